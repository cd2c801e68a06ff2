/**
 * Reports in a real browser: headless Chromium (Debian `chromium`, driven by playwright-core)
 * opens each report with every network request recorded — none but the page itself is allowed —
 * and keeps a full-page screenshot under test-artifacts/ (gitignored) for a person to look at.
 * The PDF comes from the same HTML. Skipped, with a message, only when Chromium is absent on a
 * developer's machine; .ci/run installs it and sets KEEPCLEAR_REQUIRE_CHROMIUM so CI never skips.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  chromiumMissing,
  eventReportModelFromDb,
  htmlToPdf,
  launchChromium,
  renderEventReportHtml,
  renderRunReportHtml,
  runReportModelFromDb,
  type EventReportModel,
} from '../app/report/index.js';
import { helveticaWidthPx } from '../app/report/textWidth.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { instantFromMs } from '../core/time/instant.js';
import { ROOT } from './support/cli.js';
import { reportFixture, WEEK_START, type Fixture } from './support/reportFixture.js';

export const ARTIFACTS = join(ROOT, 'test-artifacts');
const missing = chromiumMissing();
if (missing && process.env.KEEPCLEAR_REQUIRE_CHROMIUM) throw new Error(`KEEPCLEAR_REQUIRE_CHROMIUM is set but ${missing}`);
if (missing) console.warn(`report-chromium tests skipped: ${missing}`);

/** Text widths from Helvetica metrics against Chromium's Liberation Sans: metric-compatible fonts agree to rounding; 2 % allows hinting. */
const WIDTH_REL_TOL = 0.02;

describe.skipIf(missing !== null)('reports in headless Chromium', () => {
  let fx: Fixture;
  let browser: Browser;
  let runHtml: string;
  let eventHtml: string;
  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    fx = reportFixture(250);
    const generatedAt = instantFromMs(WEEK_START + 8 * 86_400_000);
    runHtml = await renderRunReportHtml(runReportModelFromDb(fx.db, fx.runId, { generatedAt, title: 'Report test — run of 250 invented events' }));
    const base = eventReportModelFromDb(fx.db, `${fx.runId}-1`, { generatedAt });
    // A recorded combined covariance (the risk details land later), a series and a plan, so the screenshot shows every part.
    const model: EventReportModel = {
      ...base,
      plane: { ...base.plane!, covM2: [[180 ** 2, -0.55 * 180 * 60], [-0.55 * 180 * 60, 60 ** 2]], note: null },
      series: {
        id: 'S1',
        state: 'updated: Pc grew',
        points: [
          { eventId: 'R0-5', source: 'run', hoursToTca: 150, missKm: 0.4, pc: 1e-6, rtnKm: [0.1, -0.35, 0.15] },
          { eventId: 'C1-1', source: 'cdm', hoursToTca: 96, missKm: 0.2, pc: 3e-5, rtnKm: [0.06, -0.17, 0.08] },
          { eventId: 'R1-1', source: 'run', hoursToTca: 50, missKm: 0.05, pc: 9e-4, rtnKm: [0.05, 0, 0] },
          { eventId: 'C2-1', source: 'cdm', hoursToTca: 20, missKm: 0.06, pc: 1.2e-3, rtnKm: [0.05, 0.02, 0.01] },
        ],
      },
      plan: {
        target: { pc: 1e-6 },
        proposal: { burnTime: '2026-12-07T13:12:00.000Z', leadTimeS: 6000, direction: 'T', deltaVMs: 0.08, deltaVRtnMs: [0, 0.08, 0], achievedMissKm: 1.9, achievedPc: 2e-8, propellantKg: 0.004 },
        trade: [
          { leadTimeS: 3000, deltaVMs: 0.16, achievedMissKm: 1.9 },
          { leadTimeS: 6000, deltaVMs: 0.08, achievedMissKm: 1.9 },
        ],
        verification: { method: 'numerical propagation (two-body + J2..J4 + drag)', missKm: 1.87, pc: 3e-8 },
        newApproaches: [],
      },
    };
    eventHtml = await renderEventReportHtml(model);
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
    fx?.db.close();
  });

  /** Opens a file in a fresh page and returns every URL the page requested. */
  async function open(file: string, html: string): Promise<{ page: Page; requests: string[]; url: string }> {
    const path = join(ARTIFACTS, file);
    writeFileSync(path, html);
    const url = pathToFileURL(path).href;
    const page = await browser.newPage({ viewport: { width: 1100, height: 900 } });
    const requests: string[] = [];
    page.on('request', (r) => requests.push(r.url()));
    await page.goto(url, { waitUntil: 'load' });
    return { page, requests, url };
  }

  it('the recorder sees a request when a page makes one (so the checks below can fail)', async () => {
    const { page, requests, url } = await open('request-probe.html', '<!doctype html><img src="http://127.0.0.1:9/probe.png">');
    await page.close();
    expect(requests).toContain('http://127.0.0.1:9/probe.png');
    expect(requests).toContain(url);
  });

  for (const [name, html] of [['run-report', () => runHtml], ['event-report', () => eventHtml]] as const) {
    it(`${name}: no request but the page itself, plots drawn, caution visible; screenshot kept`, async () => {
      const { page, requests, url } = await open(`${name}.html`, html());
      await page.screenshot({ path: join(ARTIFACTS, `${name}.png`), fullPage: true });
      const plots = await page.$$eval('figure[data-plot] svg', (svgs) => svgs.map((s) => s.getBoundingClientRect().width));
      const caution = await page.textContent('[data-caution]');
      await page.close();
      expect(requests).toEqual([url]);
      expect(plots.length).toBeGreaterThanOrEqual(name === 'run-report' ? 1 : 4);
      for (const w of plots) expect(w).toBeGreaterThan(200);
      expect(caution).toContain(DECISION_AID_NOTE);
    });
  }

  it('prints the same HTML to PDF', async () => {
    for (const [name, html] of [['run-report', runHtml], ['event-report', eventHtml]] as const) {
      const pdf = await htmlToPdf(html);
      writeFileSync(join(ARTIFACTS, `${name}.pdf`), pdf);
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      expect(pdf.length).toBeGreaterThan(10_000);
    }
  });

  const liberation = spawnSync('fc-list', [':family=Liberation Sans'], { encoding: 'utf8' }).stdout?.trim();
  it.skipIf(!liberation)('plot text is laid out with the widths Chromium measures in Liberation Sans', async () => {
    const page = await browser.newPage();
    const samples = ['The week at a glance: TCA against miss distance', 'miss distance (km, log scale)', 'Mon 07 Dec', '0.01', 'R1-214', 'Routine'];
    const measured = await page.evaluate((texts) => {
      const ctx = document.createElement('canvas').getContext('2d')!;
      ctx.font = '11px "Liberation Sans"';
      return texts.map((t) => ctx.measureText(t).width);
    }, samples);
    await page.close();
    samples.forEach((t, i) => {
      const ours = helveticaWidthPx(t, 11);
      expect(Math.abs(ours - measured[i]!) / measured[i]!, `"${t}": ${ours} vs ${measured[i]}`).toBeLessThan(WIDTH_REL_TOL);
    });
  });
});
