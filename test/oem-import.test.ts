/**
 * OEM import (issue 7 item 2; DESIGN.md "Owner ephemerides"): files route by content to the OEM
 * importer (KVN and XML), OBJECT_ID is matched to a catalogue object — catalogue number (Alpha-5
 * decoded by core/elements/objectId.ts) or international designator, an ambiguous designator is
 * an error naming the objects — and the stored ephemeris interpolates exactly as the file does.
 *
 * Sources: the OEM files are written by Keepclear's writer from SGP4 (invented objects); the
 * expected states come from reading the same file with the OEM reader (parseOemFile), so the
 * check is that storage loses nothing (bit-for-bit equal), not a numeric claim. Alpha-5 decoding:
 * common practice (A = 10, I and O skipped), as objectId.ts documents.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importFile } from '../app/import/index.js';
import type { ElementSet } from '../core/elements/elementSet.js';
import { formatOemKvn, parseOemFile, sampleOem } from '../core/formats/oem/index.js';
import { EphemerisTrajectory } from '../core/propagation/ephemeris.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { instantFromMs, parseIso, type Instant } from '../core/time/instant.js';
import {
  getObject, listEphemerides, listImportFiles, loadEphemeris, openDatabase, storeElementSets, type KeepclearDb,
} from '../db/index.js';
import { elementSet } from './support/elements.js';

const T0 = parseIso('2026-12-07T00:00:00Z')!;
const HOUR = 3_600_000;
let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-oem-import-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const orbit = { aKm: 6928, e: 0.001, iDeg: 97.6, raanDeg: 10, argpDeg: 30, uDeg: 0 };
const set = (id: string, designator: string | null, name: string): ElementSet => ({
  ...elementSet(id, T0, orbit), name, intlDesignator: designator,
});

function catalogue(sets: ElementSet[]): KeepclearDb {
  const db = openDatabase(':memory:');
  storeElementSets(db, { path: 'cat.tle', sha256: 'c'.repeat(64), format: 'TLE' }, sets, []);
  return db;
}

/** An OEM of `id`'s SGP4 orbit over [T0, T0 + hours], written by Keepclear's writer. */
function oemFile(name: string, objectIdText: string, hours = 6, created = T0): string {
  const traj = new Sgp4Trajectory(set('100001', null, 'X'));
  const oem = sampleOem([{ trajectory: traj, start: T0, end: (T0 + hours * HOUR) as Instant, stepS: 60 }], {
    objectName: 'KEEPCLEAR-1', objectId: objectIdText, originator: 'TARNWELL ORBITAL', creationDate: created,
  });
  const path = join(dir, name);
  writeFileSync(path, formatOemKvn(oem));
  return path;
}

describe('routing', () => {
  it('an OEM in KVN is imported as an ephemeris, not refused, and its import is logged', () => {
    const db = catalogue([set('100001', '2026-901A', 'KEEPCLEAR-1')]);
    const file = oemFile('a.oem', 'A0001');
    const o = importFile(db, file);
    expect(o.ok, o.ok ? '' : o.error.message).toBe(true);
    expect(o).toMatchObject({ format: 'OEM-KVN', counts: { imported: 1, unchanged: 0, rejected: 0 } });
    const [e] = listEphemerides(db, '100001');
    expect(e).toMatchObject({ objectId: '100001', objectRef: 'A0001', fileName: file, originator: 'TARNWELL ORBITAL', segmentCount: 1 });
    expect(e!.creationDate).toBe(T0);
    expect([e!.usableStart, e!.usableStop]).toEqual([T0, T0 + 6 * HOUR]);
    expect(listImportFiles(db)[0]).toMatchObject({ path: file, format: 'OEM-KVN', imported: 1 });
    // the same file again is the same ephemeris
    expect(importFile(db, file)).toMatchObject({ ok: true, counts: { imported: 0, unchanged: 1 } });
    expect(listEphemerides(db, '100001')).toHaveLength(1);
    db.close();
  });

  it('the stored ephemeris interpolates bit for bit as the file does', () => {
    const db = catalogue([set('100001', null, 'KEEPCLEAR-1')]);
    const file = oemFile('b.oem', '100001');
    expect(importFile(db, file).ok).toBe(true);
    const stored = new EphemerisTrajectory(loadEphemeris(db, listEphemerides(db, '100001')[0]!.id)!, '100001');
    const direct = new EphemerisTrajectory(parseOemFile(readFileSync(file), file).oem!, '100001');
    const a = new Float64Array(6), b = new Float64Array(6);
    for (let k = 0; k <= 100; k++) {
      const t = instantFromMs(T0 + k * 0.06 * HOUR + 1234.5);
      expect(stored.stateInto(t, a, 0)).toBe(direct.stateInto(t, b, 0));
      expect([...a]).toEqual([...b]);
    }
    expect(stored.stateInto(instantFromMs(T0 + 7 * HOUR), a, 0)).toBe('outside-ephemeris');
    db.close();
  });

  it('an OEM in XML routes too (the malformed-corpus file: its first segment refused, the second kept)', () => {
    const db = catalogue([set('100002', '2026-100A', 'TARNWELL-2')]);
    const o = importFile(db, 'test/fixtures/oem/xml-syntax.oem.xml');
    expect(o.ok, o.ok ? '' : o.error.message).toBe(true);
    expect(o).toMatchObject({ format: 'OEM-XML', counts: { imported: 1 } });
    expect(o.ok && o.rejections.map((r) => r.code)).toContain('XML_SYNTAX');
    expect(listEphemerides(db, '100002')[0]!.segmentCount).toBe(1);
    db.close();
  });

  it('--hbr-m sets the radius of the object the OEM names', () => {
    const db = catalogue([set('100001', null, 'KEEPCLEAR-1')]);
    expect(importFile(db, oemFile('c.oem', '100001'), 1.5).ok).toBe(true);
    expect(getObject(db, '100001')!.hardBodyRadiusM).toBe(1.5);
    db.close();
  });
});

