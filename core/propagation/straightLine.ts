import type { Instant } from '../time/instant.js';
import type { FailureReason, Trajectory } from './trajectory.js';

/**
 * Uniform straight-line motion r(t) = r0 + v·(t − t0): a trajectory whose encounters can be
 * computed by hand (TCA = −(Δr·Δv)/|Δv|², miss = |Δr + Δv·TCA|). For tests.
 */
export class StraightLineTrajectory implements Trajectory {
  readonly span = null;
  constructor(
    readonly objectId: string,
    readonly t0: Instant,
    readonly r0: readonly [number, number, number],
    readonly v: readonly [number, number, number],
  ) {}

  get speedKmS(): number {
    return Math.hypot(this.v[0], this.v[1], this.v[2]);
  }

  stateInto(t: Instant, out: Float64Array, off: number): FailureReason | null {
    const dt = (t - this.t0) / 1000;
    for (let c = 0; c < 3; c++) {
      out[off + c] = this.r0[c]! + this.v[c]! * dt;
      out[off + 3 + c] = this.v[c]!;
    }
    return null;
  }
}
