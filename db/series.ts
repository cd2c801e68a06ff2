/**
 * Series storage (schema v4): which series each event belongs to, each series' state, and the
 * run facts linking needs (when a run's data was created, what a screening run covered).
 * The linking itself is core/events/seriesLink.ts; the service that calls it is app/series.ts.
 */
import { pairKeyOf, type ScreeningCoverage, type SeriesMember, type SeriesSourceKind, type SeriesState } from '../core/events/index.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import type { ScreeningVolume } from '../core/screening/types.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import type { KeepclearDb } from './connection.js';
import { eventFromRow, type EventRow } from './events.js';

/** Runs whose events are sightings of a conjunction. Plan runs are hypothetical: never linked. */
export const LINKED_RUN_KINDS = ['screening', 'merge', 'cdm'] as const;
/** A cancelled run's events were found all the same; only a done run tells what it did NOT find. */
const LINKED_STATUSES = "('done', 'cancelled')";
const LINKED_KINDS = "('screening', 'merge', 'cdm')";

export interface StoredSeries {
  readonly id: string;
  readonly primary: string;
  readonly secondary: string;
  readonly founderEventId: string;
  readonly state: SeriesState;
  /** TCA of the newest sighting */
  readonly tca: Instant;
  readonly sightings: number;
  readonly lastEventId: string;
  readonly lastDataAt: Instant;
  readonly missedByRun: string | null;
  /** the newest data time the state was judged at */
  readonly asOf: Instant;
}

interface SeriesRow {
  id: string;
  primary_id: string;
  secondary_id: string;
  founder_event_id: string;
  state: SeriesState;
  tca_ms: number;
  sightings: number;
  last_event_id: string;
  last_data_at: number;
  missed_by_run: string | null;
  as_of: number;
}

const seriesFromRow = (r: SeriesRow): StoredSeries => ({
  id: r.id,
  primary: r.primary_id,
  secondary: r.secondary_id,
  founderEventId: r.founder_event_id,
  state: r.state,
  tca: instantFromMs(r.tca_ms),
  sightings: r.sightings,
  lastEventId: r.last_event_id,
  lastDataAt: instantFromMs(r.last_data_at),
  missedByRun: r.missed_by_run,
  asOf: instantFromMs(r.as_of),
});

type SightingRow = EventRow & { run_kind: string; run_data_at: number };

const memberOf = (r: SightingRow): SeriesMember => ({
  event: eventFromRow(r),
  source: {
    id: r.run_id,
    // a merge of shards is a screening run as far as series go
    kind: (r.run_kind === 'cdm' ? 'cdm' : 'screening') satisfies SeriesSourceKind,
    createdAt: instantFromMs(r.run_data_at),
  },
});

const SIGHTING_SELECT = `SELECT e.*, r.kind AS run_kind, COALESCE(r.data_at, r.created_at) AS run_data_at
   FROM events e JOIN runs r ON r.id = e.run_id`;

/**
 * The columns of a sighting read for linking: all an event has but its extra JSON, which linking
 * never looks at. The risk detail stays: the series tolerance takes σ along the relative
 * velocity from it (core/events/seriesTolerance.ts).
 */
const LINK_COLUMNS = `e.id, e.run_id, e.seq, e.primary_id, e.secondary_id, e.tca_ms, e.miss_km, e.relative_speed_km_s,
   e.rtn_r_km, e.rtn_t_km, e.rtn_n_km, e.approach_angle_deg, e.entry_ms, e.exit_ms,
   e.p_x_km, e.p_y_km, e.p_z_km, e.p_vx_km_s, e.p_vy_km_s, e.p_vz_km_s,
   e.s_x_km, e.s_y_km, e.s_z_km, e.s_vx_km_s, e.s_vy_km_s, e.s_vz_km_s,
   e.primary_epoch_ms, e.secondary_epoch_ms,
   e.pc, e.pc_method, e.covariance_source, e.hard_body_radius_m, e.tier, e.warnings_json,
   e.risk_detail_json, '{}' AS extra_json, e.series_id,
   r.kind AS run_kind, COALESCE(r.data_at, r.created_at) AS run_data_at`;

/** The stored sightings of one unordered pair (either order), in any order; for linking (LINK_COLUMNS: no extra JSON). */
export function sightingsOfPair(db: KeepclearDb, a: string, b: string): SeriesMember[] {
  const rows = db
    .stmt(
      `SELECT ${LINK_COLUMNS} FROM events e JOIN runs r ON r.id = e.run_id
        WHERE ((e.primary_id = @a AND e.secondary_id = @b) OR (e.primary_id = @b AND e.secondary_id = @a))
          AND r.kind IN ${LINKED_KINDS} AND r.status IN ${LINKED_STATUSES}`,
    )
    .all({ a, b }) as SightingRow[];
  return rows.map(memberOf);
}

