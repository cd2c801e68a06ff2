/**
 * Sharded all-vs-all runs (DESIGN.md "--shard K/N and merge"): `screenShard` screens one shard
 * of the pairs and returns its JSON document; `mergeShards` checks that a set of such documents
 * is one complete run (same catalogue, window and volume; shards 1..N each once, all finished)
 * and stores their union as one run of kind "merge", with risk and series as a screening run.
 *
 * A shard is not stored as a run: it covers only some pairs, and a stored screening run tells
 * the series rule that every pair in its window was looked at ("no longer predicted" would be
 * said of conjunctions that another shard holds). The merged run says that truthfully.
 */
import { KeepclearError } from '../core/errors.js';
import { parseIso, toIso, type Instant } from '../core/time/instant.js';
import { runScreening } from '../core/screening/run.js';
import { shardText, type ShardSpec } from '../core/screening/spatial/shard.js';
import type { FlaggedObject, ScreeningSettings, ScreeningVolume } from '../core/screening/types.js';
import { encounterWith, type ConjunctionEvent, type Encounter, type StateArray } from '../core/events/index.js';
import {
  createRun, eventsOfRun, finishRun, fingerprintOfCatalogue, getRun, inTransaction, readCatalogue,
  type KeepclearDb, type RunRecord,
} from '../db/index.js';
import { eventToJson } from './eventJson.js';
import { RiskContext } from './risk.js';
import { linkRun } from './series.js';

export interface ShardRequest {
  readonly settings: ScreeningSettings & { readonly shard: ShardSpec };
  readonly workers?: number;
  readonly onProgress?: (done: number, total: number) => void;
  readonly signal?: AbortSignal;
}

export interface ShardResult {
  /** the JSON document of the shard (without the caution, which the writer adds) */
  readonly doc: { run: Record<string, unknown>; events: Record<string, unknown>[] };
  readonly flagged: readonly FlaggedObject[];
  readonly eventCount: number;
  readonly cancelled: boolean;
  readonly wallMs: number;
  readonly objects: number;
}

/** Id of a shard's result: not a stored run, so not "R…". */
export const shardRunId = (s: ShardSpec): string => `shard-${s.index}-of-${s.count}`;

/** Screens one shard of an all-vs-all run on the newest element sets of the database. */
export async function screenShard(db: KeepclearDb, req: ShardRequest): Promise<ShardResult> {
  const { settings } = req;
  if (settings.primaries !== 'all') throw new KeepclearError('BAD_ARGUMENT', 'a shard (--shard K/N) needs an all-vs-all run (--all)');
  // The orbits and their fingerprint from one snapshot: an import landing between two reads would
  // give the shard a fingerprint of sets it did not screen, and merge compares them.
  const catalogue = readCatalogue(db);
  const sets = catalogue.sets;
  if (sets.length === 0) {
    throw new KeepclearError('NOT_FOUND', 'the database holds no element sets; import a catalogue first (keepclear import FILE)');
  }
  const fingerprint = fingerprintOfCatalogue(db, catalogue);
  const outcome = await runScreening(sets, settings, {
    ...(req.workers !== undefined ? { workers: req.workers } : {}),
    ...(req.onProgress ? { onProgress: req.onProgress } : {}),
    ...(req.signal ? { signal: req.signal } : {}),
  });
  const risk = new RiskContext(db);
  const runId = shardRunId(settings.shard);
  const events: ConjunctionEvent[] = outcome.encounters.map((e, n) =>
    encounterWith(e, { id: `${runId}-${n + 1}`, runId, risk: risk.assess(e), seriesId: null }),
  );
  const v = settings.volume;
  const run = {
    id: runId,
    start: toIso(settings.start),
    end: toIso(settings.end),
    days: (settings.end - settings.start) / 86_400_000,
    thresholdKm: v.kind === 'sphere' ? v.radiusKm : null,
    ...(v.kind === 'rtn-ellipsoid' ? { volumeRtnKm: [v.rKm, v.tKm, v.nKm] } : {}),
    objects: sets.length,
    primaries: [],
    allObjects: true,
    flagged: outcome.flagged.map((f) => ({ id: f.id, reason: f.reason })),
    status: outcome.cancelled ? 'cancelled' : 'done',
    catalogFingerprint: fingerprint,
    wallMs: outcome.wallMs,
    shard: shardText(settings.shard),
    shardIndex: settings.shard.index,
    shardCount: settings.shard.count,
    // exact window edges (ms): the ISO text above is rounded to the millisecond
    startMs: settings.start,
    endMs: settings.end,
  };
  return {
    doc: { run, events: events.map(shardEventJson) },
    flagged: outcome.flagged,
    eventCount: events.length,
    cancelled: outcome.cancelled,
    wallMs: outcome.wallMs,
    objects: sets.length,
  };
}

