/**
 * The work behind `jobs.start`: import uploaded files, screen, plan. Each runs as a JobManager
 * job with progress and cancel, and comes back as a JobResult for the renderer.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { ImportFileResult, ImportJobRequest, JobResult, JobStatus, PlanJobRequest, PlanView, ScreenJobRequest } from '../../core/bridge/contract.js';
import { canonicalObjectId } from '../../core/elements/objectId.js';
import { KeepclearError, rejectionLine } from '../../core/errors.js';
import type { ScreeningSettings } from '../../core/screening/types.js';
import { MS_PER_DAY, parseIso, type Instant } from '../../core/time/instant.js';
import type { KeepclearDb } from '../../db/index.js';
import type { FileOutcome } from '../import/index.js';
import type { JobContext, JobManager } from '../jobs/manager.js';
import type { PlanDocument } from '../plan/index.js';

/** Rejections listed per file in the result; the rest are counted (the CLI lists them all). */
export const PROBLEMS_LISTED_PER_FILE = 20;

function fileResult(o: FileOutcome, name: string, tempPath: string): ImportFileResult {
  // Messages carry the private temporary path; the user knows the file by its name.
  const named = (line: string): string => line.split(tempPath).join(name);
  if (!o.ok) {
    return { name, ok: false, format: o.format, imported: 0, updated: 0, unchanged: 0, rejected: 0, problems: [named(o.error.toLine())] };
  }
  return {
    name,
    ok: true,
    format: o.format,
    ...o.counts,
    problems: o.rejections.slice(0, PROBLEMS_LISTED_PER_FILE).map((r) => named(rejectionLine(r))),
  };
}

async function importJob(db: KeepclearDb, req: ImportJobRequest, ctx: JobContext): Promise<JobResult> {
  const { importFiles } = await import('../import/index.js');
  // Files go through the same service as the CLI, from a private folder removed afterwards.
  const dir = mkdtempSync(join(tmpdir(), 'keepclear-upload-'));
  const results: ImportFileResult[] = [];
  try {
    for (const [i, f] of req.files.entries()) {
      if (ctx.signal.aborted) break;
      ctx.progress(i, req.files.length, `file ${i + 1} of ${req.files.length}: ${f.name}`);
      // Let the progress reach the page before the (synchronous) import of this file.
      await new Promise((r) => setImmediate(r));
      const path = join(dir, `${i}-${f.name}`);
      writeFileSync(path, f.text, { mode: 0o600 });
      const summary = importFiles(db, { files: [path], ...(req.hbrM !== undefined ? { hbrM: req.hbrM } : {}) });
      results.push(fileResult(summary.outcomes[0]!, f.name, path));
      rmSync(path, { force: true });
    }
    ctx.progress(results.length, req.files.length, 'import finished');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  return { kind: 'import', files: results };
}

export function screeningSettingsOf(req: ScreenJobRequest): ScreeningSettings {
  const start = parseIso(req.start);
  if (start === null) throw new KeepclearError('BAD_ARGUMENT', `start must be an ISO 8601 UTC time, got "${req.start}"`);
  const primaries = [...new Set(req.primaries.map(canonicalObjectId))];
  return {
    start,
    end: (start + req.days * MS_PER_DAY) as Instant,
    volume: { kind: 'sphere', radiusKm: req.thresholdKm },
    primaries,
  };
}

async function screenJob(db: KeepclearDb, settings: ScreeningSettings, ctx: JobContext): Promise<JobResult> {
  const { screenAndStore } = await import('../screen.js');
  const { run, events } = await screenAndStore(db, {
    settings,
    onProgress: (done, total) => ctx.progress(done, total, 'screening'),
    signal: ctx.signal,
  });
  return { kind: 'screen', runId: run.id, status: run.status, eventCount: events.length, flagged: run.flagged.map((f) => `${f.id}: ${f.reason}`) };
}

async function planJob(db: KeepclearDb, req: PlanJobRequest, ctx: JobContext): Promise<JobResult> {
  const { planForEvent } = await import('../plan/index.js');
  const { getEvent, setSpacecraft } = await import('../../db/index.js');
  const e = getEvent(db, req.eventId);
  if (!e) throw new KeepclearError('NOT_FOUND', `no event "${req.eventId}"`);
  if (req.massKg !== undefined || req.ispS !== undefined) {
    setSpacecraft(db, e.primary, { ...(req.massKg !== undefined ? { massKg: req.massKg } : {}), ...(req.ispS !== undefined ? { ispS: req.ispS } : {}) });
  }
  const target = req.targetMissKm !== undefined ? { kind: 'miss' as const, missKm: req.targetMissKm } : { kind: 'pc' as const, pc: req.targetPc! };
  const plan = await planForEvent(db, req.eventId, {
    target,
    signal: ctx.signal,
    onProgress: (p) => ctx.progress(p.done, p.total, p.phase === 'trade' ? 'trade over lead times' : 're-screening the manoeuvred path'),
  });
  return { kind: 'plan', plan: planViewOf(plan.document) };
}

const num = (x: unknown): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);

