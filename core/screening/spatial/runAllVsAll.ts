/**
 * All-vs-all screening through the spatial index (DESIGN.md "Performance targets"): every
 * thread indexes whole blocks of time for all objects (broadPhase.ts), the candidates are
 * grouped by pair in this thread, and the pairs are refined exactly, shared among the threads.
 * Objects that stop propagating inside the window are screened pair by pair (engine.ts).
 * Results are sorted by the caller (run.ts), so they do not depend on the worker count.
 */
import { wrap, releaseProxy, type Remote } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import type { OrbitElements } from '../../elements/elementSet.js';
import { startWorkers, stopWorkers } from '../../workers/entry.js';
import { packSets } from '../packedSets.js';
import type { ChunkResult } from '../chunk.js';
import type { WindowSettings } from '../engine.js';
import { AllVsAllChunk, stepPlan, INDEX_STEP_MS, type BroadResult } from './chunk.js';
import { groupByPair, type PairRegions } from './candidates.js';
import type { ShardSpec } from './shard.js';
import type { AllVsAllWorkerApi } from './worker.js';

/** One thread's side of the work, whether a worker or this thread. */
interface Side {
  broad(blocks: number[], units: number[]): Promise<BroadResult> | BroadResult;
  refine(pairs: PairRegions, units: number): Promise<ChunkResult> | ChunkResult;
  screenPairwise(objects: number[], all: number[]): Promise<ChunkResult> | ChunkResult;
}

/**
 * Screens every pair of `elementSets` (of one shard, if given). Progress units: the first half
 * of `elementSets.length` for the index, the second half for refinement.
 */
export async function runAllVsAll(
  elementSets: readonly OrbitElements[],
  win: WindowSettings,
  control: Int32Array,
  nWorkers: number,
  shard?: ShardSpec,
): Promise<ChunkResult[]> {
  if (nWorkers <= 0) {
    const c = new AllVsAllChunk(elementSets, win, control, shard);
    return await drive([c], { role: c.role, flagged: c.flaggedIds().length }, elementSets.length, win);
  }
  const workers = await startWorkers('./worker.ts', import.meta.url, nWorkers);
  const apis: Remote<AllVsAllWorkerApi>[] = workers.map((w) => wrap<AllVsAllWorkerApi>(nodeEndpoint(w)));
  try {
    const packed = packSets(elementSets);
    // The roles (indexed, short-lived, flagged) are computed the same way in every thread; this
    // thread needs them too, to choose the pairwise objects: the first worker's are taken
    // (computing them here as well would compete with the workers for the cores).
    const roles = await Promise.all(apis.map((a) => a.init(packed, win, control.buffer as SharedArrayBuffer, shard ?? null)));
    const local = { role: roles[0]!, flagged: roles[0]!.reduce((n, r) => n + (r === 2 ? 1 : 0), 0) };
    return await drive(apis as unknown as Side[], local, elementSets.length, win);
  } finally {
    for (const a of apis) a[releaseProxy]();
    stopWorkers(workers);
  }
}

/** Each object's role (AllVsAllChunk.role) and how many are flagged (left out). */
interface Roles {
  readonly role: Uint8Array;
  readonly flagged: number;
}

