/**
 * OEM covariance blocks: the 21 lower-triangle terms as a full 6×6, and its position block turned
 * into the object's RTN frame (R = r/|r|, N = r×v/|r×v|, T = N×R, Keepclear design notes) in m².
 *
 * Frames (CCSDS 502.0-B-2 annex A): RTN (= RSW) needs no rotation; TNW has T along the velocity,
 * W along r×v and N = W×T; an inertial or Earth-fixed frame is rotated to TEME at the covariance
 * epoch and then to RTN with the object's TEME state at that epoch. Only the 3×3 position block
 * is rotated, so the ITRF ω×r velocity term plays no part.
 */
import { congruence, type Matrix } from '../../math/linalg.js';
import type { Instant } from '../../time/instant.js';
import type { StateVector } from '../../units.js';
import { COV_DIMENSION, COVARIANCE_TERMS } from './keywords.js';
import { frameToTemeRotation } from './frames.js';
import type { OemCovariance } from './model.js';

/** km² → m². */
const M2_PER_KM2 = 1e6;

export function fullCovariance(lowerTriangle: readonly number[]): Matrix {
  const c = Array.from({ length: COV_DIMENSION }, () => new Array<number>(COV_DIMENSION).fill(0));
  COVARIANCE_TERMS.forEach((t, i) => {
    c[t.row]![t.col] = lowerTriangle[i]!;
    c[t.col]![t.row] = lowerTriangle[i]!;
  });
  return c;
}

/** The lower triangle row by row (the KVN order), the inverse of fullCovariance. */
export const lowerTriangleOf = (m: Matrix): number[] => COVARIANCE_TERMS.map((t) => m[t.row]![t.col]!);

type V3 = [number, number, number];
const cross = (a: V3, b: V3): V3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: V3): V3 => {
  const n = Math.hypot(a[0], a[1], a[2]);
  return [a[0] / n, a[1] / n, a[2] / n];
};

/** Rows R, T, N in TEME: M · v_TEME = v_RTN. */
export function rtnAxes(s: StateVector<'TEME'>): Matrix {
  const r: V3 = [s.r[0], s.r[1], s.r[2]], v: V3 = [s.v[0], s.v[1], s.v[2]];
  const R = unit(r), N = unit(cross(r, v));
  return [R, cross(N, R), N];
}

/** Rows T, N, W in TEME: M · v_TEME = v_TNW. */
export function tnwAxes(s: StateVector<'TEME'>): Matrix {
  const r: V3 = [s.r[0], s.r[1], s.r[2]], v: V3 = [s.v[0], s.v[1], s.v[2]];
  const T = unit(v), W = unit(cross(r, v));
  return [T, cross(W, T), W];
}

const transpose3 = (m: Matrix): Matrix => [0, 1, 2].map((j) => [0, 1, 2].map((i) => m[i]![j]!));
const mul3 = (a: Matrix, b: Matrix): Matrix =>
  [0, 1, 2].map((i) => [0, 1, 2].map((j) => a[i]![0]! * b[0]![j]! + a[i]![1]! * b[1]![j]! + a[i]![2]! * b[2]![j]!));

/** Does turning this covariance into RTN need the object's state at its epoch? */
export const needsState = (cov: Pick<OemCovariance, 'frame'>): boolean => cov.frame !== 'RTN';

/**
 * The 3×3 position covariance in the object's RTN frame, m². `state` is the object's TEME
 * state at the covariance epoch (unused for an RTN block).
 */
export function positionCovarianceRtnM2(cov: OemCovariance, state: StateVector<'TEME'> | null, epoch: Instant = cov.epoch): Matrix {
  const pos = cov.matrix.slice(0, 3).map((row) => row.slice(0, 3));
  let inRtn: Matrix;
  if (cov.frame === 'RTN') inRtn = pos;
  else {
    if (!state) throw new RangeError(`covariance at line ${cov.line} is in ${cov.frameName}: the object's state is needed to turn it into RTN`);
    const rtn = rtnAxes(state);
    let toTeme: Matrix;
    if (cov.frame === 'TNW') toTeme = transpose3(tnwAxes(state));
    else {
      const m = frameToTemeRotation(cov.frame, epoch);
      toTeme = [[m[0], m[1], m[2]], [m[3], m[4], m[5]], [m[6], m[7], m[8]]];
    }
    inRtn = congruence(mul3(rtn, toTeme), pos);
  }
  return inRtn.map((row) => row.map((x) => x * M2_PER_KM2));
}
