/**
 * Manoeuvre plans, kept with their event. The headline numbers of the chosen burn are columns;
 * the whole plan is its JSON document (app/plan/json.ts writes it), stored as given.
 */
import { KeepclearError } from '../core/errors.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import type { KeepclearDb } from './connection.js';

export type PlanStatus = 'planned' | 'no-burn-needed' | 'no-proposal';

export type PlanTargetRecord = { readonly kind: 'miss'; readonly missKm: number } | { readonly kind: 'pc'; readonly pc: number };

export interface NewPlan {
  readonly eventId: string;
  readonly createdAt: Instant;
  readonly target: PlanTargetRecord;
  readonly status: PlanStatus;
  /** the chosen burn; required exactly when status is 'planned' */
  readonly burn: {
    readonly time: Instant;
    readonly leadTimeS: number;
    readonly direction: string;
    readonly deltaVMs: number;
    readonly achievedMissKm: number | null;
    readonly achievedPc: number | null;
    readonly propellantKg: number;
  } | null;
  readonly massKg: number;
  readonly ispS: number;
  readonly newApproaches: number;
  readonly document: Record<string, unknown>;
}

/** What lists of events show of a plan. */
export interface PlanSummary {
  readonly id: number;
  readonly eventId: string;
  readonly createdAt: Instant;
  readonly target: PlanTargetRecord;
  readonly status: PlanStatus;
  readonly burnTime: Instant | null;
  readonly leadTimeS: number | null;
  readonly direction: string | null;
  readonly deltaVMs: number | null;
  readonly achievedMissKm: number | null;
  readonly achievedPc: number | null;
  readonly propellantKg: number | null;
  readonly newApproaches: number;
}

export interface StoredPlan extends PlanSummary {
  readonly massKg: number;
  readonly ispS: number;
  readonly document: Record<string, unknown>;
}

interface PlanRow {
  id: number;
  event_id: string;
  created_at: number;
  target_json: string;
  status: PlanStatus;
  burn_time_ms: number | null;
  lead_time_s: number | null;
  direction: string | null;
  delta_v_m_s: number | null;
  achieved_miss_km: number | null;
  achieved_pc: number | null;
  propellant_kg: number | null;
  mass_kg: number;
  isp_s: number;
  new_approaches: number;
  document_json?: string;
}

const SUMMARY_COLUMNS =
  'id, event_id, created_at, target_json, status, burn_time_ms, lead_time_s, direction, delta_v_m_s, ' +
  'achieved_miss_km, achieved_pc, propellant_kg, mass_kg, isp_s, new_approaches';

const summaryOf = (r: PlanRow): PlanSummary => ({
  id: r.id,
  eventId: r.event_id,
  createdAt: instantFromMs(r.created_at),
  target: JSON.parse(r.target_json) as PlanTargetRecord,
  status: r.status,
  burnTime: r.burn_time_ms === null ? null : instantFromMs(r.burn_time_ms),
  leadTimeS: r.lead_time_s,
  direction: r.direction,
  deltaVMs: r.delta_v_m_s,
  achievedMissKm: r.achieved_miss_km,
  achievedPc: r.achieved_pc,
  propellantKg: r.propellant_kg,
  newApproaches: r.new_approaches,
});

/** Stores one plan (one statement: all or nothing) and returns its id. */
export function storePlan(db: KeepclearDb, p: NewPlan): number {
  if ((p.status === 'planned') !== (p.burn !== null))
    throw new KeepclearError('INTERNAL', `plan of ${p.eventId}: status ${p.status} ${p.burn ? 'with' : 'without'} a burn`);
  const b = p.burn;
  const exists = db.stmt('SELECT 1 FROM events WHERE id = ?').pluck().get(p.eventId);
  if (!exists) throw new KeepclearError('NOT_FOUND', `no event "${p.eventId}"; list events with keepclear events`);
  const info = db
    .stmt(
      `INSERT INTO plans (event_id, created_at, target_json, status, burn_time_ms, lead_time_s, direction, delta_v_m_s,
         achieved_miss_km, achieved_pc, propellant_kg, mass_kg, isp_s, new_approaches, document_json)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    )
    .run(
      p.eventId, p.createdAt, JSON.stringify(p.target), p.status,
      b?.time ?? null, b?.leadTimeS ?? null, b?.direction ?? null, b?.deltaVMs ?? null,
      b?.achievedMissKm ?? null, b?.achievedPc ?? null, b?.propellantKg ?? null,
      p.massKg, p.ispS, p.newApproaches, JSON.stringify(p.document),
    );
  return Number(info.lastInsertRowid);
}

export function getPlan(db: KeepclearDb, id: number): StoredPlan | null {
  const r = db.stmt('SELECT * FROM plans WHERE id = ?').get(id) as PlanRow | undefined;
  return r ? { ...summaryOf(r), massKg: r.mass_kg, ispS: r.isp_s, document: JSON.parse(r.document_json!) as Record<string, unknown> } : null;
}

/** The newest plan of an event (the one reports and lists show), or null. */
export function latestPlanOfEvent(db: KeepclearDb, eventId: string): StoredPlan | null {
  const id = db.stmt('SELECT id FROM plans WHERE event_id = ? ORDER BY created_at DESC, id DESC LIMIT 1').pluck().get(eventId) as
    | number
    | undefined;
  return id === undefined ? null : getPlan(db, id);
}

/** Every plan of an event, newest first (summaries). */
export function plansOfEvent(db: KeepclearDb, eventId: string): PlanSummary[] {
  const rows = db.stmt(`SELECT ${SUMMARY_COLUMNS} FROM plans WHERE event_id = ? ORDER BY created_at DESC, id DESC`).all(eventId) as PlanRow[];
  return rows.map(summaryOf);
}

/** The newest plan of each of the given events that has one (for event lists). */
export function latestPlanSummaries(db: KeepclearDb, eventIds: readonly string[]): Map<string, PlanSummary> {
  const out = new Map<string, PlanSummary>();
  if (eventIds.length === 0) return out;
  // Plans are few (one per planned event): read them all rather than bind thousands of ids.
  const rows = db.stmt(`SELECT ${SUMMARY_COLUMNS} FROM plans ORDER BY created_at, id`).all() as PlanRow[];
  const wanted = new Set(eventIds);
  for (const r of rows) if (wanted.has(r.event_id)) out.set(r.event_id, summaryOf(r));
  return out;
}
