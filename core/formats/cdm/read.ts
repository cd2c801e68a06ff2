/**
 * Entry point for reading a CDM file whatever its syntax: KVN or XML is decided from the first
 * significant character, so callers (import, tests) need not know which they hold.
 */
import type { CdmParseResult, CdmReadOptions } from './build.js';
import { CDM_KEYWORDS } from './keywords.js';
import { parseCdmKvn } from './kvn.js';
import { parseCdmXml } from './xml.js';

/**
 * A CDM file holds one message of a few kilobytes (the full CCSDS 508.0-B-1 example with every
 * optional block is 17 kB as KVN); 1 MiB is 60 times that. A larger file is refused unread: it
 * is not one CDM, and its comments or values would be kept in the database.
 */
export const MAX_CDM_BYTES = 1024 * 1024;

const refuse = (code: 'NOT_TEXT' | 'FORMAT_UNKNOWN' | 'INPUT_TOO_LARGE', file: string, line: number, reason: string): CdmParseResult =>
  ({ cdm: null, errors: [{ code, file, line, reason }], repairs: [] });

export function parseCdmFile(input: Uint8Array | string, file: string, opts: CdmReadOptions = {}): CdmParseResult {
  if (input.length > MAX_CDM_BYTES)
    return refuse('INPUT_TOO_LARGE', file, 1,
      `the file is ${input.length.toLocaleString('en-US')} ${typeof input === 'string' ? 'characters' : 'bytes'} long; a CDM is a few ` +
        `kilobytes (at most ${MAX_CDM_BYTES.toLocaleString('en-US')} bytes are read): this is not one CDM, or it is damaged`);
  let text: string;
  if (typeof input === 'string') text = input;
  else {
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(input);
    } catch {
      return refuse('NOT_TEXT', file, 1, 'file is not UTF-8 text; a CDM is a text file (KVN or XML)');
    }
  }
  const nul = text.indexOf('\0');
  if (nul >= 0)
    return refuse('NOT_TEXT', file, text.slice(0, nul).split('\n').length, 'file contains NUL bytes; a CDM is a text file (KVN or XML)');
  const body = text.replace(/^\uFEFF/, '');
  const start = body.trimStart();
  if (start.startsWith('<')) return parseCdmXml(body, file, opts);
  // Any CDM keyword first means KVN, even without the version line: the KVN reader then names
  // what is missing instead of a vague "unknown format".
  const firstKeyword = /^\s*([A-Z0-9_]+)\s*=/m.exec(body)?.[1];
  if ((firstKeyword && CDM_KEYWORDS.has(firstKeyword)) || /^\s*COMMENT\b/.test(start)) return parseCdmKvn(body, file, opts);
  return refuse('FORMAT_UNKNOWN', file, 1,
    `not a CDM: expected "CCSDS_CDM_VERS = …" (KVN) or "<cdm …>" (XML) at the start${firstKeyword ? `, found ${firstKeyword}` : ''}`);
}
