/**
 * One stored event as a CDM (KVN): gathers from the database what the message says of each
 * object (name, designator, hard-body radius, covariance and where it came from) and hands it to
 * core/events/toCdm.ts. The text is written by the CDM writer of core/formats/cdm, so an exported
 * message reads back through the same reader as any received one.
 */
import { basename } from 'node:path';
import { canonicalObjectId } from '../../core/elements/objectId.js';
import type { Cdm, CdmObject } from '../../core/formats/cdm/index.js';
import { formatCdmKvn } from '../../core/formats/cdm/index.js';
import type { ConjunctionEvent } from '../../core/events/index.js';
import { eventToCdm, type CdmExportInput, type CdmObjectFacts } from '../../core/events/toCdm.js';
import type { Matrix } from '../../core/math/linalg.js';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';
import { DEFAULT_HBR_PER_OBJECT_M, hbrFromAreaM } from '../../core/risk/hardBody.js';
import { toIso, type Instant } from '../../core/time/instant.js';
import { getCdm, getEventExtra, getObject, getRun, runEphemerides, type KeepclearDb, type RunRecord } from '../../db/index.js';

/** ORIGINATOR of every message Keepclear writes (508.0-B-1: the creating agency or operator). */
export const CDM_ORIGINATOR = 'KEEPCLEAR';

/**
 * MESSAGE_ID: the event id and the creation time to the second, so exporting the same event
 * again (after new data) gives a new id while one export is stable within its second. 508.0-B-1
 * asks MESSAGE_ID to be unique for the originator; the importer keys received messages on
 * (ORIGINATOR, MESSAGE_ID).
 */
export const cdmMessageId = (eventId: string, created: Instant): string =>
  `${eventId}-${toIso(created).replace(/[-:]/g, '').slice(0, 15)}`;

/** What an event's ephemeris source was, when the run recorded one (OEM primaries). */
export interface EphemerisSourceNote {
  readonly objectId: string;
  readonly fileName: string;
}

export interface CdmExportOptions {
  readonly now?: Instant;
  /** owner ephemerides the event's run used, by object id (default: what the run recorded) */
  readonly ephemerides?: readonly EphemerisSourceNote[];
}

/** The received message behind an event's covariance (a CDM-made event or a matched one). */
function linkedCdm(db: KeepclearDb, extra: Record<string, unknown> | null): Cdm | null {
  const id = extra?.cdmId;
  if (typeof id !== 'number') return null;
  const stored = getCdm(db, id);
  return stored ? (stored.parsed as Cdm) : null;
}

/** The message object of `objectId` in a received CDM, when the CDM names it. */
function cdmObjectFor(cdm: Cdm | null, objectId: string, ids: readonly [string, string]): CdmObject | null {
  if (!cdm) return null;
  if (ids[0] === objectId) return cdm.object1;
  if (ids[1] === objectId) return cdm.object2;
  return null;
}

function facts(
  db: KeepclearDb,
  e: ConjunctionEvent,
  which: 'primary' | 'secondary',
  cdm: { msg: Cdm; ids: readonly [string, string] } | null,
  run: RunRecord | null,
  opts: CdmExportOptions,
): CdmObjectFacts {
  const id = which === 'primary' ? e.primary : e.secondary;
  const obj = getObject(db, id);
  const sources = (e.risk?.covarianceSource ?? '').split(' / ');
  const source = (which === 'primary' ? sources[0] : sources[1]) || 'none';
  const fromMsg = cdm ? cdmObjectFor(cdm.msg, id, cdm.ids) : null;
  const detail = e.risk?.detail;
  const position = (which === 'primary' ? detail?.primaryCovRtnM2 : detail?.secondaryCovRtnM2) ?? null;
  // A received message's 6×6 (with velocity terms) is used when the Pc took that message's
  // covariance; otherwise what the Pc used, which is a position covariance.
  const msgCov = source.startsWith('cdm') && fromMsg?.covariance.usable ? (fromMsg.covariance.usable.slice(0, 6).map((r) => r.slice(0, 6)) as Matrix) : null;
  const covRtn: Matrix | null = msgCov ?? (position ? position.map((r) => [...r]) : null);
  const area = fromMsg?.additional.areaPc;
  const own = area !== undefined ? hbrFromAreaM(area) : (obj?.hardBodyRadiusM ?? null);
  const epoch = which === 'primary' ? e.primaryEpoch : e.secondaryEpoch;
  const used = opts.ephemerides ?? runEphemerides(db, e.runId);
  const oem = used.find((x) => x.objectId === id) ?? null;
  const stateSource = run?.kind === 'cdm' && cdm
    ? `the received CDM ${cdm.msg.header.originator} ${cdm.msg.header.messageId}`
    : oem
      ? `the owner ephemeris ${oem.fileName} (OEM, interpolated)`
      : `SGP4 propagation of the element set of epoch ${toIso(epoch)}`;
  return {
    id,
    name: obj?.name ?? fromMsg?.metadata.objectName ?? null,
    intlDesignator: obj?.intlDesignator ?? fromMsg?.metadata.internationalDesignator ?? null,
    hardBodyRadiusM: own ?? DEFAULT_HBR_PER_OBJECT_M,
    hardBodyRadiusDefault: own === null,
    covRtn,
    covarianceSource: source,
    covarianceMethod: source.startsWith('default') ? 'DEFAULT' : 'CALCULATED',
    // EPHEMERIS_NAME: the file's own name, not the folder it was imported from.
    ephemerisName: oem ? basename(oem.fileName) : null,
    stateSource,
  };
}

/** The message for one stored event, as a model (tests compare it field by field). */
export function cdmOfEvent(db: KeepclearDb, e: ConjunctionEvent, opts: CdmExportOptions = {}): Cdm {
  const now = opts.now ?? (Date.now() as Instant);
  const run = getRun(db, e.runId);
  const extra = getEventExtra(db, e.id);
  const msg = linkedCdm(db, extra);
  const cdm = msg ? { msg, ids: [canonicalId(msg.object1), canonicalId(msg.object2)] as const } : null;
  const screened = run !== null && (run.kind === 'screening' || run.kind === 'merge');
  const v = run?.settings.volume;
  const input: CdmExportInput = {
    event: e,
    primary: facts(db, e, 'primary', cdm, run, opts),
    secondary: facts(db, e, 'secondary', cdm, run, opts),
    creationDate: now,
    originator: CDM_ORIGINATOR,
    messageId: cdmMessageId(e.id, now),
    screening: screened && run && v
      ? {
          start: run.settings.start,
          stop: run.settings.end,
          volumeRtnKm: v.kind === 'sphere' ? [v.radiusKm, v.radiusKm, v.radiusKm] : [v.rKm, v.tKm, v.nKm],
        }
      : null,
    headerComments: [
      `Keepclear event ${e.id} of run ${e.runId}${run ? ` (${run.kind})` : ''}`,
      DECISION_AID_NOTE,
    ],
  };
  return eventToCdm(input);
}

/** KVN text of the message for one stored event. */
export function cdmTextOfEvent(db: KeepclearDb, e: ConjunctionEvent, opts: CdmExportOptions = {}): string {
  return formatCdmKvn(cdmOfEvent(db, e, opts));
}

const canonicalId = (o: CdmObject): string => canonicalObjectId(o.metadata.objectDesignator);
