/**
 * Closed-form two-body motion for interpolation checks, written here independently of core/
 * (Kepler's equation by Newton's method; perifocal position and velocity rotated by the
 * classical angles — Vallado, Fundamentals of Astrodynamics and Applications, §2.2 and algorithm
 * COE2RV, from memory). Also evaluates the position at complex times, for Cauchy estimates of
 * derivatives: x(t) is analytic wherever dE/dt = n / (1 − e cos E) is finite.
 */
import type { FailureReason, Trajectory } from '../../core/propagation/trajectory.js';
import type { Instant } from '../../core/time/instant.js';

export interface TwoBodyOrbit {
  readonly aKm: number;
  readonly e: number;
  readonly iDeg: number;
  readonly raanDeg: number;
  readonly argpDeg: number;
  /** Mean anomaly at t0, deg. */
  readonly m0Deg: number;
  readonly t0: number;
  readonly mu: number;
}

const DEG = Math.PI / 180;

export class TwoBody {
  readonly n: number;
  /** Perifocal unit vectors P (to perigee) and Q (90° ahead), in the inertial frame. */
  readonly P: [number, number, number];
  readonly Q: [number, number, number];
  readonly b: number;
  constructor(readonly o: TwoBodyOrbit) {
    this.n = Math.sqrt(o.mu / o.aKm ** 3);
    this.b = o.aKm * Math.sqrt(1 - o.e * o.e);
    const [cO, sO] = [Math.cos(o.raanDeg * DEG), Math.sin(o.raanDeg * DEG)];
    const [cw, sw] = [Math.cos(o.argpDeg * DEG), Math.sin(o.argpDeg * DEG)];
    const [ci, si] = [Math.cos(o.iDeg * DEG), Math.sin(o.iDeg * DEG)];
    this.P = [cO * cw - sO * sw * ci, sO * cw + cO * sw * ci, sw * si];
    this.Q = [-cO * sw - sO * cw * ci, -sO * sw + cO * cw * ci, cw * si];
  }

  meanAnomaly(tMs: number): number {
    return this.o.m0Deg * DEG + (this.n * (tMs - this.o.t0)) / 1000;
  }

  /** Eccentric anomaly of a real mean anomaly (Newton, to 1e-15 rad). */
  eccentricAnomaly(M: number): number {
    const e = this.o.e;
    let E = e < 0.8 ? M : Math.PI * Math.sign(Math.sin(M)) + M;
    for (let k = 0; k < 60; k++) {
      const d = (E - e * Math.sin(E) - M) / (1 - e * Math.cos(E));
      E -= d;
      if (Math.abs(d) < 1e-15) break;
    }
    return E;
  }

  /** Position (km) and velocity (km/s) at UTC ms. */
  state(tMs: number): { r: [number, number, number]; v: [number, number, number] } {
    const { aKm: a, e } = this.o;
    const E = this.eccentricAnomaly(this.meanAnomaly(tMs));
    const [c, s] = [Math.cos(E), Math.sin(E)];
    const x = a * (c - e), y = this.b * s;
    const Edot = this.n / (1 - e * c);
    const vx = -a * s * Edot, vy = this.b * c * Edot;
    const r = [0, 1, 2].map((i) => this.P[i]! * x + this.Q[i]! * y) as [number, number, number];
    const v = [0, 1, 2].map((i) => this.P[i]! * vx + this.Q[i]! * vy) as [number, number, number];
    return { r, v };
  }

  /**
   * |x_i(z)| for the three position components at complex time z = tMs + i·imS·1000 (imS in s).
   * Kepler's equation E − e sin E = M is solved for complex E by Newton from the real solution.
   */
  complexPositionModuli(tMs: number, imS: number): [number, number, number] {
    const e = this.o.e;
    const mRe = this.meanAnomaly(tMs), mIm = this.n * imS;
    let er = this.eccentricAnomaly(mRe), ei = 0;
    for (let k = 0; k < 100; k++) {
      // sin and cos of a complex angle.
      const sr = Math.sin(er) * Math.cosh(ei), si = Math.cos(er) * Math.sinh(ei);
      const cr = Math.cos(er) * Math.cosh(ei), cim = -Math.sin(er) * Math.sinh(ei);
      const fr = er - e * sr - mRe, fi = ei - e * si - mIm;
      const dr = 1 - e * cr, di = -e * cim;
      const den = dr * dr + di * di;
      const stepR = (fr * dr + fi * di) / den, stepI = (fi * dr - fr * di) / den;
      er -= stepR;
      ei -= stepI;
      if (Math.hypot(stepR, stepI) < 1e-14) break;
    }
    const cr = Math.cos(er) * Math.cosh(ei), cim = -Math.sin(er) * Math.sinh(ei);
    const sr = Math.sin(er) * Math.cosh(ei), si = Math.cos(er) * Math.sinh(ei);
    const { aKm: a } = this.o;
    const xr = a * (cr - e), xi = a * cim, yr = this.b * sr, yi = this.b * si;
    return [0, 1, 2].map((k) =>
      Math.hypot(this.P[k]! * xr + this.Q[k]! * yr, this.P[k]! * xi + this.Q[k]! * yi)) as [number, number, number];
  }

  /**
   * Imaginary distance (s) from the real axis to the nearest singularity of x(t): where
   * 1 − e cos E = 0, i.e. E = 2πk ± i·acosh(1/e), so t = t_perigee ± i(acosh(1/e) − √(1−e²))/n.
   */
  singularityDistanceS(): number {
    const e = this.o.e;
    return e === 0 ? Infinity : (Math.acosh(1 / e) - Math.sqrt(1 - e * e)) / this.n;
  }
}

/** A two-body orbit as a Trajectory (its inertial frame called TEME), for sampling into an OEM. */
export class TwoBodyTrajectory implements Trajectory {
  readonly span = null;
  constructor(readonly objectId: string, readonly body: TwoBody) {}
  stateInto(t: Instant, out: Float64Array, off: number): FailureReason | null {
    const s = this.body.state(t);
    out.set(s.r, off);
    out.set(s.v, off + 3);
    return null;
  }
}
