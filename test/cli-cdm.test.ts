/**
 * Received CDMs through the CLI (DESIGN.md: "An event imported from a CDM appears in `events`
 * like any other, with `primary` and `secondary` taken from the message's OBJECT1 and OBJECT2
 * designators and `pc` computed by Keepclear"; README: exit 1 on bad input, errors as
 * `keepclear: FILE:LINE: what is wrong`, a file that cannot be read changes nothing).
 *
 * The CCSDS 508.0-B-1 example messages (test/authorities/ccsds-508, see its README) carry an
 * OBJECT1 6×6 covariance that is not positive semi-definite (T–RDOT correlation −1.44). The
 * importer keeps such messages flagged (app/import/cdm.ts: "Pc falls back to maximum Pc"), and
 * DESIGN.md asks for maximum Pc when a covariance is doubtful. test/fixtures/cdm/valid-6x6.kvn
 * has the same layout with PSD covariances, so its Pc is the 2-D reference integral.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listImportFiles, openDatabase } from '../db/index.js';
import { ROOT, runKeepclear, type EventJson, type Run } from './support/cli.js';

const AUTH = 'test/authorities/ccsds-508';
const KVN = `${AUTH}/cdm-obligatory.kvn`;
const XML = `${AUTH}/cdm-example.xml`;
const VALID = 'test/fixtures/cdm/valid-6x6.kvn';
/** A copy of test/fixtures/cdm/missing-tca.kvn: valid-6x6.kvn without its TCA line (line 6). */
const MISSING_TCA = 'test/fixtures/cli/cdm-missing-tca.kvn';
const XML_BROKEN = 'test/fixtures/cdm/xml-syntax-error.xml';

/** All three messages: TCA = 2010-03-13T22:37:52.618 (UTC, CCSDS writes no zone). */
const MESSAGE_TCA = '2010-03-13T22:37:52.618Z';
/** MISS_DISTANCE = 715 [m], written to the metre; the states give the miss to about a mm. */
const MESSAGE_MISS_KM = 0.715;
const MISS_ROUNDING_KM = 0.001;

const keepclear = (args: string[]): Run => runKeepclear(args, dir);

function events(db: string): EventJson[] {
  const r = keepclear(['events', '--db', db, '--json', '-']);
  expect(r.code, r.stderr).toBe(0);
  return (JSON.parse(r.stdout) as { events: EventJson[] }).events;
}

/** Row count of every table: "changes nothing" means all of them stay as they were. */
function tableCounts(db: string): Record<string, number> {
  const d = openDatabase(db);
  try {
    const names = d.sqlite
      .prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name")
      .pluck()
      .all() as string[];
    return Object.fromEntries(names.map((n) => [n, d.sqlite.prepare(`SELECT COUNT(*) FROM "${n}"`).pluck().get() as number]));
  } finally {
    d.close();
  }
}
function importFiles(db: string): string[] {
  const d = openDatabase(db);
  try {
    return listImportFiles(d).map((f) => `${f.path} ${f.sha256}`);
  } finally {
    d.close();
  }
}

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-cdm-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe.each([
  ['KVN (obligatory keywords)', KVN, null],
  ['XML', XML, 4.835e-5],
])('the CCSDS 508.0-B-1 example, %s', (_name, file, reportedPc) => {
  let db: string;
  let first: Run;
  let stored: EventJson[];
  beforeAll(() => {
    db = join(dir, `${file.endsWith('.xml') ? 'xml' : 'kvn'}.db`);
    first = keepclear(['import', file, '--db', db]);
    stored = events(db);
  });

  it('imports with exit 0 and notes the flagged covariance on stderr', () => {
    // importMessageFile: a CDM kept with a flagged covariance is imported, no record rejected
    expect(first.code, first.stderr).toBe(0);
    expect(first.stdout).toMatch(/imported 1, updated 0, unchanged 0, rejected 0/);
    expect(first.stderr).toMatch(/^keepclear: .*OBJECT1 6×6 covariance is not positive semi-definite/m);
  });

  it('shows one event: OBJECT1/OBJECT2 designators, the message TCA, miss and speed', () => {
    const [e, ...more] = stored;
    expect(more).toEqual([]);
    expect(e!.primary).toBe('12345');
    expect(e!.secondary).toBe('30337');
    expect(e!.tca).toBe(MESSAGE_TCA);
    expect(Math.abs(e!.missKm - MESSAGE_MISS_KM)).toBeLessThanOrEqual(MISS_ROUNDING_KM);
    expect(Math.hypot(...e!.rtnKm)).toBeCloseTo(e!.missKm, 9);
    expect(e!.relativeSpeedKmS).toBeGreaterThan(14);
    expect(e!.relativeSpeedKmS).toBeLessThan(15.5);
  });

  it("keeps the message's reported Pc apart from Keepclear's own", () => {
    const [e] = stored;
    expect(e!.extra!.reportedPc ?? null).toBe(reportedPc);
    expect(typeof e!.pc).toBe('number');
    expect(e!.covarianceSource).toMatch(/^cdm/);
  });

  it('uses maximum Pc, since OBJECT1 covariance is not PSD', () => {
    const [e] = stored;
    expect(typeof e!.pc).toBe('number');
    expect(e!.pcMethod).toMatch(/max-pc/);
  });

  it('says once, not twice, that the covariance is not PSD', () => {
    const [e] = stored;
    expect(e!.warnings.filter((w) => /not positive semi-definite/.test(w))).toHaveLength(1);
    expect(first.stderr.split('\n').filter((l) => /not positive semi-definite/.test(l))).toHaveLength(1);
  });

  it('re-importing the same file creates no second event', () => {
    const again = keepclear(['import', file, '--db', db]);
    expect(again.code, again.stderr).toBe(0);
    expect(again.stdout).toMatch(/imported 0, updated 0, unchanged 1, rejected 0/);
    const after = events(db);
    expect(after).toHaveLength(1);
    expect(after.map((e) => e.id)).toEqual(stored.map((e) => e.id));
  });
});