/** The plan document (app/plan/json.ts, what `plan --json` writes) as the renderer shows it. */
export function planViewOf(d: PlanDocument): PlanView {
  const v = d.verification as { method?: unknown; sgp4PlusDifference?: { missKm?: unknown; pc?: unknown } | null; fullyNumerical?: { missKm?: unknown; pc?: unknown } | null } | null;
  const checked = v?.sgp4PlusDifference ?? v?.fullyNumerical ?? null;
  const p = d.proposal;
  return {
    event: d.event,
    target: { missKm: 'missKm' in d.target ? d.target.missKm : null, pc: 'pc' in d.target ? d.target.pc : null },
    proposal: p && {
      burnTime: p.burnTime,
      leadTimeS: p.leadTimeS,
      direction: p.direction,
      deltaVMs: p.deltaVMs,
      deltaVRtnMs: p.deltaVRtnMs,
      achievedMissKm: p.achievedMissKm ?? Number.NaN,
      achievedPc: p.achievedPc,
      propellantKg: p.propellantKg,
    },
    trade: d.trade
      .filter((t) => t.deltaVMs !== null && t.achievedMissKm !== null)
      .map((t) => ({ leadTimeS: t.leadTimeS, deltaVMs: t.deltaVMs!, achievedMissKm: t.achievedMissKm!, achievedPc: t.achievedPc })),
    verification:
      v && checked && num(checked.missKm) !== null
        ? { method: String(v.method ?? 'numerical propagation'), missKm: num(checked.missKm)!, pc: num(checked.pc), notes: [...d.notes] }
        : null,
    newApproaches: d.newApproaches.map((a) => ({ secondary: String(a['secondary']), tca: String(a['tca']), missKm: num(a['missKm']) ?? Number.NaN, pc: num(a['pc']) })),
    note: p ? null : `no proposal (${d.status})${d.notes.length ? `: ${d.notes.join('; ')}` : ''}`,
  };
}

const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

export function startImport(db: KeepclearDb, jobs: JobManager, req: ImportJobRequest): JobStatus {
  const title = `Import ${req.files.length === 1 ? req.files[0]!.name : plural(req.files.length, 'file')}`;
  return jobs.start('import', title, (ctx) => importJob(db, req, ctx));
}

export function startScreening(db: KeepclearDb, jobs: JobManager, req: ScreenJobRequest): JobStatus {
  // Checked before the job starts, so a bad id is an answer to the request, not a failed job.
  const settings = screeningSettingsOf(req);
  const title = `Screen ${plural(req.primaries.length, 'primary').replace('primarys', 'primaries')}, ${req.days} d from ${req.start.slice(0, 10)}, ${req.thresholdKm} km`;
  return jobs.start('screen', title, (ctx) => screenJob(db, settings, ctx));
}

export function startPlan(db: KeepclearDb, jobs: JobManager, req: PlanJobRequest): JobStatus {
  return jobs.start('plan', `Plan an avoidance manoeuvre for ${req.eventId}`, (ctx) => planJob(db, req, ctx));
}
