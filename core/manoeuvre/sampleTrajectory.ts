/**
 * States of a trajectory at a fixed step, for writers of ephemeris files (the OEM writer lives
 * on its own branch: `formatOemKvn`). The first sample is at `start` exactly — for a
 * manoeuvred trajectory, pass the burn time, so the file starts with the post-burn state and
 * no interpolation spans the burn — and the last at `end` exactly.
 */
import { KeepclearError } from '../errors.js';
import type { Trajectory } from '../propagation/trajectory.js';
import type { StateArray } from '../events/index.js';
import type { Instant } from '../time/instant.js';

export interface TemeSample {
  readonly t: Instant;
  /** TEME x y z (km) vx vy vz (km/s) */
  readonly state: StateArray;
}

export function sampleTrajectory(traj: Trajectory, start: Instant, end: Instant, stepS: number): TemeSample[] {
  if (!(stepS > 0) || !(end >= start))
    throw new KeepclearError('BAD_ARGUMENT', `sampling needs start ≤ end and a positive step (step ${stepS} s, span ${(end - start) / 1000} s)`);
  const n = Math.floor((end - start) / (stepS * 1000) + 1e-9);
  const times: number[] = Array.from({ length: n + 1 }, (_, k) => start + k * stepS * 1000);
  if (times[times.length - 1]! < end) times.push(end);
  const buf = new Float64Array(6);
  return times.map((t) => {
    const failure = traj.stateInto(t as Instant, buf, 0);
    if (failure)
      throw new KeepclearError('PROPAGATION_FAILED', `${traj.objectId}: no state at ${new Date(t).toISOString()} (${failure})`);
    return { t: t as Instant, state: [buf[0]!, buf[1]!, buf[2]!, buf[3]!, buf[4]!, buf[5]!] as const };
  });
}
