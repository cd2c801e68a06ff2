/**
 * `keepclear import FILE.oem` then `keepclear screen --primary ID` as a user runs them
 * (DESIGN.md "Owner ephemerides"): the run says it used the ephemeris ("ephemeris: FILE (OEM,
 * created …)") on stderr and in its JSON; a window the ephemeris covers only in part exits 1
 * with `keepclear: FILE:1: …` naming the gap. Invented demo objects (Alpha-5 fleet A0001…).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatOemKvn, sampleOem } from '../core/formats/oem/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { toIso, type Instant } from '../core/time/instant.js';
import { runKeepclear } from './support/cli.js';

const HOUR = 3_600_000;
let dir: string;
let db: string;
let oemPath: string;
let start: Instant;
let primary: string;
const keepclear = (args: string[]) => runKeepclear(args, dir);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-oem-'));
  db = join(dir, 'k.db');
  const sc = buildDemoScenario({ catalogSize: 50 });
  start = sc.start;
  const set = sc.fleet[0]!;
  primary = set.objectId;
  const catalog = join(dir, 'catalog.tle');
  writeFileSync(catalog, formatTleFile([...sc.fleet, ...sc.catalog]));
  const oem = sampleOem(
    [{ trajectory: new Sgp4Trajectory(set), start: (start - 2 * HOUR) as Instant, end: (start + 26 * HOUR) as Instant, stepS: 60 }],
    { objectName: 'FLEET 1', objectId: 'A0001', originator: 'DEMO OPERATOR', creationDate: start },
  );
  oemPath = join(dir, 'fleet1.oem');
  writeFileSync(oemPath, formatOemKvn(oem));
  const imp = keepclear(['import', catalog, oemPath, '--db', db]);
  expect(imp.code, imp.stderr).toBe(0);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('screen --primary with an imported OEM', () => {
  it('screens from the ephemeris and says so on stderr and in the run JSON', () => {
    const r = keepclear(['screen', '--primary', 'A0001', '--start', toIso(start), '--days', '1', '--db', db, '--json', '-', '--workers', '0']);
    expect(r.code, r.stderr).toBe(0);
    const said = `ephemeris: ${oemPath} (OEM, created ${toIso(start)})`;
    expect(r.stderr).toContain(`primary ${primary}: ${said}`);
    const doc = JSON.parse(r.stdout) as { run: { primarySources: Record<string, string>; ephemerides: { primary: string; file: string }[] } };
    expect(doc.run.primarySources[primary]).toBe(said);
    expect(doc.run.ephemerides).toEqual([{ primary, file: oemPath, creationDate: toIso(start) }]);
  });

  it('a window past the ephemeris exits 1 naming the file and the gap', () => {
    const r = keepclear(['screen', '--primary', 'A0001', '--start', toIso(start), '--days', '2', '--db', db, '--workers', '0']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(
      new RegExp(`^keepclear: ${oemPath.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}:1: ephemeris does not cover ${toIso((start + 26 * HOUR) as Instant)} to `, 'm'),
    );
    expect(r.stderr).toMatch(/an ephemeris is not extrapolated/);
  });
});

describe('events of a run screened from an OEM', () => {
  it('names the ephemeris in the terminal', () => {
    const r = keepclear(['events', '--db', db]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain(`primary ${primary}: ephemeris: ${oemPath} (OEM, created ${toIso(start)})`);
  });
});

describe('exporting an event of that run as a CDM', () => {
  it('names the ephemeris as the primary\'s EPHEMERIS_NAME (508.0-B-1 metadata)', () => {
    const out = join(dir, 'oem-event.cdm');
    const r = keepclear(['export', '--event', 'R1-1', '--format', 'cdm', '--out', out, '--db', db]);
    expect(r.code, r.stderr).toBe(0);
    const text = readFileSync(out, 'utf8');
    const names = [...text.matchAll(/^EPHEMERIS_NAME\s*=\s*(.*)$/gm)].map((m) => m[1]!.trim());
    expect(names).toEqual(['fleet1.oem', 'NONE']);
    expect(text).toMatch(/state at TCA from the owner ephemeris .*fleet1\.oem \(OEM, interpolated\)/);
  });
});
