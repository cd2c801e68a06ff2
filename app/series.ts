/**
 * The linking service: after every screening run and every received message, the events they
 * stored join their series (core/events/seriesLink.ts: same pair, TCA within τ), and the state of
 * every open series is judged again as of the newest data (core/events/seriesState.ts). Called
 * inside the transaction that stores the events, so a reader never sees events without their
 * series or a state that ignores them.
 *
 * Arrival order does not matter: linking is a function of the stored sightings of a pair (ordered
 * by TCA, dated by each run's data time: a screening run's time, a message's CREATION_DATE), and
 * states are judged from all stored runs. A message created before a run but imported after it
 * takes its place by CREATION_DATE.
 *
 * Received messages also feed the risk of screened events (DESIGN.md: a received CDM is first in
 * covariance precedence). Which message: the newest message of the event's own series that was
 * created no later than the run's data — what the operator held when the run was made. A run
 * older than every message of its series keeps its own covariance, so the trend shows what was
 * known at each time.
 */
import {
  linkSeries,
  pairKeyOf,
  seriesStatus,
  seriesTrend,
  type ConjunctionEvent,
  type ScreeningCoverage,
  type Series,
  type SeriesMember,
  type SeriesState,
  type SeriesStatus,
  type SeriesTrend,
} from '../core/events/index.js';
import { sightingView, tcaTolerance } from '../core/events/seriesTolerance.js';
import { KeepclearError } from '../core/errors.js';
import type { Instant } from '../core/time/instant.js';
import {
  deleteSeries,
  eventsOfSeries,
  getEventExtra,
  getRun,
  getSeries,
  inTransaction,
  listCdms,
  listSeries,
  LINKED_RUN_KINDS,
  mergeEventExtra,
  newestDataAt,
  putSeries,
  screeningCoverage,
  setEventSeries,
  sightingsOfPair,
  sightingsOfRun,
  sightingsOfRunPairs,
  unlinkedPairs,
  updateEventRisk,
  type KeepclearDb,
  type StoredSeries,
} from '../db/index.js';
import { cdmRiskInputs } from './cdmRisk.js';
import { RiskContext } from './risk.js';

export interface LinkOutcome {
  /** pairs relinked */
  readonly pairs: number;
  /** series of those pairs after linking */
  readonly series: readonly string[];
  /**
   * events whose stored series id linking set or changed (a screening run stores its events with
   * the id of the series each would found, app/screen.ts: of those only the ones that join an
   * older series count)
   */
  readonly reassigned: number;
  /** series ids that no longer exist (an out-of-order message re-founded a series, or two merged) */
  readonly retired: readonly string[];
  /** screened events whose risk now takes a received message's covariance (or no longer does) */
  readonly reassessed: readonly string[];
}

const OPEN_STATES: readonly SeriesState[] = ['new', 'updated', 'no-longer-predicted'];
/** Around a series' TCA, the window in which a newer run may have looked for it (1 day, ms). */
const RECHECK_PAD_MS = 86_400_000;

function rowOf(s: Series, st: SeriesStatus): StoredSeries {
  const last = s.members[s.members.length - 1]!;
  return {
    id: s.id,
    primary: s.primary,
    secondary: s.secondary,
    founderEventId: s.founderEventId,
    state: st.state,
    tca: st.tca,
    sightings: st.sightings,
    lastEventId: last.event.id,
    lastDataAt: last.source.createdAt,
    missedByRun: st.missedBy,
    asOf: st.asOf,
  };
}

/** A stored series with its members (data order), as core's Series. */
function seriesFromStore(stored: StoredSeries, members: readonly SeriesMember[]): Series {
  return { id: stored.id, founderEventId: members[0]!.event.id, primary: stored.primary, secondary: stored.secondary, members };
}

/**
 * Judges again the state of the given series and of every other open series (a new run can make
 * an untouched series "no longer predicted"; newer data can make it "past").
 */
