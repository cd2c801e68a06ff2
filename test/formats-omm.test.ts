/**
 * OMM readers and writers. Reference: the GOES 9 OMM example of CCSDS 502.0-B-2 (Orbit Data
 * Messages, 2009) and its two-line form (test/fixtures/formats/README.md says how the fixture
 * was written: from memory, cross-checked against values quoted in a public test).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { detectFormat, parseElementFile } from '../core/formats/detect.js';
import { parseOmmCsv, formatOmmCsv } from '../core/formats/omm/index.js';
import { parseOmmJson, formatOmmJson } from '../core/formats/omm/index.js';
import { parseOmmKvn, formatOmmKvn } from '../core/formats/omm/index.js';
import { parseOmmXml, formatOmmXml } from '../core/formats/omm/index.js';
import { parseTle } from '../core/formats/tle/index.js';
import { generateCatalog } from '../core/synthetic/catalog.js';

const FIX = new URL('./fixtures/formats/', import.meta.url);
const bytes = (f: string): Uint8Array => readFileSync(new URL(f, FIX));
const text = (f: string): string => readFileSync(new URL(f, FIX), 'utf8');
const noSource = (s: ElementSet | undefined) => ({ ...s, source: null });

/**
 * Values of the 502.0-B-2 GOES 9 example (keyword = value as printed in the standard).
 * EPOCH 2007-064T10:34:41.4264: day 64 of 2007 is 5 March (31 + 28 + 5; hand arithmetic).
 */
const GOES9 = {
  objectId: '23581',
  name: 'GOES 9',
  intlDesignator: '1995-025A',
  classification: 'U',
  epoch: Date.UTC(2007, 2, 5, 10, 34, 41) + 426.4,
  meanMotionRevPerDay: 1.00273272,
  eccentricity: 0.0005013,
  inclinationDeg: 3.0539,
  raanDeg: 81.7939,
  argPerigeeDeg: 249.2363,
  meanAnomalyDeg: 150.1602,
  bstar: 0.0001,
  meanMotionDot: -0.00000113,
  meanMotionDdot: 0,
  elementSetNo: 925,
  revAtEpoch: 4316,
  ephemerisType: 0,
};
/**
 * Epochs are UTC ms doubles built by different arithmetic (TLE day fraction vs calendar
 * fields): they may differ by rounding of a ~1.2e12 double, ≈ 2.4e-4 ms. 1 µs allows that.
 */
const EPOCH_TOL_MS = 1e-3;

const expectGoes9 = (s: ElementSet | undefined): void => {
  expect(s).toBeDefined();
  const { epoch, ...rest } = GOES9;
  expect(Math.abs((s?.epoch ?? 0) - epoch)).toBeLessThanOrEqual(EPOCH_TOL_MS);
  expect({ ...noSource(s), epoch: 0 }).toEqual({ ...rest, epoch: 0, source: null });
};

describe('the 502.0-B-2 GOES 9 example in every form', () => {
  const forms = [
    ['goes9.tle', 'TLE', 1],
    ['goes9.omm.kvn', 'OMM-KVN', 1],
    ['goes9.omm.xml', 'OMM-XML', 2],
    ['goes9.omm.json', 'OMM-JSON', 1],
    ['goes9.omm.csv', 'OMM-CSV', 2],
  ] as const;
  const results = forms.map(([f]) => parseElementFile(bytes(f), f));

  forms.forEach(([f, format, line], k) => {
    it(`${f}: detected as ${format}, values of the standard's example, source line ${line}`, () => {
      const r = results[k]!;
      expect(r.fatal).toBeNull();
      expect(r.format).toBe(format);
      expect(r.rejections).toEqual([]);
      expect(r.sets).toHaveLength(1);
      expectGoes9(r.sets[0]);
      expect(r.sets[0]?.source).toEqual({ file: f, line, format });
    });
  });

  it('all five forms give identical element sets (except source)', () => {
    const first = noSource(results[0]!.sets[0]);
    for (const r of results.slice(1)) expect(noSource(r.sets[0])).toEqual(first);
  });
});

describe('several OMMs in one file', () => {
  const kvn = text('goes9.omm.kvn');
  it('KVN: concatenated messages, each located at its CCSDS_OMM_VERS line', () => {
    const two = kvn + '\n' + kvn.replace('NORAD_CAT_ID = 23581', 'NORAD_CAT_ID = 99001');
    const r = parseOmmKvn(two, 'two.kvn');
    expect(r.rejections).toEqual([]);
    expect(r.sets.map((s) => [s.objectId, s.source.line])).toEqual([
      ['23581', 1],
      ['99001', kvn.split('\n').length + 1],
    ]);
  });

  it('XML: an <ndm> with many <omm>, each located at its start tag', () => {
    const one = text('goes9.omm.xml').replace(/^<\?xml[^>]*>\n/, '');
    const ndm = `<?xml version="1.0"?>\n<ndm>\n${one}${one.replace('>23581<', '>99002<')}</ndm>\n`;
    const r = parseOmmXml(ndm, 'many.xml');
    expect(r.rejections).toEqual([]);
    expect(r.sets.map((s) => [s.objectId, s.source.line])).toEqual([
      ['23581', 3],
      ['99002', 3 + one.split('\n').length - 1],
    ]);
    expect(detectFormat(ndm)).toBe('OMM-XML');
  });
});