describe('OBJECT_ID matching', () => {
  it.each([
    ['100001', '100001'],
    ['A0001', '100001'],
    ['a0001', '100001'],
    ['0100001', '100001'],
    ['2026-901A', '100001'],
  ])('OBJECT_ID %s is catalogue object %s', (text, id) => {
    const db = catalogue([set('100001', '2026-901A', 'KEEPCLEAR-1'), set('100002', '2026-901B', 'KEEPCLEAR-2')]);
    const o = importFile(db, oemFile(`m-${text}.oem`, text));
    expect(o.ok, o.ok ? '' : o.error.message).toBe(true);
    expect(listEphemerides(db, id)).toHaveLength(1);
    db.close();
  });

  it('a designator carried by two catalogue objects is an error naming both; nothing is stored', () => {
    const db = catalogue([set('100001', '2026-901A', 'KEEPCLEAR-1'), set('110007', '2026-901A', 'DEBRIS B0007')]);
    const file = oemFile('ambiguous.oem', '2026-901A');
    const o = importFile(db, file);
    expect(o.ok).toBe(false);
    const msg = !o.ok ? o.error.toLine() : '';
    expect(msg).toMatch(/OBJECT_ID = 2026-901A is the international designator of 2 catalogue objects: 100001 \(KEEPCLEAR-1\), 110007 \(DEBRIS B0007\)/);
    expect(msg).toMatch(new RegExp(`^${file.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}:\\d+: `));
    expect(listEphemerides(db, '100001')).toEqual([]);
    expect(listImportFiles(db).filter((f) => f.format.startsWith('OEM'))).toEqual([]);
    db.close();
  });

  it('a designator of no catalogue object, and an OBJECT_ID that is neither, are errors saying what to do', () => {
    const db = catalogue([set('100001', '2026-901A', 'KEEPCLEAR-1')]);
    const a = importFile(db, oemFile('unknown.oem', '2026-555C'));
    expect(!a.ok && a.error.message).toMatch(/OBJECT_ID = 2026-555C matches no catalogue object: import the object's element set/);
    const b = importFile(db, oemFile('odd.oem', 'MY SAT'));
    expect(!b.ok && b.error.message).toMatch(/OBJECT_ID = MY SAT is neither a catalogue number/);
    db.close();
  });

  it('a catalogue number not in the catalogue yet is kept for that number, with a note', () => {
    const db = catalogue([]);
    const o = importFile(db, oemFile('new.oem', 'A0003'));
    expect(o.ok).toBe(true);
    expect(o.ok && o.notes.join(' ')).toMatch(/catalogue object 100003 has no element set stored yet/);
    expect(listEphemerides(db, '100003')).toHaveLength(1);
    db.close();
  });
});
