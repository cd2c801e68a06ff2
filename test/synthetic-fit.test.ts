import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { KeepclearError } from '../core/errors.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { fitElementSetToState } from '../core/synthetic/fit.js';
import { MS_PER_DAY, parseIso, type Instant } from '../core/time/instant.js';

/** The fitter's contract: SGP4 of the fitted set reproduces the target within these. */
const POSITION_TOL_KM = 1e-3; // 1 m
const VELOCITY_TOL_KMS = 1e-6; // 1 mm/s

const EPOCH = parseIso('2026-12-05T06:00:00.000Z')!;
const base: ElementSet = {
  objectId: '42', name: 'TEST', intlDesignator: null, classification: 'U', epoch: EPOCH,
  meanMotionRevPerDay: 15.2, eccentricity: 0.0012, inclinationDeg: 53, raanDeg: 120, argPerigeeDeg: 80,
  meanAnomalyDeg: 200, bstar: 2e-4, meanMotionDot: 0, meanMotionDdot: 0, elementSetNo: 1,
  revAtEpoch: 0, ephemerisType: 0, source: { file: 'test', line: 1, format: 'SYNTHETIC' },
};

/** Hand-picked sets covering the regimes: drag-heavy LEO, sun-synchronous, GEO, GTO, 12-hour HEO. */
const CASES: [string, Partial<ElementSet>][] = [
  ['LEO 53° with drag', {}],
  ['low LEO, strong drag', { meanMotionRevPerDay: 15.9, eccentricity: 0.0005, bstar: 6e-4 }],
  ['sun-synchronous', { meanMotionRevPerDay: 14.6, inclinationDeg: 98.2, eccentricity: 0.0009, bstar: 5e-5 }],
  ['near-circular, ω and M not separable', { eccentricity: 2e-6 }],
  ['GEO (deep space)', { meanMotionRevPerDay: 1.0027, eccentricity: 0.0002, inclinationDeg: 0.05, bstar: 0 }],
  ['GTO (deep space, eccentric)', { meanMotionRevPerDay: 2.25, eccentricity: 0.73, inclinationDeg: 27, bstar: 3e-5 }],
  ['Molniya-like HEO', { meanMotionRevPerDay: 2.0056, eccentricity: 0.72, inclinationDeg: 63.4, argPerigeeDeg: 270, bstar: 1e-5 }],
];

function stateOf(es: ElementSet, t: Instant): { r: number[]; v: number[] } {
  const out = new Float64Array(6);
  const failure = new Sgp4Trajectory(es).stateInto(t, out, 0);
  if (failure) throw new Error(failure);
  return { r: [out[0]!, out[1]!, out[2]!], v: [out[3]!, out[4]!, out[5]!] };
}
const dist = (a: number[], b: number[]): number => Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!);

describe('fitElementSetToState', () => {
  for (const [label, change] of CASES)
    for (const spanDays of [0, 1.7, 6.3]) {
      it(`${label}: recovers a state ${spanDays} days after the fit epoch`, () => {
        const truth = { ...base, ...change };
        const at = (EPOCH + spanDays * MS_PER_DAY) as Instant;
        const target = stateOf(truth, at);
        const fitted = fitElementSetToState(target, at, { objectId: '42', epoch: EPOCH, bstar: truth.bstar });
        // Checked by an independent SGP4 evaluation, not the fitter's own residual.
        const got = stateOf(fitted, at);
        expect(dist(got.r, target.r)).toBeLessThan(POSITION_TOL_KM);
        expect(dist(got.v, target.v)).toBeLessThan(VELOCITY_TOL_KMS);
        expect(fitted.epoch).toBe(EPOCH);
        // The mean elements are unique for a given B*, so the original set comes back. 1e-6
        // rev/day in n is ~0.4 m in a; near-circular orbits only fix ω + M, so compare that.
        expect(Math.abs(fitted.meanMotionRevPerDay - truth.meanMotionRevPerDay)).toBeLessThan(1e-6);
        expect(Math.abs(fitted.eccentricity - truth.eccentricity)).toBeLessThan(1e-6);
        expect(Math.abs(fitted.inclinationDeg - truth.inclinationDeg)).toBeLessThan(1e-5);
        const u = (es: ElementSet): number => es.raanDeg + es.argPerigeeDeg + es.meanAnomalyDeg;
        const du = ((u(fitted) - u(truth)) % 360 + 540) % 360 - 180;
        expect(Math.abs(du)).toBeLessThan(1e-5);
      });
    }

  it('fits an arbitrary state (not made by SGP4) and keeps the template fields', () => {
    // A circular 700 km equatorial-ish orbit written down directly: r along x, v along y/z.
    const r = 6378.135 + 700, v = Math.sqrt(398600.8 / r);
    const target = { r: [r, 0, 0], v: [0, v * Math.cos(0.3), v * Math.sin(0.3)] };
    const at = (EPOCH + 2 * MS_PER_DAY) as Instant;
    const fitted = fitElementSetToState(target, at, { objectId: '7', name: 'HAND', epoch: EPOCH, bstar: 1e-4, elementSetNo: 55 });
    const got = stateOf(fitted, at);
    expect(dist(got.r, target.r)).toBeLessThan(POSITION_TOL_KM);
    expect(dist(got.v, target.v)).toBeLessThan(VELOCITY_TOL_KMS);
    expect([fitted.objectId, fitted.name, fitted.bstar, fitted.elementSetNo]).toEqual(['7', 'HAND', 1e-4, 55]);
  });

  it('refuses a state with no bound orbit', () => {
    const target = { r: [7000, 0, 0], v: [0, 12, 0] }; // above escape speed (≈ 10.7 km/s here)
    expect(() => fitElementSetToState(target, EPOCH, { objectId: '9', epoch: EPOCH })).toThrow(KeepclearError);
  });
});
