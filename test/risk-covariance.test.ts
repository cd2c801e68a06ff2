import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { multiply, transpose } from '../core/math/linalg.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { cdmRtnFromLowerTriangle } from '../core/risk/covarianceCdm.js';
import { rtnToInertialCov6 } from '../core/risk/frames.js';
import { defaultCovariance, regimeOf } from '../core/risk/covarianceDefault.js';
import { covarianceFromHistory, GROWTH_FLOOR_DAYS } from '../core/risk/covarianceHistory.js';
import { judgeCovariance } from '../core/risk/covariancePsd.js';
import { symmetricEigen } from '../core/math/linalg.js';
import { DEFAULT_COVARIANCE_PROVENANCE, DEFAULT_COVARIANCE_TABLE } from '../core/risk/defaultCovarianceTable.js';
import { MS_PER_DAY, parseIso, type Instant } from '../core/time/instant.js';

const close = (a: number[][], b: number[][], tol: number): void => {
  for (let i = 0; i < a.length; i++) for (let j = 0; j < a.length; j++) expect(Math.abs(a[i]![j]! - b[i]![j]!)).toBeLessThan(tol);
};

describe('one PSD policy (core/risk/covariancePsd.ts) for every covariance source', () => {
  // Q is a rotation; A = Q·diag(4, 1, λ3)·Qᵀ has eigenvalues 4, 1, λ3 by construction.
  const t = 0.6, c = Math.cos(t), s = Math.sin(t);
  const q = [[c, -s, 0], [s * 0.6, c * 0.6, -0.8], [s * 0.8, c * 0.8, 0.6]];
  const build = (l3: number) => multiply(multiply(q, [[4, 0, 0], [0, 1, 0], [0, 0, l3]]), transpose(q));
  it('slightly indefinite (rounding-sized) → repaired to a PSD matrix next to it (Higham 1988 on the correlation-scaled matrix)', () => {
    const r = judgeCovariance(build(-1e-5), 'test');
    expect(r.status).toBe('repaired');
    expect(symmetricEigen(r.usable!).values[0]!).toBeGreaterThan(-1e-12);
    close(r.usable!, build(-1e-5), 1e-4); // the clipped eigenvalue was 1e-5
    expect(r.note).toMatch(/repaired to nearest PSD/);
  });
  it('clearly indefinite → refused with the eigenvalue named; a proper covariance → used as is', () => {
    const bad = judgeCovariance(build(-0.1), 'primary history');
    expect(bad.status).toBe('not-psd');
    expect(bad.usable).toBeNull();
    expect(bad.note).toMatch(/primary history 3×3 covariance is not positive semi-definite: smallest eigenvalue -/);
    expect(judgeCovariance(build(0.5), 'test')).toEqual({ status: 'psd', usable: build(0.5) });
  });
  it('an all-zero position block is refused, not computed with', () => {
    const z = Array.from({ length: 6 }, (_, i) => Array.from({ length: 6 }, (_, j) => (i === j && i >= 3 ? 1e-4 : 0)));
    const v = judgeCovariance(z, 'OBJECT2');
    expect(v.status).toBe('zero');
    expect(v.usable).toBeNull();
    expect(v.note).toMatch(/OBJECT2 covariance has an all-zero position block/);
  });
  it('non-finite or asymmetric → refused', () => {
    expect(judgeCovariance([[1, 0, 0], [0, NaN, 0], [0, 0, 1]], 'x').status).toBe('not-psd');
    const asym = judgeCovariance([[4, 1, 0], [0.5, 4, 0], [0, 0, 4]], 'x');
    expect(asym.status).toBe('not-psd');
    expect(asym.note).toMatch(/not symmetric/);
  });
});

