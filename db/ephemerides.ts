/**
 * Owner ephemerides (schema v5): store an OEM's usable segments for one object, list an object's
 * ephemerides newest first, load one back as the Oem model (so core/propagation/ephemeris.ts
 * interpolates it exactly as it would the file), and record which ephemeris a run used.
 */
import type { Oem, OemCovariance, OemHeader, OemMetadata, OemSegment, TemeNodeStates } from '../core/formats/oem/index.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import type { Rejection } from '../core/errors.js';
import { inTransaction, type KeepclearDb } from './connection.js';
import { insertImportFile, insertRejection, setImportCounts, type ImportFileRef } from './imports.js';

/** One stored ephemeris, without its nodes. */
export interface EphemerisSummary {
  readonly id: number;
  readonly objectId: string;
  /** OBJECT_ID as the message wrote it */
  readonly objectRef: string;
  readonly objectName: string | null;
  readonly fileName: string;
  readonly sha256: string;
  readonly originator: string;
  readonly messageId: string | null;
  readonly creationDate: Instant;
  /** earliest usable start and latest usable stop over its segments (there may be gaps between) */
  readonly usableStart: Instant;
  readonly usableStop: Instant;
  readonly segmentCount: number;
  readonly covarianceCount: number;
  readonly storedAt: Instant;
}

export interface NewEphemeris {
  readonly objectId: string;
  readonly fileName: string;
  readonly sha256: string;
  readonly importFileId?: number | null;
  readonly header: OemHeader;
  /** the message's usable segments of this object, in file order */
  readonly segments: readonly OemSegment[];
}

interface Row {
  id: number;
  object_id: string;
  object_ref: string;
  object_name: string | null;
  file_name: string;
  sha256: string;
  originator: string;
  message_id: string | null;
  creation_date_ms: number;
  usable_start_ms: number;
  usable_stop_ms: number;
  header_json: string;
  segment_count: number;
  covariance_count: number;
  stored_at: number;
}

interface SegmentRow {
  seq: number;
  usable_start_ms: number;
  usable_stop_ms: number;
  line: number;
  node_count: number;
  epochs_f64: Buffer;
  teme_f64: Buffer;
  lines_i32: Buffer;
  metadata_json: string;
  data_comments_json: string;
  covariances_json: string;
}

const summaryOf = (r: Row): EphemerisSummary => ({
  id: r.id,
  objectId: r.object_id,
  objectRef: r.object_ref,
  objectName: r.object_name,
  fileName: r.file_name,
  sha256: r.sha256,
  originator: r.originator,
  messageId: r.message_id,
  creationDate: instantFromMs(r.creation_date_ms),
  usableStart: instantFromMs(r.usable_start_ms),
  usableStop: instantFromMs(r.usable_stop_ms),
  segmentCount: r.segment_count,
  covarianceCount: r.covariance_count,
  storedAt: instantFromMs(r.stored_at),
});

/** Typed array → BLOB (little-endian on every platform Node runs on that we support). */
const blob = (a: Float64Array | Int32Array): Buffer => Buffer.from(a.buffer, a.byteOffset, a.byteLength);
/** BLOB → typed array; copied so the array is aligned and owns its memory. */
function f64(b: Buffer): Float64Array {
  const out = new Float64Array(b.byteLength / 8);
  new Uint8Array(out.buffer).set(b);
  return out;
}
function i32(b: Buffer): Int32Array {
  const out = new Int32Array(b.byteLength / 4);
  new Uint8Array(out.buffer).set(b);
  return out;
}

/**
 * Stores one ephemeris (call inside the import's transaction). The same file for the same
 * object again is not stored twice: returns the existing id and `inserted: false`.
 */
