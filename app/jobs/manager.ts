/**
 * Long work of the desktop app and `keepclear serve` as jobs: each runs as a promise in this
 * process, reports progress, can be cancelled through its AbortSignal, and ends done, failed or
 * cancelled with a result. Listeners hear every change (throttled progress), which serve pushes
 * to the browser as server-sent events and Electron can forward over IPC.
 */
import { KeepclearError } from '../../core/errors.js';
import type { JobKind, JobProgress, JobResult, JobStatus } from '../../core/bridge/contract.js';

export interface JobContext {
  readonly signal: AbortSignal;
  progress(done: number, total: number, message: string): void;
}

export type JobWork = (ctx: JobContext) => Promise<JobResult>;
export type JobListener = (status: JobStatus) => void;

/** Progress updates closer together than this are merged: a browser needs no more than ~10 a second. */
export const PROGRESS_MIN_INTERVAL_MS = 100;
/** Finished jobs kept for `jobs.get`/`jobs.list`; older ones are forgotten. */
export const FINISHED_JOBS_KEPT = 50;

interface Entry {
  status: JobStatus;
  readonly controller: AbortController;
  lastSent: number;
  pending: ReturnType<typeof setTimeout> | null;
  readonly done: Promise<JobStatus>;
}

const messageOf = (err: unknown): string =>
  err instanceof KeepclearError ? err.toLine() : err instanceof Error ? err.message : String(err);

export class JobManager {
  private readonly jobs = new Map<string, Entry>();
  private readonly listeners = new Set<JobListener>();
  private seq = 0;

  constructor(private readonly now: () => number = Date.now) {}

  /** Starts `work` at once; the status comes back before any of it has run. */
  start(kind: JobKind, title: string, work: JobWork): JobStatus {
    const id = `J${++this.seq}`;
    const controller = new AbortController();
    let resolveDone!: (s: JobStatus) => void;
    const entry: Entry = {
      status: {
        id, kind, title, state: 'running', progress: null,
        startedAt: new Date(this.now()).toISOString(), finishedAt: null, error: null, result: null,
      },
      controller,
      lastSent: 0,
      pending: null,
      done: new Promise<JobStatus>((r) => (resolveDone = r)),
    };
    this.jobs.set(id, entry);
    this.forgetOld();
    const ctx: JobContext = {
      signal: controller.signal,
      progress: (done, total, message) => this.progress(entry, { done, total, message }),
    };
    // Deferred so the caller has the status (and listeners their first event) before work begins.
    setImmediate(() => {
      work(ctx).then(
        // a cancelled job may still have a result (a screening stores what it found so far)
        (result) => this.finish(entry, controller.signal.aborted ? 'cancelled' : 'done', null, result),
        (err: unknown) => this.finish(entry, controller.signal.aborted ? 'cancelled' : 'failed', controller.signal.aborted ? null : messageOf(err), null),
      ).finally(() => resolveDone(entry.status));
    });
    this.emit(entry.status);
    return entry.status;
  }

  get(id: string): JobStatus {
    return this.entry(id).status;
  }

  /** Asks the job to stop; it ends `cancelled` (a screening keeps what it found, stored as a cancelled run). */
  cancel(id: string): JobStatus {
    const e = this.entry(id);
    if (e.status.state === 'running') e.controller.abort();
    return e.status;
  }

  /** Resolves when the job has ended (tests, shutdown). */
  whenDone(id: string): Promise<JobStatus> {
    return this.entry(id).done;
  }

  list(): JobStatus[] {
    return [...this.jobs.values()].map((e) => e.status).reverse();
  }

  subscribe(listener: JobListener): () => void {
    this.listeners.add(listener);
    return () => void this.listeners.delete(listener);
  }

  /** Cancels every running job and waits for them to end. */
  async shutdown(): Promise<void> {
    const running = [...this.jobs.values()].filter((e) => e.status.state === 'running');
    for (const e of running) e.controller.abort();
    await Promise.all(running.map((e) => e.done));
  }

  private entry(id: string): Entry {
    const e = this.jobs.get(id);
    if (!e) throw new KeepclearError('NOT_FOUND', `no job "${id}" (jobs are kept while the app runs; finished ones are forgotten after ${FINISHED_JOBS_KEPT})`);
    return e;
  }

  private progress(e: Entry, p: JobProgress): void {
    if (e.status.state !== 'running') return;
    e.status = { ...e.status, progress: p };
    const wait = e.lastSent + PROGRESS_MIN_INTERVAL_MS - this.now();
    if (wait <= 0) {
      this.send(e);
    } else if (e.pending === null) {
      e.pending = setTimeout(() => this.send(e), wait);
    }
  }

  private send(e: Entry): void {
    if (e.pending !== null) clearTimeout(e.pending);
    e.pending = null;
    e.lastSent = this.now();
    this.emit(e.status);
  }

  private finish(e: Entry, state: JobStatus['state'], error: string | null, result: JobResult | null): void {
    e.status = { ...e.status, state, error, result, finishedAt: new Date(this.now()).toISOString() };
    this.send(e);
  }

  private emit(status: JobStatus): void {
    for (const l of this.listeners) {
      try {
        l(status);
      } catch {
        // a listener that fails (a closed connection) must not stop the job or the others
      }
    }
  }

  private forgetOld(): void {
    const finished = [...this.jobs.values()].filter((e) => e.status.state !== 'running');
    for (const e of finished.slice(0, Math.max(0, finished.length - FINISHED_JOBS_KEPT))) this.jobs.delete(e.status.id);
  }
}
