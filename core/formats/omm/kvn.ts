/**
 * OMM in Keyword = Value Notation (CCSDS 502.0-B-2 §4, §7). A file may hold several OMMs one
 * after another; each starts at its CCSDS_OMM_VERS line. Units in square brackets are optional.
 */
import type { ElementSet } from '../../elements/elementSet.js';
import type { Rejection } from '../../errors.js';
import { OmmProblem, ommToElementSet, type OmmField } from './fields.js';
import { MAX_RECORD_CHARS, overlongReason, rejection, splitLines, type ParseResult } from '../result.js';


const KVN_RE = /^([A-Z][A-Z0-9_]*)\s*=\s*(.*)$/;
const UNITS_RE = /^(.*?)\s*\[([^\]]*)\]$/;
/** Free-text values where a bracket is part of the text ("GOES 9 [P]"), never units. */
const TEXT_KEYS = new Set(['OBJECT_NAME', 'OBJECT_ID', 'ORIGINATOR', 'MESSAGE_ID']);

interface Block {
  start: number;
  fields: Map<string, OmmField>;
  problem: OmmProblem | null;
}

export function parseOmmKvn(text: string, file: string): ParseResult {
  const lines = splitLines(text);
  const blocks: Block[] = [];
  let cur: Block | null = null;

  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i] ?? '';
    const t = raw.trim();
    if (t === '' || t.startsWith('COMMENT')) continue;
    const lineNo = i + 1;
    if (raw.length > MAX_RECORD_CHARS) {
      // Not matched against KVN_RE: the OMM it is in is rejected with this reason.
      if (cur === null) {
        cur = { start: lineNo, fields: new Map(), problem: null };
        blocks.push(cur);
      }
      cur.problem ??= new OmmProblem('OMM_FIELD', lineNo, overlongReason('this line', raw.length));
      continue;
    }
    const m = KVN_RE.exec(t);
    if (m && m[1] === 'CCSDS_OMM_VERS') {
      cur = { start: lineNo, fields: new Map(), problem: null };
      blocks.push(cur);
    }
    if (cur === null) {
      cur = { start: lineNo, fields: new Map(), problem: null };
      blocks.push(cur);
    }
    if (cur.problem) continue;
    if (!m) {
      cur.problem = new OmmProblem(
        'OMM_FIELD',
        lineNo,
        `line '${t.slice(0, 60)}' is not 'KEYWORD = value': fix or remove the line ` +
          '(comments must start with COMMENT)',
      );
      continue;
    }
    const key = m[1] ?? '';
    let value = (m[2] ?? '').trim();
    let units: string | undefined;
    const u = TEXT_KEYS.has(key) ? null : UNITS_RE.exec(value);
    if (u) {
      value = u[1] ?? '';
      units = u[2];
    }
    if (cur.fields.has(key)) {
      cur.problem = new OmmProblem(
        'OMM_FIELD',
        lineNo,
        `${key} appears twice in one OMM (first on line ${cur.fields.get(key)?.line}): ` +
          'a missing CCSDS_OMM_VERS line may have merged two messages; remove the duplicate',
      );
      continue;
    }
    cur.fields.set(key, { value, line: lineNo, units: units?.trim() });
  }

  const sets: ElementSet[] = [];
  const rejections: Rejection[] = [];
  for (const b of blocks) {
    try {
      if (b.problem) throw b.problem;
      sets.push(
        ommToElementSet((k) => b.fields.get(k), { file, line: b.start, format: 'OMM-KVN', requireHeader: true }),
      );
    } catch (e) {
      if (!(e instanceof OmmProblem)) throw e;
      rejections.push(rejection(e.code, file, e.line, e.reason));
    }
  }
  return { sets, rejections };
}
