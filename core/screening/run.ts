import { wrap, releaseProxy, type Remote } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import type { OrbitElements } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { startWorkers, stopWorkers } from '../workers/entry.js';
import { packSets } from './packedSets.js';
import { CTRL_CANCEL, CTRL_DONE, newControl, ScreeningChunk, type ChunkResult, type GridLayout, type SampledPrimary } from './chunk.js';
import { gridPointCount, gridStepMs } from './primaryGrid.js';
import { MODEL_MARGIN_MS, objectFromSamples, type WindowSettings } from './engine.js';
import type { Instant } from '../time/instant.js';
import type { Trajectory } from '../propagation/trajectory.js';
import { EDGE_SERVE_MAX_MS, sampleCapacity, sampleStepMs, sampleTrajectory } from '../propagation/sampledTrajectory.js';
import type { FlaggedObject, ScreeningSettings } from './types.js';
import type { Encounter } from '../events/index.js';
import type { ScreeningWorkerApi } from './worker.js';
import { runAllVsAll } from './spatial/runAllVsAll.js';

export interface RunOptions {
  /** worker threads; 0 runs in this thread. Default: one per core. */
  readonly workers?: number;
  /** called about every 200 ms with units done / total (secondaries, or primaries for all-vs-all) */
  readonly onProgress?: (done: number, total: number) => void;
  readonly signal?: AbortSignal;
  /**
   * Primaries given as trajectories (an owner ephemeris, a manoeuvred trajectory, …) in place
   * of their element sets. Each must be listed in `settings.primaries`; it is sampled once in
   * this thread (sampledTrajectory.ts: interpolation error ≤ 1 mm) and screened from the
   * samples, also as a secondary of the other primaries. Its element set, if any, is not used.
   */
  readonly primaryTrajectories?: readonly PrimaryTrajectory[];
}

/** A primary given as a trajectory (see RunOptions.primaryTrajectories). */
export interface PrimaryTrajectory {
  readonly trajectory: Trajectory;
  /**
   * Epoch of the data behind it (element set epoch, ephemeris creation), carried into each
   * encounter as the primary's epoch. Default: the epoch of the object's element set in the
   * catalogue, else the window start.
   */
  readonly epoch?: Instant;
}

/**
 * Samples are taken this far outside the window (ms): the validity probe and the filter model
 * reach MODEL_MARGIN_MS past the end; refinement's differencing reaches ≤ 16 s past either edge.
 */
const SAMPLE_MARGIN_MS = MODEL_MARGIN_MS + 60_000;

export interface ScreeningOutcome {
  readonly encounters: Encounter[];
  readonly flagged: FlaggedObject[];
  readonly cancelled: boolean;
  readonly stats: Record<string, number>;
  readonly wallMs: number;
}

/**
 * Screens element sets: fleet-vs-catalogue (primaries listed) or all-vs-all. The catalogue is
 * split among worker threads by secondary (interleaved, for balance); primary ephemerides are
 * computed once into shared memory. Results are sorted, so they do not depend on the worker count.
 */
