/**
 * Schema v5 (owner ephemerides): the step applies on top of v3 alone (it uses no table of v4),
 * stores an OEM's segments compactly and gives them back unchanged, records the ephemeris a run
 * used, and refuses rows whose packed nodes do not match their count.
 */
import { describe, expect, it } from 'vitest';
import { formatOemKvn, parseOemFile, sampleOem } from '../core/formats/oem/index.js';
import { StraightLineTrajectory } from '../core/propagation/straightLine.js';
import { parseIso, type Instant } from '../core/time/instant.js';
import {
  createRun, describeDatabase, getEphemeris, listEphemerides, loadEphemeris, migrate, MIGRATIONS, openDatabase,
  recordRunEphemeris, runEphemerides, schemaVersion, storeEphemeris,
} from '../db/index.js';
import { KeepclearDb } from '../db/connection.js';
import Database from 'better-sqlite3';

const T0 = parseIso('2026-12-07T00:00:00Z')!;

function oem() {
  const traj = new StraightLineTrajectory('100001', T0, [7000, 0, 0], [0, 7.5, 0]);
  const model = sampleOem([{ trajectory: traj, start: T0, end: (T0 + 3_600_000) as Instant, stepS: 60 }], {
    objectName: 'KEEPCLEAR-1', objectId: '100001', originator: 'TARNWELL ORBITAL', creationDate: T0,
  });
  // through the writer and reader, so it carries source lines like an imported file
  return parseOemFile(formatOemKvn(model), 'k1.oem').oem!;
}

describe('schema v5', () => {
  it('applies on top of v3 without v4 and holds an ephemeris', () => {
    const db = new KeepclearDb(':memory:', new Database(':memory:'), 5000);
    migrate(db, MIGRATIONS.filter((m) => m.version <= 3 || m.version === 5));
    expect(schemaVersion(db)).toBe(5);
    expect(describeDatabase(db).tables).toEqual(expect.arrayContaining(['ephemerides', 'ephemeris_segments', 'run_ephemerides']));
    const o = oem();
    const { id, inserted } = storeEphemeris(db, { objectId: '100001', fileName: 'k1.oem', sha256: 'a'.repeat(64), header: o.header, segments: o.segments });
    expect(inserted).toBe(true);
    expect(storeEphemeris(db, { objectId: '100001', fileName: 'k1.oem', sha256: 'a'.repeat(64), header: o.header, segments: o.segments }))
      .toEqual({ id, inserted: false });
    const back = loadEphemeris(db, id)!;
    expect(back.segments).toHaveLength(1);
    const [s, t] = [o.segments[0]!, back.segments[0]!];
    expect([...t.epochs]).toEqual([...s.epochs]);
    expect([...t.teme]).toEqual([...s.teme]);
    expect([...t.nodeLines]).toEqual([...s.nodeLines]);
    expect(t.metadata).toEqual(JSON.parse(JSON.stringify(s.metadata)));
    expect(t.usable).toEqual(s.usable);
    expect(back.header.originator).toBe('TARNWELL ORBITAL');
    expect(getEphemeris(db, id)).toMatchObject({ objectId: '100001', segmentCount: 1, covarianceCount: 0 });
    db.close();
  });

  it('records the ephemeris a run used; the record goes with the run', () => {
    const db = openDatabase(':memory:');
    const o = oem();
    storeEphemeris(db, { objectId: '100001', fileName: 'k1.oem', sha256: 'b'.repeat(64), header: o.header, segments: o.segments });
    const e = listEphemerides(db, '100001')[0]!;
    const run = createRun(db, { start: T0, end: (T0 + 1) as Instant, volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['100001'] }, 'f', 1);
    recordRunEphemeris(db, run, e);
    expect(runEphemerides(db, run)).toEqual([{ objectId: '100001', ephemerisId: e.id, fileName: 'k1.oem', creationDate: T0 }]);
    db.sqlite.prepare('DELETE FROM runs WHERE id = ?').run(run);
    expect(runEphemerides(db, run)).toEqual([]);
    db.close();
  });

  it('refuses packed nodes that do not match their count', () => {
    const db = openDatabase(':memory:');
    const o = oem();
    const { id } = storeEphemeris(db, { objectId: '100001', fileName: 'k1.oem', sha256: 'c'.repeat(64), header: o.header, segments: o.segments });
    expect(() =>
      db.sqlite.prepare('UPDATE ephemeris_segments SET node_count = node_count + 1 WHERE ephemeris_id = ?').run(id),
    ).toThrow(/CHECK constraint failed/);
    db.close();
  });
});
