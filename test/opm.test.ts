/**
 * OPM (CCSDS 502.0-B-2, Orbit Data Messages §3: header, metadata, state vector, spacecraft
 * parameters, manoeuvre block MAN_EPOCH_IGNITION … MAN_DV_3 in km/s; §3.2.4.8: every manoeuvre
 * repeats all seven keywords in order) written and read back, a hand-written message in the
 * standard's layout (test/fixtures/opm/two-manoeuvres.opm), and malformed files reported as
 * FILE:LINE.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { KeepclearError } from '../core/errors.js';
import { formatOpmKvn } from '../core/formats/opm/opmWrite.js';
import { parseOpmKvn } from '../core/formats/opm/opmRead.js';
import { burnOpm, opmStateTeme } from '../core/manoeuvre/burnOpm.js';
import { parseIso, type Instant } from '../core/time/instant.js';

/**
 * TEME → EME2000 → TEME through core/frames: two rotations and their transposes, so only
 * rounding remains (~1e-12 of 7000 km).
 */
const FRAME_ROUND_TRIP_KM = 1e-8;
const FRAME_ROUND_TRIP_KMS = 1e-11;

const BURN_TIME = parseIso('2026-12-07T13:27:11.123Z')!;
const STATE = [-4471.338, 5012.004, 1834.772, -2.1147, -3.9721, 6.0183] as const;

function sample() {
  return burnOpm({
    objectName: 'TARNWELL-1',
    objectId: '2025-077A',
    stateAtBurn: STATE,
    burn: { time: BURN_TIME, deltaVRtnMs: [0.0123, -0.1301, 0.0004] },
    propellantKg: 0.00603,
    massKg: 100,
    creationDate: parseIso('2026-12-06T08:00:00Z')!,
    comments: ['planned avoidance burn, event 17 (decision aid only)'],
  });
}

describe('OPM write → read', () => {
  it('round trip keeps every field exactly; the state returns to TEME', () => {
    const m = sample();
    const text = formatOpmKvn(m);
    expect(text).toMatch(/^CCSDS_OPM_VERS\s+= 2\.0$/m);
    expect(text).toMatch(/^REF_FRAME\s+= EME2000$/m);
    expect(text).toMatch(/^MAN_REF_FRAME\s+= RTN$/m);
    expect(text).toMatch(/^MAN_DURATION\s+= 0 \[s\]$/m);
    expect(text).toMatch(/^MAN_DV_2\s+= -0\.0001301 \[km\/s\]$/m);
    const r = parseOpmKvn(text, 'plan.opm');
    expect(r.epoch).toBe(BURN_TIME);
    expect(r.positionKm).toEqual(m.positionKm);
    expect(r.velocityKmS).toEqual(m.velocityKmS);
    expect(r.spacecraft).toEqual({ massKg: 100 });
    expect(r.comments).toEqual(m.comments);
    expect(r.manoeuvres).toHaveLength(1);
    const [man] = r.manoeuvres;
    expect(man!.epochIgnition).toBe(BURN_TIME);
    expect(man!.durationS).toBe(0);
    expect(man!.deltaMassKg).toBe(-0.00603);
    expect(man!.refFrame).toBe('RTN');
    expect(man!.dvKmS).toEqual(m.manoeuvres[0]!.dvKmS);
    // m/s of the plan → km/s of the message
    [0.0000123, -0.0001301, 0.0000004].forEach((v, i) => expect(man!.dvKmS[i]).toBeCloseTo(v, 15));
    const back = opmStateTeme(r);
    for (let i = 0; i < 3; i++) {
      expect(Math.abs(back[i]! - STATE[i]!)).toBeLessThan(FRAME_ROUND_TRIP_KM);
      expect(Math.abs(back[3 + i]! - STATE[3 + i]!)).toBeLessThan(FRAME_ROUND_TRIP_KMS);
    }
    // EME2000 is not TEME: the written state must have been rotated (precession since 2000 ≈ 0.37°).
    expect(Math.hypot(m.positionKm[0] - STATE[0], m.positionKm[1] - STATE[1], m.positionKm[2] - STATE[2])).toBeGreaterThan(10);
  });

  it('refuses a burn without propellant (the standard wants MAN_DELTA_MASS < 0)', () => {
    expect(() => burnOpm({ ...sampleInput(), propellantKg: 0 })).toThrow(/propellant/);
  });
});

function sampleInput() {
  return {
    objectName: 'X', objectId: '1', stateAtBurn: STATE, burn: { time: BURN_TIME as Instant, deltaVRtnMs: [0, 0.1, 0] as const },
    propellantKg: 0.001,
  };
}