export async function runScreening(
  elementSets: readonly OrbitElements[],
  settings: ScreeningSettings,
  options: RunOptions = {},
): Promise<ScreeningOutcome> {
  const t0 = performance.now();
  if (!(settings.end > settings.start)) {
    throw new KeepclearError('BAD_ARGUMENT', `screening window is empty: ${settings.start} to ${settings.end}`);
  }
  const ids = new Set(elementSets.map((e) => e.objectId));
  const all = settings.primaries === 'all';
  if (settings.shard && !all) throw new KeepclearError('BAD_ARGUMENT', 'a shard (--shard K/N) needs an all-vs-all run (--all)');
  const primaries = all ? [] : [...new Set(settings.primaries as readonly string[])];
  const given = new Map((options.primaryTrajectories ?? []).map((p) => [p.trajectory.objectId, p]));
  if (all && given.size > 0) {
    throw new KeepclearError('BAD_ARGUMENT', 'primary trajectories apply to fleet screening, not to all-vs-all');
  }
  for (const id of given.keys()) {
    if (!primaries.includes(id)) throw new KeepclearError('BAD_ARGUMENT', `trajectory of ${id} given, but ${id} is not a listed primary`);
  }
  for (const p of primaries) {
    if (!ids.has(p) && !given.has(p)) throw new KeepclearError('NOT_FOUND', `primary ${p} has no element set in the catalogue`);
  }
  const win: WindowSettings = { start: settings.start, end: settings.end, volume: settings.volume };
  const nWorkers = options.workers ?? availableParallelism();
  if (!Number.isInteger(nWorkers) || nWorkers < 0) {
    throw new KeepclearError('BAD_ARGUMENT', `worker count must be a whole number ≥ 0, got ${nWorkers}`);
  }
  const control = newControl();
  const bySet = new Map(elementSets.map((e) => [e.objectId, e]));
  // Trajectory primaries: sampled here into shared memory; their element sets step aside.
  const sampled: SampledPrimary[] = [...given.values()].map((p) => ({
    table: sampleIntoShared(p.trajectory, settings.start, settings.end),
    epoch: p.epoch ?? bySet.get(p.trajectory.objectId)?.epoch ?? settings.start,
  }));
  const catalog = given.size ? elementSets.filter((e) => !given.has(e.objectId)) : elementSets;
  const total = catalog.length + sampled.length;
  const sampledStep = new Map(sampled.map((p) => [p.table.objectId, objectFromSamples(p.table, p.epoch).gridStepMs!]));

  // Grid layout for the primaries, in one shared buffer.
  let offset = 0;
  const layout = primaries.map((id) => {
    const es = bySet.get(id);
    const stepMs = sampledStep.get(id) ?? gridStepMs(es!.meanMotionRevPerDay, es!.eccentricity);
    const count = gridPointCount(settings.start, settings.end, stepMs);
    const l = { id, offset, count, stepMs };
    offset += count * 6;
    return l;
  });
  const gridBuffer = new SharedArrayBuffer(Math.max(8, offset * 8));

  const onAbort = () => Atomics.store(control, CTRL_CANCEL, 1);
  // A signal aborted before the run starts fires no event: look at it now.
  if (options.signal?.aborted) onAbort();
  options.signal?.addEventListener('abort', onAbort);
  const timer = options.onProgress
    ? setInterval(() => options.onProgress!(Atomics.load(control, CTRL_DONE), total), 200)
    : null;
  try {
    let results: ChunkResult[];
    if (all) {
      // All-vs-all goes through the spatial index (spatial/runAllVsAll.ts).
      results = await runAllVsAll(elementSets, win, control, nWorkers, settings.shard);
    } else if (nWorkers <= 0) {
      const chunk = new ScreeningChunk(catalog, win, control, sampled);
      if (all) results = [chunk.screenAllPairs(0, 1)];
      else {
        const built = chunk.buildGrids(layout, new Float64Array(gridBuffer));
        chunk.attachGrids(built, new Float64Array(gridBuffer));
        results = [chunk.screenShared(primaries)];
      }
    } else {
      results = await inWorkers(nWorkers, catalog, sampled, win, control, all, primaries, layout, gridBuffer);
    }
    options.onProgress?.(Atomics.load(control, CTRL_DONE), total);
    return merge(results, performance.now() - t0);
  } finally {
    if (timer) clearInterval(timer);
    options.signal?.removeEventListener('abort', onAbort);
  }
}

/**
 * Worker threads started ahead of the run (prestartScreeningWorkers): they load their modules
 * while the caller still reads the catalogue. Unreferenced until a run takes them, so a process
 * that never screens is not kept alive by them.
 */
let prestarted: { n: number; workers: Promise<Worker[]> } | null = null;

/**
 * Starts the pair-by-pair screening workers now, for the next runScreening in this process with
 * the same worker count (a command line that is about to screen). No effect for 0 workers.
 */
export function prestartScreeningWorkers(n: number = availableParallelism()): void {
  if (!(n > 0) || prestarted) return;
  const workers = startWorkers('./worker.ts', import.meta.url, n).then((ws) => {
    for (const w of ws) w.unref();
    return ws;
  });
  workers.catch(() => undefined); // a failure shows when a run takes them
  prestarted = { n, workers };
}

