/**
 * Planning an avoidance burn for a stored event, end to end (used by the CLI's `plan` and by
 * `serve`): gather the inputs once (app/plan/inputs.ts), sweep lead times and choose the burn
 * (core/manoeuvre planAvoidance), verify it two ways, re-screen the manoeuvred primary against
 * the whole catalogue for the rest of the window (app/plan/rescreen.ts), mark which approaches
 * are new, and store the plan with its event.
 *
 * A decision aid: the operator's own flight dynamics, the screening provider's screening of the
 * planned trajectory and local rules decide (PLAN_CAUTION).
 */
import { KeepclearError } from '../../core/errors.js';
import type { ConjunctionEvent } from '../../core/events/index.js';
import {
  dragFromBstar,
  planAvoidance,
  type AvoidanceTarget,
  type DirectionChoice,
  type PlanResult,
} from '../../core/manoeuvre/index.js';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';
import type { ScreeningVolume } from '../../core/screening/types.js';
import { toIso, type Instant } from '../../core/time/instant.js';
import { eventsOfRun, getEvent, latestElementSets, storePlan, type KeepclearDb } from '../../db/index.js';
import { RiskContext } from '../risk.js';
import { classifyApproaches, type RescreenApproach } from './approaches.js';
import { planInputs } from './inputs.js';
import { planDocument, type PlanDocument } from './json.js';
import { rescreenTrajectory } from './rescreen.js';

/** The caution of every plan: the decision-aid note and who decides. */
export const PLAN_CAUTION =
  `${DECISION_AID_NOTE} A manoeuvre plan is a proposal to check: the operator's own flight dynamics, ` +
  'the screening provider\'s screening of the planned trajectory and local rules decide.';

export type PlanPhase = 'trade' | 'rescreen';

export interface PlanProgress {
  readonly phase: PlanPhase;
  readonly done: number;
  readonly total: number;
}

export interface PlanRequest {
  readonly target: AvoidanceTarget;
  readonly onProgress?: (p: PlanProgress) => void;
  readonly signal?: AbortSignal;
  /** store the plan with its event (default true) */
  readonly store?: boolean;
  /** the plan's time stamp; default now */
  readonly now?: Instant;
  /** default: every quarter orbit from ¼ to 5 orbits */
  readonly leadTimesS?: readonly number[];
  /** default ['T', 'best'] */
  readonly directions?: readonly DirectionChoice[];
  /** no burn before this instant (e.g. now + upload time) */
  readonly earliestBurn?: Instant;
}

export interface RescreenSummary {
  readonly start: Instant;
  readonly end: Instant;
  readonly volume: ScreeningVolume;
  /** catalogue objects screened (the primary left out) */
  readonly objects: number;
  readonly radiusPruned: number;
  readonly approaches: readonly RescreenApproach[];
  readonly flagged: readonly { readonly id: string; readonly reason: string }[];
  /** whether "new" could be judged (a screening run lies behind the event) */
  readonly comparedWithRun: string | null;
  readonly wallMs: number;
}

export interface EventPlan {
  readonly event: ConjunctionEvent;
  readonly target: AvoidanceTarget;
  readonly createdAt: Instant;
  readonly spacecraft: { readonly massKg: number; readonly ispS: number };
  readonly objectName: string | null;
  /** how Pc is computed for moved encounters */
  readonly pcMethod: string;
  /** the core planner's result: trade, proposal, verification, manoeuvred trajectory */
  readonly core: PlanResult;
  readonly windowEnd: Instant;
  readonly rescreen: RescreenSummary | null;
  /** approaches of the manoeuvred primary that the run did not have */
  readonly newApproaches: readonly RescreenApproach[];
  readonly notes: readonly string[];
  readonly caution: string;
  /** id of the stored plan; null when not stored */
  readonly planId: number | null;
  readonly timings: { readonly inputsMs: number; readonly tradeMs: number; readonly rescreenMs: number; readonly totalMs: number };
  /** the plan as JSON (DESIGN.md "JSON of plan" plus more): what --json writes and the database keeps */
  readonly document: PlanDocument;
}

const cancelled = (signal: AbortSignal | undefined, where: string): void => {
  if (signal?.aborted) throw new KeepclearError('CANCELLED', `plan cancelled ${where}`);
};

