/**
 * Imports one OEM file (CCSDS 502.0-B-2, KVN or XML) as owner ephemerides, in one transaction.
 *
 * OBJECT_ID names the object (DESIGN.md "Owner ephemerides"): a catalogue number (Alpha-5
 * allowed) is the object with that number; an international designator is the catalogue object
 * that carries it — none is an error (import the object's element set first), several are an
 * error naming them. Each segment is matched on its own OBJECT_ID: a segment that names no
 * object is rejected alone and the rest of the file is kept; one ephemeris is stored per object.
 */
import { canonicalObjectId } from '../../core/elements/objectId.js';
import { KeepclearError, type Rejection } from '../../core/errors.js';
import { classifyObjectId, parseOemFile, type OemSegment } from '../../core/formats/oem/index.js';
import { getObject, inTransaction, objectsWithDesignator, setHardBodyRadius, storeOemFile, type ImportCounts, type KeepclearDb, type NewEphemeris } from '../../db/index.js';

export interface OemImportOutcome {
  readonly counts: ImportCounts;
  readonly rejections: readonly Rejection[];
  /** conversions and choices made while loading, and matching notes, as FILE:LINE: note */
  readonly notes: readonly string[];
  /** the catalogue objects the file's ephemerides were stored for */
  readonly objectIds: readonly string[];
}

export type ObjectMatch = { readonly id: string; readonly note: string | null } | { readonly error: string };

/** The catalogue object an OEM's OBJECT_ID names, or why none can be chosen. */
export function matchOemObject(db: KeepclearDb, objectIdText: string): ObjectMatch {
  const ref = classifyObjectId(objectIdText);
  if (ref.kind === 'catalogue') {
    const id = canonicalObjectId(ref.catalogueNumber);
    return {
      id,
      note: getObject(db, id) ? null : `OBJECT_ID = ${objectIdText.trim()}: catalogue object ${id} has no element set stored yet; the ephemeris is kept for it`,
    };
  }
  if (ref.kind === 'designator') {
    const hits = objectsWithDesignator(db, ref.designator);
    if (hits.length === 1) return { id: hits[0]!.id, note: null };
    if (hits.length === 0)
      return {
        error: `OBJECT_ID = ${ref.designator} matches no catalogue object: import the object's element set (TLE or OMM) first, or write its catalogue number as OBJECT_ID`,
      };
    const named = hits.map((h) => (h.name ? `${h.id} (${h.name})` : h.id)).join(', ');
    return {
      error: `OBJECT_ID = ${ref.designator} is the international designator of ${hits.length} catalogue objects: ${named}; write the catalogue number as OBJECT_ID to say which`,
    };
  }
  return {
    error: `OBJECT_ID = ${ref.text} is neither a catalogue number (e.g. 70000 or A0001) nor an international designator (e.g. 2026-100A); write one of them`,
  };
}

/** `hbrM` (--hbr-m) sets the hard-body radius of the objects the file names, in the same transaction. */
export function importOemFile(
  db: KeepclearDb,
  file: string,
  bytes: Uint8Array,
  sha256: string,
  format: string,
  hbrM?: number,
): OemImportOutcome {
  const parsed = parseOemFile(bytes, file);
  if (!parsed.oem) {
    const f = parsed.fatal ?? parsed.rejections[0];
    throw new KeepclearError(f?.code ?? 'OEM_STRUCTURE', f?.reason ?? 'not a readable OEM', { file, line: f?.line ?? 1 });
  }
  const oem = parsed.oem;
  const rejections: Rejection[] = [...parsed.rejections];
  const notes = parsed.notes.map((n) => `${n.file}:${n.line}: ${n.note}`);
  const byObject = new Map<string, OemSegment[]>();
  const matched = new Map<string, ObjectMatch>();
  for (const seg of oem.segments) {
    const text = seg.metadata.objectId;
    let m = matched.get(text);
    if (!m) {
      m = matchOemObject(db, text);
      matched.set(text, m);
      if ('id' in m && m.note) notes.push(`${file}:${seg.line}: ${m.note}`);
    }
    if ('error' in m) {
      rejections.push({ code: 'OEM_FIELD', file, line: seg.line, reason: `${m.error} — this segment is skipped` });
      continue;
    }
    byObject.set(m.id, [...(byObject.get(m.id) ?? []), seg]);
  }
  if (byObject.size === 0) {
    // Every segment failed to name an object: the first reason is the file's error.
    const first = rejections.find((r) => r.code === 'OEM_FIELD') ?? rejections[0];
    throw new KeepclearError('OEM_FIELD', first ? first.reason.replace(/ — this segment is skipped$/, '; nothing was imported') : 'no segment names a catalogue object', {
      file,
      line: first?.line ?? 1,
    });
  }
  const ephemerides: NewEphemeris[] = [...byObject].map(([objectId, segments]) => ({
    objectId, fileName: file, sha256, header: oem.header, segments,
  }));
  // better-sqlite3 nests the inner transaction as a savepoint: file and radius commit together.
  const stored = inTransaction(db, () => {
    const r = storeOemFile(db, { path: file, sha256, format }, ephemerides, rejections);
    if (hbrM !== undefined) setHardBodyRadius(db, [...byObject.keys()], hbrM);
    return r;
  });
  return {
    counts: { imported: stored.imported, updated: 0, unchanged: stored.unchanged, rejected: stored.rejected },
    rejections: rejections.sort((a, b) => a.line - b.line),
    notes,
    objectIds: [...byObject.keys()],
  };
}
