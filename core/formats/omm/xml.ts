/**
 * OMM in XML (CCSDS 502.0-B-2 §8 / NDM/XML): a single <omm>, or an <ndm> holding many.
 * fast-xml-parser does the parsing; it reports no line numbers for elements, so each <omm>'s
 * line is found by scanning the text for its start tag (comments and CDATA blanked first).
 * A syntax error inside one <omm> of an <ndm> rejects that OMM only: each <omm> is then
 * parsed on its own.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import type { ElementSet } from '../../elements/elementSet.js';
import type { Rejection } from '../../errors.js';
import { OmmProblem, ommToElementSet, type OmmField } from './fields.js';
import { MAX_RECORD_CHARS, overlongReason, rejection, type ParseResult } from '../result.js';


const parser = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: '@_',
  parseTagValue: false, // keep numbers as text so the shared validation sees what was written
  parseAttributeValue: false,
  trimValues: true,
  removeNSPrefix: true,
  isArray: (name) => name === 'omm' || name === 'COMMENT',
});

/** Replaces comments and CDATA by blanks of the same length, keeping newlines (and offsets). */
const blankOut = (text: string): string =>
  text.replace(/<!--[\s\S]*?-->|<!\[CDATA\[[\s\S]*?\]\]>/g, (m) => m.replace(/[^\n]/g, ' '));

/** Above this many OMMs a valid file is parsed one OMM at a time (memory, see parseOmmXml). */
const CHUNKED_ABOVE = 1000;

const OMM_OPEN_RE = /<(?:[A-Za-z_][\w.-]*:)?omm(?=[\s>/])/g;

/** Offsets of line starts of the last text seen: a file is scanned once, not once per keyword. */
let cachedText: string | null = null;
let cachedStarts: number[] = [];

function lineAt(text: string, offset: number): number {
  if (text !== cachedText) {
    cachedText = text;
    cachedStarts = [0];
    for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) cachedStarts.push(i + 1);
  }
  // Binary search: the number of line starts at or before offset is the 1-based line.
  let lo = 0, hi = cachedStarts.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (cachedStarts[mid]! <= offset) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

type XmlNode = Record<string, unknown>;
const isNode = (v: unknown): v is XmlNode => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Collects leaf keyword elements (value, units) of the OMM's header/metadata/data blocks. */
function collect(node: XmlNode, out: Map<string, { value: string; units?: string | undefined }>): void {
  for (const [k, v] of Object.entries(node)) {
    if (k.startsWith('@_') || k === 'COMMENT' || k === '#text') continue;
    if (isNode(v) && ('#text' in v || Object.keys(v).every((a) => a.startsWith('@_')))) {
      const units = v['@_units'];
      out.set(k, { value: String(v['#text'] ?? ''), units: typeof units === 'string' ? units : undefined });
    } else if (isNode(v)) collect(v, out);
    else if (typeof v === 'string' || typeof v === 'number') out.set(k, { value: String(v) });
    // Repeated non-COMMENT elements (arrays) do not occur in an OMM; they are ignored.
  }
}

interface OmmAt {
  node: XmlNode;
  offset: number;
  /** where the next <omm> starts (or the text ends): keyword lookups stay inside this OMM */
  end: number;
}

function ommToSet(o: OmmAt, text: string, file: string): ElementSet {
  const line = lineAt(text, o.offset);
  const own = text.slice(o.offset, o.end);
  const fields = new Map<string, { value: string; units?: string | undefined }>();
  collect(o.node, fields);
  const version = o.node['@_version'];
  if (typeof version === 'string') fields.set('CCSDS_OMM_VERS', { value: version });
  const lineOfKey = (k: string): number => {
    // Searched inside this OMM only: an absent tag must not send the search through the rest
    // of the file (that made large files quadratic).
    const at = own.indexOf(`<${k}`);
    return at >= 0 ? lineAt(text, o.offset + at) : line;
  };
  const get = (k: string): OmmField | undefined => {
    const f = fields.get(k);
    return f === undefined ? undefined : { value: f.value, units: f.units, line: lineOfKey(k) };
  };
  return ommToElementSet(get, { file, line, format: 'OMM-XML', requireHeader: true });
}

