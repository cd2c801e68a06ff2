/**
 * Schema v3 (db/schemaV3.ts): the runs table is rebuilt to change its CHECK constraints, the
 * way the SQLite documentation prescribes (https://www.sqlite.org/lang_altertable.html §7:
 * foreign keys off outside the transaction, create / copy / drop / rename, foreign_key_check).
 * Checked on a v2 file holding data of every kind that references runs: the events, flagged
 * objects and the received message linked to an event must all survive, and the control case
 * shows what the same step does with foreign keys left on (it deletes every event).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import Database from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Encounter, RiskAssessment, StateArray } from '../core/events/index.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import {
  KeepclearDb,
  MIGRATIONS,
  SCHEMA_VERSION,
  createRun,
  eventsOfRun,
  getCdm,
  getRun,
  latestRun,
  listRuns,
  migrate,
  openDatabase,
  schemaVersion,
  storeCdm,
  type Migration,
} from '../db/index.js';
import { insertEvents } from '../db/events.js';

const T0 = parseIso('2026-12-03T00:00:00Z')!;
const SHA = 'c'.repeat(64);

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-v3-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

function encounter(secondary: string, k: number): Encounter {
  const p: StateArray = [7000 + k, 1, 2, 0.1, 7.5, 0.2];
  const s: StateArray = [7000.5 + k, 1.2, 2.1, -0.1, -7.5, 0.3];
  return {
    primary: '25544', secondary, tca: instantFromMs(T0 + k * 60_000), missKm: 0.5 + k, relativeSpeedKmS: 15,
    rtnKm: [0.5, 0, k], approachAngleDeg: 170, entry: null, exit: null, primaryState: p, secondaryState: s,
    primaryEpoch: T0, secondaryEpoch: T0,
  };
}
const RISK: RiskAssessment = {
  pc: 2e-5, pcMethod: '2d-reference', covarianceSource: 'cdm / cdm', hardBodyRadiusM: 10, tier: 'monitor', warnings: ['w'],
};

/** A database as schema v2 left it, written with v2's statements: three runs, events, a linked message. */
function makeV2File(path: string): void {
  const db = new KeepclearDb(path, new Database(path), 5000);
  db.sqlite.pragma('journal_mode = WAL');
  db.sqlite.pragma('foreign_keys = ON');
  migrate(db, MIGRATIONS.filter((m) => m.version <= 2));
  expect(schemaVersion(db)).toBe(2);
  const run = db.sqlite.prepare(
    `INSERT INTO runs (id, seq, created_at, start_ms, end_ms, volume_json, primaries_json, catalog_fingerprint,
       object_count, status, finished_at, wall_ms, event_count, flagged_count)
     VALUES (?, ?, ?, ?, ?, '{"kind":"sphere","radiusKm":5}', '["25544"]', ?, 30, ?, ?, 10, ?, ?)`,
  );
  db.sqlite.transaction(() => {
    run.run('R1', 1, T0, T0, T0 + 86_400_000, 'f'.repeat(64), 'done', T0 + 5, 2, 1);
    insertEvents(db, 'R1', [{ ...encounter('40000', 1), risk: RISK }, encounter('40001', 2)]);
    db.sqlite.prepare("INSERT INTO run_flagged (run_id, object_id, reason) VALUES ('R1', '99', 'decayed')").run();
    run.run('R2', 2, T0 + 10, T0, T0 + 1, `cdm:${SHA}`, 'done', T0 + 11, 1, 0);
    insertEvents(db, 'R2', [{ ...encounter('40000', 1), risk: RISK }]);
    run.run('R3', 3, T0 + 20, T0, T0 + 86_400_000, 'e'.repeat(64), 'running', null, null, null);
  })();
  storeCdm(db, {
    messageId: 'M1', creationDate: T0, originator: 'ORIG', tca: instantFromMs(T0 + 60_000), missDistanceM: 1500,
    object1Id: '25544', object2Id: '40000', reportedPc: 1e-5, parsed: {}, eventId: 'R2-1',
  });
  db.close();
}

