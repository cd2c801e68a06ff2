/**
 * Errors as typed codes plus a message that carries the values involved.
 * `where` is the file and 1-based line the problem was found on, when it comes from a file.
 */
export type ErrorCode =
  // input files
  | 'FILE_UNREADABLE'
  | 'FILE_EMPTY'
  | 'FORMAT_UNKNOWN'
  | 'NOT_TEXT'
  | 'TLE_CHECKSUM'
  | 'TLE_COLUMNS'
  | 'TLE_TRUNCATED'
  | 'TLE_LINE_ORDER'
  | 'TLE_FIELD'
  | 'OMM_MISSING_KEYWORD'
  | 'OMM_FIELD'
  | 'XML_SYNTAX'
  | 'JSON_SYNTAX'
  | 'CSV_SYNTAX'
  | 'VALUE_OUT_OF_RANGE'
  | 'CDM_MISSING_KEYWORD'
  | 'CDM_FIELD'
  | 'CDM_UNITS'
  | 'CDM_COVARIANCE'
  | 'CDM_STRUCTURE'
  | 'OEM_FIELD'
  | 'OEM_MISSING_KEYWORD'
  | 'OEM_STRUCTURE'
  | 'OEM_EPOCH_ORDER'
  | 'OEM_UNITS'
  | 'OEM_COVARIANCE'
  | 'OEM_UNSUPPORTED'
  | 'INPUT_TOO_LARGE'
  // shards of an all-vs-all run that do not make one run (keepclear merge)
  | 'SHARD_INVALID'
  // the database file
  | 'DATABASE_BUSY'
  | 'DATABASE_READONLY'
  | 'DATABASE_FULL'
  | 'DATABASE_IO'
  | 'DATABASE_DAMAGED'
  | 'OPM_FIELD'
  | 'OPM_MISSING_KEYWORD'
  | 'OPM_STRUCTURE'
  // propagation
  | 'PROPAGATION_FAILED'
  /** an owner ephemeris does not cover the screening window (never extrapolated) */
  | 'EPHEMERIS_GAP'
  // manoeuvre planning
  | 'SPACECRAFT_PARAMETER_MISSING'
  // arguments and runs
  | 'BAD_ARGUMENT'
  | 'NOT_FOUND'
  | 'CANCELLED'
  | 'INTERNAL';

export interface Where {
  readonly file: string;
  readonly line: number;
}

export class KeepclearError extends Error {
  readonly code: ErrorCode;
  readonly where: Where | undefined;
  constructor(code: ErrorCode, message: string, where?: Where) {
    super(message);
    this.name = 'KeepclearError';
    this.code = code;
    this.where = where;
  }
  /** The CLI's error line: `FILE:LINE: what is wrong` (without the program prefix). */
  toLine(): string {
    return this.where ? `${this.where.file}:${this.where.line}: ${this.message}` : this.message;
  }
}

/** One record that could not be used; the rest of the file still imports. */
export interface Rejection {
  readonly code: ErrorCode;
  readonly file: string;
  readonly line: number;
  readonly reason: string;
}

export const rejectionLine = (r: Rejection): string => `${r.file}:${r.line}: ${r.reason}`;
