import { KeepclearError } from '../errors.js';
import { normalInterval } from './normalInterval.js';

/** A 2-D vector in the encounter plane, metres. */
export type Vec2 = readonly [number, number];
/** A symmetric 2×2 covariance in the encounter plane, m², row-major. */
export type Cov2 = readonly [readonly [number, number], readonly [number, number]];

/**
 * The 2-D Pc problem in the principal axes of the covariance: σx ≥ σy, miss (u, v) reflected
 * into the first quadrant (the disk is symmetric, so reflections do not change Pc).
 */
export interface PrincipalProblem {
  readonly sx: number;
  readonly sy: number;
  readonly u: number;
  readonly v: number;
  readonly r: number;
}

/**
 * Ratio σmin/σmax below which a 2×2 covariance counts as singular for Pc: the 1-D erf form then
 * divides by a σy at rounding level. Our choice (about √ε).
 */
export const MIN_SIGMA_RATIO = 1e-8;

/** Closed-form eigen-decomposition of the 2×2 (no iteration: this is on the fast path). */
export function toPrincipal(miss: Vec2, cov: Cov2, radiusM: number): PrincipalProblem {
  const a = cov[0][0], b = 0.5 * (cov[0][1] + cov[1][0]), c = cov[1][1];
  if (![a, b, c, miss[0], miss[1], radiusM].every(Number.isFinite))
    throw new KeepclearError('BAD_ARGUMENT', 'Pc: miss, covariance and radius must be finite');
  const half = 0.5 * (a + c);
  const rad = Math.hypot(0.5 * (a - c), b);
  const l1 = half + rad;
  // λ2 from the determinant: avoids the cancellation of half − rad for thin ellipses.
  const l2 = l1 > 0 ? (a * c - b * b) / l1 : 0;
  if (!(l1 > 0) || !(l2 > 0) || Math.sqrt(l2 / l1) < MIN_SIGMA_RATIO)
    throw new KeepclearError(
      'BAD_ARGUMENT',
      `Pc: covariance is not positive definite (eigenvalues ${l1.toExponential(3)}, ${l2.toExponential(3)} m²)`,
    );
  const phi = 0.5 * Math.atan2(2 * b, a - c); // direction of the major axis
  const cs = Math.cos(phi), sn = Math.sin(phi);
  return {
    sx: Math.sqrt(l1),
    sy: Math.sqrt(l2),
    u: Math.abs(cs * miss[0] + sn * miss[1]),
    v: Math.abs(-sn * miss[0] + cs * miss[1]),
    r: radiusM,
  };
}

const INV_SQRT_2PI = 0.3989422804014327;

/**
 * Pc as a 1-D integral over the disk, x = R·sin θ, θ ∈ [−π/2, π/2]:
 *   Pc = ∫ R cos θ · φ((R sin θ − u)/σx)/σx · P((−R cos θ − v)/σy < Z < (R cos θ − v)/σy) dθ.
 * The substitution removes the square-root end singularities of the chord length, so the
 * integrand is analytic in θ (exponential convergence of Gauss rules).
 */
export function integrandTheta(p: PrincipalProblem): (theta: number) => number {
  const { sx, sy, u, v, r } = p;
  return (theta: number): number => {
    const half = r * Math.cos(theta);
    if (!(half > 0)) return 0;
    const zx = (r * Math.sin(theta) - u) / sx;
    const dens = (INV_SQRT_2PI / sx) * Math.exp(-0.5 * zx * zx);
    if (dens === 0) return 0;
    return half * dens * normalInterval((-half - v) / sy, (half - v) / sy);
  };
}
