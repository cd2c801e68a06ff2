import type { ScreeningVolume } from './types.js';
import { norm3 } from '../math/norm.js';

/**
 * Relative geometry of two TEME states (x y z vx vy vz, km and km/s).
 * RTN of the primary: R = r/|r|, N = (r×v)/|r×v|, T = N×R (DESIGN.md "Time, frames, units").
 */
export function rtnBasis(p: ArrayLike<number>): [number[], number[], number[]] {
  const r = [p[0]!, p[1]!, p[2]!], v = [p[3]!, p[4]!, p[5]!];
  const rn = norm3(r[0]!, r[1]!, r[2]!);
  const R = r.map((x) => x / rn);
  const h = [r[1]! * v[2]! - r[2]! * v[1]!, r[2]! * v[0]! - r[0]! * v[2]!, r[0]! * v[1]! - r[1]! * v[0]!];
  const hn = norm3(h[0]!, h[1]!, h[2]!);
  const N = h.map((x) => x / hn);
  const T = [N[1]! * R[2]! - N[2]! * R[1]!, N[2]! * R[0]! - N[0]! * R[2]!, N[0]! * R[1]! - N[1]! * R[0]!];
  return [R, T, N];
}

/** Secondary minus primary position, in the primary's RTN frame (km). */
export function relativeRtn(p: ArrayLike<number>, s: ArrayLike<number>): [number, number, number] {
  const [R, T, N] = rtnBasis(p);
  const d = [s[0]! - p[0]!, s[1]! - p[1]!, s[2]! - p[2]!];
  const dot = (u: number[]) => u[0]! * d[0]! + u[1]! * d[1]! + u[2]! * d[2]!;
  return [dot(R), dot(T), dot(N)];
}

/** Angle between the two velocity vectors, degrees (0 overtaking, 180 head-on). */
export function approachAngleDeg(p: ArrayLike<number>, s: ArrayLike<number>): number {
  const dot = p[3]! * s[3]! + p[4]! * s[4]! + p[5]! * s[5]!;
  const c = dot / (norm3(p[3]!, p[4]!, p[5]!) * norm3(s[3]!, s[4]!, s[5]!));
  return (Math.acos(Math.min(1, Math.max(-1, c))) * 180) / Math.PI;
}

/** Largest distance from the primary that can still be inside the volume (km). */
export function volumeBoundKm(v: ScreeningVolume): number {
  return v.kind === 'sphere' ? v.radiusKm : Math.max(v.rKm, v.tKm, v.nKm);
}

/**
 * Normalised distance: ≤ 1 inside the volume. Sphere: d/R. Ellipsoid: √((r/a)²+(t/b)²+(n/c)²)
 * with the offset expressed in the primary's RTN frame at that instant.
 */
export function volumeMetric(v: ScreeningVolume, p: ArrayLike<number>, s: ArrayLike<number>): number {
  if (v.kind === 'sphere') {
    return norm3(s[0]! - p[0]!, s[1]! - p[1]!, s[2]! - p[2]!) / v.radiusKm;
  }
  const [r, t, n] = relativeRtn(p, s);
  return norm3(r / v.rKm, t / v.tKm, n / v.nKm);
}
