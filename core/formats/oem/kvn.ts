/**
 * Lexer for the KVN form of the OEM (CCSDS 502.0-B-2 §5, §7): header keywords, then segments of
 * META_START … META_STOP, data lines, and optional COVARIANCE_START … COVARIANCE_STOP blocks.
 * It only splits the text; values are checked in read.ts. A structural fault costs as little as
 * possible: a stray line is rejected alone, a covariance block with the wrong number of terms is
 * rejected alone, a segment whose metadata block never closes is rejected alone.
 */
import type { Rejection } from '../../errors.js';
import { splitLines } from '../result.js';
import { COV_DIMENSION } from './keywords.js';
import { emptySegment, type RawCovariance, type RawEntry, type RawOem, type RawSegment, type RawValue } from './raw.js';

const PAIR_RE = /^([A-Z][A-Z0-9_]*)\s*=\s*(.*?)\s*$/;
const COMMENT_RE = /^COMMENT(?:\s+(.*?))?\s*$/;
const UNIT_ONLY_RE = /^\[([^\]]*)\]$/;
const VALUE_UNIT_RE = /^(.+?)\[([^\]]*)\]$/;

type Place = 'header' | 'meta' | 'data' | 'covariance' | 'closed';

interface OpenCovariance {
  line: number;
  entries: RawEntry[];
  rows: { line: number; values: RawValue[] }[];
  comments: string[];
}

export interface KvnLexResult {
  readonly raw: RawOem;
  readonly rejections: Rejection[];
}

/**
 * Splits a data or covariance line into values; a "[unit]" token (or a value ending in one)
 * belongs to the value before it. Returns a reason instead when a unit stands alone.
 */
export function splitValues(text: string): RawValue[] | string {
  const out: { text: string; unit: string | undefined }[] = [];
  if (text.trim() === '') return out;
  for (const token of text.trim().split(/\s+/)) {
    const alone = UNIT_ONLY_RE.exec(token);
    if (alone) {
      const prev = out.at(-1);
      if (!prev || prev.unit !== undefined) return `unit [${alone[1]}] follows no value`;
      prev.unit = alone[1]!.trim();
      continue;
    }
    const joined = VALUE_UNIT_RE.exec(token);
    out.push(joined ? { text: joined[1]!, unit: joined[2]!.trim() } : { text: token, unit: undefined });
  }
  return out;
}