async function drive(sides: Side[], local: Roles, total: number, win: WindowSettings): Promise<ChunkResult[]> {
  const n = sides.length;
  const { steps, blocks } = stepPlan(win);
  const indexUnits = Math.floor(total / 2);
  // Blocks handed out one at a time to whichever thread is free (blocks differ in cost, and
  // so do threads on a shared machine); each block's share of the progress units.
  const share = (b: number) => Math.floor(((b + 1) * indexUnits) / blocks) - Math.floor((b * indexUnits) / blocks);
  let next = 0;
  const broad = await Promise.all(
    sides.map(async (s) => {
      const parts: BroadResult[] = [];
      while (next < blocks) {
        const b = next++;
        parts.push(await s.broad([b], [share(b)]));
      }
      return joinBroad(parts);
    }),
  );

  // Indexed objects whose sampling failed somewhere are screened pairwise, with the short-lived.
  const failed = new Set(broad.flatMap((r) => r.failed));
  const pairwise: number[] = [];
  local.role.forEach((r, i) => {
    if (r === 1 || failed.has(i)) pairwise.push(i);
  });
  const parts = broad.map((r) => r.candidates);
  const grouped = groupByPair(failed.size > 0 ? parts.map((c) => dropObjects(c, failed)) : parts, total, steps, win.start, INDEX_STEP_MS);

  // Pairs interleaved among threads (neighbouring pairs share objects and cost alike).
  const refineUnits = total - indexUnits;
  const nPairs = grouped.first.length;
  const pieces = sides.map((_, w) => slicePairs(grouped, w, n));
  const unitsOf = (w: number) => (nPairs === 0 ? (w === 0 ? refineUnits : 0) : Math.floor((pieces[w]!.first.length * refineUnits) / nPairs));
  const refined = await Promise.all(sides.map((s, w) => s.refine(pieces[w]!, unitsOf(w))));
  const pw = await Promise.all(sides.map((s, w) => s.screenPairwise(pairwise.filter((_, q) => q % n === w), pairwise)));
  const stats = broad.map((b) => b.stats as unknown as Record<string, number>);
  return sides.map((_, w) => ({
    encounters: [...refined[w]!.encounters, ...pw[w]!.encounters],
    flagged: [...refined[w]!.flagged, ...pw[w]!.flagged],
    // Session statistics are cumulative per thread: the last call's are the thread's total.
    stats: { ...stats[w], ...pw[w]!.stats, indexedObjects: w === 0 ? total - pairwise.length - local.flagged : 0 },
    cancelled: refined[w]!.cancelled || pw[w]!.cancelled,
  }));
}

/** One thread's results of several broad() calls as one. */
function joinBroad(parts: readonly BroadResult[]): BroadResult {
  const stats = { steps: 0, objectSteps: 0, pairTests: 0, candidates: 0, sgp4Evaluations: 0 };
  for (const p of parts) for (const k of Object.keys(stats) as (keyof typeof stats)[]) stats[k] += p.stats[k];
  const cat = (pick: (c: BroadResult['candidates']) => Int32Array): Int32Array => {
    const out = new Int32Array(parts.reduce((a, p) => a + pick(p.candidates).length, 0));
    let at = 0;
    for (const p of parts) {
      out.set(pick(p.candidates), at);
      at += pick(p.candidates).length;
    }
    return out;
  };
  return {
    candidates: { i: cat((c) => c.i), j: cat((c) => c.j), k: cat((c) => c.k) },
    stats,
    failed: [...new Set(parts.flatMap((p) => p.failed))],
  };
}

function dropObjects(c: BroadResult['candidates'], drop: Set<number>): BroadResult['candidates'] {
  const keep: number[] = [];
  for (let x = 0; x < c.i.length; x++) if (!drop.has(c.i[x]!) && !drop.has(c.j[x]!)) keep.push(x);
  const pick = (a: Int32Array) => Int32Array.from(keep, (x) => a[x]!);
  return { i: pick(c.i), j: pick(c.j), k: pick(c.k) };
}

/** Pairs p ≡ w (mod n), with their regions. */
function slicePairs(g: PairRegions, w: number, n: number): PairRegions {
  const first: number[] = [], second: number[] = [], offsets: number[] = [0], regions: number[] = [];
  for (let p = w; p < g.first.length; p += n) {
    first.push(g.first[p]!);
    second.push(g.second[p]!);
    for (let r = g.offsets[p]!; r < g.offsets[p + 1]!; r++) regions.push(g.regions[r]!);
    offsets.push(regions.length);
  }
  return { first: Int32Array.from(first), second: Int32Array.from(second), offsets: Int32Array.from(offsets), regions: Float64Array.from(regions) };
}
