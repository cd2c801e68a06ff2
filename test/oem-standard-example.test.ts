/**
 * The OEM example of CCSDS 502.0-B-2 (copies in test/authorities/ccsds-502, provenance in its
 * README), read field by field. Every expected value is typed from the text of the file it checks.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseOemFile, readOemText, type OemMessage } from '../core/formats/oem/index.js';
import { parseIso } from '../core/time/instant.js';

const dir = new URL('./authorities/ccsds-502/', import.meta.url);
const read = (f: string): string => readFileSync(new URL(f, dir), 'utf8');
const t = (iso: string): number => parseIso(iso)!;

function expectExample(m: OemMessage, file: string): void {
  expect(m.header).toMatchObject({ version: '2.0', originator: 'NASA/JPL', creationDate: t('1996-11-04T17:22:31Z'), comments: [] });
  expect(m.header.messageId).toBeUndefined();
  expect(m.segments).toHaveLength(2);
  const [a, b] = m.segments as [OemMessage['segments'][0], OemMessage['segments'][0]];
  for (const s of [a, b])
    expect(s.metadata, file).toMatchObject({
      objectName: 'MARS GLOBAL SURVEYOR', objectId: '1996-062A', centerName: 'MARS BARYCENTER',
      refFrame: 'EME2000', timeSystem: 'UTC', interpolation: 'HERMITE', interpolationDegree: 7,
    });
  expect(a.metadata).toMatchObject({
    startTime: t('1996-12-18T12:00:00.331Z'), useableStartTime: t('1996-12-18T12:10:00.331Z'),
    useableStopTime: t('1996-12-28T21:23:00.331Z'), stopTime: t('1996-12-28T21:28:00.331Z'),
  });
  expect(b.metadata).toMatchObject({
    startTime: t('1996-12-28T21:29:07.267Z'), useableStartTime: t('1996-12-28T22:08:02.5Z'),
    useableStopTime: t('1996-12-30T01:18:02.5Z'), stopTime: t('1996-12-30T01:28:02.267Z'),
  });
  expect(a.dataComments).toEqual([
    'This file was produced by M.R. Somebody, MSOO NAV/JPL, 1996NOV 04. It is',
    'to be used for DSN scheduling purposes only.',
  ]);
  expect(b.dataComments).toEqual(['This block begins after trajectory correction maneuver TCM-3.']);
  const states = (s: typeof a): unknown[] => s.states.map((x) => [x.epoch, ...x.r, ...x.v]);
  expect(states(a)).toEqual([
    [t('1996-12-18T12:00:00.331Z'), 2789.619, -280.045, -1746.755, 4.73372, -2.49586, -1.04195],
    [t('1996-12-18T12:01:00.331Z'), 2783.419, -308.143, -1877.071, 5.18604, -2.42124, -1.99608],
    [t('1996-12-18T12:02:00.331Z'), 2776.033, -336.859, -2008.682, 5.63678, -2.33951, -1.94687],
  ]);
  expect(states(b)).toEqual([
    [t('1996-12-28T21:29:07.267Z'), -2432.166, -63.042, 1742.754, 7.33702, -3.495867, -1.041945],
    [t('1996-12-28T21:59:02.267Z'), -2445.234, -878.141, 1873.073, 1.86043, -3.421256, -0.996366],
    [t('1996-12-28T22:00:02.267Z'), -2458.079, -683.858, 2007.684, 6.36786, -3.339563, -0.946654],
  ]);
  expect(a.states.every((s) => s.a === undefined)).toBe(true);
  expect(a.covariances).toEqual([]);
}

describe('CCSDS 502.0-B-2 OEM example, KVN and XML', () => {
  it('KVN: every field as written; lines point at the text', () => {
    const r = readOemText(read('oem-example.kvn'), 'oem-example.kvn');
    expect(r.rejections).toEqual([]);
    expectExample(r.message!, 'kvn');
    const s = r.message!.segments;
    expect(s[0]!.line).toBe(5); // META_START
    expect(s[0]!.metadata.lines['CENTER_NAME']).toBe(8);
    expect(s[0]!.states.map((x) => x.line)).toEqual([21, 22, 23]);
    expect(s[1]!.states.map((x) => x.line)).toEqual([41, 42, 43]);
  });

  it('XML: the same message', () => {
    const r = readOemText(read('oem-example.xml'), 'oem-example.xml');
    expect(r.rejections).toEqual([]);
    expectExample(r.message!, 'xml');
    expect(r.message!.segments[1]!.metadata.lines['CENTER_NAME']).toBe(57);
    expect(r.message!.segments[0]!.states.map((x) => x.line)).toEqual([24, 33, 42]);
  });

  it('is refused for use with the reason: it is centred on Mars', () => {
    for (const f of ['oem-example.kvn', 'oem-example.xml']) {
      const p = parseOemFile(new TextEncoder().encode(read(f)), f);
      expect(p.oem).toBeNull();
      expect(p.fatal).toMatchObject({ file: f, line: 1, code: 'OEM_STRUCTURE' });
      const centre = p.rejections.filter((x) => x.code === 'OEM_UNSUPPORTED');
      expect(centre.map((x) => x.line)).toEqual(f.endsWith('kvn') ? [8, 28] : [11, 57]);
      for (const x of centre) expect(x.reason).toMatch(/^CENTER_NAME = MARS BARYCENTER: Keepclear screens Earth orbits/);
    }
  });
});

describe('OEM with covariance (the standard example\'s covariance terms)', () => {
  it('reads both matrices term by term, in the order written', () => {
    const r = readOemText(read('oem-covariance.kvn'), 'oem-covariance.kvn');
    expect(r.rejections).toEqual([]);
    const m = r.message!;
    expect(m.header.comments).toEqual(['Valid example of a single data/covariance block']);
    const seg = m.segments[0]!;
    expect(seg.metadata).toMatchObject({
      useableStartTime: t('1996-12-18T12:00:00.331Z'), useableStopTime: t('1996-12-28T21:28:00.331Z'),
    });
    expect(seg.covariances).toHaveLength(2);
    const [c1, c2] = seg.covariances as [typeof seg.covariances[0], typeof seg.covariances[0]];
    expect(c1).toMatchObject({ epoch: t('1996-12-18T21:29:07.267Z'), covRefFrame: 'EME2000', line: 25 });
    expect(c1.lowerTriangle).toEqual([
      3.3313494e-4,
      4.6189273e-4, 6.7824216e-4,
      -3.0700078e-4, -4.2212341e-4, 3.2319319e-4,
      -3.349365e-7, -4.6860842e-7, 2.4849495e-7, 4.2960228e-10,
      -2.2118325e-7, -2.8641868e-7, 1.7980986e-7, 2.6088992e-10, 1.7675147e-10,
      -3.041346e-7, -4.9894969e-7, 3.5403109e-7, 1.8692631e-10, 1.0088625e-10, 6.2244443e-10,
    ]);
    expect(c2).toMatchObject({ epoch: t('1996-12-19T21:00:00Z'), covRefFrame: 'EME2000', line: 34 });
    expect(c2.lowerTriangle).toEqual([
      3.4424505e-4,
      4.5078162e-4, 6.8935327e-4,
      -3.0600067e-4, -4.110123e-4, 3.342042e-4,
      -3.2382549e-7, -4.5750731e-7, 2.3738384e-7, 4.3071339e-10,
      -2.1007214e-7, -2.7530757e-7, 1.6870875e-7, 2.5077881e-10, 1.8786258e-10,
      -3.030235e-7, -4.8783858e-7, 3.4302008e-7, 1.758152e-10, 1.0077514e-10, 6.2244443e-10,
    ]);
  });
});