function syntaxRejection(file: string, text: string, base: number, err: { msg: string; line: number; col: number }): Rejection {
  const offset = lineAt(text, base) - 1;
  const line = offset + err.line;
  // The validator counts lines from the start of the piece it was given; shift to file lines.
  const msg = err.msg.replace(/\bline (\d+)/g, (_m, n: string) => `line ${Number(n) + offset}`);
  return rejection(
    'XML_SYNTAX',
    file,
    line,
    `XML syntax error at line ${line} column ${err.col}: ${msg} — fix the XML (a validator or ` +
      'editor shows the spot) or re-export the file',
  );
}

export function parseOmmXml(text: string, file: string, chunkedAbove = CHUNKED_ABOVE): ParseResult {
  const scan = blankOut(text);
  const starts = [...scan.matchAll(OMM_OPEN_RE)].map((m) => m.index);
  const closeRe = /<\/(?:[A-Za-z_][\w.-]*:)?omm\s*>/g;
  const spans = starts.map((start) => {
    closeRe.lastIndex = start;
    const close = closeRe.exec(scan);
    return { start, end: close ? close.index + close[0].length : text.length };
  });
  const sets: ElementSet[] = [];
  const rejections: Rejection[] = [];
  const take = (o: OmmAt, src: string): void => {
    try {
      sets.push(ommToSet(o, src, file));
    } catch (e) {
      if (!(e instanceof OmmProblem)) throw e;
      rejections.push(rejection(e.code, file, e.line, e.reason));
    }
  };
  const noOmm = (): ParseResult => ({
    sets,
    rejections: [rejection('OMM_MISSING_KEYWORD', file, 1, 'the XML holds no <omm> element: it is not an OMM file; check the file chosen')],
  });
  /** An overlong <omm> is rejected unread: the XML parser's memory grows far beyond its size. */
  const overlong = (span: { start: number; end: number }): boolean => {
    if (span.end - span.start <= MAX_RECORD_CHARS) return false;
    rejections.push(rejection('OMM_FIELD', file, lineAt(text, span.start), overlongReason('this <omm> element', span.end - span.start)));
    return true;
  };
  const parseOne = (span: { start: number; end: number }, end: number): void => {
    const node = (parser.parse(text.slice(span.start, span.end)) as XmlNode)['omm'];
    const first = Array.isArray(node) ? (node[0] as unknown) : undefined;
    if (isNode(first)) take({ node: first, offset: span.start, end }, text);
  };

  const valid = XMLValidator.validate(text);
  const inside = spans.reduce((n, sp) => n + (sp.end - sp.start), 0);
  const oversized = spans.some((sp) => sp.end - sp.start > MAX_RECORD_CHARS) || text.length - inside > MAX_RECORD_CHARS;
  if (valid === true && starts.length === 0) return noOmm();
  if (valid === true && (starts.length > chunkedAbove || oversized)) {
    // A large catalogue (or one with an overlong part): one <omm> at a time, so the parsed tree
    // of the whole file (≈10× the text in memory, measured 1.67 GB for 155 MB) never exists at once.
    spans.forEach((span, k) => {
      if (!overlong(span)) parseOne(span, starts[k + 1] ?? text.length);
    });
    return { sets, rejections };
  }
  if (valid === true) {
    const doc = parser.parse(text) as XmlNode;
    const root = isNode(doc['ndm']) ? doc['ndm'] : doc;
    const omms = Array.isArray(root['omm']) ? (root['omm'] as unknown[]) : [];
    if (omms.length === 0) return noOmm();
    omms.forEach((n, k) => {
      if (isNode(n)) take({ node: n, offset: starts[k] ?? 0, end: starts[k + 1] ?? text.length }, text);
    });
    return { sets, rejections };
  }

  // Syntax error: retry each <omm>…</omm> on its own so the intact ones still import.
  let reported = false;
  for (const span of spans) {
    if (overlong(span)) continue;
    const v = XMLValidator.validate(text.slice(span.start, span.end));
    if (v !== true) {
      rejections.push(syntaxRejection(file, text, span.start, v.err));
      reported = true;
      continue;
    }
    parseOne(span, span.end);
  }
  if (!reported) rejections.push(syntaxRejection(file, text, 0, valid.err));
  return { sets, rejections };
}
