import { weekGlanceSpec } from '../../../core/plots/weekGlance.js';
import { TIER_ORDER } from '../../../core/risk/tiers.js';
import type { EventRowModel, RunReportModel } from '../model.js';
import { catalogueBanner, cautionBox, eventTable, runMeta, tierCards } from './common.js';
import { esc, shortIso } from './format.js';
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
