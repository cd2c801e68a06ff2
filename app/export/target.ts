import { KeepclearError } from '../../core/errors.js';
import type { ConjunctionEvent } from '../../core/events/index.js';
import { eventsOfRun, getEvent, getRun, type KeepclearDb, type RunRecord } from '../../db/index.js';
import { ensureLinked, seriesView, type SeriesView } from '../series.js';

/** What to export: one event, the events of one run, or one series. */
export type ExportTarget = { readonly event: string } | { readonly run: string } | { readonly series: string };

export interface ExportSelection {
  readonly kind: 'event' | 'run' | 'series';
  readonly id: string;
  /** the run of a run export, or of the single event; null for a series */
  readonly run: RunRecord | null;
  /** the series of a series export, its events in the order their data was created */
  readonly series: SeriesView | null;
  readonly events: readonly ConjunctionEvent[];
}

/** The events a target names; an unknown id is NOT_FOUND with what to do. */
export function selectEvents(db: KeepclearDb, target: ExportTarget): ExportSelection {
  if ('event' in target) {
    const e = getEvent(db, target.event);
    if (!e) throw new KeepclearError('NOT_FOUND', `no event "${target.event}"; list event ids with keepclear events`);
    return { kind: 'event', id: e.id, run: getRun(db, e.runId), series: null, events: [e] };
  }
  if ('series' in target) {
    // Databases written before series existed are linked on first use, as `events` does.
    ensureLinked(db);
    const view = seriesView(db, target.series);
    if (!view)
      throw new KeepclearError('NOT_FOUND', `no series "${target.series}"; every event's seriesId is in keepclear events --json -`);
    return { kind: 'series', id: view.stored.id, run: null, series: view, events: view.series.members.map((m) => m.event) };
  }
  const run = getRun(db, target.run);
  if (!run) throw new KeepclearError('NOT_FOUND', `no run "${target.run}"; see the run ids in keepclear events --json -`);
  return { kind: 'run', id: run.id, run, series: null, events: eventsOfRun(db, run.id) };
}
