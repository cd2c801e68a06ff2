/**
 * Any trajectory sampled once at a uniform step and served by interpolation: how a primary that
 * is not an element set (an owner ephemeris, a manoeuvred trajectory) reaches screening worker
 * threads. The main thread samples; the samples live in one SharedArrayBuffer; each worker
 * wraps them in a `SampledTrajectory` that reads the shared memory.
 *
 * Interpolation: Lagrange of degree 9 (10 uniformly spaced nodes, the window centred on the
 * interval of t), position and velocity each from their own node values. For uniform nodes the
 * error is bounded by
 *
 *     |f − p| ≤ max|f⁽¹⁰⁾| / 10! · max_s Π|s − k| · h¹⁰ ≤ 872 / 3 628 800 · (h·ω)¹⁰ · R
 *
 * in the middle interval (Π at s = 4.5 is 872), where f⁽¹⁰⁾ of orbital motion is ≈ ω¹⁰·R with ω
 * the fastest angular rate (the rate at perigee) and R the radius. SAMPLE_TURN_RAD = 0.05 rad
 * per step gives 2.3e-17·R; twice-per-orbit terms of SGP4 (amplitude ≤ ~20 km, frequency 2ω)
 * add ≤ 2.4e-4·0.1¹⁰·20 km ≈ 5e-17 km. Windows at the ends of a piece are off-centre (Π up to
 * ~4.2e4 in the end interval, 48× the middle), and a piece that ends at a break or at the end
 * of a source's span extrapolates up to one step past its last node (Π ≤ 10!, so
 * ≤ (h·ω)¹⁰·R ≈ 1e-13·R: 0.7 µm in LEO, 4 µm at GEO), plus at most one more step at a span edge
 * (EDGE_SERVE_MAX_MS; Π ≤ 11!, 11× more: ≤ 10 µm in LEO). Near the perigee of an eccentric orbit the high derivatives grow faster than ω_p¹⁰·r_p
 * (measured for an exact Kepler orbit with e = 0.7: 0.03 mm, 0.3 µm/s), and SGP4's deep-space
 * resonance integration is itself only piecewise smooth (GEO: 0.04 mm measured). Stated bounds,
 * asserted by test/sampled-trajectory.test.ts against an exact Kepler orbit (e = 0.001, 0.7)
 * and against SGP4 (LEO, GEO, e = 0.7, and across a break): SAMPLED_POSITION_TOL_KM = 0.1 mm
 * and SAMPLED_VELOCITY_TOL_KMS = 1 µm/s — four orders of magnitude inside the 1 m miss
 * precision screening promises.
 *
 * Node times are whole milliseconds (SamplePiece): rounding them to a double's resolution
 * instead cost millimetres (measured), far above the bound.
 *
 * Breaks: where a trajectory is not smooth (an impulsive burn, an ephemeris segment switch) it
 * lists the instants in `breaks`; sampling starts a new piece there, and no interpolation window
 * spans a break. Nodes of a piece before a break stop BREAK_EDGE_MS before it (the state at a
 * break is the state after it).
 *
 * A failing source (SGP4 decay, the end of an ephemeris) ends the samples at the last good node;
 * after it `stateInto` returns the source's reason, so screening's validity probe finds the end.
 */
import type { Instant } from '../time/instant.js';
import type { FailureReason, Trajectory } from './trajectory.js';
import { MU_EARTH_WGS72 } from '../units.js';
import { norm3 } from '../math/norm.js';

/** Angle swept at the fastest angular rate per sampling step (rad): sets the error above. */
export const SAMPLE_TURN_RAD = 0.05;
/** Sampling step limits (ms): 1 s to 5 min (the upper limit keeps GEO tables uniform in cost). */
const MIN_STEP_MS = 1_000;
const MAX_STEP_MS = 300_000;
/** Nodes per interpolation window (degree 9). */
export const SAMPLE_NODES = 10;
/**
 * Most a table serves past its first or last node at a span edge (ms), and never more than one
 * step of that piece: there the extrapolation error stays ≤ (h·ω)¹⁰·R, as for a piece ending at
 * a break. 20 s covers refinement's range-rate differencing (≤ 2 × 8 s past a window edge).
 */