describe('header keywords', () => {
  const json = text('goes9.omm.json');
  const withKey = (k: string, v: string): string => json.replace('"OBJECT_NAME"', `"${k}": "${v}", "OBJECT_NAME"`);
  it.each([
    ['REF_FRAME', 'TEME', true],
    ['REF_FRAME', 'GCRF', false],
    ['TIME_SYSTEM', 'UTC', true],
    ['TIME_SYSTEM', 'TAI', false],
    ['MEAN_ELEMENT_THEORY', 'SGP4', true],
    ['MEAN_ELEMENT_THEORY', 'SGP/SGP4', true],
    ['MEAN_ELEMENT_THEORY', 'SGP4-XP', false],
    ['CENTER_NAME', 'MOON', false],
  ])('JSON with %s = %s accepted: %s', (k, v, ok) => {
    const r = parseOmmJson(withKey(k, v), 'h.json');
    expect(r.sets).toHaveLength(ok ? 1 : 0);
    if (!ok) expect(r.rejections[0]?.reason).toContain(`${k} is '${v}'`);
  });

  it('KVN: a value given in other units is refused (MEAN_MOTION in [km] is a different quantity)', () => {
    const r = parseOmmKvn(text('goes9.omm.kvn').replace('1.00273272 [rev/day]', '1.00273272 [km]'), 'u.kvn');
    expect(r.sets).toHaveLength(0);
    expect(r.rejections[0]).toMatchObject({ line: 13, code: 'OMM_FIELD' });
    expect(r.rejections[0]?.reason).toContain('[rev/day]');
  });
});

describe('writers round-trip through the readers', () => {
  const base = parseTle(text('goes9.tle'), 'g').sets[0]!;
  const sets: ElementSet[] = [
    base,
    { ...base, objectId: '100001', name: 'A & <B> "C", D', intlDesignator: null, bstar: -3.3e-5, meanMotionDdot: 1.2e-11 },
    { ...base, objectId: '7', name: null, eccentricity: 0.7303, meanMotionRevPerDay: 2.00613, epoch: (base.epoch + 123.456789) as never },
  ];
  const HDR = { creationDate: '2026-01-01T00:00:00', originator: 'TEST' };
  /** The writers keep microseconds: a written epoch is within 0.5 µs (+ double rounding). */
  const WRITTEN_EPOCH_TOL_MS = 0.5e-3 + 1e-6;

  it.each([
    ['KVN', () => parseOmmKvn(formatOmmKvn(sets, HDR), 'w.kvn')],
    ['XML', () => parseOmmXml(formatOmmXml(sets, HDR), 'w.xml')],
    ['JSON', () => parseOmmJson(formatOmmJson(sets), 'w.json')],
    ['CSV', () => parseOmmCsv(formatOmmCsv(sets), 'w.csv')],
  ])('%s', (_n, roundTrip) => {
    const r = roundTrip();
    expect(r.rejections).toEqual([]);
    expect(r.sets).toHaveLength(sets.length);
    r.sets.forEach((s, k) => {
      const want = sets[k]!;
      expect(Math.abs(s.epoch - want.epoch)).toBeLessThanOrEqual(WRITTEN_EPOCH_TOL_MS);
      expect({ ...noSource(s), epoch: 0 }).toEqual({ ...noSource(want), epoch: 0 });
    });
  });

  it('XML writer output is well-formed and escaped', () => {
    const xml = formatOmmXml(sets, HDR);
    expect(xml).toContain('<OBJECT_NAME>A &amp; &lt;B&gt; &quot;C&quot;, D</OBJECT_NAME>');
    expect(detectFormat(xml)).toBe('OMM-XML');
  });
});

describe('format detection by content', () => {
  const enc = (s: string): Uint8Array => new TextEncoder().encode(s);
  it.each([
    ['CCSDS_CDM_VERS = 1.0\n', 'CDM-KVN'],
    ['COMMENT x\nCCSDS_OEM_VERS = 2.0\n', 'OEM-KVN'],
    ['<?xml version="1.0"?>\n<cdm id="CCSDS_CDM_VERS" version="1.0"></cdm>', 'CDM-XML'],
    ['<?xml version="1.0"?>\n<!-- c -->\n<oem version="2.0"></oem>', 'OEM-XML'],
    ['<ndm><oem version="2.0"></oem></ndm>', 'OEM-XML'],
  ])('%j → %s, reported only', (t, f) => {
    const r = parseElementFile(enc(t), 'x');
    expect(r).toEqual({ format: f, sets: [], rejections: [], fatal: null });
  });

  it('a UTF-8 BOM and CRLF line ends are accepted', () => {
    const r = parseElementFile(enc('\uFEFF' + text('goes9.omm.kvn').replace(/\n/g, '\r\n')), 'bom.kvn');
    expect(r.format).toBe('OMM-KVN');
    expect(r.sets).toHaveLength(1);
  });

  it('unknown text is fatal and nothing else', () => {
    const r = parseElementFile(enc('hello world\n'), 'notes.txt');
    expect(r.format).toBe('UNKNOWN');
    expect(r.sets).toEqual([]);
    expect(r.fatal?.code).toBe('FORMAT_UNKNOWN');
    expect(r.fatal?.toLine()).toMatch(/^notes\.txt:1: not a recognised element file/);
  });
});

describe('large OMM XML files are read one OMM at a time', () => {
  it('gives the same element sets and lines as reading the whole document', () => {
    const sets = generateCatalog({ size: 300, seed: 11, epoch: Date.parse('2026-12-07T00:00:00Z') as never });
    const text = formatOmmXml(sets);
    const whole = parseOmmXml(text, 'cat.xml', Number.POSITIVE_INFINITY);
    const chunked = parseOmmXml(text, 'cat.xml', 0);
    expect(whole.sets).toHaveLength(300);
    expect(chunked.sets).toEqual(whole.sets);
    expect(chunked.rejections).toEqual(whole.rejections);
  });
});
