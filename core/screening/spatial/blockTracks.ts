/**
 * SGP4 samples of every indexed object over one time block, and their cubic Hermite
 * interpolant: position and velocity at any instant of the block for a few dozen flops.
 *
 * Per object and block it also keeps what the index needs to pad with:
 *  - epsKm: bound of |SGP4 − interpolant| (sampling.ts);
 *  - accelKmS2: max |H''| over the block, exact for the interpolant: on each interval H'' is
 *    linear in time, so its norm is largest at an interval end, where it is computed;
 *  - speedKmS: max |H'| over the block: H' changes by at most accelKmS2·h/2 from the nearer end
 *    of its interval, where it equals the sampled velocity.
 */
import type { Instant } from '../../time/instant.js';
import type { Trajectory } from '../../propagation/trajectory.js';
import { interpolationBoundKm, type SamplingPlan } from './sampling.js';
import { norm3 } from '../../math/norm.js';

export class BlockTracks {
  /** x y z vx vy vz per sample, objects one after another (offsets in `first`) */
  readonly samples: Float64Array;
  readonly first: Int32Array;
  readonly stepMs: Float64Array;
  readonly epsKm: Float64Array;
  readonly accelKmS2: Float64Array;
  readonly speedKmS: Float64Array;
  /** 1 when the object is usable in this block, 0 when a sample failed */
  readonly ok: Uint8Array;
  sgp4Evaluations = 0;

  constructor(
    readonly t0: number,
    readonly t1: number,
    trajectories: readonly Trajectory[],
    plans: readonly SamplingPlan[],
    /** objects taking part (indices into trajectories) */
    readonly members: Int32Array,
  ) {
    const n = trajectories.length;
    this.first = new Int32Array(n + 1);
    this.stepMs = new Float64Array(n);
    this.epsKm = new Float64Array(n);
    this.accelKmS2 = new Float64Array(n);
    this.speedKmS = new Float64Array(n);
    this.ok = new Uint8Array(n);
    const span = t1 - t0;
    const counts = new Int32Array(n);
    for (const i of members) {
      const m = Math.max(1, Math.ceil(span / 1000 / plans[i]!.maxStepS));
      counts[i] = m + 1;
      this.stepMs[i] = span / m;
    }
    let total = 0;
    for (let i = 0; i < n; i++) {
      this.first[i] = total;
      total += counts[i]!;
    }
    this.first[n] = total;
    this.samples = new Float64Array(total * 6);
    const x = this.samples;
    for (const i of members) {
      const tr = trajectories[i]!;
      const h = this.stepMs[i]!;
      const hs = h / 1000;
      const base = this.first[i]!;
      const count = counts[i]!;
      let good = true, vMax = 0;
      for (let m = 0; m < count; m++) {
        const t = (m === count - 1 ? t1 : t0 + m * h) as Instant;
        if (tr.stateInto(t, x, (base + m) * 6)) {
          good = false;
          break;
        }
        const o = (base + m) * 6;
        vMax = Math.max(vMax, norm3(x[o + 3]!, x[o + 4]!, x[o + 5]!));
      }
      this.sgp4Evaluations += count;
      if (!good) continue;
      let aMax = 0;
      for (let m = 0; m + 1 < count; m++) {
        const o = (base + m) * 6;
        for (let end = 0; end < 2; end++) {
          let s2 = 0;
          for (let c = 0; c < 3; c++) {
            const dp = x[o + 6 + c]! - x[o + c]!;
            const v0 = x[o + 3 + c]!, v1 = x[o + 9 + c]!;
            // H'' at s = 0 and s = 1 of the interval (per s² of time)
            const a = end === 0 ? (6 * dp - hs * (4 * v0 + 2 * v1)) / (hs * hs) : (-6 * dp + hs * (2 * v0 + 4 * v1)) / (hs * hs);
            s2 += a * a;
          }
          aMax = Math.max(aMax, Math.sqrt(s2));
        }
      }
      this.ok[i] = 1;
      this.accelKmS2[i] = aMax;
      this.speedKmS[i] = vMax + (aMax * hs) / 2;
      this.epsKm[i] = interpolationBoundKm(plans[i]!, hs);
    }
  }

  /** A cursor over `objects` for the broad phase's per-step loop (TrackCursor). */
  cursor(objects: Int32Array): TrackCursor {
    return new TrackCursor(this, objects);
  }

  /** Interpolated position and velocity of object i at t (ms) into out[off..off+5]. */
  stateInto(i: number, t: number, out: Float64Array, off: number): void {
    const h = this.stepMs[i]!;
    const base = this.first[i]!;
    const last = this.first[i + 1]! - base - 2;
    let m = Math.floor((t - this.t0) / h);
    if (m < 0) m = 0;
    else if (m > last) m = last;
    const s = (t - this.t0 - m * h) / h;
    const hs = h / 1000;
    const s2 = s * s, s3 = s2 * s;
    const h00 = 2 * s3 - 3 * s2 + 1, h10 = (s3 - 2 * s2 + s) * hs, h01 = -2 * s3 + 3 * s2, h11 = (s3 - s2) * hs;
    const d00 = (6 * s2 - 6 * s) / hs, d10 = 3 * s2 - 4 * s + 1, d01 = (-6 * s2 + 6 * s) / hs, d11 = 3 * s2 - 2 * s;
    const x = this.samples, a = (base + m) * 6, b = a + 6;
    for (let c = 0; c < 3; c++) {
      const p0 = x[a + c]!, v0 = x[a + 3 + c]!, p1 = x[b + c]!, v1 = x[b + 3 + c]!;
      out[off + c] = h00 * p0 + h10 * v0 + h01 * p1 + h11 * v1;
      out[off + 3 + c] = d00 * p0 + d10 * v0 + d01 * p1 + d11 * v1;
    }
  }
}

