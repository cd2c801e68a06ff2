/**
 * `keepclear serve`: the renderer and the bridge over loopback HTTP, for any browser.
 *
 *   GET  /…                      the built renderer (static files; no data in them)
 *   POST /api/bridge             { channel, request } → BridgeReply, the same dispatch as Electron IPC
 *   GET  /api/jobs/events        server-sent events: one `job` event (a JobStatus) per change
 *
 * Only 127.0.0.1 is listened on. Every /api request needs the token printed in the URL, in the
 * `Authorization: Bearer …` header (or `?token=` for the event stream, which cannot set headers):
 * none → 401, a wrong one → 403. The Host header must name this server (a page on another site
 * that rebinds its DNS name to 127.0.0.1 is refused), and a cross-origin Origin is refused.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { BridgeFailure, BridgeReply, JobStatus } from '../../core/bridge/contract.js';
import { IMPORT_MAX_CHARS, IMPORT_MAX_FILES } from '../../core/bridge/contract.js';
import { dispatch } from '../../core/bridge/dispatch.js';
import type { KeepclearDb } from '../../db/index.js';
import { createBridgeHandlers } from '../bridge/handlers.js';
import { JobManager } from '../jobs/manager.js';
import { staticFile } from './static.js';
import { newToken, sameToken } from './token.js';

export const SERVE_HOST = '127.0.0.1';
/**
 * Largest request body: an import of the largest allowed file as JSON text (escapes can double
 * it) plus room for the envelope. Bodies above it are refused with 413 before they are read whole.
 */
export const MAX_BODY_BYTES = 2 * IMPORT_MAX_CHARS + 64 * 1024;
/** A comment line on the event stream this often keeps proxies and browsers from timing it out. */
export const SSE_HEARTBEAT_MS = 15_000;

/** The page's policy, sent as a header too (the built page also carries it as a meta tag). */
export const CONTENT_SECURITY_POLICY =
  "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data: blob:; connect-src 'self'; " +
  "worker-src 'self' blob:; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

export interface ServeOptions {
  readonly db: KeepclearDb;
  /** folder of the built renderer (rendererDir()) */
  readonly rendererDir: string;
  /** 0 or absent: a free port chosen by the system */
  readonly port?: number;
  /** tests fix it; otherwise random */
  readonly token?: string;
}

export interface RunningServer {
  readonly url: string;
  readonly port: number;
  readonly token: string;
  readonly jobs: JobManager;
  close(): Promise<void>;
}

const HTTP_STATUS: Readonly<Record<BridgeFailure['code'], number>> = {
  BAD_REQUEST: 400,
  UNKNOWN_CHANNEL: 400,
  NOT_FOUND: 404,
  INTERNAL: 500,
};

const COMMON_HEADERS = {
  'X-Content-Type-Options': 'nosniff',
  // The token is in the page's URL: never send it on as a referrer.
  'Referrer-Policy': 'no-referrer',
  'X-Frame-Options': 'DENY',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Resource-Policy': 'same-origin',
} as const;

function send(res: ServerResponse, status: number, type: string, body: string | Buffer, extra: Record<string, string> = {}): void {
  res.writeHead(status, { ...COMMON_HEADERS, 'Content-Type': type, 'Content-Length': Buffer.byteLength(body), ...extra });
  res.end(body);
}

function sendReply(res: ServerResponse, status: number, reply: BridgeReply): void {
  send(res, status, 'application/json; charset=utf-8', JSON.stringify(reply), { 'Cache-Control': 'no-store' });
}

const failure = (code: BridgeFailure['code'], message: string): BridgeReply => ({ ok: false, error: { code, message } });

function readBody(req: IncomingMessage, limit: number): Promise<Buffer | 'too-large'> {
  return new Promise((resolve, reject) => {
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > limit) {
      resolve('too-large');
      req.resume();
      return;
    }
    const parts: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > limit) {
        resolve('too-large');
        req.destroy();
        return;
      }
      parts.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(parts)));
    req.on('error', reject);
  });
}

