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

/**
 * Angular velocity of the RTN frame, inertial axes, rad/s: ω = (r×v)/|r|². For two-body motion
 * the frame turns about N at the rate of the true anomaly, ḟ = |r×v|/r²; perturbations add a
 * small rotation about R (the orbit plane turning), far below what matters for a covariance.
 * r and v in any consistent units (km and km/s, or m and m/s).
 */
export function rtnAngularVelocity(r: Vec3n, v: Vec3n): Vec3n {
  const h = cross(r, v);
  const r2 = r[0] * r[0] + r[1] * r[1] + r[2] * r[2];
  return [h[0] / r2, h[1] / r2, h[2] / r2];
}

/**
 * Jacobian of the map from a small inertial state deviation (δr, δv) about an object's state to
 * the same deviation seen in that object's rotating RTN frame:
 *   ρ = B·δr,   ρ̇ = B·(δv − ω×δr),   so   J = [[B, 0], [−B·[ω×], B]].
 * The velocity seen in a rotating frame loses the frame's own motion ω×δr; a rotation of the
 * velocity block alone (block-diagonal B) would call an along-track offset on the same orbit
 * (which keeps pace with the frame) a velocity error of |ω|·δr.
 */
export function rtnJacobian(r: Vec3n, v: Vec3n): Matrix {
  const b = rtnBasis(r, v);
  const w = rtnAngularVelocity(r, v);
  // [ω×] such that [ω×]·x = ω × x
  const wx = [[0, -w[2], w[1]], [w[2], 0, -w[0]], [-w[1], w[0], 0]];
  const bw = multiply(b, wx);
  const j = zeros(6);
  for (let i = 0; i < 3; i++)
    for (let k = 0; k < 3; k++) {
      j[i]![k] = b[i]![k]!;
      j[i + 3]![k + 3] = b[i]![k]!;
      j[i + 3]![k] = -bw[i]![k]!;
    }
  return j;
}

/** Inverse of rtnJacobian: δr = Bᵀρ, δv = Bᵀρ̇ + ω×(Bᵀρ), i.e. [[Bᵀ, 0], [[ω×]Bᵀ, Bᵀ]]. */
export function rtnJacobianInverse(r: Vec3n, v: Vec3n): Matrix {
  const bt = transpose(rtnBasis(r, v));
  const w = rtnAngularVelocity(r, v);
  const wx = [[0, -w[2], w[1]], [w[2], 0, -w[0]], [-w[1], w[0], 0]];
  const wbt = multiply(wx, bt);
  const j = zeros(6);
  for (let i = 0; i < 3; i++)
    for (let k = 0; k < 3; k++) {
      j[i]![k] = bt[i]![k]!;
      j[i + 3]![k + 3] = bt[i]![k]!;
      j[i + 3]![k] = wbt[i]![k]!;
    }
  return j;
}

/**
 * C_inertial of a 3×3 position covariance: Bᵀ · C_rtn · B. (A 6×6 needs the object's state for
 * the ω×r term: use rtnToInertialCov6.)
 */
export function rtnToInertialCov(cov: Matrix, basis: Matrix): Matrix {
  if (cov.length !== 3) throw new RangeError('rtnToInertialCov takes a 3×3; use rtnToInertialCov6 for 6×6');
  return multiply(multiply(transpose(basis), cov), basis);
}

/** C_rtn = B · C_inertial · Bᵀ of a 3×3 position covariance. */
export function inertialToRtnCov(cov: Matrix, basis: Matrix): Matrix {
  if (cov.length !== 3) throw new RangeError('inertialToRtnCov takes a 3×3; use inertialToRtnCov6 for 6×6');
  return multiply(multiply(basis, cov), transpose(basis));
}

/**
 * 6×6 RTN covariance (position, velocity in the rotating frame; m², m²/s, m²/s²) to inertial
 * axes about the object's state (r, v): J⁻¹ · C · J⁻ᵀ with the ω×r term (rtnJacobianInverse).
 */
export function rtnToInertialCov6(cov: Matrix, r: Vec3n, v: Vec3n): Matrix {
  const ji = rtnJacobianInverse(r, v);
  return multiply(multiply(ji, cov), transpose(ji));
}

/** 6×6 inertial covariance to the object's rotating RTN frame: J · C · Jᵀ (rtnJacobian). */
export function inertialToRtnCov6(cov: Matrix, r: Vec3n, v: Vec3n): Matrix {
  const j = rtnJacobian(r, v);
  return multiply(multiply(j, cov), transpose(j));
}
