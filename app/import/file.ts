import { createHash } from 'node:crypto';
import { KeepclearError } from '../../core/errors.js';
import { parseElementFile } from '../../core/formats/detect.js';
import { inTransaction, setHardBodyRadius, storageError, storeElementSets, type KeepclearDb } from '../../db/index.js';
import { importMessageFile, isMessageFormat } from './messages.js';
import type { FileOutcome } from './outcome.js';
import { readInputFile } from './readInput.js';

/**
 * Reads, recognises, parses and stores one file, in one transaction. Never throws: problems of
 * the file (unreadable, too large, unrecognised, malformed) and of the database (locked,
 * read-only, full) both come back as a FileNotImported, and then nothing of the file was kept.
 */
export function importFile(db: KeepclearDb, file: string, hbrM?: number): FileOutcome {
  try {
    return importFileOrThrow(db, file, hbrM);
  } catch (err) {
    const known = err instanceof KeepclearError ? err : storageError(err, db.path, db.busyTimeoutMs);
    const why = known ? known.message : (err as Error).message;
    const error = new KeepclearError(
      known?.code ?? 'INTERNAL',
      `not stored, nothing of this file was kept: ${why}`,
      { file, line: 1 },
    );
    (error as { cause?: unknown }).cause = err;
    return { ok: false, file, format: null, error };
  }
}

function importFileOrThrow(db: KeepclearDb, file: string, hbrM: number | undefined): FileOutcome {
  const read = readInputFile(file);
  if ('error' in read) return { ok: false, file, format: null, error: read.error };
  const { bytes } = read;
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const parsed = parseElementFile(bytes, file);
  if (parsed.fatal) return { ok: false, file, format: null, error: parsed.fatal };
  if (isMessageFormat(parsed.format)) return importMessageFile(db, file, bytes, sha256, parsed.format, hbrM);
  if (parsed.format === 'UNKNOWN') {
    return {
      ok: false,
      file,
      format: null,
      error: new KeepclearError(
        'FORMAT_UNKNOWN',
        'format not recognised: expected TLE, OMM (KVN, XML, JSON, CSV), OEM or CDM',
        { file, line: 1 },
      ),
    };
  }
  const format = parsed.format;
  const stored = inTransaction(db, () => {
    const result = storeElementSets(db, { path: file, sha256, format }, parsed.sets, parsed.rejections);
    if (hbrM !== undefined) setHardBodyRadius(db, parsed.sets.map((s) => s.objectId), hbrM);
    return result;
  });
  const counts = { imported: stored.imported, updated: stored.updated, unchanged: stored.unchanged, rejected: stored.rejected };
  return { ok: true, file, format, counts, rejections: stored.rejections, notes: [] };
}
