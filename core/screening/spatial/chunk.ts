/**
 * The all-vs-all work one thread does (a worker, or the calling thread with workers = 0):
 *  1. `broad`: the spatial index over the blocks of time it is given (broadPhase.ts);
 *  2. `refine`: exact refinement (refine.ts) of the candidate pairs it is given, each over its
 *     candidate regions padded by one refinement step, exactly as the pair-by-pair engine does;
 *  3. `screenPairwise`: objects that stop propagating inside the window (decay; found by the
 *     validity probe, or by the index's sampling when the probe missed it) are screened by the
 *     pair-by-pair engine against every object, up to their first failure (their exact grid
 *     ends there: ScreeningSession.grid).
 * Objects whose propagation fails at the window start are flagged and left out.
 */
import type { OrbitElements } from '../../elements/elementSet.js';
import type { Encounter } from '../../events/index.js';
import { objectFromElements, ScreeningSession, type ScreeningObject, type WindowSettings } from '../engine.js';
import { padClipMerge } from '../regions.js';
import { findEncounters, PropagationError } from '../refine.js';
import { volumeBoundKm } from '../geometry.js';
import { CTRL_CANCEL, CTRL_DONE, type ChunkResult } from '../chunk.js';
import { BlockTracks } from './blockTracks.js';
import { broadPhase, type BroadPhaseStats } from './broadPhase.js';
import { CandidateList, type Candidates, type PairRegions } from './candidates.js';
import { SortedCells } from './sortedCells.js';
import { samplingPlan, type SamplingPlan } from './sampling.js';
import { pairFilter, type ShardSpec } from './shard.js';

/**
 * Index step Δ (ms). Each step costs a fixed amount per object (interpolation, cell insert,
 * neighbour look-ups) while the pairs tested per step grow with the cell volume (∝ Δ² in a thin
 * shell): on the 30,000-object catalogue, 20 s cost least (measured 10 s: 1.5×, 40 s: 1.1×).
 */
export const INDEX_STEP_MS = 20_000;
/** Steps per block of time (1 h): blocks are the unit of work shared among threads. */
export const BLOCK_STEPS = 180;
/** Range-rate sampling step in refinement: ≤ 1/16 of the shorter period, at most 60 s (as engine.ts). */
const REFINE_MAX_STEP_MS = 60_000;

export interface BroadResult {
  candidates: Candidates;
  stats: BroadPhaseStats & { sgp4Evaluations: number };
  /** indexed objects whose SGP4 sampling failed in a block (screened pairwise instead) */
  failed: number[];
}

/** How the window is cut into index steps and blocks (the same in every thread). */
export function stepPlan(win: WindowSettings): { steps: number; blocks: number } {
  const steps = Math.max(1, Math.ceil((win.end - win.start) / INDEX_STEP_MS));
  return { steps, blocks: Math.ceil(steps / BLOCK_STEPS) };
}

export class AllVsAllChunk {
  readonly objects: ScreeningObject[];
  readonly session: ScreeningSession;
  /** 0 indexed, 1 short-lived (screened pairwise), 2 left out (flagged) */
  readonly role: Uint8Array;
  private readonly plans: SamplingPlan[];
  private readonly keep: (i: number, j: number) => boolean;
  private readonly extra = { refinedPairs: 0, regions: 0, shortLived: 0 };

  constructor(
    elementSets: readonly OrbitElements[],
    readonly settings: WindowSettings,
    private readonly control: Int32Array,
    shard?: ShardSpec,
  ) {
    this.objects = elementSets.map(objectFromElements);
    this.session = new ScreeningSession(settings);
    this.plans = elementSets.map((e) => samplingPlan(e.meanMotionRevPerDay, e.eccentricity));
    this.keep = pairFilter(this.objects.map((o) => o.id), shard);
    this.role = new Uint8Array(this.objects.length);
    // The index samples up to the end of the last step, ≤ end + Δ.
    const need = settings.end + INDEX_STEP_MS;
    this.objects.forEach((o, i) => {
      const until = this.session.validUntil(o);
      this.role[i] = until === null ? 2 : until < need ? 1 : 0;
    });
  }

  private cancelled = (): boolean => Atomics.load(this.control, CTRL_CANCEL) !== 0;

