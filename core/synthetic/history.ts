import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import type { Instant } from '../time/instant.js';
import { tleExactEpoch } from './draft.js';
import { fitElementSetToState } from './fit.js';
import type { Rng } from './random.js';

/**
 * Older element sets consistent with the newest one, as a tracking network would have issued:
 * the newest set propagated back to each older epoch, its state disturbed by an orbit-
 * determination error, and refitted. Later, "covariance from element-set history" propagates
 * these to newer epochs and takes the statistics of the differences.
 *
 * Error sizes (1σ; rough figures from memory for public LEO element sets at epoch): radial
 * 30 m, along-track 150 m, cross-track 40 m. Velocity errors are drawn mostly drift-free in the
 * Clohessy–Wiltshire sense (rotating-frame along-track rate −2n·δR), plus 1.5 mm/s along-track so the
 * along-track difference grows by a few hundred metres per day, as it does between real sets.
 */
export const OD_SIGMA_M = { radial: 30, alongTrack: 150, crossTrack: 40 } as const;
const DRIFT_SIGMA_KMS = 1.5e-6;

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
    const r = [buf[0]!, buf[1]!, buf[2]!], v = [buf[3]!, buf[4]!, buf[5]!];
    const rn = Math.hypot(...r);
    const R = r.map((x) => x / rn);
    const h = [r[1]! * v[2]! - r[2]! * v[1]!, r[2]! * v[0]! - r[0]! * v[2]!, r[0]! * v[1]! - r[1]! * v[0]!];
    const hn = Math.hypot(...h);
    const N = h.map((x) => x / hn);
    const T = [N[1]! * R[2]! - N[2]! * R[1]!, N[2]! * R[0]! - N[0]! * R[2]!, N[0]! * R[1]! - N[1]! * R[0]!];
    const n = hn / (rn * rn); // angular rate, rad/s
    const dR = rng.normal(0, OD_SIGMA_M.radial / 1000);
    const dT = rng.normal(0, OD_SIGMA_M.alongTrack / 1000);
    const dN = rng.normal(0, OD_SIGMA_M.crossTrack / 1000);
    // Relative velocity in the rotating frame (CW: drift-free when ẏ = −2n·x), then to inertial
    // by adding ω × δr with ω = n·N: +n·δR along T and −n·δT along R.
    const xDot = rng.normal(0, (n * OD_SIGMA_M.crossTrack) / 1000);
    const yDot = -2 * n * dR + rng.normal(0, DRIFT_SIGMA_KMS);
    const zDot = rng.normal(0, (n * OD_SIGMA_M.crossTrack) / 1000);
    const dvR = xDot - n * dT, dvT = yDot + n * dR, dvN = zDot;
    const target = {
      r: [0, 1, 2].map((j) => r[j]! + dR * R[j]! + dT * T[j]! + dN * N[j]!),
      v: [0, 1, 2].map((j) => v[j]! + dvR * R[j]! + dvT * T[j]! + dvN * N[j]!),
    };
    out.push(
      fitElementSetToState(target, epoch, {
        ...newest,
        epoch,
        elementSetNo: Math.max(1, newest.elementSetNo - k),
        revAtEpoch: Math.max(0, Math.round(newest.revAtEpoch - ((newest.epoch - epoch) / 86_400_000) * newest.meanMotion)),
      }),
    );
  }
  return out.reverse();
}
