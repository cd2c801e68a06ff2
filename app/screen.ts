import type { Instant } from '../core/time/instant.js';
import { KeepclearError } from '../core/errors.js';
import { runScreening } from '../core/screening/run.js';
import type { ScreeningSettings } from '../core/screening/types.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import {
  catalogFingerprint,
  createRun,
  finishRun,
  getRun,
  inTransaction,
  latestElementSets,
  mergeEventExtra,
  type KeepclearDb,
  type RunRecord,
  type StoredCdm,
} from '../db/index.js';
import { matchingCdm } from './cdmMatch.js';
import { RiskContext } from './risk.js';

export interface ScreenRequest {
  readonly settings: ScreeningSettings;
  readonly workers?: number;
  readonly onProgress?: (done: number, total: number) => void;
  readonly signal?: AbortSignal;
}

export interface ScreenResult {
  readonly run: RunRecord;
  readonly events: ConjunctionEvent[];
}

/**
 * One screening run end to end: the newest element set of every stored object, the screening
 * (worker threads), the risk of each encounter, and the run stored in one transaction.
 * A cancelled run is stored as cancelled with what was found so far.
 */
export async function screenAndStore(db: KeepclearDb, req: ScreenRequest): Promise<ScreenResult> {
  const sets = latestElementSets(db);
  if (sets.length === 0) {
    throw new KeepclearError('NOT_FOUND', 'the database holds no element sets; import a catalogue first (keepclear import FILE)');
  }
  const known = new Set(sets.map((s) => s.objectId));
  if (req.settings.primaries !== 'all') {
    const missing = req.settings.primaries.filter((p) => !known.has(p));
    if (missing.length > 0) {
      throw new KeepclearError('NOT_FOUND', `no element set for primary ${missing.join(', ')}; import it first or check the id`);
    }
  }
  const runId = createRun(db, req.settings, catalogFingerprint(db), sets.length);
  let outcome;
  try {
    outcome = await runScreening(sets, req.settings, {
      ...(req.workers !== undefined ? { workers: req.workers } : {}),
      ...(req.onProgress ? { onProgress: req.onProgress } : {}),
      ...(req.signal ? { signal: req.signal } : {}),
    });
  } catch (err) {
    finishRun(db, runId, { status: 'failed', wallMs: 0, flagged: [], events: [] });
    throw err;
  }
  // Covariance precedence: a received message about the same conjunction comes first, then the
  // object's element-set history, then the default table (DESIGN.md risk requirements).
  const risk = new RiskContext(db);
  const cache = new Map<string, StoredCdm[]>();
  const matches = outcome.encounters.map((e) => matchingCdm(db, e, cache));
  const events = outcome.encounters.map((e, i) => ({ ...e, risk: risk.assess(e, matches[i] ?? undefined) }));
  const stored = inTransaction(db, () => {
    const evs = finishRun(db, runId, {
      status: outcome.cancelled ? 'cancelled' : 'done',
      wallMs: outcome.wallMs,
      flagged: outcome.flagged,
      events,
    });
    evs.forEach((ev, i) => {
      const m = matches[i];
      if (m) mergeEventExtra(db, ev.id, { cdmId: m.cdm.id, cdmEventId: m.cdm.eventId, reportedPc: m.cdm.reportedPc });
    });
    return evs;
  });
  return { run: getRun(db, runId)!, events: stored };
}

export const daysAfter = (start: Instant, days: number): Instant => (start + days * 86_400_000) as Instant;
