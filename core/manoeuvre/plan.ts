/**
 * Avoidance planning for one event, as an app service calls it: trade table of Δv against lead
 * time, the chosen burn, its verification, propellant, and the manoeuvred trajectory to hand to
 * screening for the re-screen against the catalogue.
 *
 * Steps: find the encounter again on the given trajectories (TCA ± a fraction of an orbit);
 * for each lead time, the SGP4 state at the burn and the STM to TCA; per direction, a linear
 * first guess verified and refined by re-propagation (solveAlong.ts); choose the proposal
 * (proposal.ts); verify it over the rest of the window (verifyProposal.ts).
 */
import { KeepclearError } from '../errors.js';
import { DECISION_AID_NOTE } from '../risk/assess.js';
import { NO_DRAG, type DragParameter } from '../propagation/numerical/ballistic.js';
import { forceModel } from '../propagation/numerical/forceModel.js';
import { orbitScale } from '../propagation/numerical/orbitScale.js';
import type { Trajectory } from '../propagation/trajectory.js';
import type { Encounter } from '../events/index.js';
import { MS_PER_DAY, MS_PER_S, type Instant } from '../time/instant.js';
import type { Vec3 } from './burn.js';
import { closestApproachNear } from './closestApproach.js';
import { defaultLeadTimesS, tradeRowsAt, burnCaseAt, type DirectionChoice, type TradeRow } from './leadTimeSweep.js';
import { newCounters, type PlanningContext, type WorkCounters } from './planningContext.js';
import { chooseProposal } from './proposal.js';
import { checkPropulsion, propellantKg, type SpacecraftPropulsion } from './propellant.js';
import { outcomeOf, type AvoidanceTarget, type PcCallback } from './target.js';
import { verifyProposal, type Verification } from './verifyProposal.js';
import type { ManoeuvredTrajectory } from './manoeuvredTrajectory.js';


/** Search window for the new closest approach: TCA ± this fraction of the primary's period. */
export const SEARCH_HALF_WINDOW_PERIODS = 0.25;
/** Largest burn considered by default (m/s): far beyond any routine avoidance burn of a small satellite. */
export const DEFAULT_MAX_DELTA_V_MS = 5;
/** The returned manoeuvred trajectory reaches at least this far past TCA by default. */
const DEFAULT_VERIFICATION_SPAN_MS = MS_PER_DAY;
/** Beyond the search window the verification tables reach this far (s), for range-rate stencils. */
const VERIFICATION_MARGIN_S = 120;
/**
 * The manoeuvred trajectory runs this far past verificationEnd: screening probes its sources up
 * to an hour beyond the window end (core/screening/engine.ts, model margin) and its grids step
 * past the end.
 */
const SCREENING_TAIL_MS = 2 * 3_600_000;

export interface PlanInput {
  /** the event as screened (or imported): ids, TCA, epochs; its TCA centres the search */
  readonly event: Encounter;
  /** the trajectories the event was screened with (SGP4 of the element sets, or an ephemeris) */
  readonly primary: Trajectory;
  readonly secondary: Trajectory;
  readonly target: AvoidanceTarget;
  /** Pc with the event's covariances and method; required for a Pc target */
  readonly pcOf?: PcCallback;
  /** the primary's mass and thruster Isp: required (no default) */
  readonly spacecraft: SpacecraftPropulsion;
  /** drag of the numerical model: dragFromBstar(elements.bstar) or dragFromSpacecraft(...); default none */
  readonly drag?: DragParameter;
  /** default ['T', 'best'] */
  readonly directions?: readonly DirectionChoice[];
  /** default every quarter orbit from ¼ to 5 orbits */
  readonly leadTimesS?: readonly number[];
  /** no burn before this (e.g. now + upload time); earlier lead times are skipped */
  readonly earliestBurn?: Instant;
  /** the operator's minimum lead time (s); shorter rows are listed but never proposed */
  readonly minLeadS?: number;
  readonly maxDeltaVMs?: number;
  /** the screening window's end: the returned manoeuvred trajectory reaches 2 h beyond it; default TCA + 1 day */
  readonly verificationEnd?: Instant;
  /** the secondary's period (s), when shorter than the primary's (sets sampling steps) */
  readonly secondaryPeriodS?: number;
  /**
   * Called after each lead time of the sweep (done, total), for progress. It may throw (e.g. a
   * cancellation) to stop the plan there.
   */
  readonly onLeadTime?: (done: number, total: number) => void;
}

export interface Proposal extends TradeRow {
  readonly propellantKg: number;
}

export interface PlanResult {
  readonly caution: string;
  readonly target: AvoidanceTarget;
  /** 'planned'; 'no-burn-needed' when the event already meets the target; 'no-proposal' when no row qualifies */
  readonly status: 'planned' | 'no-burn-needed' | 'no-proposal';
  /** the encounter without a burn, found again on the trajectories */
  readonly original: { readonly tca: Instant; readonly missKm: number; readonly pc: number | null };
  readonly periodS: number;
  readonly trade: readonly TradeRow[];
  readonly proposal: Proposal | null;
  readonly verification: Verification | null;
  /** SGP4 + integrated difference from the burn to verificationEnd: hand to screening */
  readonly manoeuvredTrajectory: ManoeuvredTrajectory | null;
  readonly linearModel: string;
  readonly notes: readonly string[];
  readonly work: WorkCounters & { readonly elapsedMs: number };
}

export const LINEAR_MODEL_NOTE =
  'first guesses and the best direction from the state-transition matrix integrated along the orbit ' +
  '(two-body + J2 variational equations); every Δv is verified by re-propagation';