/**
 * stateInto for one fixed list of objects at many instants, into structure-of-arrays outputs
 * indexed like `objects` (out[n] is objects[n]'s), with the same arithmetic as stateInto (so the
 * same doubles) and no call per object.
 *
 * It keeps each object's current interval (its two end samples, in twelve arrays read in
 * sequence) and reaches into `samples` only when an object enters another interval, every ~12
 * steps in LEO. Reading `samples` at every step missed the cache once or twice per object: the
 * samples of 30,000 objects take ~20 MB, and an object's are ~700 bytes from the next one's.
 * Measured on the 30,000-object bench catalogue: 130–170 ns per object and step that way, against
 * ~40 ns for 3,000 objects, whose samples fit in the cache.
 */
export class TrackCursor {
  private readonly n: number;
  private readonly h: Float64Array;
  private readonly base: Int32Array;
  private readonly last: Int32Array;
  /** interval each object's end points were loaded for (−1: none yet) */
  private readonly at: Int32Array;
  /** end points of the current interval: position and velocity at its start (0) and end (1) */
  private readonly ends: Float64Array[];

  constructor(
    private readonly tracks: BlockTracks,
    objects: Int32Array,
  ) {
    const n = (this.n = objects.length);
    this.h = new Float64Array(n);
    this.base = new Int32Array(n);
    this.last = new Int32Array(n);
    this.at = new Int32Array(n).fill(-1);
    this.ends = Array.from({ length: 12 }, () => new Float64Array(n));
    for (let k = 0; k < n; k++) {
      const i = objects[k]!;
      this.h[k] = tracks.stepMs[i]!;
      this.base[k] = tracks.first[i]!;
      this.last[k] = tracks.first[i + 1]! - tracks.first[i]! - 2;
    }
  }

  statesAt(t: number, x: Float64Array, y: Float64Array, z: Float64Array, u: Float64Array, v: Float64Array, w: Float64Array): void {
    const samples = this.tracks.samples, t0 = this.tracks.t0;
    const hh = this.h, base = this.base, last = this.last, at = this.at;
    const [px0, py0, pz0, vx0, vy0, vz0, px1, py1, pz1, vx1, vy1, vz1] = this.ends as [
      Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array,
      Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array,
    ];
    for (let n = 0; n < this.n; n++) {
      const h = hh[n]!;
      let m = Math.floor((t - t0) / h);
      if (m < 0) m = 0;
      else if (m > last[n]!) m = last[n]!;
      if (m !== at[n]) {
        const a = (base[n]! + m) * 6;
        px0[n] = samples[a]!; py0[n] = samples[a + 1]!; pz0[n] = samples[a + 2]!;
        vx0[n] = samples[a + 3]!; vy0[n] = samples[a + 4]!; vz0[n] = samples[a + 5]!;
        px1[n] = samples[a + 6]!; py1[n] = samples[a + 7]!; pz1[n] = samples[a + 8]!;
        vx1[n] = samples[a + 9]!; vy1[n] = samples[a + 10]!; vz1[n] = samples[a + 11]!;
        at[n] = m;
      }
      const s = (t - t0 - m * h) / h;
      const hs = h / 1000;
      const s2 = s * s, s3 = s2 * s;
      const h00 = 2 * s3 - 3 * s2 + 1, h10 = (s3 - 2 * s2 + s) * hs, h01 = -2 * s3 + 3 * s2, h11 = (s3 - s2) * hs;
      const d00 = (6 * s2 - 6 * s) / hs, d10 = 3 * s2 - 4 * s + 1, d01 = (-6 * s2 + 6 * s) / hs, d11 = 3 * s2 - 2 * s;
      x[n] = h00 * px0[n]! + h10 * vx0[n]! + h01 * px1[n]! + h11 * vx1[n]!;
      u[n] = d00 * px0[n]! + d10 * vx0[n]! + d01 * px1[n]! + d11 * vx1[n]!;
      y[n] = h00 * py0[n]! + h10 * vy0[n]! + h01 * py1[n]! + h11 * vy1[n]!;
      v[n] = d00 * py0[n]! + d10 * vy0[n]! + d01 * py1[n]! + d11 * vy1[n]!;
      z[n] = h00 * pz0[n]! + h10 * vz0[n]! + h01 * pz1[n]! + h11 * vz1[n]!;
      w[n] = d00 * pz0[n]! + d10 * vz0[n]! + d01 * pz1[n]! + d11 * vz1[n]!;
    }
  }
}
