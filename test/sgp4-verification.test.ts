/**
 * SGP4/SDP4 against the published verification vectors: Vallado, Crawford, Hujsak, Kelso,
 * "Revisiting Spacetrack Report #3", AIAA 2006-6753 — SGP4-VER.TLE (33 element sets) and
 * tcppver.out (output of the reference C++ code), copied verbatim into
 * test/authorities/sgp4-verification/ (see README.md there).
 * Where a set stops with an SGP4 error, the code comes from python-sgp4 2.15
 * (error_codes.json, made by make_error_codes.py in the same folder).
 *
 * Path under test: TLE text → parseTle → ElementSet → Sgp4Trajectory.stateAtMinutesInto.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseTle } from '../core/formats/tle/index.js';
import { reasonForSgp4Code, Sgp4Trajectory } from '../core/propagation/sgp4.js';
import type { ElementSet } from '../core/elements/elementSet.js';
import type { Instant } from '../core/time/instant.js';
import { verificationRecords, withChecksum } from './support/verificationSets.js';

const DIR = new URL('./authorities/sgp4-verification/', import.meta.url);
const read = (name: string): string => readFileSync(new URL(name, DIR), 'utf8');

// Required by the brief: exact propagation. tcppver.out prints 8 decimals of km (1e-5 mm)
// and 9 decimals of km/s, so 1 mm leaves room only for arithmetic-order differences.
const POS_TOL_KM = 1e-6; // km: 1 mm
const VEL_TOL_KMS = 1e-6; // km/s: 1 mm/s

/** tcppver.out blocks in file order: header "<satnum> xx", then rows of t, r(3), v(3). */
function readReference(): { satnum: string; rows: number[][] }[] {
  const blocks: { satnum: string; rows: number[][] }[] = [];
  for (const line of read('tcppver.out').split(/\r?\n/)) {
    const f = line.trim().split(/\s+/);
    if (f[0] === '') continue;
    if (f[1] === 'xx') blocks.push({ satnum: f[0]!, rows: [] });
    else blocks.at(-1)!.rows.push(f.slice(0, 7).map(Number));
  }
  return blocks;
}

interface ErrorFixture {
  sets: { satnum: number; stopsAt: number | null; error: number; lastGood: number | null }[];
  initCases: {
    name: string; epochDays1950: number; bstar: number; ecco: number; argpoRad: number;
    incloRad: number; moRad: number; noRadPerMin: number; nodeoRad: number; error: number;
  }[];
}

const records = verificationRecords();
const reference = readReference();
const fixture = JSON.parse(read('error_codes.json')) as ErrorFixture;
const repaired = records.filter((r) => withChecksum(r.line1) !== r.line1).map((r) => r.line1.slice(2, 7));
const text = records.map((r) => `${withChecksum(r.line1)}\n${withChecksum(r.line2)}`).join('\n');
const parsed = parseTle(text, 'SGP4-VER.TLE');

