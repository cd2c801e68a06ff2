import { KeepclearError, type Rejection } from '../core/errors.js';
import { parseCdmFile, hardBodyRadiusFromAreaPc, type Cdm, type CdmObject } from '../core/formats/cdm/index.js';
import { eme2000ToGcrf } from '../core/frames/eme2000.js';
import { gcrfToTeme, itrfToTeme } from '../core/frames/teme.js';
import { approachAngleDeg, relativeRtn } from '../core/screening/geometry.js';
import type { ConjunctionEvent, Encounter, StateArray } from '../core/events/index.js';
import type { Instant } from '../core/time/instant.js';
import { vec3, type Km, type KmPerS, type StateVector } from '../core/units.js';
import {
  createRun,
  eventsOfRun,
  finishRun,
  inTransaction,
  latestRun,
  linkCdmToEvent,
  mergeEventExtra,
  storeCdmFile,
  updateEventRisk,
  type ImportCounts,
  type KeepclearDb,
} from '../db/index.js';
import { matchingCdm, SAME_CONJUNCTION_MS } from './cdmMatch.js';
import { RiskContext } from './risk.js';

/** Runs made from received messages carry this fingerprint prefix (screening runs never do). */
export const CDM_RUN_PREFIX = 'cdm:';

export interface CdmImportOutcome {
  readonly counts: ImportCounts;
  readonly rejections: readonly Rejection[];
  readonly repairs: readonly string[];
  readonly eventId: string | null;
}

/** Catalogue designators are stored as canonical ids: digits without leading zeros. */
export const canonicalId = (designator: string): string =>
  /^\d+$/.test(designator.trim()) ? String(Number(designator.trim())) : designator.trim();

function toTeme(o: CdmObject, t: Instant): StateArray {
  const s = o.state;
  const r = vec3<'GCRF', Km>(s.r[0], s.r[1], s.r[2]);
  const v = vec3<'GCRF', KmPerS>(s.v[0], s.v[1], s.v[2]);
  let teme: StateVector<'TEME'>;
  switch (o.metadata.refFrame) {
    case 'ITRF':
      teme = itrfToTeme({ r, v } as unknown as StateVector<'ITRF'>, t);
      break;
    case 'EME2000':
      teme = gcrfToTeme(eme2000ToGcrf({ r, v } as unknown as StateVector<'EME2000'>), t);
      break;
    default:
      teme = gcrfToTeme({ r, v }, t);
  }
  return [teme.r[0], teme.r[1], teme.r[2], teme.v[0], teme.v[1], teme.v[2]];
}

/** The conjunction a message describes, as an encounter (states in TEME at TCA). */
export function encounterFromCdm(cdm: Cdm): Encounter {
  const tca = cdm.relative.tca;
  const p = toTeme(cdm.object1, tca), s = toTeme(cdm.object2, tca);
  const epochOf = (o: CdmObject) => o.od.timeLastobEnd ?? tca;
  return {
    primary: canonicalId(cdm.object1.metadata.objectDesignator),
    secondary: canonicalId(cdm.object2.metadata.objectDesignator),
    tca,
    missKm: Math.hypot(s[0] - p[0], s[1] - p[1], s[2] - p[2]),
    relativeSpeedKmS: Math.hypot(s[3] - p[3], s[4] - p[4], s[5] - p[5]),
    rtnKm: relativeRtn(p, s),
    approachAngleDeg: approachAngleDeg(p, s),
    entry: cdm.relative.screenEntryTime ?? null,
    exit: cdm.relative.screenExitTime ?? null,
    primaryState: p,
    secondaryState: s,
    primaryEpoch: epochOf(cdm.object1),
    secondaryEpoch: epochOf(cdm.object2),
  };
}

/**
 * Imports one CDM file in ONE transaction: the message, a run holding its event with
 * Keepclear's own Pc (the message's COLLISION_PROBABILITY is kept apart as "reported"), and a
 * link to the screened event of the same pair and TCA, when there is one. A covariance that is
 * not positive semi-definite beyond rounding is kept flagged, and Pc falls back to maximum Pc.
 */
