import { KeepclearError } from '../../core/errors.js';
import { catalogFingerprint, type KeepclearDb } from '../../db/index.js';
import { importFile } from './file.js';
import { addCounts, NO_COUNTS, type FileOutcome, type ImportSummary } from './outcome.js';

export interface ImportRequest {
  readonly files: readonly string[];
  /** hard-body radius (m) to set on every object of the files */
  readonly hbrM?: number;
  /** called after each file, for progress and for presenting outcomes as they come */
  readonly onFile?: (outcome: FileOutcome, index: number, count: number) => void;
  /**
   * Compute and keep the catalogue's fingerprint once the files are in (default true), so the
   * next screening runs need not (db/fingerprint.ts; ~0.15 s for 30,000 objects). A caller about
   * to screen at once passes false: the screening computes it while its workers start.
   */
  readonly keepFingerprint?: boolean;
}

/**
 * Imports files one by one, each in its own transaction: a bad record is rejected alone, a file
 * that cannot be read or recognised changes nothing, and files already imported stay imported
 * when a later one fails. When the database itself cannot be written (locked past the busy
 * timeout, read-only, full), the files after that one are not tried and say so.
 */
export function importFiles(db: KeepclearDb, req: ImportRequest): ImportSummary {
  const outcomes: FileOutcome[] = [];
  let total = NO_COUNTS;
  let storageFailure: KeepclearError | null = null;
  req.files.forEach((file, i) => {
    const outcome: FileOutcome = storageFailure
      ? {
          ok: false,
          file,
          format: null,
          error: new KeepclearError(storageFailure.code, 'not tried: the database could not be written (see above)', { file, line: 1 }),
        }
      : importFile(db, file, req.hbrM);
    if (!outcome.ok && outcome.error.code.startsWith('DATABASE_')) storageFailure ??= outcome.error;
    if (outcome.ok) total = addCounts(total, outcome.counts);
    outcomes.push(outcome);
    req.onFile?.(outcome, i, req.files.length);
  });
  const notImported = outcomes.filter((o) => !o.ok).length;
  if (req.keepFingerprint !== false && !storageFailure && total.imported + total.updated > 0) {
    try {
      catalogFingerprint(db);
    } catch {
      // Only a head start for the next run, which computes it itself if it is not kept.
    }
  }
  return { outcomes, total, notImported, clean: notImported === 0 && total.rejected === 0 };
}
