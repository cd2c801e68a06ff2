import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import {
  countObjects,
  getObject,
  latestElementSets,
  listImportFiles,
  openDatabase,
  rejectionsOfImport,
} from '../db/index.js';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const T0 = parseIso('2026-03-01T00:00:00Z')!;

function run(args: string[], env: Record<string, string> = {}): { code: number; stdout: string; stderr: string; ms: number } {
  const started = performance.now();
  const r = spawnSync(process.execPath, [join(ROOT, 'bin', 'keepclear.js'), ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, ...env },
    maxBuffer: 64 * 1024 * 1024,
  });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr, ms: performance.now() - started };
}

/** Object i of a synthetic catalogue: LEO-like, every field varied so no two sets coincide. */
function synthetic(i: number): ElementSet {
  return {
    objectId: String(i),
    name: `TESTSAT ${i}`,
    intlDesignator: '2025-001A',
    classification: 'U',
    epoch: instantFromMs(T0 + (i % 1000) * 60_000),
    meanMotionRevPerDay: 14 + (i % 200) / 100,
    eccentricity: ((i * 7) % 5000) / 1e6,
    inclinationDeg: (i * 0.37) % 180,
    raanDeg: (i * 1.13) % 360,
    argPerigeeDeg: (i * 2.71) % 360,
    meanAnomalyDeg: (i * 3.14) % 360,
    bstar: 1e-4,
    meanMotionDot: 1e-5,
    meanMotionDdot: 0,
    elementSetNo: 999,
    revAtEpoch: i % 100_000,
    ephemerisType: 0,
    source: { file: 'synthetic', line: 1, format: 'SYNTHETIC' },
  };
}

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-import-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const file = (name: string, text: string | Uint8Array): string => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};

