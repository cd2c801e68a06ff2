/**
 * The plan as JSON: DESIGN.md "JSON of plan" (event, proposal{burnTime, leadTimeS, direction,
 * deltaVMs, deltaVRtnMs, achievedMissKm, achievedPc, propellantKg}, trade[], newApproaches[])
 * plus what a reader needs to trust it: the caution, the target, the encounter without a burn,
 * both verifications (saying which is which), the re-screen and notes. `plan --json` writes it,
 * the database keeps it with the event, reports and `serve` read it.
 */
import type { AvoidanceTarget, PlanResult, TradeRow, VerifiedApproach } from '../../core/manoeuvre/index.js';
import { toIso, type Instant } from '../../core/time/instant.js';
import { approachToJson, type RescreenApproach } from './approaches.js';
import type { EventPlan } from './service.js';

export interface PlanTradeJson {
  readonly leadTimeS: number;
  readonly leadTimeOrbits: number;
  readonly burnTime: string;
  readonly direction: string;
  readonly status: string;
  readonly deltaVMs: number | null;
  readonly deltaVRtnMs: readonly number[] | null;
  readonly achievedMissKm: number | null;
  readonly achievedPc: number | null;
  readonly newTca: string | null;
  readonly linearDeltaVMs: number | null;
  readonly note: string | null;
}

export interface PlanProposalJson {
  readonly burnTime: string;
  readonly leadTimeS: number;
  readonly leadTimeOrbits: number;
  readonly direction: string;
  readonly deltaVMs: number;
  readonly deltaVRtnMs: readonly [number, number, number];
  /** the verified new closest approach (SGP4 + integrated difference over the whole window) */
  readonly achievedMissKm: number | null;
  readonly achievedPc: number | null;
  readonly newTca: string | null;
  readonly propellantKg: number;
  readonly massKg: number;
  readonly ispS: number;
}

export interface PlanDocument {
  readonly caution: string;
  readonly event: string;
  readonly planId: number | null;
  readonly createdAt: string;
  readonly status: PlanResult['status'];
  readonly target: { readonly missKm: number } | { readonly pc: number };
  readonly primary: string;
  readonly secondary: string;
  readonly original: { readonly tca: string; readonly missKm: number; readonly pc: number | null };
  readonly proposal: PlanProposalJson | null;
  /** per lead time, the cheapest direction that met the target (or the first row when none did) */
  readonly trade: readonly PlanTradeJson[];
  /** every row: each lead time × each direction tried */
  readonly tradeByDirection: readonly PlanTradeJson[];
  readonly verification: Record<string, unknown> | null;
  readonly newApproaches: readonly Record<string, unknown>[];
  readonly rescreen: Record<string, unknown> | null;
  readonly pcMethod: string;
  readonly linearModel: string;
  readonly periodS: number;
  readonly notes: readonly string[];
  readonly timingsMs: Record<string, number>;
}

const iso = (t: Instant | null | undefined): string | null => (t === null || t === undefined ? null : toIso(t));

function tradeJson(r: TradeRow, periodS: number): PlanTradeJson {
  return {
    leadTimeS: r.leadTimeS,
    leadTimeOrbits: r.leadTimeS / periodS,
    burnTime: toIso(r.burnTime),
    direction: r.direction,
    status: r.status,
    deltaVMs: r.deltaVMs,
    deltaVRtnMs: r.deltaVRtnMs ? [...r.deltaVRtnMs] : null,
    achievedMissKm: r.achievedMissKm,
    achievedPc: r.achievedPc,
    newTca: iso(r.newTca),
    linearDeltaVMs: r.linearDeltaVMs,
    note: r.note ?? null,
  };
}

/** One row per lead time: the smallest Δv among the directions that met the target. */
export function cheapestPerLeadTime(rows: readonly TradeRow[]): TradeRow[] {
  const by = new Map<number, TradeRow>();
  for (const r of rows) {
    const cur = by.get(r.leadTimeS);
    const better =
      !cur ||
      (r.status === 'met' && (cur.status !== 'met' || (r.deltaVMs ?? Infinity) < (cur.deltaVMs ?? Infinity)));
    if (better) by.set(r.leadTimeS, r);
  }
  return [...by.values()].sort((a, b) => a.leadTimeS - b.leadTimeS);
}

const approach = (a: VerifiedApproach | null): Record<string, unknown> | null =>
  a && {
    tca: toIso(a.tca),
    missKm: a.missKm,
    pc: a.pc,
    rtnKm: [...a.rtnKm],
    relativeSpeedKmS: a.relativeSpeedKmS,
    atWindowEdge: a.atWindowEdge,
  };

export const targetJson = (t: AvoidanceTarget): { missKm: number } | { pc: number } =>
  t.kind === 'miss' ? { missKm: t.missKm } : { pc: t.pc };

export function planDocument(p: Omit<EventPlan, 'document'>): PlanDocument {
  const c = p.core;
  const periodS = c.periodS;
  const v = c.verification;
  const chosen = v?.sgp4PlusDifference ?? null;
  const q = c.proposal;
  const rs = p.rescreen;
  return {
    caution: p.caution,
    event: p.event.id,
    planId: p.planId,
    createdAt: toIso(p.createdAt),
    status: c.status,
    target: targetJson(p.target),
    primary: p.event.primary,
    secondary: p.event.secondary,
    original: { tca: toIso(c.original.tca), missKm: c.original.missKm, pc: c.original.pc },
    proposal:
      q && q.deltaVMs !== null && q.deltaVRtnMs
        ? {
            burnTime: toIso(q.burnTime),
            leadTimeS: q.leadTimeS,
            leadTimeOrbits: q.leadTimeS / periodS,
            direction: q.direction,
            deltaVMs: q.deltaVMs,
            deltaVRtnMs: [q.deltaVRtnMs[0], q.deltaVRtnMs[1], q.deltaVRtnMs[2]],
            achievedMissKm: chosen ? chosen.missKm : q.achievedMissKm,
            achievedPc: chosen ? chosen.pc : q.achievedPc,
            newTca: chosen ? toIso(chosen.tca) : iso(q.newTca),
            propellantKg: q.propellantKg,
            massKg: p.spacecraft.massKg,
            ispS: p.spacecraft.ispS,
          }
        : null,
    trade: cheapestPerLeadTime(c.trade).map((r) => tradeJson(r, periodS)),
    tradeByDirection: c.trade.map((r) => tradeJson(r, periodS)),
    verification: v && {
      method: v.method,
      sgp4PlusDifference: approach(v.sgp4PlusDifference),
      fullyNumerical: approach(v.fullyNumerical),
      fullyNumericalUnmanoeuvred: approach(v.fullyNumericalUnmanoeuvred),
      modelDifferenceAtTcaKm: v.modelDifferenceAtTcaKm,
      burnDisplacementAtTcaKm: v.burnDisplacementAtTcaKm,
    },
    newApproaches: p.newApproaches.map(approachToJson),
    rescreen: rs && {
      start: toIso(rs.start),
      end: toIso(rs.end),
      volume: rs.volume,
      objects: rs.objects,
      radiusPruned: rs.radiusPruned,
      comparedWithRun: rs.comparedWithRun,
      approaches: rs.approaches.map((a: RescreenApproach) => approachToJson(a)),
      flagged: rs.flagged.map((f) => ({ id: f.id, reason: f.reason })),
      wallMs: rs.wallMs,
    },
    pcMethod: p.pcMethod,
    linearModel: c.linearModel,
    periodS,
    notes: [...p.notes],
    timingsMs: { ...p.timings },
  };
}
