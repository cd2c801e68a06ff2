/** The bridge's read-only channels over the database: catalogue, runs, events. */
import { eventDetailOf, eventRowOf, runSummaryOf } from '../../core/bridge/convert.js';
import type { CatalogSummary, EventResponse, RunEvents, RunsList } from '../../core/bridge/contract.js';
import { KeepclearError } from '../../core/errors.js';
import { toIso, type Instant } from '../../core/time/instant.js';
import { seriesStatesOf } from '../seriesJson.js';
import { countObjects, eventsOfRun, getEvent, getRun, listRuns, newestElementEpochMs, type KeepclearDb } from '../../db/index.js';

/** Runs listed when the renderer does not say how many. */
export const DEFAULT_RUNS_LISTED = 100;

export function catalogSummary(db: KeepclearDb): CatalogSummary {
  const t = newestElementEpochMs(db);
  return { objectCount: countObjects(db), latestEpoch: t === null ? null : toIso(t as Instant) };
}

export function runsList(db: KeepclearDb, limit: number | undefined): RunsList {
  return { runs: listRuns(db, limit ?? DEFAULT_RUNS_LISTED).map(runSummaryOf) };
}

export function runEvents(db: KeepclearDb, runId: string): RunEvents {
  if (!getRun(db, runId)) throw new KeepclearError('NOT_FOUND', `no run "${runId}"`);
  const events = eventsOfRun(db, runId);
  const states = seriesStatesOf(db, events);
  return {
    runId,
    events: events.map((e) => ({ ...eventRowOf(e), seriesId: e.seriesId ?? null, seriesState: (e.seriesId && states.get(e.seriesId)) ?? null })),
  };
}

export function eventResponse(db: KeepclearDb, eventId: string): EventResponse {
  const e = getEvent(db, eventId);
  if (!e) throw new KeepclearError('NOT_FOUND', `no event "${eventId}"`);
  return { event: eventDetailOf(e) };
}
