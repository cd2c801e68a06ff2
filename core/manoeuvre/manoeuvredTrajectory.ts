/**
 * The primary after a planned burn, as screening sees it: the SGP4 trajectory plus
 * (integrated manoeuvred − integrated unmanoeuvred), both integrations started from the SGP4
 * state at the burn (burnDifference.ts).
 *
 * Why not the integrated manoeuvred orbit itself: SGP4 and the numerical model drift apart by
 * kilometres within a day (different theory, constants and drag), far more than a small burn
 * moves the orbit (a 0.1 m/s burn: ~1–2 km after an orbit). Comparing the integrated
 * manoeuvred orbit with the SGP4 secondary would mix model difference into the miss. The
 * difference of two integrations from the same state carries the burn alone, with the model
 * error entering only at second order; adding it to SGP4 compares like with like.
 *
 * Before the burn this is exactly the SGP4 trajectory; at and after the burn, SGP4 plus the
 * tabulated difference (allocation-free: one SGP4 call and one table evaluation).
 */
import type { Instant } from '../time/instant.js';
import type { FailureReason, Trajectory } from '../propagation/trajectory.js';
import { STATE_TABLE_STRIDE, type HermiteStateTable } from '../propagation/numerical/hermiteTable.js';
import type { ImpulsiveBurn } from './burn.js';

export class ManoeuvredTrajectory implements Trajectory {
  readonly objectId: string;
  /**
   * Start: the base trajectory's (SGP4: unbounded, −∞). End: the end of the tabulated
   * difference. Between the burn and the table start (only in the planner's internal tables,
   * which cover the encounter window) the state is 'outside-ephemeris'.
   */
  readonly span: { readonly start: Instant; readonly end: Instant };
  private readonly scratch = new Float64Array(6);

  constructor(
    readonly base: Trajectory,
    readonly burn: ImpulsiveBurn,
    private readonly difference: HermiteStateTable,
  ) {
    this.objectId = base.objectId;
    this.span = { start: base.span?.start ?? (-Infinity as Instant), end: difference.endMs as Instant };
  }

  /**
   * An upper bound (km) on |manoeuvred − base| position over the whole table. Between two
   * nodes the difference f departs from the chord joining its node values by at most
   * (h²/8)·max|f''| (linear interpolation error), and the chord's length never exceeds its
   * longer end, so max|f| ≤ max over nodes |f| + (h²/8)·max|δa| (node accelerations, +10 % for
   * their variation between nodes). Screening filters built for the base trajectory stay
   * conservative for this one when their pad grows by this much.
   */
  get maxDisplacementKm(): number {
    if (this.displacementBound === undefined) {
      const d = this.difference.data;
      let r = 0, a = 0;
      for (let k = 0; k < this.difference.count; k++) {
        const o = k * STATE_TABLE_STRIDE;
        r = Math.max(r, Math.hypot(d[o]!, d[o + 1]!, d[o + 2]!));
        a = Math.max(a, Math.hypot(d[o + 6]!, d[o + 7]!, d[o + 8]!));
      }
      const h = this.difference.stepS;
      this.displacementBound = r + ((h * h) / 8) * a * 1.1;
    }
    return this.displacementBound;
  }
  private displacementBound: number | undefined;

  /** The burn changes the velocity at once: interpolation must not span it. */
  get breaks(): readonly Instant[] {
    return [this.burn.time];
  }

  stateInto(t: Instant, out: Float64Array, offset: number): FailureReason | null {
    if (t < this.burn.time) return this.base.stateInto(t, out, offset);
    if (!this.difference.stateInto(t, this.scratch, 0)) return 'outside-ephemeris';
    const failure = this.base.stateInto(t, out, offset);
    if (failure) return failure;
    const d = this.scratch;
    for (let i = 0; i < 6; i++) out[offset + i] = out[offset + i]! + d[i]!;
    return null;
  }
}
