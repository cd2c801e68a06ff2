/**
 * What the terminal shows (issue 7 item 5): `events` (and `screen`, `demo`, which share the
 * presenter) lead with counts per tier, then the events above the lowest tier by Pc; the full
 * list only with --all-events. Pc below 1e-10 reads "< 1e-10"; the JSON keeps the number and
 * carries the decision-aid note as its top-level "caution" (DESIGN.md).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Encounter, RiskAssessment } from '../core/events/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { TIERS } from '../core/risk/tiers.js';
import { instantFromMs, parseIso, toIso } from '../core/time/instant.js';
import { createRun, finishRun, openDatabase } from '../db/index.js';
import { runKeepclear, type Run } from './support/cli.js';

const T0 = parseIso('2026-12-07T00:00:00Z')!;
const risk = (tier: keyof typeof TIERS, pc: number | null): RiskAssessment => ({
  pc, pcMethod: pc === null ? 'none' : '2d-reference', covarianceSource: 'history / default', hardBodyRadiusM: 10, tier, warnings: [],
});
const encounter = (secondary: string, minutes: number, missKm: number): Encounter => ({
  primary: '80001', secondary, tca: instantFromMs(T0 + minutes * 60_000), missKm, relativeSpeedKmS: 12, rtnKm: [missKm, 0, 0],
  approachAngleDeg: 120, entry: null, exit: null, primaryState: [7000, 0, 0, 0, 7.5, 0],
  secondaryState: [7000 + missKm, 0, 0, 0, -3, 6], primaryEpoch: T0, secondaryEpoch: T0,
});

/** secondary → (tier, Pc); listed here in the order the attention list must show them. */
const EVENTS: [string, keyof typeof TIERS, number | null, number][] = [
  ['90001', 'plan', 3e-4, 0.2],
  ['90002', 'monitor', 2e-6, 0.9],
  ['90003', 'monitor', null, 2.0], // no Pc: graded by miss, listed after those with a Pc
  ['90004', 'routine', 3e-12, 4.0],
  ['90005', 'routine', 1e-9, 3.0],
];

let dir: string;
let db: string;
let ids: Map<string, string>; // secondary → event id
const keepclear = (args: string[]): Run => runKeepclear(args, dir);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-terminal-'));
  db = join(dir, 'tiers.db');
  const d = openDatabase(db);
  const run = createRun(d, { start: T0, end: instantFromMs(T0 + 86_400_000), volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['80001'] }, 'f'.repeat(64), 6);
  // TCAs in reverse order of concern, so "by TCA" and "by Pc" differ
  const stored = finishRun(d, run, {
    status: 'done', wallMs: 1, flagged: [],
    events: EVENTS.map(([s, tier, pc, miss], k) => ({ ...encounter(s, 100 - k * 10, miss), risk: risk(tier, pc) })),
  });
  ids = new Map(stored.map((e) => [e.secondary, e.id]));
  d.close();
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('keepclear events, human output', () => {
  let r: Run;
  beforeAll(() => {
    r = keepclear(['events', '--db', db]);
  });

  it('leads with the counts per tier', () => {
    expect(r.code, r.stderr).toBe(0);
    const counts = `Events by tier: ${TIERS.plan.label} 1 · ${TIERS.monitor.label} 2 · ${TIERS.routine.label} 2`;
    const lines = r.stdout.split('\n');
    expect(lines.indexOf(counts)).toBeGreaterThanOrEqual(0);
    expect(lines.indexOf(counts)).toBeLessThan(lines.findIndex((l) => l.startsWith('event ')));
  });

  it('then lists only the events above the lowest tier, highest Pc first', () => {
    const order = ['90001', '90002', '90003'].map((s) => r.stdout.indexOf(`${ids.get(s)} `));
    expect(order.every((i) => i > 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    for (const s of ['90004', '90005']) expect(r.stdout).not.toContain(`${ids.get(s)} `);
    expect(r.stdout).toContain(`2 ${TIERS.routine.label} event(s) not listed: --all-events lists every event`);
    expect(r.stdout).toContain(DECISION_AID_NOTE);
  });

  it('--all-events lists every event by TCA, a Pc below 1e-10 as "< 1e-10"', () => {
    const all = keepclear(['events', '--db', db, '--all-events']);
    expect(all.code, all.stderr).toBe(0);
    const rowOf = (s: string) => all.stdout.split('\n').find((l) => l.startsWith(`${ids.get(s)} `)) ?? '';
    for (const [s] of EVENTS) expect(rowOf(s), s).not.toBe('');
    expect(rowOf('90004')).toMatch(/ < 1e-10 /);
    expect(rowOf('90005')).toMatch(/ 1\.00e-9 /);
    expect(rowOf('90001')).toMatch(/ 3\.00e-4 /);
    const byTca = EVENTS.map(([s]) => all.stdout.indexOf(`${ids.get(s)} `)).reverse();
    expect([...byTca].sort((a, b) => a - b)).toEqual(byTca);
  });
});

describe('keepclear events --json -', () => {
  it('keeps the number and carries the decision-aid caution at the top level', () => {
    const r = keepclear(['events', '--db', db, '--json', '-']);
    expect(r.code, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { caution: string; events: { secondary: string; pc: number | null; tca: string }[] };
    expect(out.caution).toBe(DECISION_AID_NOTE);
    // what the briefing asks the note to say, read from the real output (not from the constant)
    expect(out.caution).toMatch(/decision aid/);
    expect(out.caution).toMatch(/screening provider/);
    expect(out.caution).toMatch(/licensed/);
    expect(out.caution).toMatch(/local rules/);
    expect(out.events.find((e) => e.secondary === '90004')!.pc).toBe(3e-12);
    expect(out.events.find((e) => e.secondary === '90003')!.pc).toBeNull();
    expect(out.events.map((e) => e.tca)).toEqual(EVENTS.map(([s], k) => toIso(encounter(s, 100 - k * 10, 0).tca)).reverse());
  });
});
