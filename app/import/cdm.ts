import { KeepclearError, type Rejection } from '../../core/errors.js';
import { parseCdmFile, hardBodyRadiusFromAreaPc, type CdmObject } from '../../core/formats/cdm/index.js';
import { encounterFromCdm } from '../../core/events/fromCdm.js';
import type { Instant } from '../../core/time/instant.js';
import {
  createRun,
  finishRun,
  getEvent,
  inTransaction,
  linkCdmToEvent,
  mergeEventExtra,
  setRunDataAt,
  storeCdmFile,
  type ImportCounts,
  type KeepclearDb,
} from '../../db/index.js';
import { RiskContext } from '../risk.js';
import { linkRun } from '../series.js';

export interface CdmImportOutcome {
  readonly counts: ImportCounts;
  readonly rejections: readonly Rejection[];
  /** what the reader repaired or flagged (e.g. a covariance not PSD), with file:line */
  readonly repairs: readonly string[];
  readonly eventId: string | null;
  /** the series the message's event joined (the same conjunction seen by runs or other messages) */
  readonly seriesId: string | null;
}

/**
 * Imports one CDM file in ONE transaction: the message, a run holding its event with
 * Keepclear's own Pc (the message's COLLISION_PROBABILITY is kept apart as "reported"), dated by
 * its CREATION_DATE, and the event linked into its series (app/series.ts: screened events of the
 * same series created after the message take its covariance). A covariance that is
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
    if (stored.imported === 0) return { counts, rejections: [], repairs: notes, eventId: null, seriesId: null };
    const start = rv.startScreenPeriod ?? enc.tca;
    const end = rv.stopScreenPeriod && rv.stopScreenPeriod > start ? rv.stopScreenPeriod : ((start + 1) as Instant);
    const runId = createRun(db, { start, end, volume, primaries: [enc.primary] }, sha256, 2, 'cdm');
    // The message's data dates from its creation, not from when it reached us.
    setRunDataAt(db, runId, cdm.header.creationDate);
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
    mergeEventExtra(db, eventId, extra);
    linkRun(db, runId);
    const seriesId = getEvent(db, eventId)?.seriesId ?? null;
    return { counts, rejections: [], repairs: notes, eventId, seriesId };
  });
}