/** An event of a shard: the JSON of `screen`, plus the times unrounded so `merge` loses nothing. */
function shardEventJson(e: ConjunctionEvent): Record<string, unknown> {
  // Added to the object eventToJson made, not spread into a new one (slow in V8: encounterWith).
  return Object.assign(eventToJson(e), {
    tcaMs: e.tca,
    entryMs: e.entry,
    exitMs: e.exit,
    primaryEpochMs: e.primaryEpoch,
    secondaryEpochMs: e.secondaryEpoch,
  });
}

/** One shard document as read from its file. */
export interface ShardFile {
  readonly file: string;
  readonly text: string;
}

interface ParsedShard {
  file: string;
  index: number;
  count: number;
  settings: ScreeningSettings;
  fingerprint: string;
  objects: number;
  wallMs: number;
  flagged: FlaggedObject[];
  encounters: Encounter[];
}

const bad = (file: string, what: string): KeepclearError => new KeepclearError('SHARD_INVALID', `${file}: ${what}`);

function parseShard(f: ShardFile): ParsedShard {
  let doc: unknown;
  try {
    doc = JSON.parse(f.text);
  } catch (err) {
    throw bad(f.file, `not JSON (${(err as Error).message}); give the files written by keepclear screen --all --shard K/N --json FILE`);
  }
  const run = (doc as { run?: Record<string, unknown> })?.run;
  const events = (doc as { events?: unknown })?.events;
  if (!run || typeof run !== 'object' || !Array.isArray(events)) {
    throw bad(f.file, 'no "run" and "events": not the JSON of keepclear screen');
  }
  const index = run.shardIndex, count = run.shardCount;
  if (typeof index !== 'number' || typeof count !== 'number') {
    throw bad(f.file, 'its run is not a shard (no shardIndex/shardCount); give the JSON of screen --all --shard K/N');
  }
  if (run.status !== 'done') throw bad(f.file, `shard ${index}/${count} did not finish (status ${String(run.status)}); run it again`);
  const num = (k: string): number => {
    const x = run[k];
    if (typeof x !== 'number' || !Number.isFinite(x)) throw bad(f.file, `run.${k} is missing or not a number`);
    return x;
  };
  const volume: ScreeningVolume = Array.isArray(run.volumeRtnKm)
    ? { kind: 'rtn-ellipsoid', rKm: Number(run.volumeRtnKm[0]), tKm: Number(run.volumeRtnKm[1]), nKm: Number(run.volumeRtnKm[2]) }
    : { kind: 'sphere', radiusKm: num('thresholdKm') };
  const settings: ScreeningSettings = { start: num('startMs') as Instant, end: num('endMs') as Instant, volume, primaries: 'all' };
  const flagged = Array.isArray(run.flagged) ? (run.flagged as FlaggedObject[]).map((x) => ({ id: String(x.id), reason: String(x.reason) })) : [];
  const encounters = events.map((e, n) => encounterOf(f.file, n, e as Record<string, unknown>));
  return {
    file: f.file, index, count, settings, flagged, encounters,
    fingerprint: String(run.catalogFingerprint), objects: num('objects'), wallMs: num('wallMs'),
  };
}

