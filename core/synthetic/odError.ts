import type { FitTarget } from './fit.js';
import type { Rng } from './random.js';

/**
 * An orbit-determination error as a tracking network's newest element set would carry it: a
 * state (TEME km, km/s) disturbed in its own RTN frame.
 *
 * Error sizes (1σ; rough figures from memory for public LEO element sets at epoch): radial
 * 30 m, along-track 150 m, cross-track 40 m. Velocity errors are drawn mostly drift-free in the
 * Clohessy–Wiltshire sense (rotating-frame along-track rate −2n·δR), plus 1.5 mm/s along-track so
 * the along-track difference grows by a few hundred metres per day, as it does between real sets.
 */
export const OD_SIGMA_M = { radial: 30, alongTrack: 150, crossTrack: 40 } as const;
export const DRIFT_SIGMA_KMS = 1.5e-6;

export function withOrbitDeterminationError(r: readonly number[], v: readonly number[], rng: Rng): FitTarget {
  const rn = Math.hypot(r[0]!, r[1]!, r[2]!);
  const R = r.map((x) => x / rn);
  const h = [r[1]! * v[2]! - r[2]! * v[1]!, r[2]! * v[0]! - r[0]! * v[2]!, r[0]! * v[1]! - r[1]! * v[0]!];
  const hn = Math.hypot(h[0]!, h[1]!, h[2]!);
  const N = h.map((x) => x / hn);
  const T = [N[1]! * R[2]! - N[2]! * R[1]!, N[2]! * R[0]! - N[0]! * R[2]!, N[0]! * R[1]! - N[1]! * R[0]!];
  const n = hn / (rn * rn); // angular rate, rad/s
  const dR = rng.normal(0, OD_SIGMA_M.radial / 1000);
  const dT = rng.normal(0, OD_SIGMA_M.alongTrack / 1000);
  const dN = rng.normal(0, OD_SIGMA_M.crossTrack / 1000);
  // Relative velocity in the rotating frame (CW: drift-free when ẏ = −2n·x), then to inertial
  // by adding ω × δr with ω = n·N: +n·δR along T and −n·δT along R.
  const xDot = rng.normal(0, (n * OD_SIGMA_M.crossTrack) / 1000);
  const yDot = -2 * n * dR + rng.normal(0, DRIFT_SIGMA_KMS);
  const zDot = rng.normal(0, (n * OD_SIGMA_M.crossTrack) / 1000);
  const dvR = xDot - n * dT, dvT = yDot + n * dR, dvN = zDot;
  return {
    r: [0, 1, 2].map((j) => r[j]! + dR * R[j]! + dT * T[j]! + dN * N[j]!),
    v: [0, 1, 2].map((j) => v[j]! + dvR * R[j]! + dvT * T[j]! + dvN * N[j]!),
  };
}
