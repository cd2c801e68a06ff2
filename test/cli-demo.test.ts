/**
 * `keepclear demo --out DIR` (DESIGN.md "demo"): builds the demo scenario into DIR/*.db, screens
 * the invented fleet for the demo week, writes the run's report into DIR and prints a summary.
 * A small catalogue (--size) and in-thread screening (--workers 0) keep it quick.
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { buildDemoScenario, type DemoScenario } from '../core/synthetic/demo.js';
import { eventsOfRun, listRuns, openDatabase } from '../db/index.js';
import { runKeepclear, type Run } from './support/cli.js';

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
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('keepclear demo', () => {
  it('exits 0', () => {
    expect(r.code, r.stderr).toBe(0);
  });

  it('writes a database and an HTML report with the decision-aid note into DIR', () => {
    const files = readdirSync(out);
    const dbs = files.filter((f) => f.endsWith('.db'));
    const reports = files.filter((f) => /^report-.*\.html$/.test(f));
    expect(dbs).toHaveLength(1);
    expect(reports).toHaveLength(1);
    const html = readFileSync(join(out, reports[0]!), 'utf8');
    expect(html).toContain(htmlEscape(DECISION_AID_NOTE));
    // every planted pair is listed in the report
    for (const p of scenario.planted) expect(html).toContain(`<td>${p.secondary}</td>`);
  });

  it('says all planted encounters were found', () => {
    const n = scenario.planted.length;
    expect(n).toBeGreaterThan(0);
    expect(r.stdout).toContain(`${n} of ${n} planted encounters found`);
    expect(r.stdout).toContain(join(out, readdirSync(out).find((f) => f.endsWith('.db'))!));
    expect(r.stdout).toContain(DECISION_AID_NOTE);
  });

  it('the database holds the run, with every planted encounter at its TCA', () => {
    const d = openDatabase(join(out, readdirSync(out).find((f) => f.endsWith('.db'))!));
    try {
      const runs = listRuns(d);
      expect(runs).toHaveLength(1);
      const events = eventsOfRun(d, runs[0]!.id);
      for (const p of scenario.planted) {
        const e = events.find((x) => x.primary === p.primary && x.secondary === p.secondary && Math.abs(x.tca - p.tca) < 1000);
        expect(e, `${p.primary}/${p.secondary}`).toBeDefined();
        // designed miss (fitted to 1 m, core/synthetic/fit.ts) plus the screening's 1 m
        expect(Math.abs(e!.missKm - p.designedMissKm)).toBeLessThanOrEqual(0.002);
      }
    } finally {
      d.close();
    }
  });

  it('leads with the counts per tier before any list of events (issue 7 item 5)', () => {
    const lines = r.stdout.split('\n');
    const counts = lines.findIndex((l) => /^Events by tier: /.test(l));
    expect(counts).toBeGreaterThan(0);
    const table = lines.findIndex((l) => l.startsWith('event '));
    if (table >= 0) expect(counts).toBeLessThan(table);
  });

  it('reports progress on stderr', () => {
    expect(r.stderr).toMatch(/screening: 100%/);
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
