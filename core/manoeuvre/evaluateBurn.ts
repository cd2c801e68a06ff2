/**
 * One burn judged two ways: by the linear map (cheap, for guesses) and by re-propagation
 * (the answer): the manoeuvred trajectory (SGP4 + integrated difference) near TCA, the new
 * closest approach found again on it, and its Pc.
 */
import { KeepclearError } from '../errors.js';
import { SEARCH_STEP_CONTROL } from '../propagation/numerical/integrateOnGrid.js';
import type { Encounter } from '../events/index.js';
import type { Instant } from '../time/instant.js';
import { integrateBurnDifference } from './burnDifference.js';
import type { Vec3 } from './burn.js';
import { closestApproachNear } from './closestApproach.js';
import { ManoeuvredTrajectory } from './manoeuvredTrajectory.js';
import type { BurnCase, PlanningContext } from './planningContext.js';
import { predictedEncounter } from './predictedEncounter.js';
import { outcomeOf, type Outcome } from './target.js';

/**
 * The range rate is differenced over up to ±16 s (refine.ts), and the window edges are probed:
 * the table reaches this far beyond the window on both sides (s).
 */
const TABLE_MARGIN_S = 60;

export interface BurnEvaluation extends Outcome {
  readonly dvRtnMs: Vec3;
}

function pcOf(ctx: PlanningContext, encounter: Encounter | null): number | null {
  if (!ctx.pcOf || !encounter) return null;
  ctx.counters.pcCalls++;
  return ctx.pcOf(encounter);
}

export function predictBurn(ctx: PlanningContext, bc: BurnCase, dvRtnMs: Vec3): BurnEvaluation {
  ctx.counters.predictions++;
  const e = predictedEncounter(ctx.original, bc.sensitivity, dvRtnMs);
  return { ...outcomeOf(ctx.target, e, pcOf(ctx, e)), dvRtnMs };
}

/** The manoeuvred trajectory tabulated over the search window around the old TCA. */
export function manoeuvredNearTca(ctx: PlanningContext, bc: BurnCase, dvRtnMs: Vec3): ManoeuvredTrajectory {
  const tca = ctx.original.tca;
  const tableStart = Math.max(bc.burnTime, tca - (ctx.halfWindowS + TABLE_MARGIN_S) * 1000) as Instant;
  const tableEnd = (tca + (ctx.halfWindowS + TABLE_MARGIN_S) * 1000) as Instant;
  if (!(bc.burnTime < tableEnd))
    throw new KeepclearError('BAD_ARGUMENT', `burn at ${bc.burnTime} is after the search window around TCA ${tca} (UTC ms)`);
  const burn = { time: bc.burnTime, deltaVRtnMs: dvRtnMs };
  const d = integrateBurnDifference({
    stateAtBurn: bc.stateAtBurn,
    burn,
    tableStart,
    tableEnd,
    model: ctx.model,
    control: SEARCH_STEP_CONTROL,
  });
  ctx.counters.integrations++;
  return new ManoeuvredTrajectory(ctx.pair.primary, burn, d.difference);
}

export function verifyBurn(ctx: PlanningContext, bc: BurnCase, dvRtnMs: Vec3): BurnEvaluation {
  const primary = manoeuvredNearTca(ctx, bc, dvRtnMs);
  const e = closestApproachNear({ ...ctx.pair, primary }, ctx.original.tca, ctx.halfWindowS);
  return { ...outcomeOf(ctx.target, e, pcOf(ctx, e)), dvRtnMs };
}
