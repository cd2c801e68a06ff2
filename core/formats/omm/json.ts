/**
 * OMM as JSON: an array of flat objects keyed by CCSDS keyword names, as public catalogue
 * providers distribute them (numbers as JSON numbers or as strings; header keywords often
 * absent). A single object is accepted too.
 *
 * The text is first cut into its top-level elements by a small scanner, then each element is
 * parsed on its own: a syntax error inside one object rejects that object only, and every
 * object's line (its opening brace) is known.
 */
import type { ElementSet } from '../../elements/elementSet.js';
import type { Rejection } from '../../errors.js';
import { OmmProblem, ommToElementSet } from './fields.js';
import { MAX_RECORD_CHARS, overlongReason, rejection, type ParseResult } from '../result.js';


interface Span {
  start: number;
  end: number;
  line: number;
}

/** Splits a JSON array (or single value) into top-level element spans; null if unbalanced. */
function topLevelSpans(text: string): { spans: Span[]; error: { line: number; what: string } | null } {
  const spans: Span[] = [];
  let depth = 0;
  let inString = false;
  let line = 1;
  let elemStart = -1;
  let elemLine = 1;
  let arrayTop = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '\n') line++;
    if (inString) {
      if (c === '\\') i++;
      else if (c === '"') inString = false;
      continue;
    }
    if (c === '"') inString = true;
    if (depth === 0 && c === '[' && spans.length === 0 && elemStart < 0) {
      arrayTop = true;
      depth = 1;
      continue;
    }
    if (c === ' ' || c === '\n' || c === '\r' || c === '\t') continue;
    const topLevel = depth === (arrayTop ? 1 : 0);
    if (topLevel && (c === ',' || c === ']')) {
      if (elemStart >= 0) spans.push({ start: elemStart, end: i, line: elemLine });
      elemStart = -1;
      if (c === ']') {
        depth = 0;
        arrayTop = false;
      }
      continue;
    }
    if (topLevel && elemStart < 0) {
      elemStart = i;
      elemLine = line;
    }
    if (c === '{' || c === '[') depth++;
    else if (c === '}' || c === ']') {
      depth--;
      if (depth < 0) return { spans, error: { line, what: `unexpected '${c}'` } };
      if (!arrayTop && depth === 0 && elemStart >= 0) {
        spans.push({ start: elemStart, end: i + 1, line: elemLine });
        elemStart = -1;
      }
    }
  }
  if (depth !== 0 || inString)
    return { spans, error: { line, what: inString ? 'a string is not closed' : 'a bracket or brace is not closed' } };
  return { spans, error: null };
}

export function parseOmmJson(text: string, file: string): ParseResult {
  const sets: ElementSet[] = [];
  const rejections: Rejection[] = [];
  const { spans, error } = topLevelSpans(text);
  if (error)
    rejections.push(
      rejection('JSON_SYNTAX', file, error.line, `JSON syntax error: ${error.what}; fix the JSON or re-download the file`),
    );
  for (const s of spans) {
    if (s.end - s.start > MAX_RECORD_CHARS) {
      rejections.push(rejection('OMM_FIELD', file, s.line, overlongReason('the object starting here', s.end - s.start)));
      continue;
    }
    let obj: unknown;
    try {
      obj = JSON.parse(text.slice(s.start, s.end));
    } catch (e) {
      rejections.push(
        rejection(
          'JSON_SYNTAX',
          file,
          s.line,
          `JSON syntax error in the object starting here: ${(e as Error).message}; fix the object or re-download the file`,
        ),
      );
      continue;
    }
    if (typeof obj !== 'object' || obj === null || Array.isArray(obj)) {
      rejections.push(
        rejection('OMM_FIELD', file, s.line, 'expected an object of OMM keywords here; an OMM JSON file is an array of objects'),
      );
      continue;
    }
    const rec = obj as Record<string, unknown>;
    try {
      sets.push(
        ommToElementSet(
          (k) => {
            const v = rec[k];
            if (v === undefined || v === null) return undefined;
            return { value: typeof v === 'number' ? v : String(v), line: s.line };
          },
          { file, line: s.line, format: 'OMM-JSON', requireHeader: false },
        ),
      );
    } catch (e) {
      if (!(e instanceof OmmProblem)) throw e;
      rejections.push(rejection(e.code, file, e.line, e.reason));
    }
  }
  return { sets, rejections };
}
