/**
 * The app as a user gets it, for browser tests and the UI benchmark: the renderer built with
 * vite into a private folder (so the check uses the current sources, not a stale dist/), served
 * by `startServe` over a given database, and headless Chromium (playwright-core) opened on the
 * printed URL.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { launchChromium } from '../../app/report/pdf.js';
import { startServe, type RunningServer } from '../../app/serve/index.js';
import type { KeepclearDb } from '../../db/index.js';
import { ROOT } from './cli.js';

/** Builds the renderer into a fresh folder; throws with vite's output when the build fails. */
export function buildRenderer(): string {
  const out = mkdtempSync(join(tmpdir(), 'keepclear-renderer-'));
  const r = spawnSync(process.execPath, [join(ROOT, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '-c', 'renderer/vite.config.ts', '--outDir', out, '--emptyOutDir', '--logLevel', 'warn'], {
    cwd: ROOT,
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new Error(`renderer build failed:\n${r.stdout}\n${r.stderr}`);
  return out;
}

export interface ServedApp {
  readonly server: RunningServer;
  readonly browser: Browser;
  readonly page: Page;
  /** console errors and failed requests seen by the page */
  readonly problems: string[];
  close(): Promise<void>;
}

export async function openServedApp(db: KeepclearDb, rendererDir: string, viewport = { width: 1400, height: 900 }): Promise<ServedApp> {
  const server = await startServe({ db, rendererDir });
  const browser = await launchChromium();
  const page = await browser.newPage({ viewport, acceptDownloads: true });
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(`console: ${m.text()}`);
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('requestfailed', (r) => problems.push(`request failed: ${r.url()}`));
  // Nothing but our own server: a page that fetched from elsewhere would fail here.
  await page.route('**/*', (route) => (route.request().url().startsWith(`http://127.0.0.1:${server.port}/`) ? route.continue() : route.abort()));
  await page.goto(server.url);
  return {
    server,
    browser,
    page,
    problems,
    async close() {
      await browser.close();
      await server.close();
    },
  };
}
