/**
 * The conjunction a received CDM describes, as an Encounter: both states converted from the
 * message's REF_FRAME to TEME at TCA, objects named by their canonical ids (Alpha-5 decoded),
 * relative geometry computed the same way as for screened encounters.
 */
import { canonicalObjectId } from '../elements/objectId.js';
import type { Cdm, CdmObject } from '../formats/cdm/index.js';
import { toTemeFrom } from '../frames/toTeme.js';
import type { Instant } from '../time/instant.js';
import type { Encounter, StateArray } from './encounter.js';
import { approachAngleDeg, missAndSpeed, relativeRtn } from './geometry.js';

/** An object's state at TCA in TEME (km, km/s); CDM states are km and km/s (508.0-B-1 §3.5). */
function temeStateOf(o: CdmObject, tca: Instant): StateArray {
  const teme = toTemeFrom(o.metadata.refFrame, o.state.r, o.state.v, tca);
  return [teme.r[0], teme.r[1], teme.r[2], teme.v[0], teme.v[1], teme.v[2]];
}

/** The epoch the message's orbit determination stands for: its last observation, else TCA. */
const epochOf = (o: CdmObject, tca: Instant): Instant => o.od.timeLastobEnd ?? tca;

export function encounterFromCdm(cdm: Cdm): Encounter {
  const tca = cdm.relative.tca;
  const p = temeStateOf(cdm.object1, tca);
  const s = temeStateOf(cdm.object2, tca);
  return {
    primary: canonicalObjectId(cdm.object1.metadata.objectDesignator),
    secondary: canonicalObjectId(cdm.object2.metadata.objectDesignator),
    tca,
    ...missAndSpeed(p, s),
    rtnKm: relativeRtn(p, s),
    approachAngleDeg: approachAngleDeg(p, s),
    entry: cdm.relative.screenEntryTime ?? null,
    exit: cdm.relative.screenExitTime ?? null,
    primaryState: p,
    secondaryState: s,
    primaryEpoch: epochOf(cdm.object1, tca),
    secondaryEpoch: epochOf(cdm.object2, tca),
  };
}
