/**
 * Reader for the XML form of the CDM (CCSDS 508.0-B-1 section 5, NDM/XML schema layout:
 * cdm > header, body > relativeMetadataData, segment × 2 > metadata, data > odParameters,
 * additionalParameters, stateVector, covarianceMatrix). Syntax is checked by fast-xml-parser's
 * validator first, so a broken file gets the parser's line number and no message at all.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import type { Rejection } from '../../errors.js';
import { buildCdm, type CdmParseResult, type CdmReadOptions } from './build.js';
import type { CdmBlock } from './keywords.js';
import { emptySection, type RawCommentPlace, type RawSection } from './raw.js';

export type XNode = Record<string, unknown> & { ':@'?: Record<string, string> };

export const tagOf = (n: XNode): string | undefined => Object.keys(n).find((k) => k !== ':@');
export const childrenOf = (n: XNode): XNode[] => (n[tagOf(n)!] as XNode[] | undefined) ?? [];
export const isElement = (n: XNode): boolean => {
  const t = tagOf(n);
  return t !== undefined && t !== '#text' && !t.startsWith('?') && t !== '#comment';
};
export const textOf = (n: XNode): string =>
  childrenOf(n).map((c) => (typeof c['#text'] === 'string' ? c['#text'] : '')).join('');

/** Containers inside a segment and the block their leaves belong to. */
const CONTAINER_PLACE: Record<string, RawCommentPlace> = {
  metadata: 'metadata', data: 'data', odParameters: 'od', additionalParameters: 'additional',
  stateVector: 'state', covarianceMatrix: 'covariance',
};

/**
 * Finds each element's line: start tags appear in the text in the same order as a pre-order
 * walk visits elements, so one forward cursor suffices. Comments, CDATA and processing
 * instructions are blanked first (newlines kept) so a tag name inside them cannot match.
 */
export class LineFinder {
  private cursor = 0;
  private readonly masked: string;
  private readonly starts: number[] = [0];
  constructor(text: string) {
    this.masked = text.replace(/<!--[\s\S]*?-->|<!\[CDATA\[[\s\S]*?\]\]>|<\?[\s\S]*?\?>/g, (m) => m.replace(/[^\n]/g, ' '));
    for (let i = 0; i < text.length; i++) if (text[i] === '\n') this.starts.push(i + 1);
  }
  next(tag: string): number {
    const re = new RegExp(`<${tag.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?=[\\s/>])`, 'g');
    re.lastIndex = this.cursor;
    const m = re.exec(this.masked);
    const at = m ? m.index : this.cursor;
    this.cursor = m ? at + 1 : this.cursor;
    let lo = 0, hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid]! <= at) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  }
}

export function parseCdmXml(text: string, file: string, opts: CdmReadOptions = {}): CdmParseResult {
  const refuse = (r: Rejection): CdmParseResult => ({ cdm: null, errors: [r], repairs: [] });
  const valid = XMLValidator.validate(text);
  if (valid !== true)
    return refuse({
      code: 'XML_SYNTAX', file, line: valid.err.line,
      reason: `XML syntax error at column ${valid.err.col}: ${valid.err.msg.replace(/\.$/, '')}; fix the XML (the file was not imported)`,
    });
  const doc = new XMLParser({
    preserveOrder: true, ignoreAttributes: false, attributeNamePrefix: '',
    parseTagValue: false, parseAttributeValue: false, trimValues: true,
  }).parse(text) as XNode[];

  const lines = new LineFinder(text);
  const errors: Rejection[] = [];
  const root = doc.find(isElement);
  if (!root || tagOf(root) !== 'cdm')
    return refuse({
      code: 'CDM_STRUCTURE', file, line: root ? lines.next(tagOf(root)!) : 1,
      reason: `root element is <${root ? tagOf(root) : ''}>, expected <cdm>; this is not an XML CDM`,
    });

  const rootLine = lines.next('cdm');
  const header = emptySection(rootLine);
  const version = root[':@']?.['version'];
  if (version !== undefined) header.entries.push({ keyword: 'CCSDS_CDM_VERS', value: version, unit: undefined, line: rootLine });
  let relative: RawSection | null = null;
  const objects: RawSection[] = [];

  /** Adds the leaves under `node` to `section`, descending through containers. */
  const collect = (node: XNode, section: RawSection, place: RawCommentPlace): void => {
    for (const child of childrenOf(node).filter(isElement)) {
      const tag = tagOf(child)!;
      const line = lines.next(tag);
      if (tag in CONTAINER_PLACE || tag === 'relativeStateVector' || childrenOf(child).some(isElement)) {
        collect(child, section, CONTAINER_PLACE[tag] ?? place);
      } else if (tag === 'COMMENT') {
        section.comments.push({ text: textOf(child).trim(), place, line });
      } else {
        section.entries.push({
          keyword: tag, value: textOf(child), unit: child[':@']?.['units'], line,
          ...(place !== 'data' ? { place: place as CdmBlock } : {}),
        });
      }
    }
  };

  for (const part of childrenOf(root).filter(isElement)) {
    const tag = tagOf(part)!;
    const line = lines.next(tag);
    if (tag === 'header') collect(part, header, 'header');
    else if (tag === 'body') {
      for (const sec of childrenOf(part).filter(isElement)) {
        const name = tagOf(sec)!;
        const secLine = lines.next(name);
        if (name === 'relativeMetadataData') {
          relative = emptySection(secLine);
          collect(sec, relative, 'relative');
        } else if (name === 'segment') {
          const obj = emptySection(secLine);
          objects.push(obj);
          collect(sec, obj, 'metadata');
        } else errors.push({ code: 'CDM_STRUCTURE', file, line: secLine, reason: `unexpected <${name}> in <body>; expected <relativeMetadataData> and two <segment>` });
      }
    } else errors.push({ code: 'CDM_STRUCTURE', file, line, reason: `unexpected <${tag}> in <cdm>; expected <header> and <body>` });
  }

  const built = buildCdm({ header, relative: relative ?? emptySection(rootLine), objects }, file, opts);
  if (errors.length === 0) return built;
  return { cdm: null, errors: [...errors, ...built.errors].sort((a, b) => a.line - b.line), repairs: [] };
}
