/**
 * What the terminal shows of a list of events: what needs attention first. Counts per tier,
 * then the events above the lowest tier, highest Pc first; every event only with --all-events
 * (the full list goes to JSON, CSV and the report). Pc reads "< 1e-10" below the display floor.
 */
import { formatPc } from '../../core/events/pcText.js';
import type { ConjunctionEvent } from '../../core/events/index.js';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';
import { TIERS } from '../../core/risk/tiers.js';
import { toIso } from '../../core/time/instant.js';

/** Tier ids from the most to the least urgent, as core/risk/tiers.ts lists them. */
const TIER_ORDER = Object.keys(TIERS) as (keyof typeof TIERS)[];
const LOWEST_TIER: string = TIER_ORDER[TIER_ORDER.length - 1]!;
const labelOf = (tier: string): string => (TIERS as Record<string, { label: string } | undefined>)[tier]?.label ?? tier;

/** Events that need a look: graded above the lowest tier, or not graded at all. */
export const needsAttention = (e: ConjunctionEvent): boolean => e.risk === null || e.risk.tier !== LOWEST_TIER;

/** Highest Pc first; events without a Pc after those with one, closest first. */
export function byConcern(a: ConjunctionEvent, b: ConjunctionEvent): number {
  const pa = a.risk?.pc ?? null, pb = b.risk?.pc ?? null;
  if (pa !== null && pb !== null && pa !== pb) return pb - pa;
  if ((pa === null) !== (pb === null)) return pa === null ? 1 : -1;
  return a.missKm - b.missKm || a.tca - b.tca;
}

/** "Plan 2 · Monitor 5 · Routine 223" (every tier, zeros too, so the scale is always visible). */
export function tierCounts(events: readonly ConjunctionEvent[]): string {
  const counts = new Map<string, number>(TIER_ORDER.map((t) => [t, 0]));
  let unassessed = 0;
  for (const e of events) {
    if (e.risk === null) unassessed++;
    else counts.set(e.risk.tier, (counts.get(e.risk.tier) ?? 0) + 1);
  }
  const parts = [...counts].map(([t, n]) => `${labelOf(t)} ${n}`);
  if (unassessed > 0) parts.push(`not assessed ${unassessed}`);
  return parts.join(' · ');
}

/**
 * A plain-text table of events. `plans` (event id → a short text of its newest manoeuvre plan)
 * adds a "plan" column when any listed event has one.
 */
export function eventTable(events: readonly ConjunctionEvent[], plans?: ReadonlyMap<string, string>): string {
  const withPlans = plans !== undefined && events.some((e) => plans.has(e.id));
  const head = ['event', 'TCA (UTC)', 'primary', 'secondary', 'miss km', 'v_rel km/s', 'Pc', 'tier', 'covariance', ...(withPlans ? ['plan (Δv → miss)'] : [])];
  const rows = events.map((e) => [
    e.id,
    toIso(e.tca),
    e.primary,
    e.secondary,
    e.missKm.toFixed(3),
    e.relativeSpeedKmS.toFixed(3),
    formatPc(e.risk?.pc),
    e.risk ? labelOf(e.risk.tier) : '—',
    e.risk?.covarianceSource ?? '—',
    ...(withPlans ? [plans!.get(e.id) ?? ''] : []),
  ]);
  // a loop, not Math.max(...rows): 10⁵ arguments (--all-events on an all-vs-all run) overflow the stack
  const widths = head.map((h, i) => rows.reduce((w, r) => Math.max(w, r[i]!.length), h.length));
  const line = (r: string[]) => r.map((c, i) => c.padEnd(widths[i]!)).join('  ').trimEnd();
  return [line(head), ...rows.map(line)].join('\n') + '\n';
}

/**
 * The events block of `screen`, `events` and `demo`: tier counts, the events needing attention
 * (or all, by TCA, with `all`), a pointer to the rest, `more` lines (series counts), and the
 * decision-aid note.
 */
/**
 * Rows of "needing attention" a screening's terminal summary lists (highest Pc first; the rest
 * are counted and are in --json, the reports and --all-events). An all-vs-all run has ~3·10⁴
 * events above the lowest tier: nobody reads that many lines, and printing them took seconds.
 */
export const SCREEN_SUMMARY_ROWS = 100;

export function eventSummary(
  events: readonly ConjunctionEvent[],
  all: boolean,
  more: readonly string[] = [],
  plans?: ReadonlyMap<string, string>,
  /** at most this many rows of "needing attention" (the demo's short summary); the rest are counted */
  maxRows = Infinity,
): string {
  const out: string[] = [`Events by tier: ${tierCounts(events)}`];
  if (events.length === 0) {
    out.push('No events in the screening volume.');
  } else if (all) {
    out.push('', `All ${events.length} event(s), by TCA:`, eventTable(events, plans));
  } else {
    const attention = events.filter(needsAttention).sort(byConcern);
    out.push('');
    if (attention.length > maxRows) {
      out.push(
        `Needing attention (${attention.length}), the ${maxRows} with the highest Pc:`,
        eventTable(attention.slice(0, maxRows), plans),
        `${attention.length - maxRows} more needing attention: in the report, with --all-events, or in --json.`,
      );
    } else if (attention.length > 0) out.push(`Needing attention (${attention.length}), highest Pc first:`, eventTable(attention, plans));
    else out.push(`No event above ${labelOf(LOWEST_TIER)}.`);
    const rest = events.length - attention.length;
    if (rest > 0) {
      out.push(`${rest} ${labelOf(LOWEST_TIER)} event(s) not listed: --all-events lists every event; --json FILE writes them all.`);
    }
  }
  if (more.length > 0) out.push('', ...more);
  out.push('', `Note: ${DECISION_AID_NOTE}`);
  return out.join('\n').replace(/\n{3,}/g, '\n\n') + '\n';
}