export function storeEphemeris(db: KeepclearDb, e: NewEphemeris): { id: number; inserted: boolean } {
  const existing = db
    .stmt('SELECT id FROM ephemerides WHERE object_id = ? AND sha256 = ?')
    .pluck()
    .get(e.objectId, e.sha256) as number | undefined;
  if (existing !== undefined) return { id: existing, inserted: false };
  const first = e.segments[0]!;
  const start = Math.min(...e.segments.map((s) => s.usable.start));
  const stop = Math.max(...e.segments.map((s) => s.usable.end));
  const covs = e.segments.reduce((n, s) => n + s.covariances.length, 0);
  const id = Number(
    db
      .stmt(
        `INSERT INTO ephemerides (object_id, object_ref, object_name, file_name, sha256, import_file_id, originator,
           message_id, creation_date_ms, usable_start_ms, usable_stop_ms, header_json, segment_count,
           covariance_count, stored_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        e.objectId, first.metadata.objectId, first.metadata.objectName || null, e.fileName, e.sha256, e.importFileId ?? null,
        e.header.originator, e.header.messageId ?? null, e.header.creationDate, start, stop,
        JSON.stringify(e.header), e.segments.length, covs, Date.now(),
      ).lastInsertRowid,
  );
  const insert = db.stmt(
    `INSERT INTO ephemeris_segments (ephemeris_id, seq, usable_start_ms, usable_stop_ms, line, node_count,
       epochs_f64, teme_f64, lines_i32, metadata_json, data_comments_json, covariances_json)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
  );
  e.segments.forEach((s, seq) => {
    insert.run(
      id, seq, s.usable.start, s.usable.end, s.line, s.epochs.length,
      blob(s.epochs), blob(s.teme), blob(s.nodeLines),
      JSON.stringify(s.metadata), JSON.stringify(s.dataComments), JSON.stringify(s.covariances),
    );
  });
  return { id, inserted: true };
}

/** An object's ephemerides, newest CREATION_DATE first (then the later import). */
export function listEphemerides(db: KeepclearDb, objectId: string): EphemerisSummary[] {
  const rows = db
    .stmt('SELECT * FROM ephemerides WHERE object_id = ? ORDER BY creation_date_ms DESC, id DESC')
    .all(objectId) as Row[];
  return rows.map(summaryOf);
}

export function getEphemeris(db: KeepclearDb, id: number): EphemerisSummary | null {
  const row = db.stmt('SELECT * FROM ephemerides WHERE id = ?').get(id) as Row | undefined;
  return row ? summaryOf(row) : null;
}

/** The stored ephemeris as the Oem model (its file name as `file`), for EphemerisTrajectory. */
export function loadEphemeris(db: KeepclearDb, id: number): Oem | null {
  const row = db.stmt('SELECT file_name, header_json FROM ephemerides WHERE id = ?').get(id) as
    | { file_name: string; header_json: string }
    | undefined;
  if (!row) return null;
  const segs = db
    .stmt('SELECT * FROM ephemeris_segments WHERE ephemeris_id = ? ORDER BY seq')
    .all(id) as SegmentRow[];
  return {
    file: row.file_name,
    header: JSON.parse(row.header_json) as OemHeader,
    segments: segs.map((s): OemSegment => ({
      metadata: JSON.parse(s.metadata_json) as OemMetadata,
      dataComments: JSON.parse(s.data_comments_json) as string[],
      epochs: f64(s.epochs_f64),
      teme: f64(s.teme_f64) as TemeNodeStates,
      nodeLines: i32(s.lines_i32),
      usable: { start: instantFromMs(s.usable_start_ms), end: instantFromMs(s.usable_stop_ms) },
      covariances: JSON.parse(s.covariances_json) as OemCovariance[],
      line: s.line,
    })),
  };
}

/** What a run used for one primary. */
export interface RunEphemeris {
  readonly objectId: string;
  readonly ephemerisId: number | null;
  readonly fileName: string;
  readonly creationDate: Instant;
}

/** Records that a run screened `objectId` from this ephemeris (inside the run's transaction). */
export function recordRunEphemeris(db: KeepclearDb, runId: string, e: EphemerisSummary): void {
  db.stmt(
    'INSERT INTO run_ephemerides (run_id, object_id, ephemeris_id, file_name, creation_date_ms) VALUES (?, ?, ?, ?, ?)',
  ).run(runId, e.objectId, e.id, e.fileName, e.creationDate);
}

export function runEphemerides(db: KeepclearDb, runId: string): RunEphemeris[] {
  const rows = db
    .stmt('SELECT object_id, ephemeris_id, file_name, creation_date_ms FROM run_ephemerides WHERE run_id = ? ORDER BY object_id')
    .all(runId) as { object_id: string; ephemeris_id: number | null; file_name: string; creation_date_ms: number }[];
  return rows.map((r) => ({
    objectId: r.object_id,
    ephemerisId: r.ephemeris_id,
    fileName: r.file_name,
    creationDate: instantFromMs(r.creation_date_ms),
  }));
}

/**
 * Stores the ephemerides of one OEM file (one per object it names) and the file's import log,
 * with its rejected lines and segments, in one transaction.
 */
export function storeOemFile(
  db: KeepclearDb,
  file: ImportFileRef,
  ephemerides: readonly NewEphemeris[],
  rejections: readonly Rejection[],
): { importFileId: number; imported: number; unchanged: number; rejected: number; ids: number[] } {
  return inTransaction(db, () => {
    const fileId = insertImportFile(db, file, Date.now());
    for (const r of rejections) insertRejection(db, fileId, r);
    const ids: number[] = [];
    let imported = 0;
    for (const e of ephemerides) {
      const { id, inserted } = storeEphemeris(db, { ...e, importFileId: fileId });
      ids.push(id);
      if (inserted) imported++;
    }
    const counts = { imported, updated: 0, unchanged: ephemerides.length - imported, rejected: rejections.length };
    setImportCounts(db, fileId, counts);
    return { importFileId: fileId, ...counts, ids };
  });
}
