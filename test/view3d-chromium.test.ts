/**
 * The 3-D view in a real browser: headless Chromium (Debian `chromium`, playwright-core, software
 * WebGL) opens the stand-alone harness (renderer/view3d/harness.html under the app's CSP) with
 * the demo world's riskiest encounter and a 30,000-object catalogue. Checks what was drawn from
 * screenshots decoded in Node (test/support/png.ts), not from tags: both panels hold an image,
 * the scrubber moves the markers, dragging drops to half resolution, dispose loses both WebGL
 * contexts. Screenshots are kept in test-artifacts/view3d/ (gitignored).
 * Skipped only when Chromium is absent and KEEPCLEAR_REQUIRE_CHROMIUM is unset.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromiumMissing } from '../app/report/pdf.js';
import type { Encounter } from '../core/events/index.js';
import { StraightLineTrajectory } from '../core/propagation/straightLine.js';
import { buildEncounterScene, type EncounterScene } from '../core/scene/encounterScene.js';
import { parseIso } from '../core/time/instant.js';
import { TIERS } from '../core/risk/tiers.js';
import { ROOT } from './support/cli.js';
import { demoEncounterScene } from './support/encounterSceneFixture.js';
import { changedFraction, lumaVariance, readPng, type Rgba } from './support/png.js';
import { buildHarness, launchChromium, openView, serveDir } from './support/view3dHarness.js';

const ARTIFACTS = join(ROOT, 'test-artifacts', 'view3d');
const missing = chromiumMissing();
if (missing && process.env.KEEPCLEAR_REQUIRE_CHROMIUM) throw new Error(`KEEPCLEAR_REQUIRE_CHROMIUM is set but ${missing}`);
if (missing) console.warn(`view3d-chromium tests skipped: ${missing}`);

/**
 * A panel that drew nothing is its flat background: luma variance 0. The Earth with its
 * graticule and 30,000 points, or ellipsoids over the dark ground, give hundreds (measured
 * 600–1,500). 20 leaves room for other window sizes and still fails a blank or near-blank panel.
 */
const MIN_DRAWN_VARIANCE = 20;
/** A marker that "moved" must move at least this far on screen (px); the chosen times move it far more. */
const MIN_MARKER_MOVE_PX = 20;

const hex = (c: string): [number, number, number] => [1, 3, 5].map((i) => parseInt(c.slice(i, i + 2), 16)) as [number, number, number];

async function shot(page: Page, selector: string, name: string): Promise<Rgba> {
  const png = await page.locator(selector).screenshot();
  writeFileSync(join(ARTIFACTS, `${name}.png`), png);
  return readPng(png);
}

const settle = (page: Page) => page.evaluate(() => window.keepclearView3d.settle());
const inspect = (page: Page) => page.evaluate(() => window.keepclearView3d.view().inspect());

