import { KeepclearError } from '../core/errors.js';
import type { FlaggedObject, ScreeningSettings, ScreeningVolume } from '../core/screening/types.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import { inTransaction, type KeepclearDb } from './connection.js';
import { insertEvents, type NewEvent } from './events.js';
import { currentOwner, type RunOwner } from './owner.js';
import type { RUN_KINDS } from './schemaV3.js';

/** `interrupted`: the owning process died while the run was running (found on a later open). */
export type RunStatus = 'running' | 'done' | 'cancelled' | 'failed' | 'interrupted';
/** What made a run: a screening, a received CDM, (later) a merge of shards or a manoeuvre plan. */
export type RunKind = (typeof RUN_KINDS)[number];

export interface RunRecord {
  readonly id: string;
  readonly kind: RunKind;
  readonly createdAt: Instant;
  /**
   * when the run's data was created (schema v4): a screening run's time, a received message's
   * CREATION_DATE. Series order their events by it.
   */
  readonly dataAt: Instant;
  readonly settings: ScreeningSettings;
  /**
   * screening: catalogFingerprint() of the sets screened (tells whether two runs saw the same
   * orbits); cdm: SHA-256 of the message file
   */
  readonly catalogFingerprint: string;
  readonly objectCount: number;
  readonly status: RunStatus;
  /** null while running */
  readonly finishedAt: Instant | null;
  readonly wallMs: number | null;
  readonly eventCount: number | null;
  readonly flagged: readonly FlaggedObject[];
  /** the process that created the run; null for runs stored before schema v3 */
  readonly owner: RunOwner | null;
}

export interface RunOutcome {
  readonly status: Exclude<RunStatus, 'running' | 'interrupted'>;
  readonly wallMs: number;
  readonly flagged: readonly FlaggedObject[];
  /** ids and run ids are assigned here; any the caller set are ignored */
  readonly events: readonly NewEvent[];
  /**
   * The series id each event is stored with, from its id, until linking (in the same
   * transaction) sets the real one: see insertEvents. Without it events are stored unlinked (NULL).
   */
  readonly provisionalSeriesId?: (eventId: string) => string;
}

interface RunRow {
  id: string;
  seq: number;
  kind: RunKind;
  created_at: number;
  data_at: number | null;
  start_ms: number;
  end_ms: number;
  volume_json: string;
  primaries_json: string;
  catalog_fingerprint: string;
  object_count: number;
  status: RunStatus;
  owner_pid: number | null;
  owner_host: string | null;
  finished_at: number | null;
  wall_ms: number | null;
  event_count: number | null;
  flagged_count: number | null;
}

function fromRow(db: KeepclearDb, r: RunRow): RunRecord {
  const flagged = db
    .stmt('SELECT object_id AS id, reason FROM run_flagged WHERE run_id = ? ORDER BY rowid')
    .all(r.id) as FlaggedObject[];
  return {
    id: r.id,
    kind: r.kind,
    createdAt: instantFromMs(r.created_at),
    dataAt: instantFromMs(r.data_at ?? r.created_at),
    settings: {
      start: instantFromMs(r.start_ms),
      end: instantFromMs(r.end_ms),
      volume: JSON.parse(r.volume_json) as ScreeningVolume,
      primaries: JSON.parse(r.primaries_json) as string[] | 'all',
    },
    catalogFingerprint: r.catalog_fingerprint,
    objectCount: r.object_count,
    status: r.status,
    finishedAt: r.finished_at === null ? null : instantFromMs(r.finished_at),
    wallMs: r.wall_ms,
    eventCount: r.event_count,
    flagged,
    owner: r.owner_pid === null || r.owner_host === null ? null : { pid: r.owner_pid, host: r.owner_host },
  };
}

/**
 * Opens a run in status "running", owned by this process, and returns its id: "R" and a
 * sequence number ("R12"), short enough to type after --run. The number is taken inside a write
 * transaction, so two processes sharing the file cannot get the same one.
 */
export function createRun(
  db: KeepclearDb,
  settings: ScreeningSettings,
  fingerprint: string,
  objectCount: number,
  kind: RunKind = 'screening',
  owner: RunOwner = currentOwner(),
): string {
  return inTransaction(db, () => {
    const seq = (db.stmt('SELECT COALESCE(MAX(seq), 0) + 1 FROM runs').pluck().get() as number);
    const id = `R${seq}`;
    const now = Date.now();
    db.stmt(
      `INSERT INTO runs (id, seq, kind, created_at, data_at, start_ms, end_ms, volume_json, primaries_json,
         catalog_fingerprint, object_count, status, owner_pid, owner_host)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 'running', ?, ?)`,
    ).run(
      id,
      seq,
      kind,
      now,
      now,
      settings.start,
      settings.end,
      JSON.stringify(settings.volume),
      JSON.stringify(settings.primaries),
      fingerprint,
      objectCount,
      owner.pid,
      owner.host,
    );
    return id;
  });
}

