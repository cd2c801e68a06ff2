import type { Instant } from '../time/instant.js';
import type { FailureReason, Trajectory } from '../propagation/trajectory.js';
import { buildPlanarTrack, type PlanarTrack } from './planarTrack.js';
import { norm3 } from '../math/norm.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../units.js';

const MU_KM3_S2 = MU_EARTH_WGS72;
/** Lower bound of any radius a grid can hold (km): keeps the pad finite for a decaying object. */
const R_EARTH_KM = R_EARTH_WGS72 - 100;

/**
 * Exact states of one object on a uniform time grid, interpolated by cubic Hermite (position
 * and velocity at both ends). With the step of gridStepMs the interpolation error stays below
 * ~1.4 m (see there; measured in test/screening-grid.test.ts), far inside the filter pads.
 * The array can live in a SharedArrayBuffer so every worker reads the same ephemeris.
 */
export class StateGrid {
  constructor(
    readonly start: number,
    readonly stepMs: number,
    readonly count: number,
    /** x y z vx vy vz per grid point (km, km/s) */
    readonly states: Float64Array,
    readonly vMaxKmS: number,
  ) {}

  private rMax = -1;
  private rMin = -1;
  private planar: PlanarTrack | null = null;
  /** The grid in block-wise orbit-plane coordinates, built on first use. */
  track(): PlanarTrack {
    return (this.planar ??= buildPlanarTrack(this));
  }

  /** Upper bound of |r| over the grid (km), computed once. */
  maxRadiusKm(): number {
    if (this.rMax < 0) this.radiusBounds();
    return this.rMax;
  }

  /** Lower bound of |r| over the grid (km), computed once. */
  minRadiusKm(): number {
    if (this.rMin < 0) this.radiusBounds();
    return this.rMin;
  }

  private radiusBounds(): void {
    let lo = Infinity, hi = 0;
    const x = this.states;
    for (let j = 0; j < this.count; j++) {
      const r = norm3(x[j * 6]!, x[j * 6 + 1]!, x[j * 6 + 2]!);
      if (r < lo) lo = r;
      if (r > hi) hi = r;
    }
    // Between grid points |r| leaves the samples' range by at most max|d²|r|/dt²|·h²/8, and
    // d²|r|/dt² = (v² − ṙ²)/|r| + r̂·a lies within [−1.01·μ/r², v²/r] (gravity pulls inwards; J2
    // changes it by < 1 %): ~3 km for a 54-s LEO step, ~1.3 km near a 42-s step's perigee at
    // e = 0.7. At least 1 km.
    const h = this.stepMs / 1000, rLow = Math.max(lo, R_EARTH_KM);
    const pad = Math.max(1, (Math.max(this.vMaxKmS * this.vMaxKmS / rLow, (1.01 * MU_KM3_S2) / (rLow * rLow)) * h * h) / 8);
    this.rMax = hi + pad;
    this.rMin = Math.max(0, lo - pad);
  }

  timeAt(j: number): number {
    return this.start + j * this.stepMs;
  }

  positionInto(t: number, out: Float64Array, off: number): void {
    let j = Math.floor((t - this.start) / this.stepMs);
    if (j < 0) j = 0;
    if (j > this.count - 2) j = this.count - 2;
    const h = this.stepMs / 1000;
    const s = (t - this.start - j * this.stepMs) / this.stepMs;
    const s2 = s * s, s3 = s2 * s;
    const h00 = 2 * s3 - 3 * s2 + 1, h10 = s3 - 2 * s2 + s, h01 = -2 * s3 + 3 * s2, h11 = s3 - s2;
    const a = j * 6, b = a + 6, x = this.states;
    for (let c = 0; c < 3; c++) {
      out[off + c] = h00 * x[a + c]! + h10 * h * x[a + 3 + c]! + h01 * x[b + c]! + h11 * h * x[b + 3 + c]!;
    }
  }

  /** Position (km) and velocity (km/s, the derivative of the same cubic) at t into out[off..off+5]. */
  stateInto(t: number, out: Float64Array, off: number): void {
    let j = Math.floor((t - this.start) / this.stepMs);
    if (j < 0) j = 0;
    if (j > this.count - 2) j = this.count - 2;
    const h = this.stepMs / 1000;
    const s = (t - this.start - j * this.stepMs) / this.stepMs;
    const s2 = s * s, s3 = s2 * s;
    const h00 = 2 * s3 - 3 * s2 + 1, h10 = s3 - 2 * s2 + s, h01 = -2 * s3 + 3 * s2, h11 = s3 - s2;
    const d00 = (6 * s2 - 6 * s) / h, d10 = 3 * s2 - 4 * s + 1, d01 = (6 * s - 6 * s2) / h, d11 = 3 * s2 - 2 * s;
    const a = j * 6, b = a + 6, x = this.states;
    for (let c = 0; c < 3; c++) {
      const p0 = x[a + c]!, v0 = x[a + 3 + c]!, p1 = x[b + c]!, v1 = x[b + 3 + c]!;
      out[off + c] = h00 * p0 + h10 * h * v0 + h01 * p1 + h11 * h * v1;
      out[off + 3 + c] = d00 * p0 + d10 * v0 + d01 * p1 + d11 * v1;
    }
  }
}

