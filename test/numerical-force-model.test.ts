/**
 * Force model of the numerical propagator (core/propagation/numerical/forceModel.ts).
 *
 * - Zonal accelerations against the gradient of the zonal potential, computed here by central
 *   differences of U_n = −(μ/r) J_n (R/r)^n P_n(sin φ) with the Legendre polynomials
 *   P2 = (3s² − 1)/2, P3 = (5s³ − 3s)/2, P4 = (35s⁴ − 30s² + 3)/8 (Vallado, Fundamentals of
 *   Astrodynamics and Applications, §8.6 — the geopotential; the polynomials are standard).
 * - EGM-96 zonal coefficients: unnormalised from the published normalised C̄n0 (EGM-96 coefficient
 *   file, Lemoine et al. 1998) and against Vallado's Table D-1 values (from memory).
 * - Exponential atmosphere: Vallado Table 8-4 entries and a value worked by hand.
 * - B* → C_D·A/m: 2·B* / (ρ0·R_E) with ρ0 = 2.461e-8 kg/m³ and R_E = 6378.135 km (Hoots &
 *   Roehrich, Spacetrack Report #3; from memory), computed by hand here.
 */
import { describe, expect, it } from 'vitest';
import { exponentialDensity } from '../core/propagation/numerical/atmosphere.js';
import { BSTAR_TO_CDA_OVER_M, dragFromBstar } from '../core/propagation/numerical/ballistic.js';
import { EARTH_ROTATION_RAD_S, J2_EGM96, J3_EGM96, J4_EGM96, MU_EGM96, R_EGM96 } from '../core/propagation/numerical/earthModel.js';
import { accelerationInto, forceModel, heightAboveEllipsoidKm } from '../core/propagation/numerical/forceModel.js';

/** Central-difference step (km): truncation h²·U'''/6 ~ 1e-20 km/s², rounding ε·U/h ~ 1e-17 km/s². */
const FD_STEP_KM = 1e-2;
/** Tolerance on each zonal term's acceleration (km/s²): 1e-5 of the J3/J4 terms (~1e-8 km/s²). */
const ZONAL_TOL_KMS2 = 1e-13;

const legendre = [
  () => 1,
  (s: number) => s,
  (s: number) => (3 * s * s - 1) / 2,
  (s: number) => (5 * s ** 3 - 3 * s) / 2,
  (s: number) => (35 * s ** 4 - 30 * s * s + 3) / 8,
];
const J = [0, 0, J2_EGM96, J3_EGM96, J4_EGM96];

function zonalPotential(n: number, x: number, y: number, z: number): number {
  const r = Math.hypot(x, y, z);
  return -(MU_EGM96 / r) * J[n]! * (R_EGM96 / r) ** n * legendre[n]!(z / r);
}

function gradient(n: number, p: number[]): number[] {
  return [0, 1, 2].map((k) => {
    const a = [...p], b = [...p];
    a[k]! += FD_STEP_KM;
    b[k]! -= FD_STEP_KM;
    return (zonalPotential(n, a[0]!, a[1]!, a[2]!) - zonalPotential(n, b[0]!, b[1]!, b[2]!)) / (2 * FD_STEP_KM);
  });
}

const acc = (degree: 0 | 2 | 3 | 4, p: number[]): number[] => {
  const out = new Float64Array(3);
  accelerationInto(forceModel({ zonalDegree: degree }), [...p, 0, 0, 0], 0, out, 0);
  return [...out];
};

