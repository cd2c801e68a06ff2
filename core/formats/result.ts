import type { ElementSet } from '../elements/elementSet.js';
import type { ErrorCode, Rejection } from '../errors.js';

/** What every element-set reader returns: the sets it could use and one rejection per bad record. */
export interface ParseResult {
  sets: ElementSet[];
  rejections: Rejection[];
}

export const rejection = (code: ErrorCode, file: string, line: number, reason: string): Rejection => ({
  code,
  file,
  line,
  reason,
});

/** Splits text into lines, accepting LF, CRLF and lone CR (files moved between systems). */
export const splitLines = (text: string): string[] => text.split(/\r\n|\r|\n/);

/**
 * The longest record a reader takes: 64 KiB (65,536 characters) for one TLE line, KVN line, CSV
 * row, or one OMM of XML or JSON. Real records are under 2 kB (an OMM in XML with comments);
 * anything longer is a damaged or wrong file, and reading it would cost many times its size in
 * memory (measured: one 100 MB CSV field took 4 GB and 57 s). Longer records are rejected unread.
 */
export const MAX_RECORD_CHARS = 65_536;

/** The rejection reason of an overlong record, at its first line. */
export const overlongReason = (what: string, chars: number): string =>
  `${what} is ${chars.toLocaleString('en-US')} characters long, more than the ${MAX_RECORD_CHARS.toLocaleString('en-US')} ` +
  'a record may have: the file is damaged or not an element file; the record was skipped unread';

/** A value as messages quote it: whole when short, else its start and its length. */
export function quoteValue(value: string, max = 60): string {
  return value.length <= max ? value : `${value.slice(0, max)}… (${value.length.toLocaleString('en-US')} characters)`;
}
