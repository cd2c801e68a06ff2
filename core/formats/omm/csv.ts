/**
 * OMM as CSV: a header row of CCSDS keyword names, one element set per row (as public
 * providers distribute it). Quoting per RFC 4180; a quoted field may not span lines here
 * (no provider does that for OMM), and such a row is rejected with a reason.
 */
import type { ElementSet } from '../../elements/elementSet.js';
import type { Rejection } from '../../errors.js';
import { OmmProblem, ommToElementSet } from './fields.js';
import { MAX_RECORD_CHARS, overlongReason, rejection, splitLines, type ParseResult } from '../result.js';


/** Splits one CSV row; null when a quote is left open. */
export function splitCsvRow(row: string): string[] | null {
  const out: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < row.length; i++) {
    const c = row[i];
    if (quoted) {
      if (c === '"' && row[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      out.push(cell);
      cell = '';
    } else cell += c;
  }
  if (quoted) return null;
  out.push(cell);
  return out;
}

export function parseOmmCsv(text: string, file: string): ParseResult {
  const lines = splitLines(text);
  const sets: ElementSet[] = [];
  const rejections: Rejection[] = [];
  let header: string[] | null = null;
  let headerLine = 0;
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i] ?? '';
    if (raw.trim() === '') continue;
    const lineNo = i + 1;
    if (raw.length > MAX_RECORD_CHARS) {
      rejections.push(rejection('CSV_SYNTAX', file, lineNo, overlongReason('this row', raw.length)));
      continue;
    }
    const cells = splitCsvRow(raw);
    if (cells === null) {
      rejections.push(
        rejection('CSV_SYNTAX', file, lineNo, 'a quoted field is not closed on this row: close the quote (fields may not span lines)'),
      );
      continue;
    }
    if (header === null) {
      header = cells.map((c) => c.trim().toUpperCase());
      headerLine = lineNo;
      continue;
    }
    if (cells.length !== header.length) {
      rejections.push(
        rejection(
          'CSV_SYNTAX',
          file,
          lineNo,
          `row has ${cells.length} fields but the header (line ${headerLine}) has ${header.length}: ` +
            'a comma inside a value needs quotes; fix the row',
        ),
      );
      continue;
    }
    const row = new Map<string, string>();
    header.forEach((k, j) => row.set(k, (cells[j] ?? '').trim()));
    try {
      sets.push(
        ommToElementSet(
          (k) => {
            const v = row.get(k);
            return v === undefined ? undefined : { value: v, line: lineNo };
          },
          { file, line: lineNo, format: 'OMM-CSV', requireHeader: false },
        ),
      );
    } catch (e) {
      if (!(e instanceof OmmProblem)) throw e;
      rejections.push(rejection(e.code, file, e.line, e.reason));
    }
  }
  return { sets, rejections };
}