describe('a CDM with PSD covariances (test/fixtures/cdm/valid-6x6.kvn)', () => {
  it('gets the 2-D reference Pc from the message covariance', () => {
    const db = join(dir, 'valid.db');
    const r = keepclear(['import', VALID, '--db', db]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stderr).toBe('');
    const [e, ...more] = events(db);
    expect(more).toEqual([]);
    expect([e!.primary, e!.secondary, e!.tca]).toEqual(['12345', '30337', MESSAGE_TCA]);
    expect(e!.pcMethod).toBe('2d-reference');
    expect(e!.covarianceSource).toMatch(/^cdm/);
    expect(typeof e!.pc).toBe('number');
    expect(e!.pc!).toBeGreaterThan(0);
    expect(e!.pc!).toBeLessThan(1);
    expect(e!.extra!.reportedPc).toBe(4.835e-5);
    // RELATIVE_SPEED = 14762 [m/s], to the m/s
    expect(Math.abs(e!.relativeSpeedKmS - 14.762)).toBeLessThanOrEqual(0.001);
  });

  it('designators with leading zeros become canonical ids', () => {
    const text = readFileSync(join(ROOT, VALID), 'utf8')
      .replace(/^(OBJECT_DESIGNATOR\s*=\s*)12345$/m, '$100345')
      .replace(/^(OBJECT_DESIGNATOR\s*=\s*)30337$/m, '$100761');
    expect(text).toMatch(/= 00345$/m);
    expect(text).toMatch(/= 00761$/m);
    const file = join(dir, 'leading-zeros.kvn');
    writeFileSync(file, text);
    const db = join(dir, 'zeros.db');
    const r = keepclear(['import', file, '--db', db]);
    expect(r.code, r.stderr).toBe(0);
    const [e] = events(db);
    expect([e!.primary, e!.secondary]).toEqual(['345', '761']);
  });
});

describe('malformed CDMs exit 1 and change nothing', () => {
  let db: string;
  let eventsBefore: EventJson[];
  beforeAll(() => {
    db = join(dir, 'malformed.db');
    const r = keepclear(['import', VALID, '--db', db]);
    expect(r.code, r.stderr).toBe(0);
    eventsBefore = events(db);
    expect(eventsBefore).toHaveLength(1);
  });

  it.each([
    [MISSING_TCA, 6, /relative metadata\/data lacks mandatory keyword TCA/],
    [XML_BROKEN, 16, /MISS_DISTANC/],
  ])('%s', (file, line, reason) => {
    const countsBefore = tableCounts(db);
    const filesBefore = importFiles(db);
    const r = keepclear(['import', file, '--db', db]);
    expect(r.code).toBe(1);
    const [errLine, ...rest] = r.stderr.trim().split('\n');
    expect(rest).toEqual([]);
    expect(errLine).toMatch(new RegExp(`^keepclear: ${file.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:${line}: `));
    expect(errLine).toMatch(reason);
    expect(r.stdout).toMatch(/1 not imported/);
    expect(tableCounts(db)).toEqual(countsBefore);
    expect(importFiles(db)).toEqual(filesBefore);
    expect(events(db)).toEqual(eventsBefore);
  });
});