describe('CDM covariance (CCSDS 508.0-B-1 lower triangle, RTN) → inertial', () => {
  it('lower triangle is read row by row into a symmetric 6×6', () => {
    const m = cdmRtnFromLowerTriangle(Array.from({ length: 21 }, (_, k) => k + 1));
    expect(m[0]![0]).toBe(1);
    expect(m[1]![0]).toBe(2);
    expect(m[0]![1]).toBe(2);
    expect(m[2]![2]).toBe(6);
    expect(m[5]![5]).toBe(21);
  });
  it('inclined circular orbit at the node: T and N mix by the inclination; ω×r gives the velocity block (hand-computed)', () => {
    const i = 0.9, sr = 100, st = 1000, sn = 300;
    const rtn6 = cdmRtnFromLowerTriangle([sr ** 2, 0, st ** 2, 0, 0, sn ** 2, ...new Array<number>(15).fill(0)]);
    const r = 7000, v = 7.5; // km, km/s
    const cov = rtnToInertialCov6(rtn6, [r, 0, 0], [0, v * Math.cos(i), v * Math.sin(i)]);
    const ci = Math.cos(i), si = Math.sin(i);
    const expected = [
      [sr ** 2, 0, 0],
      [0, st ** 2 * ci * ci + sn ** 2 * si * si, (st ** 2 - sn ** 2) * ci * si],
      [0, (st ** 2 - sn ** 2) * ci * si, st ** 2 * si * si + sn ** 2 * ci * ci],
    ];
    close(cov.slice(0, 3).map((row) => row.slice(0, 3)), expected, 1e-8);
    // Zero velocity variance in the rotating frame: δv = ω×δr with ω = (v/r)·N, N = (0, −sin i, cos i).
    // A radial error moves with the frame along T̂ = (0, cos i, sin i); an along-track error along
    // N×T̂ = −R̂; a cross-track one not at all. So Cvv = w²(σR²·T̂T̂ᵀ + σT²·R̂R̂ᵀ), Crv = w(σR²·R̂T̂ᵀ − σT²·T̂R̂ᵀ).
    const w = v / r; // 1/s
    const T = [0, ci, si], R = [1, 0, 0];
    const vv = [0, 1, 2].map((a) => [0, 1, 2].map((b) => w * w * (sr ** 2 * T[a]! * T[b]! + st ** 2 * R[a]! * R[b]!)));
    const rv = [0, 1, 2].map((a) => [0, 1, 2].map((b) => w * (sr ** 2 * R[a]! * T[b]! - st ** 2 * T[a]! * R[b]!)));
    close(cov.slice(3, 6).map((row) => row.slice(3, 6)), vv, 1e-12);
    close(cov.slice(0, 3).map((row) => row.slice(3, 6)), rv, 1e-10);
  });
});

describe('default covariance table', () => {
  it('is labelled with its provenance, value by value', () => {
    expect(DEFAULT_COVARIANCE_PROVENANCE).toMatch(/Levit & Marshall 2011.*Riesing 2015.*from memory/);
    for (const r of ['MEO', 'GEO', 'HEO'] as const) expect(DEFAULT_COVARIANCE_TABLE[r].provenance).toMatch(/^from memory/);
  });
  it('LEO-low along-track σ against Riesing 2015 (SSC15-VIII-5, abstract; test/authorities/tle-accuracy)', () => {
    // "1-σ in-track propagation error after one day ranges from 10-30 km ..., two-day 20-70 km"
    const one = defaultCovariance('LEO-low', 1).sigmaM[1], two = defaultCovariance('LEO-low', 2).sigmaM[1];
    expect(one).toBeGreaterThanOrEqual(10_000);
    expect(one).toBeLessThanOrEqual(30_000);
    expect(two).toBeGreaterThanOrEqual(20_000);
    expect(two).toBeLessThanOrEqual(70_000);
  });
  it('LEO along-track growth against Levit & Marshall 2011 (Adv. Space Res. 47, abstract)', () => {
    // "range error ... increases at a typical rate of 100 meters per day, approximately a 10-fold
    // improvement over individual TLE's propagated with ... SGP4": a single TLE ≈ 1 km/day.
    const growth = defaultCovariance('LEO', 11).sigmaM[1] - defaultCovariance('LEO', 10).sigmaM[1];
    expect(growth / (10 * 100)).toBeGreaterThan(0.9);
    expect(growth / (10 * 100)).toBeLessThan(1.1);
  });
  it('regimes by mean motion and eccentricity', () => {
    expect(regimeOf({ meanMotionRevPerDay: 15.5, eccentricity: 0.0005 })).toBe('LEO-low'); // ~420 km
    expect(regimeOf({ meanMotionRevPerDay: 14.2, eccentricity: 0.001 })).toBe('LEO'); // ~800 km
    expect(regimeOf({ meanMotionRevPerDay: 2.005, eccentricity: 0.01 })).toBe('MEO'); // GNSS
    expect(regimeOf({ meanMotionRevPerDay: 1.0027, eccentricity: 0.0002 })).toBe('GEO');
    expect(regimeOf({ meanMotionRevPerDay: 2.006, eccentricity: 0.72 })).toBe('HEO'); // Molniya-type
  });
  it('grows as √(σ₀² + (g·age)²), named in the source string', () => {
    const row = DEFAULT_COVARIANCE_TABLE.LEO;
    const d2 = defaultCovariance('LEO', 2);
    for (let i = 0; i < 3; i++) {
      const expected = Math.sqrt(row.atEpochM[i]! ** 2 + (2 * row.growthMPerDay[i]!) ** 2);
      expect(d2.sigmaM[i]).toBeCloseTo(expected, 9);
      expect(d2.rtnM2[i]![i]).toBeCloseTo(expected ** 2, 6);
    }
    expect(d2.source).toBe('default(LEO, age 2.0 d)');
  });
});