export function importCdmFile(
  db: KeepclearDb,
  file: string,
  bytes: Uint8Array,
  sha256: string,
  format: string,
  hbrM: number | undefined,
): CdmImportOutcome {
  const parsed = parseCdmFile(bytes, file, { badCovariance: 'flag' });
  if (!parsed.cdm) {
    const first = parsed.errors[0];
    throw new KeepclearError(first?.code ?? 'CDM_FIELD', first?.reason ?? 'not a readable CDM', {
      file,
      line: first?.line ?? 1,
    });
  }
  const cdm = parsed.cdm;
  const enc = encounterFromCdm(cdm);
  const hbr = (o: CdmObject) =>
    o.additional.areaPc !== undefined ? hardBodyRadiusFromAreaPc(o.additional.areaPc) : (hbrM ?? null);
  // A covariance the reader judged not PSD beyond rounding has no usable matrix: it is doubtful,
  // and Pc falls back to maximum Pc (DESIGN.md risk requirements).
  const doubtful = (o: CdmObject) =>
    o.covariance.usable ? null : (o.covariance.note ?? `${o.metadata.object} covariance not positive semi-definite`);
  const risk = new RiskContext(db).assess(enc, {
    primaryRtnM2: cdm.object1.covariance.usable,
    secondaryRtnM2: cdm.object2.covariance.usable,
    primaryDoubtful: doubtful(cdm.object1),
    secondaryDoubtful: doubtful(cdm.object2),
    hbrPrimaryM: hbr(cdm.object1),
    hbrSecondaryM: hbr(cdm.object2),
  });
  // The reader's repair notes already carry each covariance note (with file:line); add a
  // covariance note only where no repair note ends with it.
  const covNotes = [cdm.object1, cdm.object2].flatMap((o) => (o.covariance.note ? [o.covariance.note] : []));
  const notes = [...parsed.repairs, ...covNotes.filter((n) => !parsed.repairs.some((r) => r.endsWith(n)))];
  const riskWithNotes = {
    ...risk,
    warnings: [...new Set([...risk.warnings.filter((w) => !notes.some((n) => n.endsWith(w))), ...notes])],
  };
  const rv = cdm.relative;
  const volume =
    rv.screenVolumeShape === 'ELLIPSOID' && rv.screenVolumeX && rv.screenVolumeY && rv.screenVolumeZ
      ? { kind: 'rtn-ellipsoid' as const, rKm: rv.screenVolumeX / 1000, tKm: rv.screenVolumeY / 1000, nKm: rv.screenVolumeZ / 1000 }
      : { kind: 'sphere' as const, radiusKm: Math.max(enc.missKm, 0.001) };

  return inTransaction(db, () => {
    const stored = storeCdmFile(db, { path: file, sha256, format }, [
      {
        messageId: cdm.header.messageId,
        creationDate: cdm.header.creationDate,
        originator: cdm.header.originator,
        tca: enc.tca,
        missDistanceM: cdm.relative.missDistance,
        object1Id: enc.primary,
        object2Id: enc.secondary,
        reportedPc: cdm.relative.collisionProbability ?? null,
        parsed: cdm,
        eventId: null,
      },
    ], []);
    const counts = { imported: stored.imported, updated: 0, unchanged: stored.unchanged, rejected: 0 };
    if (stored.imported === 0) return { counts, rejections: [], repairs: notes, eventId: null };
    const start = rv.startScreenPeriod ?? enc.tca;
    const end = rv.stopScreenPeriod && rv.stopScreenPeriod > start ? rv.stopScreenPeriod : ((start + 1) as Instant);
    const runId = createRun(db, { start, end, volume, primaries: [enc.primary] }, `${CDM_RUN_PREFIX}${sha256}`, 2);
    const [event] = finishRun(db, runId, { status: 'done', wallMs: 0, flagged: [], events: [{ ...enc, risk: riskWithNotes }] });
    const eventId = event!.id;
    linkCdmToEvent(db, stored.ids[0]!, eventId);
    const extra: Record<string, unknown> = {
      source: 'cdm',
      cdmId: stored.ids[0],
      reportedPc: cdm.relative.collisionProbability ?? null,
      reportedPcMethod: cdm.relative.collisionProbabilityMethod ?? null,
      reportedMissKm: cdm.relative.missDistance / 1000,
      originator: cdm.header.originator,
      messageId: cdm.header.messageId,
    };
    const screened = latestScreeningEvent(db, enc);
    if (screened) {
      extra.matchedEventId = screened.id;
      // The screened event's risk now takes the message's covariance (first in precedence).
      const inputs = matchingCdm(db, screened);
      if (inputs) updateEventRisk(db, screened.id, new RiskContext(db).assess(screened, inputs));
      mergeEventExtra(db, screened.id, { cdmEventId: eventId, cdmId: stored.ids[0], reportedPc: cdm.relative.collisionProbability ?? null });
    }
    mergeEventExtra(db, eventId, extra);
    return { counts, rejections: [], repairs: notes, eventId };
  });
}

/** The event of the newest screening run with the same pair (either order) and TCA. */
function latestScreeningEvent(db: KeepclearDb, e: Encounter): ConjunctionEvent | null {
  const run = latestRun(db, 'done');
  if (!run || run.catalogFingerprint.startsWith(CDM_RUN_PREFIX)) return null;
  const hit = eventsOfRun(db, run.id).find(
    (x) =>
      ((x.primary === e.primary && x.secondary === e.secondary) || (x.primary === e.secondary && x.secondary === e.primary)) &&
      Math.abs(x.tca - e.tca) <= SAME_CONJUNCTION_MS,
  );
  return hit ?? null;
}
