/**
 * Writes a Cdm as KVN (CCSDS 508.0-B-1 section 4) in the standard's keyword order, with units in
 * brackets, every COMMENT and every extra keyword, so that reading the text back gives the same
 * model. Numbers are printed with the shortest text that reads back to the same double.
 */
import { COV_TERMS, specsOf, type CdmBlock, type CdmKeywordSpec } from './keywords.js';
import type { Cdm, CdmBlockInfo, CdmObject } from './model.js';
import type { Instant } from '../../time/instant.js';
import { formatCcsdsTime, formatCdmNumber } from './values.js';

const WIDTH = 28; // longest keyword, COLLISION_PROBABILITY_METHOD, is 28 characters

const line = (keyword: string, value: string, unit?: string): string =>
  `${keyword.padEnd(WIDTH)} = ${value}${unit ? ` [${unit}]` : ''}`;

function valueText(spec: CdmKeywordSpec, v: unknown): string {
  switch (spec.kind) {
    case 'number':
      return formatCdmNumber(v as number);
    case 'integer':
      return String(v);
    case 'time':
      return formatCcsdsTime(v as Instant);
    default:
      return String(v);
  }
}

function writeBlock(out: string[], block: CdmBlock, info: CdmBlockInfo, skip: ReadonlySet<string> = new Set()): void {
  for (const c of info.comments) out.push(`COMMENT ${c}`);
  const values = info as unknown as Record<string, unknown>;
  for (const spec of specsOf(block)) {
    if (skip.has(spec.keyword)) continue;
    const v = values[spec.prop];
    if (v !== undefined) out.push(line(spec.keyword, valueText(spec, v), spec.unit));
  }
  writeExtras(out, info);
}

function writeExtras(out: string[], info: CdmBlockInfo): void {
  for (const [kw, e] of Object.entries(info.extras)) out.push(line(kw, e.value, e.unit));
}

function writeObject(out: string[], o: CdmObject): void {
  writeBlock(out, 'metadata', o.metadata);
  for (const c of o.dataComments) out.push(`COMMENT ${c}`);
  writeBlock(out, 'od', o.od);
  writeBlock(out, 'additional', o.additional);
  for (const c of o.state.comments) out.push(`COMMENT ${c}`);
  const [x, y, z] = o.state.r;
  const [vx, vy, vz] = o.state.v;
  const sv: [string, number][] = [['X', x], ['Y', y], ['Z', z], ['X_DOT', vx], ['Y_DOT', vy], ['Z_DOT', vz]];
  for (const [kw, v] of sv) out.push(line(kw, formatCdmNumber(v), kw.endsWith('_DOT') ? 'km/s' : 'km'));
  writeExtras(out, o.state);
  const cov = o.covariance;
  for (const c of cov.comments) out.push(`COMMENT ${c}`);
  for (const t of COV_TERMS)
    if (t.row < cov.dimension) out.push(line(t.keyword, formatCdmNumber(cov.matrix[t.row]![t.col]!), t.unit));
  writeExtras(out, cov);
}

export function formatCdmKvn(cdm: Cdm): string {
  const out: string[] = [];
  // The version line must come first, before any header COMMENT (CCSDS 508.0-B-1 4.1).
  out.push(line('CCSDS_CDM_VERS', cdm.header.ccsdsCdmVers));
  writeBlock(out, 'header', cdm.header, new Set(['CCSDS_CDM_VERS']));
  writeBlock(out, 'relative', cdm.relative);
  writeObject(out, cdm.object1);
  writeObject(out, cdm.object2);
  return out.join('\n') + '\n';
}
