import type { SatRec } from 'satellite.js';
import type { Instant } from '../time/instant.js';
import type { FailureReason } from '../propagation/trajectory.js';
import { reasonForSgp4Code } from '../propagation/sgp4.js';
import { sgp4Into } from '../propagation/sgp4Kernel.js';
import { R_EARTH_WGS72 } from '../units.js';
import { norm3 } from '../math/norm.js';

const TWO_PI = 2 * Math.PI;
const MS_PER_MIN = 60_000;
/**
 * Safety on the measured model error: the periodic terms SGP4 adds to its mean elements vary
 * with the orbital phase; the samples below cover the phase with gaps ≤ ~0.05 of an orbit, so
 * they see ≥ ~0.95 of the peak of a once- or twice-per-orbit term, and 1.5× covers the rest
 * (checked against SGP4 at random instants in test/screening-model-bound.test.ts).
 */
const EPS_SAFETY = 1.5;
/** Floor added to the measured error (km): covers rounding and unsampled interpolation error. */
const EPS_FLOOR_KM = 2;
/**
 * Added to the measured velocity error (km/s): SGP4's velocity is not exactly dr/dt (gap
 * measured up to 2e-3 km/s on GTO orbits, spatial/sampling.ts) — 5× that, plus rounding.
 */
const VELOCITY_GAP_KMS = 0.01;

/**
 * A cheap stand-in for SGP4 used only to dismiss pairs: SGP4's own mean elements sampled at
 * uniform nodes, interpolated (cubic Lagrange through 4 nodes, angles unwrapped) and turned
 * into a Keplerian position. `epsKm` bounds |model − SGP4| over the span (measured at every
 * node and every mid-node, then padded); filters add it to their distance thresholds.
 */
export interface OrbitModel {
  readonly epsKm: number;
  /** false when the source has no mean orbit plane (then normalInto is meaningless) */
  readonly hasPlane: boolean;
  /** Bounds of the osculating radius over the span (km), padded by epsKm. */
  readonly rMinKm: number;
  readonly rMaxKm: number;
  /** Upper bound of the speed (km/s) over the span. */
  readonly vMaxKmS: number;
  /** Writes the approximate TEME position (km) at t into out[off..off+2]. */
  positionInto(t: Instant, out: Float64Array, off: number): void;
  /**
   * Bound of |dr/dt − model velocity| (km/s) over the span, when the model has a velocity
   * (stateInto); measured like epsKm, plus SGP4's own gap between its velocity and dr/dt.
   */
  readonly velocityErrKmS?: number;
  /** Position (km) and velocity (km/s) at t into out[off..off+5]; present with velocityErrKmS. */
  stateInto?(t: Instant, out: Float64Array, off: number): void;
  /** Unit normal of the mean orbit plane at t. */
  normalInto(t: Instant, out: Float64Array, off: number): void;
  /**
   * The same normal, cheaper: the normals at the model's nodes, interpolated by the same cubic
   * as the elements (no trigonometry per call). The remainder of 4-point interpolation is
   * ≤ h⁴/24·|n⁗| ≤ (12 h × 2e-6 rad/s)⁴/24 ≈ 2.3e-6 (16 m at 7000 km), inside NORMAL_INTERP_KM.
   */
  tabledNormalInto(t: Instant, out: Float64Array, off: number): void;
  /**
   * Interpolated mean elements at t into out[0..6]: a (km), e, i, Ω, ω, M (rad, unwrapped),
   * dM/dt (rad/ms). Absent for sources without mean elements.
   */
  meanElementsInto?(t: Instant, out: Float64Array): void;
}


const N_EL = 6;
/** Fractional part of the golden ratio: successive multiples spread evenly over [0, 1). */
const GOLDEN = 0.6180339887498949;
/** Eccentricity above which the error is also measured around perigee passages. */
const PERIGEE_SAMPLING_MIN_E = 0.05;
/** Perigee samples are spaced by the period over this (5 samples across ±2/50 of an orbit). */
const PERIGEE_SAMPLE_FRACTION = 50;
/** Keplerian period (min) of a semi-major axis in km, WGS-72 μ. */
const periodMinutes = (aKm: number): number => (2 * Math.PI * Math.sqrt((aKm * aKm * aKm) / 398600.8)) / 60; // a(km), e, i, Ω, ω, M — all unwrapped

