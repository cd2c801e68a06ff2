/**
 * `keepclear demo --out DIR` (DESIGN.md "demo"; issue 7 items 7 and "Done when"): replays the
 * invented operator's three weeks (catalogue updated between them, a received CDM) into DIR/*.db,
 * ends with a report folder (the last run's report with plots and what changed, one report per
 * event in the most urgent tier present, each with its series' trend) and a short summary (counts
 * by tier and by series state, where the files are). A small catalogue (--size) and in-thread
 * screening (--workers 0) keep it quick. Expected links and states come from the designs
 * (core/synthetic/demoDesigns.ts), not from the code under test.
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { TIER_ORDER } from '../core/risk/tiers.js';
import { buildDemoScenario, type DemoScenario } from '../core/synthetic/demo.js';
import { DEMO_WEEK_STARTS_ISO } from '../core/synthetic/demoDesigns.js';
import { parseIso } from '../core/time/instant.js';
import { eventsOfRun, listRuns, listSeries, openDatabase } from '../db/index.js';
import { runKeepclear, type Run } from './support/cli.js';
import { all, axesOf, parseDoc } from './support/svgProbe.js';

const SIZE = 500;

const keepclear = (args: string[]): Run => runKeepclear(args, dir);
const htmlEscape = (s: string): string =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

let dir: string;
let out: string;
let r: Run;
let scenario: DemoScenario;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-demo-'));
  out = join(dir, 'demo out'); // a space in the path, as user folders often have
  r = keepclear(['demo', '--out', out, '--size', String(SIZE), '--workers', '0']);
  scenario = buildDemoScenario({ catalogSize: SIZE });
}, 600_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const dbFile = (): string => join(out, readdirSync(out).find((f) => f.endsWith('.db'))!);

/** The last screening run (week 3) of the demo database, with its events. */
function lastWeek() {
  const d = openDatabase(dbFile());
  try {
    const runs = listRuns(d).filter((x) => x.kind === 'screening');
    return { runs, events: eventsOfRun(d, runs[0]!.id), series: listSeries(d) };
  } finally {
    d.close();
  }
}