function encounterOf(file: string, n: number, e: Record<string, unknown>): Encounter {
  const where = `event ${n + 1}`;
  const time = (ms: string, iso: string, nullable: boolean): Instant | null => {
    if (typeof e[ms] === 'number') return e[ms] as Instant;
    if (e[iso] === null && nullable) return null;
    const t = typeof e[iso] === 'string' ? parseIso(e[iso] as string) : null;
    if (t === null) throw bad(file, `${where}: ${iso} is missing or not an ISO time`);
    return t;
  };
  const vec = (k: string, len: number): number[] => {
    const v = e[k];
    if (!Array.isArray(v) || v.length !== len || !v.every((x) => typeof x === 'number')) throw bad(file, `${where}: ${k} must be ${len} numbers`);
    return v as number[];
  };
  const numOf = (k: string): number => {
    if (typeof e[k] !== 'number') throw bad(file, `${where}: ${k} is missing or not a number`);
    return e[k] as number;
  };
  if (typeof e.primary !== 'string' || typeof e.secondary !== 'string') throw bad(file, `${where}: primary and secondary must be ids`);
  return {
    primary: e.primary,
    secondary: e.secondary,
    tca: time('tcaMs', 'tca', false)!,
    missKm: numOf('missKm'),
    relativeSpeedKmS: numOf('relativeSpeedKmS'),
    rtnKm: vec('rtnKm', 3) as unknown as [number, number, number],
    approachAngleDeg: numOf('approachAngleDeg'),
    entry: time('entryMs', 'entry', true),
    exit: time('exitMs', 'exit', true),
    primaryState: vec('primaryStateTeme', 6) as unknown as StateArray,
    secondaryState: vec('secondaryStateTeme', 6) as unknown as StateArray,
    primaryEpoch: time('primaryEpochMs', 'primaryEpoch', false)!,
    secondaryEpoch: time('secondaryEpochMs', 'secondaryEpoch', false)!,
    ...(e.atWindowEdge === true ? { atWindowEdge: true } : {}),
  };
}

export interface MergeResult {
  readonly run: RunRecord;
  readonly events: ConjunctionEvent[];
  readonly shards: number;
}

/** Checks that the documents are the N shards of one run, and stores their union as one run. */
export function mergeShards(db: KeepclearDb, files: readonly ShardFile[]): MergeResult {
  if (files.length === 0) throw new KeepclearError('BAD_ARGUMENT', 'give the JSON files of the shards (keepclear merge SHARD.json...)');
  const shards = files.map(parseShard);
  const first = shards[0]!;
  const same = (a: ParsedShard, what: string, x: unknown, y: unknown) => {
    if (JSON.stringify(x) !== JSON.stringify(y)) {
      throw bad(a.file, `its ${what} (${JSON.stringify(x)}) differs from ${first.file} (${JSON.stringify(y)}): shards of different runs cannot be merged`);
    }
  };
  for (const s of shards.slice(1)) {
    same(s, 'shard count', s.count, first.count);
    same(s, 'catalogue fingerprint', s.fingerprint, first.fingerprint);
    same(s, 'window', [s.settings.start, s.settings.end], [first.settings.start, first.settings.end]);
    same(s, 'screening volume', s.settings.volume, first.settings.volume);
    same(s, 'object count', s.objects, first.objects);
  }
  const seen = new Map<number, string>();
  for (const s of shards) {
    const other = seen.get(s.index);
    if (other !== undefined) throw bad(s.file, `shard ${s.index}/${s.count} is also in ${other}; give each shard once`);
    seen.set(s.index, s.file);
  }
  const missing = Array.from({ length: first.count }, (_, k) => k + 1).filter((k) => !seen.has(k));
  if (missing.length > 0) {
    throw new KeepclearError('SHARD_INVALID', `shard${missing.length > 1 ? 's' : ''} ${missing.map((k) => `${k}/${first.count}`).join(', ')} missing; give all ${first.count} shards of the run`);
  }
  const encounters = shards.flatMap((s) => s.encounters);
  encounters.sort((a, b) => a.tca - b.tca || a.primary.localeCompare(b.primary) || a.secondary.localeCompare(b.secondary));
  const flaggedById = new Map<string, string>();
  for (const s of shards) for (const f of s.flagged) if (!flaggedById.has(f.id)) flaggedById.set(f.id, f.reason);
  const flagged = [...flaggedById].map(([id, reason]) => ({ id, reason })).sort((a, b) => a.id.localeCompare(b.id));
  // Risk again with this database (the same as the shards' if it is a copy of theirs).
  const risk = new RiskContext(db);
  const events = encounters.map((e) => encounterWith(e, { risk: risk.assess(e) }));
  const runId = createRun(db, first.settings, first.fingerprint, first.objects, 'merge');
  inTransaction(db, () => {
    // The run took as long as its slowest shard (they run side by side).
    finishRun(db, runId, { status: 'done', wallMs: Math.max(...shards.map((s) => s.wallMs)), flagged, events });
    linkRun(db, runId);
  });
  return { run: getRun(db, runId)!, events: eventsOfRun(db, runId), shards: first.count };
}