export async function startServe(opts: ServeOptions): Promise<RunningServer> {
  const token = opts.token ?? newToken();
  const jobs = new JobManager();
  const { handlers } = createBridgeHandlers(opts.db, jobs);
  const streams = new Set<ServerResponse>();
  let port = 0;

  const hostAllowed = (host: string | undefined): boolean => host === `${SERVE_HOST}:${port}` || host === `localhost:${port}`;
  const originAllowed = (origin: string | undefined): boolean =>
    origin === undefined || origin === `http://${SERVE_HOST}:${port}` || origin === `http://localhost:${port}`;

  /** null when the request may go on; otherwise the refusal was sent. */
  function refuseUnlessAuthorised(req: IncomingMessage, res: ServerResponse, url: URL): boolean {
    const header = req.headers['authorization'];
    const bearer = typeof header === 'string' && header.startsWith('Bearer ') ? header.slice(7) : null;
    const given = bearer ?? url.searchParams.get('token');
    if (given === null || given === '') {
      sendReply(res, 401, failure('BAD_REQUEST', 'serve: this request needs the token from the URL keepclear serve printed'));
      return true;
    }
    if (!sameToken(given, token)) {
      sendReply(res, 403, failure('BAD_REQUEST', 'serve: wrong token; open the URL keepclear serve printed'));
      return true;
    }
    if (!originAllowed(req.headers['origin'])) {
      sendReply(res, 403, failure('BAD_REQUEST', `serve: requests from ${String(req.headers['origin'])} are refused`));
      return true;
    }
    return false;
  }

  async function bridgeCall(req: IncomingMessage, res: ServerResponse): Promise<void> {
    if (!String(req.headers['content-type'] ?? '').startsWith('application/json')) {
      sendReply(res, 415, failure('BAD_REQUEST', 'serve: send the bridge call as application/json'));
      return;
    }
    const body = await readBody(req, MAX_BODY_BYTES);
    if (body === 'too-large') {
      sendReply(res, 413, failure('BAD_REQUEST', `serve: request body above ${MAX_BODY_BYTES} bytes; import at most ${IMPORT_MAX_FILES} files of up to ${IMPORT_MAX_CHARS} characters`));
      return;
    }
    let call: unknown;
    try {
      call = JSON.parse(body.toString('utf8'));
    } catch (err) {
      sendReply(res, 400, failure('BAD_REQUEST', `serve: the body is not JSON: ${(err as Error).message}`));
      return;
    }
    if (typeof call !== 'object' || call === null || Array.isArray(call)) {
      sendReply(res, 400, failure('BAD_REQUEST', 'serve: the body must be {"channel": "…", "request": {…}}'));
      return;
    }
    const { channel, request } = call as { channel?: unknown; request?: unknown };
    const reply = await dispatch(handlers, channel, request);
    sendReply(res, reply.ok ? 200 : HTTP_STATUS[reply.error.code], reply);
  }

  function jobStream(res: ServerResponse): void {
    res.writeHead(200, {
      ...COMMON_HEADERS,
      'Content-Type': 'text/event-stream; charset=utf-8',
      'Cache-Control': 'no-store',
      Connection: 'keep-alive',
    });
    const push = (s: JobStatus): void => void res.write(`event: job\ndata: ${JSON.stringify(s)}\n\n`);
    res.write(': keepclear job events\n\n');
    for (const s of jobs.list().reverse()) push(s);
    const unsubscribe = jobs.subscribe(push);
    const beat = setInterval(() => res.write(': still here\n\n'), SSE_HEARTBEAT_MS);
    streams.add(res);
    res.on('close', () => {
      clearInterval(beat);
      unsubscribe();
      streams.delete(res);
    });
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    if (!hostAllowed(req.headers['host'])) {
      send(res, 403, 'text/plain; charset=utf-8', 'keepclear serve answers only to 127.0.0.1 and localhost\n');
      return;
    }
    const url = new URL(req.url ?? '/', `http://${SERVE_HOST}:${port}`);
    if (url.pathname.startsWith('/api/')) {
      if (refuseUnlessAuthorised(req, res, url)) return;
      if (url.pathname === '/api/bridge' && req.method === 'POST') return bridgeCall(req, res);
      if (url.pathname === '/api/jobs/events' && req.method === 'GET') return jobStream(res);
      sendReply(res, 404, failure('NOT_FOUND', `serve: no ${req.method} ${url.pathname}`));
      return;
    }
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      send(res, 405, 'text/plain; charset=utf-8', 'method not allowed\n', { Allow: 'GET, HEAD' });
      return;
    }
    const file = await staticFile(opts.rendererDir, url.pathname);
    if (!file) {
      send(res, 404, 'text/plain; charset=utf-8', 'not found\n');
      return;
    }
    const headers: Record<string, string> = { 'Cache-Control': 'no-cache' };
    if (file.type.startsWith('text/html')) headers['Content-Security-Policy'] = CONTENT_SECURITY_POLICY;
    if (req.method === 'HEAD') {
      res.writeHead(200, { ...COMMON_HEADERS, 'Content-Type': file.type, 'Content-Length': file.body.length, ...headers });
      res.end();
      return;
    }
    send(res, 200, file.type, file.body, headers);
  }

  const server: Server = createServer((req, res) => {
    handle(req, res).catch((err: unknown) => {
      if (!res.headersSent) sendReply(res, 500, failure('INTERNAL', `serve: ${(err as Error).message}`));
      else res.destroy();
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, SERVE_HOST, () => {
      server.off('error', reject);
      resolve();
    });
  });
  port = (server.address() as AddressInfo).port;

  return {
    url: `http://${SERVE_HOST}:${port}/?token=${token}`,
    port,
    token,
    jobs,
    async close() {
      for (const s of streams) s.end();
      await jobs.shutdown();
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
    },
  };
}