export const EDGE_SERVE_MAX_MS = 20_000;
/** Last node of a piece this far before the break that ends it (ms). */
const BREAK_EDGE_MS = 1;
/** Stated bounds of the interpolation error (km, km/s): 0.1 mm and 1 µm/s (see above). */
export const SAMPLED_POSITION_TOL_KM = 1e-7;
export const SAMPLED_VELOCITY_TOL_KMS = 1e-9;

/**
 * One smooth stretch of samples: nodes at t0 + k·stepMs, k = 0 … count−1, serving [from, until].
 * t0 and stepMs are whole milliseconds, so every node time is exact: an Instant near 2026 is a
 * double with a resolution of 0.24 µs, ~2 mm of LEO motion, and node times rounded that way
 * showed up as millimetres of error.
 */
export interface SamplePiece {
  readonly from: number;
  readonly t0: number;
  readonly stepMs: number;
  readonly count: number;
  /** index of the first node in `values` (in nodes, 6 numbers each) */
  readonly first: number;
  /** the piece serves up to here (ms): its last node, or the break that ends it */
  readonly until: number;
}

/** Samples of one trajectory, plain data (structured-clone safe); `values` may be shared memory. */
export interface SampleTable {
  readonly objectId: string;
  readonly pieces: readonly SamplePiece[];
  /** x y z vx vy vz (km, km/s) per node */
  readonly values: Float64Array;
  /** why the source stopped before the requested end, if it did */
  readonly failure: FailureReason | null;
  /** max |v| over the nodes plus the change possible between nodes (km/s) */
  readonly vMaxKmS: number;
  /** bounds of |r| over the served span (km), padded for the motion between nodes */
  readonly rMinKm: number;
  readonly rMaxKm: number;
}

/** The step (ms) for a state: SAMPLE_TURN_RAD at the osculating orbit's perigee rate. */
export function sampleStepMs(state: ArrayLike<number>): number {
  const rate = perigeeRate(state);
  if (!(rate > 0)) return MIN_STEP_MS;
  return Math.min(MAX_STEP_MS, Math.max(MIN_STEP_MS, (SAMPLE_TURN_RAD / rate) * 1000));
}

/** Osculating angular rate at perigee (rad/s) from a TEME state: h / r_p². */
function perigeeRate(s: ArrayLike<number>): number {
  const [x, y, z, vx, vy, vz] = [s[0]!, s[1]!, s[2]!, s[3]!, s[4]!, s[5]!];
  const r = norm3(x, y, z);
  const hx = y * vz - z * vy, hy = z * vx - x * vz, hz = x * vy - y * vx;
  const h = norm3(hx, hy, hz);
  const v2 = vx * vx + vy * vy + vz * vz;
  const energy = v2 / 2 - MU_EARTH_WGS72 / r;
  if (!(energy < 0)) return h / (r * r);
  const a = -MU_EARTH_WGS72 / (2 * energy);
  const e = Math.sqrt(Math.max(0, 1 - (h * h) / (MU_EARTH_WGS72 * a)));
  const rp = a * (1 - e);
  return h / (rp * rp);
}

/** Bytes a table of [from, to] at this step can need (an upper bound: breaks add pieces). */
export function sampleCapacity(from: number, to: number, stepMs: number, breaks = 0): number {
  const h = Math.max(1, Math.round(stepMs));
  return (Math.ceil((to - from) / h) + 2 + (breaks + 1) * SAMPLE_NODES) * 6;
}

/**
 * Samples `traj` over [from, to] at `stepMs` (default: sampleStepMs of its first state) into
 * `buffer` (default: a new array of sampleCapacity). A piece shorter than 10 steps gets a
 * smaller step so that it still has SAMPLE_NODES nodes.
 */
