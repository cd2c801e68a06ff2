/**
 * OEM writer → reader: what Keepclear writes reads back to the same model (positions within
 * 1 mm, covariances exactly), with every mandatory keyword of CCSDS 502.0-B-2 §5 (header: table
 * 5-2; metadata: table 5-3 — keyword lists typed from the standard's tables, from memory, and
 * matching its example in test/authorities/ccsds-502). Also: time systems converted with the
 * leap seconds of IERS Bulletin C, frame names read as the notes say, OBJECT_ID classes.
 */
import { describe, expect, it } from 'vitest';
import {
  classifyObjectId, formatOemKvn, fullCovariance, parseOemFile, sampleOem, type Oem, type OemCovariance,
} from '../core/formats/oem/index.js';
import type { OemStateFrame } from '../core/formats/oem/keywords.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import { TwoBody, TwoBodyTrajectory } from './support/twoBody.js';

const T0 = Date.UTC(2026, 5, 1, 6, 0, 0);
const body = new TwoBody({ aKm: 7000, e: 0.01, iDeg: 98, raanDeg: 120, argpDeg: 45, m0Deg: 0, t0: T0, mu: 398600.4418 });
const traj = new TwoBodyTrajectory('90003', body);
/** Written to 1e-7 km per axis (write.ts POSITION_DECIMALS): 0.09 mm in 3-D. */
const ROUND_TRIP_KM = 1e-6; // km: the 1 mm the writer promises
const ROUND_TRIP_KMS = 1e-9; // km/s: written to 1e-10 km/s

const covariance = (epoch: number, frameName: string, frame: OemCovariance['frame'], scale: number): OemCovariance => ({
  epoch: instantFromMs(epoch), frameName, frame, comments: ['from the orbit determination of 2026-06-01'], line: 0,
  matrix: fullCovariance([
    1.2e-4 * scale,
    -3.4e-6, 5.6e-3 * scale,
    7.8e-7, -9.1e-7, 2.3e-5 * scale,
    1.1e-8, -2.2e-9, 3.3e-10, 4.4e-9,
    -5.5e-10, 6.6e-9, -7.7e-11, 8.8e-12, 9.9e-9,
    1.01e-11, -2.02e-10, 3.03e-9, -4.04e-13, 5.05e-12, 6.06e-10,
  ]),
});

function twoSegments(frame: OemStateFrame, messageId?: string): Oem {
  const oem = sampleOem(
    [
      { trajectory: traj, start: instantFromMs(T0), end: instantFromMs(T0 + 3600e3), stepS: 60 },
      { trajectory: traj, start: instantFromMs(T0 + 3600e3), end: instantFromMs(T0 + 7200e3), stepS: 120 },
    ],
    {
      objectName: 'TARNWELL-3', objectId: 'A0001', originator: 'TARNWELL ORBITAL', creationDate: instantFromMs(T0 - 60_000),
      frame, comments: ['planned trajectory'], ...(messageId ? { messageId } : {}),
    },
  );
  const [a, b] = oem.segments as [Oem['segments'][0], Oem['segments'][0]];
  return {
    ...oem,
    segments: [
      { ...a, covariances: [covariance(T0 + 600e3, 'RTN', 'RTN', 1), covariance(T0 + 1200e3, frame, frame, 2)] },
      { ...b, metadata: { ...b.metadata, useableStartTime: instantFromMs(T0 + 3600e3 + 240e3), comments: ['after the burn'] },
        dataComments: ['segment 2 data'], covariances: [covariance(T0 + 4000e3, 'TNW', 'TNW', 3)] },
    ],
  };
}

const HEADER_MANDATORY = ['CCSDS_OEM_VERS', 'CREATION_DATE', 'ORIGINATOR'];
const METADATA_MANDATORY = ['OBJECT_NAME', 'OBJECT_ID', 'CENTER_NAME', 'REF_FRAME', 'TIME_SYSTEM', 'START_TIME', 'STOP_TIME'];
const CCSDS_UTC_MS = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}$/;

