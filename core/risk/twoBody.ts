import { MU_EARTH_WGS84 } from '../units.js';

/** Earth's μ in m³/s² (WGS-84 value of core/units.ts, which is in km³/s²). */
export const MU_M3_S2 = MU_EARTH_WGS84 * 1e9;

/** A position-velocity state in metres and m/s, inertial axes. */
export type State6 = readonly [number, number, number, number, number, number];

/** Newton iterations on the universal anomaly; it converges quadratically in a few. */
const MAX_ITERATIONS = 50;
/** Stop when the time of flight matches to this fraction of a second (far below 1 µs). */
const TIME_TOL_S = 1e-9;

/** Stumpff functions c2(ψ), c3(ψ) with series near ψ = 0 (no cancellation). */
function stumpff(psi: number): [number, number] {
  if (psi > 1e-6) {
    const s = Math.sqrt(psi);
    return [(1 - Math.cos(s)) / psi, (s - Math.sin(s)) / (s * psi)];
  }
  if (psi < -1e-6) {
    const s = Math.sqrt(-psi);
    return [(1 - Math.cosh(s)) / psi, (Math.sinh(s) - s) / (s * -psi)];
  }
  return [1 / 2 - psi / 24 + (psi * psi) / 720, 1 / 6 - psi / 120 + (psi * psi) / 5040];
}

/**
 * Two-body (Keplerian) propagation by Lagrange f and g with the universal anomaly χ (Vallado,
 * Fundamentals of Astrodynamics and Applications, algorithm "KEPLER", universal-variable form;
 * Bate, Mueller & White ch. 4). Valid for every conic. dt in seconds, either sign.
 */
export function propagateTwoBody(x: State6, dt: number, mu = MU_M3_S2): State6 {
  if (dt === 0) return x;
  const r0v = [x[0], x[1], x[2]], v0v = [x[3], x[4], x[5]];
  const r0 = Math.hypot(x[0], x[1], x[2]);
  const v2 = x[3] * x[3] + x[4] * x[4] + x[5] * x[5];
  const rv = x[0] * x[3] + x[1] * x[4] + x[2] * x[5];
  const sqmu = Math.sqrt(mu);
  const alpha = 2 / r0 - v2 / mu; // 1/a
  // Starting guess: elliptic χ ≈ √μ·dt·α; otherwise a small-step guess (refined by Newton).
  let chi = alpha > 1e-12 ? sqmu * dt * alpha : (sqmu * dt) / r0;
  let c2 = 0.5, c3 = 1 / 6, psi = 0, r = r0;
  for (let k = 0; k < MAX_ITERATIONS; k++) {
    psi = chi * chi * alpha;
    [c2, c3] = stumpff(psi);
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
  return [
    f * r0v[0]! + g * v0v[0]!,
    f * r0v[1]! + g * v0v[1]!,
    f * r0v[2]! + g * v0v[2]!,
    fdot * r0v[0]! + gdot * v0v[0]!,
    fdot * r0v[1]! + gdot * v0v[1]!,
    fdot * r0v[2]! + gdot * v0v[2]!,
  ];
}

/** Forward-difference steps of the state transition matrix: 1 m and 1 mm/s. The truncation
 * error is ~h/|r| relative (1.5e-7 in LEO) and the rounding error ~ε·|r|/h (1.6e-9): far below
 * what a covariance needs, at half the cost of central differences. */
const STM_STEP_POSITION_M = 1;
const STM_STEP_VELOCITY_MPS = 1e-3;

/** State at dt and the two-body state transition matrix Φ(dt) = ∂x(dt)/∂x(0) (6×6, row-major). */
export function propagateWithStm(x: State6, dt: number, mu = MU_M3_S2): { state: State6; stm: number[][] } {
  const state = propagateTwoBody(x, dt, mu);
  const stm = Array.from({ length: 6 }, () => new Array<number>(6).fill(0));
  for (let k = 0; k < 6; k++) {
    const h = k < 3 ? STM_STEP_POSITION_M : STM_STEP_VELOCITY_MPS;
    const plus = x.slice() as number[];
    plus[k]! += h;
    const a = propagateTwoBody(plus as unknown as State6, dt, mu);
    for (let i = 0; i < 6; i++) stm[i]![k] = (a[i]! - state[i]!) / h;
  }
  return { state, stm };
}
