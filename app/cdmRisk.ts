import type { Cdm, CdmObject } from '../core/formats/cdm/index.js';
// From its own module, not the format's index: that one brings the XML reader (~35 ms to load) into every screening.
import { hardBodyRadiusFromAreaPc } from '../core/formats/cdm/model.js';
import type { Matrix } from '../core/math/linalg.js';
import type { Encounter } from '../core/events/index.js';
import type { StoredCdm } from '../db/index.js';

/** What a received message contributes to a screened event's risk: first in precedence. */
export interface CdmRiskInputs {
  readonly cdm: StoredCdm;
  readonly primaryRtnM2: Matrix | null;
  readonly secondaryRtnM2: Matrix | null;
  readonly primaryDoubtful: string | null;
  readonly secondaryDoubtful: string | null;
  readonly hbrPrimaryM: number | null;
  readonly hbrSecondaryM: number | null;
}

/**
 * A stored message's covariances and hard-body radii mapped to the event's primary and
 * secondary (the message may name the pair the other way round). Which message belongs to which
 * event is the series rule's business (app/series.ts), not this function's.
 */
export function cdmRiskInputs(cdm: StoredCdm, e: Encounter): CdmRiskInputs {
  const parsed = cdm.parsed as Cdm;
  const swap = cdm.object1Id !== e.primary;
  const [p, s] = swap ? [parsed.object2, parsed.object1] : [parsed.object1, parsed.object2];
  const doubtful = (o: CdmObject) =>
    o.covariance.usable ? null : (o.covariance.note ?? `${o.metadata.object} covariance not positive semi-definite`);
  const hbr = (o: CdmObject) => (o.additional.areaPc !== undefined ? hardBodyRadiusFromAreaPc(o.additional.areaPc) : null);
  return {
    cdm,
    primaryRtnM2: p.covariance.usable,
    secondaryRtnM2: s.covariance.usable,
    primaryDoubtful: doubtful(p),
    secondaryDoubtful: doubtful(s),
    hbrPrimaryM: hbr(p),
    hbrSecondaryM: hbr(s),
  };
}
