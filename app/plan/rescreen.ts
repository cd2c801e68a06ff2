/**
 * Re-screen of the manoeuvred primary against the whole catalogue, from the burn to the end of
 * the screening window (DESIGN.md: "re-screen the manoeuvred trajectory against the whole
 * catalogue over the window"), with the screening engine itself: runScreening with the
 * manoeuvred trajectory as a trajectory primary (core/screening/run.ts primaryTrajectories:
 * sampled once across the burn's break, radius band and speed bound from the samples, the
 * catalogue split among worker threads).
 */
import type { ElementSet } from '../../core/elements/elementSet.js';
import { KeepclearError } from '../../core/errors.js';
import type { Encounter } from '../../core/events/index.js';
import type { Trajectory } from '../../core/propagation/trajectory.js';
import { runScreening } from '../../core/screening/run.js';
import type { FlaggedObject, ScreeningVolume } from '../../core/screening/types.js';
import type { Instant } from '../../core/time/instant.js';

export interface RescreenInput {
  /** the primary's element set (id and epoch of the data behind the trajectory) */
  readonly primarySet: ElementSet;
  /** the manoeuvred trajectory, valid from `start` to `end` + 2 h */
  readonly trajectory: Trajectory;
  readonly catalogue: readonly ElementSet[];
  readonly start: Instant;
  readonly end: Instant;
  readonly volume: ScreeningVolume;
  /** worker threads (default one per core; 0 screens in this thread) */
  readonly workers?: number;
  readonly onProgress?: (done: number, total: number) => void;
  readonly signal?: AbortSignal;
}

export interface RescreenOutcome {
  readonly encounters: Encounter[];
  readonly flagged: FlaggedObject[];
  /** catalogue objects screened (the primary left out) */
  readonly objects: number;
  /** of those, dismissed by the radius bands (the engine's apogee/perigee test) */
  readonly radiusPruned: number;
  readonly wallMs: number;
}

export async function rescreenTrajectory(input: RescreenInput): Promise<RescreenOutcome> {
  const t0 = performance.now();
  const id = input.primarySet.objectId;
  if (input.trajectory.objectId !== id)
    throw new KeepclearError('INTERNAL', `re-screen: trajectory of ${input.trajectory.objectId} given for primary ${id}`);
  const outcome = await runScreening(
    input.catalogue,
    { start: input.start, end: input.end, volume: input.volume, primaries: [id] },
    {
      primaryTrajectories: [{ trajectory: input.trajectory, epoch: input.primarySet.epoch }],
      ...(input.workers !== undefined ? { workers: input.workers } : {}),
      ...(input.onProgress ? { onProgress: input.onProgress } : {}),
      ...(input.signal ? { signal: input.signal } : {}),
    },
  );
  if (outcome.cancelled) throw new KeepclearError('CANCELLED', 'plan cancelled during the re-screen of the manoeuvred trajectory');
  return {
    encounters: outcome.encounters.filter((e) => e.primary === id),
    flagged: outcome.flagged,
    objects: input.catalogue.filter((s) => s.objectId !== id).length,
    radiusPruned: outcome.stats.radiusPruned ?? 0,
    wallMs: performance.now() - t0,
  };
}
