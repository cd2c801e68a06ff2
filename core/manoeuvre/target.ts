/**
 * What the burn must achieve, and how far an encounter is from it. The margin is ≥ 0 exactly
 * when the target is met; it is what the solver brackets and refines.
 */
import type { Encounter } from '../events/index.js';

export type AvoidanceTarget =
  /** new closest approach at least this far (km) */
  | { readonly kind: 'miss'; readonly missKm: number }
  /** probability of collision at most this */
  | { readonly kind: 'pc'; readonly pc: number };

/**
 * Pc of an encounter with the event's own covariances and method (the app passes
 * core/risk/assess.ts assessEncounter with the event's stored inputs). Called hundreds of times
 * per plan: resolve covariances once outside (e.g. a fixed RTN covariance), not per call.
 */
export type PcCallback = (encounter: Encounter) => number | null;

/** Pc of exactly zero (or below double range) counts as 1e-300 in the margin's logarithm. */
const SMALLEST_PC = 1e-300;

export interface Outcome {
  readonly encounter: Encounter | null;
  readonly pc: number | null;
  /** ≥ 0: target met. km for a miss target, decades (log10) for a Pc target. */
  readonly margin: number;
}

/**
 * A closest approach on the search-window edge is not a true minimum (the distance was still
 * falling there): it counts as not met, so no answer rests on a minimum that was not found.
 */
export function outcomeOf(target: AvoidanceTarget, encounter: Encounter | null, pc: number | null): Outcome {
  if (!encounter || encounter.atWindowEdge) return { encounter, pc, margin: -Infinity };
  if (target.kind === 'miss') return { encounter, pc, margin: encounter.missKm - target.missKm };
  if (pc === null || !(pc >= 0)) return { encounter, pc, margin: -Infinity };
  return { encounter, pc, margin: Math.log10(target.pc) - Math.log10(Math.max(pc, SMALLEST_PC)) };
}

export const describeTarget = (t: AvoidanceTarget): string =>
  t.kind === 'miss' ? `miss ≥ ${t.missKm} km` : `Pc ≤ ${t.pc}`;