describe('covarianceFromHistory on a synthetic history with a known perturbation', () => {
  const epochN = parseIso('2026-03-01T00:00:00Z')!;
  const base: ElementSet = {
    objectId: '90001', name: 'SYNTH', intlDesignator: null, classification: 'U', epoch: epochN,
    meanMotionRevPerDay: 14.8, eccentricity: 0.0008, inclinationDeg: 53, raanDeg: 120, argPerigeeDeg: 80, meanAnomalyDeg: 200,
    bstar: 0, meanMotionDot: 0, meanMotionDdot: 0, elementSetNo: 1, revAtEpoch: 1, ephemerisType: 0,
    source: { file: 'synthetic', line: 1, format: 'SYNTHETIC' },
  };
  // With B* = 0 SGP4's secular motion is linear (mdot, argpdot, nodedot, from satellite.js), so
  // stepping those back by Δt gives an older set that propagates onto the newest one; then we add
  // a known error: mean anomaly σ_M (along-track ≈ a·σ_M) and inclination σ_i (cross-track).
  const sat = new Sgp4Trajectory(base).satrec;
  const aKm = Math.cbrt(398600.8 / ((14.8 * 2 * Math.PI) / 86400) ** 2);
  const sigmaMDeg = 0.01, sigmaIDeg = 0.001;
  // Fixed pseudo-normal draws (seeded offline, here verbatim) so the test is deterministic.
  const zM = [0.82, -1.31, 0.44, -0.27, 1.65, -0.93, 0.12, -1.08];
  const zI = [-0.55, 1.12, 0.31, -1.41, 0.78, -0.06, 1.25, -0.69];
  const older: ElementSet[] = zM.map((z, k) => {
    const dtMin = (8 - k) * 0.5 * 1440; // 4 d … 0.5 d before the newest
    const deg = (x: number) => (x * 180) / Math.PI;
    return {
      ...base,
      epoch: (epochN - dtMin * 60_000) as Instant,
      meanAnomalyDeg: base.meanAnomalyDeg - deg(sat.mdot * dtMin) + sigmaMDeg * z,
      argPerigeeDeg: base.argPerigeeDeg - deg(sat.argpdot * dtMin),
      raanDeg: base.raanDeg - deg(sat.nodedot * dtMin),
      inclinationDeg: base.inclinationDeg + sigmaIDeg * zI[k]!,
    };
  });
  const history = [...older, base];

  it('needs at least 3 older sets', () => {
    expect(covarianceFromHistory([older[0]!, older[1]!, base], epochN)).toBeNull();
  });
  it('recovers along-track dominance and the order of magnitude of each axis', () => {
    const h = covarianceFromHistory(history, epochN)!;
    expect(h.source).toBe('history(n=8)');
    const [sr, st, sn] = [0, 1, 2].map((i) => Math.sqrt(h.sampleRtnM2[i]![i]!)) as [number, number, number];
    const rad = Math.PI / 180;
    const rmsM = Math.sqrt(zM.reduce((s, z) => s + z * z, 0) / zM.length);
    const rmsI = Math.sqrt(zI.reduce((s, z) => s + z * z, 0) / zI.length);
    const expT = aKm * 1000 * sigmaMDeg * rad * rmsM; // along-track = a·δM
    const expN = (aKm * 1000 * sigmaIDeg * rad * rmsI) / Math.SQRT2; // a·δi·sin(u), rms over u
    // Factor-of-2 band: the secular rates are stepped with SGP4's own rates, but δi also moves
    // the J2 rates slightly and four phases sample sin(u) coarsely.
    expect(st / expT).toBeGreaterThan(0.5);
    expect(st / expT).toBeLessThan(2);
    expect(sn / expN).toBeGreaterThan(0.5);
    expect(sn / expN).toBeLessThan(2);
    expect(st).toBeGreaterThan(5 * sn);
    expect(st).toBeGreaterThan(5 * sr);
  });
  it('grows the along-track variance by ((floor + age)/(floor + mean span))²', () => {
    const at = (epochN + 3 * MS_PER_DAY) as Instant;
    const h = covarianceFromHistory(history, at)!;
    const g = (GROWTH_FLOOR_DAYS + 3) / (GROWTH_FLOOR_DAYS + 2.25); // mean span of 0.5…4 d = 2.25 d
    expect(h.meanSpanDays).toBeCloseTo(2.25, 9);
    expect(h.rtnM2[1]![1]! / h.sampleRtnM2[1]![1]!).toBeCloseTo(g * g, 9);
    expect(h.rtnM2[0]![0]!).toBeCloseTo(h.sampleRtnM2[0]![0]!, 6);
  });
});
