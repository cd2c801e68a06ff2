/**
 * The risk of many encounters at once (an all-vs-all run has ~10⁵): assessEncounter for each,
 * shared among worker threads in batches when there are enough of them to pay for starting the
 * threads. Each assessment is a pure function of its job, so the results are those of the
 * same calls in this thread, in the jobs' order, whatever the thread count.
 */
import { wrap, releaseProxy } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { availableParallelism } from 'node:os';
import type { RiskAssessment } from '../events/index.js';
import { startWorkers, stopWorkers } from '../workers/entry.js';
import { assessEncounter, type AssessInputs, type EncounterAtTca } from './assess.js';
import type { RiskWorkerApi } from './worker.js';

/**
 * One encounter and what its assessment needs, no more: a job is copied to a thread, and the
 * copy costs by the field (history given as historyStats, not as the element sets; the element
 * set as the three numbers the default table reads).
 */
export interface RiskJob {
  readonly encounter: EncounterAtTca;
  readonly inputs: AssessInputs;
}

/** Below this many jobs, starting threads costs more than it saves (~0.1 s per thread). */
export const PARALLEL_RISK_MIN_JOBS = 2000;
/** Jobs per message to a thread: large enough that messaging is cheap, small enough to balance. */
const BATCH = 1000;

/** Assessments of `jobs` in their order; `workers` threads (default one per core; 0: this thread). */
export function assessMany(jobs: readonly RiskJob[], workers = availableParallelism()): Promise<RiskAssessment[]> {
  return assessEach(jobs.length, (i) => jobs[i]!, workers);
}

/**
 * assessMany of the jobs jobAt(0) … jobAt(count − 1), each made when its batch is sent: the
 * threads start at once and work while this thread makes the next batches, instead of waiting
 * for all 10⁵ jobs (seconds of database reads and copying) to be made first.
 */
export async function assessEach(count: number, jobAt: (i: number) => RiskJob, workers = availableParallelism()): Promise<RiskAssessment[]> {
  const n = Math.min(workers, Math.ceil(count / BATCH));
  if (n <= 0 || count < PARALLEL_RISK_MIN_JOBS) {
    return Array.from({ length: count }, (_, i) => {
      const j = jobAt(i);
      return assessEncounter(j.encounter, j.inputs);
    });
  }
  const threads = await startWorkers('./worker.ts', import.meta.url, n);
  const apis = threads.map((w) => wrap<RiskWorkerApi>(nodeEndpoint(w)));
  try {
    const out = new Array<RiskAssessment>(count);
    let next = 0;
    await Promise.all(
      apis.map(async (api) => {
        // Each thread has its next batch queued while it works on one: made and sent here
        // before waiting for the batch in hand. Made only after the previous one came back, the
        // threads sat idle ~1.2 s each of a 10-s assessment of 124,503 encounters (profiled).
        let inHand: Promise<void> | null = null;
        while (next < count) {
          const from = next;
          next = Math.min(count, next + BATCH);
          const batch = new Array<RiskJob>(next - from);
          for (let k = 0; k < batch.length; k++) batch[k] = jobAt(from + k);
          const sent = api.assess(batch).then((done) => {
            for (let k = 0; k < done.length; k++) out[from + k] = done[k]!;
          });
          // Handled here too, so a failure while the batch before it is awaited is not an
          // unhandled rejection; it still rejects where it is awaited.
          sent.catch(() => undefined);
          if (inHand) await inHand;
          inHand = sent;
        }
        if (inHand) await inHand;
      }),
    );
    return out;
  } finally {
    for (const a of apis) a[releaseProxy]();
    stopWorkers(threads);
  }
}
