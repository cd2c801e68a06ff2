import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import type { Rejection } from '../core/errors.js';
import { instantFromMs, parseIso, type Instant } from '../core/time/instant.js';
import {
  catalogFingerprint,
  countObjects,
  elementSetHistory,
  getObject,
  latestElementSets,
  listImportFiles,
  openDatabase,
  rejectionsOfImport,
  setHardBodyRadius,
  storeElementSets,
  supersededElementSets,
  EPOCH_MATCH_MS,
  type KeepclearDb,
} from '../db/index.js';
import { clearInjectedFailures, failElementSetInsertsFor } from '../db/testing.js';

const T0 = parseIso('2026-03-01T00:00:00Z')!;
const HOUR_MS = 3_600_000;
const at = (hours: number): Instant => instantFromMs(T0 + hours * HOUR_MS);

/** A plausible LEO set; vary the fields a test is about. */
function set(objectId: string, epoch: Instant, over: Partial<ElementSet> = {}): ElementSet {
  return {
    objectId,
    name: `SAT ${objectId}`,
    intlDesignator: '2020-001A',
    classification: 'U',
    epoch,
    meanMotionRevPerDay: 15.2,
    eccentricity: 0.0012,
    inclinationDeg: 53.05,
    raanDeg: 120.5,
    argPerigeeDeg: 90.25,
    meanAnomalyDeg: 270.125,
    bstar: 1.2345e-4,
    meanMotionDot: 1.5e-5,
    meanMotionDdot: 0,
    elementSetNo: 999,
    revAtEpoch: 12345,
    ephemerisType: 0,
    source: { file: 'cat.tle', line: 1, format: 'TLE' },
    ...over,
  };
}

const FILE = { path: 'cat.tle', sha256: 'a'.repeat(64), format: 'TLE' };

let db: KeepclearDb;
beforeEach(() => {
  db = openDatabase(':memory:');
});
afterEach(() => db.close());

