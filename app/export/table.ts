/**
 * Events as a CSV table (RFC 4180: comma-separated, CRLF line ends, fields with a comma, quote
 * or line break quoted, quotes doubled). One header row, then one row per event. Numbers keep
 * full precision (JavaScript's shortest round-trip text); times are ISO 8601 UTC with ms and Z;
 * an empty field is "no value" (no Pc, no volume entry at a window edge).
 */
import type { ConjunctionEvent } from '../../core/events/index.js';
import { toIso } from '../../core/time/instant.js';

type Cell = string | number | null;

/** Column name → value; names follow the JSON of DESIGN.md, RTN split in three. */
const COLUMNS: readonly (readonly [string, (e: ConjunctionEvent) => Cell])[] = [
  ['id', (e) => e.id],
  ['runId', (e) => e.runId],
  ['seriesId', (e) => e.seriesId ?? null],
  ['primary', (e) => e.primary],
  ['secondary', (e) => e.secondary],
  ['tca', (e) => toIso(e.tca)],
  ['missKm', (e) => e.missKm],
  ['relativeSpeedKmS', (e) => e.relativeSpeedKmS],
  ['rtnRKm', (e) => e.rtnKm[0]],
  ['rtnTKm', (e) => e.rtnKm[1]],
  ['rtnNKm', (e) => e.rtnKm[2]],
  ['approachAngleDeg', (e) => e.approachAngleDeg],
  ['pc', (e) => (e.risk && e.risk.pc !== null && Number.isFinite(e.risk.pc) ? e.risk.pc : null)],
  ['pcMethod', (e) => e.risk?.pcMethod ?? null],
  ['covarianceSource', (e) => e.risk?.covarianceSource ?? null],
  ['tier', (e) => e.risk?.tier ?? null],
  ['hardBodyRadiusM', (e) => e.risk?.hardBodyRadiusM ?? null],
  ['entry', (e) => (e.entry === null ? null : toIso(e.entry))],
  ['exit', (e) => (e.exit === null ? null : toIso(e.exit))],
  ['primaryEpoch', (e) => toIso(e.primaryEpoch)],
  ['secondaryEpoch', (e) => toIso(e.secondaryEpoch)],
];

export const CSV_COLUMNS: readonly string[] = COLUMNS.map(([name]) => name);

function cell(x: Cell): string {
  if (x === null) return '';
  const t = typeof x === 'number' ? String(x) : x;
  return /[",\r\n]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}

/** The CSV text, one row per event in the order given. */
export function eventsCsv(events: readonly ConjunctionEvent[]): string {
  const rows = [CSV_COLUMNS.map(cell).join(',')];
  for (const e of events) rows.push(COLUMNS.map(([, f]) => cell(f(e))).join(','));
  return rows.join('\r\n') + '\r\n';
}