describe('writer → reader', () => {
  for (const frame of ['EME2000', 'GCRF', 'ITRF', 'TEME'] as const) {
    it(`${frame}: the same model back (positions within 1 mm, covariances exact)`, () => {
      const oem = twoSegments(frame);
      const text = formatOemKvn(oem);
      const back = parseOemFile(text, 'plan.oem');
      expect(back.rejections).toEqual([]);
      const o = back.oem!;
      expect(o.header).toMatchObject({ version: '2.0', originator: 'TARNWELL ORBITAL', creationDate: T0 - 60_000, comments: ['planned trajectory'] });
      expect(o.segments).toHaveLength(2);
      o.segments.forEach((s, k) => {
        const w = oem.segments[k]!;
        expect(s.metadata).toMatchObject({
          objectName: 'TARNWELL-3', objectId: 'A0001', centerName: 'EARTH', refFrame: frame, stateFrame: frame,
          timeSystem: 'UTC', startTime: w.metadata.startTime, stopTime: w.metadata.stopTime,
          interpolation: { method: 'LAGRANGE', degree: 9, stated: true },
        });
        expect([...s.epochs]).toEqual([...w.epochs]);
        for (let i = 0; i < s.epochs.length; i++) {
          const o6 = 6 * i;
          expect(Math.hypot(s.teme[o6]! - w.teme[o6]!, s.teme[o6 + 1]! - w.teme[o6 + 1]!, s.teme[o6 + 2]! - w.teme[o6 + 2]!)).toBeLessThan(ROUND_TRIP_KM);
          expect(Math.hypot(s.teme[o6 + 3]! - w.teme[o6 + 3]!, s.teme[o6 + 4]! - w.teme[o6 + 4]!, s.teme[o6 + 5]! - w.teme[o6 + 5]!)).toBeLessThan(ROUND_TRIP_KMS);
        }
        expect(s.covariances.map((c) => [c.epoch, c.frameName, c.frame, c.matrix, c.comments])).toEqual(
          w.covariances.map((c) => [c.epoch, c.frameName, c.frame, c.matrix, c.comments]));
      });
      expect(o.segments[1]!.metadata.useableStartTime).toBe(T0 + 3600e3 + 240e3);
      expect(o.segments[1]!.usable).toEqual({ start: T0 + 3600e3 + 240e3, end: T0 + 7200e3 });
      expect(o.segments[1]!.metadata.comments).toEqual(['after the burn']);
      expect(o.segments[1]!.dataComments).toEqual(['segment 2 data']);
    });
  }

  it('writes every mandatory keyword of 502.0-B-2, UTC times with milliseconds', () => {
    const text = formatOemKvn(twoSegments('EME2000'));
    const lines = text.split('\n');
    const keys = lines.map((l) => /^([A-Z_]+)\s*=\s*(.*)$/.exec(l)).filter((m) => m !== null);
    for (const k of HEADER_MANDATORY) expect(keys.filter((m) => m[1] === k), k).toHaveLength(1);
    for (const k of METADATA_MANDATORY) expect(keys.filter((m) => m[1] === k), k).toHaveLength(2);
    expect(lines[0]).toMatch(/^CCSDS_OEM_VERS\s+= 2\.0$/);
    expect(lines.filter((l) => l === 'META_START')).toHaveLength(2);
    expect(lines.filter((l) => l === 'META_STOP')).toHaveLength(2);
    for (const m of keys.filter((m) => /TIME$|^CREATION_DATE$|^EPOCH$/.test(m[1]!))) expect(m[2], m[1]).toMatch(CCSDS_UTC_MS);
    for (const l of lines.filter((l) => /^\d{4}-/.test(l))) {
      const f = l.split(' ');
      expect(f).toHaveLength(7);
      expect(f[0]).toMatch(CCSDS_UTC_MS);
    }
    expect(keys.filter((m) => m[1] === 'TIME_SYSTEM').every((m) => m[2] === 'UTC')).toBe(true);
    expect(keys.filter((m) => m[1] === 'CENTER_NAME').every((m) => m[2] === 'EARTH')).toBe(true);
  });

  it('a MESSAGE_ID (a version 3.0 keyword) makes the message version 3.0, and reads back', () => {
    const text = formatOemKvn(twoSegments('EME2000', 'TW-2026-0601-01'));
    expect(text.split('\n')[0]).toMatch(/= 3\.0$/);
    expect(parseOemFile(text, 'x.oem').oem!.header).toMatchObject({ version: '3.0', messageId: 'TW-2026-0601-01' });
  });
});

