/**
 * Lexer for the XML form of the OEM (NDM/XML, CCSDS 505.0: oem > header, body > segment* >
 * metadata, data > stateVector*, covarianceMatrix*), alone or inside an <ndm>. fast-xml-parser
 * does the parsing, as for CDM and OMM. The header and each segment are parsed on their own, so a
 * syntax error inside one segment costs that segment only: the others still load.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import type { Rejection } from '../../errors.js';
import { childrenOf, isElement, LineFinder, tagOf, textOf, type XNode } from '../cdm/xml.js';
import { COVARIANCE_TERMS, STATE_ELEMENTS } from './keywords.js';
import { emptySegment, type RawEntry, type RawOem, type RawSegment, type RawValue } from './raw.js';

const parser = new XMLParser({
  preserveOrder: true, ignoreAttributes: false, attributeNamePrefix: '',
  parseTagValue: false, parseAttributeValue: false, trimValues: true,
});

/** Comments and CDATA blanked (newlines kept) so tag searches cannot match inside them. */
const blankOut = (text: string): string =>
  text.replace(/<!--[\s\S]*?-->|<!\[CDATA\[[\s\S]*?\]\]>/g, (m) => m.replace(/[^\n]/g, ' '));

class Lines {
  private readonly starts: number[] = [0];
  constructor(text: string) {
    for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) this.starts.push(i + 1);
  }
  /** 1-based line of a character offset. */
  of(offset: number): number {
    let lo = 0, hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid]! <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  }
}

interface Chunk {
  readonly text: string;
  /** File line of the chunk's first character. */
  readonly line: number;
}

export interface XmlLexResult {
  /** null when the file holds no <oem> at all. */
  readonly raw: RawOem | null;
  readonly rejections: Rejection[];
}

const COV_ELEMENT_INDEX = new Map(COVARIANCE_TERMS.map((t, i) => [t.element, i] as const));

export function lexOemXml(text: string, file: string): XmlLexResult {
  const rejections: Rejection[] = [];
  const reject = (code: Rejection['code'], line: number, reason: string): void => {
    rejections.push({ code, file, line, reason });
  };
  const lines = new Lines(text);
  const masked = blankOut(text);
  const open = /<oem(?=[\s>/])[^>]*>/.exec(masked);
  const whole = XMLValidator.validate(text);
  if (!open) {
    const v = whole === true ? null : whole.err;
    reject(v ? 'XML_SYNTAX' : 'OEM_STRUCTURE', v?.line ?? 1,
      v ? `XML syntax error at column ${v.col}: ${v.msg.replace(/\.$/, '')}; fix the XML (the file was not imported)`
        : 'the XML holds no <oem> element: it is not an OEM; check the file chosen');
    return { raw: null, rejections };
  }
  const headerLine = lines.of(open.index);
  const raw: RawOem = { headerLine, header: [], headerComments: [], segments: [] };
  const version = /\bversion\s*=\s*["']([^"']*)["']/.exec(open[0])?.[1];
  if (version !== undefined) raw.header.push({ keyword: 'CCSDS_OEM_VERS', value: version, line: headerLine });
  let reported = false;

  /** Parses one chunk, or reports its syntax error (lines shifted to the file's) and returns null. */
  const parse = (chunk: Chunk, what: string): XNode | null => {
    const v = XMLValidator.validate(chunk.text);
    if (v !== true) {
      const shift = chunk.line - 1;
      const msg = v.err.msg.replace(/\.$/, '').replace(/\bline (\d+)/g, (_m, n: string) => `line ${Number(n) + shift}`);
      reject('XML_SYNTAX', v.err.line + shift, `XML syntax error at column ${v.err.col}: ${msg} — ${what}; fix the XML`);
      reported = true;
      return null;
    }
    return (parser.parse(chunk.text) as XNode[]).find(isElement) ?? null;
  };
  const chunkAt = (start: number, closeRe: RegExp): Chunk => {
    closeRe.lastIndex = start;
    const close = closeRe.exec(masked);
    return { text: text.slice(start, close ? close.index + close[0].length : text.length), line: lines.of(start) };
  };

  const headerStart = masked.slice(open.index).search(/<header(?=[\s>/])/);
  if (headerStart >= 0) {
    const chunk = chunkAt(open.index + headerStart, /<\/header\s*>/g);
    const node = parse(chunk, 'the header could not be read');
    if (node) {
      const finder = new LineFinder(chunk.text);
      finder.next('header');
      for (const child of childrenOf(node).filter(isElement)) {
        const tag = tagOf(child)!;
        const line = finder.next(tag) + chunk.line - 1;
        if (tag === 'COMMENT') raw.headerComments.push(textOf(child).trim());
        else raw.header.push({ keyword: tag, value: textOf(child), line });
      }
    }
  }

  for (const m of masked.matchAll(/<segment(?=[\s>/])/g)) {
    const chunk = chunkAt(m.index, /<\/segment\s*>/g);
    const node = parse(chunk, 'this segment is skipped, the others still load');
    if (node) raw.segments.push(readSegment(node, chunk, reject));
  }
  if (whole !== true && !reported)
    reject('XML_SYNTAX', whole.err.line, `XML syntax error at column ${whole.err.col}: ${whole.err.msg.replace(/\.$/, '')}; fix the XML`);
  if (/<oem(?=[\s>/])/.test(masked.slice(open.index + open[0].length)))
    reject('OEM_STRUCTURE', lines.of(masked.indexOf('<oem', open.index + 1)),
      'a second <oem> in one file; only the first is read — give each OEM its own file');
  return { raw, rejections };
}

