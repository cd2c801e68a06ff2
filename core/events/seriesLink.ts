/**
 * Series: the same conjunction seen again — in a later screening run or a received CDM — is one
 * series. Two sightings are the same conjunction when they are of the same unordered pair of
 * objects and their TCAs lie within τ (seriesTolerance.ts) of each other; a series is a connected
 * group of such links (single linkage along the TCA axis), with one rule on top: one source (a
 * screening run, a received message) sees a conjunction at most once, so a group holding two
 * sightings from one source is cut at its widest gap (in units of τ) between them.
 *
 * The series of a pair are a function of the SET of its sightings — computed from the sightings
 * sorted by TCA, never from their arrival order — so the same events arriving in any order give
 * the same series (test/events-series-link.test.ts checks permutations). Linking is incremental
 * by pair: adding a run's or a message's events recomputes only the pairs they touch
 * (SeriesLinker), which are a handful of sightings each.
 *
 * A series' id is derived from its founder, the sighting whose data is oldest (creation time,
 * then source id, then event id): data normally arrives in time order, so ids are stable; an
 * out-of-order import (an old message after newer runs) or an event that bridges two series
 * can re-found a series, and the change is reported (SeriesUpdate.retired / reassigned).
 */
import type { ConjunctionEvent } from './event.js';
import type { Instant } from '../time/instant.js';
import { largestCap, pairKeyOf, sightingView, tcaTolerance, type SightingView } from './seriesTolerance.js';

/** Where a sighting's data came from. */
export type SeriesSourceKind = 'screening' | 'cdm';

export interface SeriesSource {
  /** the run id (a received message is stored as a run of its own) */
  readonly id: string;
  readonly kind: SeriesSourceKind;
  /**
   * when the data was created: a screening run's time, a message's CREATION_DATE. Orders a
   * series' events and dates the trend ("time to TCA").
   */
  readonly createdAt: Instant;
}

/** One event as series linking sees it. */
export interface SeriesMember {
  readonly event: ConjunctionEvent;
  readonly source: SeriesSource;
}

export interface Series {
  /** `S-` + the founder's event id (see above) */
  readonly id: string;
  readonly founderEventId: string;
  /** the pair as the first screening sighting names it (else the first message's OBJECT1/OBJECT2) */
  readonly primary: string;
  readonly secondary: string;
  /** sightings in the order their data was created */
  readonly members: readonly SeriesMember[];
}

export const seriesIdFor = (founderEventId: string): string => `S-${founderEventId}`;

/** Data order: creation time, then source id, then event id (a total order, so ties cannot flip). */
export function compareByData(a: SeriesMember, b: SeriesMember): number {
  return (
    a.source.createdAt - b.source.createdAt ||
    (a.source.id < b.source.id ? -1 : a.source.id > b.source.id ? 1 : 0) ||
    (a.event.id < b.event.id ? -1 : a.event.id > b.event.id ? 1 : 0)
  );
}

/**
 * A sighting and its view, built on first use: a pair seen once (every pair of a new run, 10⁵ in
 * an all-vs-all one) is never compared, so never needs it.
 */
class Item {
  private built: SightingView | null = null;
  readonly pairKey: string;
  constructor(readonly member: SeriesMember) {
    this.pairKey = pairKeyOf(member.event.primary, member.event.secondary);
  }
  get view(): SightingView {
    return (this.built ??= sightingView(this.member.event, this.member.source.createdAt));
  }
}

const itemOf = (member: SeriesMember): Item => new Item(member);

/** TCA order with the data order as tie-break: the one canonical order linking works in. */
const byTca = (a: Item, b: Item): number => a.view.tcaMs - b.view.tcaMs || compareByData(a.member, b.member);

/** Connected groups of `items` (sorted by TCA) under "TCA within τ". */
function components(items: readonly Item[]): Item[][] {
  const n = items.length;
  if (n === 1) return [[items[0]!]];
  const parent = Array.from({ length: n }, (_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]!]!;
      i = parent[i]!;
    }
    return i;
  };
  const reach = largestCap(items.map((it) => it.view));
  for (let i = 0; i < n; i++) {
    const a = items[i]!.view;
    for (let j = i + 1; j < n; j++) {
      const b = items[j]!.view;
      const gapS = (b.tcaMs - a.tcaMs) / 1000;
      if (gapS > reach) break;
      if (gapS <= tcaTolerance(a, b).seconds) {
        const ra = find(i), rb = find(j);
        if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
      }
    }
  }
  const groups = new Map<number, Item[]>();
  for (let i = 0; i < n; i++) {
    const r = find(i);
    let g = groups.get(r);
    if (!g) groups.set(r, (g = []));
    g.push(items[i]!);
  }
  return [...groups.values()]; // each group keeps TCA order
}

