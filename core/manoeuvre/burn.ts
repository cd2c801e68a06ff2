/**
 * An impulsive burn: a velocity change Δv at one instant, given in the primary's RTN frame at
 * that instant (DESIGN.md: R = r/|r|, N = r×v/|r×v|, T = N×R), in m/s as operators state it.
 */
import type { Instant } from '../time/instant.js';

export type RtnAxis = 'R' | 'T' | 'N';
export type Vec3 = readonly [number, number, number];

export interface ImpulsiveBurn {
  readonly time: Instant;
  /** Δv along R, T, N of the state at `time` (m/s) */
  readonly deltaVRtnMs: Vec3;
}

/** Rows R, T, N (unit vectors in TEME) of a state x y z vx vy vz: x_rtn = M · x_teme. */
export function rtnRows(state: ArrayLike<number>): [Vec3, Vec3, Vec3] {
  const x = state[0]!, y = state[1]!, z = state[2]!, vx = state[3]!, vy = state[4]!, vz = state[5]!;
  const r = Math.hypot(x, y, z);
  const R: Vec3 = [x / r, y / r, z / r];
  const hx = y * vz - z * vy, hy = z * vx - x * vz, hz = x * vy - y * vx;
  const h = Math.hypot(hx, hy, hz);
  const N: Vec3 = [hx / h, hy / h, hz / h];
  const T: Vec3 = [N[1] * R[2] - N[2] * R[1], N[2] * R[0] - N[0] * R[2], N[0] * R[1] - N[1] * R[0]];
  return [R, T, N];
}

/** Δv in TEME km/s of an RTN Δv in m/s, for the RTN frame of `state`. */
export function deltaVTemeKmS(state: ArrayLike<number>, dvRtnMs: Vec3): Vec3 {
  const [R, T, N] = rtnRows(state);
  const k = 1e-3;
  return [
    k * (R[0] * dvRtnMs[0] + T[0] * dvRtnMs[1] + N[0] * dvRtnMs[2]),
    k * (R[1] * dvRtnMs[0] + T[1] * dvRtnMs[1] + N[1] * dvRtnMs[2]),
    k * (R[2] * dvRtnMs[0] + T[2] * dvRtnMs[1] + N[2] * dvRtnMs[2]),
  ];
}

/** The state just after the burn: same position, velocity plus Δv. */
export function applyBurn(state: ArrayLike<number>, dvRtnMs: Vec3): Float64Array {
  const dv = deltaVTemeKmS(state, dvRtnMs);
  const out = Float64Array.from({ length: 6 }, (_, i) => state[i]!);
  out[3] = state[3]! + dv[0];
  out[4] = state[4]! + dv[1];
  out[5] = state[5]! + dv[2];
  return out;
}