describe('keepclear import', () => {
  it('imports a good TLE file, then finds it unchanged on re-import', () => {
    const db = join(dir, 'good.db');
    const tle = file('good.tle', formatTleFile([synthetic(1), synthetic(2), synthetic(25544)]));
    const first = run(['import', tle, '--db', db]);
    expect(first.stderr).toBe('');
    expect(first.code).toBe(0);
    expect(first.stdout).toContain(`${tle} (TLE): imported 3, updated 0, unchanged 0, rejected 0`);
    expect(first.stdout).toContain('total: imported 3, updated 0, unchanged 0, rejected 0 (1 file)');
    const again = run(['import', tle, '--db', db]);
    expect(again.code).toBe(0);
    expect(again.stdout).toContain('imported 0, updated 0, unchanged 3, rejected 0');
    const d = openDatabase(db);
    expect(latestElementSets(d).map((s) => s.objectId)).toEqual(['1', '2', '25544']);
    expect(getObject(d, '25544')?.name).toBe('TESTSAT 25544');
    expect(listImportFiles(d)).toHaveLength(2);
    d.close();
  });

  it('rejects one bad record, stores the good ones, exits 1', () => {
    const db = join(dir, 'bad-record.db');
    const lines = formatTleFile([synthetic(1), synthetic(2), synthetic(3)], false).split('\n');
    // line 3 is line 1 of the second set; change its last digit so the checksum no longer matches
    const l = lines[2]!;
    lines[2] = l.slice(0, -1) + String((Number(l.slice(-1)) + 1) % 10);
    const tle = file('one-bad.tle', lines.join('\n'));
    const r = run(['import', tle, '--db', db]);
    expect(r.code).toBe(1);
    expect(r.stdout).toContain('imported 2, updated 0, unchanged 0, rejected 1');
    const errLines = r.stderr.trim().split('\n');
    expect(errLines).toHaveLength(1);
    expect(errLines[0]).toMatch(new RegExp(`^keepclear: ${escape(tle)}:3: .*checksum`, 'i'));
    const d = openDatabase(db);
    expect(latestElementSets(d).map((s) => s.objectId)).toEqual(['1', '3']);
    const [logged] = listImportFiles(d);
    expect(rejectionsOfImport(d, logged!.id)).toEqual([{ line: 3, code: 'TLE_CHECKSUM', reason: expect.any(String) }]);
    d.close();
  });

  it('reports an unreadable path at line 1 and still imports the other files', () => {
    const db = join(dir, 'unreadable.db');
    const missing = join(dir, 'no-such-file.tle');
    const tle = file('after-missing.tle', formatTleFile([synthetic(5)]));
    const r = run(['import', missing, tle, '--db', db]);
    expect(r.code).toBe(1);
    expect(r.stderr).toBe(`keepclear: ${missing}:1: cannot read: no such file; check the path\n`);
    expect(r.stdout).toContain('total: imported 1, updated 0, unchanged 0, rejected 0 (2 files, 1 not imported)');
    const d = openDatabase(db);
    expect(countObjects(d)).toBe(1);
    expect(listImportFiles(d).map((f) => f.path)).toEqual([tle]);
    d.close();
  });

  it('refuses a binary file and changes nothing', () => {
    const db = join(dir, 'binary.db');
    const bytes = new Uint8Array(4096).map((_, i) => (i * 37) % 256);
    const bin = file('catalog.zip', bytes);
    const r = run(['import', bin, '--db', db]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(new RegExp(`^keepclear: ${escape(bin)}:\\d+: .*binary`));
    expect(r.stdout).toContain('(1 file, 1 not imported)');
    const d = openDatabase(db);
    expect(countObjects(d)).toBe(0);
    expect(listImportFiles(d)).toEqual([]);
    d.close();
  });

  // root reads any file, so the check only means something for an ordinary user
  it.skipIf(process.getuid?.() === 0)('refuses a file it has no permission to read', () => {
    const p = file('secret.tle', formatTleFile([synthetic(6)]));
    chmodSync(p, 0o000);
    const r = run(['import', p, '--db', join(dir, 'perm.db')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain(`${p}:1: cannot read: permission denied`);
  });

  it('sets the hard-body radius of every object in the files with --hbr-m', () => {
    const db = join(dir, 'hbr.db');
    const a = file('hbr-a.tle', formatTleFile([synthetic(11), synthetic(12)]));
    const other = file('hbr-other.tle', formatTleFile([synthetic(13)]));
    expect(run(['import', other, '--db', db]).code).toBe(0);
    const r = run(['import', a, '--db', db, '--hbr-m', '2.5']);
    expect(r.code).toBe(0);
    const d = openDatabase(db);
    expect(getObject(d, '11')?.hardBodyRadiusM).toBe(2.5);
    expect(getObject(d, '12')?.hardBodyRadiusM).toBe(2.5);
    expect(getObject(d, '13')?.hardBodyRadiusM).toBeNull();
    d.close();
  });

  it('uses KEEPCLEAR_DB when no --db is given', () => {
    const db = join(dir, 'env', 'from-env.db');
    const tle = file('env.tle', formatTleFile([synthetic(21)]));
    const r = run(['import', tle], { KEEPCLEAR_DB: db });
    expect(r.code).toBe(0);
    const d = openDatabase(db);
    expect(countObjects(d)).toBe(1);
    d.close();
  });

  it('routes a CDM to the CDM importer: a header-only message gets the CDM reader\'s own complaint', () => {
    // Neither "format not recognised" nor an element-set error: only the CDM reader knows that
    // a CDM's relative metadata/data must hold TCA and MISS_DISTANCE (CCSDS 508.0-B-1, mandatory keywords).
    const cdm = file(
      'msg.cdm',
      'CCSDS_CDM_VERS = 1.0\nCREATION_DATE = 2026-12-01T00:00:00.000\nORIGINATOR = TEST\nMESSAGE_ID = X1\n',
    );
    const r = run(['import', cdm, '--db', join(dir, 'cdm.db')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toBe(
      `keepclear: ${cdm}:1: relative metadata/data lacks mandatory keywords TCA, MISS_DISTANCE; add them as CCSDS 508.0-B-1 requires\n`,
    );
  });

  it.each([
    [['import'], /at least one FILE/],
    [['import', 'x.tle', '--hbr-m', '-3'], /--hbr-m must be a positive number/],
    [['import', 'x.tle', '--hbr-m', 'abc'], /--hbr-m must be a positive number/],
    [['import', 'x.tle', '--hbr-m'], /--hbr-m needs a value/],
    [['import', 'x.tle', '--bogus'], /unknown option --bogus/],
  ])('exits 2 on bad arguments %j without touching a database', (args, message) => {
    const db = join(dir, `never-${Math.random().toString(36).slice(2)}.db`);
    const r = run([...args, '--db', db]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(existsSync(db)).toBe(false);
  });

  it('imports 100,000 objects in one file', () => {
    const N = 100_000; // catalogue numbers 1..100000; 100000 is written in Alpha-5 as "A0000"
    const sets = Array.from({ length: N }, (_, i) => synthetic(i + 1));
    const tle = file('big.tle', formatTleFile(sets));
    const db = join(dir, 'big.db');
    const r = run(['import', tle, '--db', db]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain(`imported ${N}, updated 0, unchanged 0, rejected 0`);
    const d = openDatabase(db);
    expect(countObjects(d)).toBe(N);
    expect(getObject(d, '100000')?.name).toBe('TESTSAT 100000');
    d.close();
    const again = run(['import', tle, '--db', db]);
    expect(again.stdout).toContain(`imported 0, updated 0, unchanged ${N}, rejected 0`);
    // Measured, not asserted: the whole command including Node start-up and TypeScript loading.
    console.log(
      `import of ${N} objects: ${(r.ms / 1000).toFixed(2)} s wall (${Math.round(N / (r.ms / 1000))} sets/s); ` +
        `re-import (all unchanged): ${(again.ms / 1000).toFixed(2)} s`,
    );
  });
});

function escape(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
