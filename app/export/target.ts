import { KeepclearError } from '../../core/errors.js';
import type { ConjunctionEvent } from '../../core/events/index.js';
import { eventsOfRun, getEvent, getRun, type KeepclearDb, type RunRecord } from '../../db/index.js';

/** What to export: one event, the events of one run, or (with series stored) one series. */
export type ExportTarget = { readonly event: string } | { readonly run: string };

export interface ExportSelection {
  readonly kind: 'event' | 'run';
  readonly id: string;
  /** the run of a run export, or of the single event */
  readonly run: RunRecord | null;
  readonly events: readonly ConjunctionEvent[];
}

/** The events a target names; an unknown id is NOT_FOUND with what to do. */
export function selectEvents(db: KeepclearDb, target: ExportTarget): ExportSelection {
  if ('event' in target) {
    const e = getEvent(db, target.event);
    if (!e) throw new KeepclearError('NOT_FOUND', `no event "${target.event}"; list event ids with keepclear events`);
    return { kind: 'event', id: e.id, run: getRun(db, e.runId), events: [e] };
  }
  const run = getRun(db, target.run);
  if (!run) throw new KeepclearError('NOT_FOUND', `no run "${target.run}"; see the run ids in keepclear events --json -`);
  return { kind: 'run', id: run.id, run, events: eventsOfRun(db, run.id) };
}
