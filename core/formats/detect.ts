/**
 * One entry point for element files: decode the bytes, recognise the format by content (never
 * by extension: downloads are often named ".txt" whatever they hold), and run the reader.
 * CDM and OEM files are only recognised here; the caller routes them to their own importers.
 */
import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError, type Rejection } from '../errors.js';
import { parseOmmCsv, parseOmmJson, parseOmmKvn, parseOmmXml } from './omm/index.js';
import { decodeText } from './text.js';
import { parseTle } from './tle/index.js';

export type ElementFileFormat =
  | 'TLE'
  | 'OMM-KVN'
  | 'OMM-XML'
  | 'OMM-JSON'
  | 'OMM-CSV'
  | 'CDM-KVN'
  | 'CDM-XML'
  | 'OEM-KVN'
  | 'OEM-XML'
  | 'UNKNOWN';

export interface ElementFileResult {
  format: ElementFileFormat;
  sets: ElementSet[];
  rejections: Rejection[];
  fatal: KeepclearError | null;
}

/** The first line that says something: not blank, not a KVN COMMENT, not an XML declaration/comment. */
function firstMeaningfulLine(text: string): string {
  for (const l of text.split('\n')) {
    const t = l.trim();
    if (t === '' || t.startsWith('COMMENT') || t.startsWith('#')) continue;
    return t;
  }
  return '';
}

/** Root element name of an XML document, skipping the declaration, comments and DOCTYPE. */
function xmlRoot(text: string): string {
  const body = text.replace(/<\?[\s\S]*?\?>|<!--[\s\S]*?-->|<![A-Z][^>]*>/g, '');
  const m = /<\s*(?:[A-Za-z_][\w.-]*:)?([A-Za-z_][\w.-]*)/.exec(body);
  return m?.[1]?.toLowerCase() ?? '';
}

/** In an <ndm> container, the kind of message it holds (first child message element). */
function ndmContent(text: string): string {
  const m = /<\s*(?:[A-Za-z_][\w.-]*:)?(omm|cdm|oem|opm)(?=[\s>/])/i.exec(text);
  return m?.[1]?.toLowerCase() ?? '';
}

export function detectFormat(text: string): ElementFileFormat {
  const first = firstMeaningfulLine(text);
  if (/^CCSDS_OMM_VERS\s*=/.test(first)) return 'OMM-KVN';
  if (/^CCSDS_CDM_VERS\s*=/.test(first)) return 'CDM-KVN';
  if (/^CCSDS_OEM_VERS\s*=/.test(first)) return 'OEM-KVN';
  if (first.startsWith('<')) {
    const root = xmlRoot(text);
    const kind = root === 'ndm' ? ndmContent(text) : root;
    if (kind === 'omm') return 'OMM-XML';
    if (kind === 'cdm') return 'CDM-XML';
    if (kind === 'oem') return 'OEM-XML';
    return 'UNKNOWN';
  }
  if (first.startsWith('[') || first.startsWith('{')) return 'OMM-JSON';
  if (/^"?(OBJECT_NAME|NORAD_CAT_ID|OBJECT_ID|CCSDS_OMM_VERS)"?\s*,/i.test(first) || /,\s*"?(NORAD_CAT_ID|OBJECT_NAME)"?\s*(,|$)/i.test(first))
    return 'OMM-CSV';
  // TLE: a "1 " line followed by a "2 " line among the first lines (a name line may come first).
  const lines = text.split('\n').filter((l) => l.trim() !== '' && !l.startsWith('#')).slice(0, 6);
  for (let i = 0; i + 1 < lines.length; i++)
    if (/^1\s/.test(lines[i] ?? '') && /^2\s/.test(lines[i + 1] ?? '')) return 'TLE';
  return 'UNKNOWN';
}

export function parseElementFile(bytes: Uint8Array, file: string): ElementFileResult {
  const decoded = decodeText(bytes, file);
  if ('error' in decoded) return { format: 'UNKNOWN', sets: [], rejections: [], fatal: decoded.error };
  const { text } = decoded;
  const format = detectFormat(text);
  const none = { sets: [], rejections: [], fatal: null };
  switch (format) {
    case 'TLE':
      return { format, ...parseTle(text, file), fatal: null };
    case 'OMM-KVN':
      return { format, ...parseOmmKvn(text, file), fatal: null };
    case 'OMM-XML':
      return { format, ...parseOmmXml(text, file), fatal: null };
    case 'OMM-JSON':
      return { format, ...parseOmmJson(text, file), fatal: null };
    case 'OMM-CSV':
      return { format, ...parseOmmCsv(text, file), fatal: null };
    case 'CDM-KVN':
    case 'CDM-XML':
    case 'OEM-KVN':
    case 'OEM-XML':
      return { format, ...none };
    case 'UNKNOWN':
      return {
        format,
        ...none,
        fatal: new KeepclearError(
          'FORMAT_UNKNOWN',
          `not a recognised element file (starts with '${firstMeaningfulLine(text).slice(0, 40)}'): ` +
            'expected TLE, CCSDS OMM (KVN, XML, JSON, CSV), OEM or CDM; check the file chosen',
          { file, line: 1 },
        ),
      };
  }
}
