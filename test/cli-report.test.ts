/**
 * `keepclear report (--event ID | --run ID) --out FILE.html|FILE.pdf [--db FILE]` (DESIGN.md CLI
 * contract) run as a user would: the files appear, bad arguments exit 2, unknown ids exit 1.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromiumMissing } from '../app/report/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { runKeepclear } from './support/cli.js';
import { reportFixture } from './support/reportFixture.js';

let dir: string;
let dbPath: string;
let runId: string;
const keepclear = (args: string[]) => runKeepclear(args, dir);
const htmlEscape = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-report-'));
  dbPath = join(dir, 'reports.db');
  const fx = reportFixture(20, dbPath);
  runId = fx.runId;
  fx.db.close();
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('keepclear report', () => {
  it('writes the run report as HTML, with the caution', () => {
    const out = join(dir, 'week.html');
    const r = keepclear(['report', '--run', runId, '--out', out, '--db', dbPath]);
    expect(r.code, r.stderr).toBe(0);
    const html = readFileSync(out, 'utf8');
    expect(html).toContain(htmlEscape(DECISION_AID_NOTE));
    expect(html).toContain('data-plot="week-glance"');
    expect(r.stderr).toMatch(/^report: .*week\.html \(HTML/m);
  });

  it('--run latest reports on the newest finished screening run (README "Scheduled use")', () => {
    const out = join(dir, 'latest.html');
    const r = keepclear(['report', '--run', 'latest', '--out', out, '--db', dbPath]);
    expect(r.code, r.stderr).toBe(0);
    expect(readFileSync(out, 'utf8')).toContain(`<b>${runId}</b>`);
    const empty = keepclear(['report', '--run', 'latest', '--out', join(dir, 'none.html'), '--db', join(dir, 'empty.db')]);
    expect(empty.code).toBe(1);
    expect(empty.stderr).toMatch(/^keepclear: no finished screening run/m);
  });

  it('writes an event report as HTML', () => {
    const out = join(dir, 'event.html');
    const r = keepclear(['report', '--event', `${runId}-1`, '--out', out, '--db', dbPath]);
    expect(r.code, r.stderr).toBe(0);
    expect(readFileSync(out, 'utf8')).toContain('data-plot="encounter-plane"');
  });

  it.skipIf(chromiumMissing() !== null)('writes a PDF through Chromium', () => {
    const out = join(dir, 'event.pdf');
    const r = keepclear(['report', '--event', `${runId}-2`, '--out', out, '--db', dbPath]);
    expect(r.code, r.stderr).toBe(0);
    expect(readFileSync(out).subarray(0, 5).toString('latin1')).toBe('%PDF-');
  });

  it.each([
    [['--out', 'x.html'], /exactly one of --run ID or --event ID/],
    [['--run', 'R1', '--event', 'R1-1', '--out', 'x.html'], /exactly one of --run ID or --event ID/],
    [['--run', 'R1'], /--out FILE\.html or --out FILE\.pdf/],
    [['--run', 'R1', '--out', 'x.txt'], /must end in \.html or \.pdf/],
    [['--run', 'R1', '--out', 'x.html', '--bogus', '1'], /unknown option --bogus/],
  ])('bad arguments %j exit 2', (args, message) => {
    const r = keepclear(['report', ...args.map((a) => (a.startsWith('x.') ? join(dir, a) : a)), '--db', dbPath]);
    expect(r.code, r.stderr).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(existsSync(join(dir, 'x.html'))).toBe(false);
  });

  it('an unknown run or event exits 1 and names it', () => {
    const a = keepclear(['report', '--run', 'R404', '--out', join(dir, 'no.html'), '--db', dbPath]);
    expect(a.code).toBe(1);
    expect(a.stderr).toMatch(/no run "R404"/);
    const b = keepclear(['report', '--event', 'R1-999', '--out', join(dir, 'no.html'), '--db', dbPath]);
    expect(b.code).toBe(1);
    expect(b.stderr).toMatch(/no event "R1-999"/);
    expect(existsSync(join(dir, 'no.html'))).toBe(false);
  });

  it('--help lists the report command', () => {
    expect(keepclear(['--help']).stdout).toMatch(/keepclear report \(--event ID \| --run ID\) --out FILE\.html\|FILE\.pdf/);
  });
});
