import { MU_EARTH_WGS84 } from '../units.js';

/** Earth's μ in m³/s² (WGS-84 value of core/units.ts, which is in km³/s²). */
export const MU_M3_S2 = MU_EARTH_WGS84 * 1e9;

/** A position-velocity state in metres and m/s, inertial axes. */
export type State6 = readonly [number, number, number, number, number, number];

/** Newton iterations on the universal anomaly; it converges quadratically in a few. */
const MAX_ITERATIONS = 50;
/** Stop when the time of flight matches to this fraction of a second (far below 1 µs). */
const TIME_TOL_S = 1e-9;

/** Stumpff functions c2(ψ), c3(ψ) with series near ψ = 0 (no cancellation), into C2 and C3
 * (module variables: the 3-D Pc calls this millions of times, and a returned pair allocates). */
let C2 = 0.5, C3 = 1 / 6;
function stumpff(psi: number): void {
  if (psi > 1e-6) {
    const s = Math.sqrt(psi);
    C2 = (1 - Math.cos(s)) / psi;
    C3 = (s - Math.sin(s)) / (s * psi);
    return;
  }
  if (psi < -1e-6) {
    const s = Math.sqrt(-psi);
    C2 = (1 - Math.cosh(s)) / psi;
    C3 = (Math.sinh(s) - s) / (s * -psi);
    return;
  }
  C2 = 1 / 2 - psi / 24 + (psi * psi) / 720;
  C3 = 1 / 6 - psi / 120 + (psi * psi) / 5040;
}

/** A writable state of 6 numbers (a plain array or a Float64Array). */
type StateOut = { [i: number]: number };

/**
 * Two-body (Keplerian) propagation by Lagrange f and g with the universal anomaly χ (Vallado,
 * Fundamentals of Astrodynamics and Applications, algorithm "KEPLER", universal-variable form;
 * Bate, Mueller & White ch. 4). Valid for every conic. dt in seconds, either sign.
 */
export function propagateTwoBody(x: State6, dt: number, mu = MU_M3_S2): State6 {
  if (dt === 0) return x;
  const out = [0, 0, 0, 0, 0, 0];
  propagateTwoBodyInto(x, dt, mu, out, 0);
  return out as unknown as State6;
}

/** propagateTwoBody written into out[off..off+5] without allocating (dt = 0 copies x). */
export function propagateTwoBodyInto(x: ArrayLike<number>, dt: number, mu: number, out: StateOut, off: number): void {
  const x0 = x[0]!, x1 = x[1]!, x2 = x[2]!, x3 = x[3]!, x4 = x[4]!, x5 = x[5]!;
  if (dt === 0) {
    out[off] = x0; out[off + 1] = x1; out[off + 2] = x2; out[off + 3] = x3; out[off + 4] = x4; out[off + 5] = x5;
    return;
  }
  const r0 = Math.hypot(x0, x1, x2);
  const v2 = x3 * x3 + x4 * x4 + x5 * x5;
  const rv = x0 * x3 + x1 * x4 + x2 * x5;
  const sqmu = Math.sqrt(mu);
  const alpha = 2 / r0 - v2 / mu; // 1/a
  // Starting guess: elliptic χ ≈ √μ·dt·α; otherwise a small-step guess (refined by Newton).
  let chi = alpha > 1e-12 ? sqmu * dt * alpha : (sqmu * dt) / r0;
  let c2 = 0.5, c3 = 1 / 6, psi = 0, r = r0;
  for (let k = 0; k < MAX_ITERATIONS; k++) {
    psi = chi * chi * alpha;
    stumpff(psi);
    c2 = C2;
    c3 = C3;
    const chi2 = chi * chi;
    r = chi2 * c2 + (rv / sqmu) * chi * (1 - psi * c3) + r0 * (1 - psi * c2);
    const t = (chi2 * chi * c3 + (rv / sqmu) * chi2 * c2 + r0 * chi * (1 - psi * c3)) / sqmu;
    const err = dt - t;
    if (Math.abs(err) < TIME_TOL_S) break;
    chi += (sqmu * err) / r;
  }
  const chi2 = chi * chi;
  const f = 1 - (chi2 / r0) * c2;
  const g = dt - (chi2 * chi * c3) / sqmu;
  const gdot = 1 - (chi2 / r) * c2;
  const fdot = (sqmu / (r * r0)) * chi * (psi * c3 - 1);
  out[off] = f * x0 + g * x3;
  out[off + 1] = f * x1 + g * x4;
  out[off + 2] = f * x2 + g * x5;
  out[off + 3] = fdot * x0 + gdot * x3;
  out[off + 4] = fdot * x1 + gdot * x4;
  out[off + 5] = fdot * x2 + gdot * x5;
}

/** Forward-difference steps of the state transition matrix: 1 m and 1 mm/s. The truncation
 * error is ~h/|r| relative (1.5e-7 in LEO) and the rounding error ~ε·|r|/h (1.6e-9): far below
 * what a covariance needs, at half the cost of central differences. */
const STM_STEP_POSITION_M = 1;
const STM_STEP_VELOCITY_MPS = 1e-3;

/** State at dt and the two-body state transition matrix Φ(dt) = ∂x(dt)/∂x(0) (6×6, row-major). */
export function propagateWithStm(x: State6, dt: number, mu = MU_M3_S2): { state: State6; stm: number[][] } {
  const state = new Float64Array(6), flat = new Float64Array(36);
  propagateWithStmInto(x, dt, mu, state, flat, new Float64Array(6), new Float64Array(6));
  return {
    state: Array.from(state) as unknown as State6,
    stm: Array.from({ length: 6 }, (_, i) => Array.from(flat.subarray(6 * i, 6 * i + 6))),
  };
}

/**
 * propagateWithStm into `state` (6) and `stm` (36, row-major) without allocating; `plus` and
 * `moved` are scratch arrays of 6.
 */
export function propagateWithStmInto(
  x: ArrayLike<number>, dt: number, mu: number, state: Float64Array, stm: Float64Array, plus: Float64Array, moved: Float64Array,
): void {
  propagateTwoBodyInto(x, dt, mu, state, 0);
  for (let k = 0; k < 6; k++) {
    const h = k < 3 ? STM_STEP_POSITION_M : STM_STEP_VELOCITY_MPS;
    for (let i = 0; i < 6; i++) plus[i] = x[i]!;
    plus[k]! += h;
    propagateTwoBodyInto(plus, dt, mu, moved, 0);
    for (let i = 0; i < 6; i++) stm[6 * i + k] = (moved[i]! - state[i]!) / h;
  }
}
