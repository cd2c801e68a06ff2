import { multiply, transpose, zeros, type Matrix } from '../math/linalg.js';

export type Vec3n = readonly [number, number, number];

const cross = (a: Vec3n, b: Vec3n): Vec3n => [
  a[1] * b[2] - a[2] * b[1],
  a[2] * b[0] - a[0] * b[2],
  a[0] * b[1] - a[1] * b[0],
];
const unit = (a: Vec3n): Vec3n => {
  const n = Math.hypot(a[0], a[1], a[2]);
  return [a[0] / n, a[1] / n, a[2] / n];
};

/**
 * RTN basis of an object from its inertial (TEME) position and velocity, as in DESIGN.md:
 * R = r/|r|, N = r×v/|r×v|, T = N×R. Rows are R, T, N, so `basis · x_inertial = x_rtn`.
 * Any unit of r and v works (only directions are used).
 */
export function rtnBasis(r: Vec3n, v: Vec3n): Matrix {
  const R = unit(r);
  const N = unit(cross(r, v));
  const T = cross(N, R);
  return [[...R], [...T], [...N]];
}

export const inertialToRtnVec = (x: Vec3n, basis: Matrix): Vec3n => {
  const y = multiply(basis, [[x[0]], [x[1]], [x[2]]]);
  return [y[0]![0]!, y[1]![0]!, y[2]![0]!];
};

/** 6×6 block-diagonal rotation [[B, 0], [0, B]]. */
function block6(b: Matrix): Matrix {
  const out = zeros(6);
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) {
      out[i]![j] = b[i]![j]!;
      out[i + 3]![j + 3] = b[i]![j]!;
    }
  return out;
}

/** C_inertial = Bᵀ · C_rtn · B for a 3×3 (position) or 6×6 (position, velocity) covariance. */
export function rtnToInertialCov(cov: Matrix, basis: Matrix): Matrix {
  const b = cov.length === 6 ? block6(basis) : basis;
  return multiply(multiply(transpose(b), cov), b);
}

/** C_rtn = B · C_inertial · Bᵀ. */
export function inertialToRtnCov(cov: Matrix, basis: Matrix): Matrix {
  const b = cov.length === 6 ? block6(basis) : basis;
  return multiply(multiply(b, cov), transpose(b));
}
