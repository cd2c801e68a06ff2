import { KeepclearError } from '../core/errors.js';
import type { ConjunctionEvent, Encounter, RiskAssessment, RiskDetail, StateArray } from '../core/events/index.js';
import { encounterFields } from '../core/events/index.js';
import { instantFromMs } from '../core/time/instant.js';
import type { KeepclearDb } from './connection.js';

/** An encounter as handed over by screening; a risk may already be attached. */
export type NewEvent = Encounter & { readonly risk?: RiskAssessment | null };

export interface EventRow {
  id: string;
  run_id: string;
  seq: number;
  primary_id: string;
  secondary_id: string;
  tca_ms: number;
  miss_km: number;
  relative_speed_km_s: number;
  rtn_r_km: number;
  rtn_t_km: number;
  rtn_n_km: number;
  approach_angle_deg: number;
  entry_ms: number | null;
  exit_ms: number | null;
  p_x_km: number; p_y_km: number; p_z_km: number;
  p_vx_km_s: number; p_vy_km_s: number; p_vz_km_s: number;
  s_x_km: number; s_y_km: number; s_z_km: number;
  s_vx_km_s: number; s_vy_km_s: number; s_vz_km_s: number;
  primary_epoch_ms: number;
  secondary_epoch_ms: number;
  pc: number | null;
  pc_method: string | null;
  covariance_source: string | null;
  hard_body_radius_m: number | null;
  tier: string | null;
  warnings_json: string | null;
  /** RiskDetail as JSON (schema v2); NULL for events stored before, or without a plane */
  risk_detail_json: string | null;
  extra_json: string;
  /** schema v4; NULL until the linking service has seen the event */
  series_id?: string | null;
}

function riskFromRow(r: EventRow): RiskAssessment | null {
  // The schema keeps the risk columns all-NULL or all-set (pc excepted), so pc_method decides.
  if (r.pc_method === null) return null;
  return {
    pc: r.pc,
    pcMethod: r.pc_method,
    covarianceSource: r.covariance_source ?? '',
    hardBodyRadiusM: r.hard_body_radius_m ?? Number.NaN,
    tier: r.tier ?? '',
    warnings: JSON.parse(r.warnings_json ?? '[]') as string[],
    ...(r.risk_detail_json ? { detail: JSON.parse(r.risk_detail_json) as RiskDetail } : {}),
  };
}

/** A stored row as an event (exported for db/series.ts, which reads events joined with runs). */
export const eventFromRow = (r: EventRow): ConjunctionEvent => ({
  id: r.id,
  runId: r.run_id,
  primary: r.primary_id,
  secondary: r.secondary_id,
  tca: instantFromMs(r.tca_ms),
  missKm: r.miss_km,
  relativeSpeedKmS: r.relative_speed_km_s,
  rtnKm: [r.rtn_r_km, r.rtn_t_km, r.rtn_n_km],
  approachAngleDeg: r.approach_angle_deg,
  entry: r.entry_ms === null ? null : instantFromMs(r.entry_ms),
  exit: r.exit_ms === null ? null : instantFromMs(r.exit_ms),
  primaryState: [r.p_x_km, r.p_y_km, r.p_z_km, r.p_vx_km_s, r.p_vy_km_s, r.p_vz_km_s] as StateArray,
  secondaryState: [r.s_x_km, r.s_y_km, r.s_z_km, r.s_vx_km_s, r.s_vy_km_s, r.s_vz_km_s] as StateArray,
  primaryEpoch: instantFromMs(r.primary_epoch_ms),
  secondaryEpoch: instantFromMs(r.secondary_epoch_ms),
  risk: riskFromRow(r),
  // only once linked: events read back compare equal to what was stored
  ...(r.series_id ? { seriesId: r.series_id } : {}),
});

const riskParams = (risk: RiskAssessment | null | undefined): unknown[] =>
  risk
    ? [
        risk.pc,
        risk.pcMethod,
        risk.covarianceSource,
        risk.hardBodyRadiusM,
        risk.tier,
        JSON.stringify(risk.warnings),
        risk.detail ? JSON.stringify(risk.detail) : null,
      ]
    : [null, null, null, null, null, null, null];

/** Events of a run are numbered in TCA order; ties broken by the pair so the order is stable. */
function byTca(a: NewEvent, b: NewEvent): number {
  if (a.tca !== b.tca) return a.tca - b.tca;
  if (a.primary !== b.primary) return a.primary < b.primary ? -1 : 1;
  return a.secondary < b.secondary ? -1 : a.secondary > b.secondary ? 1 : 0;
}

/** Event id: the run id and the 1-based position in TCA order ("R12-3"): short, readable, stable. */
export const eventId = (runId: string, seq: number): string => `${runId}-${seq}`;