export function sampleTrajectory(
  traj: Trajectory,
  from: Instant,
  to: Instant,
  options: {
    readonly stepMs?: number;
    readonly buffer?: Float64Array;
    /**
     * Serve this far (ms) before the first and after the last node when the source ends there by
     * its span (not by a failure): refinement differences the range rate a few seconds past the
     * window edges, and an ephemeris that covers exactly the window must not fail there. The
     * end windows extrapolate by at most this much (≤ EDGE_SERVE_MAX_MS: within the error bound).
     */
    readonly edgeMs?: number;
  } = {},
): SampleTable {
  const scratch = new Float64Array(6);
  let stepMs = options.stepMs;
  if (stepMs === undefined) {
    const f = traj.stateInto(from, scratch, 0);
    stepMs = f ? MIN_STEP_MS : sampleStepMs(scratch);
  }
  // A source with a bounded span (an owner ephemeris) is sampled only inside it: nothing before
  // its start, and its end is treated like a break (nodes stop at or before it; the last window
  // serves the < 1 step left), never sampled past it.
  const lo = traj.span && traj.span.start > from ? Math.ceil(traj.span.start) : (from as number);
  const hi = traj.span && traj.span.end < to ? Math.floor(traj.span.end) : (to as number);
  const hardEnd = hi < to;
  const breaks = (traj.breaks ?? []).filter((b) => b > lo && b < hi).sort((a, b) => a - b);
  const values = options.buffer ?? new Float64Array(sampleCapacity(from, to, stepMs, breaks.length));
  const bounds = [lo, ...breaks, hi];
  const pieces: SamplePiece[] = [];
  let node = 0, failure: FailureReason | null = null;
  let vMax = 0, rMin = Infinity, rMax = 0, aMax = 0;
  const h = Math.max(1, Math.round(stepMs));
  for (let p = 0; p + 1 < bounds.length && !failure; p++) {
    const a = bounds[p]!, isLast = p + 2 === bounds.length && !hardEnd;
    const b = isLast || p + 2 === bounds.length ? bounds[p + 1]! : bounds[p + 1]! - BREAK_EDGE_MS;
    const t0 = Math.ceil(a);
    if (!(b > t0)) continue;
    // A short piece gets a shorter (whole-ms) step, so that it still has a full window.
    const hp = Math.min(h, Math.floor((b - t0) / (SAMPLE_NODES - 1)));
    if (hp < 1) continue;
    // The last piece's nodes reach past its end (the source serves the margin); a piece that
    // ends at a break stops at or before it, and the < 1 step left is served by its last window.
    const n = isLast ? Math.ceil((b - t0) / hp) : Math.floor((b - t0) / hp);
    const first = node;
    let count = 0;
    for (let k = 0; k <= n; k++) {
      const t = t0 + k * hp;
      const off = node * 6;
      if (off + 6 > values.length) throw new RangeError(`sample buffer too small for ${traj.objectId}`);
      const f = traj.stateInto(t as Instant, values, off);
      if (f) {
        // The last piece's final node lies past the requested end; a source that stops exactly
        // there (an ephemeris covering just this span) has not failed: that piece serves up to
        // the end from its last window.
        if (!(isLast && t > b && k === n)) failure = f;
        break;
      }
      const r = norm3(values[off]!, values[off + 1]!, values[off + 2]!);
      const v = norm3(values[off + 3]!, values[off + 4]!, values[off + 5]!);
      vMax = Math.max(vMax, v);
      rMin = Math.min(rMin, r);
      rMax = Math.max(rMax, r);
      // Bound of d²|r|/dt² at this radius: gravity or centripetal term, whichever is larger.
      aMax = Math.max(aMax, MU_EARTH_WGS72 / (r * r), (v * v) / r);
      node++;
      count++;
    }
    // A piece needs a full window; fewer good nodes (failure right away) serve nothing.
    if (count >= SAMPLE_NODES) {
      const lastNode = t0 + (count - 1) * hp;
      pieces.push({ from: a, t0, stepMs: hp, count, first, until: failure ? lastNode : isLast ? b : bounds[p + 1]! });
    } else node = first;
  }
  const edge = Math.min(options.edgeMs ?? 0, EDGE_SERVE_MAX_MS);
  if (edge > 0 && pieces.length > 0) {
    const first = pieces[0]!;
    pieces[0] = { ...first, from: first.from - Math.min(edge, first.stepMs) };
    const last = pieces[pieces.length - 1]!;
    if (!failure) pieces[pieces.length - 1] = { ...last, until: last.until + Math.min(edge, last.stepMs) };
  }
  // Between nodes (half a step from the nearest), |r| can pass an extreme by ≤ ½·a·(h/2)² and
  // |v| can grow by ≤ a·h/2; a is bounded by the larger of μ/r² and v²/r seen at the nodes.
  const hMax = pieces.reduce((m, p) => Math.max(m, p.stepMs), 0) / 1000;
  const rPad = 0.5 * aMax * (hMax / 2) ** 2;
  return {
    objectId: traj.objectId,
    pieces,
    values,
    failure: failure ?? (pieces.length === 0 ? 'outside-ephemeris' : null),
    vMaxKmS: vMax + aMax * (hMax / 2),
    rMinKm: pieces.length ? rMin - rPad : 0,
    rMaxKm: pieces.length ? rMax + rPad : 0,
  };
}

