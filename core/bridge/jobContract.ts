/**
 * Long work over the bridge — import, screening, manoeuvre planning — as jobs: `jobs.start`
 * answers at once with the job's status; progress follows as JobStatus updates (pushed over
 * server-sent events by `keepclear serve`, or read with `jobs.get`), and `jobs.cancel` stops it.
 * Types and request checks only; app/jobs runs them.
 */
import type { PlanProposalJson } from '../events/planProposal.js';
import { describe, idValue, isoField, isPlainObject, numberIn, objectWith, type Check } from './checks.js';

export type JobKind = 'import' | 'screen' | 'plan';
export type JobState = 'running' | 'done' | 'failed' | 'cancelled';

/** A file chosen in the browser, sent as its text (the host writes it to a private temporary folder). */
export interface UploadedFile {
  /** the file's own name, no folders */
  readonly name: string;
  readonly text: string;
}

export interface ImportJobRequest {
  readonly kind: 'import';
  readonly files: readonly UploadedFile[];
  /** hard-body radius (m) to set on every object of the files */
  readonly hbrM?: number;
}

export interface ScreenJobRequest {
  readonly kind: 'screen';
  /** catalogue numbers of the primaries (Alpha-5 allowed) */
  readonly primaries: readonly string[];
  /** window start, ISO UTC */
  readonly start: string;
  readonly days: number;
  /** radius of the screening sphere */
  readonly thresholdKm: number;
}

/** Exactly one target: a miss distance to reach, or a Pc to get below. */
export interface PlanJobRequest {
  readonly kind: 'plan';
  readonly eventId: string;
  readonly targetMissKm?: number;
  readonly targetPc?: number;
  /** the primary's mass and Isp, stored with the object before planning (absent: what is stored) */
  readonly massKg?: number;
  readonly ispS?: number;
}

export type JobStartRequest = ImportJobRequest | ScreenJobRequest | PlanJobRequest;

export interface JobProgress {
  readonly done: number;
  readonly total: number;
  /** what is being done, in words ("screening", "file 2 of 3: catalogue.tle") */
  readonly message: string;
}

export interface ImportFileResult {
  readonly name: string;
  readonly ok: boolean;
  /** TLE, OMM-KVN, …; null when not recognised */
  readonly format: string | null;
  readonly imported: number;
  readonly updated: number;
  readonly unchanged: number;
  readonly rejected: number;
  /** "FILE:LINE: what is wrong" lines: the file's error, or its first rejections */
  readonly problems: readonly string[];
}

/** A manoeuvre proposal as DESIGN.md's plan JSON has it, with the verification and the target. */
export interface PlanView {
  readonly event: string;
  readonly target: { readonly missKm: number | null; readonly pc: number | null };
  readonly proposal: PlanProposalJson | null;
  readonly trade: readonly { readonly leadTimeS: number; readonly deltaVMs: number; readonly achievedMissKm: number; readonly achievedPc: number | null }[];
  /** how the proposal was checked, and what that check found */
  readonly verification: { readonly method: string; readonly missKm: number; readonly pc: number | null; readonly notes: readonly string[] } | null;
  readonly newApproaches: readonly { readonly secondary: string; readonly tca: string; readonly missKm: number; readonly pc: number | null }[];
  /** why no proposal, when there is none */
  readonly note: string | null;
}

export type JobResult =
  | { readonly kind: 'import'; readonly files: readonly ImportFileResult[] }
  | { readonly kind: 'screen'; readonly runId: string; readonly status: string; readonly eventCount: number; readonly flagged: readonly string[] }
  | { readonly kind: 'plan'; readonly plan: PlanView };

export interface JobStatus {
  /** "J3" */
  readonly id: string;
  readonly kind: JobKind;
  /** one line for the user ("Screening 5 primaries, 7 d from 2026-12-07") */
  readonly title: string;
  readonly state: JobState;
  readonly progress: JobProgress | null;
  readonly startedAt: string;
  readonly finishedAt: string | null;
  /** why it failed ("FILE:LINE: what is wrong" where a file is at fault) */
  readonly error: string | null;
  readonly result: JobResult | null;
}

export interface JobIdRequest {
  readonly jobId: string;
}

export interface JobsList {
  /** newest first */
  readonly jobs: readonly JobStatus[];
}

// ───────────────────────────── limits and checks ─────────────────────────────

/** Files per import job: enough for a catalogue and a handful of messages; more is a mistake. */
export const IMPORT_MAX_FILES = 50;
/** Characters of one uploaded file: the import service's own input limit (256 MiB, app/import/readInput.ts). */
export const IMPORT_MAX_CHARS = 256 * 1024 * 1024;
export const FILE_NAME_MAX_LENGTH = 255;
export const PRIMARIES_MAX = 1000;
/** Screening window and radius limits: the CLI's (cli/commands/screen.ts). */
export const SCREEN_MAX_DAYS = 60;
export const SCREEN_MAX_THRESHOLD_KM = 1000;
/** Plan targets: a miss up to 100 km, a Pc from 1e-12 up to 1e-2 (anything above is no avoidance target). */
export const PLAN_MAX_MISS_KM = 100;
export const PLAN_PC_RANGE = [1e-12, 1e-2] as const;
/** Spacecraft from a 0.1 kg chip-sat to a 100 t station; Isp from cold gas (~30 s) to electric (~10,000 s). */
export const PLAN_MASS_RANGE_KG = [0.1, 100_000] as const;
export const PLAN_ISP_RANGE_S = [1, 10_000] as const;

