/**
 * Schema v4 (db/schemaV4.ts): runs.data_at, events.series_id and the series table, added to a v3
 * file holding data. Checks: nothing of v3 is lost (events compare equal field by field, apart
 * from the new seriesId), a screening run's data time is its own time and a run made from a
 * received message takes the message's CREATION_DATE (DESIGN.md "Series": "in the order their
 * data was created (a CDM's CREATION_DATE; a screening run's time)"), events start unlinked, and
 * the series table keeps its state words to the four of core/events/seriesState.ts.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Encounter, StateArray } from '../core/events/index.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import {
  KeepclearDb,
  MIGRATIONS,
  SCHEMA_VERSION,
  createRun,
  eventsOfRun,
  eventsOfSeries,
  getRun,
  getSeries,
  migrate,
  newestDataAt,
  openDatabase,
  putSeries,
  schemaVersion,
  setEventSeries,
  setRunDataAt,
  storeCdm,
  unlinkedPairs,
} from '../db/index.js';
import { insertEvents } from '../db/events.js';

const T0 = parseIso('2026-12-03T00:00:00Z')!;
const CREATED = parseIso('2026-11-30T12:00:00Z')!;

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-v4-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

function encounter(secondary: string, k: number): Encounter {
  const p: StateArray = [7000 + k, 1, 2, 0.1, 7.5, 0.2];
  const s: StateArray = [7000.5 + k, 1.2, 2.1, -0.1, -7.5, 0.3];
  return {
    primary: '100001', secondary, tca: instantFromMs(T0 + k * 60_000), missKm: 0.5 + k, relativeSpeedKmS: 15,
    rtnKm: [0.5, 0, k], approachAngleDeg: 170, entry: null, exit: null, primaryState: p, secondaryState: s,
    primaryEpoch: T0, secondaryEpoch: T0,
  };
}

/** A v3 file: a screening run with two events, a run made from a message (linked), a running run. */
function makeV3File(path: string): void {
  const db = new KeepclearDb(path, new Database(path), 5000);
  db.sqlite.pragma('journal_mode = WAL');
  db.sqlite.pragma('foreign_keys = ON');
  migrate(db, MIGRATIONS.filter((m) => m.version <= 3));
  expect(schemaVersion(db)).toBe(3);
  const run = db.sqlite.prepare(
    `INSERT INTO runs (id, seq, kind, created_at, start_ms, end_ms, volume_json, primaries_json, catalog_fingerprint,
       object_count, status, finished_at, wall_ms, event_count, flagged_count)
     VALUES (?, ?, ?, ?, ?, ?, '{"kind":"sphere","radiusKm":5}', '["100001"]', 'f', 30, 'done', ?, 10, ?, 0)`,
  );
  db.sqlite.transaction(() => {
    run.run('R1', 1, 'screening', T0 - 1000, T0, T0 + 7 * 86_400_000, T0, 2);
    insertEvents(db, 'R1', [encounter('110001', 1), encounter('110002', 2)]);
    run.run('R2', 2, 'cdm', T0 + 5000, T0, T0 + 1, T0 + 5000, 1);
    insertEvents(db, 'R2', [encounter('110001', 1)]);
  })();
  storeCdm(db, {
    messageId: 'M1', creationDate: CREATED, originator: 'ORIG', tca: instantFromMs(T0 + 60_000), missDistanceM: 1500,
    object1Id: '100001', object2Id: '110001', reportedPc: 1e-5, parsed: {}, eventId: 'R2-1',
  });
  db.close();
}

describe('schema v4 from a v3 file with data', () => {
  it('keeps every event; data times come from the run or its message; events start unlinked', () => {
    const path = join(dir, 'v3.db');
    makeV3File(path);
    const before = new KeepclearDb(path, new Database(path, { readonly: true }), 0);
    const eventsBefore = [...eventsOfRun(before, 'R1'), ...eventsOfRun(before, 'R2')];
    before.close();

    const db = openDatabase(path);
    try {
      expect(schemaVersion(db)).toBeGreaterThanOrEqual(4);
      expect(SCHEMA_VERSION).toBeGreaterThanOrEqual(4);
      expect(db.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
      const after = [...eventsOfRun(db, 'R1'), ...eventsOfRun(db, 'R2')];
      expect(after.map(({ seriesId: _s, ...rest }) => rest)).toEqual(eventsBefore.map(({ seriesId: _s, ...rest }) => rest));
      expect(after.every((e) => (e.seriesId ?? null) === null)).toBe(true);
      // screening: its own time; cdm: the message's CREATION_DATE (older than the run row)
      expect(getRun(db, 'R1')!.dataAt).toBe(T0 - 1000);
      expect(getRun(db, 'R2')!.dataAt).toBe(CREATED);
      expect(newestDataAt(db)).toBe(T0 - 1000);
      // all three events wait to be linked, by pair
      expect(unlinkedPairs(db).map((p) => p.join('/')).sort()).toEqual(['100001/110001', '100001/110002']);
    } finally {
      db.close();
    }
  });

  it('stores series ids and series rows; events of a series come in data order', () => {
    const path = join(dir, 'v3b.db');
    makeV3File(path);
    const db = openDatabase(path);
    try {
      setEventSeries(db, new Map([['R1-1', 'S-R2-1'], ['R2-1', 'S-R2-1']]));
      putSeries(db, [{
        id: 'S-R2-1', primary: '100001', secondary: '110001', founderEventId: 'R2-1', state: 'updated',
        tca: instantFromMs(T0 + 60_000), sightings: 2, lastEventId: 'R1-1', lastDataAt: instantFromMs(T0 - 1000),
        missedByRun: null, asOf: instantFromMs(T0 - 1000),
      }]);
      expect(getSeries(db, 'S-R2-1')?.state).toBe('updated');
      // R2's data (the message, 30 Nov) is older than R1's (3 Dec) although R2 was stored later
      expect(eventsOfSeries(db, 'S-R2-1').map((m) => [m.event.id, m.source.kind])).toEqual([['R2-1', 'cdm'], ['R1-1', 'screening']]);
      expect(unlinkedPairs(db).map((p) => p.join('/'))).toEqual(['100001/110002']);
      // state words are ours and fixed by the schema
      expect(() => db.sqlite.prepare("UPDATE series SET state = 'closed'").run()).toThrow(/CHECK/);
    } finally {
      db.close();
    }
  });

  it('a new run takes its own time as data time until told otherwise', () => {
    const db = openDatabase(':memory:');
    try {
      const id = createRun(db, { start: T0, end: instantFromMs(T0 + 1), volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['100001'] }, 'f', 1);
      const run = getRun(db, id)!;
      expect(run.dataAt).toBe(run.createdAt);
      setRunDataAt(db, id, CREATED);
      expect(getRun(db, id)!.dataAt).toBe(CREATED);
      expect(() => setRunDataAt(db, 'R99', CREATED)).toThrow(/no run "R99"/);
    } finally {
      db.close();
    }
  });
});