/** The sightings of one run (nothing when the run is of a kind or status that is not linked). */
export function sightingsOfRun(db: KeepclearDb, runId: string): SeriesMember[] {
  const rows = db
    .stmt(`${SIGHTING_SELECT} WHERE e.run_id = ? AND r.kind IN ${LINKED_KINDS} AND r.status IN ${LINKED_STATUSES}`)
    .all(runId) as SightingRow[];
  return rows.map(memberOf);
}

/**
 * The stored sightings of every pair a run has events of (either order; nothing when the run is
 * of a kind or status that is not linked), by pairKeyOf: what sightingsOfPair gives for each of
 * those pairs, read in one statement instead of one per pair (an all-vs-all run has ~10⁵ pairs).
 * For linking: the events carry no extra JSON (LINK_COLUMNS). `otherRunsOnly`: leave out the
 * run's own events (a caller that holds them adds them itself: app/series.ts linkRun).
 */
export function sightingsOfRunPairs(db: KeepclearDb, runId: string, opts: { readonly otherRunsOnly?: boolean } = {}): Map<string, SeriesMember[]> {
  const others = opts.otherRunsOnly === true;
  const part = (a: string, b: string) =>
    `SELECT ${LINK_COLUMNS}
       FROM p JOIN events e ON e.primary_id = p.${a} AND e.secondary_id = p.${b} JOIN runs r ON r.id = e.run_id
      WHERE r.kind IN ${LINKED_KINDS} AND r.status IN ${LINKED_STATUSES}${others ? ' AND e.run_id <> @run' : ''}`;
  const rows = db
    .stmt(
      `WITH p AS (SELECT DISTINCT x.primary_id AS a, x.secondary_id AS b FROM events x JOIN runs xr ON xr.id = x.run_id
                   WHERE x.run_id = @run AND xr.kind IN ${LINKED_KINDS} AND xr.status IN ${LINKED_STATUSES})
       ${part('a', 'b')} UNION ALL ${part('b', 'a')} AND p.a <> p.b`,
    )
    .iterate({ run: runId }) as IterableIterator<SightingRow>;
  const out = new Map<string, SeriesMember[]>();
  const seen = new Set<string>();
  // Row by row: 10⁵ rows of ~40 columns never exist at once beside the members made of them.
  for (const r of rows) {
    // a pair stored in both orders by this run is reached from both: keep each event once
    if (seen.has(r.id)) continue;
    seen.add(r.id);
    const key = pairKeyOf(r.primary_id, r.secondary_id);
    let list = out.get(key);
    if (!list) out.set(key, (list = []));
    list.push(memberOf(r));
  }
  return out;
}

/** Pairs (as stored) that hold events not yet linked: events stored before schema v4, or an interrupted link. */
export function unlinkedPairs(db: KeepclearDb): [string, string][] {
  const rows = db
    .stmt(
      `SELECT DISTINCT e.primary_id AS p, e.secondary_id AS s FROM events e JOIN runs r ON r.id = e.run_id
        WHERE e.series_id IS NULL AND r.kind IN ${LINKED_KINDS} AND r.status IN ${LINKED_STATUSES}`,
    )
    .all() as { p: string; s: string }[];
  return rows.map((r) => [r.p, r.s]);
}

/** Writes series ids of events (the linker's `reassigned`). */
export function setEventSeries(db: KeepclearDb, assignments: ReadonlyMap<string, string>): void {
  const set = db.stmt('UPDATE events SET series_id = ? WHERE id = ?');
  for (const [eventId, seriesId] of assignments) set.run(seriesId, eventId);
}

/** Inserts or replaces series rows. */
export function putSeries(db: KeepclearDb, rows: readonly StoredSeries[], now: number = Date.now()): void {
  const put = db.stmt(
    `INSERT INTO series (id, primary_id, secondary_id, founder_event_id, state, tca_ms, sightings, last_event_id,
       last_data_at, missed_by_run, as_of, updated_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
     ON CONFLICT (id) DO UPDATE SET primary_id = excluded.primary_id, secondary_id = excluded.secondary_id,
       founder_event_id = excluded.founder_event_id, state = excluded.state, tca_ms = excluded.tca_ms,
       sightings = excluded.sightings, last_event_id = excluded.last_event_id, last_data_at = excluded.last_data_at,
       missed_by_run = excluded.missed_by_run, as_of = excluded.as_of, updated_at = excluded.updated_at`,
  );
  for (const s of rows) {
    put.run(s.id, s.primary, s.secondary, s.founderEventId, s.state, s.tca, s.sightings, s.lastEventId,
      s.lastDataAt, s.missedByRun, s.asOf, now);
  }
}

/** Removes series that no longer exist (re-founded or merged into another when a pair was relinked). */
export function deleteSeries(db: KeepclearDb, ids: readonly string[]): void {
  const del = db.stmt('DELETE FROM series WHERE id = ?');
  for (const id of ids) del.run(id);
}

