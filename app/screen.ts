import type { Instant } from '../core/time/instant.js';
import { KeepclearError } from '../core/errors.js';
import { runScreening, type ScreeningOutcome } from '../core/screening/run.js';
import type { ScreeningSettings } from '../core/screening/types.js';
import { encounterWith, seriesIdFor, type ConjunctionEvent } from '../core/events/index.js';
import {
  fingerprintOfCatalogue,
  createRun,
  finishRun,
  getEvent,
  getRun,
  inTransaction,
  readCatalogue,
  setRunDataAt,
  recordRunEphemeris,
  runEphemerides,
  seriesIdsOfRun,
  type KeepclearDb,
  type RunEphemeris,
  type RunRecord,
  type EphemerisSummary,
} from '../db/index.js';
import { chooseEphemerides } from './ephemerisChoice.js';
import { RiskContext } from './risk.js';
import { linkRun, type LinkOutcome } from './series.js';

export interface ScreenRequest {
  readonly settings: ScreeningSettings;
  readonly workers?: number;
  readonly onProgress?: (done: number, total: number) => void;
  readonly signal?: AbortSignal;
  /**
   * the time the run's data stands for (default: now). A replay of older weekly runs (the demo)
   * sets it, so series order and date the runs as they happened.
   */
  readonly dataAt?: Instant;
  /**
   * Called as each phase ends (screening, risk, store and link, series ids) with its wall time
   * in ms: the benchmark's phase timings (KEEPCLEAR_PHASES=1 on the command line).
   */
  readonly onPhase?: (phase: string, ms: number) => void;
}

export interface ScreenResult {
  readonly run: RunRecord;
  /** as stored: with risk and series id */
  readonly events: ConjunctionEvent[];
  readonly linked: LinkOutcome;
  /** the owner ephemerides (OEM) the run screened primaries from, in place of their element sets */
  readonly ephemerides: readonly RunEphemeris[];
  /** why a primary with ephemerides was screened from its element set (none covers the window) */
  readonly notes: readonly string[];
}

/**
 * One screening run end to end: the newest element set of every stored object, the screening
 * (worker threads), the risk of each encounter, and the run stored in one transaction.
 * A primary with an owner ephemeris (OEM) that covers the window is screened from the newest
 * such ephemeris instead of its element set, and the run records which (app/ephemerisChoice.ts);
 * an ephemeris that covers only part of the window is an error, never extrapolated.
 * A cancelled run is stored as cancelled with what was found so far.
 */
export async function screenAndStore(db: KeepclearDb, req: ScreenRequest): Promise<ScreenResult> {
  let mark = performance.now();
  const catalogue = readCatalogue(db);
  const sets = catalogue.sets;
  if (sets.length === 0) {
    throw new KeepclearError('NOT_FOUND', 'the database holds no element sets; import a catalogue first (keepclear import FILE)');
  }
  const known = new Set(sets.map((s) => s.objectId));
  const choice =
    req.settings.primaries === 'all'
      ? { used: new Map(), notes: [] }
      : chooseEphemerides(db, req.settings.primaries, req.settings.start, req.settings.end);
  if (req.settings.primaries !== 'all') {
    const missing = req.settings.primaries.filter((p) => !known.has(p) && !choice.used.has(p));
    if (missing.length > 0) {
      throw new KeepclearError('NOT_FOUND', `no element set or covering ephemeris for primary ${missing.join(', ')}; import one first or check the id`);
    }
  }
  const phase = (name: string): void => {
    const now = performance.now();
    req.onPhase?.(name, now - mark);
    mark = now;
  };
  phase('load');
  // The screening starts first and the run row is written while the workers work: the main
  // thread would otherwise spend the fingerprint's time (~0.15 s for 30,000 sets, when the one
  // kept since the last import no longer describes the sets) before any worker starts. It is of
  // the sets already loaded (no second catalogue read).
  // The caller's cancel, and ours should the run row not be written.
  const stop = new AbortController();
  const forward = (): void => stop.abort();
  if (req.signal?.aborted) stop.abort();
  req.signal?.addEventListener('abort', forward);
  const screening = runScreening(sets, req.settings, {
    ...(req.workers !== undefined ? { workers: req.workers } : {}),
    ...(req.onProgress ? { onProgress: req.onProgress } : {}),
    signal: stop.signal,
    ...(choice.used.size > 0
      ? {
          // The data behind an ephemeris is as old as its CREATION_DATE: that is the primary's epoch.
          primaryTrajectories: [...choice.used.values()].map((u) => ({ trajectory: u.trajectory, epoch: u.summary.creationDate })),
        }
      : {}),
  });
  // One turn of the event loop first, so the screening hands the workers their catalogue
  // before this thread spends its time on the fingerprint.
  await new Promise<void>((resolve) => setImmediate(resolve));
  let runId: string;
  try {
    runId = createRun(db, req.settings, fingerprintOfCatalogue(db, catalogue), sets.length);
  } catch (err) {
    // Nothing stored: stop the workers and drop what they found.
    stop.abort();
    await screening.catch(() => undefined);
    req.signal?.removeEventListener('abort', forward);
    throw err;
  }
  let outcome;
  try {
    outcome = await screening;
  } catch (err) {
    finishRun(db, runId, { status: 'failed', wallMs: 0, flagged: [], events: [] });
    throw err;
  } finally {
    req.signal?.removeEventListener('abort', forward);
  }
  // Covariance precedence: the object's element-set history, then the default table; a received
  // message of the same series comes first and is applied while linking (app/series.ts), since
  // which message is "the same conjunction" is the series rule's answer.
  // An ephemeris's covariance block, when it has one, is that primary's covariance (app/risk.ts).
  const risk = new RiskContext(db, new Map([...choice.used].map(([id, u]) => [id, u.trajectory])));
  phase('screening');
  const { linked, stored } = await assessAndStore(db, runId, outcome, risk, req, choice.used, phase);
  // Stored: the ~10⁵ encounters of an all-vs-all run can go.
  outcome.encounters.length = 0;
  const result = {
    run: getRun(db, runId)!,
    events: asLinked(db, runId, stored, linked),
    linked,
    ephemerides: runEphemerides(db, runId),
    notes: choice.notes,
  };
  phase('series ids');
  return result;
}