/** Cuts a group holding two sightings of one source at its widest gap between them (in τ). */
function splitRepeatedSources(group: Item[]): Item[][] {
  // Candidate cuts: the gaps between two sightings of one source (gap k lies after item k).
  const lastAt = new Map<string, number>();
  const candidate = new Array<boolean>(group.length).fill(false);
  let any = false;
  group.forEach((it, k) => {
    const src = it.member.source.id;
    const last = lastAt.get(src);
    if (last !== undefined) {
      for (let g = last; g < k; g++) candidate[g] = true;
      any = true;
    }
    lastAt.set(src, k);
  });
  if (!any) return [group];
  let cut = -1, widest = -1;
  for (let k = 0; k + 1 < group.length; k++) {
    if (!candidate[k]) continue;
    const a = group[k]!.view, b = group[k + 1]!.view;
    const width = (b.tcaMs - a.tcaMs) / 1000 / tcaTolerance(a, b).seconds;
    if (width > widest) {
      widest = width;
      cut = k;
    }
  }
  return [...linkGroup(group.slice(0, cut + 1)), ...linkGroup(group.slice(cut + 1))];
}

/** Groups of one pair's items (sorted by TCA), every group free of repeated sources. */
function linkGroup(items: readonly Item[]): Item[][] {
  return components(items).flatMap(splitRepeatedSources);
}

function seriesOf(group: readonly Item[]): Series {
  const members = group.map((it) => it.member).sort(compareByData);
  const founder = members[0]!;
  const named = members.find((m) => m.source.kind === 'screening') ?? founder;
  return {
    id: seriesIdFor(founder.event.id),
    founderEventId: founder.event.id,
    primary: named.event.primary,
    secondary: named.event.secondary,
    members,
  };
}

function linkPair(items: Item[]): Series[] {
  if (items.length === 1) return [seriesOf(items)];
  items.sort(byTca);
  return linkGroup(items).map(seriesOf);
}

/** Series of a whole set of sightings, ordered by pair and TCA. Pure; order of input is irrelevant. */
export function linkSeries(members: readonly SeriesMember[]): Series[] {
  const byPair = new Map<string, Item[]>();
  for (const m of members) {
    const it = itemOf(m);
    let list = byPair.get(it.pairKey);
    if (!list) byPair.set(it.pairKey, (list = []));
    list.push(it);
  }
  const keys = [...byPair.keys()].sort();
  return keys.flatMap((k) => linkPair(byPair.get(k)!));
}

/** What one `add` changed, for a store to write back. */
export interface SeriesUpdate {
  /** series created or whose membership or id changed */
  readonly changed: readonly Series[];
  /** ids that no longer name a series (re-founded or merged into another) */
  readonly retired: readonly string[];
  /** every event whose series id is new or different: what to write */
  readonly reassigned: ReadonlyMap<string, string>;
}

/**
 * Incremental linking: holds the sightings seen so far, by pair; `add` relinks only the pairs the
 * new sightings touch. A store that keeps series ids per event can also build a linker from the
 * stored sightings of the touched pairs only, add the new ones, and write `reassigned`.
 * Adding an event id already held replaces it (re-adding is harmless).
 */
export class SeriesLinker {
  private readonly items = new Map<string, Map<string, Item>>(); // pair → event id → item
  private readonly seriesByPair = new Map<string, Series[]>();
  private readonly seriesOfEvent = new Map<string, string>();
  private readonly byId = new Map<string, Series>();

  constructor(members: readonly SeriesMember[] = []) {
    if (members.length > 0) this.add(members);
  }

  add(members: readonly SeriesMember[]): SeriesUpdate {
    const touched = new Set<string>();
    for (const m of members) {
      const it = itemOf(m);
      let held = this.items.get(it.pairKey);
      if (!held) this.items.set(it.pairKey, (held = new Map()));
      held.set(m.event.id, it);
      touched.add(it.pairKey);
    }
    const changed: Series[] = [];
    const retired: string[] = [];
    const reassigned = new Map<string, string>();
    for (const pair of [...touched].sort()) {
      const before = this.seriesByPair.get(pair) ?? [];
      const after = linkPair([...this.items.get(pair)!.values()]);
      const memberKey = (s: Series) => s.members.map((m) => m.event.id).join('\u0000');
      const old = new Map(before.map((s) => [s.id, memberKey(s)]));
      for (const s of after) if (old.get(s.id) !== memberKey(s)) changed.push(s);
      const ids = new Set(after.map((s) => s.id));
      for (const s of before) {
        if (!ids.has(s.id)) {
          retired.push(s.id);
          this.byId.delete(s.id);
        }
      }
      for (const s of after) {
        this.byId.set(s.id, s);
        for (const m of s.members) {
          if (this.seriesOfEvent.get(m.event.id) !== s.id) reassigned.set(m.event.id, s.id);
          this.seriesOfEvent.set(m.event.id, s.id);
        }
      }
      this.seriesByPair.set(pair, after);
    }
    return { changed, retired, reassigned };
  }

  /** Every series, ordered by pair and TCA (the same order as linkSeries). */
  all(): Series[] {
    return [...this.seriesByPair.keys()].sort().flatMap((k) => this.seriesByPair.get(k)!);
  }

  get(seriesId: string): Series | undefined {
    return this.byId.get(seriesId);
  }

  seriesIdOf(eventId: string): string | undefined {
    return this.seriesOfEvent.get(eventId);
  }
}
