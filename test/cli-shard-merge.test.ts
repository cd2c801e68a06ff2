/**
 * `keepclear screen --all --shard K/N` and `keepclear merge` as a user runs them (DESIGN.md
 * "--shard K/N and merge"): spawned processes on one database; the union of the shards, merged,
 * equals the unsharded run event for event (same pairs, TCA, miss and Pc); the merged run is
 * stored as one run; incomplete, repeated or foreign shards are refused with words; bad
 * arguments exit 2.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { generateCatalog } from '../core/synthetic/catalog.js';
import type { Instant } from '../core/time/instant.js';
import { listRuns, openDatabase } from '../db/index.js';
import { runKeepclear, type EventJson, type Run } from './support/cli.js';

const START = '2026-12-07T00:00:00Z';
let dir: string;
const k = (args: string[]): Run => runKeepclear(args, dir);
const db = () => join(dir, 'k.db');
const screenArgs = ['screen', '--all', '--start', START, '--days', '0.15', '--threshold-km', '10', '--workers', '1'];

interface Doc { run: Record<string, unknown>; events: EventJson[] }
const read = (f: string): Doc => JSON.parse(readFileSync(f, 'utf8')) as Doc;
const key = (e: EventJson) => `${[e.primary, e.secondary].sort().join('~')}@${e.tca}`;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-shards-'));
  const sets = generateCatalog({ size: 1500, seed: 21, epoch: Date.parse(START) as Instant });
  writeFileSync(join(dir, 'cat.json'), formatOmmJson(sets));
  const imp = k(['import', join(dir, 'cat.json'), '--db', db()]);
  expect(imp.code, imp.stderr).toBe(0);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('shards and merge', () => {
  it('the merged run of 3 shards equals the unsharded run', () => {
    const whole = k([...screenArgs, '--db', db(), '--json', join(dir, 'whole.json')]);
    expect(whole.code, whole.stderr).toBe(0);
    for (let s = 1; s <= 3; s++) {
      const r = k([...screenArgs, '--shard', `${s}/3`, '--db', db(), '--json', join(dir, `s${s}.json`)]);
      expect(r.code, r.stderr).toBe(0);
      expect(r.stdout).toContain(`shard ${s}/3`);
    }
    const runsBefore = listRuns(openDatabase(db(), { readonly: true } as never)).length;
    const merged = k(['merge', ...[1, 2, 3].map((s) => join(dir, `s${s}.json`)), '--db', db(), '--json', '-']);
    expect(merged.code, merged.stderr).toBe(0);
    const m = JSON.parse(merged.stdout) as Doc & { caution: string };
    const w = read(join(dir, 'whole.json'));
    expect(typeof m.caution).toBe('string');
    expect(w.events.length).toBeGreaterThanOrEqual(10);
    expect(m.run).toMatchObject({ allObjects: true, objects: 1500, shards: 3, status: 'done', thresholdKm: 10 });
    expect(m.run.catalogFingerprint).toBe(w.run.catalogFingerprint);
    const shardCounts = [1, 2, 3].map((s) => read(join(dir, `s${s}.json`)).events.length);
    expect(shardCounts.reduce((a, b) => a + b, 0)).toBe(w.events.length);
    expect(shardCounts.filter((c) => c > 0).length).toBeGreaterThan(1);
    const pick = (e: EventJson) => ({ key: key(e), missKm: e.missKm, pc: e.pc, rtnKm: e.rtnKm });
    expect(m.events.map(pick).sort((a, b) => a.key.localeCompare(b.key))).toEqual(w.events.map(pick).sort((a, b) => a.key.localeCompare(b.key)));
    // stored as one run of kind "merge"
    const runs = listRuns(openDatabase(db()));
    expect(runs.length).toBe(runsBefore + 1);
    expect(runs[0]).toMatchObject({ kind: 'merge', status: 'done', eventCount: w.events.length });
  });

  it('refuses a missing, repeated or foreign shard, changing nothing', () => {
    const before = listRuns(openDatabase(db())).length;
    const missing = k(['merge', join(dir, 's1.json'), join(dir, 's3.json'), '--db', db()]);
    expect(missing.code).toBe(1);
    expect(missing.stderr).toMatch(/shard 2\/3 missing/);
    const twice = k(['merge', join(dir, 's1.json'), join(dir, 's1.json'), join(dir, 's2.json'), join(dir, 's3.json'), '--db', db()]);
    expect(twice.code).toBe(1);
    expect(twice.stderr).toMatch(/s1\.json: shard 1\/3 is also in/);
    const foreign = read(join(dir, 's2.json'));
    foreign.run.catalogFingerprint = 'something else';
    writeFileSync(join(dir, 'foreign.json'), JSON.stringify(foreign));
    const other = k(['merge', join(dir, 's1.json'), join(dir, 'foreign.json'), join(dir, 's3.json'), '--db', db()]);
    expect(other.code).toBe(1);
    expect(other.stderr).toMatch(/foreign\.json: its catalogue fingerprint/);
    const notShard = k(['merge', join(dir, 'whole.json'), '--db', db()]);
    expect(notShard.code).toBe(1);
    expect(notShard.stderr).toMatch(/whole\.json: its run is not a shard/);
    expect(listRuns(openDatabase(db())).length).toBe(before);
  });

  it('bad --shard arguments exit 2 before any work', () => {
    for (const [args, msg] of [
      [['screen', '--primary', '1', '--shard', '1/2', '--json', 'x.json'], /with --all/],
      [['screen', '--all', '--shard', '1/2'], /needs --json FILE/],
      [['screen', '--all', '--shard', '3/2', '--json', 'x.json'], /K\/N with 1 ≤ K ≤ N/],
      [['screen', '--all', '--shard', 'two', '--json', 'x.json'], /K\/N/],
    ] as const) {
      const r = k([...args, '--db', join(dir, 'never.db')]);
      expect(r.code, `${args.join(' ')}: ${r.stderr}`).toBe(2);
      expect(r.stderr).toMatch(msg);
    }
    const none = k(['merge', '--db', join(dir, 'never.db')]);
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/give the JSON files/);
  });
});