/**
 * Grid step (ms) from the fastest angular rate of the orbit, its rate at perigee n_p: cubic
 * Hermite interpolation errs by ≤ h⁴/384·|r⁽⁴⁾| ≈ (h·n_p)⁴/384·r, so h·n_p ≤ GRID_TURN_RAD keeps
 * it below (0.06)⁴/384 ≈ 3.4e-8 of the radius (0.24 m in LEO, 1.4 m at GEO radius), inside
 * the filters' GRID_EPS_KM = 10 m (test/screening-grid.test.ts measures it). Between 5 and 60 s.
 */
export function gridStepMs(meanMotionRevPerDay: number, eccentricity = 0): number {
  const n = (meanMotionRevPerDay * 2 * Math.PI) / 86_400; // rad/s
  const e = Math.min(Math.max(eccentricity, 0), 0.99);
  const perigeeRate = (n * Math.sqrt(1 + e)) / Math.pow(1 - e, 1.5); // h/r_p² = n·√(1+e)/(1−e)^1.5
  const s = Math.min(60, Math.max(5, GRID_TURN_RAD / perigeeRate));
  return s * 1000;
}

const GRID_TURN_RAD = 0.06;

/** Fills a grid from a trajectory; returns the failure if any grid point cannot be computed. */
export function buildStateGrid(
  traj: Trajectory,
  start: Instant,
  end: Instant,
  stepMs: number,
  buffer?: Float64Array,
): StateGrid | { failure: FailureReason; at: number } {
  return buildStateGridPoints(traj, start, gridPointCount(start, end, stepMs), stepMs, buffer);
}

/** A grid of exactly `count` points from `start` (the point count given, not derived from an end in floating point). */
export function buildStateGridPoints(
  traj: Trajectory,
  start: Instant,
  count: number,
  stepMs: number,
  buffer?: Float64Array,
): StateGrid | { failure: FailureReason; at: number } {
  if (buffer && buffer.length < count * 6) throw new Error(`grid buffer holds ${buffer.length / 6} points, ${count} needed`);
  const states = buffer ?? new Float64Array(count * 6);
  let vMax = 0;
  for (let j = 0; j < count; j++) {
    const t = (start + j * stepMs) as Instant;
    const f = traj.stateInto(t, states, j * 6);
    if (f) return { failure: f, at: t };
    vMax = Math.max(vMax, norm3(states[j * 6 + 3]!, states[j * 6 + 4]!, states[j * 6 + 5]!));
  }
  return new StateGrid(start, stepMs, count, states, vMax);
}

/**
 * The grid of an object that stops propagating at `until` (≤ the window end): it ends exactly
 * there, its step shortened to the largest ≤ `stepMs` that divides [start, until] evenly (a
 * shorter step only makes the interpolation better), so no instant the object is screened at
 * lies beyond its last point. If a point fails even so (SGP4's failure need not be monotonic in
 * time), the grid ends at its last point before that failure (reported as `failure`, `failedAt`),
 * and the object is screened up to that point. Null when not even one step can be computed.
 */
export function buildStateGridUntil(
  traj: Trajectory,
  start: Instant,
  until: number,
  stepMs: number,
  buffer?: Float64Array,
): { grid: StateGrid; failure: FailureReason | null; failedAt: number } | null {
  const span = until - start;
  if (!(span > 0)) return null;
  const k = Math.max(1, Math.ceil((span - STEP_COUNT_SLACK_MS) / stepMs));
  const h = span / k;
  const g = buildStateGridPoints(traj, start, k + 1, h, buffer);
  if (!('failure' in g)) return { grid: g, failure: null, failedAt: NaN };
  // The points before the failing one were computed: the grid keeps them.
  const count = Math.round((g.at - start) / h);
  if (count < 2) return null;
  const kept = buildStateGridPoints(traj, start, count, h, buffer);
  return 'failure' in kept ? null : { grid: kept, failure: g.failure, failedAt: g.at };
}

/**
 * A span longer than a whole number of steps by less than this (ms) counts as that number: instants
 * near 2026 in ms carry rounding of 2.4e-4 ms (one ulp of 1.8e12), so a decay exactly k steps
 * after the start can come out a hair longer. The step then exceeds the asked one by < 1 µs.
 */
const STEP_COUNT_SLACK_MS = 1e-3;

/** Instant of a grid's last point. */
export const gridEnd = (g: StateGrid): number => g.start + (g.count - 1) * g.stepMs;

export const gridPointCount = (start: number, end: number, stepMs: number): number =>
  Math.ceil((end - start) / stepMs) + 1;
