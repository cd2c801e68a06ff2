import { eventRowOf } from '../core/bridge/convert.js';
import type { EventRow } from '../core/bridge/contract.js';
import { toIso } from '../core/time/instant.js';
import type { FlaggedObject, ScreeningSettings } from '../core/screening/types.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import type { RunEphemeris, RunRecord } from '../db/index.js';
import { describeEphemeris } from './ephemerisText.js';

/**
 * JSON of one event: the contract names of DESIGN.md ("JSON of screen and events") plus extras.
 * `seriesId` (DESIGN.md "Series") is null only for an event not linked (a plan's hypothetical
 * events); `seriesState` is given where the caller knows it.
 */
export function eventToJson(e: ConjunctionEvent, seriesStates?: ReadonlyMap<string, string>): Record<string, unknown> {
  const r = e.risk;
  const row = eventRowOf(e);
  // Written out key by key, not `{ ...row, more }`: in V8 (Node 20) each key given after a
  // spread costs ~2 µs, ~40 µs an event here — 5 s of an all-vs-all run's 10⁵ events.
  // `satisfies` keeps every field of the bridge's row in the list.
  return {
    // The fields the desktop bridge shows in its event table, converted the same way.
    id: row.id,
    runId: row.runId,
    primary: row.primary,
    secondary: row.secondary,
    tca: row.tca,
    missKm: row.missKm,
    relativeSpeedKmS: row.relativeSpeedKmS,
    rtnKm: row.rtnKm,
    approachAngleDeg: row.approachAngleDeg,
    pc: row.pc,
    pcMethod: row.pcMethod,
    covarianceSource: row.covarianceSource,
    tier: row.tier,
    seriesId: e.seriesId ?? null,
    // left out of the text (JSON drops undefined) where the caller does not know series states
    seriesState: seriesStates ? ((e.seriesId && seriesStates.get(e.seriesId)) ?? null) : undefined,
    hardBodyRadiusM: r ? r.hardBodyRadiusM : null,
    warnings: r ? [...r.warnings] : [],
    entry: e.entry === null ? null : toIso(e.entry),
    exit: e.exit === null ? null : toIso(e.exit),
    atWindowEdge: e.atWindowEdge === true,
    primaryEpoch: toIso(e.primaryEpoch),
    secondaryEpoch: toIso(e.secondaryEpoch),
    primaryAgeDays: (e.tca - e.primaryEpoch) / 86_400_000,
    secondaryAgeDays: (e.tca - e.secondaryEpoch) / 86_400_000,
    primaryStateTeme: [...e.primaryState],
    secondaryStateTeme: [...e.secondaryState],
  } satisfies { [K in keyof EventRow]: EventRow[K] } & Record<string, unknown>;
}

/**
 * JSON of a run. `ephemerides`: the owner ephemerides it screened primaries from (db
 * runEphemerides); each primary then has `primarySources[id] = "ephemeris: FILE (OEM, created …)"`,
 * the others "element set".
 */
export function runToJson(
  run: RunRecord,
  flagged: readonly FlaggedObject[] = run.flagged,
  ephemerides: readonly RunEphemeris[] = [],
): Record<string, unknown> {
  const s: ScreeningSettings = run.settings;
  const v = s.volume;
  return {
    id: run.id,
    // when the run's data was created: series order their events by it
    dataAt: toIso(run.dataAt),
    start: toIso(s.start),
    end: toIso(s.end),
    days: (s.end - s.start) / 86_400_000,
    thresholdKm: v.kind === 'sphere' ? v.radiusKm : null,
    ...(v.kind === 'rtn-ellipsoid' ? { volumeRtnKm: [v.rKm, v.tKm, v.nKm] } : {}),
    objects: run.objectCount,
    // All-vs-all: every object is a primary; the list stays empty and allObjects says so.
    primaries: s.primaries === 'all' ? [] : [...s.primaries],
    allObjects: s.primaries === 'all',
    flagged: flagged.map((f) => ({ id: f.id, reason: f.reason })),
    status: run.status,
    catalogFingerprint: run.catalogFingerprint,
    wallMs: run.wallMs,
    ...(s.primaries === 'all'
      ? {}
      : {
          primarySources: Object.fromEntries(
            s.primaries.map((id) => {
              const e = ephemerides.find((x) => x.objectId === id);
              return [id, e ? `ephemeris: ${describeEphemeris(e)}` : 'element set'];
            }),
          ),
          ephemerides: ephemerides.map((e) => ({ primary: e.objectId, file: e.fileName, creationDate: toIso(e.creationDate) })),
        }),
  };
}
