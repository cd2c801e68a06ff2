/**
 * Small pieces of the CDM reader checked against hand computations and the calendar:
 * CCSDS time forms, number syntax, hard-body radius, the PSD verdict, and format detection.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { hardBodyRadiusFromAreaPc, parseCdmFile } from '../core/formats/cdm/index.js';
import { formatCcsdsTime, parseCcsdsTime, parseCdmNumber } from '../core/formats/cdm/values.js';
import { judgeCovariance, psdTolerance } from '../core/formats/cdm/covariance.js';
import { parseIso, type Instant } from '../core/time/instant.js';

describe('CCSDS times', () => {
  it('day-of-year form: 2010 day 072 is 13 March (31 + 28 + 13)', () => {
    expect(parseCcsdsTime('2010-072T22:31:12.000')).toBe(parseIso('2010-03-13T22:31:12.000Z'));
  });
  it('day 366 exists only in leap years', () => {
    expect(parseCcsdsTime('2012-366T00:00:00')).toBe(Date.UTC(2012, 11, 31));
    expect(parseCcsdsTime('2011-366T00:00:00')).toBeNull();
  });
  it('rejects non-CCSDS forms', () => {
    for (const t of ['2010-03-13', '2010-03-13 22:31:12', '13/03/2010 22:31:12', '2010-03-13T22:31:12+01:00'])
      expect(parseCcsdsTime(t), t).toBeNull();
  });
  it('keeps microseconds through write and read', () => {
    const t = parseCcsdsTime('2010-03-13T22:37:52.618123')!;
    // A double of ms near 1.27e12 resolves 2^-12 ms ≈ 0.24 µs, so 0.123 ms is kept to that.
    expect(t - parseCcsdsTime('2010-03-13T22:37:52.618')!).toBeCloseTo(0.123, 3);
    expect(formatCcsdsTime(t)).toBe('2010-03-13T22:37:52.618123');
    expect(formatCcsdsTime(Date.UTC(2010, 2, 13, 22, 37, 52, 618) as Instant)).toBe('2010-03-13T22:37:52.618');
  });
});

describe('numbers', () => {
  it('accepts decimal and E notation only', () => {
    expect(parseCdmNumber('-7.5888E+02')).toBe(-758.88);
    expect(parseCdmNumber('.5')).toBe(0.5);
    for (const bad of ['', '0x10', 'NaN', '1,5', '1.2.3', '7e', 'Infinity']) expect(parseCdmNumber(bad), bad).toBeNull();
  });
});

describe('hard-body radius from AREA_PC', () => {
  it('is the radius of a disc of that area', () => {
    expect(hardBodyRadiusFromAreaPc(Math.PI)).toBeCloseTo(1, 15);
    const r = hardBodyRadiusFromAreaPc(5.2); // AREA_PC of OBJECT1 in the 508.0-B-1 example
    expect(Math.PI * r * r).toBeCloseTo(5.2, 12);
    expect(r).toBeCloseTo(1.28655, 5); // √(5.2/π) = √1.655211 = 1.286550 by hand
    expect(() => hardBodyRadiusFromAreaPc(-1)).toThrow(/AREA_PC/);
  });
});

describe('covariance verdict', () => {
  const diag = (...d: number[]) => d.map((x, i) => d.map((_, j) => (i === j ? x : 0)));
  it('rounding tolerance grows with size: n · 1e-3', () => {
    expect(psdTolerance(6)).toBeCloseTo(0.006, 15);
    expect(psdTolerance(9)).toBeCloseTo(0.009, 15);
  });
  it('diagonal positive matrix is PSD as received', () => {
    const c = diag(1, 2, 3, 1e-4, 1e-4, 1e-4);
    expect(judgeCovariance(c, 'OBJECT1')).toEqual({ status: 'psd', usable: c });
  });
  it('a negative variance is refused, naming the term', () => {
    const v = judgeCovariance(diag(1, 2, 3, -1e-4, 1e-4, 1e-4), 'OBJECT2');
    expect(v.status).toBe('not-psd');
    expect(v.note).toMatch(/OBJECT2 6×6 covariance is not positive semi-definite: variance CRDOT_RDOT = -1E-4 \[m\*\*2\/s\*\*2\] is negative/);
  });
});

describe('format detection', () => {
  it('refuses bytes that are not UTF-8', () => {
    const r = parseCdmFile(new Uint8Array([0xff, 0xfe, 0x00, 0x41]), 'bin.cdm');
    expect(r.errors[0]).toMatchObject({ code: 'NOT_TEXT', file: 'bin.cdm', line: 1 });
  });
  it('refuses text that is neither KVN CDM nor XML', () => {
    const r = parseCdmFile('CCSDS_OMM_VERS = 2.0\n', 'x.omm');
    expect(r.cdm).toBeNull();
    expect(r.errors[0]!.code).toBe('FORMAT_UNKNOWN');
    expect(r.errors[0]!.reason).toMatch(/found CCSDS_OMM_VERS/);
  });
  it('KVN without its version line names CCSDS_CDM_VERS as missing', () => {
    const text = readFileSync(new URL('./fixtures/cdm/valid-6x6.kvn', import.meta.url), 'utf8').replace(/^CCSDS_CDM_VERS.*\n/, '');
    const r = parseCdmFile(text, 'nover.kvn');
    expect(r.cdm).toBeNull();
    expect(r.errors[0]).toMatchObject({ code: 'CDM_MISSING_KEYWORD', line: 2 });
    expect(r.errors[0]!.reason).toMatch(/header lacks mandatory keyword CCSDS_CDM_VERS/);
  });
  it('reads a day-of-year TCA in a KVN message', () => {
    const text = readFileSync(new URL('./fixtures/cdm/valid-6x6.kvn', import.meta.url), 'utf8')
      .replace('2010-03-13T22:37:52.618', '2010-072T22:37:52.618');
    expect(parseCdmFile(text, 'doy.kvn').cdm!.relative.tca).toBe(parseIso('2010-03-13T22:37:52.618Z'));
  });
});
