import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { KeepclearError, rejectionLine, type Rejection } from '../../core/errors.js';
import { parseElementFile } from '../../core/formats/detect.js';
import {
  defaultDbPath,
  inTransaction,
  openDatabase,
  setHardBodyRadius,
  storeElementSets,
  type ImportCounts,
  type KeepclearDb,
} from '../../db/index.js';
import { optNumber, optString, parseArgs } from '../args.js';
import { importCdmFile } from '../../app/cdmImport.js';

/**
 * `keepclear import FILE... [--db FILE] [--hbr-m X]`
 *
 * Each file is stored in its own transaction: a bad record is rejected alone, a file that cannot
 * be read or recognised changes nothing, and files already imported stay imported when a later
 * one fails. Whole-file problems are reported at line 1, the convention of the format readers.
 */

type Format = ReturnType<typeof parseElementFile>['format'];
type MessageFormat = Extract<Format, 'CDM-KVN' | 'CDM-XML' | 'OEM-KVN' | 'OEM-XML'>;

/** What importing one file did: counts when it was stored, or the reason it was not. */
export type FileOutcome =
  | { readonly ok: true; readonly format: string; readonly counts: ImportCounts; readonly rejections: readonly Rejection[] }
  | { readonly ok: false; readonly error: KeepclearError };

const MESSAGE_FORMATS: readonly Format[] = ['CDM-KVN', 'CDM-XML', 'OEM-KVN', 'OEM-XML'];
const isMessageFormat = (f: Format): f is MessageFormat => MESSAGE_FORMATS.includes(f);

/**
 * THE place where CDM and OEM files are routed. Each importer stores its file in one
 * transaction and returns a FileOutcome; `hbrM` is the --hbr-m value for the file's objects.
 */
export function importMessageFile(
  db: KeepclearDb,
  file: string,
  bytes: Uint8Array,
  sha256: string,
  format: MessageFormat,
  hbrM: number | undefined,
): FileOutcome {
  if (format.startsWith('CDM')) {
    try {
      const r = importCdmFile(db, file, bytes, sha256, format, hbrM);
      for (const note of r.repairs) process.stderr.write(`keepclear: ${file}: note: ${note}\n`);
      return { ok: true, format, counts: r.counts, rejections: r.rejections };
    } catch (err) {
      if (err instanceof KeepclearError) return { ok: false, error: err };
      throw err;
    }
  }
  return {
    ok: false,
    error: new KeepclearError(
      'FORMAT_UNKNOWN',
      'OEM owner ephemerides are not imported yet (planned); import TLE, OMM or CDM files',
      { file, line: 1 },
    ),
  };
}

/** Turns a read error into words a user can act on. */
function readFailure(file: string, err: unknown): KeepclearError {
  const code = (err as NodeJS.ErrnoException).code;
  const why =
    code === 'ENOENT'
      ? 'no such file; check the path'
      : code === 'EACCES' || code === 'EPERM'
        ? 'permission denied; check the file permissions'
        : code === 'EISDIR'
          ? 'it is a directory; name the files inside it'
          : `${(err as Error).message}; check the path`;
  return new KeepclearError('FILE_UNREADABLE', `cannot read: ${why}`, { file, line: 1 });
}

/** Reads, parses and stores one file. Never throws for problems of the file itself. */
export function importOneFile(db: KeepclearDb, file: string, hbrM: number | undefined): FileOutcome {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(file);
  } catch (err) {
    return { ok: false, error: readFailure(file, err) };
  }
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const parsed = parseElementFile(bytes, file);
  if (parsed.fatal) return { ok: false, error: parsed.fatal };
  if (isMessageFormat(parsed.format)) return importMessageFile(db, file, bytes, sha256, parsed.format, hbrM);
  if (parsed.format === 'UNKNOWN') {
    return {
      ok: false,
      error: new KeepclearError(
        'FORMAT_UNKNOWN',
        'format not recognised: expected TLE, OMM (KVN, XML, JSON, CSV), OEM or CDM',
        { file, line: 1 },
      ),
    };
  }
  const stored = inTransaction(db, () => {
    const result = storeElementSets(db, { path: file, sha256, format: parsed.format }, parsed.sets, parsed.rejections);
    if (hbrM !== undefined) setHardBodyRadius(db, parsed.sets.map((s) => s.objectId), hbrM);
    return result;
  });
  return { ok: true, format: parsed.format, counts: stored, rejections: stored.rejections };
}

const countsText = (c: ImportCounts): string =>
  `imported ${c.imported}, updated ${c.updated}, unchanged ${c.unchanged}, rejected ${c.rejected}`;

export async function importCommand(argv: readonly string[]): Promise<number> {
  const args = parseArgs(argv, { valued: ['db', 'hbr-m'] });
  const hbrM = optNumber(args, 'hbr-m', (x) => x > 0, 'a positive number of metres');
  if (args.positional.length === 0) {
    throw new KeepclearError('BAD_ARGUMENT', 'import needs at least one FILE: keepclear import FILE... [--db FILE] [--hbr-m X]');
  }
  const db = openDatabase(optString(args, 'db') ?? defaultDbPath());
  try {
    return importCatalogFiles(db, args.positional, hbrM, false) ? 0 : 1;
  } finally {
    db.close();
  }
}

/**
 * Imports files one by one (each in its own transaction), reporting rejections on stderr and
 * counts on stdout (on stderr when `quiet`, so stdout can carry JSON). True when every file
 * imported without a single rejected record.
 */
export function importCatalogFiles(db: KeepclearDb, files: readonly string[], hbrM: number | undefined, quiet: boolean): boolean {
  const out = quiet ? process.stderr : process.stdout;
  const total = { imported: 0, updated: 0, unchanged: 0, rejected: 0 };
  let failed = 0;
  for (const file of files) {
    let outcome: FileOutcome;
    try {
      outcome = importOneFile(db, file, hbrM);
    } catch (err) {
      // A storage failure (disk full, locked database) rolled the file back; say so and go on.
      const why = err instanceof KeepclearError ? err.message : (err as Error).message;
      outcome = {
        ok: false,
        error: new KeepclearError('INTERNAL', `not stored, nothing of this file was kept: ${why}`, { file, line: 1 }),
      };
    }
    if (!outcome.ok) {
      failed++;
      const line = outcome.error.where ? outcome.error.toLine() : `${file}:1: ${outcome.error.message}`;
      process.stderr.write(`keepclear: ${line}\n`);
      continue;
    }
    for (const r of outcome.rejections) process.stderr.write(`keepclear: ${rejectionLine(r)}\n`);
    out.write(`${file} (${outcome.format}): ${countsText(outcome.counts)}\n`);
    total.imported += outcome.counts.imported;
    total.updated += outcome.counts.updated;
    total.unchanged += outcome.counts.unchanged;
    total.rejected += outcome.counts.rejected;
  }
  const n = files.length;
  const failedText = failed > 0 ? `, ${failed} not imported` : '';
  out.write(`total: ${countsText(total)} (${n} file${n === 1 ? '' : 's'}${failedText})\n`);
  return failed === 0 && total.rejected === 0;
}
