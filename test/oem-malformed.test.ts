/**
 * Malformed OEMs (test/fixtures/oem, described in its README): each problem is reported as
 * FILE:LINE: reason, costs only its line, covariance block or segment, and the good segments
 * still load; a file with nothing usable is refused as a whole. Expected lines and states are
 * counted from the fixture texts (the rules are CCSDS 502.0-B-2's and the project's own).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { rejectionLine, type ErrorCode } from '../core/errors.js';
import { parseOemFile } from '../core/formats/oem/index.js';

const dir = new URL('./fixtures/oem/', import.meta.url);
const load = (f: string) => parseOemFile(readFileSync(new URL(f, dir)), f);

interface Case {
  readonly file: string;
  readonly code: ErrorCode;
  readonly line: number;
  readonly reason: RegExp;
  /** States per loaded segment, in file order. */
  readonly states: readonly number[];
  readonly covariances?: number;
}

const CASES: readonly Case[] = [
  { file: 'bad-epoch.oem', code: 'OEM_FIELD', line: 20, reason: /^data line epoch "2026-05-1OT00:03:00\.000" is not a CCSDS time; write YYYY-MM-DD/, states: [9, 10] },
  { file: 'non-increasing.oem', code: 'OEM_EPOCH_ORDER', line: 21, reason: /does not come after the previous one \(line 20\); epochs must increase within a segment/, states: [9, 10] },
  { file: 'missing-keyword.oem', code: 'OEM_MISSING_KEYWORD', line: 5, reason: /metadata lacks REF_FRAME; add it between META_START and META_STOP — this segment is skipped/, states: [10] },
  { file: 'bad-frame.oem', code: 'OEM_UNSUPPORTED', line: 9, reason: /^REF_FRAME = TOD is not supported: Keepclear reads EME2000, GCRF/, states: [10] },
  { file: 'time-system.oem', code: 'OEM_UNSUPPORTED', line: 10, reason: /^TIME_SYSTEM = TDB is not supported: Keepclear converts UTC, TAI, TT, GPS to UTC/, states: [10] },
  { file: 'short-line.oem', code: 'OEM_FIELD', line: 22, reason: /^data line has 5 numbers after the epoch, expected 6/, states: [9, 10] },
  { file: 'bad-units.oem', code: 'OEM_UNITS', line: 18, reason: /^data line X \(value 1\) has unit \[m\], expected \[km\]/, states: [9, 10] },
  { file: 'bad-covariance.oem', code: 'OEM_COVARIANCE', line: 36, reason: /^covariance row 6 has 5 values, expected 6 .*this covariance is skipped, the states still load/, states: [10, 10], covariances: 1 },
  { file: 'xml-syntax.oem.xml', code: 'XML_SYNTAX', line: 32, reason: /^XML syntax error at column \d+: .* — this segment is skipped, the others still load; fix the XML/, states: [10] },
];

describe('one problem costs only its line, covariance block or segment', () => {
  for (const c of CASES) {
    it(`${c.file}: ${c.code} at line ${c.line}, the rest loads`, () => {
      const r = load(c.file);
      expect(r.fatal).toBeNull();
      expect(r.rejections).toHaveLength(1);
      const rej = r.rejections[0]!;
      expect(rej).toMatchObject({ code: c.code, file: c.file, line: c.line });
      expect(rej.reason).toMatch(c.reason);
      expect(rejectionLine(rej).startsWith(`${c.file}:${c.line}: `)).toBe(true);
      expect(r.oem!.segments.map((s) => s.epochs.length)).toEqual(c.states);
      if (c.covariances !== undefined) {
        const covs = r.oem!.segments.flatMap((s) => s.covariances);
        expect(covs).toHaveLength(c.covariances);
        expect(covs[0]!.frameName).toBe('EME2000');
      }
    });
  }
});

describe('a file with nothing usable is refused as a whole', () => {
  it('nothing-usable.oem: its only segment is centred on the Moon', () => {
    const r = load('nothing-usable.oem');
    expect(r.oem).toBeNull();
    expect(r.fatal).toMatchObject({ file: 'nothing-usable.oem', line: 1, code: 'OEM_STRUCTURE' });
    expect(r.fatal!.reason).toMatch(/^no usable segment in this OEM .*nothing was imported$/);
    expect(r.rejections.map((x) => [x.line, x.code])).toEqual([[1, 'OEM_STRUCTURE'], [8, 'OEM_UNSUPPORTED']]);
    expect(r.rejections[1]!.reason).toMatch(/^CENTER_NAME = MOON: Keepclear screens Earth orbits/);
  });

  it('missing-originator.oem: the header lacks ORIGINATOR', () => {
    const r = load('missing-originator.oem');
    expect(r.oem).toBeNull();
    expect(r.fatal).toMatchObject({ file: 'missing-originator.oem', line: 1, code: 'OEM_MISSING_KEYWORD' });
    expect(r.fatal!.reason).toMatch(/^the OEM header lacks ORIGINATOR; .* the file was not imported$/);
  });

  it('binary input is refused before any OEM rule', () => {
    const r = parseOemFile(Uint8Array.of(0x43, 0x43, 0, 0x53), 'blob.oem');
    expect(r.fatal).toMatchObject({ code: 'NOT_TEXT', file: 'blob.oem', line: 1 });
  });
});
