import { eventRowOf } from '../core/bridge/convert.js';
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
  return {
    // The fields the desktop bridge shows in its event table, converted the same way.
    ...eventRowOf(e),
    seriesId: e.seriesId ?? null,
    ...(seriesStates ? { seriesState: (e.seriesId && seriesStates.get(e.seriesId)) ?? null } : {}),
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
  };
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
