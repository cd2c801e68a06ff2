/**
 * The file-import service (app/import): outcomes per file for the CLI, `serve` and the desktop
 * app to present; nothing written to the terminal; one file = one transaction, also when the
 * disk fills up in the middle (provoked with SQLite's max_page_count, which makes the next page
 * allocation fail with SQLITE_FULL exactly as a full disk does).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, afterEach, describe, expect, it, vi } from 'vitest';
import { importFile, importFiles } from '../app/import/index.js';
import type { ElementSet } from '../core/elements/elementSet.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import { countObjects, eventsOfRun, listImportFiles, listRuns, openDatabase } from '../db/index.js';

const T0 = parseIso('2026-03-01T00:00:00Z')!;
const synthetic = (i: number): ElementSet => ({
  objectId: String(i), name: `SAT ${i}`, intlDesignator: null, classification: 'U', epoch: instantFromMs(T0),
  meanMotionRevPerDay: 15, eccentricity: 0.001, inclinationDeg: 51.6, raanDeg: i % 360, argPerigeeDeg: 0, meanAnomalyDeg: i % 360,
  bstar: 1e-4, meanMotionDot: 0, meanMotionDdot: 0, elementSetNo: 1, revAtEpoch: 1, ephemerisType: 0,
  source: { file: 's', line: 1, format: 'SYNTHETIC' },
});

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-app-import-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));
afterEach(() => vi.restoreAllMocks());

const write = (name: string, text: string): string => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};

describe('importFiles', () => {
  it('returns an outcome per file and writes nothing to the terminal', () => {
    const out = vi.spyOn(process.stdout, 'write');
    const err = vi.spyOn(process.stderr, 'write');
    const good = write('good.tle', formatTleFile([synthetic(1), synthetic(2)]));
    const lines = formatTleFile([synthetic(3), synthetic(4)], false).split('\n');
    lines[0] = `${lines[0]!.slice(0, -1)}${(Number(lines[0]!.slice(-1)) + 1) % 10}`; // checksum broken
    const oneBad = write('one-bad.tle', lines.join('\n'));
    const missing = join(dir, 'missing.tle');
    const cdm = 'test/authorities/ccsds-508/cdm-obligatory.kvn'; // its OBJECT1 covariance is not PSD: a note
    const db = openDatabase(':memory:');
    const seen: string[] = [];
    const s = importFiles(db, { files: [good, oneBad, missing, cdm], onFile: (o) => seen.push(o.file) });
    expect(seen).toEqual([good, oneBad, missing, cdm]);
    const [a, b, c, d] = s.outcomes;
    expect(a).toMatchObject({ ok: true, file: good, format: 'TLE', counts: { imported: 2, rejected: 0 }, notes: [] });
    expect(b).toMatchObject({ ok: true, counts: { imported: 1, rejected: 1 }, rejections: [{ code: 'TLE_CHECKSUM', line: 1 }] });
    expect(c).toMatchObject({ ok: false, file: missing, format: null });
    expect(!c!.ok && c!.error.toLine()).toBe(`${missing}:1: cannot read: no such file; check the path`);
    expect(d).toMatchObject({ ok: true, format: 'CDM-KVN', counts: { imported: 1 } });
    expect(d!.ok && d!.notes.join(' ')).toMatch(/OBJECT1 6×6 covariance is not positive semi-definite/);
    expect(s.total).toEqual({ imported: 4, updated: 0, unchanged: 0, rejected: 1 });
    expect([s.notImported, s.clean]).toEqual([1, false]);
    expect(out).not.toHaveBeenCalled();
    expect(err).not.toHaveBeenCalled();
    db.close();
  });

  it('a CDM naming its objects in Alpha-5 ("A0001") lands on the catalogue numbers (100001)', () => {
    const text = readFileSync('test/fixtures/cdm/valid-6x6.kvn', 'utf8')
      .replace(/^(OBJECT_DESIGNATOR\s*=\s*)12345$/m, '$1A0001')
      .replace(/^(OBJECT_DESIGNATOR\s*=\s*)30337$/m, '$1z9999');
    expect(text).toMatch(/= A0001$/m);
    const db = openDatabase(':memory:');
    const o = importFile(db, write('alpha5.kvn', text));
    expect(o.ok, !o.ok ? o.error.message : '').toBe(true);
    const [run] = listRuns(db, 10, ['cdm']);
    const [e] = eventsOfRun(db, run!.id);
    // common practice: A = 10 (A0001 = 100001); Z = 33 (Z9999 = 339999, the largest Alpha-5 number)
    expect([e!.primary, e!.secondary]).toEqual(['100001', '339999']);
    db.close();
  });
});

describe('a full disk in the middle of a file (SQLITE_FULL)', () => {
  it('stores nothing of that file, says so clearly, skips the rest, and the database stays usable', () => {
    const path = join(dir, 'full.db');
    const db = openDatabase(path);
    const first = write('fits.tle', formatTleFile([synthetic(1)]));
    expect(importFile(db, first).ok).toBe(true);
    const pages = db.sqlite.pragma('page_count', { simple: true }) as number;
    db.sqlite.pragma(`max_page_count = ${pages + 10}`); // room for ~40 kB more: far less than the file
    const big = write('too-big.tle', formatTleFile(Array.from({ length: 5000 }, (_, k) => synthetic(k + 10))));
    const after = write('after.tle', formatTleFile([synthetic(9)]));
    const s = importFiles(db, { files: [big, after] });
    const [full, skipped] = s.outcomes;
    expect(full!.ok).toBe(false);
    if (full!.ok) return;
    expect(full!.error.code).toBe('DATABASE_FULL');
    expect(full!.error.toLine()).toBe(
      `${big}:1: not stored, nothing of this file was kept: the disk holding the database is full (or the database ` +
        'reached its size limit); nothing of the interrupted write was kept; free some space and run the command again',
    );
    expect(skipped).toMatchObject({ ok: false, file: after });
    expect(!skipped!.ok && skipped!.error.message).toMatch(/not tried: the database could not be written/);
    expect(db.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
    expect(countObjects(db)).toBe(1);
    expect(listImportFiles(db).map((f) => f.path)).toEqual([first]);
    // space again: the same file imports whole
    db.sqlite.pragma('max_page_count = 1073741823');
    expect(importFile(db, big)).toMatchObject({ ok: true, counts: { imported: 5000 } });
    db.close();
  });
});
