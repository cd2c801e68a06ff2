/**
 * The state of a series as of the newest data, in words of our own:
 *
 * - `new`                  seen once so far (one screening run or one received message), TCA ahead.
 * - `updated`              seen again: two or more sightings, TCA ahead, and no newer screening
 *                          run that covered it has missed it.
 * - `no-longer-predicted`  a screening run newer than the last sighting, whose window covers the
 *                          series' TCA (with the series' own tolerance on either side) and whose
 *                          primaries include either object of the pair (or all objects), did not
 *                          find it. A run that left either object out (flagged) says nothing.
 *                          A later sighting (a run or a message) makes the series `updated` again.
 * - `past`                 the TCA of the newest sighting lies before the newest data (`asOf`):
 *                          nothing to act on any more. Takes precedence over the others.
 *
 * Only screening runs can miss a conjunction: a received message speaks of its own conjunction
 * and says nothing about others.
 */
import type { Instant } from '../time/instant.js';
import type { ScreeningVolume } from '../screening/types.js';
import type { Series } from './seriesLink.js';
import { sightingView, tcaTolerance } from './seriesTolerance.js';

export type SeriesState = 'new' | 'updated' | 'no-longer-predicted' | 'past';

export const SERIES_STATE_MEANING: Readonly<Record<SeriesState, string>> = {
  new: 'seen once so far; TCA ahead',
  updated: 'seen again; TCA ahead',
  'no-longer-predicted': 'a newer screening run covering its TCA did not find it',
  past: 'its TCA has elapsed relative to the newest data',
};

/** What a screening run covered: enough to tell whether it should have seen a conjunction. */
export interface ScreeningCoverage {
  /** run id; the same as the SeriesSource id of the run's sightings */
  readonly id: string;
  /** the run's time: the same as its SeriesSource.createdAt */
  readonly createdAt: Instant;
  readonly start: Instant;
  readonly end: Instant;
  readonly primaries: readonly string[] | 'all';
  /** objects the run left out (propagation failures) */
  readonly flagged?: readonly string[];
  /** the run's screening volume; absent: taken to hold any miss */
  readonly volume?: ScreeningVolume;
}

/**
 * Would the run's volume have held a sighting with this miss? For an ellipsoid only its smallest
 * semi-axis is sure (the sighting's RTN frame may be the other object's), so a run misses a
 * conjunction only where it certainly looked.
 */
function volumeHolds(volume: ScreeningVolume | undefined, missKm: number): boolean {
  if (!volume) return true;
  return volume.kind === 'sphere' ? missKm <= volume.radiusKm : missKm <= Math.min(volume.rKm, volume.tKm, volume.nKm);
}

export interface SeriesStatus {
  readonly state: SeriesState;
  readonly asOf: Instant;
  /** TCA of the newest sighting */
  readonly tca: Instant;
  readonly sightings: number;
  /** creation time and source of the newest sighting */
  readonly lastSeen: Instant;
  readonly lastSeenBy: string;
  /** the newest screening run that covered the TCA after the last sighting and did not find it */
  readonly missedBy: string | null;
}

/** The newest data time among sources (screening runs and received messages). */
export function newestDataTime(sources: Iterable<{ readonly createdAt: Instant }>): Instant | null {
  let newest: Instant | null = null;
  for (const s of sources) if (newest === null || s.createdAt > newest) newest = s.createdAt;
  return newest;
}

const screens = (run: ScreeningCoverage, a: string, b: string): boolean =>
  (run.primaries === 'all' || run.primaries.includes(a) || run.primaries.includes(b)) &&
  !(run.flagged ?? []).some((id) => id === a || id === b);

/**
 * State of one series. `runs`: the screening runs known (any order; runs that are sources of the
 * series' sightings are fine to include). `asOf`: the newest data time (newestDataTime of every
 * run and message), which decides `past`.
 */
export function seriesStatus(series: Series, runs: readonly ScreeningCoverage[], asOf: Instant): SeriesStatus {
  const newest = series.members[series.members.length - 1]!;
  const tca = newest.event.tca;
  // Written out, not spread from a common base: a key added after a spread costs ~2 µs in V8
  // (Node 20), and a run links 10⁵ series (DEVELOPERS.md, Conventions).
  const status = (state: SeriesState, missedBy: string | null): SeriesStatus => ({
    asOf,
    tca,
    sightings: series.members.length,
    lastSeen: newest.source.createdAt,
    lastSeenBy: newest.source.id,
    state,
    missedBy,
  });
  if (tca < asOf) return status('past', null);
  let marginMs: number | null = null;
  let seenBy: Set<string> | null = null;
  let missedBy: ScreeningCoverage | null = null;
  for (const run of runs) {
    if (run.createdAt <= newest.source.createdAt) continue;
    seenBy ??= new Set(series.members.map((m) => m.source.id));
    if (seenBy.has(run.id)) continue;
    // Where the TCA could be, by the newest sighting's own uncertainty (only when a newer run
    // could have missed it: a new run's own series have none).
    if (marginMs === null) {
      const view = sightingView(newest.event, newest.source.createdAt);
      marginMs = tcaTolerance(view, view).seconds * 1000;
    }
    if (run.start > tca - marginMs || run.end < tca + marginMs) continue;
    if (!screens(run, series.primary, series.secondary)) continue;
    if (!volumeHolds(run.volume, newest.event.missKm)) continue;
    if (!missedBy || run.createdAt > missedBy.createdAt || (run.createdAt === missedBy.createdAt && run.id > missedBy.id)) missedBy = run;
  }
  if (missedBy) return status('no-longer-predicted', missedBy.id);
  return status(series.members.length === 1 ? 'new' : 'updated', null);
}
