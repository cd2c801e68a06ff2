/**
 * Reader for the KVN (keyword = value) form of the CDM, CCSDS 508.0-B-1 section 4.
 *
 * KVN has no section markers: the header runs until the first relative-data keyword, that block
 * until the first `OBJECT =` line, and each `OBJECT =` line opens an object. A COMMENT belongs to
 * the block of the keyword that follows it (the standard allows comments only at block starts).
 */
import type { Rejection } from '../../errors.js';
import { buildCdm, type CdmParseResult, type CdmReadOptions } from './build.js';
import { CDM_KEYWORDS, type CdmBlock } from './keywords.js';
import { emptySection, type RawComment, type RawEntry, type RawSection } from './raw.js';

const COMMENT_RE = /^\s*COMMENT(?:\s(.*))?$/;
const PAIR_RE = /^\s*([A-Z0-9_]+)\s*=(.*)$/;
const UNIT_RE = /^(.*?)\s*\[([^\]]*)\]\s*$/;

type Line = { kind: 'entry'; entry: RawEntry } | { kind: 'comment'; text: string; line: number };

function lex(text: string, file: string, errors: Rejection[]): Line[] {
  const out: Line[] = [];
  text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/).forEach((raw, i) => {
    const line = i + 1;
    if (raw.trim() === '') return;
    const c = COMMENT_RE.exec(raw);
    if (c) {
      out.push({ kind: 'comment', text: (c[1] ?? '').trim(), line });
      return;
    }
    const p = PAIR_RE.exec(raw);
    if (!p) {
      errors.push({
        code: 'CDM_FIELD', file, line,
        reason: `line is neither "KEYWORD = value" nor "COMMENT …" (${JSON.stringify(raw.trim().slice(0, 60))}); correct or remove it`,
      });
      return;
    }
    const rest = p[2]!;
    const u = UNIT_RE.exec(rest);
    out.push({
      kind: 'entry',
      entry: { keyword: p[1]!, value: (u ? u[1]! : rest).trim(), unit: u ? u[2]!.trim() : undefined, line },
    });
  });
  return out;
}

export function parseCdmKvn(text: string, file: string, opts: CdmReadOptions = {}): CdmParseResult {
  const errors: Rejection[] = [];
  const lines = lex(text, file, errors);
  const firstEntry = lines.find((l) => l.kind === 'entry');
  if (!firstEntry)
    return {
      cdm: null, repairs: [],
      errors: [...errors, { code: 'FILE_EMPTY', file, line: 1, reason: 'no CDM keywords found; the file must start with CCSDS_CDM_VERS = 1.0' }],
    };

  const header = emptySection(firstEntry.entry.line);
  let relative: RawSection | null = null;
  const objects: RawSection[] = [];
  let current: RawSection = header;
  let currentBlock: CdmBlock = 'header';
  let pending: { text: string; line: number }[] = [];
  const flush = (place: CdmBlock): void => {
    for (const c of pending) current.comments.push({ ...c, place } satisfies RawComment);
    pending = [];
  };

  for (const l of lines) {
    if (l.kind === 'comment') {
      pending.push({ text: l.text, line: l.line });
      continue;
    }
    const e = l.entry;
    const block = CDM_KEYWORDS.get(e.keyword)?.block;
    if (e.keyword === 'CCSDS_CDM_VERS' && current !== header) {
      errors.push({
        code: 'CDM_STRUCTURE', file, line: e.line,
        reason: 'a second CDM begins here; a file may hold one CDM, so split the file into one message per file',
      });
      break;
    }
    if (e.keyword === 'OBJECT') {
      current = emptySection(e.line);
      objects.push(current);
      currentBlock = 'metadata';
    } else if (objects.length > 0) {
      currentBlock = block ?? currentBlock;
    } else if (block === 'relative' && current === header) {
      relative = emptySection(e.line);
      current = relative;
      currentBlock = 'relative';
    } else if (block !== undefined && block !== 'header' && block !== 'relative') {
      errors.push({
        code: 'CDM_STRUCTURE', file, line: e.line,
        reason: `${e.keyword} appears before any "OBJECT = OBJECT1" line; object data must follow its OBJECT line`,
      });
      continue;
    }
    flush(currentBlock);
    current.entries.push(e);
  }
  flush(currentBlock);

  const built = buildCdm(
    { header, relative: relative ?? emptySection(objects[0]?.startLine ?? header.startLine), objects },
    file, opts,
  );
  if (errors.length === 0) return built;
  return { cdm: null, errors: [...errors, ...built.errors].sort((a, b) => a.line - b.line), repairs: [] };
}
