/**
 * The catalogue fingerprint kept between runs (schema v8, db/fingerprint.ts): used only while it
 * still describes the latest sets. Every check compares with the fingerprint computed afresh
 * from latestElementSets, so a kept value that outlived a change of the sets fails it.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importFiles } from '../app/import/index.js';
import type { ElementSet } from '../core/elements/elementSet.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { instantFromMs, parseIso, type Instant } from '../core/time/instant.js';
import {
  catalogFingerprint,
  fingerprintOfCatalogue,
  fingerprintOfSets,
  latestElementSets,
  migrate,
  MIGRATIONS,
  openDatabase,
  readCatalogue,
  schemaVersion,
  storeElementSets,
  type KeepclearDb,
} from '../db/index.js';
import { KeepclearDb as Db } from '../db/connection.js';

const T0 = parseIso('2026-03-01T00:00:00Z')!;
const HOUR_MS = 3_600_000;
const at = (hours: number): Instant => instantFromMs(T0 + hours * HOUR_MS);
const FILE = { path: 'cat.tle', sha256: 'a'.repeat(64), format: 'TLE' };

function set(objectId: string, epoch: Instant, over: Partial<ElementSet> = {}): ElementSet {
  return {
    objectId, name: `SAT ${objectId}`, intlDesignator: null, classification: 'U', epoch,
    meanMotionRevPerDay: 15.2, eccentricity: 0.0012, inclinationDeg: 53.05, raanDeg: 120.5, argPerigeeDeg: 90.25,
    meanAnomalyDeg: 270.125, bstar: 1.2345e-4, meanMotionDot: 1.5e-5, meanMotionDdot: 0, elementSetNo: 999,
    revAtEpoch: 12345, ephemerisType: 0, source: { file: 'cat.tle', line: 1, format: 'TLE' }, ...over,
  };
}

/** The fingerprint computed afresh, never from the kept one. */
const fresh = (db: KeepclearDb): string => fingerprintOfSets(latestElementSets(db));