function refreshStates(db: KeepclearDb, touched: readonly Series[]): void {
  const asOf = newestDataAt(db);
  if (asOf === null) return;
  const coverage = screeningCoverage(db);
  const seen = new Set(touched.map((s) => s.id));
  const rows = touched.map((s) => rowOf(s, seriesStatus(s, coverage, asOf)));
  const gone: string[] = [];
  for (const stored of listSeries(db, { states: OPEN_STATES })) {
    if (seen.has(stored.id)) continue;
    // Only two things change an untouched series: its TCA falling behind the newest data, or a
    // screening run newer than its last sighting around its TCA. Skip the rest without reading
    // their events (RECHECK_PAD_MS exceeds any tolerance: the ¼-period cap is under 1 day).
    const mayChange =
      stored.tca < asOf ||
      coverage.some((r) => r.createdAt > stored.lastDataAt && r.start <= stored.tca + RECHECK_PAD_MS && r.end >= stored.tca - RECHECK_PAD_MS);
    if (!mayChange) continue;
    const members = eventsOfSeries(db, stored.id);
    if (members.length === 0) {
      gone.push(stored.id); // its events were deleted with their run
      continue;
    }
    const s = seriesFromStore(stored, members);
    rows.push(rowOf(s, seriesStatus(s, coverage, asOf)));
  }
  deleteSeries(db, gone);
  putSeries(db, rows);
}

/**
 * Screened events of the series take the covariance of the newest message of the same series
 * created no later than their run's data (see the file comment). Re-assesses only where the
 * message to use differs from the one the event already used.
 */
function applyMessageCovariances(db: KeepclearDb, series: readonly Series[]): string[] {
  const changed: string[] = [];
  let risk: RiskContext | null = null;
  for (const s of series) {
    const messages = s.members.filter((m) => m.source.kind === 'cdm');
    if (messages.length === 0) continue;
    for (const m of s.members) {
      if (m.source.kind !== 'screening' || !m.event.risk) continue;
      // members are in data order: the last message created at or before the run's data
      const use = messages.filter((c) => c.source.createdAt <= m.source.createdAt).pop() ?? null;
      // the stored message behind that event (a message run without one contributes nothing)
      const cdm = use ? (listCdms(db, { eventId: use.event.id })[0] ?? null) : null;
      const wanted = cdm ? use!.event.id : null;
      const extra = getEventExtra(db, m.event.id) ?? {};
      const usedEventId = typeof extra['cdmEventId'] === 'string' ? extra['cdmEventId'] : null;
      if (wanted === usedEventId) continue;
      risk ??= new RiskContext(db);
      updateEventRisk(db, m.event.id, cdm ? risk.assess(m.event, cdmRiskInputs(cdm, m.event)) : risk.assess(m.event));
      mergeEventExtra(db, m.event.id, {
        cdmEventId: wanted,
        cdmId: cdm?.id ?? null,
        reportedPc: cdm?.reportedPc ?? null,
      });
      changed.push(m.event.id);
    }
  }
  return changed;
}

/**
 * Relinks the given pairs (either order) and judges states again. Runs in one transaction.
 * `read`: the stored sightings of some of the pairs by pairKeyOf, already read in this
 * transaction (linkRun); the others are read pair by pair.
 */
export function linkPairs(
  db: KeepclearDb,
  pairs: Iterable<readonly [string, string]>,
  read: ReadonlyMap<string, readonly SeriesMember[]> = new Map(),
): LinkOutcome {
  return inTransaction(db, () => {
    const unique = new Map<string, readonly [string, string]>();
    for (const [a, b] of pairs) unique.set(pairKeyOf(a, b), [a, b]);
    const all: Series[] = [];
    const assignments = new Map<string, string>();
    const retired = new Set<string>();
    for (const key of [...unique.keys()].sort()) {
      const [a, b] = unique.get(key)!;
      const members = read.get(key) ?? sightingsOfPair(db, a, b);
      if (members.length === 0) continue;
      const before = new Set(members.flatMap((m) => (m.event.seriesId ? [m.event.seriesId] : [])));
      const series = linkSeries(members);
      for (const s of series) {
        before.delete(s.id);
        for (const m of s.members) if (m.event.seriesId !== s.id) assignments.set(m.event.id, s.id);
      }
      // A provisional id a new event was stored with (RunOutcome.provisionalSeriesId) that
      // linking did not keep named no stored series: nothing was retired.
      for (const id of before) if (getSeries(db, id) !== null) retired.add(id);
      all.push(...series);
    }
    setEventSeries(db, assignments);
    deleteSeries(db, [...retired]);
    // Re-read the events whose risk a message may change: they carry their new series id.
    const reassessed = applyMessageCovariances(db, all);
    refreshStates(db, all);
    return { pairs: unique.size, series: all.map((s) => s.id), reassigned: assignments.size, retired: [...retired], reassessed };
  });
}