async function takeWorkers(n: number): Promise<Worker[]> {
  if (prestarted && prestarted.n === n) {
    const { workers } = prestarted;
    prestarted = null;
    const ws = await workers;
    for (const w of ws) w.ref();
    return ws;
  }
  return startWorkers('./worker.ts', import.meta.url, n);
}

async function inWorkers(
  n: number,
  elementSets: readonly OrbitElements[],
  sampled: readonly SampledPrimary[],
  win: WindowSettings,
  control: Int32Array,
  all: boolean,
  primaries: string[],
  layout: { id: string; offset: number; count: number; stepMs: number }[],
  gridBuffer: SharedArrayBuffer,
): Promise<ChunkResult[]> {
  const workers = await takeWorkers(n);
  const apis: Remote<ScreeningWorkerApi>[] = workers.map((w) => wrap<ScreeningWorkerApi>(nodeEndpoint(w)));
  try {
    const packed = packSets(elementSets);
    await Promise.all(apis.map((a) => a.init(packed, win, control.buffer as SharedArrayBuffer, sampled as SampledPrimary[])));
    if (all) return await Promise.all(apis.map((a, i) => a.screenAllPairs(i, n)));
    // Primary grids: split among workers, written into the shared buffer.
    const parts = apis.map((_, i) => layout.filter((_, k) => k % n === i));
    const built: GridLayout[] = (await Promise.all(apis.map((a, i) => a.buildGrids(parts[i]!, gridBuffer)))).flat();
    await Promise.all(apis.map((a) => a.attachGrids(built, gridBuffer)));
    // A primary whose grid failed was flagged by the worker that built it.
    return await Promise.all(apis.map((a) => a.screenShared(primaries)));
  } finally {
    for (const a of apis) a[releaseProxy]();
    stopWorkers(workers);
  }
}

/**
 * Samples a primary over the window and its margins into a SharedArrayBuffer. A source whose
 * span ends inside the margins (an ephemeris covering just the window) is sampled over its span
 * and served EDGE_SERVE_MAX_MS beyond it, which covers refinement's differencing at the edges.
 */
function sampleIntoShared(traj: Trajectory, start: Instant, end: Instant) {
  let from = start - SAMPLE_MARGIN_MS, to = end + SAMPLE_MARGIN_MS;
  if (traj.span) {
    from = Math.max(from, traj.span.start);
    to = Math.min(to, traj.span.end);
  }
  const probe = new Float64Array(6);
  // The step follows the orbit at the window start (or the margin's start if that fails).
  const stepMs = traj.stateInto(start, probe, 0) && traj.stateInto(from as Instant, probe, 0) ? 1000 : sampleStepMs(probe);
  const breaks = traj.breaks?.length ?? 0;
  const buffer = new Float64Array(new SharedArrayBuffer(8 * sampleCapacity(from, Math.max(to, from), stepMs, breaks)));
  return sampleTrajectory(traj, from as Instant, Math.max(to, from) as Instant, { stepMs, buffer, edgeMs: EDGE_SERVE_MAX_MS });
}

function merge(results: ChunkResult[], wallMs: number): ScreeningOutcome {
  const encounters = results.flatMap((r) => r.encounters);
  encounters.sort((a, b) => a.tca - b.tca || a.primary.localeCompare(b.primary) || a.secondary.localeCompare(b.secondary));
  const flaggedMap = new Map<string, string>();
  for (const r of results) for (const f of r.flagged) if (!flaggedMap.has(f.id)) flaggedMap.set(f.id, f.reason);
  const flagged = [...flaggedMap].map(([id, reason]) => ({ id, reason })).sort((a, b) => a.id.localeCompare(b.id));
  const stats: Record<string, number> = {};
  for (const r of results) for (const [k, v] of Object.entries(r.stats)) stats[k] = (stats[k] ?? 0) + v;
  return { encounters, flagged, cancelled: results.some((r) => r.cancelled), stats, wallMs };
}