interface State {
  generation: number;
  fingerprint: string | null;
  fingerprint_generation: number | null;
}
const state = (db: KeepclearDb): State => db.sqlite.prepare('SELECT * FROM catalog_state').get() as State;

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-fingerprint-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('kept catalogue fingerprint', () => {
  it('is kept once computed and then read back, equal to the fresh one', () => {
    const db = openDatabase(':memory:');
    storeElementSets(db, FILE, [set('1', at(0)), set('2', at(0))], []);
    expect(state(db).fingerprint).toBeNull();
    const f = catalogFingerprint(db);
    expect(f).toBe(fresh(db));
    expect(state(db)).toMatchObject({ fingerprint: f, fingerprint_generation: state(db).generation });
    // Read back, not computed: a planted value comes back as long as the generation matches.
    db.sqlite.prepare("UPDATE catalog_state SET fingerprint = 'planted'").run();
    expect(catalogFingerprint(db)).toBe('planted');
    db.close();
  });

  it('is not used after a new set, a correction or a deletion, whoever writes it', () => {
    const db = openDatabase(':memory:');
    storeElementSets(db, FILE, [set('1', at(0)), set('2', at(0))], []);
    const f0 = catalogFingerprint(db);
    storeElementSets(db, FILE, [set('1', at(6))], []); // newer epoch
    const f1 = catalogFingerprint(db);
    expect(f1).not.toBe(f0);
    expect(f1).toBe(fresh(db));
    storeElementSets(db, FILE, [set('2', at(0), { bstar: 2e-4 })], []); // correction: supersedes (UPDATE) and inserts
    const f2 = catalogFingerprint(db);
    expect(f2).not.toBe(f1);
    expect(f2).toBe(fresh(db));
    // Writes outside the store (another tool, by hand) move the generation too: the triggers.
    db.sqlite.prepare("DELETE FROM element_sets WHERE object_id = '1' AND epoch_ms = ?").run(at(6));
    const f3 = catalogFingerprint(db);
    expect(f3).toBe(fresh(db));
    expect(f3).not.toBe(f2);
    db.sqlite.prepare("UPDATE element_sets SET bstar = 3e-4 WHERE object_id = '2' AND superseded = 0").run();
    expect(catalogFingerprint(db)).toBe(fresh(db));
    expect(catalogFingerprint(db)).not.toBe(f3);
    db.close();
  });

  it('of a snapshot read before another process imported: returned, not kept', () => {
    const path = join(dir, 'race.db');
    const a = openDatabase(path);
    const b = openDatabase(path);
    storeElementSets(a, FILE, [set('1', at(0))], []);
    const snapshot = readCatalogue(a);
    storeElementSets(b, FILE, [set('2', at(0))], []); // lands between the read and the fingerprint
    const f = fingerprintOfCatalogue(a, snapshot);
    expect(f).toBe(fingerprintOfSets(snapshot.sets)); // what the run screened
    expect(state(a).fingerprint).toBeNull(); // not kept: it no longer describes the sets
    expect(catalogFingerprint(a)).toBe(fresh(a));
    expect(catalogFingerprint(a)).not.toBe(f);
    a.close();
    b.close();
  });

  it('readCatalogue reads the latest orbits and their generation from one snapshot', () => {
    const db = openDatabase(':memory:');
    storeElementSets(db, FILE, [set('1', at(0)), set('2', at(1)), set('3', at(0), { classification: 'C', elementSetNo: 7 })], []);
    storeElementSets(db, FILE, [set('1', at(5), { meanAnomalyDeg: 10.5 }), set('2', at(1), { bstar: 3e-4 })], []); // newer; correction
    const snap = readCatalogue(db);
    // latestElementSets without name, designator and source: the newest epoch, the correction.
    const orbitOf = ({ name: _n, intlDesignator: _i, source: _s, ...orbit }: ElementSet) => orbit;
    expect(snap.sets).toEqual(latestElementSets(db).map(orbitOf));
    expect(snap.sets.map((s) => [s.objectId, s.epoch, s.bstar])).toEqual([['1', at(5), 1.2345e-4], ['2', at(1), 3e-4], ['3', at(0), 1.2345e-4]]);
    expect(snap.sets[2]).toMatchObject({ classification: 'C', elementSetNo: 7 });
    expect(fingerprintOfSets(snap.sets)).toBe(fresh(db));
    expect(snap.generation).toBe(state(db).generation);
    expect(snap.generation).toBeGreaterThan(0);
    db.close();
  });

  it('a read-only database: the fingerprint is still given, only not kept', () => {
    const path = join(dir, 'ro.db');
    const w = openDatabase(path);
    storeElementSets(w, FILE, [set('1', at(0))], []);
    const expected = fresh(w);
    w.close();
    const ro = new Db(path, new Database(path, { readonly: true }), 1000);
    expect(catalogFingerprint(ro)).toBe(expected);
    expect(state(ro).fingerprint).toBeNull();
    ro.sqlite.close();
  });

  it('an import keeps it unless asked not to', () => {
    const tle = join(dir, 'two.tle');
    writeFileSync(tle, formatTleFile([set('11', at(0)), set('12', at(0))]));
    const db = openDatabase(':memory:');
    importFiles(db, { files: [tle] });
    expect(state(db)).toMatchObject({ fingerprint: fresh(db), fingerprint_generation: state(db).generation });
    const other = openDatabase(':memory:');
    importFiles(other, { files: [tle], keepFingerprint: false });
    expect(state(other).fingerprint).toBeNull();
    db.close();
    other.close();
  });

  it('schema v8 on a v7 database: generation 0, nothing kept, then computed from its sets', () => {
    const db = new Db(':memory:', new Database(':memory:'), 5000);
    migrate(db, MIGRATIONS.filter((m) => m.version <= 7));
    storeElementSets(db, FILE, [set('1', at(0))], []);
    migrate(db);
    expect(schemaVersion(db)).toBe(8);
    expect(state(db)).toEqual({ id: 1, generation: 0, fingerprint: null, fingerprint_generation: null });
    expect(catalogFingerprint(db)).toBe(fresh(db));
    db.close();
  });
});