/**
 * The run's events as eventsOfRun reads them back, without reading them back: the events as
 * stored (same order: TCA, then sequence) with the series id linking gave each, and the few
 * whose risk linking changed (a received message's covariance) read again. Reading 10⁵ rows
 * back took seconds and held a second copy of every event.
 */
function asLinked(db: KeepclearDb, runId: string, stored: readonly ConjunctionEvent[], linked: LinkOutcome): ConjunctionEvent[] {
  const seriesIds = seriesIdsOfRun(db, runId);
  const reassessed = new Set(linked.reassessed);
  return stored.map((e) => {
    if (reassessed.has(e.id)) return getEvent(db, e.id)!;
    const seriesId = seriesIds.get(e.id);
    return seriesId === undefined ? e : encounterWith(e, { id: e.id, runId: e.runId, risk: e.risk, seriesId });
  });
}

/**
 * The risk of each encounter, then the run stored and linked in one transaction. A function of
 * its own so that the assessed copies of the encounters (an all-vs-all run has ~10⁵) are garbage
 * once it returns: only the events as stored are kept, and handed back.
 */
async function assessAndStore(
  db: KeepclearDb,
  runId: string,
  outcome: ScreeningOutcome,
  risk: RiskContext,
  req: ScreenRequest,
  used: ReadonlyMap<string, { readonly summary: EphemerisSummary }>,
  phase: (name: string) => void,
): Promise<{ linked: LinkOutcome; stored: ConjunctionEvent[] }> {
  const risks = await risk.assessMany(outcome.encounters, req.workers);
  const events = outcome.encounters.map((e, n) => encounterWith(e, { risk: risks[n]! }));
  phase('risk');
  let stored: ConjunctionEvent[] = [];
  const linked = inTransaction(db, () => {
    if (req.dataAt !== undefined) setRunDataAt(db, runId, req.dataAt);
    for (const u of used.values()) recordRunEphemeris(db, runId, u.summary);
    stored = finishRun(db, runId, {
      status: outcome.cancelled ? 'cancelled' : 'done',
      wallMs: outcome.wallMs,
      flagged: outcome.flagged,
      events,
      // Stored with the series each would found; linkRun below changes only those that join an
      // older series, instead of writing every row again (a new all-vs-all run: none of 124,503).
      provisionalSeriesId: seriesIdFor,
    });
    // In the same transaction: nobody sees the run's events without their series.
    // The run's events as they now stand in the database (with their provisional series ids):
    // linking need not read them back.
    return linkRun(db, runId, stored.map((e) => encounterWith(e, { id: e.id, runId: e.runId, risk: e.risk, seriesId: seriesIdFor(e.id) })));
  });
  phase('store and link');
  return { linked, stored };
}

export const daysAfter = (start: Instant, days: number): Instant => (start + days * 86_400_000) as Instant;