describe.skipIf(missing !== null)('3-D view in headless Chromium', () => {
  let scene: EncounterScene;
  let browser: Browser;
  let server: Server;
  let url: string;
  let page: Page;
  let errors: string[];

  beforeAll(async () => {
    mkdirSync(ARTIFACTS, { recursive: true });
    scene = demoEncounterScene(30_000);
    const dir = join(ROOT, 'test-artifacts', 'view3d-harness');
    await buildHarness(dir);
    ({ url, server } = await serveDir(dir));
    browser = await launchChromium();
    ({ page, errors } = await openView(browser, url, scene));
  });
  afterAll(async () => {
    await browser?.close();
    server?.close();
  });

  it('the PNG reader decodes a Chromium screenshot of a known colour exactly (PNG spec, W3C 2003)', async () => {
    const p = await browser.newPage({ viewport: { width: 40, height: 30 } });
    await p.setContent('<body style="margin:0;background:rgb(10,200,30)"></body>');
    const img = readPng(await p.screenshot());
    await p.close();
    expect([img.width, img.height]).toEqual([40, 30]);
    for (let i = 0; i < img.width * img.height; i += 97) expect([...img.data.subarray(4 * i, 4 * i + 3)]).toEqual([10, 200, 30]);
    expect(lumaVariance(img)).toBeLessThan(1e-6); // zero but for the rounding of Σy² − (Σy)²
  });

  it('the scene has the 30,000-object catalogue and an assessed encounter', () => {
    expect(scene.catalogue.count).toBeGreaterThanOrEqual(30_000);
    expect(scene.covariance.combined).not.toBeNull();
    expect(scene.tier).not.toBeNull();
  });

  it('both panels drew (pixel variance of each panel, not just a canvas tag)', async () => {
    const earth = await shot(page, '[data-panel=earth]', 'earth-at-tca');
    const rtn = await shot(page, '[data-panel=rtn]', 'rtn-at-tca');
    await page.screenshot({ path: join(ARTIFACTS, 'view-at-tca.png') });
    expect(lumaVariance(earth)).toBeGreaterThan(MIN_DRAWN_VARIANCE);
    expect(lumaVariance(rtn)).toBeGreaterThan(MIN_DRAWN_VARIANCE);
    expect(errors).toEqual([]);
    // 1200 × 640: side by side (each ~600 × 585 is squarer than 1200 × 290 stacked)
    const [e, r] = await Promise.all(['earth', 'rtn'].map((p) => page.locator(`[data-panel=${p}]`).boundingBox()));
    expect(r!.x).toBeGreaterThan(e!.x + e!.width - 5);
    expect(Math.abs(r!.y - e!.y)).toBeLessThan(1);
  });

  it('setTime moves the markers in both panels and the scrubber follows', async () => {
    const before = await inspect(page);
    const rtnBefore = await shot(page, '[data-panel=rtn]', 'rtn-before-move');
    // 0.2 s after TCA at ~15 km/s: 3 km along the track, inside the RTN panel's view.
    await page.evaluate(() => window.keepclearView3d.view().setTime(0.2));
    await settle(page);
    const after = await inspect(page);
    const rtnAfter = await shot(page, '[data-panel=rtn]', 'rtn-after-move');
    const moved = Math.hypot(after.rtn.secondary[0] - before.rtn.secondary[0], after.rtn.secondary[1] - before.rtn.secondary[1]);
    expect(moved).toBeGreaterThan(MIN_MARKER_MOVE_PX);
    expect(changedFraction(rtnBefore, rtnAfter)).toBeGreaterThan(0);
    // The secondary's marker is drawn where the view says it is, in the tier's colour.
    const [x, y] = after.rtn.secondary.map(Math.round) as [number, number];
    expect(x).toBeGreaterThan(0);
    expect(x).toBeLessThan(rtnAfter.width);
    const want = hex(TIERS[scene.tier!].colour);
    let best = Infinity;
    for (let dy = -3; dy <= 3; dy++) for (let dx = -3; dx <= 3; dx++) {
      const i = 4 * ((y + dy) * rtnAfter.width + (x + dx));
      best = Math.min(best, Math.max(...want.map((c, k) => Math.abs(c - rtnAfter.data[i + k]!))));
    }
    expect(best).toBeLessThanOrEqual(8); // the tier colour itself, up to texture filtering at the rim

    // Two minutes before TCA the objects are ~900 km back along their orbits.
    await page.evaluate(() => window.keepclearView3d.view().setTime(-120));
    await settle(page);
    const early = await inspect(page);
    await shot(page, '[data-panel=earth]', 'earth-tca-minus-120s');
    for (const k of ['primary', 'secondary'] as const) {
      expect(Math.hypot(early.earth[k][0] - before.earth[k][0], early.earth[k][1] - before.earth[k][1])).toBeGreaterThan(MIN_MARKER_MOVE_PX);
    }
    expect(await page.locator('input[type=range]').inputValue()).toBe('-120');
    expect(await page.locator('output').textContent()).toBe('TCA − 02:00');
  });

  it('the scrubber drives the view, and times outside the range are clamped', async () => {
    await page.locator('input[type=range]').fill('45');
    expect((await inspect(page)).timeS).toBe(45);
    await page.evaluate(() => window.keepclearView3d.view().setTime(1e9));
    expect((await inspect(page)).timeS).toBe(scene.timeRangeS[1]);
    await page.getByRole('button', { name: 'Back to TCA' }).click();
    expect((await inspect(page)).timeS).toBe(0);
  });

  it('drops to half resolution while dragging and returns to full after', async () => {
    const size = () => page.evaluate(() => document.querySelector<HTMLCanvasElement>('[data-panel=earth] canvas')!.width);
    const full = await size();
    const box = (await page.locator('[data-panel=earth] canvas').boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width / 2 + 40, box.y + box.height / 2 + 10, { steps: 4 });
    const dragging = await size();
    await page.mouse.up();
    await settle(page);
    expect(dragging).toBe(Math.floor(full / 2)); // DRAG_RESOLUTION_FACTOR 0.5; three.js floors the buffer size
    expect(await size()).toBe(full);
  });

  it('follows a resize of its host', async () => {
    await page.evaluate(() => Object.assign(document.getElementById('view')!.style, { width: '500px', height: '1000px' }));
    await settle(page);
    await settle(page);
    const dims = await page.evaluate(() =>
      Array.from(document.querySelectorAll<HTMLCanvasElement>('#view canvas')).map((c) => [c.width, c.clientWidth, c.height, c.clientHeight]),
    );
    // Tall and narrow: the panels stack (squarer than side by side), each as wide as the host.
    for (const [w, cw, h, ch] of dims) {
      expect(cw).toBe(500);
      expect(w).toBe(cw);
      expect(h).toBe(ch);
    }
    const rtn = await shot(page, '[data-panel=rtn]', 'rtn-stacked');
    expect(lumaVariance(rtn)).toBeGreaterThan(MIN_DRAWN_VARIANCE);
  });

  it('dispose releases both WebGL contexts and removes what it made', async () => {
    expect(await page.evaluate(() => window.keepclearView3d.contextsLost())).toEqual([false, false]);
    await page.evaluate(() => window.keepclearView3d.view().dispose());
    expect(await page.evaluate(() => window.keepclearView3d.contextsLost())).toEqual([true, true]);
    expect(await page.evaluate(() => window.keepclearView3d.canvasCount())).toBe(0);
    expect(await page.evaluate(() => document.getElementById('view')!.childElementCount)).toBe(0);
    // A late setTime after dispose is harmless.
    await page.evaluate(() => window.keepclearView3d.view().setTime(10));
    expect(errors).toEqual([]);
  });

  it('an event without risk assessment, covariance or catalogue still draws (hard-body sphere, track, axes)', async () => {
    const tca = parseIso('2026-12-07T10:00:00.000Z')!;
    const p = new StraightLineTrajectory('100001', tca, [7000, 0, 0], [0, 7.5, 0]);
    const s = new StraightLineTrajectory('330001', tca, [7000, 0.02, 0.01], [0, 0, 7.5]);
    const st = (t: StraightLineTrajectory) => [...t.r0, ...t.v] as unknown as Encounter['primaryState'];
    const bare = buildEncounterScene({
      event: { primary: '100001', secondary: '330001', tca, missKm: 0, relativeSpeedKmS: 0, rtnKm: [0, 0, 0], approachAngleDeg: 90, entry: null, exit: null,
        primaryState: st(p), secondaryState: st(s), primaryEpoch: tca, secondaryEpoch: tca },
      primary: p, secondary: s,
    });
    expect([bare.tier, bare.covariance.combined, bare.catalogue.count]).toEqual([null, null, 0]);
    const { page: p2, errors: e2 } = await openView(browser, url, bare, { width: 1000, height: 500 });
    const rtn = await shot(p2, '[data-panel=rtn]', 'rtn-unassessed');
    const earth = await shot(p2, '[data-panel=earth]', 'earth-unassessed');
    expect(lumaVariance(rtn)).toBeGreaterThan(MIN_DRAWN_VARIANCE);
    expect(lumaVariance(earth)).toBeGreaterThan(MIN_DRAWN_VARIANCE);
    expect(await p2.locator('[data-panel=rtn]').textContent()).toContain('no covariance: ellipsoids not drawn');
    expect(await p2.locator('[data-panel=earth]').textContent()).toContain('Not assessed');
    expect(e2).toEqual([]);
    await p2.close();
  });
});
