/**
 * Bad CDM files (test/fixtures/cdm): each is refused with the file, the line and a reason that
 * says what is wrong, and no message is returned. Line numbers were read off the fixture files.
 * The fixtures follow the layout of the CCSDS 508.0-B-1 obligatory-keywords example with
 * covariances made up for Keepclear (OBJECT2's 6×6 is the standard example's, which is PSD).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseCdmFile } from '../core/formats/cdm/index.js';
import { rejectionLine } from '../core/errors.js';

const dir = new URL('./fixtures/cdm/', import.meta.url);
const parse = (f: string) => parseCdmFile(readFileSync(new URL(f, dir)), f);

const cases: [file: string, code: string, line: number, reason: RegExp][] = [
  ['missing-tca.kvn', 'CDM_MISSING_KEYWORD', 6, /relative metadata\/data lacks mandatory keyword TCA/],
  ['missing-ref-frame-object2.kvn', 'CDM_MISSING_KEYWORD', 49, /OBJECT2 metadata lacks mandatory keyword REF_FRAME/],
  ['wrong-units.kvn', 'CDM_UNITS', 7, /MISS_DISTANCE has unit \[km\], expected \[m\].*convert/],
  ['non-numeric.kvn', 'CDM_FIELD', 22, /OBJECT1 Y = "2244\.65x4904" is not a number/],
  ['bad-ref-frame.kvn', 'CDM_FIELD', 19, /OBJECT1 REF_FRAME = "TEME" is not allowed; CCSDS 508\.0-B-1 allows EME2000, GCRF, ITRF/],
  ['not-psd.kvn', 'CDM_COVARIANCE', 27, /OBJECT1 6×6 covariance is not positive semi-definite.*CT_R = .* implies correlation 1\.50 between R and T/],
  ['one-object.kvn', 'CDM_STRUCTURE', 11, /only one object section; a CDM needs OBJECT1 and OBJECT2/],
  ['partial-extension.kvn', 'CDM_MISSING_KEYWORD', 27, /OBJECT1 covariance has DRG terms.*missing CDRG_DRG/],
  ['two-messages.kvn', 'CDM_STRUCTURE', 86, /a second CDM begins here; a file may hold one CDM/],
  ['xml-syntax-error.xml', 'XML_SYNTAX', 16, /Expected closing tag 'MISS_DISTANCE'.*instead of closing tag 'MISS_DISTANC'/],
];

describe('malformed CDM files are refused whole', () => {
  for (const [file, code, line, reason] of cases)
    it(file, () => {
      const r = parse(file);
      expect(r.cdm).toBeNull();
      expect(r.repairs).toEqual([]);
      const first = r.errors[0]!;
      expect([first.code, first.file, first.line]).toEqual([code, file, line]);
      expect(first.reason).toMatch(reason);
      expect(rejectionLine(first)).toMatch(new RegExp(`^${file.replace('.', '\\.')}:${line}: `));
    });

  it('reports every bad value, not only the first (both objects in non-numeric.kvn)', () => {
    expect(parse('non-numeric.kvn').errors.map((e) => e.line)).toEqual([22, 60]);
  });
});

describe('accepted CDM files', () => {
  it('valid-6x6.kvn: both covariances PSD, nothing repaired', () => {
    const r = parse('valid-6x6.kvn');
    expect(r.errors).toEqual([]);
    expect(r.repairs).toEqual([]);
    expect(r.cdm!.object1.covariance.status).toBe('psd');
  });

  it('cov-9x9.kvn: the 9×9 extension (drag, SRP, thrust) is accepted whole', () => {
    const r = parse('cov-9x9.kvn');
    expect(r.errors).toEqual([]);
    const cov = r.cdm!.object1.covariance;
    expect(cov.dimension).toBe(9);
    expect(cov.status).toBe('psd');
    expect(cov.matrix[8]![8]).toBe(1e-12); // CTHR_THR = 1.0000E-12 [m**2/s**4] in the fixture
    expect(cov.lines['CTHR_THR']).toBe(71);
  });

  it('slightly-not-psd.kvn: ρ(R,T) = 1.0004 is rounding, repaired with a note', () => {
    const r = parse('slightly-not-psd.kvn');
    expect(r.errors).toEqual([]);
    const cov = r.cdm!.object2.covariance;
    expect(cov.status).toBe('repaired');
    // 2×2 block [[1, 1.0004], [1.0004, 1]] has eigenvalue 1 − 1.0004 = −4e-4 (hand computation).
    expect(r.repairs).toEqual([expect.stringMatching(
      /^slightly-not-psd\.kvn:65: OBJECT2 covariance repaired to nearest PSD: clipped eigenvalue -0\.000405 of the correlation-scaled 6×6 matrix/)]);
    expect(cov.matrix[1]![0]).toBe(324.04); // as received: CT_R = 3.2404E+02
    // The repaired matrix is a covariance again: |ρ(R,T)| ≤ 1 from its own variances.
    const u = cov.usable!;
    expect(u[1]![0]! / Math.sqrt(u[0]![0]! * u[1]![1]!)).toBeLessThanOrEqual(1 + 1e-9);
  });
});
