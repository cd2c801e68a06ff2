/**
 * The 3-D view's scene data (core/scene): the encounter in the primary's RTN frame, covariance
 * ellipsoids from the eigen-decomposition, orbits and catalogue around TCA. Geometries are built
 * from straight-line trajectories so every expected value is worked by hand (sources beside each).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { Encounter, Matrix3, RiskAssessment } from '../core/events/index.js';
import { StraightLineTrajectory } from '../core/propagation/straightLine.js';
import type { FailureReason, Trajectory } from '../core/propagation/trajectory.js';
import { covarianceEllipsoid, reframeCovariance, rtnAxes } from '../core/scene/ellipsoid.js';
import { buildEncounterScene, relativeSampleTimes, trackPointAt } from '../core/scene/encounterScene.js';
import { parseIso, type Instant } from '../core/time/instant.js';
import { MU_EARTH_WGS84 } from '../core/units.js';

const TCA = parseIso('2026-12-07T10:00:00.000Z')!;
/** Doubles through a few products and square roots: rounding only. */
const ROUND_TOL = 1e-9;

function encounter(p: StraightLineTrajectory, s: StraightLineTrajectory): Encounter {
  const st = (t: StraightLineTrajectory) => [...t.r0, ...t.v] as unknown as Encounter['primaryState'];
  return {
    primary: p.objectId, secondary: s.objectId, tca: TCA, missKm: 0, relativeSpeedKmS: 0, rtnKm: [0, 0, 0],
    approachAngleDeg: 0, entry: null, exit: null, primaryState: st(p), secondaryState: st(s), primaryEpoch: TCA, secondaryEpoch: TCA,
  };
}

/** A trajectory that always fails, like a decayed object. */
class Failing implements Trajectory {
  readonly span = null;
  constructor(readonly objectId: string) {}
  stateInto(): FailureReason | null {
    return 'decayed';
  }
}

const close = (a: readonly number[], b: readonly number[], tol: number) =>
  a.forEach((x, i) => expect(Math.abs(x - b[i]!), `component ${i}: ${x} vs ${b[i]}`).toBeLessThan(tol));

describe('encounter in the primary RTN frame (DESIGN.md: R = r/|r|, N = r×v/|r×v|, T = N×R; secondary − primary)', () => {
  // Primary at (0, 7000, 0) km moving +z: R = ŷ, N = r×v ∝ x̂, T = N×R = ẑ (hand).
  const primary = new StraightLineTrajectory('100001', TCA, [0, 7000, 0], [0, 0, 7.5]);
  // Secondary offset (1, 2, 3) km, moving +x: RTN offset = (Δy, Δz, Δx) = (2, 3, 1) km.
  const secondary = new StraightLineTrajectory('330001', TCA, [1, 7002, 3], [7.5, 0, 0]);
  const scene = buildEncounterScene({ event: encounter(primary, secondary), primary, secondary, relativeSpanS: 80, relativeSamples: 5 });

  it('relative position and velocity at TCA (hand values)', () => {
    close(scene.relative.tcaRtnKm, [2, 3, 1], ROUND_TOL);
    // Δv = (7.5, 0, −7.5): R = Δv·ŷ = 0, T = Δv·ẑ = −7.5, N = Δv·x̂ = 7.5
    close(scene.relative.relativeVelocityRtnKmS, [0, -7.5, 7.5], ROUND_TOL);
    expect(Math.abs(scene.relative.missKm - Math.sqrt(14))).toBeLessThan(ROUND_TOL);
    expect(Math.abs(scene.relative.relativeSpeedKmS - 7.5 * Math.SQRT2)).toBeLessThan(ROUND_TOL);
  });

  it('the track uses the primary frame of each instant (hand values at t = +10 s)', () => {
    // Samples 80·u³ for u = −1, −½, 0, ½, 1 → −80, −10, 0, 10, 80 s.
    expect(scene.relative.timesS).toEqual([-80, -10, 0, 10, 80]);
    // At +10 s: primary (0, 7000, 75), secondary (76, 7002, 3) → d = (76, 2, −72).
    // R = (0, 7000, 75)/|r|, N = x̂, T = N×R = (0, −75, 7000)/|r|.
    const r = Math.hypot(7000, 75);
    const expected = [(2 * 7000 - 72 * 75) / r, (-2 * 75 - 72 * 7000) / r, 76];
    close(scene.relative.rtnKm.slice(9, 12), expected, ROUND_TOL);
    close(trackPointAt(scene.relative.timesS, scene.relative.rtnKm, 10), expected, ROUND_TOL);
  });

  it('orbits span one revolution centred on TCA (period by vis-viva) and pass through the TCA state', () => {
    // vis-viva: 1/a = 2/r − v²/μ; T = 2π √(a³/μ) (any orbital mechanics text, e.g. Vallado §1.3)
    const a = 1 / (2 / 7000 - 7.5 ** 2 / MU_EARTH_WGS84);
    const period = 2 * Math.PI * Math.sqrt(a ** 3 / MU_EARTH_WGS84);
    const t = scene.primary.timesS;
    expect(Math.abs(t[0]! + period / 2)).toBeLessThan(1e-6);
    expect(Math.abs(t[t.length - 1]! - period / 2)).toBeLessThan(1e-6);
    const mid = t.indexOf(0);
    expect(mid).toBeGreaterThan(0);
    close(scene.primary.positionsTemeKm.slice(3 * mid, 3 * mid + 3), [0, 7000, 0], ROUND_TOL);
    close(trackPointAt(scene.secondary.timesS, scene.secondary.positionsTemeKm, 0), [1, 7002, 3], 1e-6);
  });

  it('is plain data: survives JSON and structured clone unchanged', () => {
    expect(JSON.parse(JSON.stringify(scene))).toEqual(scene);
    expect(structuredClone(scene)).toEqual(scene);
  });
});

