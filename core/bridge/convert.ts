/**
 * From Keepclear's inside types (Instant times, state arrays) to the bridge's plain ones.
 * Pure; the handlers the desktop app and `keepclear serve` register use these.
 */
import { TIERS, type TierId } from '../risk/tiers.js';
import type { FlaggedObject, ScreeningSettings } from '../screening/types.js';
import type { ConjunctionEvent } from '../events/index.js';
import { toIso, type Instant } from '../time/instant.js';
import type { EventDetail, EventRow, RunStatus, RunSummary, ScreeningVolumeSummary } from './contract.js';

type Vec3 = readonly [number, number, number];

/** A stored tier string as a TierId; anything else (not yet assessed, unknown) is null. */
export const tierOf = (t: string | null | undefined): TierId | null =>
  typeof t === 'string' && Object.prototype.hasOwnProperty.call(TIERS, t) ? (t as TierId) : null;

/** NaN and ±Infinity do not survive JSON; the bridge sends null instead. */
const finiteOrNull = (x: number | null | undefined): number | null =>
  typeof x === 'number' && Number.isFinite(x) ? x : null;

const isoOrNull = (t: Instant | null): string | null => (t === null ? null : toIso(t));

export function eventRowOf(e: ConjunctionEvent): EventRow {
  return {
    id: e.id,
    runId: e.runId,
    primary: e.primary,
    secondary: e.secondary,
    tca: toIso(e.tca),
    missKm: e.missKm,
    relativeSpeedKmS: e.relativeSpeedKmS,
    rtnKm: [e.rtnKm[0], e.rtnKm[1], e.rtnKm[2]],
    approachAngleDeg: e.approachAngleDeg,
    pc: finiteOrNull(e.risk?.pc),
    pcMethod: e.risk?.pcMethod ?? null,
    covarianceSource: e.risk?.covarianceSource ?? null,
    tier: tierOf(e.risk?.tier),
  };
}

export function eventDetailOf(e: ConjunctionEvent): EventDetail {
  const [px, py, pz, pvx, pvy, pvz] = e.primaryState;
  const [sx, sy, sz, svx, svy, svz] = e.secondaryState;
  return {
    ...eventRowOf(e),
    entry: isoOrNull(e.entry),
    exit: isoOrNull(e.exit),
    primaryEpoch: toIso(e.primaryEpoch),
    secondaryEpoch: toIso(e.secondaryEpoch),
    primaryPositionTemeKm: [px, py, pz] as Vec3,
    primaryVelocityTemeKmS: [pvx, pvy, pvz] as Vec3,
    secondaryPositionTemeKm: [sx, sy, sz] as Vec3,
    secondaryVelocityTemeKmS: [svx, svy, svz] as Vec3,
    hardBodyRadiusM: finiteOrNull(e.risk?.hardBodyRadiusM),
    warnings: [...(e.risk?.warnings ?? [])],
  };
}

/** The fields of a stored run the bridge shows (db/runs.ts RunRecord has this shape). */
export interface RunLike {
  readonly id: string;
  readonly createdAt: Instant;
  readonly settings: ScreeningSettings;
  readonly objectCount: number;
  readonly status: RunStatus;
  readonly finishedAt: Instant | null;
  readonly eventCount: number | null;
  readonly flagged: readonly FlaggedObject[];
}

export function runSummaryOf(r: RunLike): RunSummary {
  const v = r.settings.volume;
  const volume: ScreeningVolumeSummary =
    v.kind === 'sphere'
      ? { kind: 'sphere', radiusKm: v.radiusKm }
      : { kind: 'rtn-ellipsoid', rKm: v.rKm, tKm: v.tKm, nKm: v.nKm };
  return {
    id: r.id,
    createdAt: toIso(r.createdAt),
    start: toIso(r.settings.start),
    end: toIso(r.settings.end),
    volume,
    primaries: r.settings.primaries === 'all' ? 'all' : [...r.settings.primaries],
    objectCount: r.objectCount,
    status: r.status,
    finishedAt: isoOrNull(r.finishedAt),
    eventCount: r.eventCount,
    flaggedCount: r.flagged.length,
  };
}