describe('OPM reader on a message in the standard\'s layout', () => {
  const text = readFileSync(new URL('./fixtures/opm/two-manoeuvres.opm', import.meta.url), 'utf8');
  const m = parseOpmKvn(text, 'two-manoeuvres.opm');
  it('header, metadata and day-of-year epoch', () => {
    expect(m.originator).toBe('TARNWELL ORBITAL');
    expect(m.objectId).toBe('2025-077C');
    expect(m.epoch).toBe(parseIso('2026-12-06T12:00:00.250Z'));
    expect(m.positionKm).toEqual([6655.9942, -1218.5751, 2082.9177]);
  });
  it('spacecraft parameters, and the keywords kept verbatim', () => {
    expect(m.spacecraft).toEqual({ massKg: 180.5, dragAreaM2: 1.2, dragCoeff: 2.2 });
    expect(m.other.GM).toBe('398600.4415');
    expect(m.other.USER_DEFINED_PLAN).toBe('demo');
  });
  it('both manoeuvres with their own comments', () => {
    expect(m.manoeuvres.map((x) => x.refFrame)).toEqual(['EME2000', 'RTN']);
    expect(m.manoeuvres[0]!.durationS).toBe(132.6);
    expect(m.manoeuvres[0]!.comments).toEqual(['First burn: finite, inertial frame']);
    expect(m.manoeuvres[1]!.dvKmS).toEqual([0.000015, -0.0001873, 0]);
    expect(m.manoeuvres[1]!.line).toBe(44);
  });
});

describe('malformed OPM: FILE:LINE and a typed code', () => {
  const good = formatOpmKvn(sample()).split('\n');
  const lineOf = (key: string) => good.findIndex((l) => l.startsWith(`${key} `)) + 1;
  const cases: [string, (lines: string[]) => string[], string, number | (() => number), RegExp][] = [
    ['a manoeuvre missing MAN_DV_3', (l) => l.filter((x) => !x.startsWith('MAN_DV_3')), 'OPM_MISSING_KEYWORD', () => lineOf('MAN_EPOCH_IGNITION'), /MAN_DV_3/],
    ['manoeuvre keywords out of order', (l) => swap(l, lineOf('MAN_DURATION') - 1, lineOf('MAN_DELTA_MASS') - 1), 'OPM_STRUCTURE', () => lineOf('MAN_DURATION'), /out of order/],
    ['a number that is not one', (l) => l.map((x) => (x.startsWith('Y ') ? 'Y = 12.3.4 [km]' : x)), 'OPM_FIELD', () => lineOf('Y'), /not a number/],
    ['a wrong unit', (l) => l.map((x) => (x.startsWith('X_DOT') ? 'X_DOT = 1.5 [m/s]' : x)), 'OPM_FIELD', () => lineOf('X_DOT'), /\[km\/s\]/],
    ['an unknown keyword', (l) => [...l.slice(0, 5), 'OBJECT_COLOUR = blue', ...l.slice(5)], 'OPM_FIELD', 6, /unknown keyword OBJECT_COLOUR/],
    ['not an OPM', (l) => ['CCSDS_OEM_VERS = 2.0', ...l.slice(1)], 'OPM_STRUCTURE', 1, /CCSDS_OPM_VERS/],
    ['the state vector missing Z', (l) => l.filter((x) => !x.startsWith('Z ')), 'OPM_MISSING_KEYWORD', 1, /Z is missing/],
    ['a time system other than UTC', (l) => l.map((x) => (x.startsWith('TIME_SYSTEM') ? 'TIME_SYSTEM = TAI' : x)), 'OPM_FIELD', () => lineOf('TIME_SYSTEM'), /UTC/],
    ['a positive mass change', (l) => l.map((x) => (x.startsWith('MAN_DELTA_MASS') ? 'MAN_DELTA_MASS = 0.5 [kg]' : x)), 'OPM_FIELD', () => lineOf('MAN_DELTA_MASS'), /positive/],
    ['a bad epoch', (l) => l.map((x) => (x.startsWith('EPOCH') ? 'EPOCH = 2026-13-45T99:00:00' : x)), 'OPM_FIELD', () => lineOf('EPOCH'), /CCSDS time/],
    ['a line that is not KEYWORD = value', (l) => [...l.slice(0, 3), 'this is not kvn', ...l.slice(3)], 'OPM_FIELD', 4, /KEYWORD = value/],
    ['a duplicate keyword', (l) => [...l, 'OBJECT_NAME = AGAIN'], 'OPM_FIELD', () => good.length + 1, /twice/],
  ];
  for (const [label, edit, code, line, message] of cases)
    it(label, () => {
      let caught: unknown;
      try {
        parseOpmKvn(edit([...good]).join('\n'), 'bad.opm');
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(KeepclearError);
      const e = caught as KeepclearError;
      const want = typeof line === 'function' ? line() : line;
      expect(e.code).toBe(code);
      expect(e.where).toEqual({ file: 'bad.opm', line: want });
      expect(e.toLine()).toMatch(new RegExp(`^bad\\.opm:${want}: `));
      expect(e.message).toMatch(message);
    });
});

function swap(l: string[], i: number, j: number): string[] {
  const out = [...l];
  [out[i], out[j]] = [out[j]!, out[i]!];
  return out;
}
