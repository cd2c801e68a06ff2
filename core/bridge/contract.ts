/**
 * The one typed contract between the renderer and the rest of Keepclear.
 *
 * The renderer calls `invoke(channel, request)` and gets the response; the desktop app carries
 * the call over Electron IPC (electron/preload.ts ↔ electron/ipc.ts), `keepclear serve` will
 * carry the same calls over a loopback HTTP/WebSocket host. Both ends go through `dispatch()`
 * (./dispatch.ts), so each request is checked here, at every boundary, before a handler sees it.
 *
 * Everything that crosses is plain data that survives JSON and structured clone: strings,
 * finite numbers, booleans, null, arrays and plain objects. Times are ISO 8601 UTC with
 * milliseconds and `Z`; distances are km in fields whose names end in `Km`, speeds km/s in
 * fields ending in `KmS`, the hard-body radius m (`M`), angles degrees (`Deg`).
 *
 * This file is pure TypeScript (no Electron, no SQL, no DOM) so every side can import it.
 */
import type { TierId } from '../risk/tiers.js';
import { describe, ID_MAX_LENGTH, objectWith, withId, type Check } from './checks.js';
import { jobStartCheck, type JobIdRequest, type JobStartRequest, type JobStatus, type JobsList } from './jobContract.js';
import { exportCheck, reportCheck, type EventView, type ExportRequest, type ReportDocument, type ReportRequest } from './viewContract.js';
import type { EncounterScene } from '../scene/encounterScene.js';

export * from './jobContract.js';
export * from './viewContract.js';

// ───────────────────────────── requests ─────────────────────────────

/** `catalog.summary` takes no parameters: send `{}`. */
export type CatalogSummaryRequest = Readonly<Record<string, never>>;

export interface RunsListRequest {
  /** most runs to return, newest first; 1…RUNS_LIST_MAX_LIMIT; default chosen by the handler */
  readonly limit?: number;
}

export interface RunEventsRequest {
  readonly runId: string;
}

export interface EventGetRequest {
  readonly eventId: string;
}

// ───────────────────────────── responses ─────────────────────────────

export interface CatalogSummary {
  /** objects known to the catalogue database */
  readonly objectCount: number;
  /** newest element-set epoch in the catalogue (ISO UTC); null when the catalogue is empty */
  readonly latestEpoch: string | null;
}

/** `interrupted`: its process died while it ran (marked when the database is next opened). */
export type RunStatus = 'running' | 'done' | 'cancelled' | 'failed' | 'interrupted';

export type ScreeningVolumeSummary =
  | { readonly kind: 'sphere'; readonly radiusKm: number }
  /** semi-axes along the primary's R, T, N directions */
  | { readonly kind: 'rtn-ellipsoid'; readonly rKm: number; readonly tKm: number; readonly nKm: number };

export interface RunSummary {
  /** "R12" */
  readonly id: string;
  readonly createdAt: string;
  /** screening window, ISO UTC */
  readonly start: string;
  readonly end: string;
  readonly volume: ScreeningVolumeSummary;
  /** object ids screened as primaries, or 'all' for all-vs-all */
  readonly primaries: readonly string[] | 'all';
  /** catalogue objects the run screened against */
  readonly objectCount: number;
  readonly status: RunStatus;
  /** null while running */
  readonly finishedAt: string | null;
  /** null while running */
  readonly eventCount: number | null;
  /** objects left out of the run (propagation failure, bad elements, …) */
  readonly flaggedCount: number;
}

export interface RunsList {
  /** newest first */
  readonly runs: readonly RunSummary[];
}

/** One close approach as listed in a run: the fields of the CLI's `events` JSON plus tier. */
export interface EventRow {
  /** "R12-3" */
  readonly id: string;
  readonly runId: string;
  readonly primary: string;
  readonly secondary: string;
  /** time of closest approach, ISO UTC */
  readonly tca: string;
  readonly missKm: number;
  readonly relativeSpeedKmS: number;
  /** secondary minus primary in the primary's RTN frame at TCA */
  readonly rtnKm: readonly [number, number, number];
  readonly approachAngleDeg: number;
  /** probability of collision; null where none was computed */
  readonly pc: number | null;
  readonly pcMethod: string | null;
  readonly covarianceSource: string | null;
  /** decision tier (core/risk/tiers.ts); null before risk assessment */
  readonly tier: TierId | null;
  /** the series (same conjunction across runs and messages) and its state; null where series are not recorded */
  readonly seriesId?: string | null;
  readonly seriesState?: string | null;
}

