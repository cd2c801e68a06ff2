import { KeepclearError } from '../errors.js';

/** A symmetric 2×2 covariance [[xx, xy], [xy, yy]] in m². */
export type Cov2M2 = readonly [readonly [number, number], readonly [number, number]];
export type Point2 = readonly [number, number];

/** Principal axes of a 2×2 covariance: standard deviations and the major axis' angle from x̂. */
export interface PrincipalAxes {
  /** σ along the major axis (m) */
  readonly sigmaMajorM: number;
  /** σ along the minor axis (m) */
  readonly sigmaMinorM: number;
  /** angle of the major axis from the +x axis, counter-clockwise (rad) */
  readonly angleRad: number;
}

/**
 * Eigenvalues below −this × the trace are not rounding: the matrix is not a covariance. Smaller
 * negative ones (rounding of a nearly singular PSD matrix) are read as zero width.
 */
const NEGATIVE_EIGEN_TOLERANCE = 1e-9;

/**
 * Closed-form eigen-decomposition of a symmetric 2×2 matrix: λ = m ± √(d² + b²) with
 * m = (a + c)/2, d = (a − c)/2, and the major axis at ½·atan2(2b, a − c).
 */
export function principalAxes(cov: Cov2M2): PrincipalAxes {
  const a = cov[0][0], c = cov[1][1];
  const b = 0.5 * (cov[0][1] + cov[1][0]);
  if (![a, b, c].every(Number.isFinite)) {
    throw new KeepclearError('BAD_ARGUMENT', `covariance has a non-finite entry: [[${a}, ${b}], [${b}, ${c}]] m²`);
  }
  const mean = 0.5 * (a + c);
  const r = Math.hypot(0.5 * (a - c), b);
  const hi = mean + r, lo = mean - r;
  const tol = NEGATIVE_EIGEN_TOLERANCE * Math.max(Math.abs(a + c), Number.MIN_VALUE);
  if (lo < -tol) {
    throw new KeepclearError(
      'BAD_ARGUMENT',
      `covariance [[${a}, ${b}], [${b}, ${c}]] m² is not positive semi-definite (eigenvalue ${lo} m²); no ellipse can be drawn`,
    );
  }
  return { sigmaMajorM: Math.sqrt(Math.max(hi, 0)), sigmaMinorM: Math.sqrt(Math.max(lo, 0)), angleRad: 0.5 * Math.atan2(2 * b, a - c) };
}

/** Points on a closed polyline (the first point repeated at the end). */
const closed = (n: number, at: (theta: number) => Point2): Point2[] => {
  const pts: Point2[] = [];
  for (let i = 0; i <= n; i++) pts.push(at((2 * Math.PI * (i % n)) / n));
  return pts;
};

/**
 * The k-σ contour of a bivariate normal centred at `centre`: centre + k·(σ₁cosθ·e₁ + σ₂sinθ·e₂),
 * sampled at n angles. 120 samples keep the chord error below 0.04 % of the radius, well under
 * a pixel on a report-sized plot.
 */
export function ellipsePolyline(centre: Point2, cov: Cov2M2, k: number, n = 120): Point2[] {
  const p = principalAxes(cov);
  const ca = Math.cos(p.angleRad), sa = Math.sin(p.angleRad);
  return closed(n, (t) => {
    const u = k * p.sigmaMajorM * Math.cos(t), v = k * p.sigmaMinorM * Math.sin(t);
    return [centre[0] + u * ca - v * sa, centre[1] + u * sa + v * ca];
  });
}

export function circlePolyline(centre: Point2, radius: number, n = 120): Point2[] {
  return closed(n, (t) => [centre[0] + radius * Math.cos(t), centre[1] + radius * Math.sin(t)]);
}

/**
 * Half-widths along x and y of the k-σ ellipse: k·√Cxx and k·√Cyy (the support function of the
 * ellipse xᵀC⁻¹x = k² in the axis directions). Used to size the plot before sampling.
 */
export const ellipseHalfExtents = (cov: Cov2M2, k: number): Point2 => [
  k * Math.sqrt(Math.max(cov[0][0], 0)),
  k * Math.sqrt(Math.max(cov[1][1], 0)),
];
