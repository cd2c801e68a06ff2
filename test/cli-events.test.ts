/**
 * `keepclear events` (DESIGN.md CLI contract): after a screening run, the stored events come
 * back with the same contract fields the screen printed; `--run ID` picks an older run; an
 * unknown run is a failure (exit 1); the terminal table carries the decision-aid note.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { runKeepclear, type Run } from './support/cli.js';


const keepclear = (args: string[]): Run => runKeepclear(args, dir);

/** The contract names of one event (DESIGN.md "JSON of screen and events"). */
const CONTRACT_FIELDS = [
  'id', 'primary', 'secondary', 'tca', 'missKm', 'relativeSpeedKmS', 'rtnKm', 'approachAngleDeg', 'pc', 'pcMethod', 'covarianceSource',
] as const;
type EventJson = Record<(typeof CONTRACT_FIELDS)[number], unknown> & { id: string };
interface Output {
  run: { id: string; thresholdKm: number | null; primaries: string[] } | null;
  events: EventJson[];
}
const contract = (e: EventJson) => Object.fromEntries(CONTRACT_FIELDS.map((k) => [k, e[k]]));

let dir: string;
let db: string;
let first: Output; // screen of 100001, 5 km sphere
let second: Output; // screen of 100003, 3 km sphere (the newest run)

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-events-'));
  const scenario = buildDemoScenario({ catalogSize: 300 });
  const fleet = join(dir, 'fleet.tle');
  const catalog = join(dir, 'catalog.json');
  writeFileSync(fleet, formatTleFile(scenario.fleet));
  writeFileSync(catalog, formatOmmJson(scenario.catalog));
  db = join(dir, 'events.db');
  const common = ['--db', db, '--start', '2026-12-07T00:00:00Z', '--days', '2', '--workers', '0', '--json', '-'];
  const a = keepclear(['screen', '--catalog', fleet, '--catalog', catalog, '--primary', '100001', ...common]);
  expect(a.code, a.stderr).toBe(0);
  first = JSON.parse(a.stdout) as Output;
  const b = keepclear(['screen', '--primary', '100003', '--threshold-km', '3', ...common]);
  expect(b.code, b.stderr).toBe(0);
  second = JSON.parse(b.stdout) as Output;
  expect(first.events.length).toBeGreaterThan(0);
  expect(second.events.length).toBeGreaterThan(0);
  expect(second.run!.id).not.toBe(first.run!.id);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('keepclear events', () => {
  it('--json - gives the newest run and the same events as its screen printed', () => {
    const r = keepclear(['events', '--db', db, '--json', '-']);
    expect(r.code, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as Output; // only JSON on stdout
    expect(out.run!.id).toBe(second.run!.id);
    expect(out.run!.thresholdKm).toBe(3);
    expect(out.events.map((e) => [e.id, e.tca, e.missKm])).toEqual(second.events.map((e) => [e.id, e.tca, e.missKm]));
    // every contract field survives storage exactly
    expect(out.events.map(contract)).toEqual(second.events.map(contract));
  });

  it('--run ID gives that run and its events', () => {
    const r = keepclear(['events', '--db', db, '--run', first.run!.id, '--json', '-']);
    expect(r.code, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as Output;
    expect(out.run!.id).toBe(first.run!.id);
    expect(out.run!.primaries).toEqual(['100001']);
    expect(out.events.map((e) => [e.id, e.tca, e.missKm])).toEqual(first.events.map((e) => [e.id, e.tca, e.missKm]));
    expect(out.events.map(contract)).toEqual(first.events.map(contract));
  });

  it('--json FILE writes the same JSON to the file and (with --all-events) the table to stdout', () => {
    const file = join(dir, 'events.json');
    const r = keepclear(['events', '--db', db, '--run', first.run!.id, '--json', file, '--all-events']);
    expect(r.code, r.stderr).toBe(0);
    const out = JSON.parse(readFileSync(file, 'utf8')) as Output;
    expect(out.events.map((e) => e.id)).toEqual(first.events.map((e) => e.id));
    for (const e of first.events) expect(r.stdout).toContain(e.id);
  });

  it('an unknown run exits 1 with a keepclear: line', () => {
    const r = keepclear(['events', '--db', db, '--run', 'R999', '--json', '-']);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^keepclear: .*R999/);
  });

  it('human output with --all-events lists every event and carries the decision-aid note', () => {
    const r = keepclear(['events', '--db', db, '--all-events']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain(DECISION_AID_NOTE);
    expect(r.stdout).toMatch(/decision aid/i);
    for (const e of second.events) {
      expect(r.stdout).toContain(e.id);
      expect(r.stdout).toContain(e.tca);
    }
  });

  it('bad arguments exit 2', () => {
    for (const args of [['--bogus'], ['--run'], ['stray']]) {
      const r = keepclear(['events', '--db', db, ...args]);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr).toMatch(/^keepclear: /);
    }
  });

  it('every event carries its series (DESIGN.md "Series"); two runs of other primaries share none', () => {
    const r = keepclear(['events', '--db', db, '--run', first.run!.id, '--json', '-']);
    const out = JSON.parse(r.stdout) as { events: (EventJson & { seriesId: unknown; seriesState: unknown })[] };
    for (const e of out.events) {
      expect(e.seriesId, e.id).toMatch(/^S-R\d+-\d+$/);
      expect(e.seriesState, e.id).toBe('new'); // seen once: the other run screened another primary
    }
    const again = JSON.parse(keepclear(['events', '--db', db, '--json', '-']).stdout) as { events: { seriesId: string }[] };
    const mine = new Set(out.events.map((e) => e.seriesId));
    expect(again.events.filter((e) => mine.has(e.seriesId))).toEqual([]);
  });

  it('an empty database gives no run and no events', () => {
    const r = keepclear(['events', '--db', join(dir, 'empty.db'), '--json', '-']);
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({ caution: DECISION_AID_NOTE, run: null, events: [] });
  });
});