export interface RunEvents {
  readonly runId: string;
  /** by TCA */
  readonly events: readonly EventRow[];
}

/** One event with everything needed to judge it. */
export interface EventDetail extends EventRow {
  /** first entry into / last exit from the screening volume; null at a window edge */
  readonly entry: string | null;
  readonly exit: string | null;
  /** epochs of the element sets (or ephemerides) used */
  readonly primaryEpoch: string;
  readonly secondaryEpoch: string;
  /** TEME states at TCA */
  readonly primaryPositionTemeKm: readonly [number, number, number];
  readonly primaryVelocityTemeKmS: readonly [number, number, number];
  readonly secondaryPositionTemeKm: readonly [number, number, number];
  readonly secondaryVelocityTemeKmS: readonly [number, number, number];
  /** combined hard-body radius used for Pc; null before risk assessment */
  readonly hardBodyRadiusM: number | null;
  /** risk warnings (e.g. short-encounter assumption doubtful) */
  readonly warnings: readonly string[];
}

export interface EventResponse {
  readonly event: EventDetail;
}

// ───────────────────────────── the map ─────────────────────────────

/**
 * Channel name → request and response. Adding a channel here without a validator in
 * REQUEST_VALIDATORS, a handler in BridgeHandlers, is a compile error.
 * An unknown run or event id is answered with the error code NOT_FOUND, never with fake data.
 */
export interface BridgeContract {
  'catalog.summary': { request: CatalogSummaryRequest; response: CatalogSummary };
  'runs.list': { request: RunsListRequest; response: RunsList };
  'runs.events': { request: RunEventsRequest; response: RunEvents };
  'events.get': { request: EventGetRequest; response: EventResponse };
  /** the event page: facts with unit and source, plots as SVG, series */
  'events.view': { request: EventGetRequest; response: EventView };
  /** the 3-D view's scene (core/scene), built in the host */
  'events.scene': { request: EventGetRequest; response: EncounterScene };
  /** a report as self-contained HTML, for the renderer to save */
  'reports.make': { request: ReportRequest; response: ReportDocument };
  /** one event as CDM (KVN), CSV or JSON, for the renderer to save */
  'exports.make': { request: ExportRequest; response: ReportDocument };
  /** long work: import, screening, plan (jobContract.ts) */
  'jobs.start': { request: JobStartRequest; response: JobStatus };
  'jobs.get': { request: JobIdRequest; response: JobStatus };
  'jobs.cancel': { request: JobIdRequest; response: JobStatus };
  'jobs.list': { request: CatalogSummaryRequest; response: JobsList };
}

export type Channel = keyof BridgeContract;
export type Req<C extends Channel> = BridgeContract[C]['request'];
export type Res<C extends Channel> = BridgeContract[C]['response'];

/** What the renderer sees as `window.keepclear`. */
export interface BridgeApi {
  invoke<C extends Channel>(channel: C, req: Req<C>): Promise<Res<C>>;
}

/**
 * The implementation side: one function per channel. Handlers receive requests that have
 * already passed validation. Throw KeepclearError('NOT_FOUND', …) for unknown ids.
 */
export type BridgeHandlers = { readonly [C in Channel]: (req: Req<C>) => Promise<Res<C>> | Res<C> };

// ───────────────────────────── errors and replies ─────────────────────────────

export type BridgeErrorCode = 'UNKNOWN_CHANNEL' | 'BAD_REQUEST' | 'NOT_FOUND' | 'INTERNAL';
export const BRIDGE_ERROR_CODES: readonly BridgeErrorCode[] = ['UNKNOWN_CHANNEL', 'BAD_REQUEST', 'NOT_FOUND', 'INTERNAL'];

export interface BridgeFailure {
  readonly code: BridgeErrorCode;
  readonly message: string;
}

/** What travels back over any transport: a value or a failure, never a thrown object. */
export type BridgeReply<C extends Channel = Channel> =
  | { readonly ok: true; readonly value: Res<C> }
  | { readonly ok: false; readonly error: BridgeFailure };

