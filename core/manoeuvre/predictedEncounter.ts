/**
 * The encounter a burn would give according to the linear map (linearMap.ts): the primary's
 * state at the old TCA moved by δx, the secondary's unchanged, and the new TCA found on the
 * straight-line relative motion through that point (TCA shift −(Δr·Δv)/|Δv|²). Costs no
 * propagation, so the solver can try hundreds of burns with it; only first guesses and
 * directions come from it.
 */
import { approachAngleDeg, relativeRtn } from '../screening/geometry.js';
import type { Encounter, StateArray } from '../events/index.js';
import type { Instant } from '../time/instant.js';
import type { Vec3 } from './burn.js';
import { linearOffset, type BurnSensitivity } from './linearMap.js';

export function predictedEncounter(base: Encounter, sens: BurnSensitivity, dvRtnMs: Vec3): Encounter {
  const d = linearOffset(sens, dvRtnMs);
  const p = base.primaryState.map((x, i) => x + d[i]!);
  const s = base.secondaryState;
  const dr = [s[0] - p[0]!, s[1] - p[1]!, s[2] - p[2]!];
  const dv = [s[3] - p[3]!, s[4] - p[4]!, s[5] - p[5]!];
  const v2 = dv[0]! * dv[0]! + dv[1]! * dv[1]! + dv[2]! * dv[2]!;
  const shiftS = v2 > 0 ? -(dr[0]! * dv[0]! + dr[1]! * dv[1]! + dr[2]! * dv[2]!) / v2 : 0;
  const move = (x: readonly number[]): StateArray =>
    [x[0]! + x[3]! * shiftS, x[1]! + x[4]! * shiftS, x[2]! + x[5]! * shiftS, x[3]!, x[4]!, x[5]!] as const;
  const p2 = move(p), s2 = move(s);
  return {
    ...base,
    tca: (base.tca + shiftS * 1000) as Instant,
    missKm: Math.hypot(s2[0] - p2[0], s2[1] - p2[1], s2[2] - p2[2]),
    relativeSpeedKmS: Math.sqrt(v2),
    rtnKm: relativeRtn(p2, s2),
    approachAngleDeg: approachAngleDeg(p2, s2),
    primaryState: p2,
    secondaryState: s2,
    entry: null,
    exit: null,
  };
}