export async function planForEvent(db: KeepclearDb, eventId: string, req: PlanRequest): Promise<EventPlan> {
  const t0 = performance.now();
  const createdAt = req.now ?? (Date.now() as Instant);
  const event = getEvent(db, eventId);
  if (!event) throw new KeepclearError('NOT_FOUND', `no event "${eventId}"; list events with keepclear events`);
  const inputs = planInputs(db, event);
  const notes = [...inputs.notes];
  const primary = inputs.primaryTrajectory;
  const secondary = inputs.secondaryTrajectory;
  const tInputs = performance.now();
  cancelled(req.signal, 'before the trade');

  const core = planAvoidance({
    event,
    primary,
    secondary,
    target: req.target,
    pcOf: inputs.pcOf,
    spacecraft: inputs.spacecraft,
    drag: dragFromBstar(inputs.primarySet.bstar),
    verificationEnd: inputs.windowEnd,
    secondaryPeriodS: 86_400 / inputs.secondarySet.meanMotionRevPerDay,
    ...(req.leadTimesS ? { leadTimesS: req.leadTimesS } : {}),
    ...(req.directions ? { directions: req.directions } : {}),
    ...(req.earliestBurn !== undefined ? { earliestBurn: req.earliestBurn } : {}),
    onLeadTime: (done, total) => {
      req.onProgress?.({ phase: 'trade', done, total });
      cancelled(req.signal, `after ${done} of ${total} lead times`);
    },
  });
  notes.push(...core.notes);
  const tTrade = performance.now();

  let rescreen: RescreenSummary | null = null;
  const traj = core.manoeuvredTrajectory;
  if (core.status === 'planned' && core.proposal && traj) {
    const burnTime = core.proposal.burnTime;
    if (burnTime < createdAt) notes.push(`the burn time ${toIso(burnTime)} is already past (plan made ${toIso(createdAt)})`);
    const catalogue = latestElementSets(db);
    const out = await rescreenTrajectory({
      primarySet: inputs.primarySet,
      trajectory: traj,
      catalogue,
      start: burnTime,
      end: inputs.windowEnd,
      volume: inputs.volume,
      ...(req.signal ? { signal: req.signal } : {}),
      onProgress: (done, total) => req.onProgress?.({ phase: 'rescreen', done, total }),
    });
    const periods = new Map(catalogue.map((c) => [c.objectId, 1440 / c.meanMotionRevPerDay]));
    periods.set(event.primary, 1440 / inputs.primarySet.meanMotionRevPerDay);
    const compareRun = inputs.run && inputs.run.kind !== 'cdm' ? inputs.run : null;
    const risk = new RiskContext(db);
    const approaches = classifyApproaches(
      out.encounters,
      event.primary,
      compareRun ? eventsOfRun(db, compareRun.id) : null,
      (id) => periods.get(id) ?? 1440,
      (e) => {
        const r = risk.assess(e);
        return { pc: r.pc, tier: r.tier };
      },
    );
    if (!compareRun) notes.push('no screening run to compare with: every approach of the re-screen is listed as new');
    notes.push(
      `re-screened against the newest element set of each of ${out.objects} catalogue objects from the burn to the window end ` +
        `(${toIso(burnTime)} … ${toIso(inputs.windowEnd)})`,
    );
    rescreen = {
      start: burnTime,
      end: inputs.windowEnd,
      volume: inputs.volume,
      objects: out.objects,
      radiusPruned: out.radiusPruned,
      approaches,
      flagged: out.flagged,
      comparedWithRun: compareRun?.id ?? null,
      wallMs: out.wallMs,
    };
  }
  const tRescreen = performance.now();
  const newApproaches = rescreen ? rescreen.approaches.filter((a) => a.isNew) : [];
  const base = {
    event,
    target: req.target,
    createdAt,
    spacecraft: inputs.spacecraft,
    objectName: inputs.primarySet.name ?? null,
    pcMethod: inputs.pcMethod,
    core,
    windowEnd: inputs.windowEnd,
    rescreen,
    newApproaches,
    notes,
    caution: PLAN_CAUTION,
    timings: { inputsMs: tInputs - t0, tradeMs: tTrade - tInputs, rescreenMs: tRescreen - tTrade, totalMs: 0 },
  };
  const document = planDocument({ ...base, planId: null });
  let planId: number | null = null;
  if (req.store !== false) {
    const p = core.proposal;
    const v = core.verification?.sgp4PlusDifference ?? null;
    planId = storePlan(db, {
      eventId: event.id,
      createdAt,
      target: req.target,
      status: core.status,
      burn:
        core.status === 'planned' && p && p.deltaVMs !== null
          ? {
              time: p.burnTime,
              leadTimeS: p.leadTimeS,
              direction: p.direction,
              deltaVMs: p.deltaVMs,
              achievedMissKm: v?.missKm ?? p.achievedMissKm,
              achievedPc: v ? v.pc : p.achievedPc,
              propellantKg: p.propellantKg,
            }
          : null,
      massKg: inputs.spacecraft.massKg,
      ispS: inputs.spacecraft.ispS,
      newApproaches: newApproaches.length,
      document: { ...document },
    });
  }
  const totalMs = performance.now() - t0;
  const timings = { ...base.timings, totalMs };
  return { ...base, planId, timings, document: { ...document, planId, timingsMs: { ...timings } } };
}