// ───────────────────────────── validation ─────────────────────────────

export const RUNS_LIST_MAX_LIMIT = 1000;
export { ID_MAX_LENGTH };

/** One hand-written check per channel; the mapped type makes a missing one a compile error. */
const REQUEST_CHECKS: { readonly [C in Channel]: Check } = {
  'catalog.summary': (req) => objectWith(req, []),
  'runs.list': (req) => {
    const problem = objectWith(req, ['limit']);
    if (problem) return problem;
    const limit = (req as Record<string, unknown>)['limit'];
    if (limit === undefined) return null;
    if (typeof limit !== 'number' || !Number.isInteger(limit) || limit < 1 || limit > RUNS_LIST_MAX_LIMIT) {
      return `"limit" must be a whole number from 1 to ${RUNS_LIST_MAX_LIMIT}, got ${describe(limit)}`;
    }
    return null;
  },
  'runs.events': withId('runId'),
  'events.get': withId('eventId'),
  'events.view': withId('eventId'),
  'events.scene': withId('eventId'),
  'reports.make': reportCheck,
  'exports.make': exportCheck,
  'jobs.start': jobStartCheck,
  'jobs.get': withId('jobId'),
  'jobs.cancel': withId('jobId'),
  'jobs.list': (req) => objectWith(req, []),
};

/** Every channel, in contract order. */
export const CHANNELS: readonly Channel[] = Object.freeze(Object.keys(REQUEST_CHECKS) as Channel[]);

export function isChannel(v: unknown): v is Channel {
  return typeof v === 'string' && Object.prototype.hasOwnProperty.call(REQUEST_CHECKS, v);
}

/** Type guard for the request of one channel. */
export function isRequest<C extends Channel>(channel: C, req: unknown): req is Req<C> {
  return REQUEST_CHECKS[channel](req) === null;
}

/** Per-channel guards, for callers that prefer a table. */
export const REQUEST_GUARDS: { readonly [C in Channel]: (req: unknown) => req is Req<C> } = {
  'catalog.summary': (req): req is CatalogSummaryRequest => isRequest('catalog.summary', req),
  'runs.list': (req): req is RunsListRequest => isRequest('runs.list', req),
  'runs.events': (req): req is RunEventsRequest => isRequest('runs.events', req),
  'events.get': (req): req is EventGetRequest => isRequest('events.get', req),
  'events.view': (req): req is EventGetRequest => isRequest('events.view', req),
  'events.scene': (req): req is EventGetRequest => isRequest('events.scene', req),
  'reports.make': (req): req is ReportRequest => isRequest('reports.make', req),
  'exports.make': (req): req is ExportRequest => isRequest('exports.make', req),
  'jobs.start': (req): req is JobStartRequest => isRequest('jobs.start', req),
  'jobs.get': (req): req is JobIdRequest => isRequest('jobs.get', req),
  'jobs.cancel': (req): req is JobIdRequest => isRequest('jobs.cancel', req),
  'jobs.list': (req): req is CatalogSummaryRequest => isRequest('jobs.list', req),
};

export type ValidatedRequest =
  | { readonly ok: true; readonly channel: Channel; readonly req: Req<Channel> }
  | { readonly ok: false; readonly error: BridgeFailure };

/**
 * Checks a channel name and request that arrived from outside (renderer, IPC, HTTP).
 * Messages name the channel and what is wrong, e.g.
 * `bridge: runs.events: "runId" must be a string id, got the number 12`.
 */
export function validateRequest(channel: unknown, req: unknown): ValidatedRequest {
  if (!isChannel(channel)) {
    const name = typeof channel === 'string' ? `"${channel.slice(0, 60)}"` : describe(channel);
    return {
      ok: false,
      error: { code: 'UNKNOWN_CHANNEL', message: `bridge: unknown channel ${name} (known: ${CHANNELS.join(', ')})` },
    };
  }
  const problem = REQUEST_CHECKS[channel](req);
  if (problem !== null) return { ok: false, error: { code: 'BAD_REQUEST', message: `bridge: ${channel}: ${problem}` } };
  return { ok: true, channel, req: req as Req<Channel> };
}

/** Electron IPC channel that carries one bridge channel (main and preload agree through this). */
export const ipcChannelName = (channel: Channel): string => `keepclear:${channel}`;