describe('zonal harmonics J2, J3, J4', () => {
  const points = [
    [7000, 0, 0],
    [4000, -3000, 5000],
    [-1200, 2500, -6500],
    [0, 0, 7100],
    [26000, 1000, -12000],
  ];
  for (const p of points)
    it(`each term equals the gradient of its potential at [${p.join(', ')}] km`, () => {
      const a0 = acc(0, p), a2 = acc(2, p), a3 = acc(3, p), a4 = acc(4, p);
      const terms = [
        [2, a2.map((v, i) => v - a0[i]!)],
        [3, a3.map((v, i) => v - a2[i]!)],
        [4, a4.map((v, i) => v - a3[i]!)],
      ] as const;
      for (const [n, term] of terms) {
        const g = gradient(n, p);
        for (let i = 0; i < 3; i++) expect(Math.abs(term[i]! - g[i]!)).toBeLessThan(ZONAL_TOL_KMS2);
      }
    });

  it('two-body part is −μ r/r³', () => {
    const p = [4000, -3000, 5000];
    const r = Math.hypot(...p);
    acc(0, p).forEach((v, i) => expect(v).toBeCloseTo((-MU_EGM96 * p[i]!) / r ** 3, 15));
  });

  it('EGM-96 coefficients: J_n = −√(2n+1)·C̄n0 and Vallado Table D-1 (from memory)', () => {
    // Normalised values of the EGM-96 coefficient file (Lemoine et al. 1998).
    expect(J2_EGM96).toBeCloseTo(-Math.sqrt(5) * -0.484165371736e-3, 15);
    expect(J2_EGM96).toBeCloseTo(0.0010826267, 10);
    expect(J3_EGM96).toBeCloseTo(-0.0000025327, 10);
    expect(J4_EGM96).toBeCloseTo(-0.0000016196, 10);
  });
});

describe('exponential atmosphere (Vallado Table 8-4)', () => {
  it('gives the table entries at band bases', () => {
    expect(exponentialDensity(0)).toBe(1.225);
    expect(exponentialDensity(400)).toBe(3.725e-12);
    expect(exponentialDensity(1000)).toBe(3.019e-15);
  });
  it('interpolates exponentially inside a band (hand value)', () => {
    // 425 km: 3.725e-12 · exp(−25/58.515) = 3.725e-12 · 0.65231 = 2.4298e-12 kg/m³ (worked by hand).
    expect(exponentialDensity(425) / 2.4298e-12).toBeCloseTo(1, 4);
  });
  it('height above the ellipsoid: equator and pole (WGS-84 a = 6378.137 km, b = 6356.752 km)', () => {
    expect(heightAboveEllipsoidKm(6778.137, 0, 0)).toBeCloseTo(400, 9);
    // Pole: first-order form a(1 − f) = b exactly.
    expect(heightAboveEllipsoidKm(0, 0, 6756.752)).toBeCloseTo(400, 2);
  });
});

describe('drag', () => {
  it('B* → C_D·A/m (Spacetrack Report #3 definition, hand computation)', () => {
    const rho0RE = 2.461e-8 * 6378135; // kg/m² per Earth radius
    expect(BSTAR_TO_CDA_OVER_M).toBeCloseTo(2 / rho0RE, 4);
    expect(dragFromBstar(1e-4).cdAreaOverMassM2PerKg).toBeCloseTo(1.2741621e-3, 9);
    expect(dragFromBstar(-2e-5).cdAreaOverMassM2PerKg).toBe(0);
  });

  it('opposes the velocity relative to the rotating atmosphere, −½ρB|v|v', () => {
    const B = 0.02; // m²/kg
    const r = 6378.137 + 400; // on the equator: height 400 km, ρ = 3.725e-12 kg/m³ (Table 8-4)
    const state = [r, 0, 0, 0, 7.67, 0];
    const withDrag = new Float64Array(3), without = new Float64Array(3);
    accelerationInto(forceModel({ drag: { cdAreaOverMassM2PerKg: B, source: 'spacecraft' } }), state, 0, withDrag, 0);
    accelerationInto(forceModel({}), state, 0, without, 0);
    const vRel = 7.67 - EARTH_ROTATION_RAD_S * r; // km/s along +y
    const expected = -0.5 * 3.725e-12 * B * vRel * vRel * 1000; // km/s²
    expect(withDrag[1]! - without[1]!).toBeCloseTo(expected, 18);
    expect(withDrag[0]! - without[0]!).toBe(0);
    expect(withDrag[2]! - without[2]!).toBe(0);
  });
});