describe('storeElementSets', () => {
  it('imports new sets and round-trips every field', () => {
    const a = set('25544', at(0), { name: null, intlDesignator: null, classification: 'C', meanMotionDdot: -1.5e-11 });
    const b = set('100000', at(1), { source: { file: 'cat.tle', line: 4, format: 'TLE' } });
    const r = storeElementSets(db, FILE, [a, b], []);
    expect(r).toMatchObject({ imported: 2, updated: 0, unchanged: 0, rejected: 0 });
    expect(latestElementSets(db)).toEqual([b, a]); // ordered by id text: "100000" < "25544"
  });

  it('re-importing the same sets changes nothing', () => {
    const sets = [set('1', at(0)), set('2', at(0)), set('3', at(0))];
    storeElementSets(db, FILE, sets, []);
    const before = catalogFingerprint(db);
    const again = storeElementSets(db, FILE, sets, []);
    expect(again).toMatchObject({ imported: 0, updated: 0, unchanged: 3, rejected: 0 });
    expect(elementSetHistory(db, '1')).toHaveLength(1);
    expect(catalogFingerprint(db)).toBe(before);
  });

  it('treats epochs within EPOCH_MATCH_MS as the same epoch (TLE vs OMM quantisation)', () => {
    storeElementSets(db, FILE, [set('1', at(0))], []);
    const shifted = set('1', instantFromMs(at(0) + 0.8 * EPOCH_MATCH_MS));
    expect(storeElementSets(db, FILE, [shifted], [])).toMatchObject({ imported: 0, unchanged: 1 });
  });

  it('adds a newer epoch as history and keeps the older one', () => {
    storeElementSets(db, FILE, [set('7', at(0))], []);
    const r = storeElementSets(db, FILE, [set('7', at(12), { meanAnomalyDeg: 10 }), set('7', at(-12))], []);
    expect(r).toMatchObject({ imported: 2, updated: 0, unchanged: 0 });
    expect(elementSetHistory(db, '7').map((s) => s.epoch)).toEqual([at(-12), at(0), at(12)]);
    const [latest] = latestElementSets(db, ['7']);
    expect(latest?.epoch).toBe(at(12));
    expect(latest?.meanAnomalyDeg).toBe(10);
    const obj = getObject(db, '7');
    expect(obj?.firstSeen).toBe(at(-12));
    expect(obj?.lastSeen).toBe(at(12));
  });

  it('an older set arriving late does not become the latest', () => {
    storeElementSets(db, FILE, [set('8', at(24))], []);
    storeElementSets(db, FILE, [set('8', at(0), { meanAnomalyDeg: 1 })], []);
    expect(latestElementSets(db, ['8'])[0]?.epoch).toBe(at(24));
  });

  it('counts a correction (same epoch, other elements) as updated and keeps the old row superseded', () => {
    storeElementSets(db, FILE, [set('9', at(0))], []);
    const corrected = set('9', at(0), { inclinationDeg: 53.06 });
    const r = storeElementSets(db, FILE, [corrected], []);
    expect(r).toMatchObject({ imported: 0, updated: 1, unchanged: 0 });
    expect(elementSetHistory(db, '9')).toEqual([corrected]);
    expect(latestElementSets(db, ['9'])).toEqual([corrected]);
    expect(supersededElementSets(db, '9').map((s) => s.inclinationDeg)).toEqual([53.05]);
    // the correction itself re-imported is now unchanged
    expect(storeElementSets(db, FILE, [corrected], [])).toMatchObject({ updated: 0, unchanged: 1 });
  });

  it('a duplicate inside one file is counted once', () => {
    const r = storeElementSets(db, FILE, [set('5', at(0)), set('5', at(0))], []);
    expect(r).toMatchObject({ imported: 1, unchanged: 1 });
  });

  it('stores the reader rejections and turns unstorable sets into rejections, keeping the rest', () => {
    const readerRejection: Rejection = { code: 'TLE_CHECKSUM', file: 'cat.tle', line: 7, reason: 'checksum 3, expected 4' };
    const bad = set('11', at(0), { eccentricity: Number.NaN, source: { file: 'cat.tle', line: 10, format: 'TLE' } });
    const r = storeElementSets(db, FILE, [set('10', at(0)), bad, set('12', at(0))], [readerRejection]);
    expect(r).toMatchObject({ imported: 2, updated: 0, unchanged: 0, rejected: 2 });
    expect(r.rejections.map((x) => x.line)).toEqual([7, 10]);
    expect(rejectionsOfImport(db, r.importFileId)).toEqual([
      { line: 7, code: 'TLE_CHECKSUM', reason: 'checksum 3, expected 4' },
      { line: 10, code: 'VALUE_OUT_OF_RANGE', reason: expect.stringMatching(/eccentricity is NaN/) },
    ]);
    const [logged] = listImportFiles(db);
    expect(logged).toMatchObject({ path: 'cat.tle', format: 'TLE', imported: 2, rejected: 2 });
    expect(getObject(db, '11')).toBeNull();
  });

  it('is one transaction per file: a failure mid-store leaves nothing of that file', () => {
    storeElementSets(db, { ...FILE, path: 'first.tle' }, [set('1', at(0))], []);
    const before = catalogFingerprint(db);
    failElementSetInsertsFor(db, '3');
    const sets = [set('2', at(0)), set('1', at(0), { raanDeg: 1 }), set('3', at(0)), set('4', at(0))];
    expect(() =>
      storeElementSets(db, { ...FILE, path: 'second.tle' }, sets, [
        { code: 'TLE_CHECKSUM', file: 'second.tle', line: 9, reason: 'x' },
      ]),
    ).toThrow(/injected failure/);
    // set 2 was inserted and set 1 corrected before the failure; all of it must be gone
    expect(getObject(db, '2')).toBeNull();
    expect(countObjects(db)).toBe(1);
    expect(supersededElementSets(db, '1')).toEqual([]);
    expect(catalogFingerprint(db)).toBe(before);
    expect(listImportFiles(db).map((f) => f.path)).toEqual(['first.tle']);
    // and the same file goes in whole once the fault is gone
    clearInjectedFailures(db);
    expect(storeElementSets(db, { ...FILE, path: 'second.tle' }, sets, [])).toMatchObject({
      imported: 3,
      updated: 1,
    });
  });

  it('names and designators: the newest set wins, a missing one never erases', () => {
    storeElementSets(db, FILE, [set('20', at(0), { name: 'TBA - TO BE ASSIGNED' })], []);
    storeElementSets(db, FILE, [set('20', at(5), { name: 'NEWSAT 1' })], []);
    storeElementSets(db, FILE, [set('20', at(-5), { name: 'OLDER NAME' })], []);
    storeElementSets(db, FILE, [set('20', at(10), { name: null, intlDesignator: null })], []);
    expect(getObject(db, '20')).toMatchObject({ name: 'NEWSAT 1', intlDesignator: '2020-001A' });
  });
});

