/**
 * CCSDS Orbit Ephemeris Message (502.0-B-2) in Keepclear: read (KVN or XML), check, load into
 * the TEME model, write KVN, sample a trajectory into an OEM, classify OBJECT_ID.
 *
 *   parseOemFile(bytes, file)  → { oem, rejections, notes, fatal }   (what the importer calls)
 *   readOemText(text, file)    → the message as written, before Keepclear's conversions
 */
import type { Rejection } from '../../errors.js';
import { decodeText } from '../text.js';
import { lexOemKvn } from './kvn.js';
import { loadOem, type OemParseResult } from './load.js';
import { readOemRaw, type OemReadResult } from './read.js';
import { lexOemXml } from './xml.js';

export type { OemParseResult, OemReadResult };
export type * from './model.js';
export type {
  OemMessage, OemMessageCovariance, OemMessageMetadata, OemMessageSegment, OemMessageState, ScaleTime,
} from './message.js';
export type { OemCovarianceFrame, OemInterpolationMethod, OemStateFrame, OemTimeSystem } from './keywords.js';
export { loadOem } from './load.js';
export { formatOemKvn } from './write.js';
export { SAMPLED_INTERPOLATION, sampleOem, type OemSampleOptions, type SampledSpan } from './sample.js';
export { classifyObjectId, type OemObjectRef } from './objectId.js';
export { fullCovariance, lowerTriangleOf, positionCovarianceRtnM2 } from './covariance.js';

/** The message as written, after the standard's checks (KVN or XML, decided by the first character). */
export function readOemText(text: string, file: string): OemReadResult {
  const body = text.replace(/^\uFEFF/, '');
  if (body.trimStart().startsWith('<')) {
    const lexed = lexOemXml(body, file);
    if (!lexed.raw) return { message: null, rejections: lexed.rejections, fatal: lexed.rejections[0] ?? null };
    return merge(lexed.rejections, readOemRaw(lexed.raw, file));
  }
  const lexed = lexOemKvn(body, file);
  return merge(lexed.rejections, readOemRaw(lexed.raw, file));
}

const merge = (lexer: readonly Rejection[], read: OemReadResult): OemReadResult => ({
  ...read,
  rejections: [...lexer, ...read.rejections].sort((a, b) => a.line - b.line),
});

/**
 * Reads an OEM file for use: the importer's entry (as parseCdmFile is for CDMs). Never throws for
 * problems of the file: a bad line, covariance block or segment is rejected alone; a file with
 * nothing usable comes back with `fatal` set and `oem` null.
 */
export function parseOemFile(input: Uint8Array | string, file: string): OemParseResult {
  let text: string;
  if (typeof input === 'string') text = input;
  else {
    const decoded = decodeText(input, file);
    if ('error' in decoded) {
      const e = decoded.error;
      const fatal: Rejection = { code: e.code, file, line: e.where?.line ?? 1, reason: e.message };
      return { oem: null, rejections: [fatal], notes: [], fatal };
    }
    text = decoded.text;
  }
  const read = readOemText(text, file);
  if (!read.message) {
    const fatal: Rejection = read.fatal ?? { code: 'OEM_STRUCTURE', file, line: 1, reason: 'not an OEM; nothing was imported' };
    return { oem: null, rejections: read.rejections.length > 0 ? read.rejections : [fatal], notes: [], fatal };
  }
  return loadOem(read.message, file, read.rejections);
}