/** Adds `seconds` to every CCSDS time in the text (epochs, metadata times), as a producer on another scale would write them. */
function shiftTimes(text: string, seconds: number): string {
  return text.replace(/\b(\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3})\b/g, (s) =>
    new Date(parseIso(s)! + seconds * 1000).toISOString().slice(0, -1));
}

describe('time systems: the same trajectory written on another scale loads at the same UTC instants', () => {
  // IERS Bulletin C: TAI − UTC = 37 s since 2017-01-01; TT = TAI + 32.184 s; GPS = TAI − 19 s.
  const utc = formatOemKvn(twoSegments('EME2000'));
  const reference = parseOemFile(utc, 'utc.oem').oem!;
  for (const [scale, offsetS] of [['TAI', 37], ['TT', 69.184], ['GPS', 18]] as const) {
    it(`${scale}: times ${offsetS} s ahead of UTC`, () => {
      const text = shiftTimes(utc, offsetS).replace(/^(TIME_SYSTEM\s+=) UTC$/gm, `$1 ${scale}`);
      const r = parseOemFile(text, `${scale}.oem`);
      expect(r.rejections).toEqual([]);
      expect(r.notes.filter((n) => n.note.startsWith(`TIME_SYSTEM = ${scale}: times converted to UTC`))).toHaveLength(2);
      r.oem!.segments.forEach((s, k) => {
        const want = reference.segments[k]!;
        // The shifted text is read back in whole ms; 69.184 s is exact in ms.
        expect([...s.epochs]).toEqual([...want.epochs]);
        // The frames depend on time only through the (UTC) instant, so states agree to rounding.
        for (let i = 0; i < s.teme.length; i++) expect(Math.abs(s.teme[i]! - want.teme[i]!)).toBeLessThan(1e-9);
        expect(s.covariances.map((c) => c.epoch)).toEqual(want.covariances.map((c) => c.epoch));
        expect(s.metadata.timeSystem).toBe(scale);
      });
    });
  }
});

describe('frame names', () => {
  const text = formatOemKvn(twoSegments('GCRF'));
  it('ICRF is read as GCRF, and says so', () => {
    const r = parseOemFile(text.replace(/= GCRF$/gm, '= ICRF'), 'icrf.oem');
    expect(r.rejections).toEqual([]);
    expect(r.oem!.segments.map((s) => [s.metadata.refFrame, s.metadata.stateFrame])).toEqual([['ICRF', 'GCRF'], ['ICRF', 'GCRF']]);
    expect(r.notes.some((n) => /REF_FRAME = ICRF is read as GCRF/.test(n.note))).toBe(true);
    const g = parseOemFile(text, 'gcrf.oem').oem!;
    expect([...r.oem!.segments[0]!.teme]).toEqual([...g.segments[0]!.teme]);
  });
  it('ITRF2014, ITRF-93 … are read as ITRF, with the UT1 caveat', () => {
    const itrf = formatOemKvn(twoSegments('ITRF'));
    for (const name of ['ITRF2014', 'ITRF-93', 'ITRF2000']) {
      const r = parseOemFile(itrf.replace(/^(REF_FRAME\s+=) ITRF$/gm, `$1 ${name}`), 'itrf.oem');
      expect(r.rejections).toEqual([]);
      expect(r.oem!.segments[0]!.metadata).toMatchObject({ refFrame: name, stateFrame: 'ITRF' });
      expect(r.notes.some((n) => n.note.startsWith(`REF_FRAME = ${name} is read as ITRF`) && /0\.44 km/.test(n.note))).toBe(true);
    }
  });
  it('RSW covariance frame is RTN', () => {
    const r = parseOemFile(text.replace('COV_REF_FRAME        = RTN', 'COV_REF_FRAME        = RSW'), 'rsw.oem');
    expect(r.oem!.segments[0]!.covariances[0]).toMatchObject({ frameName: 'RSW', frame: 'RTN' });
  });
});

