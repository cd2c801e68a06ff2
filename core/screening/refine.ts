import type { Instant } from '../time/instant.js';
import type { FailureReason, Trajectory } from '../propagation/trajectory.js';
import { brentRoot, goldenMin } from '../math/brent.js';
import { approachAngleDeg, relativeRtn, volumeBoundKm, volumeMetric } from './geometry.js';
import type { ScreeningVolume } from './types.js';
import type { Encounter, StateArray } from '../events/index.js';
import { norm3 } from '../math/norm.js';

/** TCA accuracy: the range-rate root is solved to 1 µs (requirement: 1 ms). */
const TCA_TOL_S = 1e-6;
/**
 * Step of the five-point derivative of ½|Δr|² (ms): 1/4000 of the shorter period, within
 * [1 s, 8 s]. Large enough that SGP4's µm-level non-smooth position noise does not move a slow
 * (≈1 m/s) GEO encounter's root by a millisecond (error ∝ noise/(δ·v²): 1.0 ms measured at
 * δ = 2 s, so ≈0.26 ms at 8 s); small enough that the O(δ⁴) truncation error, which scales
 * with (δ·n)⁴, stays far below 1 ms.
 */
export const rateDeltaFor = (minPeriodMin: number): number =>
  Math.min(8000, Math.max(1000, (minPeriodMin * 60_000) / 4000));
/** Entry/exit times of the volume are solved to 1 ms. */
const ENTRY_TOL_S = 1e-3;

export interface PairContext {
  readonly p: Trajectory;
  readonly s: Trajectory;
  readonly primaryEpoch: Instant;
  readonly secondaryEpoch: Instant;
  readonly volume: ScreeningVolume;
  /** screening window */
  readonly start: Instant;
  readonly end: Instant;
  /** the shorter of the two orbital periods (min): sets the differencing step of the range rate */
  readonly minPeriodMin: number;
}

export class PropagationError extends Error {
  constructor(readonly objectId: string, readonly reason: FailureReason, readonly at: number) {
    super(`${objectId}: ${reason}`);
  }
}

/** Evaluates both exact states at t (ms) into one buffer: primary at 0, secondary at 6. */
class PairEvaluator {
  readonly buf = new Float64Array(12);
  evaluations = 0;
  private readonly rateDeltaMs: number;
  constructor(private readonly ctx: PairContext) {
    this.rateDeltaMs = rateDeltaFor(ctx.minPeriodMin);
  }

  at(t: number): Float64Array {
    this.evaluations += 2;
    const fp = this.ctx.p.stateInto(t as Instant, this.buf, 0);
    if (fp) throw new PropagationError(this.ctx.p.objectId, fp, t);
    const fs = this.ctx.s.stateInto(t as Instant, this.buf, 6);
    if (fs) throw new PropagationError(this.ctx.s.objectId, fs, t);
    return this.buf;
  }

  /**
   * Δr·dΔr/dt (km²/s): negative while closing, positive while opening; its root is the TCA.
   * It is the derivative of ½|Δr|² from positions, not Δr·Δv with SGP4's velocity output:
   * SGP4's velocity is not exactly the derivative of its position (|v − dr/dt| up to ~2e-5 km/s
   * in LEO, more for GTO), which would move the root by |Δr|·δv/|Δv|² — seconds in a slow
   * encounter. Differencing costs more evaluations but keeps TCA on the distance minimum.
   */
  rangeRate(t: number): number {
    // d/dt of ½|Δr|² by the five-point stencil (error O(δ⁴), see RATE_DELTA_MS).
    const d = this.rateDeltaMs;
    return (
      (-this.sq(t + 2 * d) + 8 * this.sq(t + d) - 8 * this.sq(t - d) + this.sq(t - 2 * d)) / (24 * (d / 1000))
    );
  }

  private sq(t: number): number {
    const b = this.at(t);
    const x = b[6]! - b[0]!, y = b[7]! - b[1]!, z = b[8]! - b[2]!;
    return x * x + y * y + z * z;
  }

  distance(t: number): number {
    const b = this.at(t);
    return norm3(b[6]! - b[0]!, b[7]! - b[1]!, b[8]! - b[2]!);
  }

  metric(t: number): number {
    const b = this.at(t);
    return volumeMetric(this.ctx.volume, b.subarray(0, 6), b.subarray(6, 12));
  }
}

