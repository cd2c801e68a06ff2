/**
 * `keepclear export (--event ID | --run ID) --format cdm|csv|json --out FILE [--db FILE]`
 * (DESIGN.md CLI contract) as a user runs it: files appear, bad arguments exit 2, unknown ids 1.
 */
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { parseCdmFile } from '../core/formats/cdm/index.js';
import { runKeepclear } from './support/cli.js';
import { reportFixture } from './support/reportFixture.js';

let dir: string;
let dbPath: string;
let runId: string;
const keepclear = (args: string[]) => runKeepclear(args, dir);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-export-'));
  dbPath = join(dir, 'export.db');
  const fx = reportFixture(5, dbPath);
  runId = fx.runId;
  fx.db.close();
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('keepclear export', () => {
  it('writes one CDM per event of a run into a folder', () => {
    const out = join(dir, 'messages');
    const r = keepclear(['export', '--run', runId, '--format', 'cdm', '--out', out, '--db', dbPath]);
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(out).sort()).toEqual([1, 2, 3, 4, 5].map((k) => `${runId}-${k}.cdm`));
    const f = join(out, `${runId}-1.cdm`);
    expect(parseCdmFile(readFileSync(f), f).errors).toEqual([]);
    expect(r.stderr).toMatch(/^export: 5 event\(s\) of run R\d+ as CDM: 5 file\(s\) in /m);
  });

  it('writes CSV (caution on stderr) and JSON (caution inside)', () => {
    const csv = join(dir, 'week.csv');
    const a = keepclear(['export', '--run', runId, '--format', 'csv', '--out', csv, '--db', dbPath]);
    expect(a.code, a.stderr).toBe(0);
    expect(readFileSync(csv, 'utf8').split('\r\n')[0]).toMatch(/^id,runId,seriesId,primary,secondary,tca,missKm/);
    expect(a.stderr).toContain(DECISION_AID_NOTE);
    const json = join(dir, 'one.json');
    const b = keepclear(['export', '--event', `${runId}-1`, '--format', 'JSON', '--out', json, '--db', dbPath]);
    expect(b.code, b.stderr).toBe(0);
    expect((JSON.parse(readFileSync(json, 'utf8')) as { caution: string }).caution).toBe(DECISION_AID_NOTE);
  });

  it.each([
    [['--format', 'csv', '--out', 'x.csv'], /exactly one of --event ID, --run ID or --series ID/],
    [['--run', 'R1', '--event', 'R1-1', '--format', 'csv', '--out', 'x.csv'], /exactly one of --event ID, --run ID or --series ID/],
    [['--run', 'R1', '--out', 'x.csv'], /give --format cdm, csv or json/],
    [['--run', 'R1', '--format', 'xls', '--out', 'x.xls'], /--format must be cdm, csv or json, got "xls"/],
    [['--run', 'R1', '--format', 'csv'], /give --out FILE/],
  ])('bad arguments %j exit 2', (args, message) => {
    const r = keepclear(['export', ...args, '--db', dbPath]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
  });

  it('an unknown run or event exits 1 and writes nothing', () => {
    const out = join(dir, 'none.csv');
    const r = keepclear(['export', '--run', 'R999', '--format', 'csv', '--out', out, '--db', dbPath]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^keepclear: no run "R999"/m);
    expect(existsSync(out)).toBe(false);
  });
});
