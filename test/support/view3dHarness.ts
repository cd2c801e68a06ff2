/**
 * Builds the 3-D view's harness page (renderer/view3d/harness.ts bundled by esbuild into one
 * classic script, three.js included) and serves it from 127.0.0.1 so the page's strict CSP
 * applies as in the app. Used by test/view3d-chromium.test.ts and bench/ui3d.ts.
 */
import { copyFileSync, mkdirSync, readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join, normalize } from 'node:path';
import { build } from 'esbuild';
import type { Browser, Page } from 'playwright-core';
import { CHROMIUM_ARGS, launchChromium } from '../../app/report/pdf.js';
import type { EncounterScene } from '../../core/scene/encounterScene.js';
import { ROOT } from './cli.js';

export { CHROMIUM_ARGS, launchChromium };

export async function buildHarness(outDir: string): Promise<void> {
  mkdirSync(outDir, { recursive: true });
  await build({
    entryPoints: [join(ROOT, 'renderer/view3d/harness.ts')],
    outfile: join(outDir, 'harness.js'),
    bundle: true,
    format: 'iife',
    target: 'es2022',
    logLevel: 'silent',
  });
  copyFileSync(join(ROOT, 'renderer/view3d/harness.html'), join(outDir, 'index.html'));
}

const TYPES: Record<string, string> = { '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8' };

/** A static server of `dir` on a random loopback port. */
export async function serveDir(dir: string): Promise<{ url: string; server: Server }> {
  const server = createServer((req, res) => {
    const path = normalize(decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname)).replace(/^([/\\])+/, '');
    const file = join(dir, path === '' ? 'index.html' : path);
    if (!file.startsWith(dir)) return void res.writeHead(403).end();
    try {
      const body = readFileSync(file);
      res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream' }).end(body);
    } catch {
      res.writeHead(404).end();
    }
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/`, server };
}

/** Opens the harness and mounts the scene; returns the page with the view drawn once. */
export async function openView(
  browser: Browser,
  url: string,
  scene: EncounterScene,
  size = { width: 1200, height: 640 },
  opts: { halfResolutionWhileDragging?: boolean; catalogueShareWhileDragging?: number } = {},
): Promise<{ page: Page; errors: string[] }> {
  const page = await browser.newPage({ viewport: { width: size.width, height: size.height + 20 } });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  await page.goto(url);
  await page.waitForFunction(() => 'keepclearView3d' in window);
  await page.evaluate(([s, o, z]) => window.keepclearView3d.mount(s, o, z), [scene, opts, size] as const);
  await page.evaluate(() => window.keepclearView3d.settle());
  return { page, errors };
}