describe('latestElementSets', () => {
  it('filters by ids, skipping unknown ones', () => {
    storeElementSets(db, FILE, [set('1', at(0)), set('2', at(0)), set('3', at(0))], []);
    expect(latestElementSets(db, ['3', '1', '404']).map((s) => s.objectId)).toEqual(['1', '3']);
    expect(latestElementSets(db, [])).toEqual([]);
  });
});

describe('catalogFingerprint', () => {
  it('is stable across databases, import order and source names', () => {
    const sets = [set('1', at(0)), set('2', at(1)), set('3', at(2))];
    storeElementSets(db, FILE, sets, []);
    const other = openDatabase(':memory:');
    const renamed = [...sets].reverse().map((s) => ({ ...s, name: 'X', source: { file: 'y.json', line: 3, format: 'OMM-JSON' as const } }));
    storeElementSets(other, { ...FILE, path: 'y.json' }, renamed, []);
    expect(catalogFingerprint(other)).toBe(catalogFingerprint(db));
    expect(catalogFingerprint(db)).toMatch(/^[0-9a-f]{64}$/);
    other.close();
  });

  it('changes with a newer epoch, a correction, or the id selection', () => {
    storeElementSets(db, FILE, [set('1', at(0)), set('2', at(0))], []);
    const f0 = catalogFingerprint(db);
    const f0sub = catalogFingerprint(db, ['1']);
    expect(f0sub).not.toBe(f0);
    storeElementSets(db, FILE, [set('2', at(0), { bstar: 2e-4 })], []);
    const f1 = catalogFingerprint(db);
    expect(f1).not.toBe(f0);
    expect(catalogFingerprint(db, ['1'])).toBe(f0sub); // object 1 untouched
    storeElementSets(db, FILE, [set('1', at(6))], []);
    expect(catalogFingerprint(db)).not.toBe(f1);
  });
});

describe('setHardBodyRadius', () => {
  it('sets and clears the radius of known objects only, refusing non-positive values', () => {
    storeElementSets(db, FILE, [set('1', at(0)), set('2', at(0))], []);
    expect(setHardBodyRadius(db, ['1', '2', '404'], 2.5)).toBe(2);
    expect(getObject(db, '2')?.hardBodyRadiusM).toBe(2.5);
    expect(setHardBodyRadius(db, ['2'], null)).toBe(1);
    expect(getObject(db, '2')?.hardBodyRadiusM).toBeNull();
    expect(() => setHardBodyRadius(db, ['1'], 0)).toThrow(/positive/);
    expect(() => setHardBodyRadius(db, ['1'], Number.NaN)).toThrow(/positive/);
  });
});

describe('bulk store', () => {
  it('stores 100,000 sets in one call, then finds them all unchanged', () => {
    const N = 100_000;
    const sets = Array.from({ length: N }, (_, i) =>
      set(String(i + 1), at(i % 48), { meanAnomalyDeg: (i * 3.7) % 360, raanDeg: (i * 1.3) % 360 }),
    );
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    const first = storeElementSets(db, FILE, sets, []);
    const t1 = performance.now();
    const cpu1 = process.cpuUsage(cpu0);
    expect(first).toMatchObject({ imported: N, updated: 0, unchanged: 0, rejected: 0 });
    const again = storeElementSets(db, FILE, sets, []);
    const t2 = performance.now();
    expect(again).toMatchObject({ imported: 0, unchanged: N });
    const t3 = performance.now();
    const latest = latestElementSets(db);
    const t4 = performance.now();
    expect(latest).toHaveLength(N);
    expect(countObjects(db)).toBe(N);
    // Measured, not asserted (machines differ): reported with the storage work.
    console.log(
      `store ${N} sets: ${(t1 - t0).toFixed(0)} ms wall, ${((cpu1.user + cpu1.system) / 1000).toFixed(0)} ms CPU ` +
        `(${Math.round(N / ((t1 - t0) / 1000))} sets/s wall); ` +
        `re-store unchanged: ${(t2 - t1).toFixed(0)} ms; latestElementSets: ${(t4 - t3).toFixed(0)} ms`,
    );
  });
});
