import { SERIES_STATE_MEANING, type SeriesState, type TrendChange } from '../core/events/index.js';
import { toIso } from '../core/time/instant.js';
import { getEventExtra, seriesStates, type KeepclearDb } from '../db/index.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import { eventToJson } from './eventJson.js';
import type { SeriesView } from './series.js';

const changeJson = (c: TrendChange | null): Record<string, unknown> | null =>
  c && {
    fromEventId: c.fromEventId,
    toEventId: c.toEventId,
    missChangeKm: c.missChangeKm,
    missFactor: c.missFactor,
    missDirection: c.missDirection,
    pcFactor: c.pcFactor,
    pcLog10Change: c.pcLog10Change,
    pcDirection: c.pcDirection,
    elapsedH: c.elapsedH,
  };

/**
 * JSON of `events --series ID` (DESIGN.md "Series"): `series` with id, primary, secondary and
 * state (plus what the state means, the newest TCA, the changes since the previous and the first
 * sighting), and `events` in the order their data was created, each with when its data was
 * created (`dataAt`), where it came from (`source`: screening or cdm) and its time to TCA.
 */
export function seriesToJson(db: KeepclearDb, view: SeriesView): Record<string, unknown> {
  const { stored, series, trend } = view;
  return {
    series: {
      id: stored.id,
      primary: stored.primary,
      secondary: stored.secondary,
      state: stored.state,
      stateMeaning: SERIES_STATE_MEANING[stored.state],
      tca: toIso(stored.tca),
      sightings: stored.sightings,
      lastDataAt: toIso(stored.lastDataAt),
      missedByRun: stored.missedByRun,
      asOf: toIso(stored.asOf),
      sincePrevious: changeJson(trend.sincePrevious),
      sinceFirst: changeJson(trend.sinceFirst),
    },
    events: series.members.map((m, i) =>
      Object.assign(eventToJson(m.event), {
        source: m.source.kind,
        dataAt: toIso(m.source.createdAt),
        timeToTcaH: trend.points[i]!.timeToTcaH,
        extra: getEventExtra(db, m.event.id) ?? {},
      }),
    ),
  };
}

/** The state of each event's series (for the `seriesState` field of event JSON), read in one statement. */
export function seriesStatesOf(db: KeepclearDb, events: readonly ConjunctionEvent[]): Map<string, SeriesState> {
  return seriesStates(db, events.flatMap((e) => (e.seriesId ? [e.seriesId] : [])));
}