describe('keepclear demo', () => {
  it('exits 0', () => {
    expect(r.code, r.stderr).toBe(0);
  });

  it('replays three weekly runs dated at their Mondays, and the received message by its CREATION_DATE', () => {
    const d = openDatabase(dbFile());
    try {
      const runs = listRuns(d).reverse();
      expect(runs.filter((x) => x.kind === 'screening').map((x) => x.dataAt)).toEqual(DEMO_WEEK_STARTS_ISO.map((iso) => parseIso(iso)));
      const cdm = runs.filter((x) => x.kind === 'cdm');
      expect(cdm).toHaveLength(1);
      // created between weeks 2 and 3 (demoDesigns.ts: 4 Dec 2026 09:15 UTC)
      expect(cdm[0]!.dataAt).toBe(parseIso('2026-12-04T09:15:00Z'));
    } finally {
      d.close();
    }
  });

  it('says every designed approach behaves as designed, and counts series by state', () => {
    expect(r.stdout).toMatch(/^(\d+) of \1 designed approaches behave as designed/m);
    const { series } = lastWeek();
    const line = r.stdout.split('\n').find((l) => l.startsWith('Series: '))!;
    expect(line).toMatch(/^Series: new \d+ · updated \d+ · no longer predicted \d+ · past \d+/);
    expect(series.some((s) => s.state === 'no-longer-predicted')).toBe(true);
    expect(series.some((s) => s.state === 'updated')).toBe(true);
    expect(r.stdout).toContain(DECISION_AID_NOTE);
    expect(r.stdout).toContain(dbFile());
  });

  it('the last week finds every planted encounter of the week at its TCA (week 3 is the single-week scenario)', () => {
    const { events } = lastWeek();
    for (const p of scenario.planted) {
      const e = events.find((x) => x.primary === p.primary && x.secondary === p.secondary && Math.abs(x.tca - p.tca) < 1000);
      expect(e, `${p.primary}/${p.secondary}`).toBeDefined();
      // designed miss (fitted to 1 m, core/synthetic/fit.ts) plus the screening's 1 m
      expect(Math.abs(e!.missKm - p.designedMissKm)).toBeLessThanOrEqual(0.002);
    }
  });

  it('writes a report folder: the run report with plots and what changed, one report per event of the most urgent tier', () => {
    const folder = join(out, 'report');
    const files = readdirSync(folder);
    const { runs, events } = lastWeek();
    expect(files).toContain(`run-${runs[0]!.id}.html`);
    const html = readFileSync(join(folder, `run-${runs[0]!.id}.html`), 'utf8');
    expect(html).toContain(htmlEscape(DECISION_AID_NOTE));
    const doc = parseDoc(html).document;
    const glance = doc.querySelector('figure[data-plot="week-glance"] svg')!;
    expect(axesOf(glance).length).toBeGreaterThanOrEqual(2);
    expect(all(doc, 'section[data-section="changes"] tr[data-change]').length).toBeGreaterThan(0);
    for (const p of scenario.planted) expect(html).toContain(`<td>${p.secondary}</td>`);
    const urgent = TIER_ORDER.slice(0, -1).find((t) => events.some((e) => e.risk?.tier === t));
    expect(urgent).toBeDefined();
    const expected = events.filter((e) => e.risk?.tier === urgent).map((e) => `event-${e.id}.html`).sort();
    const reports = files.filter((f) => f.startsWith('event-'));
    for (const f of expected) expect(reports).toContain(f);
    // and the grown-riskier approach of A0001 with Z0001 (seen twice and in a message), whatever its tier
    const grown = events.find((e) => e.secondary === '330001')!;
    if (grown.risk?.tier !== TIER_ORDER[TIER_ORDER.length - 1]) expect(reports).toContain(`event-${grown.id}.html`);
    for (const f of reports) {
      const ev = parseDoc(readFileSync(join(folder, f), 'utf8')).document;
      expect(ev.querySelector('section[data-section="series"] figure[data-plot="series-trend"] svg'), f).toBeTruthy();
    }
    expect(r.stdout).toContain(join(folder, `run-${runs[0]!.id}.html`));
  });

  it('events --series ID gives the series and its events in data order, the message between the runs', () => {
    const { series } = lastWeek();
    const grown = series.find((s) => s.secondary === '330001' || s.primary === '330001')!;
    const j = keepclear(['events', '--db', dbFile(), '--series', grown.id, '--json', '-']);
    expect(j.code, j.stderr).toBe(0);
    const doc = JSON.parse(j.stdout) as {
      caution: string; series: { id: string; primary: string; secondary: string; state: string };
      events: { id: string; seriesId: string; source: string; dataAt: string; pc: number | null }[];
    };
    expect(doc.caution).toBe(DECISION_AID_NOTE);
    expect(doc.series).toMatchObject({ id: grown.id, primary: '100001', secondary: '330001', state: 'updated' });
    expect(doc.events.map((e) => e.source)).toEqual(['screening', 'cdm', 'screening']);
    const times = doc.events.map((e) => Date.parse(e.dataAt));
    expect([...times].sort((a, b) => a - b)).toEqual(times);
    for (const e of doc.events) expect(e.seriesId).toBe(grown.id);
    const text = keepclear(['events', '--db', dbFile(), '--series', grown.id]);
    expect(text.code, text.stderr).toBe(0);
    expect(text.stdout).toMatch(new RegExp(`^Series ${grown.id}: 100001 × 330001 — updated`, 'm'));
    expect(text.stdout).toMatch(/^Since the first sighting: +miss −\d/m);
    const unknown = keepclear(['events', '--db', dbFile(), '--series', 'S-R99-1']);
    expect(unknown.code).toBe(1);
    expect(unknown.stderr).toMatch(/^keepclear: no series "S-R99-1"/m);
  });

  it('leads with the counts per tier before any list of events (issue 7 item 5)', () => {
    const lines = r.stdout.split('\n');
    const counts = lines.findIndex((l) => /^Events by tier: /.test(l));
    expect(counts).toBeGreaterThan(0);
    const table = lines.findIndex((l) => l.startsWith('event '));
    if (table >= 0) expect(counts).toBeLessThan(table);
  });

  it('reports progress on stderr', () => {
    expect(r.stderr).toMatch(/screening week 3: 100%/);
  });
});

describe('keepclear demo: bad arguments exit 2 and write nothing', () => {
  it.each([
    [['--size', '50'], /--size must be/],
    [['--size', 'abc'], /--size must be/],
    [['--size', '100', '--workers', 'abc'], /--workers must be/],
    [['--size', '100', '--workers', '1.5'], /--workers must be/],
    [['--size', '100', '--bogus'], /unknown option --bogus/],
  ])('%j', (args, message) => {
    const target = join(dir, `never-${Math.random().toString(36).slice(2)}`);
    const res = keepclear(['demo', '--out', target, ...args]);
    expect(res.code, res.stdout + res.stderr).toBe(2);
    expect(res.stderr).toMatch(/^keepclear: /m);
    expect(res.stderr).toMatch(message);
    expect(existsSync(target)).toBe(false);
  });
});
