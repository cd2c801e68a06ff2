/** Text shown in the renderer: pure functions, no DOM, so they are tested in plain Node. */
import type { EventRow, RunSummary } from '../core/bridge/contract.js';
import { TIERS } from '../core/risk/tiers.js';

export const NONE = '—';

/** "2026-12-03T04:05:06.789Z" → "2026-12-03 04:05:06.789" (the column says UTC). */
export function formatUtc(iso: string | null): string {
  if (iso === null) return NONE;
  const m = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2}:\d{2}(?:\.\d+)?)Z$/.exec(iso);
  return m ? `${m[1]} ${m[2]}` : iso;
}

export function formatFixed(x: number | null, digits: number): string {
  return x === null || !Number.isFinite(x) ? NONE : x.toFixed(digits);
}

/** Pc as everywhere else in Keepclear (core/events/pcText.ts): "1.23e-5", "< 1e-10", "—". */
import { formatPc } from '../core/events/pcText.js';
export { formatPc };

export interface TierDisplay {
  readonly label: string;
  /** null: not assessed, shown without a colour */
  readonly colour: string | null;
  readonly meaning: string;
}

export function tierDisplay(tier: EventRow['tier']): TierDisplay {
  if (tier === null) return { label: NONE, colour: null, meaning: 'not assessed' };
  const t = TIERS[tier];
  return { label: t.label, colour: t.colour, meaning: t.meaning };
}

function windowDays(run: RunSummary): string {
  const days = (Date.parse(run.end) - Date.parse(run.start)) / 86_400_000;
  return Number.isFinite(days) ? `${Number(days.toFixed(2))} d` : NONE;
}

/** One line per run for the selector: "R12 · 2026-12-03 04:05 UTC + 7 d · done · 14 events". */
export function runLabel(run: RunSummary): string {
  const start = formatUtc(run.start).slice(0, 16);
  const events = run.eventCount === null ? '' : ` · ${run.eventCount} event${run.eventCount === 1 ? '' : 's'}`;
  return `${run.id} · ${start} UTC + ${windowDays(run)} · ${run.status}${events}`;
}

export function catalogLine(objectCount: number, latestEpoch: string | null): string {
  const objects = `${objectCount.toLocaleString('en-US')} object${objectCount === 1 ? '' : 's'} in the catalogue`;
  return latestEpoch === null ? objects : `${objects} · newest elements ${formatUtc(latestEpoch)} UTC`;
}