export function planAvoidance(input: PlanInput): PlanResult {
  const t0 = performance.now();
  const { event, target } = input;
  validateTarget(target, input.pcOf);
  checkPropulsion(input.spacecraft, event.primary);
  const model = forceModel({ drag: input.drag ?? NO_DRAG });
  const stateAtTca = new Float64Array(6);
  const failure = input.primary.stateInto(event.tca, stateAtTca, 0);
  if (failure) throw new KeepclearError('PROPAGATION_FAILED', `primary ${event.primary} has no state at TCA (${failure})`);
  const periodS = orbitScale(stateAtTca, model.mu).periodS;
  const halfWindowS = SEARCH_HALF_WINDOW_PERIODS * periodS;
  const pair = {
    primary: input.primary,
    secondary: input.secondary,
    primaryEpoch: event.primaryEpoch,
    secondaryEpoch: event.secondaryEpoch,
    minPeriodS: Math.min(periodS, input.secondaryPeriodS ?? periodS),
  };
  const counters = newCounters();
  const found = closestApproachNear(pair, event.tca, halfWindowS);
  if (!found || found.atWindowEdge)
    throw new KeepclearError(
      'NOT_FOUND',
      `no closest approach of ${event.primary} and ${event.secondary} within ±${halfWindowS.toFixed(0)} s of TCA ${new Date(event.tca).toISOString()}`,
    );
  const ctx: PlanningContext = {
    pair,
    original: found,
    target,
    pcOf: input.pcOf ?? null,
    model,
    halfWindowS,
    maxDeltaVMs: input.maxDeltaVMs ?? DEFAULT_MAX_DELTA_V_MS,
    counters,
  };
  if (ctx.pcOf) counters.pcCalls++;
  const originalPc = ctx.pcOf ? ctx.pcOf(found) : null;
  const original = { ...outcomeOf(target, found, originalPc), dvRtnMs: [0, 0, 0] as Vec3 };
  const notes: string[] = [
    `the new closest approach is searched within TCA ± ${halfWindowS.toFixed(0)} s (a quarter orbit); approaches ` +
      'of the same pair an orbit away, and with other objects, are for the re-screen of the manoeuvred trajectory',
  ];
  const base = {
    caution: DECISION_AID_NOTE,
    target,
    original: { tca: found.tca, missKm: found.missKm, pc: originalPc },
    periodS,
    linearModel: LINEAR_MODEL_NOTE,
  };
  const work = () => ({ ...counters, elapsedMs: performance.now() - t0 });
  if (original.margin >= 0) {
    notes.push('the event already meets the target without a burn');
    return { ...base, status: 'no-burn-needed', trade: [], proposal: null, verification: null, manoeuvredTrajectory: null, notes, work: work() };
  }

  let leads = [...(input.leadTimesS ?? defaultLeadTimesS(periodS))].sort((a, b) => a - b);
  const bad = leads.find((l) => !(l > 0 && Number.isFinite(l)));
  if (bad !== undefined) throw new KeepclearError('BAD_ARGUMENT', `lead times must be positive numbers of seconds, got ${bad}`);
  if (input.earliestBurn !== undefined) {
    const kept = leads.filter((l) => found.tca - l * MS_PER_S >= input.earliestBurn!);
    if (kept.length < leads.length) notes.push(`${leads.length - kept.length} lead times skipped: their burn would come before the earliest burn time`);
    leads = kept;
  }
  const directions = input.directions ?? ['T', 'best'];
  const trade = leads.flatMap((l, i) => {
    const rows = tradeRowsAt(ctx, l, directions, original);
    input.onLeadTime?.(i + 1, leads.length);
    return rows;
  });
  const chosen = chooseProposal(trade, { minLeadS: input.minLeadS, earliestBurn: input.earliestBurn });
  if (!chosen || !chosen.deltaVRtnMs) {
    notes.push('no row of the trade table meets the target within the constraints');
    return { ...base, status: 'no-proposal', trade, proposal: null, verification: null, manoeuvredTrajectory: null, notes, work: work() };
  }
  const end = Math.max(
    (input.verificationEnd ?? found.tca + DEFAULT_VERIFICATION_SPAN_MS) + SCREENING_TAIL_MS,
    found.tca + (halfWindowS + VERIFICATION_MARGIN_S) * MS_PER_S,
  ) as Instant;
  const bc = burnCaseAt(ctx, chosen.burnTime);
  const verified = verifyProposal(ctx, bc, chosen.deltaVRtnMs, end);
  const proposal: Proposal = { ...chosen, propellantKg: propellantKg(chosen.deltaVMs!, input.spacecraft, event.primary) };
  const final = verified.verification.sgp4PlusDifference;
  if (!final || outcomeOf(target, { ...found, missKm: final.missKm, atWindowEdge: final.atWindowEdge }, final.pc).margin < 0)
    notes.push('the final verification (tighter integration over the whole window) does not meet the target: do not use this proposal as it stands');
  return {
    ...base,
    status: 'planned',
    trade,
    proposal,
    verification: verified.verification,
    manoeuvredTrajectory: verified.trajectory,
    notes,
    work: work(),
  };
}

function validateTarget(target: AvoidanceTarget, pcOf: PcCallback | undefined): void {
  if (target.kind === 'miss' && !(target.missKm > 0 && Number.isFinite(target.missKm)))
    throw new KeepclearError('BAD_ARGUMENT', `target miss distance must be a positive number of km, got ${target.missKm}`);
  if (target.kind === 'pc') {
    if (!(target.pc > 0 && target.pc < 1)) throw new KeepclearError('BAD_ARGUMENT', `target Pc must lie between 0 and 1, got ${target.pc}`);
    if (!pcOf) throw new KeepclearError('BAD_ARGUMENT', 'a Pc target needs the event\'s Pc method (pcOf callback)');
  }
}
