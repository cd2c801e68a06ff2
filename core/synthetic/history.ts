import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import type { Instant } from '../time/instant.js';
import { tleExactEpoch } from './draft.js';
import { fitElementSetToState } from './fit.js';
import { withOrbitDeterminationError } from './odError.js';
import type { Rng } from './random.js';

/**
 * Older element sets consistent with the newest one, as a tracking network would have issued:
 * the newest set propagated back to each older epoch, its state disturbed by an orbit-
 * determination error (odError.ts), and refitted. Later, "covariance from element-set history"
 * propagates these to newer epochs and takes the statistics of the differences.
 */

export interface HistoryOptions {
  readonly count?: number; // default 4
  readonly minGapHours?: number; // default 12
  readonly maxGapHours?: number; // default 24
}

/** Older sets, oldest first (the newest is not included). */
export function buildHistory(newest: ElementSet, rng: Rng, opts: HistoryOptions = {}): ElementSet[] {
  const count = opts.count ?? 4;
  const minGap = opts.minGapHours ?? 12, maxGap = opts.maxGapHours ?? 24;
  const trajectory = new Sgp4Trajectory(newest);
  const out: ElementSet[] = [];
  const buf = new Float64Array(6);
  let t: number = newest.epoch;
  for (let k = 1; k <= count; k++) {
    t = tleExactEpoch(t - rng.uniform(minGap, maxGap) * 3_600_000);
    const epoch = t as Instant;
    const failure = trajectory.stateInto(epoch, buf, 0);
    if (failure) throw new KeepclearError('INTERNAL', `history of ${newest.objectId}: ${failure}`);
    const target = withOrbitDeterminationError([buf[0]!, buf[1]!, buf[2]!], [buf[3]!, buf[4]!, buf[5]!], rng);
    out.push(
      fitElementSetToState(target, epoch, {
        ...newest,
        epoch,
        elementSetNo: Math.max(1, newest.elementSetNo - k),
        revAtEpoch: Math.max(0, Math.round(newest.revAtEpoch - ((newest.epoch - epoch) / 86_400_000) * newest.meanMotionRevPerDay)),
      }),
    );
  }
  return out.reverse();
}