describe('covariance ellipsoids (eigen-decomposition of the 3×3 position covariance)', () => {
  it('hand example: [[4,2,0],[2,4,0],[0,0,9]] has eigenvalues 9, 6, 2', () => {
    // (4 − λ)² − 4 = 0 → λ = 6, 2 in the R–T block (eigenvectors (1, ±1, 0)/√2); 9 along N. Hand.
    const e = covarianceEllipsoid([[4, 2, 0], [2, 4, 0], [0, 0, 9]]);
    close(e.sigmaM, [3, Math.sqrt(6), Math.sqrt(2)], ROUND_TOL);
    const s = Math.SQRT1_2;
    close(e.axesRtn[0].map(Math.abs), [0, 0, 1], ROUND_TOL);
    close(e.axesRtn[1].map(Math.abs), [s, s, 0], ROUND_TOL);
    expect(Math.sign(e.axesRtn[2][0])).toBe(-Math.sign(e.axesRtn[2][1])); // (1, −1, 0)/√2 up to sign
  });

  it('agrees with numpy.linalg.eigh on random RTN-sized covariances (test/authorities/scene-ellipsoid)', () => {
    const fx = JSON.parse(readFileSync(join(__dirname, 'authorities/scene-ellipsoid/fixture.json'), 'utf8')) as {
      cases: { covM2: Matrix3; eigenvaluesDescendingM2: number[]; eigenvectorsRows: number[][] }[];
    };
    expect(fx.cases.length).toBeGreaterThanOrEqual(4);
    for (const c of fx.cases) {
      const e = covarianceEllipsoid(c.covM2);
      // Jacobi vs LAPACK: both backward stable; relative agreement to 1e-9 of the largest eigenvalue.
      const lmax = c.eigenvaluesDescendingM2[0]!;
      close(e.sigmaM.map((x) => x * x / lmax), c.eigenvaluesDescendingM2.map((x) => x / lmax), 1e-9);
      for (let k = 0; k < 3; k++) {
        const d = e.axesRtn[k]!.reduce((acc, x, i) => acc + x * c.eigenvectorsRows[k]![i]!, 0);
        expect(Math.abs(Math.abs(d) - 1)).toBeLessThan(1e-8); // same axis, sign free
      }
    }
  });

  it('axes form a right-handed frame (usable as a rotation by the renderer)', () => {
    const e = covarianceEllipsoid([[2500, 300, -40], [300, 640000, 900], [-40, 900, 400]]);
    const [a, b, c] = e.axesRtn;
    close([a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]], c, 1e-12);
  });

  it('refuses a matrix that is not a covariance', () => {
    expect(() => covarianceEllipsoid([[1, 0, 0], [0, -4, 0], [0, 0, 1]])).toThrow(/not positive semi-definite.*-4/);
  });

  it("the secondary's covariance is turned into the primary's RTN frame; combined = sum (hand values)", () => {
    // Primary at (7000, 0, 0) moving +y: R = x̂, T = ŷ, N = ẑ. Secondary at (7001, 0, 0) moving +z:
    // R = x̂, N = x̂ × ẑ = −ŷ, T = N × R = ẑ. So its (σR², σT², σN²) = (1, 100, 4) reads in the
    // primary's frame as R: 1, T (= its −N): 4, N (= its T): 100. Hand.
    const primary = new StraightLineTrajectory('100001', TCA, [7000, 0, 0], [0, 7.5, 0]);
    const secondary = new StraightLineTrajectory('330001', TCA, [7001, 0, 0], [0, 0, 7.5]);
    close(rtnAxes([7001, 0, 0, 0, 0, 7.5]).flat(), [1, 0, 0, 0, 0, 1, 0, -1, 0], ROUND_TOL);
    const scene = buildEncounterScene({
      event: encounter(primary, secondary), primary, secondary,
      covariances: { primaryRtnM2: [[9, 0, 0], [0, 25, 0], [0, 0, 16]], secondaryRtnM2: [[1, 0, 0], [0, 100, 0], [0, 0, 4]] },
      hardBodyRadiusM: 12,
    });
    close(scene.covariance.secondary!.covRtnM2.flat(), [1, 0, 0, 0, 4, 0, 0, 0, 100], ROUND_TOL);
    close(scene.covariance.combined!.covRtnM2.flat(), [10, 0, 0, 0, 29, 0, 0, 0, 116], ROUND_TOL);
    close(scene.covariance.combined!.sigmaM, [Math.sqrt(116), Math.sqrt(29), Math.sqrt(10)], ROUND_TOL);
    close(scene.covariance.primary!.sigmaM, [5, 4, 3], ROUND_TOL);
    close(scene.relative.tcaRtnKm, [1, 0, 0], ROUND_TOL);
    expect(scene.hardBodyRadiusM).toBe(12);
    expect(scene.hardBodyRadiusIsDefault).toBe(false);
  });

  it('reframing between equal frames is the identity; between swapped axes permutes entries', () => {
    const cov: Matrix3 = [[1, 2, 3], [2, 5, 6], [3, 6, 9]];
    const I = [[1, 0, 0], [0, 1, 0], [0, 0, 1]] as const;
    close(reframeCovariance(cov, I, I).flat(), cov.flat(), 1e-15);
    // to-frame rows (ŷ, x̂, ẑ): first and second indices swap
    close(reframeCovariance(cov, I, [[0, 1, 0], [1, 0, 0], [0, 0, 1]]).flat(), [5, 2, 6, 2, 1, 3, 6, 3, 9], 1e-15);
  });
});

