/**
 * A 3×3 position covariance as an ellipsoid: the principal standard deviations and their
 * directions, from the eigen-decomposition of the symmetric matrix (x − μ)ᵀ C⁻¹ (x − μ) = k²
 * has semi-axes k·√λᵢ along the eigenvectors eᵢ). Also the change of frame of a covariance.
 */
import { KeepclearError } from '../errors.js';
import { symmetricEigen, type Matrix } from '../math/linalg.js';
import type { Matrix3 } from '../events/index.js';

export type Vec3n = readonly [number, number, number];

/** One covariance ellipsoid in a stated frame (the scene uses the primary's RTN at TCA). */
export interface CovarianceEllipsoid {
  /** 1σ semi-axes, largest first (m) */
  readonly sigmaM: Vec3n;
  /** unit vectors of the semi-axes, in the same order, as rows: axesRtn[i] goes with sigmaM[i] */
  readonly axesRtn: readonly [Vec3n, Vec3n, Vec3n];
  /** the covariance itself in the frame of the axes (m²), for tooltips and checks */
  readonly covRtnM2: Matrix3;
}

/**
 * Negative eigenvalues down to −this × the largest are rounding of a semi-definite matrix (read
 * as zero width); below that the matrix is not a covariance and no ellipsoid is drawn. Same
 * spirit as REPAIRABLE_NEGATIVE_FRACTION in core/risk/covariancePsd.ts, but a drawing only needs
 * the shape, so the tolerance is the plain rounding level of a Jacobi sweep.
 */
export const ELLIPSOID_NEGATIVE_TOLERANCE = 1e-9;

const asMatrix3 = (m: Matrix): Matrix3 =>
  [[m[0]![0]!, m[0]![1]!, m[0]![2]!], [m[1]![0]!, m[1]![1]!, m[1]![2]!], [m[2]![0]!, m[2]![1]!, m[2]![2]!]] as const;

/** The ellipsoid of a 3×3 covariance (m²). Throws BAD_ARGUMENT for a matrix that is not one. */
export function covarianceEllipsoid(cov: Matrix3 | Matrix): CovarianceEllipsoid {
  const m: Matrix = [0, 1, 2].map((i) => [0, 1, 2].map((j) => cov[i]![j]!));
  if (!m.every((row) => row.every(Number.isFinite))) {
    throw new KeepclearError('BAD_ARGUMENT', `covariance has a non-finite entry: ${JSON.stringify(m)} m²`);
  }
  const { values, vectors } = symmetricEigen(m);
  const largest = Math.max(...values.map(Math.abs));
  const order = [2, 1, 0]; // symmetricEigen returns ascending values
  const lo = values[0]!;
  if (lo < -ELLIPSOID_NEGATIVE_TOLERANCE * largest) {
    throw new KeepclearError(
      'BAD_ARGUMENT',
      `covariance ${JSON.stringify(m)} m² is not positive semi-definite (eigenvalue ${lo} m²); no ellipsoid can be drawn`,
    );
  }
  const sigma = order.map((k) => Math.sqrt(Math.max(values[k]!, 0)));
  const axis = (k: number): Vec3n => {
    const v: Vec3n = [vectors[0]![k]!, vectors[1]![k]!, vectors[2]![k]!];
    const n = Math.hypot(...v);
    return [v[0] / n, v[1] / n, v[2] / n];
  };
  let axes = order.map(axis) as [Vec3n, Vec3n, Vec3n];
  // Right-handed (third = first × second), so a renderer can use the rows as a rotation matrix.
  const [a, b, c] = axes;
  const cr: Vec3n = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  if (cr[0] * c[0] + cr[1] * c[1] + cr[2] * c[2] < 0) axes = [a, b, [-c[0], -c[1], -c[2]]];
  return { sigmaM: [sigma[0]!, sigma[1]!, sigma[2]!], axesRtn: axes, covRtnM2: asMatrix3(m) };
}

/**
 * C_to = M · C_from · Mᵀ with M = B_to · B_fromᵀ, where the bases' rows are the frames' unit
 * vectors in a common (inertial) frame: a covariance given in one object's RTN frame, re-expressed
 * in another's.
 */
export function reframeCovariance(cov: Matrix3, fromBasis: readonly Vec3n[], toBasis: readonly Vec3n[]): Matrix3 {
  const M = [0, 1, 2].map((i) => [0, 1, 2].map((j) => dot(toBasis[i]!, fromBasis[j]!)));
  const out = [0, 1, 2].map((i) =>
    [0, 1, 2].map((j) => {
      let s = 0;
      for (let p = 0; p < 3; p++) for (let q = 0; q < 3; q++) s += M[i]![p]! * cov[p]![q]! * M[j]![q]!;
      return s;
    }),
  );
  return asMatrix3(out);
}

const dot = (a: Vec3n, b: Vec3n): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];

/** RTN unit vectors (rows R, T, N) of a state, as in DESIGN.md: R = r/|r|, N = r×v/|r×v|, T = N×R. */
export function rtnAxes(state: ArrayLike<number>): [Vec3n, Vec3n, Vec3n] {
  const r: Vec3n = [state[0]!, state[1]!, state[2]!];
  const v: Vec3n = [state[3]!, state[4]!, state[5]!];
  const unit = (x: Vec3n): Vec3n => {
    const n = Math.hypot(...x);
    return [x[0] / n, x[1] / n, x[2] / n];
  };
  const cross = (a: Vec3n, b: Vec3n): Vec3n => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  const R = unit(r);
  const N = unit(cross(r, v));
  return [R, cross(N, R), N];
}

/** Sum of two 3×3 covariances (independent errors add). */
export const addCovariances = (a: Matrix3, b: Matrix3): Matrix3 =>
  asMatrix3([0, 1, 2].map((i) => [0, 1, 2].map((j) => a[i]![j]! + b[i]![j]!)));