/** SGP4 state and mean elements of the current sample (scratch: workers are single-threaded). */
const PV = new Float64Array(6);
const ME = new Float64Array(7);
/** SGP4 positions and velocities at the nodes, and the model's state (scratch, grown as needed). */
let NODE_POS = new Float64Array(64 * 3);
let NODE_VEL = new Float64Array(64 * 3);
const MODEL_STATE = new Float64Array(6);
/** Interpolation weights of the model being evaluated (scratch: evaluation is not reentrant). */
const WEIGHTS = new Float64Array(4);

export function buildSgp4Model(
  satrec: SatRec,
  epoch: Instant,
  start: Instant,
  end: Instant,
  nodeSpacingMin: number,
): OrbitModel | FailureReason {
  const spanMin = (end - start) / MS_PER_MIN;
  const nIntervals = Math.max(3, Math.ceil(spanMin / nodeSpacingMin));
  const stepMin = spanMin / nIntervals;
  const nNodes = nIntervals + 1;
  const t0Min = (start - epoch) / MS_PER_MIN; // minutes since epoch of node 0
  const el = new Float64Array(nNodes * N_EL);
  if (NODE_POS.length < nNodes * 3) {
    NODE_POS = new Float64Array(nNodes * 3);
    NODE_VEL = new Float64Array(nNodes * 3);
  }
  const pos = NODE_POS, vel = NODE_VEL;
  let vMax = 0;
  for (let k = 0; k < nNodes; k++) {
    const code = sgp4Into(satrec, t0Min + k * stepMin, PV, 0, ME);
    if (code !== 0) return reasonForSgp4Code(code);
    const o = k * N_EL;
    el[o] = ME[0]! * R_EARTH_WGS72; // am, em, im, Om, om, mm, nm (sgp4Kernel MEAN_*)
    el[o + 1] = ME[1]!;
    el[o + 2] = ME[2]!;
    el[o + 3] = ME[3]!;
    el[o + 4] = ME[4]!;
    el[o + 5] = ME[5]!;
    if (k > 0) {
      const p = o - N_EL;
      el[o + 3] = unwrapNear(el[o + 3]!, el[p + 3]!);
      el[o + 4] = unwrapNear(el[o + 4]!, el[p + 4]!);
      // Mean anomaly advances many revolutions between nodes: predict with the mean motion.
      const predicted = el[p + 5]! + ME[6]! * stepMin;
      el[o + 5] = unwrapNear(el[o + 5]!, predicted);
    }
    pos[k * 3] = PV[0]!;
    pos[k * 3 + 1] = PV[1]!;
    pos[k * 3 + 2] = PV[2]!;
    vel[k * 3] = PV[3]!;
    vel[k * 3 + 1] = PV[4]!;
    vel[k * 3 + 2] = PV[5]!;
    vMax = Math.max(vMax, norm3(PV[3]!, PV[4]!, PV[5]!));
  }
  const model = new KeplerModel(start, stepMin * MS_PER_MIN, nNodes, el);
  // Measure |model − SGP4| at nodes and mid-nodes.
  const buf = MODEL_STATE;
  let err = 0, verr = 0;
  for (let k = 0; k < nNodes; k++) {
    model.stateInto((start + k * stepMin * MS_PER_MIN) as Instant, buf, 0);
    err = Math.max(err, norm3(buf[0]! - pos[k * 3]!, buf[1]! - pos[k * 3 + 1]!, buf[2]! - pos[k * 3 + 2]!));
    verr = Math.max(verr, norm3(buf[3]! - vel[k * 3]!, buf[4]! - vel[k * 3 + 1]!, buf[5]! - vel[k * 3 + 2]!));
  }
  // Between nodes: SGP4's periodic terms vary with the orbital phase, and the node spacing can
  // be a near-multiple of the period (phase-locked samples all see the same error, measured: an
  // error of 4.7 km at every node of an orbit whose error reaches 16.6 km). So each interval is
  // also sampled at two orbital phases apart by half a period, stepping by the golden ratio from
  // interval to interval (low-discrepancy coverage of the phase), around its middle where the
  // interpolation error is largest. One pair per interval is enough at 24-h nodes: against
  // two pairs per interval the measured error stays ≥ 0.91 of theirs on every near-Earth object
  // of a 3,000-object catalogue (median 0.9997), and with EPS_SAFETY the worst error found at
  // random instants is 0.71 ε (test/screening-model-bound.test.ts holds it < ε).
  for (let k = 0; k < nIntervals; k++) {
    const periodMin = Math.min(periodMinutes(el[k * N_EL]!), stepMin);
    for (let j = 0; j < 2; j++) {
      const phase = (k * GOLDEN + j / 2) % 1;
      const tm = t0Min + (k + 0.5) * stepMin + (phase - 0.5) * periodMin;
      const code = sgp4Into(satrec, tm, PV, 0);
      if (code !== 0) return reasonForSgp4Code(code);
      model.stateInto((start + (tm - t0Min) * MS_PER_MIN) as Instant, buf, 0);
      err = Math.max(err, norm3(buf[0]! - PV[0]!, buf[1]! - PV[1]!, buf[2]! - PV[2]!));
      verr = Math.max(verr, norm3(buf[3]! - PV[3]!, buf[4]! - PV[4]!, buf[5]! - PV[5]!));
      vMax = Math.max(vMax, norm3(PV[3]!, PV[4]!, PV[5]!));
    }
  }
  // Eccentric orbits: SGP4's periodic terms peak sharply near perigee, where uniform samples
  // rarely fall; measure also around the perigee passage next to every node.
  const e0 = el[1]!;
  if (e0 > PERIGEE_SAMPLING_MIN_E) {
    for (let k = 0; k < nNodes; k++) {
      const o = k * N_EL;
      const nRadPerMin = (2 * Math.PI) / periodMinutes(el[o]!);
      // Time to the next perigee (M ≡ 0 mod 2π) from node k, then a few samples around it.
      const mMod = ((el[o + 5]! % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
      const toPerigeeMin = (2 * Math.PI - mMod) / nRadPerMin;
      const span = periodMinutes(el[o]!) / PERIGEE_SAMPLE_FRACTION;
      for (const d of [-2, -1, 0, 1, 2]) {
        const tm = t0Min + k * stepMin + toPerigeeMin + d * span;
        const tMs = start + (tm - t0Min) * MS_PER_MIN;
        if (tMs > end) continue;
        if (sgp4Into(satrec, tm, PV, 0) !== 0) continue; // a failure here is judged where the object is used
        model.stateInto(tMs as Instant, buf, 0);
        err = Math.max(err, norm3(buf[0]! - PV[0]!, buf[1]! - PV[1]!, buf[2]! - PV[2]!));
        verr = Math.max(verr, norm3(buf[3]! - PV[3]!, buf[4]! - PV[4]!, buf[5]! - PV[5]!));
      }
    }
  }
  const eps = err * EPS_SAFETY + EPS_FLOOR_KM;
  let rMin = Infinity, rMax = 0, vBound = 0;
  for (let k = 0; k < nNodes; k++) {
    const a = el[k * N_EL]!, e = el[k * N_EL + 1]!;
    rMin = Math.min(rMin, a * (1 - e));
    rMax = Math.max(rMax, a * (1 + e));
    // vis-viva at perigee, WGS-72 μ, as a speed bound of the mean orbit
    vBound = Math.max(vBound, Math.sqrt((398600.8 / a) * ((1 + e) / (1 - e))));
  }
  model.finish(eps, rMin - eps, rMax + eps, Math.max(vMax, vBound) * 1.02 + 0.05, verr * EPS_SAFETY + VELOCITY_GAP_KMS);
  return model;
}

function unwrapNear(x: number, ref: number): number {
  return x + TWO_PI * Math.round((ref - x) / TWO_PI);
}

class KeplerModel implements OrbitModel {
  readonly hasPlane = true;
  epsKm = 0;
  rMinKm = 0;
  rMaxKm = Infinity;
  vMaxKmS = Infinity;
  velocityErrKmS = Infinity;
  private readonly el: Float64Array;
  private readonly w = WEIGHTS;

  constructor(
    private readonly start: number,
    private readonly stepMs: number,
    private readonly nNodes: number,
    el: Float64Array,
  ) {
    this.el = el;
  }

  finish(eps: number, rMin: number, rMax: number, vMax: number, velocityErr: number): void {
    this.velocityErrKmS = velocityErr;
    this.epsKm = eps;
    this.rMinKm = rMin;
    this.rMaxKm = rMax;
    this.vMaxKmS = vMax;
  }

  /** Cubic Lagrange weights over 4 nodes around t; returns the first node index. */
  private weights(t: number): number {
    const x = (t - this.start) / this.stepMs;
    let k0 = Math.floor(x) - 1;
    if (k0 < 0) k0 = 0;
    if (k0 > this.nNodes - 4) k0 = this.nNodes - 4;
    const u = x - k0; // position relative to node k0, nodes at 0,1,2,3
    const w = this.w;
    w[0] = (-(u - 1) * (u - 2) * (u - 3)) / 6;
    w[1] = (u * (u - 2) * (u - 3)) / 2;
    w[2] = (-u * (u - 1) * (u - 3)) / 2;
    w[3] = (u * (u - 1) * (u - 2)) / 6;
    return k0;
  }

  private elem(k0: number, j: number): number {
    const el = this.el, w = this.w;
    return (
      w[0]! * el[k0 * N_EL + j]! +
      w[1]! * el[(k0 + 1) * N_EL + j]! +
      w[2]! * el[(k0 + 2) * N_EL + j]! +
      w[3]! * el[(k0 + 3) * N_EL + j]!
    );
  }

  positionInto(t: Instant, out: Float64Array, off: number): void {
    this.kepler(t, out, off, false);
  }

  /** Position and the Keplerian velocity of the interpolated elements (element rates left out: measured in velocityErrKmS). */
  stateInto(t: Instant, out: Float64Array, off: number): void {
    this.kepler(t, out, off, true);
  }

  private kepler(t: Instant, out: Float64Array, off: number, withVelocity: boolean): void {
    const k0 = this.weights(t);
    const a = this.elem(k0, 0);
    let e = this.elem(k0, 1);
    if (e < 0) e = 0;
    if (e > 0.999) e = 0.999;
    const inc = this.elem(k0, 2), node = this.elem(k0, 3), argp = this.elem(k0, 4);
    const M = this.elem(k0, 5) % TWO_PI;
    // Kepler's equation by Newton's method from a starter good for e < 0.99
    let E = e < 0.8 ? M : Math.PI * Math.sign(M || 1);
    for (let it = 0; it < 30; it++) {
      const f = E - e * Math.sin(E) - M;
      const d = f / (1 - e * Math.cos(E));
      E -= d;
      if (Math.abs(d) < 1e-12) break;
    }
    const cE = Math.cos(E), sE = Math.sin(E), b = Math.sqrt(1 - e * e);
    const xp = a * (cE - e);
    const yp = a * b * sE;
    const cO = Math.cos(node), sO = Math.sin(node);
    const ci = Math.cos(inc), si = Math.sin(inc);
    const cw = Math.cos(argp), sw = Math.sin(argp);
    // perifocal → inertial: R3(−Ω) R1(−i) R3(−ω)
    const px = cO * cw - sO * sw * ci, qx = -cO * sw - sO * cw * ci;
    const py = sO * cw + cO * sw * ci, qy = -sO * sw + cO * cw * ci;
    const pz = sw * si, qz = cw * si;
    out[off] = px * xp + qx * yp;
    out[off + 1] = py * xp + qy * yp;
    out[off + 2] = pz * xp + qz * yp;
    if (!withVelocity) return;
    // dE/dt = n/(1 − e cos E), n = √(μ/a³) (WGS-72 μ, as periodMinutes)
    const Edot = Math.sqrt(398600.8 / (a * a * a)) / (1 - e * cE);
    const vxp = -a * sE * Edot, vyp = a * b * cE * Edot;
    out[off + 3] = px * vxp + qx * vyp;
    out[off + 4] = py * vxp + qy * vyp;
    out[off + 5] = pz * vxp + qz * vyp;
  }

  private nodeNormals: Float64Array | null = null;
  tabledNormalInto(t: Instant, out: Float64Array, off: number): void {
    let nn = this.nodeNormals;
    if (!nn) {
      nn = new Float64Array(this.nNodes * 3);
      for (let k = 0; k < this.nNodes; k++) {
        const inc = this.el[k * N_EL + 2]!, node = this.el[k * N_EL + 3]!;
        const si = Math.sin(inc);
        nn[k * 3] = si * Math.sin(node);
        nn[k * 3 + 1] = -si * Math.cos(node);
        nn[k * 3 + 2] = Math.cos(inc);
      }
      this.nodeNormals = nn;
    }
    const k0 = this.weights(t), w = this.w;
    const w0 = w[0]!, w1 = w[1]!, w2 = w[2]!, w3 = w[3]!;
    const b = k0 * 3;
    for (let c = 0; c < 3; c++) {
      out[off + c] = w0 * nn[b + c]! + w1 * nn[b + 3 + c]! + w2 * nn[b + 6 + c]! + w3 * nn[b + 9 + c]!;
    }
  }

  meanElementsInto(t: Instant, out: Float64Array): void {
    const k0 = this.weights(t);
    for (let j = 0; j < N_EL; j++) out[j] = this.elem(k0, j);
    // dM/dt from the derivative of the Lagrange weights (per node step), then per ms.
    const x = (t - this.start) / this.stepMs - k0;
    const d0 = -(3 * x * x - 12 * x + 11) / 6, d1 = (3 * x * x - 10 * x + 6) / 2;
    const d2 = -(3 * x * x - 8 * x + 3) / 2, d3 = (3 * x * x - 6 * x + 2) / 6;
    const el = this.el, m = 5;
    out[6] =
      (d0 * el[k0 * N_EL + m]! + d1 * el[(k0 + 1) * N_EL + m]! + d2 * el[(k0 + 2) * N_EL + m]! + d3 * el[(k0 + 3) * N_EL + m]!) /
      this.stepMs;
  }

  normalInto(t: Instant, out: Float64Array, off: number): void {
    const k0 = this.weights(t);
    const inc = this.elem(k0, 2), node = this.elem(k0, 3);
    const si = Math.sin(inc);
    out[off] = si * Math.sin(node);
    out[off + 1] = -si * Math.cos(node);
    out[off + 2] = Math.cos(inc);
  }
}

/**
 * Filter model of a trajectory that has no mean elements (straight line, owner ephemeris,
 * sampled primary): the exact positions (error 0) and no orbit plane, so only the radius band
 * (when the source knows one) and the distance bound filter it.
 */
export function exactModel(
  traj: { stateInto(t: Instant, out: Float64Array, off: number): FailureReason | null },
  vMaxKmS: number,
  radiusBandKm?: readonly [number, number],
): OrbitModel {
  const buf = new Float64Array(6);
  return {
    epsKm: 0,
    hasPlane: false,
    rMinKm: radiusBandKm?.[0] ?? 0,
    rMaxKm: radiusBandKm?.[1] ?? Infinity,
    vMaxKmS,
    positionInto(t, out, off) {
      if (traj.stateInto(t, buf, 0)) {
        // Unknown position: make the distance bound useless so nothing is pruned here.
        out[off] = out[off + 1] = out[off + 2] = Number.NaN;
        return;
      }
      out[off] = buf[0]!;
      out[off + 1] = buf[1]!;
      out[off + 2] = buf[2]!;
    },
    normalInto(_t, out, off) {
      out[off] = out[off + 1] = out[off + 2] = Number.NaN;
    },
    tabledNormalInto(_t, out, off) {
      out[off] = out[off + 1] = out[off + 2] = Number.NaN;
    },
  };
}