describe('scene contents from the event', () => {
  const primary = new StraightLineTrajectory('100001', TCA, [7000, 0, 0], [0, 7.5, 0]);
  const secondary = new StraightLineTrajectory('330001', TCA, [7000, 0.3, 0.4], [0, 0, 7.5]);
  const risk: RiskAssessment = {
    pc: 2.5e-4, pcMethod: '2d-reference', covarianceSource: 'cdm / default(LEO, age 1.0 d)', hardBodyRadiusM: 7.5, tier: 'plan', warnings: [],
    detail: {
      primaryCovRtnM2: [[400, 0, 0], [0, 90000, 0], [0, 0, 900]],
      secondaryCovRtnM2: null,
      planeMissM: [500, 0], planeCovM2: null, sigmaAlongVelocityM: null,
    },
  };

  it('takes covariance, hard-body radius, tier and Pc from the risk; skips failing catalogue objects', () => {
    const catalogue: Trajectory[] = [
      new StraightLineTrajectory('110001', TCA, [0, 8000, 0], [0, 0, 7]),
      new Failing('110002'),
      new StraightLineTrajectory('110003', TCA, [-42164.0004567, 0.0126, 0], [0, -3.07, 0]),
    ];
    const scene = buildEncounterScene({ event: { ...encounter(primary, secondary), id: 'R1-1', risk }, primary, secondary, catalogue });
    expect(scene.eventId).toBe('R1-1');
    // positions rounded to the metre
    expect(scene.catalogue).toEqual({ count: 2, positionsTemeKm: [0, 8000, 0, -42164, 0.013, 0], failed: 1 });
    close(scene.covariance.primary!.sigmaM, [300, 30, 20], ROUND_TOL);
    expect(scene.covariance.secondary).toBeNull();
    expect(scene.covariance.combined).toBeNull();
    expect(scene.hardBodyRadiusM).toBe(7.5);
    expect(scene.tier).toBe('plan');
    expect(scene.pc).toBe(2.5e-4);
    expect(scene.tca).toBe('2026-12-07T10:00:00.000Z');
  });

  it('a primary without a state at TCA is a typed error naming it', () => {
    expect(() => buildEncounterScene({ event: encounter(primary, secondary), primary: new Failing('100001') as Trajectory, secondary })).toThrow(
      /primary 100001 has no state at TCA 2026-12-07T10:00:00.000Z \(decayed\)/,
    );
  });

  it('Earth orientation: GMST at TCA (Vallado, Fundamentals 4th ed., Example 3-5: 1992-08-20 12:14 UT1 → 152.578788°, from memory)', () => {
    const t = parseIso('1992-08-20T12:14:00.000Z')! as Instant;
    const p = new StraightLineTrajectory('1', t, [7000, 0, 0], [0, 7.5, 0]);
    const scene = buildEncounterScene({ event: { ...encounter(p, p), tca: t }, primary: p, secondary: p, orbitSamples: 3, relativeSamples: 3 });
    // UT1 − UTC (≈ −0.5 s in 1992) is ignored here: 0.5 s of rotation is 0.002°.
    expect(Math.abs((scene.earth.gmstAtTcaRad * 180) / Math.PI - 152.578788)).toBeLessThan(0.01);
    expect(scene.earth.equatorialRadiusKm).toBe(6378.137); // WGS-84 (NIMA TR8350.2)
    expect(Math.abs(1 / scene.earth.flattening - 298.257223563)).toBeLessThan(1e-9);
  });

  it('relative sample times are symmetric, include TCA and are densest near it', () => {
    const t = relativeSampleTimes(300, 241);
    expect(t.length).toBe(241);
    expect(t[120]).toBe(0);
    expect(t[0]).toBe(-300);
    expect(t[240]).toBe(300);
    expect(t[121]! - t[120]!).toBeLessThan(0.001); // 300/120³ s
    expect(t[240]! - t[239]!).toBeGreaterThan(7);
  });
});
