/**
 * Oversized input (issue 11 item 8): a 1 GB file is refused from its size, before it is read
 * (app/import/readInput.ts MAX_INPUT_BYTES, 256 MiB, with its reason); a 10 MB record in any
 * format is rejected unread (core/formats/result.ts MAX_RECORD_CHARS, 64 KiB) while the file's
 * other records import, and no message echoes the 10 MB. Never a crash, never an internal error.
 * The big files are made here (sparse or generated) and deleted afterwards; none is in the repo.
 */
import { closeSync, ftruncateSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { formatOmmCsv, formatOmmJson, formatOmmKvn, formatOmmXml } from '../core/formats/omm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { MAX_INPUT_BYTES } from '../app/import/index.js';
import { countObjects, listImportFiles, openDatabase } from '../db/index.js';
import { ROOT, runKeepclear, type Run } from './support/cli.js';

const TEN_MB = 10 * 1024 * 1024;
/** A rejection line quotes at most a short piece of a value; whole lines stay far below this. */
const LONGEST_MESSAGE_CHARS = 500;

let dir: string;
let sets: ElementSet[];
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-robust-input-'));
  sets = buildDemoScenario({ catalogSize: 100 }).catalog.slice(0, 3);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const keepclear = (args: string[]): Run => runKeepclear(args, dir);
const path = (name: string): string => join(dir, name);

function expectCleanFailure(r: Run): void {
  expect(r.code).toBe(1);
  expect(r.stderr).not.toMatch(/internal error|^\s+at /m);
  for (const line of r.stderr.trim().split('\n')) {
    expect(line.length).toBeLessThan(LONGEST_MESSAGE_CHARS);
    expect(line).toMatch(/^keepclear: /);
  }
}

describe('a 1 GB input file', () => {
  it('is refused from its size with the limit and what to do; the other files still import', () => {
    const big = path('huge.tle');
    const fd = openSync(big, 'w');
    ftruncateSync(fd, 1024 ** 3); // sparse: 1 GiB long, no disk used
    closeSync(fd);
    const good = path('after-huge.tle');
    writeFileSync(good, formatTleFile(sets));
    const db = path('huge.db');
    const r = keepclear(['import', big, good, '--db', db]);
    expectCleanFailure(r);
    expect(r.stderr).toBe(
      `keepclear: ${big}:1: the file is 1024 MiB, above the ${MAX_INPUT_BYTES / 1024 ** 2} MiB limit for one input file ` +
        `(files are read whole into memory; ${MAX_INPUT_BYTES / 1024 ** 2} MiB holds about 170,000 objects as OMM XML); ` +
        'split it into smaller files (for example by object) and import them together\n',
    );
    expect(r.stdout).toContain('total: imported 3, updated 0, unchanged 0, rejected 0 (2 files, 1 not imported)');
  });

  it('a device that never ends (/dev/zero) is read only up to the limit, then refused', () => {
    const r = keepclear(['import', '/dev/zero', '--db', path('zero.db')]);
    expectCleanFailure(r);
    expect(r.stderr).toMatch(/^keepclear: \/dev\/zero:1: the file is more than 256 MiB, above the 256 MiB limit for one input file/);
  });
});

describe('a 10 MB record', () => {
  const huge = 'X'.repeat(TEN_MB);
  // [format, file text, line of the rejection (0: not checked), reason, records imported]
  const cases: [string, () => string, number, RegExp, number][] = [
    ['TLE line', () => { const l = formatTleFile(sets).split('\n'); l.splice(3, 0, `1 ${huge}`); return l.join('\n'); }, 4, /TLE line 1 is not followed by a line 2/, 3],
    ['OMM KVN line', () => { const l = formatOmmKvn(sets).split('\n'); l.splice(8, 0, `OBJECT_NAME = ${huge}`); return l.join('\n'); }, 9, /this line is 10,485,774 characters long, more than the 65,536/, 2],
    ['OMM CSV row', () => { const l = formatOmmCsv(sets).split('\n'); l[2] = l[2]!.replace(',', `,${huge}`); return l.join('\n'); }, 3, /this row is 10,48\d,\d{3} characters long/, 2],
    ['OMM JSON object', () => { const a = JSON.parse(formatOmmJson(sets)) as Record<string, unknown>[]; a[1]!['OBJECT_NAME'] = huge; return JSON.stringify(a, null, 1); }, 0, /the object starting here is 10,48\d,\d{3} characters long/, 2],
    ['OMM XML element', () => formatOmmXml(sets).replace('<OBJECT_NAME>', `<OBJECT_NAME>${huge}`), 0, /this <omm> element is 10,48\d,\d{3} characters long/, 2],
  ];

  it.each(cases)('in a %s is rejected; the other records import', (name, make, line, reason, imported) => {
    const file = path(`big-record-${name.replace(/\W+/g, '-')}`);
    writeFileSync(file, make());
    const db = path(`big-record-${name.replace(/\W+/g, '-')}.db`);
    const r = keepclear(['import', file, '--db', db]);
    expectCleanFailure(r);
    const [err, ...more] = r.stderr.trim().split('\n');
    expect(more).toEqual([]);
    expect(err).toMatch(reason);
    if (line > 0) expect(err).toMatch(new RegExp(`^keepclear: [^:]+:${line}: `));
    expect(r.stdout).toContain(`imported ${imported}, updated 0, unchanged 0, rejected 1`);
    const d = openDatabase(db);
    try {
      expect(countObjects(d)).toBe(imported);
    } finally {
      d.close();
    }
  });

  it('in a CDM (one message per file) refuses the file, changing nothing', () => {
    const text = `${readFileSync(join(ROOT, 'test/fixtures/cdm/valid-6x6.kvn'), 'utf8')}COMMENT ${huge}\n`;
    const file = path('big.cdm');
    writeFileSync(file, text);
    const db = path('big-cdm.db');
    const r = keepclear(['import', file, '--db', db]);
    expectCleanFailure(r);
    expect(r.stderr).toMatch(new RegExp(`^keepclear: ${file.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:1: the file is 10,48\\d,\\d{3} bytes long; a CDM is a few kilobytes`));
    const d = openDatabase(db);
    try {
      expect(listImportFiles(d)).toEqual([]);
    } finally {
      d.close();
    }
  });
});
