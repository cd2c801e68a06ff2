/**
 * How often each object is sampled with SGP4 for the spatial index, and how far the cubic
 * Hermite interpolant of those samples can be from SGP4 itself (the pad E of the index).
 *
 * Cubic Hermite interpolation through positions and velocities at both ends of an interval h
 * errs by at most h⁴/384 · max|r⁗| (standard remainder of two-point Hermite interpolation).
 * For a Kepler orbit, max|r⁗| over the orbit is ≤ 1.13 · n_p⁴ · r_p (n_p the angular rate at
 * perigee, r_p the perigee radius; measured numerically for 0 ≤ e ≤ 0.97, maximum 1.124 at
 * e ≈ 0.3); SGP4's short-period J2 terms (≈ 10 km at twice the orbital rate in LEO) add about
 * 16·10 km·n⁴, ≤ 3 % of n⁴·r. R4_FACTOR = 2 covers both with a wide margin.
 *
 * SGP4's velocity is not exactly the time derivative of its position (|v − dr/dt| measured up to
 * 2e-5 km/s in LEO, 6e-5 GEO, 2e-3 GTO; test/support/bruteForce.ts). A velocity error δ at both
 * ends moves the interpolant by h·δ·max(|h10| + |h11|) = h·δ·s(1 − s) ≤ h·δ/4.
 *
 * So E = EPS_SAFETY · ((h·n_p)⁴·r_p·R4_FACTOR/384 + h·δ/4) + EPS_FLOOR_KM, and the step h is
 * chosen so that the first term stays near HERMITE_TARGET_KM. test/spatial-sampling.test.ts
 * compares E with |SGP4 − interpolant| at random instants for every family of the synthetic
 * catalogue.
 */
import { MU_EARTH_WGS72 } from '../../units.js';

const R4_FACTOR = 2;
/** Target of the r⁗ term of the interpolation error (km): small next to a 5 km volume. */
const HERMITE_TARGET_KM = 0.25;
/** Bounds of |v − dr/dt| (km/s): 3× the measured 6e-5 for near-circular orbits, 2.5× the
 *  measured 2e-3 for eccentric (GTO-like) ones. */
const VEL_MISMATCH_CIRCULAR_KMS = 2e-4;
const VEL_MISMATCH_ECCENTRIC_KMS = 5e-3;
const ECCENTRIC_FROM = 0.1;
/** Safety on the derived bound, and a floor for rounding (km). */
const EPS_SAFETY = 1.5;
const EPS_FLOOR_KM = 0.01;
/** Sample steps (s): at least 20 s (no use sampling finer than the index step), at most 30 min
 *  (deep-space propagation is slow; a GEO orbit turns 0.13 rad in 30 min, error ≈ 0.1 km). */
const MIN_SAMPLE_S = 20;
const MAX_SAMPLE_S = 1800;

export interface SamplingPlan {
  /** largest sample step (s) */
  readonly maxStepS: number;
  /** perigee angular rate (rad/s) and perigee radius (km) behind the bound */
  readonly perigeeRateRadS: number;
  readonly perigeeKm: number;
  readonly velocityMismatchKmS: number;
}

/** Plan of one object from its mean motion (rev/day) and eccentricity. */
export function samplingPlan(meanMotionRevPerDay: number, eccentricity: number): SamplingPlan {
  const n = (meanMotionRevPerDay * 2 * Math.PI) / 86_400;
  const e = Math.min(Math.max(eccentricity, 0), 0.99);
  const a = Math.cbrt(MU_EARTH_WGS72 / (n * n));
  const rp = a * (1 - e);
  const np = (n * Math.sqrt(1 + e)) / Math.pow(1 - e, 1.5);
  // (h·n_p)⁴·r_p·R4_FACTOR/384 = target  →  h = (384·target/(R4_FACTOR·r_p))^¼ / n_p
  const h = Math.pow((384 * HERMITE_TARGET_KM) / (R4_FACTOR * rp), 0.25) / np;
  return {
    maxStepS: Math.min(MAX_SAMPLE_S, Math.max(MIN_SAMPLE_S, h)),
    perigeeRateRadS: np,
    perigeeKm: rp,
    velocityMismatchKmS: e >= ECCENTRIC_FROM ? VEL_MISMATCH_ECCENTRIC_KMS : VEL_MISMATCH_CIRCULAR_KMS,
  };
}

/** Bound of |SGP4 − Hermite interpolant| (km) for samples h seconds apart. */
export function interpolationBoundKm(plan: SamplingPlan, stepS: number): number {
  const hn = stepS * plan.perigeeRateRadS;
  return EPS_SAFETY * ((hn * hn * hn * hn * plan.perigeeKm * R4_FACTOR) / 384 + (stepS * plan.velocityMismatchKmS) / 4) + EPS_FLOOR_KM;
}
