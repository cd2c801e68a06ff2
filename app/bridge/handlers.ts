/**
 * The bridge's handlers over one database: THE implementation of core/bridge/contract.ts shared
 * by `keepclear serve` (app/serve) and the desktop app's main process. Requests arrive already
 * validated (core/bridge/dispatch.ts); unknown ids are NOT_FOUND.
 */
import type { BridgeHandlers } from '../../core/bridge/contract.js';
import type { KeepclearDb } from '../../db/index.js';
import { JobManager } from '../jobs/manager.js';
import { eventView } from './eventView.js';
import { exportEvent } from './exports.js';
import { eventScene } from './scene.js';
import { startImport, startPlan, startScreening } from './jobStarters.js';
import { catalogSummary, eventResponse, runEvents, runsList } from './queries.js';
import { makeReport } from './reports.js';

export interface BridgeHost {
  readonly handlers: BridgeHandlers;
  /** the jobs started through `jobs.start`; subscribe to push their progress */
  readonly jobs: JobManager;
}

export function createBridgeHandlers(db: KeepclearDb, jobs: JobManager = new JobManager()): BridgeHost {
  const handlers: BridgeHandlers = {
    'catalog.summary': () => catalogSummary(db),
    'runs.list': ({ limit }) => runsList(db, limit),
    'runs.events': ({ runId }) => runEvents(db, runId),
    'events.get': ({ eventId }) => eventResponse(db, eventId),
    'events.view': ({ eventId }) => eventView(db, eventId),
    'events.scene': ({ eventId }) => eventScene(db, eventId),
    'reports.make': (req) => makeReport(db, req),
    'exports.make': (req) => exportEvent(db, req),
    'jobs.start': (req) => {
      switch (req.kind) {
        case 'import':
          return startImport(db, jobs, req);
        case 'screen':
          return startScreening(db, jobs, req);
        case 'plan':
          return startPlan(db, jobs, req);
      }
    },
    'jobs.get': ({ jobId }) => jobs.get(jobId),
    'jobs.cancel': ({ jobId }) => jobs.cancel(jobId),
    'jobs.list': () => ({ jobs: jobs.list() }),
  };
  return { handlers, jobs };
}