export function getSeries(db: KeepclearDb, id: string): StoredSeries | null {
  const row = db.stmt('SELECT * FROM series WHERE id = ?').get(id) as SeriesRow | undefined;
  return row ? seriesFromRow(row) : null;
}

export interface SeriesFilter {
  readonly states?: readonly SeriesState[];
  readonly objectId?: string;
}

/** Series by TCA of their newest sighting, optionally of some states or of one object. */
export function listSeries(db: KeepclearDb, filter: SeriesFilter = {}): StoredSeries[] {
  const rows = db
    .stmt(
      `SELECT * FROM series
        WHERE (@states IS NULL OR state IN (SELECT value FROM json_each(@states)))
          AND (@object IS NULL OR primary_id = @object OR secondary_id = @object)
        ORDER BY tca_ms, id`,
    )
    .all({ states: filter.states ? JSON.stringify(filter.states) : null, object: filter.objectId ?? null }) as SeriesRow[];
  return rows.map(seriesFromRow);
}

/**
 * The events of a series in the order their data was created (a message's CREATION_DATE, a
 * run's time), ties by run id then event id: the same order as core's compareByData.
 */
export function eventsOfSeries(db: KeepclearDb, seriesId: string): SeriesMember[] {
  const rows = db
    .stmt(`${SIGHTING_SELECT} WHERE e.series_id = ? ORDER BY run_data_at, e.run_id, e.id`)
    .all(seriesId) as SightingRow[];
  return rows.map(memberOf);
}

/** Series ids of some events (events without one are left out). */
export function seriesIdsOfEvents(db: KeepclearDb, eventIds: readonly string[]): Map<string, string> {
  const get = db.stmt('SELECT series_id FROM events WHERE id = ?').pluck();
  const out = new Map<string, string>();
  for (const id of eventIds) {
    const s = get.get(id) as string | null | undefined;
    if (typeof s === 'string') out.set(id, s);
  }
  return out;
}

/** The series id of each event of a run, by event id (events not linked are left out), in one read. */
export function seriesIdsOfRun(db: KeepclearDb, runId: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const r of db.stmt('SELECT id, series_id FROM events WHERE run_id = ? AND series_id IS NOT NULL').raw().iterate(runId) as IterableIterator<[string, string]>) {
    out.set(r[0], r[1]);
  }
  return out;
}

/**
 * The state of each of some series, by id (ids of no stored series are left out): one statement
 * for any number of ids (an all-vs-all run's events belong to ~10⁵ series).
 */
export function seriesStates(db: KeepclearDb, ids: Iterable<string>): Map<string, SeriesState> {
  const out = new Map<string, SeriesState>();
  const list = [...new Set(ids)];
  if (list.length === 0) return out;
  const rows = db.stmt('SELECT id, state FROM series WHERE id IN (SELECT value FROM json_each(?))').raw().iterate(JSON.stringify(list));
  for (const [id, state] of rows as IterableIterator<[string, SeriesState]>) out.set(id, state);
  return out;
}

/**
 * What every finished screening run covered (window, primaries, objects left out), dated by its
 * data time: enough to tell whether a run should have seen a conjunction (seriesStatus).
 */
export function screeningCoverage(db: KeepclearDb): ScreeningCoverage[] {
  const rows = db
    .stmt(
      `SELECT id, COALESCE(data_at, created_at) AS data_at, start_ms, end_ms, primaries_json, volume_json FROM runs
        WHERE kind IN ('screening', 'merge') AND status = 'done'`,
    )
    .all() as { id: string; data_at: number; start_ms: number; end_ms: number; primaries_json: string; volume_json: string }[];
  const flagged = db.stmt('SELECT object_id FROM run_flagged WHERE run_id = ?').pluck();
  return rows.map((r) => ({
    id: r.id,
    createdAt: instantFromMs(r.data_at),
    start: instantFromMs(r.start_ms),
    end: instantFromMs(r.end_ms),
    primaries: JSON.parse(r.primaries_json) as string[] | 'all',
    flagged: flagged.all(r.id) as string[],
    volume: JSON.parse(r.volume_json) as ScreeningVolume,
  }));
}

/** The newest data time of any linked run (screening runs and received messages); null when none. */
export function newestDataAt(db: KeepclearDb): Instant | null {
  const t = db
    .stmt(`SELECT MAX(COALESCE(data_at, created_at)) FROM runs WHERE kind IN ${LINKED_KINDS} AND status IN ${LINKED_STATUSES}`)
    .pluck()
    .get() as number | null;
  return t === null ? null : instantFromMs(t);
}

/** An event with its run's data time: what reports and the CLI need for one series' list. */
export type SeriesEvent = ConjunctionEvent & { readonly dataAt: Instant; readonly sourceKind: SeriesSourceKind };

export function seriesEventsOf(members: readonly SeriesMember[]): SeriesEvent[] {
  return members.map((m) => ({ ...m.event, dataAt: m.source.createdAt, sourceKind: m.source.kind }));
}
