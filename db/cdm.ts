import type { Rejection } from '../core/errors.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import { inTransaction, type KeepclearDb } from './connection.js';
import { insertImportFile, insertRejection, setImportCounts, type ImportFileRef } from './imports.js';

/**
 * A received conjunction data message, reduced to what is searched on plus the whole parsed
 * message as JSON. Kept generic on purpose: the CDM reader owns the message's structure.
 */
export interface CdmRecord {
  readonly messageId: string;
  readonly creationDate: Instant;
  readonly originator: string;
  readonly tca: Instant;
  readonly missDistanceM: number;
  readonly object1Id: string;
  readonly object2Id: string;
  /** COLLISION_PROBABILITY as reported by the originator (Keepclear computes its own) */
  readonly reportedPc: number | null;
  /** the parsed message; must survive JSON.stringify */
  readonly parsed: unknown;
  /** the event this message was matched to or created, when known */
  readonly eventId: string | null;
}

export interface StoredCdm extends CdmRecord {
  readonly id: number;
  readonly importFileId: number | null;
  readonly storedAt: Instant;
}

interface CdmRow {
  id: number;
  import_file_id: number | null;
  message_id: string;
  creation_date_ms: number;
  originator: string;
  tca_ms: number;
  miss_distance_m: number;
  object1_id: string;
  object2_id: string;
  collision_probability: number | null;
  parsed_json: string;
  event_id: string | null;
  stored_at: number;
}

const fromRow = (r: CdmRow): StoredCdm => ({
  id: r.id,
  importFileId: r.import_file_id,
  messageId: r.message_id,
  creationDate: instantFromMs(r.creation_date_ms),
  originator: r.originator,
  tca: instantFromMs(r.tca_ms),
  missDistanceM: r.miss_distance_m,
  object1Id: r.object1_id,
  object2Id: r.object2_id,
  reportedPc: r.collision_probability,
  parsed: JSON.parse(r.parsed_json) as unknown,
  eventId: r.event_id,
  storedAt: instantFromMs(r.stored_at),
});

/**
 * Stores one message. A message already stored (same ORIGINATOR and MESSAGE_ID) is left as it
 * is: `created` false and the stored id returned, so re-importing a file is harmless.
 */
export function storeCdm(
  db: KeepclearDb,
  record: CdmRecord,
  importFileId: number | null = null,
): { id: number; created: boolean } {
  return inTransaction(db, () => {
    const existing = db
      .stmt('SELECT id FROM cdm_messages WHERE originator = ? AND message_id = ?')
      .pluck()
      .get(record.originator, record.messageId) as number | undefined;
    if (existing !== undefined) return { id: existing, created: false };
    const id = db
      .stmt(
        `INSERT INTO cdm_messages (import_file_id, message_id, creation_date_ms, originator, tca_ms,
           miss_distance_m, object1_id, object2_id, collision_probability, parsed_json, event_id, stored_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        importFileId,
        record.messageId,
        record.creationDate,
        record.originator,
        record.tca,
        record.missDistanceM,
        record.object1Id,
        record.object2Id,
        record.reportedPc,
        JSON.stringify(record.parsed),
        record.eventId,
        Date.now(),
      ).lastInsertRowid;
    return { id: Number(id), created: true };
  });
}

/**
 * Stores the messages and rejections read from one file in ONE transaction, with its
 * import_files entry. Counts: new messages imported, already-stored ones unchanged.
 */
export function storeCdmFile(
  db: KeepclearDb,
  file: ImportFileRef,
  records: readonly CdmRecord[],
  rejections: readonly Rejection[],
): { importFileId: number; imported: number; unchanged: number; rejected: number; ids: number[] } {
  return inTransaction(db, () => {
    const fileId = insertImportFile(db, file, Date.now());
    for (const r of rejections) insertRejection(db, fileId, r);
    let imported = 0;
    const ids: number[] = [];
    for (const rec of records) {
      const { id, created } = storeCdm(db, rec, fileId);
      ids.push(id);
      if (created) imported++;
    }
    const counts = { imported, updated: 0, unchanged: records.length - imported, rejected: rejections.length };
    setImportCounts(db, fileId, counts);
    return { importFileId: fileId, ...counts, ids };
  });
}

/** Links a stored message to the event it describes. */
export function linkCdmToEvent(db: KeepclearDb, cdmId: number, eventId: string | null): void {
  db.stmt('UPDATE cdm_messages SET event_id = ? WHERE id = ?').run(eventId, cdmId);
}

export interface CdmFilter {
  readonly objectId?: string;
  readonly eventId?: string;
}

/** Stored messages, by TCA then creation date; filtered by an object (either side) or event. */
export function listCdms(db: KeepclearDb, filter: CdmFilter = {}): StoredCdm[] {
  const rows = db
    .stmt(
      `SELECT * FROM cdm_messages
        WHERE (@object IS NULL OR object1_id = @object OR object2_id = @object)
          AND (@event IS NULL OR event_id = @event)
        ORDER BY tca_ms, creation_date_ms, id`,
    )
    .all({ object: filter.objectId ?? null, event: filter.eventId ?? null }) as CdmRow[];
  return rows.map(fromRow);
}

export function getCdm(db: KeepclearDb, id: number): StoredCdm | null {
  const row = db.stmt('SELECT * FROM cdm_messages WHERE id = ?').get(id) as CdmRow | undefined;
  return row ? fromRow(row) : null;
}
