/**
 * Geometry of an encounter from the two TEME states at TCA (x y z km, vx vy vz km/s).
 * RTN of the primary: R = r/|r|, N = (r×v)/|r×v|, T = N×R (DESIGN.md "Time, frames, units");
 * a relative position "in RTN" is secondary minus primary in the primary's RTN frame.
 */

type Vec = [number, number, number];

const cross = (a: Vec, b: Vec): Vec => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: Vec): Vec => {
  const n = Math.hypot(a[0], a[1], a[2]);
  return [a[0] / n, a[1] / n, a[2] / n];
};
const dot = (a: Vec, b: Vec): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];

/** Secondary minus primary position, in the primary's RTN frame (km). */
export function relativeRtn(p: ArrayLike<number>, s: ArrayLike<number>): [number, number, number] {
  const r: Vec = [p[0]!, p[1]!, p[2]!];
  const v: Vec = [p[3]!, p[4]!, p[5]!];
  const R = unit(r);
  const N = unit(cross(r, v));
  const T = cross(N, R);
  const d: Vec = [s[0]! - p[0]!, s[1]! - p[1]!, s[2]! - p[2]!];
  return [dot(d, R), dot(d, T), dot(d, N)];
}

/** Angle between the two velocity vectors, degrees (0 overtaking, 180 head-on). */
export function approachAngleDeg(p: ArrayLike<number>, s: ArrayLike<number>): number {
  const vp: Vec = [p[3]!, p[4]!, p[5]!];
  const vs: Vec = [s[3]!, s[4]!, s[5]!];
  const c = dot(vp, vs) / (Math.hypot(...vp) * Math.hypot(...vs));
  return (Math.acos(Math.min(1, Math.max(-1, c))) * 180) / Math.PI;
}

/** |secondary − primary| position (km) and velocity (km/s). */
export function missAndSpeed(p: ArrayLike<number>, s: ArrayLike<number>): { missKm: number; relativeSpeedKmS: number } {
  return {
    missKm: Math.hypot(s[0]! - p[0]!, s[1]! - p[1]!, s[2]! - p[2]!),
    relativeSpeedKmS: Math.hypot(s[3]! - p[3]!, s[4]! - p[4]!, s[5]! - p[5]!),
  };
}