describe('schema v3 from a v2 file with data', () => {
  it('keeps every event, flagged object and message link; kinds and statuses are set', () => {
    const path = join(dir, 'v2.db');
    makeV2File(path);
    const before = new KeepclearDb(path, new Database(path, { readonly: true }), 0);
    const eventsBefore = [...eventsOfRun(before, 'R1'), ...eventsOfRun(before, 'R2')];
    before.close();
    expect(eventsBefore).toHaveLength(3);

    const db = openDatabase(path);
    try {
      expect(schemaVersion(db)).toBe(SCHEMA_VERSION);
      expect(SCHEMA_VERSION).toBeGreaterThanOrEqual(3); // later steps add to v3; they must keep its data
      expect(db.sqlite.pragma('foreign_keys', { simple: true })).toBe(1); // back on after the rebuild
      expect(db.sqlite.pragma('foreign_key_check')).toEqual([]);
      expect(db.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
      expect([...eventsOfRun(db, 'R1'), ...eventsOfRun(db, 'R2')]).toEqual(eventsBefore);
      const runs = listRuns(db);
      expect(runs.map((r) => [r.id, r.kind, r.status])).toEqual([
        ['R3', 'screening', 'interrupted'], // v2 knew no owner: left running by a killed process
        ['R2', 'cdm', 'done'],
        ['R1', 'screening', 'done'],
      ]);
      expect(getRun(db, 'R2')?.catalogFingerprint).toBe(SHA); // the "cdm:" prefix is gone
      expect(getRun(db, 'R1')?.flagged).toEqual([{ id: '99', reason: 'decayed' }]);
      expect(getRun(db, 'R1')?.owner).toBeNull();
      expect(getCdm(db, 1)?.eventId).toBe('R2-1');
      expect(latestRun(db, 'done', ['screening'])?.id).toBe('R1');
      // the rebuilt table's constraints are those of v3
      expect(() => db.sqlite.prepare("UPDATE runs SET kind = 'other' WHERE id = 'R1'").run()).toThrow(/CHECK/);
      expect(() => db.sqlite.prepare("DELETE FROM runs WHERE id = 'R1'").run()).not.toThrow();
      expect(eventsOfRun(db, 'R1')).toEqual([]); // ON DELETE CASCADE still holds after the rename
    } finally {
      db.close();
    }
  });

  it('control: the same step with foreign keys left on deletes every event', () => {
    const path = join(dir, 'control.db');
    makeV2File(path);
    const db = new KeepclearDb(path, new Database(path), 5000);
    db.sqlite.pragma('foreign_keys = ON');
    const step = MIGRATIONS.find((m) => m.version === 3)!;
    const naive: Migration = { version: step.version, name: step.name, up: step.up };
    migrate(db, [...MIGRATIONS.filter((m) => m.version <= 2), naive]);
    expect(db.sqlite.prepare('SELECT COUNT(*) FROM events').pluck().get()).toBe(0);
    db.close();
  });
});

describe('runs left running by a dead process', () => {
  /** The pid of a process that has certainly exited. */
  function deadPid(): number {
    const r = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
    return Number(r.stdout);
  }
  const SETTINGS = { start: T0, end: instantFromMs(T0 + 1), volume: { kind: 'sphere' as const, radiusKm: 5 }, primaries: ['1'] };

  it('are marked interrupted on the next open; live, foreign-host and finished runs are not', () => {
    const path = join(dir, 'owners.db');
    const db = openDatabase(path);
    const dead = createRun(db, SETTINGS, 'x', 1, 'screening', { pid: deadPid(), host: hostname() });
    const alive = createRun(db, SETTINGS, 'x', 1); // this process
    const elsewhere = createRun(db, SETTINGS, 'x', 1, 'screening', { pid: deadPid(), host: `not-${hostname()}` });
    expect(getRun(db, alive)?.owner).toEqual({ pid: process.pid, host: hostname() });
    db.close();
    const again = openDatabase(path);
    try {
      expect(getRun(again, dead)).toMatchObject({ status: 'interrupted' });
      expect(getRun(again, dead)?.finishedAt).not.toBeNull();
      expect(getRun(again, alive)?.status).toBe('running');
      expect(getRun(again, elsewhere)?.status).toBe('running');
    } finally {
      again.close();
    }
  });
});