type Reject = (code: Rejection['code'], line: number, reason: string) => void;

function readSegment(node: XNode, chunk: Chunk, reject: Reject): RawSegment {
  const finder = new LineFinder(chunk.text);
  const at = (tag: string): number => finder.next(tag) + chunk.line - 1;
  const seg = emptySegment(at('segment'));
  for (const part of childrenOf(node).filter(isElement)) {
    const tag = tagOf(part)!;
    const line = at(tag);
    if (tag === 'metadata') {
      for (const child of childrenOf(part).filter(isElement)) {
        const k = tagOf(child)!;
        const l = at(k);
        if (k === 'COMMENT') seg.metadataComments.push(textOf(child).trim());
        else seg.metadata.push({ keyword: k, value: textOf(child), line: l });
      }
    } else if (tag === 'data') {
      for (const child of childrenOf(part).filter(isElement)) {
        const k = tagOf(child)!;
        const l = at(k);
        if (k === 'COMMENT') seg.dataComments.push(textOf(child).trim());
        else if (k === 'stateVector') readState(child, l, seg, at, reject);
        else if (k === 'covarianceMatrix') readCovariance(child, l, seg, at, reject);
        else reject('OEM_STRUCTURE', l, `unexpected <${k}> in <data>; expected <stateVector> and <covarianceMatrix> — it is ignored`);
      }
    } else reject('OEM_STRUCTURE', line, `unexpected <${tag}> in <segment>; expected <metadata> and <data> — it is ignored`);
  }
  return seg;
}

const valueOf = (n: XNode): RawValue => ({ text: textOf(n), unit: n[':@']?.['units'] });

function readState(node: XNode, line: number, seg: RawSegment, at: (t: string) => number, reject: Reject): void {
  const kids = childrenOf(node).filter(isElement);
  const tags = kids.map((k) => tagOf(k)!);
  for (const t of tags) at(t);
  const expected = ['EPOCH', ...STATE_ELEMENTS];
  const n = tags.length;
  if ((n !== 7 && n !== 10) || tags.some((t, i) => t !== expected[i])) {
    reject('OEM_FIELD', line,
      `<stateVector> holds ${tags.map((t) => `<${t}>`).join(' ') || 'nothing'}; expected <EPOCH>, <X> … <Z_DOT> ` +
      'and optionally <X_DDOT> … <Z_DDOT>, in that order — this state is skipped');
    return;
  }
  seg.states.push({ line, epoch: textOf(kids[0]!), values: kids.slice(1).map(valueOf) });
}

function readCovariance(node: XNode, line: number, seg: RawSegment, at: (t: string) => number, reject: Reject): void {
  const entries: RawEntry[] = [];
  const comments: string[] = [];
  const terms: (RawValue | undefined)[] = new Array(COVARIANCE_TERMS.length).fill(undefined);
  const unknown: string[] = [];
  for (const child of childrenOf(node).filter(isElement)) {
    const k = tagOf(child)!;
    const l = at(k);
    const index = COV_ELEMENT_INDEX.get(k);
    if (k === 'COMMENT') comments.push(textOf(child).trim());
    else if (k === 'EPOCH' || k === 'COV_REF_FRAME') entries.push({ keyword: k, value: textOf(child), line: l });
    else if (index !== undefined && terms[index] === undefined) terms[index] = valueOf(child);
    else unknown.push(k);
  }
  const missing = COVARIANCE_TERMS.filter((_, i) => terms[i] === undefined).map((t) => t.element);
  if (missing.length > 0 || unknown.length > 0) {
    reject('OEM_COVARIANCE', line,
      `<covarianceMatrix> has ${COVARIANCE_TERMS.length - missing.length} of the 21 terms` +
      (missing.length > 0 ? `; missing ${missing.join(', ')}` : '') +
      (unknown.length > 0 ? `; unexpected or repeated ${unknown.join(', ')}` : '') +
      ' — this covariance is skipped, the states still load');
    return;
  }
  seg.covariances.push({ line, entries, terms: terms as RawValue[], comments });
}