/**
 * Links the events of one run (a screening run, a merge, a received message), and any left unlinked.
 * `own`: the run's events exactly as just stored in this transaction (series id included), when
 * the caller holds them: then only the other runs' sightings of its pairs are read from the
 * database (an all-vs-all run's 10⁵ rows are not read back and converted again).
 */
export function linkRun(db: KeepclearDb, runId: string, own?: readonly ConjunctionEvent[]): LinkOutcome {
  return inTransaction(db, () => {
    const run = own ? getRun(db, runId) : null;
    const linked = run !== null && (LINKED_RUN_KINDS as readonly string[]).includes(run.kind) && (run.status === 'done' || run.status === 'cancelled');
    // The run's pairs with all their stored sightings, in one read.
    const read = sightingsOfRunPairs(db, runId, { otherRunsOnly: linked });
    if (linked) {
      // as db/series.ts memberOf makes them: a merge of shards is a screening run for series
      const source = { id: runId, kind: run.kind === 'cdm' ? ('cdm' as const) : ('screening' as const), createdAt: run.dataAt };
      for (const event of own!) {
        const key = pairKeyOf(event.primary, event.secondary);
        let list = read.get(key);
        if (!list) read.set(key, (list = []));
        list.push({ event, source });
      }
    }
    const pairs: (readonly [string, string])[] = [];
    for (const members of read.values()) {
      const e = members[0]!.event;
      pairs.push([e.primary, e.secondary]);
    }
    return linkPairs(db, [...pairs, ...unlinkedPairs(db)], read);
  });
}

/**
 * Links events stored before series existed (schema v4) or left unlinked; a no-op otherwise.
 * Commands that read series call it first.
 */
export function ensureLinked(db: KeepclearDb): LinkOutcome | null {
  const pending = unlinkedPairs(db);
  return pending.length === 0 ? null : linkPairs(db, pending);
}

/**
 * ensureLinked for readers: a database that cannot be written (read-only file, a lock held too
 * long) is still read, without the missing series ids.
 */
export function tryEnsureLinked(db: KeepclearDb): void {
  try {
    ensureLinked(db);
  } catch (err) {
    if (!(err instanceof KeepclearError && err.code.startsWith('DATABASE_'))) throw err;
  }
}

/** One series as the CLI and reports show it: its stored state, its events in data order, its trend. */
export interface SeriesView {
  readonly stored: StoredSeries;
  readonly series: Series;
  readonly trend: SeriesTrend;
}

export function seriesView(db: KeepclearDb, seriesId: string): SeriesView | null {
  const stored = getSeries(db, seriesId);
  if (!stored) return null;
  const members = eventsOfSeries(db, seriesId);
  if (members.length === 0) return null;
  const series = seriesFromStore(stored, members);
  return { stored, series, trend: seriesTrend(series) };
}

/** What a run changed, by series: found for the first time, found again, or no longer found. */
export interface SeriesChange {
  readonly seriesId: string;
  readonly primary: string;
  readonly secondary: string;
  readonly change: 'new' | 'updated' | 'no-longer-predicted';
  /** the run's event (new, updated) or the last sighting before the run (no longer predicted) */
  readonly event: ConjunctionEvent;
  /** the sighting before the run's, for "updated" and "no longer predicted" */
  readonly previous: ConjunctionEvent | null;
  /** the series' state now (it may have moved on since the run) */
  readonly stateNow: SeriesState | null;
}