const FILE_NAME_BAD = /[\u0000-\u001f\u007f/\\]/;

function fileCheck(f: unknown, i: number): string | null {
  const at = `files[${i}]`;
  const shape = objectWith(f, ['name', 'text']);
  if (shape) return `${at}: ${shape}`;
  const { name, text } = f as Record<string, unknown>;
  if (typeof name !== 'string' || name.length === 0 || name.length > FILE_NAME_MAX_LENGTH || FILE_NAME_BAD.test(name) || name === '.' || name === '..') {
    return `${at}: "name" must be a file name of 1 to ${FILE_NAME_MAX_LENGTH} characters without folders or control characters, got ${describe(name)}`;
  }
  if (typeof text !== 'string') return `${at} (${name}): "text" must be the file's text, got ${describe(text)}`;
  if (text.length > IMPORT_MAX_CHARS) return `${at} (${name}): ${text.length} characters is above the ${IMPORT_MAX_CHARS} limit; split the file`;
  return null;
}

function importCheck(r: Record<string, unknown>): string | null {
  const shape = objectWith(r, ['kind', 'files', 'hbrM']);
  if (shape) return shape;
  const files = r['files'];
  if (!Array.isArray(files) || files.length === 0 || files.length > IMPORT_MAX_FILES) {
    return `"files" must be a list of 1 to ${IMPORT_MAX_FILES} files, got ${Array.isArray(files) ? `${files.length} files` : describe(files)}`;
  }
  for (let i = 0; i < files.length; i++) {
    const p = fileCheck(files[i], i);
    if (p) return p;
  }
  if (r['hbrM'] !== undefined) return numberIn(r['hbrM'], 'hbrM', 0.01, 1000, 'a hard-body radius in m from 0.01 to 1000');
  return null;
}

function screenCheck(r: Record<string, unknown>): string | null {
  const shape = objectWith(r, ['kind', 'primaries', 'start', 'days', 'thresholdKm']);
  if (shape) return shape;
  const p = r['primaries'];
  if (!Array.isArray(p) || p.length === 0 || p.length > PRIMARIES_MAX) {
    return `"primaries" must be a list of 1 to ${PRIMARIES_MAX} object ids, got ${Array.isArray(p) ? `${p.length} ids` : describe(p)}`;
  }
  for (let i = 0; i < p.length; i++) {
    const bad = idValue(p[i], `primaries[${i}]`);
    if (bad) return bad;
  }
  return (
    isoField(r['start'], 'start') ??
    numberIn(r['days'], 'days', Number.MIN_VALUE, SCREEN_MAX_DAYS, `a number of days in (0, ${SCREEN_MAX_DAYS}]`) ??
    numberIn(r['thresholdKm'], 'thresholdKm', Number.MIN_VALUE, SCREEN_MAX_THRESHOLD_KM, `a distance in km in (0, ${SCREEN_MAX_THRESHOLD_KM}]`)
  );
}

function planCheck(r: Record<string, unknown>): string | null {
  const shape = objectWith(r, ['kind', 'eventId', 'targetMissKm', 'targetPc', 'massKg', 'ispS']);
  if (shape) return shape;
  if (r['massKg'] !== undefined) {
    const bad = numberIn(r['massKg'], 'massKg', PLAN_MASS_RANGE_KG[0], PLAN_MASS_RANGE_KG[1], `a mass in kg from ${PLAN_MASS_RANGE_KG[0]} to ${PLAN_MASS_RANGE_KG[1]}`);
    if (bad) return bad;
  }
  if (r['ispS'] !== undefined) {
    const bad = numberIn(r['ispS'], 'ispS', PLAN_ISP_RANGE_S[0], PLAN_ISP_RANGE_S[1], `an Isp in s from ${PLAN_ISP_RANGE_S[0]} to ${PLAN_ISP_RANGE_S[1]}`);
    if (bad) return bad;
  }
  const id = idValue(r['eventId'], 'eventId');
  if (id) return id;
  const miss = r['targetMissKm'];
  const pc = r['targetPc'];
  if ((miss === undefined) === (pc === undefined)) return 'give exactly one of "targetMissKm" or "targetPc"';
  if (miss !== undefined) return numberIn(miss, 'targetMissKm', Number.MIN_VALUE, PLAN_MAX_MISS_KM, `a miss distance in km in (0, ${PLAN_MAX_MISS_KM}]`);
  return numberIn(pc, 'targetPc', PLAN_PC_RANGE[0], PLAN_PC_RANGE[1], `a Pc from ${PLAN_PC_RANGE[0]} to ${PLAN_PC_RANGE[1]}`);
}

export const jobStartCheck: Check = (req) => {
  if (!isPlainObject(req)) return `the request must be a plain object, got ${describe(req)}`;
  switch (req['kind']) {
    case 'import':
      return importCheck(req);
    case 'screen':
      return screenCheck(req);
    case 'plan':
      return planCheck(req);
    default:
      return `"kind" must be "import", "screen" or "plan", got ${describe(req['kind'])}`;
  }
};