/**
 * Stores the events of one run (call inside the run's finishing transaction) and returns them
 * as stored, with their ids (and without a series id: linking gives it).
 *
 * `provisionalSeriesId`: the series id to store each event with, for the linking service to
 * confirm or change in the same transaction (app/series.ts). Linking then writes only the events
 * whose series differs — for a new run, the few that join an older series — instead of updating
 * every row it just wrote (~2.5 s for an all-vs-all run's 124,503 events).
 */
export function insertEvents(
  db: KeepclearDb,
  runId: string,
  events: readonly NewEvent[],
  provisionalSeriesId?: (eventId: string) => string,
): ConjunctionEvent[] {
  const insert = db.stmt(
    `INSERT INTO events (id, run_id, seq, primary_id, secondary_id, tca_ms, miss_km, relative_speed_km_s,
       rtn_r_km, rtn_t_km, rtn_n_km, approach_angle_deg, entry_ms, exit_ms,
       p_x_km, p_y_km, p_z_km, p_vx_km_s, p_vy_km_s, p_vz_km_s,
       s_x_km, s_y_km, s_z_km, s_vx_km_s, s_vy_km_s, s_vz_km_s,
       primary_epoch_ms, secondary_epoch_ms,
       pc, pc_method, covariance_source, hard_body_radius_m, tier, warnings_json, risk_detail_json${provisionalSeriesId ? ', series_id' : ''})
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?${provisionalSeriesId ? ', ?' : ''})`,
  );
  // (the schema-v2 form without the series column is kept for the migration tests' old databases)
  const sorted = [...events].sort(byTca);
  const stored: ConjunctionEvent[] = [];
  sorted.forEach((e, i) => {
    const seq = i + 1;
    const id = eventId(runId, seq);
    insert.run(
      id, runId, seq, e.primary, e.secondary, e.tca, e.missKm, e.relativeSpeedKmS,
      e.rtnKm[0], e.rtnKm[1], e.rtnKm[2], e.approachAngleDeg, e.entry, e.exit,
      ...e.primaryState, ...e.secondaryState,
      e.primaryEpoch, e.secondaryEpoch,
      ...riskParams(e.risk),
      ...(provisionalSeriesId ? [provisionalSeriesId(id)] : []),
    );
    // Only what the row keeps, so these equal the events read back (atWindowEdge has no column).
    stored.push(Object.assign(encounterFields(e), { id, runId, risk: e.risk ?? null }));
  });
  return stored;
}

/** The events of one run, by TCA. */
export function eventsOfRun(db: KeepclearDb, runId: string): ConjunctionEvent[] {
  // Row by row: an all-vs-all run's 10⁵ raw rows never exist at once beside the events.
  const out: ConjunctionEvent[] = [];
  for (const r of db.stmt('SELECT * FROM events WHERE run_id = ? ORDER BY tca_ms, seq').iterate(runId) as IterableIterator<EventRow>) {
    out.push(eventFromRow(r));
  }
  return out;
}

export function getEvent(db: KeepclearDb, id: string): ConjunctionEvent | null {
  const row = db.stmt('SELECT * FROM events WHERE id = ?').get(id) as EventRow | undefined;
  return row ? eventFromRow(row) : null;
}

/** Replaces the risk assessment of an event (a re-assessment, e.g. after a new CDM). */
export function updateEventRisk(db: KeepclearDb, id: string, risk: RiskAssessment): void {
  const changes = db
    .stmt(
      `UPDATE events SET pc = ?, pc_method = ?, covariance_source = ?, hard_body_radius_m = ?,
         tier = ?, warnings_json = ?, risk_detail_json = ? WHERE id = ?`,
    )
    .run(...riskParams(risk), id).changes;
  if (changes === 0) throw new KeepclearError('NOT_FOUND', `no event "${id}"; list events with keepclear events`);
}

/** Fields added to events later (trend links, manoeuvre results) before they earn a column. */
export function getEventExtra(db: KeepclearDb, id: string): Record<string, unknown> | null {
  const json = db.stmt('SELECT extra_json FROM events WHERE id = ?').pluck().get(id) as string | undefined;
  return json === undefined ? null : (JSON.parse(json) as Record<string, unknown>);
}

/** Merges keys into an event's extra JSON at the top level (a key given as null is stored as null). */
export function mergeEventExtra(db: KeepclearDb, id: string, extra: Record<string, unknown>): void {
  db.sqlite.transaction(() => {
    const old = getEventExtra(db, id);
    if (old === null) throw new KeepclearError('NOT_FOUND', `no event "${id}"; list events with keepclear events`);
    db.stmt('UPDATE events SET extra_json = ? WHERE id = ?').run(JSON.stringify({ ...old, ...extra }), id);
  })();
}
