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
