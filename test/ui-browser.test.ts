/**
 * The app end to end in a real browser (Debian `chromium` through playwright-core), as a new
 * user meets it: `keepclear serve`'s host over a fresh database, the built renderer, and only
 * the page's own controls — import a catalogue, run a screening, open the riskiest event by
 * keyboard, see its numbers, plots and the 3-D view (its canvases checked by pixel variance,
 * with the HTML around them hidden), plan a manoeuvre, export a CDM. Screenshots of the list,
 * the event and the 3-D view go to test-artifacts/ui/ (gitignored). Any console error (a CSP
 * violation included) or request leaving the server fails the test.
 *
 * The catalogue is the demo world with 300 generated objects (core/synthetic), not the 30,000 of
 * `keepclear demo`, so the test takes seconds rather than minutes. Skipped only where Chromium is
 * missing and KEEPCLEAR_REQUIRE_CHROMIUM is unset (CI sets it and then this fails instead).
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromiumMissing } from '../app/report/pdf.js';
import type { EventRow } from '../core/bridge/contract.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { FLEET_IDS } from '../core/synthetic/demoFleet.js';
import { openDatabase, type KeepclearDb } from '../db/index.js';
import { ROOT } from './support/cli.js';
import { lumaVariance, readPng } from './support/png.js';
import { buildRenderer, openServedApp, type ServedApp } from './support/servedApp.js';

const ARTIFACTS = join(ROOT, 'test-artifacts', 'ui');
const missing = chromiumMissing();
if (missing && process.env.KEEPCLEAR_REQUIRE_CHROMIUM) throw new Error(`KEEPCLEAR_REQUIRE_CHROMIUM is set but ${missing}`);
if (missing) console.warn(`ui-browser tests skipped: ${missing}`);

/** Luma variance of a drawn WebGL panel (same measure and bound as test/view3d-chromium.test.ts): a blank canvas gives ~0. */
const MIN_DRAWN_VARIANCE = 20;
/** The demo week: 7 Dec 2026, 7 days, 5 km (core/synthetic/demoFleet.ts). */
const WEEK_START_INPUT = '2026-12-07T00:00:00';
const JOB_TIMEOUT_MS = 240_000;

async function waitForJob(page: Page, kind: string): Promise<string> {
  const line = page.locator(`.job[data-kind=${kind}]`).first();
  await line.waitFor({ timeout: 10_000 });
  await page.waitForFunction((k) => document.querySelector(`.job[data-kind=${k}]`)?.getAttribute('data-state') !== 'running', kind, { timeout: JOB_TIMEOUT_MS });
  const state = (await line.getAttribute('data-state'))!;
  if (state !== 'done') throw new Error(`${kind} job ended ${state}: ${await line.textContent()}`);
  return (await line.textContent()) ?? '';
}

