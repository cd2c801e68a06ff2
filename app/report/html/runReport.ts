import { weekGlanceSpec } from '../../../core/plots/weekGlance.js';
import { TIER_ORDER } from '../../../core/risk/tiers.js';
import type { EventRowModel, RunChangeModel, RunReportModel } from '../model.js';
import { catalogueBanner, cautionBox, eventTable, runMeta, tierCards } from './common.js';
import { esc, formatPc, num, shortIso, tierBadge } from './format.js';
import { pageHtml } from './page.js';
import { plotFigure } from './plots.js';

/** Events labelled by id on the week plot: the most urgent, by Pc, at most this many. */
const MAX_PLOT_LABELS = 10;

const urgency = (e: EventRowModel): number => (e.tier === null ? TIER_ORDER.length : TIER_ORDER.indexOf(e.tier));

/** Events above the lowest tier, most urgent first: tier, then Pc (highest first), then TCA. */
export function needingAttention(events: readonly EventRowModel[]): EventRowModel[] {
  const lowest = TIER_ORDER[TIER_ORDER.length - 1];
  return events
    .filter((e) => e.tier !== null && e.tier !== lowest)
    .sort((a, b) => urgency(a) - urgency(b) || (b.pc ?? -1) - (a.pc ?? -1) || a.tca.localeCompare(b.tca));
}

const CHANGE_TEXT: Readonly<Record<RunChangeModel['change'], string>> = {
  new: 'New',
  updated: 'Updated',
  'no-longer-predicted': 'No longer predicted',
};

/**
 * What changed with this run, by series, against the data before it (earlier runs and received
 * messages): new conjunctions, conjunctions seen again (miss and Pc before → now), and
 * conjunctions this run covered but no longer found.
 */
export function changesSection(changes: readonly RunChangeModel[] | null | undefined): string {
  if (changes === undefined || changes === null) return '';
  const count = (c: RunChangeModel['change']) => changes.filter((x) => x.change === c).length;
  const summary = `${count('new')} new · ${count('updated')} updated · ${count('no-longer-predicted')} no longer predicted`;
  const arrow = (before: string | null, now: string) => (before === null ? now : `${before} → ${now}`);
  const rows = changes.map(
    (c) => `<tr data-change="${esc(c.change)}" data-series="${esc(c.seriesId)}"><td>${esc(CHANGE_TEXT[c.change])}</td><td class="nw">${esc(c.seriesId)}</td><td>${esc(c.primary)} × ${esc(c.secondary)}</td><td class="nw">${esc(c.eventId)}</td><td class="nw">${esc(shortIso(c.tca))}</td>
<td class="num">${esc(arrow(c.previousMissKm === null ? null : num(c.previousMissKm, 3), num(c.missKm, 3)))}</td><td class="num">${esc(arrow(c.previousMissKm === null ? null : formatPc(c.previousPc), formatPc(c.pc)))}</td><td>${tierBadge(c.tier)}</td><td>${esc(c.stateNow ?? '—')}</td></tr>`,
  );
  const table = changes.length
    ? `<table data-table="changes"><thead><tr><th>Change</th><th>Series</th><th>Pair</th><th>Event</th><th>TCA (UTC)</th><th>Miss km (before → now)</th><th>Pc (before → now)</th><th>Tier</th><th>State now</th></tr></thead><tbody>${rows.join('\n')}</tbody></table>`
    : '<p class="none">Nothing changed: no conjunction is new, seen again or no longer found.</p>';
  return `<section data-section="changes">
<h2>What changed since the previous run (${esc(summary)})</h2>
<p class="sub">By series: the same conjunction across runs and received messages. "No longer predicted": this run covered the TCA for the pair and did not find it; for "no longer predicted" rows the event and numbers are the last sighting before this run.</p>
${table}
</section>`;
}

/** The run report: header, counts per tier, the week at a glance, what needs attention, every event. */
export async function renderRunReportHtml(m: RunReportModel): Promise<string> {
  const attention = needingAttention(m.events);
  const glance = await plotFigure(
    'week-glance',
    weekGlanceSpec({
      events: m.events.map((e) => ({ id: e.id, primary: e.primary, secondary: e.secondary, tca: e.tca, missKm: e.missKm, pc: e.pc, tier: e.tier })),
      windowStart: m.run.windowStart,
      windowEnd: m.run.windowEnd,
      screeningRadiusKm: m.run.screeningRadiusKm,
      labelIds: attention.slice(0, MAX_PLOT_LABELS).map((e) => e.id),
    }),
    'One mark per event: shape and colour give the tier. The most urgent events are labelled with their id.',
  );
  const flagged = m.flagged.length
    ? `<table data-table="flagged"><thead><tr><th>Object</th><th>Reason</th></tr></thead><tbody>${m.flagged
        .map((f) => `<tr><td>${esc(f.id)}</td><td>${esc(f.reason)}</td></tr>`)
        .join('')}</tbody></table>`
    : '<p class="none">No object was flagged: every object propagated over the whole window.</p>';
  const body = `
<header>
<h1>${esc(m.title)}</h1>
${runMeta(m.run, m.generatedAt)}
${catalogueBanner(m.catalogue)}
${cautionBox(m.caution)}
</header>
<section data-section="counts">
<h2>Events by tier (${m.events.length} in all)</h2>
${tierCards(m.events, m.thresholds.pcPlan, m.thresholds.pcMonitor)}
</section>
${changesSection(m.changes)}
<section data-section="glance">
${glance}
</section>
<section data-section="attention">
<h2>Needing attention (${attention.length})</h2>
${attention.length ? eventTable(attention, 'attention') : '<p class="none">No event is graded above routine.</p>'}
</section>
<section data-section="flagged">
<h2>Flagged objects (${m.flagged.length})</h2>
${flagged}
</section>
<section data-section="all">
<h2>All events, by TCA (${m.events.length})</h2>
${m.events.length ? eventTable(m.events, 'all') : '<p class="none">No close approach was found in this window.</p>'}
</section>`;
  const footer = `Keepclear run report · run ${esc(m.run.id)} · generated ${esc(shortIso(m.generatedAt))} · ${esc(m.caution)}`;
  return pageHtml(m.title, body, footer);
}