  /** The spatial index over the given blocks. `progressUnits[b]` is added to the shared count per block. */
  broad(blocks: readonly number[], progressUnits: readonly number[]): BroadResult {
    const { steps } = stepPlan(this.settings);
    const members = Int32Array.from(this.objects.flatMap((_, i) => (this.role[i] === 0 ? [i] : [])));
    const trajectories = this.objects.map((o) => o.trajectory);
    const cells = new SortedCells(this.objects.length);
    const out = new CandidateList();
    const stats = { steps: 0, objectSteps: 0, pairTests: 0, candidates: 0, sgp4Evaluations: 0 };
    const failed = new Set<number>();
    const s = { start: this.settings.start, stepMs: INDEX_STEP_MS, dKm: volumeBoundKm(this.settings.volume) };
    for (let n = 0; n < blocks.length; n++) {
      const b = blocks[n]!;
      const k0 = b * BLOCK_STEPS, k1 = Math.min(steps, k0 + BLOCK_STEPS);
      const tracks = new BlockTracks(s.start + k0 * INDEX_STEP_MS, s.start + k1 * INDEX_STEP_MS, trajectories, this.plans, members);
      stats.sgp4Evaluations += tracks.sgp4Evaluations;
      for (const i of members) if (!tracks.ok[i]) failed.add(i);
      if (!broadPhase(tracks, cells, s, k0, k1, this.keep, out, stats, this.cancelled)) break;
      Atomics.add(this.control, CTRL_DONE, progressUnits[n] ?? 0);
    }
    return { candidates: out.take(), stats, failed: [...failed] };
  }

  /** Exact refinement of candidate pairs; `units` are added to the shared count as pairs finish. */
  refine(pairs: PairRegions, units: number): ChunkResult {
    const out: Encounter[] = [];
    const { start, end } = this.settings;
    const nPairs = pairs.first.length;
    let reported = 0;
    for (let p = 0; p < nPairs; p++) {
      if (this.cancelled()) return this.result(out, true);
      const a = this.objects[pairs.first[p]!]!, b = this.objects[pairs.second[p]!]!;
      const regions = Array.from(pairs.regions.subarray(pairs.offsets[p]!, pairs.offsets[p + 1]!));
      const minPeriodMin = Math.min(a.periodMin, b.periodMin);
      const step = Math.min(REFINE_MAX_STEP_MS, (minPeriodMin * 60_000) / 16);
      const merged = padClipMerge(regions, step, start, end);
      this.extra.refinedPairs++;
      this.extra.regions += merged.length / 2;
      const ctx = {
        p: a.trajectory, s: b.trajectory, primaryEpoch: a.epoch, secondaryEpoch: b.epoch,
        volume: this.settings.volume, start, end, minPeriodMin,
      };
      const found: Encounter[] = [];
      try {
        for (let r = 0; r < merged.length; r += 2) {
          const lo = merged[r]!, hi = merged[r + 1]!;
          const es = findEncounters(ctx, lo, hi, step);
          this.session.stats.sgp4Evaluations += 2 * (Math.ceil((hi - lo) / step) + 30 * es.length);
          // Neighbouring regions can meet at one minimum; keep it once (as engine.ts).
          for (const e of es) if (!found.some((x) => Math.abs(x.tca - e.tca) < 1)) found.push(e);
        }
      } catch (err) {
        if (!(err instanceof PropagationError)) throw err;
        this.session.flag(err.objectId, `propagation failed: ${err.reason} at ${new Date(err.at).toISOString()}`);
      }
      for (const e of found) out.push(e);
      const due = Math.floor(((p + 1) * units) / nPairs);
      if (due > reported) {
        Atomics.add(this.control, CTRL_DONE, due - reported);
        reported = due;
      }
    }
    return this.result(out, false);
  }

  /**
   * Objects screened by the pair-by-pair engine against every other object (short-lived ones,
   * and indexed ones whose sampling failed); each such object is the primary of its pairs, and
   * a pair of two of them is screened once, from the one listed first.
   */
  screenPairwise(objectIndices: readonly number[], all: readonly number[]): ChunkResult {
    const out: Encounter[] = [];
    const listed = new Map(all.map((x, n) => [x, n]));
    for (const x of objectIndices) {
      if (this.cancelled()) return this.result(out, true);
      this.extra.shortLived++;
      const p = this.objects[x]!;
      const g = this.session.grid(p);
      if (!g) continue;
      for (let y = 0; y < this.objects.length; y++) {
        if (y === x || this.role[y] === 2) continue;
        const ny = listed.get(y);
        if (ny !== undefined && ny < listed.get(x)!) continue;
        if (!this.keep(Math.min(x, y), Math.max(x, y))) continue;
        for (const e of this.session.screenPair(p, g, this.objects[y]!)) out.push(e);
      }
    }
    return this.result(out, false);
  }

  flaggedIds(): string[] {
    return this.objects.filter((_, i) => this.role[i] === 2).map((o) => o.id);
  }

  private result(encounters: Encounter[], cancelled: boolean): ChunkResult {
    return {
      encounters,
      flagged: this.session.flaggedList(),
      stats: { ...this.session.stats, ...this.extra },
      cancelled,
    };
  }
}
