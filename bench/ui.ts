/**
 * `npm run bench:ui`: frame times in headless Chromium while the week's list of 10,000 events
 * scrolls (goal: 60 fps, i.e. frames every ~16.7 ms). The list is scrolled by script, one step
 * per animation frame, and the time between frames is recorded in the page; long animation
 * frames (> 50 ms, Chromium's own measure) are counted too. BENCH_EVENTS changes the size.
 * No targets are asserted: the numbers depend on the machine and its load.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { reportFixture } from '../test/support/reportFixture.js';
import { buildRenderer, openServedApp } from '../test/support/servedApp.js';
import { benchUi3d } from './ui3d.js';

const EVENTS = Number(process.env.BENCH_EVENTS ?? 10_000);
/** px per frame: ~8 rows, a brisk flick; and whole pages for Page Down-like jumps */
const STEP_PX = 240;
const FRAMES = 600;

interface FrameStats {
  frames: number;
  medianMs: number;
  p95Ms: number;
  p99Ms: number;
  maxMs: number;
  over20Ms: number;
  longFrames: number;
  rowsInDom: number;
  perFrame?: string;
}

/**
 * Runs in the page. Kept as plain JavaScript text: the TypeScript loader of the bench would add
 * helpers to a function passed as code, which do not exist in the page.
 */
const MEASURE_IN_PAGE = `async (step, frames) => {
  const list = document.querySelector('.vlist');
  list.scrollTop = 0;
  let long = 0;
  const obs = new PerformanceObserver((l) => (long += l.getEntries().length));
  try { obs.observe({ type: 'long-animation-frame', buffered: false }); } catch {}
  const deltas = [];
  await new Promise((resolve) => {
    let last = 0;
    let n = 0;
    const tick = (t) => {
      deltas.push(t - last);
      last = t;
      list.scrollTop = (list.scrollTop + step) % (list.scrollHeight - list.clientHeight);
      if (++n < frames) requestAnimationFrame(tick); else resolve();
    };
    requestAnimationFrame((t) => { last = t; requestAnimationFrame(tick); });
  });
  obs.disconnect();
  const s = [...deltas].sort((a, b) => a - b);
  const q = (p) => s[Math.min(s.length - 1, Math.floor(p * s.length))];
  return {
    frames: deltas.length, medianMs: q(0.5), p95Ms: q(0.95), p99Ms: q(0.99), maxMs: s[s.length - 1],
    over20Ms: deltas.filter((d) => d > 20).length, longFrames: long,
    rowsInDom: list.querySelectorAll('.vrow:not([hidden])').length,
  };
}`;

function line(label: string, s: FrameStats): string {
  const fps = 1000 / s.medianMs;
  return `${label.padEnd(30)} ${s.frames} frames: median ${s.medianMs.toFixed(1)} ms (${fps.toFixed(0)} fps), p95 ${s.p95Ms.toFixed(1)}, p99 ${s.p99Ms.toFixed(1)}, max ${s.maxMs.toFixed(1)} ms; ${s.over20Ms} over 20 ms; ${s.longFrames} long frames (>50 ms); ${s.rowsInDom} rows in the DOM${s.perFrame ? `\n${''.padEnd(31)}per frame in the renderer process: ${s.perFrame}` : ''}`;
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'keepclear-bench-ui-'));
  const t0 = performance.now();
  const fx = reportFixture(EVENTS, join(dir, 'ui.db'));
  const ui = buildRenderer();
  const app = await openServedApp(fx.db, ui);
  try {
    const { page } = app;
    await page.waitForFunction((n) => document.getElementById('shown')?.textContent?.includes(`of ${n.toLocaleString('en-US')}`), EVENTS, { timeout: 60_000 });
    process.stdout.write(`setup: ${EVENTS} events served and listed in ${((performance.now() - t0) / 1000).toFixed(1)} s\n`);
    // Chromium's own accounting of where the time went (script, style, layout), per frame.
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Performance.enable');
    const metrics = async (): Promise<Record<string, number>> =>
      Object.fromEntries(((await cdp.send('Performance.getMetrics')) as { metrics: { name: string; value: number }[] }).metrics.map((m) => [m.name, m.value]));
    const measure = async (step: number): Promise<FrameStats> => {
      const before = await metrics();
      const stats = (await page.evaluate(`(${MEASURE_IN_PAGE})(${step}, ${FRAMES})`)) as FrameStats;
      const after = await metrics();
      const per = (k: string): number => ((after[k]! - before[k]!) * 1000) / stats.frames;
      stats.perFrame = `script ${per('ScriptDuration').toFixed(2)} ms, style ${per('RecalcStyleDuration').toFixed(2)} ms, layout ${per('LayoutDuration').toFixed(2)} ms, all tasks ${per('TaskDuration').toFixed(2)} ms`;
      return stats;
    };
    // The same loop without scrolling: what this machine's software rendering gives at its current load.
    process.stdout.write(`${line('no scrolling (baseline)', await measure(0))}\n`);
    process.stdout.write(`${line(`scroll ${STEP_PX} px/frame`, await measure(STEP_PX))}\n`);
    const pagePx = await page.evaluate(() => document.querySelector<HTMLElement>('.vlist')!.clientHeight);
    process.stdout.write(`${line(`scroll a page (${pagePx} px)/frame`, await measure(pagePx))}\n`);
    if (app.problems.length) process.stdout.write(`page problems:\n  ${app.problems.join('\n  ')}\n`);
  } finally {
    await app.close();
    fx.db.close();
    rmSync(ui, { recursive: true, force: true });
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
// The 3-D view while orbiting with 30,000 catalogue points (bench/ui3d.ts).
await benchUi3d();
