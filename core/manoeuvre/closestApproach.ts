/**
 * The closest approach of a pair near a given time, found again on (possibly manoeuvred)
 * trajectories: every local minimum of the distance inside [centre − w, centre + w] by
 * core/screening/refine.ts findEncounters (range-rate sign changes, Brent to 1 µs), of which the
 * smallest is kept.
 *
 * Why a window of a fraction of an orbit: a burn moves TCA (an in-track burn mostly moves it,
 * by |along-track shift| / relative speed — a fraction of a second in a fast crossing, minutes
 * in a slow overtaking pass), but the next approach of the same pair is about half an orbit or
 * more away. A minimum on the window edge (distance still falling there) is flagged
 * (`atWindowEdge`): the window was too short to hold it.
 */
import { KeepclearError } from '../errors.js';
import { findEncounters, PropagationError } from '../screening/refine.js';
import type { Encounter } from '../events/index.js';
import type { Instant } from '../time/instant.js';
import type { Trajectory } from '../propagation/trajectory.js';

/** A sphere wide enough that every minimum in the window counts (km). */
const UNBOUNDED_SPHERE_KM = 1e6;
/** Range-rate sampling: at most 60 s and 1/16 of the shorter period, as screening does. */
const MAX_SAMPLE_STEP_MS = 60_000;

export interface PairSpec {
  readonly primary: Trajectory;
  readonly secondary: Trajectory;
  /** epochs of the element sets (or ephemerides) behind each trajectory, carried into the Encounter */
  readonly primaryEpoch: Instant;
  readonly secondaryEpoch: Instant;
  /** the shorter of the two periods (s): sets the sampling and differencing steps */
  readonly minPeriodS: number;
}

export function closestApproachNear(pair: PairSpec, centre: Instant, halfWindowS: number): Encounter | null {
  const start = (centre - halfWindowS * 1000) as Instant;
  const end = (centre + halfWindowS * 1000) as Instant;
  const ctx = {
    p: pair.primary,
    s: pair.secondary,
    primaryEpoch: pair.primaryEpoch,
    secondaryEpoch: pair.secondaryEpoch,
    volume: { kind: 'sphere' as const, radiusKm: UNBOUNDED_SPHERE_KM },
    start,
    end,
    minPeriodMin: pair.minPeriodS / 60,
  };
  const step = Math.min(MAX_SAMPLE_STEP_MS, (pair.minPeriodS * 1000) / 16);
  let found: Encounter[];
  try {
    found = findEncounters(ctx, start, end, step);
  } catch (e) {
    if (!(e instanceof PropagationError)) throw e;
    throw new KeepclearError(
      'PROPAGATION_FAILED',
      `${e.objectId} has no state at ${new Date(e.at).toISOString()} (${e.reason}) while looking for its closest approach near ${new Date(centre).toISOString()}`,
    );
  }
  let best: Encounter | null = null;
  for (const e of found) if (!best || e.missKm < best.missKm) best = e;
  return best;
}