/**
 * Finds every local minimum of the exact distance in [a, b] (ms) whose volume test passes:
 * samples the range-rate g = Δr·Δv every `stepMs`, brackets each − → + sign change and solves
 * it with Brent's method. A minimum on a screening-window edge (g > 0 at the start, g < 0 at
 * the end) is reported at the edge. `stepMs` must be below the spacing of distinct minima
 * (callers use ≤ 1/16 of the shorter period).
 */
export function findEncounters(ctx: PairContext, a: number, b: number, stepMs: number): Encounter[] {
  const ev = new PairEvaluator(ctx);
  const out: Encounter[] = [];
  const bound = volumeBoundKm(ctx.volume);
  const n = Math.max(1, Math.ceil((b - a) / stepMs));
  const h = (b - a) / n;
  let t0 = a, g0 = ev.rangeRate(a);
  if (a <= ctx.start && g0 > 0) consider(a, true);
  for (let k = 1; k <= n; k++) {
    const t1 = k === n ? b : a + k * h;
    const g1 = ev.rangeRate(t1);
    if (g0 < 0 && g1 >= 0) {
      // Solve in seconds from t0 for conditioning.
      const f = (x: number) => ev.rangeRate(t0 + x * 1000);
      const x = brentRoot(f, 0, (t1 - t0) / 1000, g0, g1, TCA_TOL_S);
      consider(t0 + x * 1000, false);
    }
    t0 = t1;
    g0 = g1;
  }
  if (b >= ctx.end && g0 < 0) consider(b, true);
  return out;

  function consider(tca: number, atEdge: boolean): void {
    const s = ev.at(tca);
    const p6 = Array.from(s.subarray(0, 6)) as unknown as StateArray;
    const s6 = Array.from(s.subarray(6, 12)) as unknown as StateArray;
    const miss = norm3(s6[0] - p6[0], s6[1] - p6[1], s6[2] - p6[2]);
    if (miss > bound) return;
    const vrel = norm3(s6[3] - p6[3], s6[4] - p6[4], s6[5] - p6[5]);
    // Time scale of the pass: how long the relative motion takes to cross the volume.
    const crossS = Math.min(3600, (2 * bound) / Math.max(vrel, 1e-6));
    let inside: number;
    let qTime = tca;
    if (ctx.volume.kind === 'sphere') inside = miss / ctx.volume.radiusKm;
    else {
      // The ellipsoid's deepest point need not be at TCA: minimise the metric around it.
      const lo = Math.max(ctx.start, tca - crossS * 1000), hi = Math.min(ctx.end, tca + crossS * 1000);
      const m = goldenMin((x) => ev.metric(x), lo, hi, 1);
      inside = Math.min(m.fx, ev.metric(tca));
      if (m.fx < ev.metric(tca)) qTime = m.x;
    }
    if (inside > 1) return;
    const entry = crossing(qTime, -1, crossS);
    const exit = crossing(qTime, +1, crossS);
    const st = ev.at(tca);
    const ps = Array.from(st.subarray(0, 6)) as unknown as StateArray;
    const ss = Array.from(st.subarray(6, 12)) as unknown as StateArray;
    out.push({
      primary: ctx.p.objectId,
      secondary: ctx.s.objectId,
      tca: tca as Instant,
      missKm: miss,
      relativeSpeedKmS: vrel,
      rtnKm: relativeRtn(ps, ss),
      approachAngleDeg: approachAngleDeg(ps, ss),
      entry: entry as Instant | null,
      exit: exit as Instant | null,
      primaryState: ps,
      secondaryState: ss,
      primaryEpoch: ctx.primaryEpoch,
      secondaryEpoch: ctx.secondaryEpoch,
      ...(atEdge ? { atWindowEdge: true } : {}),
    } as Encounter);
  }

  /** Volume boundary crossing before (dir −1) or after (+1) t; null if the window edge comes first. */
  function crossing(t: number, dir: -1 | 1, crossS: number): number | null {
    const limit = dir < 0 ? ctx.start : ctx.end;
    let step = Math.max(0.05, crossS / 8) * 1000;
    let prev = t;
    for (let i = 0; i < 400; i++) {
      let next = prev + dir * step;
      if (dir < 0 ? next <= limit : next >= limit) {
        next = limit;
        if (ev.metric(next) <= 1) return null;
      }
      if (ev.metric(next) > 1) {
        const lo = Math.min(prev, next), hi = Math.max(prev, next);
        const f = (x: number) => ev.metric(lo + x * 1000) - 1;
        const x = brentRoot(f, 0, (hi - lo) / 1000, f(0), f((hi - lo) / 1000), ENTRY_TOL_S);
        return lo + x * 1000;
      }
      prev = next;
      step *= 1.5;
    }
    return null;
  }
}
