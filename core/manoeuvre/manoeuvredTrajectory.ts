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
import type { HermiteStateTable } from '../propagation/numerical/hermiteTable.js';
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