export interface RunChanges {
  readonly runId: string;
  readonly dataAt: Instant;
  readonly changes: readonly SeriesChange[];
}

/**
 * What changed with a screening run, against the data that existed before it: each of its events
 * is "new" when nothing of its series is older, else "updated"; a series seen before the run,
 * whose TCA the run covered (with the tolerance) for either object of the pair, and which the run
 * did not find, is "no longer predicted" by this run.
 */
export function changesOfRun(db: KeepclearDb, runId: string): RunChanges | null {
  const run = getRun(db, runId);
  if (!run) return null;
  const changes: SeriesChange[] = [];
  const mine = sightingsOfRun(db, runId);
  const seriesIds = new Set<string>();
  for (const m of mine) {
    const sid = m.event.seriesId;
    if (!sid) continue;
    seriesIds.add(sid);
    const members = eventsOfSeries(db, sid);
    const idx = members.findIndex((x) => x.event.id === m.event.id);
    const previous = idx > 0 ? members[idx - 1]!.event : null;
    changes.push({
      seriesId: sid, primary: m.event.primary, secondary: m.event.secondary,
      change: previous ? 'updated' : 'new', event: m.event, previous, stateNow: getSeries(db, sid)?.state ?? null,
    });
  }
  if (run.kind === 'screening' || run.kind === 'merge') {
    const coverage: ScreeningCoverage = {
      id: run.id, createdAt: run.dataAt, start: run.settings.start, end: run.settings.end,
      primaries: run.settings.primaries, flagged: run.flagged.map((f) => f.id), volume: run.settings.volume,
    };
    // Candidates: series of the run's primaries whose newest TCA lies in (or near) its window.
    const pad = 86_400_000;
    const candidates = listSeries(db).filter((s) => !seriesIds.has(s.id) && s.tca >= run.settings.start - pad && s.tca <= run.settings.end + pad);
    for (const stored of candidates) {
      const before = eventsOfSeries(db, stored.id).filter((m) => m.source.createdAt < run.dataAt);
      if (before.length === 0) continue;
      const s = seriesFromStore(stored, before);
      const st = seriesStatus(s, [coverage], run.dataAt);
      if (st.state !== 'no-longer-predicted') continue;
      const last = before[before.length - 1]!.event;
      changes.push({
        seriesId: stored.id, primary: stored.primary, secondary: stored.secondary,
        change: 'no-longer-predicted', event: last, previous: last, stateNow: stored.state,
      });
    }
  }
  const order = { 'no-longer-predicted': 2, updated: 1, new: 0 } as const;
  changes.sort((a, b) => order[a.change] - order[b.change] || a.event.tca - b.event.tca);
  return { runId, dataAt: run.dataAt, changes };
}

/** The TCA tolerance two events of one pair were (or would be) linked with, in seconds: for the record. */
export function toleranceBetween(a: SeriesMember, b: SeriesMember): number {
  return tcaTolerance(sightingView(a.event, a.source.createdAt), sightingView(b.event, b.source.createdAt)).seconds;
}

/** How many of the given series are in each state (states as seriesStatesOf reads them). */
export function countOfStates(states: ReadonlyMap<string, SeriesState>): Record<SeriesState, number> {
  const counts: Record<SeriesState, number> = { new: 0, updated: 0, 'no-longer-predicted': 0, past: 0 };
  for (const s of states.values()) counts[s]++;
  return counts;
}

/** Counts of series by state (every stored series, or those of the given ids). */
export function countByState(db: KeepclearDb, ids?: ReadonlySet<string>): Record<SeriesState, number> {
  const counts: Record<SeriesState, number> = { new: 0, updated: 0, 'no-longer-predicted': 0, past: 0 };
  for (const s of listSeries(db)) if (!ids || ids.has(s.id)) counts[s.state]++;
  return counts;
}
