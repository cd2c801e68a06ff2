/**
 * Scheduled use (issue 7 item 8; README "Scheduled use"): `screen --attention-exit CODE` exits with
 * CODE when the run holds an event at or above `--attention-tier` (default monitor), and
 * `--attention-file PATH` keeps a JSON flag file that exists exactly while the newest run needs
 * attention. Opt-in: without the options the exit status stays DESIGN.md's (0 on success).
 * The expected answer comes from the run's own JSON (each event's tier), written by the same run.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { runKeepclear, type Run } from './support/cli.js';

interface Out { events: { id: string; tier: string | null; seriesId: string | null }[] }

let dir: string;
let db: string;
const keepclear = (args: string[]): Run => runKeepclear(args, dir);
/** 7 Dec 2026, one day: holds the designed 50-m approach of A0001 (core/synthetic/demoDesigns.ts). */
const WINDOW = ['--start', '2026-12-07T00:00:00Z', '--days', '1', '--workers', '0'];

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-attention-'));
  const scenario = buildDemoScenario({ catalogSize: 300 });
  writeFileSync(join(dir, 'fleet.tle'), formatTleFile(scenario.fleet));
  writeFileSync(join(dir, 'catalog.json'), formatOmmJson(scenario.catalog));
  db = join(dir, 'a.db');
  const r = keepclear(['import', join(dir, 'fleet.tle'), join(dir, 'catalog.json'), '--db', db]);
  expect(r.code, r.stderr).toBe(0);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function screen(extra: string[], name: string): { run: Run; out: Out } {
  const json = join(dir, `${name}.json`);
  const run = keepclear(['screen', '--db', db, '--primary', '100001', ...WINDOW, '--json', json, ...extra]);
  return { run, out: JSON.parse(readFileSync(json, 'utf8')) as Out };
}

describe('screen: the attention signal', () => {
  it('exits with the chosen code and writes the flag file when an event is at or above the tier', () => {
    const flag = join(dir, 'ATTENTION.json');
    const { run, out } = screen(['--attention-exit', '10', '--attention-file', flag], 'a');
    const above = out.events.filter((e) => e.tier === 'plan' || e.tier === 'monitor');
    expect(above.length).toBeGreaterThan(0); // the designed 50-m approach
    expect(run.code, run.stderr).toBe(10);
    expect(run.stdout).toMatch(new RegExp(`^Attention: ${above.length} event\\(s\\) at or above monitor`, 'm'));
    const doc = JSON.parse(readFileSync(flag, 'utf8')) as { caution: string; attention: boolean; tier: string; events: { id: string; seriesId: string }[] };
    expect(doc.caution).toBe(DECISION_AID_NOTE);
    expect(doc.attention).toBe(true);
    expect(doc.tier).toBe('monitor');
    expect(doc.events.map((e) => e.id).sort()).toEqual(above.map((e) => e.id).sort());
    for (const e of doc.events) expect(e.seriesId).toMatch(/^S-/);
  });

  it('exits 0 and removes a stale flag file when nothing reaches the tier', () => {
    const flag = join(dir, 'STALE.json');
    writeFileSync(flag, '{"attention":true}\n');
    // A0004 on 13 Dec with tier plan: the run's own JSON shows no plan event there (checked below)
    const json = join(dir, 'b.json');
    const run = keepclear(['screen', '--db', db, '--primary', '100004', '--start', '2026-12-13T00:00:00Z', '--days', '1', '--workers', '0',
      '--json', json, '--attention-tier', 'plan', '--attention-exit', '10', '--attention-file', flag]);
    const out = JSON.parse(readFileSync(json, 'utf8')) as Out;
    expect(out.events.filter((e) => e.tier === 'plan')).toEqual([]);
    expect(run.code, run.stderr).toBe(0);
    expect(existsSync(flag)).toBe(false);
    expect(run.stdout).toMatch(/^Attention: no event at or above plan\./m);
  });

  it('is opt-in: the same run without the options exits 0', () => {
    const { run, out } = screen([], 'c');
    expect(out.events.some((e) => e.tier === 'plan' || e.tier === 'monitor')).toBe(true);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).not.toMatch(/^Attention:/m);
  });

  it.each([
    [['--attention-exit', '1'], /--attention-exit must be a whole number 3\.\.125/],
    [['--attention-exit', '200'], /--attention-exit must be/],
    [['--attention-tier', 'urgent'], /--attention-tier must be one of plan, monitor, routine/],
  ])('bad value %j exits 2', (args, message) => {
    const r = keepclear(['screen', '--db', db, '--primary', '100001', ...WINDOW, ...args]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
  });
});
