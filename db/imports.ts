import type { Rejection } from '../core/errors.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import type { KeepclearDb } from './connection.js';

/** The file an import came from. `sha256` lets a later check tell whether it is the same file. */
export interface ImportFileRef {
  readonly path: string;
  readonly sha256: string;
  readonly format: string;
}

export interface ImportCounts {
  readonly imported: number;
  readonly updated: number;
  readonly unchanged: number;
  readonly rejected: number;
}

export interface ImportFileRecord extends ImportFileRef, ImportCounts {
  readonly id: number;
  readonly importedAt: Instant;
}

export interface StoredRejection {
  readonly line: number;
  readonly code: string;
  readonly reason: string;
}

/** Opens the log entry of one imported file; call inside the file's transaction. */
export function insertImportFile(db: KeepclearDb, file: ImportFileRef, at: number): number {
  return Number(
    db
      .stmt('INSERT INTO import_files (path, sha256, format, imported_at) VALUES (?, ?, ?, ?)')
      .run(file.path, file.sha256, file.format, at).lastInsertRowid,
  );
}

export function setImportCounts(db: KeepclearDb, fileId: number, c: ImportCounts): void {
  db.stmt('UPDATE import_files SET imported = ?, updated = ?, unchanged = ?, rejected = ? WHERE id = ?').run(
    c.imported,
    c.updated,
    c.unchanged,
    c.rejected,
    fileId,
  );
}

export function insertRejection(db: KeepclearDb, fileId: number, r: Rejection): void {
  db.stmt('INSERT INTO import_rejections (import_file_id, line, code, reason) VALUES (?, ?, ?, ?)').run(
    fileId,
    r.line,
    r.code,
    r.reason,
  );
}

interface ImportFileRow {
  id: number;
  path: string;
  sha256: string;
  format: string;
  imported_at: number;
  imported: number;
  updated: number;
  unchanged: number;
  rejected: number;
}

/** All imported files, newest first. */
export function listImportFiles(db: KeepclearDb): ImportFileRecord[] {
  const rows = db.stmt('SELECT * FROM import_files ORDER BY imported_at DESC, id DESC').all() as ImportFileRow[];
  return rows.map((r) => ({
    id: r.id,
    path: r.path,
    sha256: r.sha256,
    format: r.format,
    importedAt: instantFromMs(r.imported_at),
    imported: r.imported,
    updated: r.updated,
    unchanged: r.unchanged,
    rejected: r.rejected,
  }));
}

export function rejectionsOfImport(db: KeepclearDb, fileId: number): StoredRejection[] {
  return db
    .stmt('SELECT line, code, reason FROM import_rejections WHERE import_file_id = ? ORDER BY line, id')
    .all(fileId) as StoredRejection[];
}