export function lexOemKvn(text: string, file: string): KvnLexResult {
  const rejections: Rejection[] = [];
  const reject = (code: Rejection['code'], line: number, reason: string): void => {
    rejections.push({ code, file, line, reason });
  };
  const raw: RawOem = { headerLine: 1, header: [], headerComments: [], segments: [] };
  let place: Place = 'header';
  let seg: RawSegment | null = null;
  let cov: OpenCovariance | null = null;
  let covBlockLine = 0;
  let pendingCov: string[] = [];
  let sawHeaderLine = false;

  /** Ends the open covariance matrix: kept when it has exactly rows of 1, 2, …, 6 terms. */
  const closeMatrix = (): void => {
    if (!cov || !seg) return;
    const c = cov;
    cov = null;
    const bad = c.rows.findIndex((r, i) => r.values.length !== i + 1);
    if (c.rows.length !== COV_DIMENSION || bad >= 0) {
      const row = bad >= 0 ? c.rows[bad]! : undefined;
      reject('OEM_COVARIANCE', row?.line ?? c.line,
        (row
          ? `covariance row ${bad + 1} has ${row.values.length} value${row.values.length === 1 ? '' : 's'}, expected ${bad + 1}`
          : `covariance of EPOCH at line ${c.line} has ${c.rows.length} rows, expected ${COV_DIMENSION}`) +
        ' (the lower triangle of the 6×6 matrix: 1, 2, …, 6 values per row, 21 in all); ' +
        'this covariance is skipped, the states still load — correct the matrix to use it');
      return;
    }
    const m: RawCovariance = { line: c.line, entries: c.entries, terms: c.rows.flatMap((r) => r.values), comments: c.comments };
    seg.covariances.push(m);
  };

  const closeSegment = (line: number): void => {
    if (place === 'meta' && seg) {
      reject('OEM_STRUCTURE', seg.line,
        `META_START has no META_STOP before line ${line}; this segment is skipped — add META_STOP after its metadata`);
      raw.segments.pop();
    }
    if (place === 'covariance') {
      closeMatrix();
      seg?.dataComments.push(...pendingCov);
      pendingCov = [];
      reject('OEM_STRUCTURE', covBlockLine,
        `COVARIANCE_START has no COVARIANCE_STOP before line ${line}; add COVARIANCE_STOP after the last matrix`);
    }
  };

  splitLines(text.replace(/^\uFEFF/, '')).forEach((rawLine, i) => {
    const line = i + 1;
    const t = rawLine.trim();
    if (t === '') return;
    const comment = COMMENT_RE.exec(t);
    if (comment) {
      const c = comment[1] ?? '';
      if (place === 'header') raw.headerComments.push(c);
      else if (place === 'meta') seg!.metadataComments.push(c);
      // A covariance COMMENT belongs to the matrix it precedes (or heads, before its rows).
      else if (place === 'covariance') (cov && cov.rows.length === 0 ? cov.comments : pendingCov).push(c);
      else seg!.dataComments.push(c);
      return;
    }
    if (!sawHeaderLine) {
      raw.headerLine = line;
      sawHeaderLine = true;
    }
    switch (t) {
      case 'META_START':
        closeSegment(line);
        seg = emptySegment(line);
        raw.segments.push(seg);
        place = 'meta';
        return;
      case 'META_STOP':
        if (place === 'meta') place = 'data';
        else reject('OEM_STRUCTURE', line, 'META_STOP without a META_START before it; remove it or add the META_START');
        return;
      case 'COVARIANCE_START':
        if (place === 'data') {
          place = 'covariance';
          covBlockLine = line;
        } else reject('OEM_STRUCTURE', line, 'COVARIANCE_START outside a segment\'s data; it must follow the data lines of a segment');
        return;
      case 'COVARIANCE_STOP':
        if (place === 'covariance') {
          closeMatrix();
          seg!.dataComments.push(...pendingCov);
          pendingCov = [];
          place = 'closed';
        } else reject('OEM_STRUCTURE', line, 'COVARIANCE_STOP without a COVARIANCE_START before it; remove it');
        return;
    }
    const pair = PAIR_RE.exec(t);
    if (pair) {
      const entry: RawEntry = { keyword: pair[1]!, value: pair[2]!, line };
      if (place === 'header') raw.header.push(entry);
      else if (place === 'meta') seg!.metadata.push(entry);
      else if (place === 'covariance') {
        if (entry.keyword === 'EPOCH') {
          closeMatrix();
          cov = { line, entries: [entry], rows: [], comments: pendingCov };
          pendingCov = [];
        } else if (entry.keyword === 'COV_REF_FRAME' && cov && cov.rows.length === 0) cov.entries.push(entry);
        else
          reject('OEM_STRUCTURE', line,
            `${entry.keyword} is not expected here; a covariance matrix is EPOCH = …, optional COV_REF_FRAME = …, then 6 rows of numbers`);
      } else
        reject('OEM_STRUCTURE', line,
          `${entry.keyword} = … inside the ephemeris data; keywords belong between META_START and META_STOP ` +
          '(a META_START line may be missing); this line is skipped');
      return;
    }
    // A line of numbers: an ephemeris data line or a covariance row.
    if (place === 'data') {
      const [epoch = '', ...rest] = t.split(/\s+/);
      const values = splitValues(rest.join(' '));
      if (typeof values === 'string')
        reject('OEM_FIELD', line, `data line: ${values}; write "epoch x y z x_dot y_dot z_dot" in km and km/s — this line is skipped`);
      else seg!.states.push({ line, epoch, values });
      return;
    }
    if (place === 'covariance' && cov) {
      const values = splitValues(t);
      if (typeof values === 'string') reject('OEM_COVARIANCE', line, `covariance row: ${values}`);
      else cov.rows.push({ line, values });
      return;
    }
    reject('OEM_STRUCTURE', line,
      place === 'covariance'
        ? 'covariance values before the matrix\'s EPOCH = … line; start each matrix with EPOCH'
        : place === 'closed'
          ? 'data after COVARIANCE_STOP; a new segment must start with META_START — this line is skipped'
          : `line ${JSON.stringify(t.slice(0, 60))} is neither "KEYWORD = value" nor "COMMENT …"; correct or remove it`);
  });
  closeSegment(splitLines(text).length + 1);
  return { raw, rejections };
}
