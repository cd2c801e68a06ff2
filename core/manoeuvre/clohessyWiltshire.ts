/**
 * Clohessy–Wiltshire (Hill) relative motion (Clohessy & Wiltshire, "Terminal Guidance System
 * for Satellite Rendezvous", J. Aerospace Sci. 27(9), 1960): linearised motion of a point near
 * a circular reference orbit of mean motion n, in the reference's rotating frame with x radial
 * (R), y along track (T), z cross-track (N).
 *
 * Where it holds: circular (e ≲ 1e-3) two-body reference orbit, offsets small beside the orbit
 * radius (errors grow like |offset|²/r), over a few orbits (J2 changes the in-plane frequency by
 * ~1e-3 and drag adds a secular drift). Keepclear's planner uses the numerically integrated STM
 * (variational.ts), which has none of these limits; CW serves as the closed form that checks it
 * and as a hand estimate (test/manoeuvre-cw.test.ts).
 */
import { orbitScale } from '../propagation/numerical/orbitScale.js';
import type { Vec3 } from './burn.js';

/**
 * The 6×6 transition matrix (row-major) of the CW equations over t seconds:
 * [x y z ẋ ẏ ż](t) = Φ(t) · [x y z ẋ ẏ ż](0) (Vallado, Fundamentals of Astrodynamics and
 * Applications, §6.8, the CW solution — from memory).
 */
export function cwTransition(n: number, t: number): number[] {
  const nt = n * t, c = Math.cos(nt), s = Math.sin(nt);
  return [
    4 - 3 * c, 0, 0, s / n, (2 * (1 - c)) / n, 0,
    6 * (s - nt), 1, 0, (-2 * (1 - c)) / n, (4 * s - 3 * nt) / n, 0,
    0, 0, c, 0, 0, s / n,
    3 * n * s, 0, 0, c, 2 * s, 0,
    -6 * n * (1 - c), 0, 0, -2 * s, 4 * c - 3, 0,
    0, 0, -n * s, 0, 0, c,
  ];
}

/** Offset and rate [x y z ẋ ẏ ż] t seconds after an impulse dv (R, T, N; any unit) from zero offset. */
export function cwImpulseResponse(n: number, t: number, dv: Vec3): number[] {
  const phi = cwTransition(n, t);
  return Array.from({ length: 6 }, (_, i) => phi[6 * i + 3]! * dv[0] + phi[6 * i + 4]! * dv[1] + phi[6 * i + 5]! * dv[2]);
}

/**
 * CW estimate of a burn's offset at TCA, in the RTN frame of the unmanoeuvred orbit there (km):
 * n from the two-body semi-major axis of the state at the burn. For near-circular orbits over a
 * few revolutions; beside it the planner's integrated STM (linearMap.ts) holds for any orbit.
 */
export function cwOffsetRtnKm(stateAtBurn: ArrayLike<number>, durationS: number, dvRtnMs: Vec3, mu: number): Vec3 {
  const n = (2 * Math.PI) / orbitScale(stateAtBurn, mu).periodS;
  const s = cwImpulseResponse(n, durationS, [dvRtnMs[0] / 1000, dvRtnMs[1] / 1000, dvRtnMs[2] / 1000]);
  return [s[0]!, s[1]!, s[2]!];
}