describe('SGP4 verification set (Vallado et al. 2006, AIAA 2006-6753)', () => {
  it('has 33 element sets, 33 reference blocks, and parses all of them', () => {
    expect(records).toHaveLength(33);
    expect(reference).toHaveLength(33);
    expect(repaired).toEqual(['33333', '33334', '33335']); // python-sgp4 tests.py, see withChecksum
    expect(parsed.rejections).toEqual([]);
    expect(parsed.sets).toHaveLength(33);
    expect(fixture.sets).toHaveLength(33);
  });

  let worstPos = 0, worstVel = 0, worstPosAt = '', worstVelAt = '';
  let compared = 0;
  parsed.sets.forEach((set, i) => {
    const block = reference[i]!;
    const expected = fixture.sets[i]!;
    const rec = records[i]!;
    it(`set ${i + 1}: ${block.satnum} matches every reference step`, () => {
      expect(set.objectId).toBe(block.satnum);
      expect(expected.satnum).toBe(Number(block.satnum));
      const traj = new Sgp4Trajectory(set);
      // 33334's only row repeats 33333's last line: the reference driver printed a stale
      // buffer when SGP4 failed at t = 0 (python-sgp4 tests.py "Use previous data line").
      const rows = expected.stopsAt === 0 ? [] : block.rows;
      const out = new Float64Array(6);
      for (const row of rows) {
        const t = row[0]!;
        expect(traj.stateAtMinutesInto(t, out, 0), `${block.satnum} at ${t} min`).toBeNull();
        const dr = Math.hypot(out[0]! - row[1]!, out[1]! - row[2]!, out[2]! - row[3]!);
        const dv = Math.hypot(out[3]! - row[4]!, out[4]! - row[5]!, out[5]! - row[6]!);
        if (dr > worstPos) [worstPos, worstPosAt] = [dr, `${block.satnum}@${t}`];
        if (dv > worstVel) [worstVel, worstVelAt] = [dv, `${block.satnum}@${t}`];
        compared++;
        expect(dr, `${block.satnum} position at ${t} min`).toBeLessThan(POS_TOL_KM);
        expect(dv, `${block.satnum} velocity at ${t} min`).toBeLessThan(VEL_TOL_KMS);
      }
      if (expected.error === 0) {
        // Ran to completion: the reference must end at the requested stop time.
        expect(block.rows.at(-1)![0]).toBe(rec.stop);
      } else {
        // Stopped early: reference ends at the last good step; we fail at the next one, with
        // the same SGP4 code as python-sgp4.
        if (expected.lastGood !== null) expect(block.rows.at(-1)![0]).toBeCloseTo(expected.lastGood, 9);
        const reason = traj.stateAtMinutesInto(expected.stopsAt!, out, 0);
        expect(reason).toBe(reasonForSgp4Code(expected.error));
      }
    });
  });

  it('reports the worst errors measured', () => {
    console.info(
      `SGP4 verification worst |dr| = ${(worstPos * 1e6).toFixed(3)} mm (${worstPosAt}), ` +
        `worst |dv| = ${(worstVel * 1e6).toFixed(4)} mm/s (${worstVelAt})`,
    );
    // Every reference row was compared (33334's one stale row excepted, see above) ...
    const skipped = reference.filter((_, i) => fixture.sets[i]!.stopsAt === 0).reduce((n, b) => n + b.rows.length, 0);
    expect(compared).toBe(reference.reduce((n, b) => n + b.rows.length, 0) - skipped);
    // ... and the worst of them is inside the bound each row was held to.
    expect(worstPos).toBeLessThan(POS_TOL_KM);
    expect(worstVel).toBeLessThan(VEL_TOL_KMS);
  });

  it('stops 33334 at initialisation with code 3 (python-sgp4: perturbed eccentricity)', () => {
    const traj = new Sgp4Trajectory(parsed.sets.find((s) => s.objectId === '33334')!);
    expect(traj.initFailure).toBe('bad-perturbed-eccentricity');
  });
});

/** An element set built from sgp4init arguments (rad, rad/min, days from 1949-12-31 0h). */
function fromInitArgs(c: ErrorFixture['initCases'][number]): ElementSet {
  const DEG = 180 / Math.PI;
  const base = parsed.sets[0]!;
  return {
    ...base,
    epoch: ((c.epochDays1950 - 7306) * 86_400_000) as Instant,
    bstar: c.bstar,
    eccentricity: c.ecco,
    argPerigeeDeg: c.argpoRad * DEG,
    inclinationDeg: c.incloRad * DEG,
    meanAnomalyDeg: c.moRad * DEG,
    meanMotionRevPerDay: (c.noRadPerMin * 1440) / (2 * Math.PI),
    raanDeg: c.nodeoRad * DEG,
  };
}

describe('element sets SGP4 refuses at initialisation', () => {
  for (const c of fixture.initCases)
    it(`${c.name}: code ${c.error} as python-sgp4 2.15`, () => {
      const traj = new Sgp4Trajectory(fromInitArgs(c));
      expect(traj.initFailure).toBe(reasonForSgp4Code(c.error));
    });

  // python-sgp4 2.15 (pure-Python build) raises an exception for these instead of a code;
  // SGP4's definition of code 1 is "mean eccentricity outside 0 <= e < 1" and of code 2 a
  // negative mean motion (Vallado et al. 2006, sgp4 error list). What matters for screening:
  // a reason, never a NaN state.
  const base = fixture.initCases[0]!;
  for (const [name, ecco, n, reason] of [
    ['eccentricity exactly 1', 1, 0.06, 'bad-mean-eccentricity'],
    ['eccentricity 1.2', 1.2, 0.06, 'bad-mean-eccentricity'],
    ['negative mean motion', 0.1, -0.01, 'negative-mean-motion'],
  ] as const)
    it(`${name}: ${reason}, no state`, () => {
      const traj = new Sgp4Trajectory(fromInitArgs({ ...base, ecco, noRadPerMin: n }));
      const out = new Float64Array(6);
      expect(traj.initFailure).toBe(reason);
      expect(traj.stateAtMinutesInto(0, out, 0)).toBe(reason);
    });
});
