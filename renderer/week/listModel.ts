/**
 * The week's event list as data: filter (tier, object, time), search and sort, pure functions so
 * they are tested in Node and cost one pass over 10,000 rows.
 */
import type { EventRow } from '../../core/bridge/contract.js';
import { TIER_ORDER, type TierId } from '../../core/risk/tiers.js';

export type SortKey = 'tca' | 'missKm' | 'pc' | 'tier' | 'primary' | 'secondary' | 'relativeSpeedKmS';
export type TierFilter = TierId | 'none';

export interface ListQuery {
  /** tiers shown; 'none' = not assessed */
  readonly tiers: ReadonlySet<TierFilter>;
  /** an object id that must be the primary or the secondary; '' = any */
  readonly object: string;
  /** TCA window, ms since 1970 UTC; null = open */
  readonly fromMs: number | null;
  readonly toMs: number | null;
  /** free text, matched against ids, objects, series and sources (case-insensitive) */
  readonly search: string;
  readonly sort: SortKey;
  readonly descending: boolean;
}

export const ALL_TIERS: readonly TierFilter[] = [...TIER_ORDER, 'none'];

export const DEFAULT_QUERY: ListQuery = {
  tiers: new Set(ALL_TIERS),
  object: '',
  fromMs: null,
  toMs: null,
  search: '',
  // Riskiest first: what an engineer opens the week for.
  sort: 'pc',
  descending: true,
};

/** Rows prepared once per run: parsed TCA and a lower-case haystack for search. */
export interface ListRow {
  readonly event: EventRow;
  readonly tcaMs: number;
  readonly haystack: string;
}

export function prepareRows(events: readonly EventRow[]): ListRow[] {
  return events.map((e) => ({
    event: e,
    tcaMs: Date.parse(e.tca),
    haystack: [e.id, e.primary, e.secondary, e.seriesId ?? '', e.seriesState ?? '', e.covarianceSource ?? '', e.pcMethod ?? ''].join(' ').toLowerCase(),
  }));
}

const tierRank = (t: TierId | null): number => (t === null ? TIER_ORDER.length : TIER_ORDER.indexOf(t));

/** Ascending comparison by one key; missing values (no Pc) sort last in either direction. */
function compare(a: ListRow, b: ListRow, key: SortKey): number {
  switch (key) {
    case 'tca':
      return a.tcaMs - b.tcaMs;
    case 'missKm':
      return a.event.missKm - b.event.missKm;
    case 'relativeSpeedKmS':
      return a.event.relativeSpeedKmS - b.event.relativeSpeedKmS;
    case 'pc':
      return (a.event.pc ?? -1) - (b.event.pc ?? -1);
    case 'tier':
      // ascending = least urgent first, so "descending" puts Plan on top like Pc does
      return tierRank(b.event.tier) - tierRank(a.event.tier);
    case 'primary':
      return a.event.primary.localeCompare(b.event.primary, 'en', { numeric: true });
    case 'secondary':
      return a.event.secondary.localeCompare(b.event.secondary, 'en', { numeric: true });
  }
}

export function applyQuery(rows: readonly ListRow[], q: ListQuery): ListRow[] {
  const object = q.object.trim().toLowerCase();
  const words = q.search.trim().toLowerCase().split(/\s+/).filter((w) => w !== '');
  const out = rows.filter((r) => {
    const e = r.event;
    if (!q.tiers.has(e.tier ?? 'none')) return false;
    if (object && e.primary.toLowerCase() !== object && e.secondary.toLowerCase() !== object) return false;
    if (q.fromMs !== null && r.tcaMs < q.fromMs) return false;
    if (q.toMs !== null && r.tcaMs > q.toMs) return false;
    return words.every((w) => r.haystack.includes(w));
  });
  const sign = q.descending ? -1 : 1;
  // TCA breaks ties, so equal keys keep a stable, meaningful order.
  out.sort((a, b) => sign * compare(a, b, q.sort) || a.tcaMs - b.tcaMs);
  return out;
}

/** Events per tier (the header's counts), from the unfiltered rows. */
export function tierCounts(rows: readonly ListRow[]): Record<TierFilter, number> {
  const counts: Record<TierFilter, number> = { plan: 0, monitor: 0, routine: 0, none: 0 };
  for (const r of rows) counts[r.event.tier ?? 'none']++;
  return counts;
}

/** The index to move to for a navigation key, or null for other keys. */
export function navigate(key: string, index: number, count: number, pageRows: number): number | null {
  if (count === 0) return null;
  const clamp = (i: number): number => Math.max(0, Math.min(count - 1, i));
  switch (key) {
    case 'ArrowDown':
    case 'j':
      return clamp(index + 1);
    case 'ArrowUp':
    case 'k':
      return clamp(index - 1);
    case 'PageDown':
      return clamp(index + pageRows);
    case 'PageUp':
      return clamp(index - pageRows);
    case 'Home':
      return 0;
    case 'End':
      return count - 1;
    default:
      return null;
  }
}
