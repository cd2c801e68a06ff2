import { KeepclearError } from '../errors.js';
import type { OrbitElements } from '../elements/elementSet.js';
import { objectFromElements, objectFromSamples, ScreeningSession, type ScreeningObject, type WindowSettings } from './engine.js';
import type { SampleTable } from '../propagation/sampledTrajectory.js';
import type { Instant } from '../time/instant.js';
import { StateGrid } from './primaryGrid.js';
import type { FlaggedObject } from './types.js';
import type { Encounter } from '../events/index.js';

/**
 * Shared control block: [0] cancel flag, [1] units of work done (all workers together),
 * [2] the next secondary not yet claimed (fleet screening, ScreeningChunk.screenShared).
 */
export const CTRL_CANCEL = 0;
export const CTRL_DONE = 1;
export const CTRL_NEXT = 2;
export const CONTROL_SLOTS = 3;
/** A control block for one screening, in shared memory (zeroed). */
export const newControl = (): Int32Array => new Int32Array(new SharedArrayBuffer(4 * CONTROL_SLOTS));
/**
 * Secondaries a thread claims at a time. Claimed, not dealt out in advance: with a fixed
 * interleaved split one thread of a 20-primary week sat idle for 1.25 s of 10.7 s at the end
 * (per-object cost varies tenfold). A claimed block meets one primary at a time (screenShared),
 * and each pair reads that primary's grid at ~200 scattered plane crossings: a LEO week's grid is
 * ~8,000 cache lines, so with 64 secondaries a pass read most lines about once and missed the
 * cache; with 512 the same lines serve eight times as many pairs (20-primary week, 3 alternating
 * runs each: 7.9–8.6 s → 7.5–8.1 s). 512 objects are ~0.25 s of that week's work per thread (the
 * most the other thread can wait for the last claim), ~25 ms for 1 primary.
 * At most engine.ts's TABLES_KEPT, so a block's time-filter tables stay computed while every
 * primary meets it.
 */
const CLAIM_BLOCK = 512;

/** Where each primary's grid lives inside the shared grid buffer. */
export interface GridLayout {
  readonly id: string;
  readonly offset: number; // in doubles
  readonly count: number;
  readonly stepMs: number;
  readonly vMaxKmS: number;
}

/** A primary given as samples of a trajectory (values in shared memory) and its data epoch. */
export interface SampledPrimary {
  readonly table: SampleTable;
  readonly epoch: Instant;
}

export interface ChunkResult {
  encounters: Encounter[];
  flagged: FlaggedObject[];
  stats: Record<string, number>;
  cancelled: boolean;
}

/**
 * The work one thread does: owns the objects it was given, reads primary grids from shared
 * memory, screens its share of secondaries. Used by the worker and, with workers = 0, in-process.
 */
export class ScreeningChunk {
  private readonly objects: ScreeningObject[];
  private readonly byId = new Map<string, number>();
  private readonly session: ScreeningSession;
  private grids = new Map<string, StateGrid>();

  constructor(
    elementSets: readonly OrbitElements[],
    readonly settings: WindowSettings,
    private readonly control: Int32Array,
    sampled: readonly SampledPrimary[] = [],
  ) {
    this.objects = elementSets.map(objectFromElements);
    for (const p of sampled) this.objects.push(objectFromSamples(p.table, p.epoch));
    this.objects.forEach((o, i) => this.byId.set(o.id, i));
    this.session = new ScreeningSession(settings);
  }

  /** Checks every object's propagation over the window (flagging failures); returns how many fail. */
  checkPropagation(): number {
    let failed = 0;
    for (const o of this.objects) if (this.session.validUntil(o) === null) failed++;
    return failed;
  }

  /** Computes grids of the given primaries into the shared buffer; returns their layout. */
  buildGrids(layout: readonly { id: string; offset: number; count: number; stepMs: number }[], shared: Float64Array): GridLayout[] {
    const out: GridLayout[] = [];
    for (const l of layout) {
      const o = this.objects[this.byId.get(l.id)!]!;
      const g = this.session.grid(o, shared.subarray(l.offset, l.offset + l.count * 6));
      // A primary that decays inside the window has a shorter grid (and a step that ends it at the decay).
      out.push({ ...l, count: g ? g.count : 0, stepMs: g ? g.stepMs : l.stepMs, vMaxKmS: g ? g.vMaxKmS : -1 });
    }
    return out;
  }