/** Barycentric weights of 10 uniform nodes: (−1)^k·C(9, k). */
const W = Float64Array.from({ length: SAMPLE_NODES }, (_, k) => {
  let c = 1;
  for (let j = 0; j < k; j++) c = (c * (SAMPLE_NODES - 1 - j)) / (j + 1);
  return k % 2 === 0 ? c : -c;
});

/** The trajectory served by a SampleTable. Allocates nothing per call. */
export class SampledTrajectory implements Trajectory {
  readonly objectId: string;
  readonly span: { readonly start: Instant; readonly end: Instant };
  private hint = 0;
  private readonly q = new Float64Array(SAMPLE_NODES);

  constructor(readonly table: SampleTable) {
    this.objectId = table.objectId;
    const ps = table.pieces;
    this.span = ps.length
      ? { start: ps[0]!.from as Instant, end: ps.at(-1)!.until as Instant }
      : { start: 0 as Instant, end: -1 as Instant };
  }

  get breaks(): readonly Instant[] {
    return this.table.pieces.slice(1).map((p) => p.from as Instant);
  }

  stateInto(t: Instant, out: Float64Array, offset: number): FailureReason | null {
    const ps = this.table.pieces;
    let k = this.hint;
    let p = ps[k];
    if (!p || !(t >= p.from && t <= p.until && (k + 1 >= ps.length || t < ps[k + 1]!.from))) {
      k = -1;
      for (let i = ps.length - 1; i >= 0; i--) {
        if (ps[i]!.from <= t) {
          k = i;
          break;
        }
      }
      p = k >= 0 ? ps[k] : undefined;
      if (!p || t > p.until) return this.table.failure ?? 'outside-ephemeris';
      this.hint = k;
    }
    const s = (t - p.t0) / p.stepMs;
    let j = Math.floor(s);
    let first = j - (SAMPLE_NODES / 2 - 1);
    if (first < 0) first = 0;
    if (first > p.count - SAMPLE_NODES) first = p.count - SAMPLE_NODES;
    const x = this.table.values, base = (p.first + first) * 6;
    const u = s - first; // position in the window, 0 … 9
    j = Math.round(u);
    if (Math.abs(u - j) < 1e-12 && j >= 0 && j < SAMPLE_NODES) {
      for (let c = 0; c < 6; c++) out[offset + c] = x[base + j * 6 + c]!;
      return null;
    }
    // Barycentric form (second kind): p(u) = Σ q_k·y_k / Σ q_k, q_k = w_k/(u − k).
    const q = this.q;
    let den = 0;
    for (let i = 0; i < SAMPLE_NODES; i++) {
      const qi = W[i]! / (u - i);
      q[i] = qi;
      den += qi;
    }
    for (let c = 0; c < 6; c++) {
      let num = 0;
      for (let i = 0; i < SAMPLE_NODES; i++) num += q[i]! * x[base + i * 6 + c]!;
      out[offset + c] = num / den;
    }
    return null;
  }
}
