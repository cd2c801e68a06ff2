/**
 * What the terminal shows of series: one line of counts by state, and one series compactly — a
 * header with its state in words, one row per sighting in data order (time to TCA, miss, Pc,
 * tier), a Pc strip and the change since the first sighting.
 */
import { formatPc } from '../../core/events/pcText.js';
import { SERIES_STATE_MEANING, type SeriesState, type TrendChange } from '../../core/events/index.js';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';
import { TIERS } from '../../core/risk/tiers.js';
import { toIso } from '../../core/time/instant.js';
import type { SeriesView } from '../../app/series.js';

/** Our words for the states, as the terminal prints them. */
export const STATE_WORDS: Readonly<Record<SeriesState, string>> = {
  new: 'new',
  updated: 'updated',
  'no-longer-predicted': 'no longer predicted',
  past: 'past',
};

const labelOf = (tier: string): string => (TIERS as Record<string, { label: string } | undefined>)[tier]?.label ?? tier;

/** "Series: new 9 · updated 3 · no longer predicted 1 · past 5" */
export function seriesCounts(counts: Readonly<Record<SeriesState, number>>): string {
  return `Series: ${(Object.keys(STATE_WORDS) as SeriesState[]).map((s) => `${STATE_WORDS[s]} ${counts[s]}`).join(' · ')}`;
}

/** Eight levels of log10 Pc from 1e-10 (lowest) to 1e-2 and above: one character per sighting. */
const BARS = '▁▂▃▄▅▆▇█';
export function pcStrip(pcs: readonly (number | null)[]): string {
  return pcs
    .map((pc) => {
      if (pc === null) return '·';
      const level = Math.round(((Math.log10(Math.max(pc, 1e-10)) + 10) / 8) * (BARS.length - 1));
      return BARS[Math.min(BARS.length - 1, Math.max(0, level))]!;
    })
    .join('');
}

function changeText(c: TrendChange | null): string {
  if (!c) return 'Seen once so far.';
  const pc =
    c.pcFactor === null ? 'Pc unknown' : `Pc ×${c.pcFactor >= 100 || c.pcFactor < 0.01 ? c.pcFactor.toExponential(1) : c.pcFactor.toPrecision(2)} (${c.pcDirection})`;
  const sign = c.missChangeKm >= 0 ? '+' : '−';
  return `miss ${sign}${Math.abs(c.missChangeKm).toFixed(3)} km (${c.missDirection}), ${pc}, over ${c.elapsedH.toFixed(1)} h`;
}

export function seriesSummary(view: SeriesView): string {
  const { stored, trend } = view;
  const head = ['data time (UTC)', 'source', 'event', 'to TCA h', 'miss km', 'Pc', 'tier'];
  const rows = view.series.members.map((m, i) => [
    toIso(m.source.createdAt).slice(0, 16) + 'Z',
    m.source.kind === 'cdm' ? `message (${m.source.id})` : `run ${m.source.id}`,
    m.event.id,
    trend.points[i]!.timeToTcaH.toFixed(1),
    m.event.missKm.toFixed(3),
    formatPc(m.event.risk?.pc),
    m.event.risk ? labelOf(m.event.risk.tier) : '—',
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (r: string[]) => r.map((c, i) => c.padEnd(widths[i]!)).join('  ').trimEnd();
  const out = [
    `Series ${stored.id}: ${stored.primary} × ${stored.secondary} — ${STATE_WORDS[stored.state]} (${SERIES_STATE_MEANING[stored.state]}` +
      `${stored.missedByRun ? `: run ${stored.missedByRun}` : ''})`,
    `TCA ${toIso(stored.tca)} · ${stored.sightings} sighting(s) · judged as of ${toIso(stored.asOf)}`,
    '',
    line(head),
    ...rows.map(line),
    '',
    `Pc by sighting, oldest first: ${pcStrip(trend.points.map((p) => p.pc))}`,
    `Since the previous sighting: ${changeText(trend.sincePrevious)}`,
    `Since the first sighting:    ${changeText(trend.sinceFirst)}`,
    '',
    `Note: ${DECISION_AID_NOTE}`,
  ];
  return out.join('\n') + '\n';
}