describe('OBJECT_ID: catalogue number or international designator', () => {
  it.each([
    ['25544', { kind: 'catalogue', catalogueNumber: '25544' }],
    ['00005', { kind: 'catalogue', catalogueNumber: '5' }],
    ['A0001', { kind: 'catalogue', catalogueNumber: '100001' }], // Alpha-5: A = 10 (letters I and O unused)
    ['Z9999', { kind: 'catalogue', catalogueNumber: '339999' }],
    ['2026-100A', { kind: 'designator', designator: '2026-100A' }],
    ['1996-062abc', { kind: 'designator', designator: '1996-062ABC' }],
    ['26100A', { kind: 'designator', designator: '2026-100A' }], // the TLE's 8-column form
    ['I0001', { kind: 'unrecognised', text: 'I0001' }], // I is not an Alpha-5 letter
    ['TARNWELL-3', { kind: 'unrecognised', text: 'TARNWELL-3' }],
  ] as const)('%s', (text, want) => {
    expect(classifyObjectId(text)).toEqual(want);
  });
});


describe('KVN and XML of the same message load to the same model', () => {
  // Hand-written, with the optional parts: units ([km] in KVN, units="km" in XML), accelerations
  // on one line, a covariance in TNW, an <ndm> wrapper around the XML.
  const s = [0, 1, 2].map((k) => body.state(T0 + k * 60_000));
  const f = (x: number): string => x.toFixed(7);
  const kvn = [
    'CCSDS_OEM_VERS = 2.0', 'CREATION_DATE = 2026-06-01T05:00:00.000', 'ORIGINATOR = TARNWELL ORBITAL', '',
    'META_START', 'OBJECT_NAME = TARNWELL-3', 'OBJECT_ID = 2026-100A', 'CENTER_NAME = EARTH', 'REF_FRAME = EME2000',
    'TIME_SYSTEM = UTC', 'START_TIME = 2026-06-01T06:00:00.000', 'STOP_TIME = 2026-06-01T06:02:00.000',
    'INTERPOLATION = HERMITE', 'INTERPOLATION_DEGREE = 3', 'META_STOP',
    `2026-06-01T06:00:00.000 ${f(s[0]!.r[0])} [km] ${f(s[0]!.r[1])} [km] ${f(s[0]!.r[2])} [km] ${s[0]!.v.map(f).join(' [km/s] ')} [km/s]`,
    `2026-06-01T06:01:00.000 ${[...s[1]!.r, ...s[1]!.v].map(f).join(' ')} 0.001 0.002 0.003`,
    `2026-06-01T06:02:00.000 ${[...s[2]!.r, ...s[2]!.v].map(f).join(' ')}`,
    'COVARIANCE_START', 'EPOCH = 2026-06-01T06:01:00.000', 'COV_REF_FRAME = TNW',
    '1e-4', '0 2e-4', '0 0 3e-4', '0 0 0 1e-8', '0 0 0 0 2e-8', '0 0 0 0 0 3e-8', 'COVARIANCE_STOP', '',
  ].join('\n');
  const el = (tag: string, v: string | number, units?: string): string => `<${tag}${units ? ` units="${units}"` : ''}>${v}</${tag}>`;
  const cov = ['CX_X', 'CY_X', 'CY_Y', 'CZ_X', 'CZ_Y', 'CZ_Z', 'CX_DOT_X', 'CX_DOT_Y', 'CX_DOT_Z', 'CX_DOT_X_DOT',
    'CY_DOT_X', 'CY_DOT_Y', 'CY_DOT_Z', 'CY_DOT_X_DOT', 'CY_DOT_Y_DOT', 'CZ_DOT_X', 'CZ_DOT_Y', 'CZ_DOT_Z', 'CZ_DOT_X_DOT',
    'CZ_DOT_Y_DOT', 'CZ_DOT_Z_DOT'];
  const covValues = [1e-4, 0, 2e-4, 0, 0, 3e-4, 0, 0, 0, 1e-8, 0, 0, 0, 0, 2e-8, 0, 0, 0, 0, 0, 3e-8];
  const xml = [
    '<?xml version="1.0" encoding="UTF-8"?>', '<ndm>', '<oem id="CCSDS_OEM_VERS" version="2.0">',
    '<header>', el('CREATION_DATE', '2026-06-01T05:00:00.000'), el('ORIGINATOR', 'TARNWELL ORBITAL'), '</header>',
    '<body><segment><metadata>',
    el('OBJECT_NAME', 'TARNWELL-3'), el('OBJECT_ID', '2026-100A'), el('CENTER_NAME', 'EARTH'), el('REF_FRAME', 'EME2000'),
    el('TIME_SYSTEM', 'UTC'), el('START_TIME', '2026-06-01T06:00:00.000'), el('STOP_TIME', '2026-06-01T06:02:00.000'),
    el('INTERPOLATION', 'HERMITE'), el('INTERPOLATION_DEGREE', 3), '</metadata><data>',
    ...s.map((st, k) => ['<stateVector>', el('EPOCH', `2026-06-01T06:0${k}:00.000`),
      ...['X', 'Y', 'Z'].map((n, i) => el(n, f(st.r[i]!), 'km')), ...['X_DOT', 'Y_DOT', 'Z_DOT'].map((n, i) => el(n, f(st.v[i]!), 'km/s')),
      ...(k === 1 ? [el('X_DDOT', 0.001, 'km/s**2'), el('Y_DDOT', 0.002), el('Z_DDOT', 0.003)] : []), '</stateVector>'].join('\n')),
    '<covarianceMatrix>', el('EPOCH', '2026-06-01T06:01:00.000'), el('COV_REF_FRAME', 'TNW'),
    ...cov.map((n, i) => el(n, covValues[i]!, i === 0 ? 'km**2' : undefined)), '</covarianceMatrix>',
    '</data></segment></body>', '</oem>', '</ndm>', '',
  ].join('\n');

  it('same states, covariance and metadata; no problem reported', () => {
    const a = parseOemFile(kvn, 'x.oem'), b = parseOemFile(xml, 'x.xml');
    expect(a.rejections).toEqual([]);
    expect(b.rejections).toEqual([]);
    const [sa, sb] = [a.oem!.segments[0]!, b.oem!.segments[0]!];
    expect([...sb.epochs]).toEqual([...sa.epochs]);
    expect([...sb.teme]).toEqual([...sa.teme]);
    expect(sb.covariances.map((c) => [c.epoch, c.frame, c.matrix])).toEqual(sa.covariances.map((c) => [c.epoch, c.frame, c.matrix]));
    expect(sb.metadata).toEqual(sa.metadata);
    expect(sa.covariances[0]!.matrix[2]![2]).toBe(3e-4);
  });
  it('a unit that is not the standard\'s is refused in either syntax', () => {
    const k = parseOemFile(kvn.replace('[km/s] ', '[m/s] '), 'x.oem');
    expect(k.rejections.map((r) => [r.line, r.code])).toEqual([[16, 'OEM_UNITS']]);
    const x = parseOemFile(xml.replace('<Y_DDOT>', '<Y_DDOT units="m/s**2">'), 'x.xml');
    expect(x.rejections).toHaveLength(1);
    expect(x.rejections[0]!.reason).toMatch(/^data line Y_DDOT \(value 8\) has unit \[m\/s\*\*2\], expected \[km\/s\*\*2\]/);
  });
});
