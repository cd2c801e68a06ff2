/**
 * Verification of the chosen burn over the whole rest of the window, two ways:
 * - SGP4 + integrated difference (the answer; manoeuvredTrajectory.ts says why), whose
 *   trajectory is returned for the re-screen against the catalogue;
 * - fully numerical: the integrated manoeuvred orbit itself against the secondary, beside the
 *   integrated unmanoeuvred orbit, so the reader sees how far the numerical model alone moves
 *   the encounter (the SGP4-vs-integrator difference at TCA is reported too).
 */
import type { Encounter } from '../events/index.js';
import type { Instant } from '../time/instant.js';
import { NumericalTrajectory } from '../propagation/numerical/numericalTrajectory.js';
import { integrateBurnDifference } from './burnDifference.js';
import { closestApproachNear } from './closestApproach.js';
import { ManoeuvredTrajectory } from './manoeuvredTrajectory.js';
import type { BurnCase, PlanningContext } from './planningContext.js';
import type { Vec3 } from './burn.js';

export interface VerifiedApproach {
  readonly tca: Instant;
  readonly missKm: number;
  readonly pc: number | null;
  /** secondary minus primary in the primary's RTN frame at the new TCA (km) */
  readonly rtnKm: readonly [number, number, number];
  readonly relativeSpeedKmS: number;
  readonly atWindowEdge: boolean;
}

export interface Verification {
  readonly method: string;
  readonly sgp4PlusDifference: VerifiedApproach | null;
  readonly fullyNumerical: VerifiedApproach | null;
  /** the integrated unmanoeuvred primary against the secondary: the model's own baseline */
  readonly fullyNumericalUnmanoeuvred: VerifiedApproach | null;
  /** |SGP4 − integrated| position of the unmanoeuvred primary at the old TCA (km) */
  readonly modelDifferenceAtTcaKm: number;
  /** |manoeuvred − unmanoeuvred| position at the old TCA (km): what the burn moves */
  readonly burnDisplacementAtTcaKm: number;
}

export const VERIFICATION_METHOD =
  'manoeuvred primary = SGP4 trajectory + (integrated manoeuvred − integrated unmanoeuvred), both ' +
  'integrations (two-body + J2..J4 + exponential drag, Dormand–Prince 5(4)) started from the SGP4 state at ' +
  'the burn: SGP4 and the integrator differ by far more than a small burn moves the orbit, so only their ' +
  'difference carries the burn; the fully numerical result is shown beside it';

export interface VerifiedPlan {
  readonly verification: Verification;
  readonly trajectory: ManoeuvredTrajectory;
}

export function verifyProposal(ctx: PlanningContext, bc: BurnCase, dvRtnMs: Vec3, end: Instant): VerifiedPlan {
  const burn = { time: bc.burnTime, deltaVRtnMs: dvRtnMs };
  const d = integrateBurnDifference({
    stateAtBurn: bc.stateAtBurn,
    burn,
    tableStart: bc.burnTime,
    tableEnd: end,
    model: ctx.model,
    keepAbsolute: true,
  });
  ctx.counters.integrations++;
  const trajectory = new ManoeuvredTrajectory(ctx.pair.primary, burn, d.difference);
  const id = ctx.pair.primary.objectId;
  const numerical = new NumericalTrajectory(id, d.manoeuvred!);
  const numericalBase = new NumericalTrajectory(id, d.unmanoeuvred!);
  const tca = ctx.original.tca;
  const approach = (primary: ManoeuvredTrajectory | NumericalTrajectory): VerifiedApproach | null =>
    summary(ctx, closestApproachNear({ ...ctx.pair, primary }, tca, ctx.halfWindowS));
  const a = new Float64Array(6), b = new Float64Array(6), c = new Float64Array(6);
  ctx.pair.primary.stateInto(tca, a, 0);
  numericalBase.stateInto(tca, b, 0);
  numerical.stateInto(tca, c, 0);
  return {
    trajectory,
    verification: {
      method: VERIFICATION_METHOD,
      sgp4PlusDifference: approach(trajectory),
      fullyNumerical: approach(numerical),
      fullyNumericalUnmanoeuvred: approach(numericalBase),
      modelDifferenceAtTcaKm: Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!),
      burnDisplacementAtTcaKm: Math.hypot(c[0]! - b[0]!, c[1]! - b[1]!, c[2]! - b[2]!),
    },
  };
}

function summary(ctx: PlanningContext, e: Encounter | null): VerifiedApproach | null {
  if (!e) return null;
  if (ctx.pcOf) ctx.counters.pcCalls++;
  return {
    tca: e.tca,
    missKm: e.missKm,
    pc: ctx.pcOf ? ctx.pcOf(e) : null,
    rtnKm: e.rtnKm,
    relativeSpeedKmS: e.relativeSpeedKmS,
    atWindowEdge: e.atWindowEdge === true,
  };
}
