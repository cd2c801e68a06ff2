import type { KeepclearError, Rejection } from '../../core/errors.js';
import type { ImportCounts } from '../../db/index.js';

/** A file that was stored (in its own transaction), possibly with some records rejected. */
export interface FileImported {
  readonly ok: true;
  readonly file: string;
  /** the format recognised from the content: TLE, OMM-KVN, …, CDM-XML */
  readonly format: string;
  readonly counts: ImportCounts;
  /** one per record that could not be used; the rest of the file was stored */
  readonly rejections: readonly Rejection[];
  /** what the reader repaired or flagged while keeping the record (e.g. a covariance not PSD) */
  readonly notes: readonly string[];
}

/** A file of which nothing was stored, and why. */
export interface FileNotImported {
  readonly ok: false;
  readonly file: string;
  /** the format, when it was recognised before the failure */
  readonly format: string | null;
  /** carries FILE:LINE (line 1 for whole-file problems) */
  readonly error: KeepclearError;
}

/** What importing one file did. The CLI, `serve` and the desktop app each present it their way. */
export type FileOutcome = FileImported | FileNotImported;

/** What importing several files did, file by file and in total. */
export interface ImportSummary {
  readonly outcomes: readonly FileOutcome[];
  /** counts summed over the files that were stored */
  readonly total: ImportCounts;
  /** files of which nothing was stored */
  readonly notImported: number;
  /** every file stored and no record rejected */
  readonly clean: boolean;
}

export const NO_COUNTS: ImportCounts = { imported: 0, updated: 0, unchanged: 0, rejected: 0 };

export const addCounts = (a: ImportCounts, b: ImportCounts): ImportCounts => ({
  imported: a.imported + b.imported,
  updated: a.updated + b.updated,
  unchanged: a.unchanged + b.unchanged,
  rejected: a.rejected + b.rejected,
});
