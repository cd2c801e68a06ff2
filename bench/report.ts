/**
 * Report rendering speed: `node --import tsx bench/report.ts`. A run of 250 invented events
 * (test/support/reportFixture.ts), model from the database + HTML with its plots, then the PDF
 * through headless Chromium. Prints medians; no targets are asserted here or in tests.
 */
import {
  eventReportModelFromDb,
  htmlToPdf,
  renderEventReportHtml,
  renderRunReportHtml,
  runReportModelFromDb,
} from '../app/report/index.js';
import { reportFixture } from '../test/support/reportFixture.js';

const EVENTS = Number(process.env.BENCH_EVENTS ?? 250);
const REPEAT = 5;

async function median(label: string, n: number, f: () => Promise<unknown>): Promise<number> {
  await f(); // warm-up: module loading and JIT are not part of a report's cost
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    await f();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const m = times[Math.floor(times.length / 2)]!;
  process.stdout.write(`${label.padEnd(44)} ${m.toFixed(0).padStart(6)} ms (median of ${n})\n`);
  return m;
}

const fx = reportFixture(EVENTS);
let runHtml = '';
await median(`run report HTML, ${EVENTS} events`, REPEAT, async () => {
  runHtml = await renderRunReportHtml(runReportModelFromDb(fx.db, fx.runId));
});
await median('event report HTML', REPEAT, () => renderEventReportHtml(eventReportModelFromDb(fx.db, `${fx.runId}-1`)));
await median(`run report PDF (Chromium start to bytes)`, 3, () => htmlToPdf(runHtml));
process.stdout.write(`run report size: ${(runHtml.length / 1024).toFixed(0)} KiB of HTML\n`);
fx.db.close();