describe.skipIf(missing !== null)('the app in headless Chromium', () => {
  let dir: string;
  let db: KeepclearDb;
  let ui: string;
  let app: ServedApp;
  let page: Page;
  let riskiest: EventRow;

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    dir = mkdtempSync(join(tmpdir(), 'keepclear-ui-'));
    const scenario = buildDemoScenario({ catalogSize: 300 });
    writeFileSync(join(dir, 'demo-week.tle'), formatTleFile([...scenario.fleet, ...scenario.catalog]));
    db = openDatabase(join(dir, 'ui.db'));
    ui = buildRenderer();
    app = await openServedApp(db, ui);
    page = app.page;
  });
  afterAll(async () => {
    await app?.close();
    db?.close();
    if (ui) rmSync(ui, { recursive: true, force: true });
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it('takes the token out of the address bar and shows an empty catalogue', async () => {
    await page.waitForFunction(() => document.getElementById('catalog')?.textContent?.includes('objects in the catalogue'));
    expect(page.url()).not.toContain('token=');
    expect(await page.textContent('#catalog')).toContain('0 objects in the catalogue');
    expect((await page.textContent('#caution'))?.trim()).toBe(DECISION_AID_NOTE);
  });

  it('imports a catalogue file chosen in the page', async () => {
    await page.click('#open-import');
    await page.setInputFiles('#import-files', join(dir, 'demo-week.tle'));
    await page.click('#import-go');
    const text = await waitForJob(page, 'import');
    expect(text).toMatch(/\d+ new, 0 updated, 0 rejected/);
    await page.waitForFunction(() => !document.getElementById('catalog')?.textContent?.startsWith('0 objects'));
  });

  it('runs a screening of the fleet from the page, with progress, and lists the week riskiest first', async () => {
    await page.click('#open-screen');
    await page.fill('#screen-primaries', FLEET_IDS.join(','));
    await page.fill('#screen-start', WEEK_START_INPUT);
    await page.fill('#screen-days', '7');
    await page.fill('#screen-km', '5');
    await page.click('#screen-go');
    await page.locator('.job[data-kind=screen] progress').first().waitFor();
    const text = await waitForJob(page, 'screen');
    expect(text).toMatch(/run R\d+: \d+ event\(s\), done/);
    await page.waitForFunction(() => document.querySelectorAll('.vlist .vrow:not([hidden])').length > 0);

    // The riskiest by the host's own numbers (the bridge over HTTP, as the page uses it).
    const runId = /run (R\d+)/.exec(text)![1]!;
    const res = await fetch(`http://127.0.0.1:${app.server.port}/api/bridge`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', authorization: `Bearer ${app.server.token}` },
      body: JSON.stringify({ channel: 'runs.events', request: { runId } }),
    });
    const events = ((await res.json()) as { value: { events: EventRow[] } }).value.events;
    expect(events.length).toBeGreaterThan(0);
    riskiest = [...events].sort((a, b) => (b.pc ?? -1) - (a.pc ?? -1))[0]!;
    expect(riskiest.pc, 'the demo week plants approaches with a Pc').not.toBeNull();
    const first = page.locator('.vlist .vrow[data-index="0"]');
    expect(await first.getAttribute('data-event-id')).toBe(riskiest.id);
    // Tier by shape and colour: the glyph of the tier, in the tier's colour.
    const glyph = await first.locator('.glyph').textContent();
    expect(['▲', '◆', '●']).toContain(glyph);
    expect(await page.textContent('#shown')).toContain(`${events.length} of ${events.length}`);
    await page.screenshot({ path: join(ARTIFACTS, 'list.png') });

    // Filter and search narrow the list; clearing them brings it back.
    await page.fill('#f-search', riskiest.secondary);
    await page.waitForFunction((id) => document.querySelector('.vlist .vrow[data-index="0"]')?.getAttribute('data-event-id') === id, riskiest.id);
    expect(await page.textContent('#shown')).not.toContain(`${events.length} of`);
    await page.fill('#f-search', '');
  });

  it('opens the riskiest event by keyboard: numbers with unit and source, plots, caution', async () => {
    await page.focus('.vlist');
    await page.keyboard.press('Home');
    expect(await page.locator('.vlist .vrow.selected').getAttribute('data-event-id')).toBe(riskiest.id);
    await page.keyboard.press('Enter');
    await page.waitForSelector('#event:not([hidden])');
    expect(await page.getAttribute('#event', 'data-event-id')).toBe(riskiest.id);
    await page.waitForSelector('#plots[data-ready=yes]', { timeout: 60_000 });
    const facts = await page.$$eval('#facts tbody tr', (rows) => rows.map((r) => Array.from(r.children).map((c) => c.textContent ?? '')));
    expect(facts.length).toBeGreaterThan(5);
    for (const [label, value, unit, source] of facts) {
      expect(value, label).not.toBe('');
      expect(unit, label).not.toBe('');
      expect(source, label).not.toBe('');
    }
    expect(facts.map((f) => f[0]).join(' ')).toMatch(/Pc/);
    expect(await page.locator('#plots [data-plot=encounter-plane] svg').count()).toBe(1);
    expect(await page.locator('#plots [data-plot=rtn] svg').count()).toBe(1);
    const cautions = await page.$$eval('[data-caution]', (els) => els.map((e) => e.textContent));
    expect(cautions.length).toBeGreaterThanOrEqual(2);
    for (const c of cautions) expect(c).toBe(DECISION_AID_NOTE);
  });

  it('draws the encounter in 3-D (pixel variance of each WebGL panel)', async () => {
    await page.waitForSelector('#view3d[data-state=shown]', { timeout: 120_000 });
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    // The event page scrolls inside itself: a tall window shows all of it in one picture.
    await page.setViewportSize({ width: 1400, height: 2400 });
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    await page.screenshot({ path: join(ARTIFACTS, 'event.png') });
    await page.setViewportSize({ width: 1400, height: 900 });
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    writeFileSync(join(ARTIFACTS, 'view3d.png'), await page.locator('#view3d').screenshot());
    // Only the canvases: hide every label and control drawn over them, so the pixels are WebGL's.
    const canvases = page.locator('#view3d canvas');
    expect(await canvases.count()).toBeGreaterThanOrEqual(1);
    await page.evaluate(() => {
      const canvases = Array.from(document.querySelectorAll('#view3d canvas'));
      for (const el of Array.from(document.querySelectorAll<HTMLElement>('#view3d *'))) {
        if (el.tagName !== 'CANVAS' && !canvases.some((c) => el.contains(c))) el.style.visibility = 'hidden';
      }
    });
    for (let i = 0; i < (await canvases.count()); i++) {
      const png = await canvases.nth(i).screenshot();
      writeFileSync(join(ARTIFACTS, `view3d-canvas-${i}.png`), png);
      expect(lumaVariance(readPng(png)), `canvas ${i}`).toBeGreaterThan(MIN_DRAWN_VARIANCE);
    }
    await page.evaluate(() => {
      for (const el of Array.from(document.querySelectorAll<HTMLElement>('#view3d *'))) el.style.visibility = '';
    });
  });

  it('plans a manoeuvre: chosen burn, verified result, trade, new approaches, under the caution', async () => {
    await page.fill('#plan-mass', '180');
    await page.fill('#plan-isp', '220');
    await page.check('input[name=target][value=miss]');
    await page.fill('#plan-miss', '2');
    await page.click('#plan-go');
    await page.waitForSelector('#plan-result .plan-view, #plan-result .warn', { timeout: JOB_TIMEOUT_MS });
    const result = page.locator('#plan-result');
    expect(await result.locator('.warn').count(), (await result.textContent()) ?? '').toBe(0);
    expect(await result.textContent()).toMatch(/Chosen burn/);
    expect(await result.locator('[data-verified=yes]').count()).toBe(1);
    expect(await result.textContent()).toMatch(/Trade over lead times/);
    expect(await result.textContent()).toMatch(/New approaches after the burn/);
    expect(await page.locator('.plan [data-caution]').textContent()).toBe(DECISION_AID_NOTE);
    await page.setViewportSize({ width: 1400, height: 2400 });
    await page.locator('.panel.plan').screenshot({ path: join(ARTIFACTS, 'plan.png') });
    await page.setViewportSize({ width: 1400, height: 900 });
  });

  it('exports the event as a CDM', async () => {
    await page.selectOption('#export-format', 'cdm');
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export')]);
    const path = join(ARTIFACTS, download.suggestedFilename());
    await download.saveAs(path);
    const cdm = readFileSync(path, 'utf8');
    expect(cdm).toMatch(/^CCSDS_CDM_VERS\s*=/m);
    expect(cdm).toMatch(/^TCA\s*=\s*2026-12-/m);
    expect(cdm).toMatch(/^OBJECT\s*=\s*OBJECT1/m);
  });

  it('returns to the week with Escape, and saw no console error, CSP violation or outside request', async () => {
    await page.keyboard.press('Escape');
    await page.waitForSelector('#week:not([hidden])');
    expect(await page.locator('#view3d canvas').count()).toBe(0);
    expect(app.problems).toEqual([]);
  });
});
