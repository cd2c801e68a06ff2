/**
 * `keepclear serve` over HTTP without a browser: the printed URL (loopback, random port, token),
 * the token on every API request (401 none, 403 wrong), the Host and Origin checks, the same
 * request validators as Electron IPC, static files without escape from the renderer folder, and
 * jobs (import, screening) with progress and cancel over server-sent events.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startServe, type RunningServer } from '../app/serve/index.js';
import type { BridgeReply, JobStatus } from '../core/bridge/contract.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { openDatabase, type KeepclearDb } from '../db/index.js';
import { spawnKeepclear, waitFor } from './support/cli.js';

interface Answer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: string;
}

function http(port: number, method: string, path: string, opts: { headers?: Record<string, string>; body?: string } = {}): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port, method, path, headers: { ...(opts.body ? { 'content-type': 'application/json' } : {}), ...opts.headers } }, (res) => {
      let body = '';
      res.setEncoding('utf8').on('data', (d: string) => (body += d)).on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
    });
    req.on('error', reject);
    req.end(opts.body);
  });
}

let dir: string;
let db: KeepclearDb;
let server: RunningServer;
const call = (channel: unknown, req: unknown, token = server.token) =>
  http(server.port, 'POST', '/api/bridge', { headers: { authorization: `Bearer ${token}` }, body: JSON.stringify({ channel, request: req }) });

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-serve-'));
  const ui = join(dir, 'ui');
  mkdirSync(join(ui, 'assets'), { recursive: true });
  writeFileSync(join(ui, 'index.html'), '<!doctype html><title>t</title>');
  writeFileSync(join(ui, 'assets', 'a.js'), 'export {};');
  writeFileSync(join(dir, 'secret.txt'), 'not for the browser');
  db = openDatabase(join(dir, 'k.db'));
  server = await startServe({ db, rendererDir: ui });
});
afterAll(async () => {
  await server?.close();
  db?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('serve: address and token', () => {
  it('listens on 127.0.0.1 and prints a URL with a 256-bit token', () => {
    expect(server.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/\?token=[A-Za-z0-9_-]{43}$/);
    expect(server.url).toContain(`:${server.port}/`);
  });

  it('refuses API calls without the token (401) and with a wrong one (403), and answers with it', async () => {
    const none = await http(server.port, 'POST', '/api/bridge', { body: JSON.stringify({ channel: 'catalog.summary', request: {} }) });
    expect(none.status).toBe(401);
    const wrong = await call('catalog.summary', {}, `${server.token.slice(0, -1)}x`);
    expect(wrong.status).toBe(403);
    const stream = await http(server.port, 'GET', '/api/jobs/events?token=nope');
    expect(stream.status).toBe(403);
    const ok = await call('catalog.summary', {});
    expect(ok.status).toBe(200);
    expect(JSON.parse(ok.body)).toEqual({ ok: true, value: { objectCount: 0, latestEpoch: null } });
    expect(ok.headers['referrer-policy']).toBe('no-referrer');
  });

  it('refuses a foreign Host (DNS rebinding) and a foreign Origin', async () => {
    const host = await http(server.port, 'GET', '/', { headers: { host: `evil.example:${server.port}` } });
    expect(host.status).toBe(403);
    const origin = await http(server.port, 'POST', '/api/bridge', {
      headers: { authorization: `Bearer ${server.token}`, origin: 'http://evil.example' },
      body: JSON.stringify({ channel: 'catalog.summary', request: {} }),
    });
    expect(origin.status).toBe(403);
  });
});

describe('serve: requests checked by the contract validators', () => {
  it('answers a malformed request 400 with the same message as IPC, an unknown id 404', async () => {
    const bad = await call('runs.events', { runId: 12 });
    expect(bad.status).toBe(400);
    expect(JSON.parse(bad.body)).toEqual({
      ok: false,
      error: { code: 'BAD_REQUEST', message: 'bridge: runs.events: "runId" must be a string id, got the number 12' },
    });
    expect((await call('db.exec', {})).status).toBe(400);
    expect((await call('events.get', { eventId: 'R404-1' })).status).toBe(404);
    const notJson = await http(server.port, 'POST', '/api/bridge', { headers: { authorization: `Bearer ${server.token}` }, body: '{oops' });
    expect(notJson.status).toBe(400);
    const screen = await call('jobs.start', { kind: 'screen', primaries: ['100001'], start: '2026-12-07', days: 7, thresholdKm: 5 });
    expect(screen.status).toBe(400);
    expect((JSON.parse(screen.body) as { error: { message: string } }).error.message).toContain('"start" must be an ISO 8601 UTC time');
  });
});

describe('serve: static files', () => {
  it('serves the renderer with its CSP, and nothing outside its folder', async () => {
    const page = await http(server.port, 'GET', '/?token=x');
    expect(page.status).toBe(200);
    expect(String(page.headers['content-security-policy'])).toContain("script-src 'self'");
    expect(String(page.headers['content-security-policy'])).not.toContain('unsafe');
    expect((await http(server.port, 'GET', '/assets/a.js')).status).toBe(200);
    for (const p of ['/../secret.txt', '/%2e%2e/secret.txt', '/assets/..%2f..%2fsecret.txt', '/k.db']) {
      const r = await http(server.port, 'GET', p);
      expect(r.status, p).toBe(404);
      expect(r.body).not.toContain('not for the browser');
    }
  });
});

describe('serve: jobs with progress over server-sent events', () => {
  it('imports an uploaded catalogue, screens it, pushes progress and the result, and cancels', async () => {
    const scenario = buildDemoScenario({ catalogSize: 200 });
    const text = formatTleFile([...scenario.fleet, ...scenario.catalog]);
    const events: JobStatus[] = [];
    const streamReq = request({ host: '127.0.0.1', port: server.port, path: `/api/jobs/events?token=${server.token}` }, (res) => {
      expect(res.headers['content-type']).toContain('text/event-stream');
      let buf = '';
      res.setEncoding('utf8').on('data', (d: string) => {
        buf += d;
        let cut;
        while ((cut = buf.indexOf('\n\n')) >= 0) {
          const block = buf.slice(0, cut);
          buf = buf.slice(cut + 2);
          const data = /^data: (.*)$/m.exec(block)?.[1];
          if (data) events.push(JSON.parse(data) as JobStatus);
        }
      });
    });
    streamReq.end();

    const started = JSON.parse((await call('jobs.start', { kind: 'import', files: [{ name: 'week.tle', text }] })).body) as BridgeReply<'jobs.start'>;
    if (!started.ok) throw new Error(started.error.message);
    const importDone = await server.jobs.whenDone(started.value.id);
    expect(importDone.state).toBe('done');
    expect(importDone.result).toMatchObject({ kind: 'import', files: [{ name: 'week.tle', ok: true, format: 'TLE', imported: 205 + scenario.catalog.length - 200 }] });

    const screen = JSON.parse(
      (await call('jobs.start', { kind: 'screen', primaries: ['A0001', '100002'], start: '2026-12-07T00:00:00.000Z', days: 7, thresholdKm: 5 })).body,
    ) as BridgeReply<'jobs.start'>;
    if (!screen.ok) throw new Error(screen.error.message);
    const screened = await server.jobs.whenDone(screen.value.id);
    expect(screened.state, screened.error ?? '').toBe('done');
    expect(screened.result?.kind).toBe('screen');
    await waitFor(() => events.some((e) => e.id === screen.value.id && e.state === 'done'), 'the done event on the stream', 10_000);
    const mine = events.filter((e) => e.id === screen.value.id);
    expect(mine[0]!.state).toBe('running');
    expect(mine.some((e) => e.progress !== null && e.progress.total > 0)).toBe(true);

    // A cancelled screening ends cancelled, its run stored as cancelled (DESIGN.md: long runs can be cancelled).
    const again = JSON.parse(
      (await call('jobs.start', { kind: 'screen', primaries: ['100001', '100002', '100003', '100004', '100005'], start: '2026-12-07T00:00:00.000Z', days: 30, thresholdKm: 5 })).body,
    ) as BridgeReply<'jobs.start'>;
    if (!again.ok) throw new Error(again.error.message);
    expect(JSON.parse((await call('jobs.cancel', { jobId: again.value.id })).body)).toMatchObject({ ok: true });
    const cancelled = await server.jobs.whenDone(again.value.id);
    expect(cancelled.state).toBe('cancelled');
    if (cancelled.result?.kind === 'screen') expect(cancelled.result.status).toBe('cancelled');
    streamReq.destroy();
  });

  it('renders an event page with facts, plots as SVG and the caution', async () => {
    const runs = JSON.parse((await call('runs.list', {})).body) as BridgeReply<'runs.list'>;
    if (!runs.ok) throw new Error(runs.error.message);
    const run = runs.value.runs.find((r) => r.status === 'done')!;
    const evs = JSON.parse((await call('runs.events', { runId: run.id })).body) as BridgeReply<'runs.events'>;
    if (!evs.ok) throw new Error(evs.error.message);
    expect(evs.value.events.length).toBeGreaterThan(0);
    const view = JSON.parse((await call('events.view', { eventId: evs.value.events[0]!.id })).body) as BridgeReply<'events.view'>;
    if (!view.ok) throw new Error(view.error.message);
    expect(view.value.caution).toBe(DECISION_AID_NOTE);
    expect(view.value.facts.every((f) => f.unit !== '' && f.source !== '')).toBe(true);
    expect(view.value.plots.map((p) => p.name)).toContain('rtn');
    for (const p of view.value.plots) expect(p.svg).toMatch(/^<svg[\s\S]*<\/svg>$/);
  });
});

describe('keepclear serve (the command)', () => {
  it('prints exactly one line, the URL, and stops on SIGTERM', async () => {
    const ui = join(dir, 'ui');
    const { child, done } = spawnKeepclear(['serve', '--db', join(dir, 'k2.db')], dir, { env: { KEEPCLEAR_RENDERER_DIR: ui } });
    let out = '';
    child.stdout!.on('data', (d: string) => (out += d));
    await waitFor(() => out.includes('\n'), 'the URL line', 30_000);
    const m = /^http:\/\/127\.0\.0\.1:(\d+)\/\?token=([A-Za-z0-9_-]+)\n$/.exec(out);
    expect(m, out).not.toBeNull();
    const r = await http(Number(m![1]), 'POST', '/api/bridge', { headers: { authorization: `Bearer ${m![2]}` }, body: JSON.stringify({ channel: 'runs.list', request: {} }) });
    expect(JSON.parse(r.body)).toEqual({ ok: true, value: { runs: [] } });
    child.kill('SIGTERM');
    const end = await done;
    expect(end.code).toBe(0);
    expect(end.stdout.trim().split('\n')).toHaveLength(1);
  });

  it('says how to build the interface when it is missing', async () => {
    const { done } = spawnKeepclear(['serve', '--db', join(dir, 'k3.db')], dir, { env: { KEEPCLEAR_RENDERER_DIR: join(dir, 'nothing-here') } });
    const end = await done;
    expect(end.code).toBe(1);
    expect(end.stderr).toContain('npm run build:renderer');
  });
});