  attachGrids(layout: readonly GridLayout[], shared: Float64Array): void {
    this.grids = new Map();
    for (const l of layout) {
      if (l.vMaxKmS < 0) continue; // that primary failed to propagate (flagged where built)
      const states = shared.subarray(l.offset, l.offset + l.count * 6);
      this.grids.set(l.id, new StateGrid(this.settings.start, l.stepMs, l.count, states, l.vMaxKmS));
    }
  }

  /**
   * Screens primaries (with attached grids) against the secondaries this thread claims, in blocks
   * of CLAIM_BLOCK, from the control block's counter shared by every thread of the run. A pair of
   * two primaries is screened once, from the primary listed first.
   */
  screenShared(primaryIds: readonly string[]): ChunkResult {
    if (this.control.length < CONTROL_SLOTS) {
      throw new KeepclearError('INTERNAL', `screening control block has ${this.control.length} slots, fleet screening needs ${CONTROL_SLOTS} (newControl())`);
    }
    const out: Encounter[] = [];
    const prim = primaryIds
      .map((id) => ({ o: this.objects[this.byId.get(id)!]!, g: this.grids.get(id) }))
      .filter((x): x is { o: ScreeningObject; g: StateGrid } => x.g !== undefined);
    const primSet = new Set(primaryIds);
    const primIndex = new Map(primaryIds.map((id, i) => [id, i]));
    const n = this.objects.length;
    // Every thread of the run claims blocks of secondaries from the shared counter until none are left.
    for (let from = Atomics.add(this.control, CTRL_NEXT, CLAIM_BLOCK); from < n; from = Atomics.add(this.control, CTRL_NEXT, CLAIM_BLOCK)) {
      const to = Math.min(n, from + CLAIM_BLOCK);
      const block: ScreeningObject[] = [];
      for (let i = from; i < to; i++) {
        // Every object's propagation is checked once, so a failing one is flagged even when no
        // pair of it survives the first filters.
        if (this.session.validUntil(this.objects[i]!) !== null) block.push(this.objects[i]!);
      }
      // Primary by primary within the block, so that a primary's exact grid (~0.5 MB for a week
      // in LEO) is read for many pairs in a row. Secondary by secondary, the plane-crossing
      // tests went through every primary's grid in turn (~10 MB for 20): random reads cost
      // 21–35 ns in one grid and 93–111 ns across 20 (measured), and those reads were three
      // quarters of the filter's own time in the profile of the 20-primary bench week. Measured
      // gain: 7.56–8.58 → 7.45–7.66 s for that week (3 alternating runs each).
      for (const { o: p, g } of prim) {
        for (const s of block) {
          if (Atomics.load(this.control, CTRL_CANCEL)) return this.result(out, true);
          // A pair of two primaries is screened once, from the primary listed first.
          if (primSet.has(s.id) && primIndex.get(s.id)! <= primIndex.get(p.id)!) continue;
          for (const e of this.session.screenPair(p, g, s)) out.push(e);
        }
      }
      Atomics.add(this.control, CTRL_DONE, to - from);
    }
    return this.result(out, false);
  }

  /** All-vs-all: primaries ≡ part (mod parts), each against every object of higher index. */
  screenAllPairs(part: number, parts: number): ChunkResult {
    const out: Encounter[] = [];
    for (let i = part; i < this.objects.length; i += parts) {
      if (Atomics.load(this.control, CTRL_CANCEL)) return this.result(out, true);
      const p = this.objects[i]!;
      const g = this.session.grid(p);
      if (g) {
        for (let j = i + 1; j < this.objects.length; j++) {
          for (const e of this.session.screenPair(p, g, this.objects[j]!)) out.push(e);
        }
      }
      Atomics.add(this.control, CTRL_DONE, 1);
    }
    return this.result(out, false);
  }

  private result(encounters: Encounter[], cancelled: boolean): ChunkResult {
    return { encounters, flagged: this.session.flaggedList(), stats: { ...this.session.stats }, cancelled };
  }
}
