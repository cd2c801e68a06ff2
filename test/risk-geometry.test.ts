import { describe, expect, it } from 'vitest';
import { multiply, transpose } from '../core/math/linalg.js';
import { encounterPlane } from '../core/risk/encounterPlane.js';
import { inertialToRtnCov, inertialToRtnCov6, rtnBasis, rtnToInertialCov, rtnToInertialCov6 } from '../core/risk/frames.js';
import { pc2dReference } from '../core/risk/pc2dReference.js';
import { pcMonteCarlo3d } from '../core/risk/pcMonteCarlo.js';
import { checkShortEncounter } from '../core/risk/shortEncounter.js';
import type { StateArray } from '../core/events/index.js';

/** Unit vectors built from doubles: rounding only. */
const ROUND_TOL = 1e-14;

describe('RTN frame (DESIGN.md: R = r/|r|, N = r×v/|r×v|, T = N×R)', () => {
  it('inclined circular orbit at the node: hand-computed axes', () => {
    const i = 0.9; // rad
    const b = rtnBasis([7000, 0, 0], [0, 7.5 * Math.cos(i), 7.5 * Math.sin(i)]);
    const expected = [[1, 0, 0], [0, Math.cos(i), Math.sin(i)], [0, -Math.sin(i), Math.cos(i)]];
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) expect(Math.abs(b[r]![c]! - expected[r]![c]!)).toBeLessThan(ROUND_TOL);
  });
  it('is orthonormal and right-handed for a general state', () => {
    const b = rtnBasis([-4200.5, 5100.2, 1800.7], [-3.1, -4.4, 5.2]);
    const g = multiply(b, transpose(b));
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) expect(Math.abs(g[r]![c]! - (r === c ? 1 : 0))).toBeLessThan(ROUND_TOL);
    const [R, T, N] = b as [number[], number[], number[]];
    // R × T = N for a right-handed triad
    expect(Math.abs(R[1]! * T[2]! - R[2]! * T[1]! - N[0]!)).toBeLessThan(ROUND_TOL);
  });
  it('covariance round trip RTN → inertial → RTN, 3×3 and 6×6', () => {
    const b = rtnBasis([-4200.5, 5100.2, 1800.7], [-3.1, -4.4, 5.2]);
    const c3 = [[100, 20, -5], [20, 2500, 30], [-5, 30, 400]];
    const back = inertialToRtnCov(rtnToInertialCov(c3, b), b);
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) expect(Math.abs(back[r]![c]! - c3[r]![c]!)).toBeLessThan(1e-10);
    const c6 = Array.from({ length: 6 }, (_, r) => Array.from({ length: 6 }, (_, c) => (r === c ? 10 + r : 0.1)));
    const r: [number, number, number] = [-4200.5, 5100.2, 1800.7], v: [number, number, number] = [-3.1, -4.4, 5.2];
    const back6 = inertialToRtnCov6(rtnToInertialCov6(c6, r, v), r, v);
    for (let r = 0; r < 6; r++) for (let c = 0; c < 6; c++) expect(Math.abs(back6[r]![c]! - c6[r]![c]!)).toBeLessThan(1e-12);
  });
});

describe('encounter plane on a hand-computable geometry', () => {
  // Primary moving +y, secondary moving +z, 100 m apart along x: v_rel = (0, −7.5, 7.5) km/s,
  // ẑ = (0, −1, 1)/√2, x̂ = (1, 0, 0), ŷ = ẑ × x̂ = (0, 1, 1)/√2.
  const primary: StateArray = [7000, 0, 0, 0, 7.5, 0];
  const secondary: StateArray = [7000.1, 0, 0, 0, 0, 7.5];
  const a = 400, b = 900, c = 2500; // combined diag(a, b, c) m², split between the objects
  const plane = encounterPlane(primary, secondary, [[a / 2, 0, 0], [0, b, 0], [0, 0, 0]], [[a / 2, 0, 0], [0, 0, 0], [0, 0, c]]);
  it('miss, relative speed and projected covariance', () => {
    expect(Math.abs(plane.missM[0] - 100)).toBeLessThan(1e-9);
    expect(plane.missM[1]).toBe(0);
    expect(Math.abs(plane.relSpeedMps - 7500 * Math.SQRT2)).toBeLessThan(1e-9);
    expect(Math.abs(plane.covM2[0][0] - a)).toBeLessThan(1e-9);
    expect(Math.abs(plane.covM2[1][1] - (b + c) / 2)).toBeLessThan(1e-9);
    expect(Math.abs(plane.covM2[0][1])).toBeLessThan(1e-9);
  });
  it('3-D Monte Carlo with straight-line motion agrees with the projected 2-D Pc (4 binomial σ)', () => {
    const radius = 60;
    const pc = pc2dReference(plane.missM, plane.covM2, radius);
    const n = 200_000;
    const mc = pcMonteCarlo3d(plane.relPosM, plane.relVelMps, plane.combinedCovM2, radius, { samples: n, seed: 7 });
    expect(Math.abs(mc.pc - pc)).toBeLessThan(4 * Math.sqrt((pc * (1 - pc)) / n));
  });
  it('short-encounter check: fast LEO crossing passes, slow co-orbital approach warns', () => {
    expect(checkShortEncounter(primary, secondary, plane.relVelMps, plane.combinedCovM2, 10).warnings).toHaveLength(0);
    const slow: StateArray = [7000.1, 0, 0, 0, 7.5, 0.1];
    const w = checkShortEncounter(primary, slow, [0, 0, 100], [[1e6, 0, 0], [0, 1e6, 0], [0, 0, 1e8]], 10).warnings;
    expect(w.some((x) => x.includes('slow encounter'))).toBe(true);
    expect(w.some((x) => x.includes('long encounter'))).toBe(true);
  });
});