/**
 * Closes a running run with its results, in one transaction (a reader never sees a "done" run
 * with half its events). Returns the events as stored, with ids, in TCA order.
 */
export function finishRun(db: KeepclearDb, runId: string, outcome: RunOutcome): ConjunctionEvent[] {
  return inTransaction(db, () => {
    const status = db.stmt('SELECT status FROM runs WHERE id = ?').pluck().get(runId) as RunStatus | undefined;
    if (status === undefined) throw new KeepclearError('NOT_FOUND', `no run "${runId}"`);
    if (status !== 'running') {
      throw new KeepclearError('INTERNAL', `run "${runId}" is already ${status}; a run is finished once`);
    }
    const flag = db.stmt('INSERT INTO run_flagged (run_id, object_id, reason) VALUES (?, ?, ?)');
    for (const f of outcome.flagged) flag.run(runId, f.id, f.reason);
    const events = insertEvents(db, runId, outcome.events, outcome.provisionalSeriesId);
    db.stmt(
      `UPDATE runs SET status = ?, finished_at = ?, wall_ms = ?, event_count = ?, flagged_count = ?
        WHERE id = ?`,
    ).run(outcome.status, Date.now(), outcome.wallMs, events.length, outcome.flagged.length, runId);
    return events;
  });
}

/**
 * Sets when a run's data was created (default: the run's own time): a received message's
 * CREATION_DATE, or the time a replayed weekly run stands for (the demo).
 */
export function setRunDataAt(db: KeepclearDb, runId: string, dataAt: Instant): void {
  if (!Number.isFinite(dataAt)) throw new KeepclearError('INTERNAL', `data time of run "${runId}" must be a finite time, got ${dataAt}`);
  const changes = db.stmt('UPDATE runs SET data_at = ? WHERE id = ?').run(dataAt, runId).changes;
  if (changes === 0) throw new KeepclearError('NOT_FOUND', `no run "${runId}"`);
}

export function getRun(db: KeepclearDb, id: string): RunRecord | null {
  const row = db.stmt('SELECT * FROM runs WHERE id = ?').get(id) as RunRow | undefined;
  return row ? fromRow(db, row) : null;
}

/** Runs, newest first; only those of the given kinds when `kinds` is passed. */
export function listRuns(db: KeepclearDb, limit = 100, kinds?: readonly RunKind[]): RunRecord[] {
  const rows = (
    kinds === undefined
      ? db.stmt('SELECT * FROM runs ORDER BY seq DESC LIMIT ?').all(limit)
      : db
          .stmt('SELECT * FROM runs WHERE kind IN (SELECT value FROM json_each(?)) ORDER BY seq DESC LIMIT ?')
          .all(JSON.stringify(kinds), limit)
  ) as RunRow[];
  return rows.map((r) => fromRow(db, r));
}

/**
 * The newest run, or the newest with the given status (e.g. 'done' for `keepclear events`) and
 * of the given kinds (e.g. ['screening']).
 */
export function latestRun(db: KeepclearDb, status?: RunStatus, kinds?: readonly RunKind[]): RunRecord | null {
  const row = db
    .stmt(
      `SELECT * FROM runs
        WHERE (@status IS NULL OR status = @status)
          AND (@kinds IS NULL OR kind IN (SELECT value FROM json_each(@kinds)))
        ORDER BY seq DESC LIMIT 1`,
    )
    .get({ status: status ?? null, kinds: kinds === undefined ? null : JSON.stringify(kinds) }) as RunRow | undefined;
  return row ? fromRow(db, row) : null;
}

/**
 * Marks `interrupted` every run still `running` whose owner process is gone from this host
 * (killed, crashed, power cut), so that no run stays "running" forever. Runs owned on other
 * hosts (a database on a shared drive) are left alone: their processes cannot be checked from
 * here. Returns the ids marked.
 */
export function markInterruptedRuns(db: KeepclearDb, host: string, alive: (pid: number) => boolean): string[] {
  const candidates = db
    .stmt("SELECT id, owner_pid FROM runs WHERE status = 'running' AND owner_host = ?")
    .all(host) as { id: string; owner_pid: number | null }[];
  const dead = candidates.filter((r) => r.owner_pid !== null && !alive(r.owner_pid)).map((r) => r.id);
  if (dead.length === 0) return [];
  return inTransaction(db, () => {
    const mark = db.stmt(
      "UPDATE runs SET status = 'interrupted', finished_at = ? WHERE id = ? AND status = 'running'",
    );
    const now = Date.now();
    // Checked again under the write lock: the owner may have finished the run meanwhile.
    return dead.filter((id) => mark.run(now, id).changes === 1);
  });
}
