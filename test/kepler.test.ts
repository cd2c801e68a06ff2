/**
 * Kepler's third law helpers and SGP4's recovered semi-major axis, against:
 * - handbook orbit radii (geostationary; GPS), quoted from memory as commonly published
 *   (e.g. Vallado, Fundamentals of Astrodynamics and Applications);
 * - an independent evaluation of a = (μ/n²)^(1/3) in Python floats, and python-sgp4 2.15's
 *   no_kozai / a / altp / alta (test/authorities/sgp4-verification/kepler.json, written by
 *   make_kepler_fixture.py there; element sets from Vallado et al. 2006, AIAA 2006-6753).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  apsisRadii,
  meanMotionToSemiMajorAxis,
  periodOfMeanMotion,
  periodOfSemiMajorAxis,
  semiMajorAxisToMeanMotion,
  sgp4RecoveredMeanElements,
  sgp4SemiMajorAxis,
} from '../core/elements/kepler.js';
import { parseTle } from '../core/formats/tle/index.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { km, MU_EARTH_WGS84 } from '../core/units.js';

/** One sidereal day, s (IERS Conventions / Astronomical Almanac; from memory). */
const SIDEREAL_DAY_S = 86164.0905;
/** rev/day of a period in seconds. */
const revPerDay = (periodS: number): number => 86_400 / periodS;

// Handbook radii are quoted to 10 m, so half of that is rounding.
const QUOTED_10M = 0.005; // km
// Same formula, same doubles, different language: only cbrt/pow rounding differs.
const SAME_FORMULA_KM = 1e-9; // km
// python-sgp4 and ours run the same initl formulas in doubles: a few ulps of ~1 Earth radius.
const SAME_FORMULA_ER = 1e-13; // Earth radii (≈ 0.6 µm)
const SAME_FORMULA_RAD_MIN = 1e-15; // rad/min

interface KeplerFixture {
  sgp4: {
    satnum: string; line1: string; line2: string; noUnkozaiRadPerMin: number; aEarthRadii: number;
    altpEarthRadii: number; altaEarthRadii: number; radiusEarthKm: number;
  }[];
  kepler: { name: string; periodS: number; muKm3s2: number; aKm: number }[];
}
const fixture = JSON.parse(
  readFileSync(new URL('./authorities/sgp4-verification/kepler.json', import.meta.url), 'utf8'),
) as KeplerFixture;

describe("Kepler's third law, μ = 398600.4418 km³/s² (WGS-84, NIMA TR8350.2)", () => {
  it('geostationary: one sidereal day gives a ≈ 42164.17 km (handbook value, from memory)', () => {
    expect(Math.abs(meanMotionToSemiMajorAxis(revPerDay(SIDEREAL_DAY_S)) - 42164.17)).toBeLessThan(QUOTED_10M);
  });

  it('GPS: half a sidereal day gives a ≈ 26561.76 km (computed by hand from the law; quoted 26561.75 from memory)', () => {
    // The commonly quoted 26561.75 km sits 12 m from the law's value with these constants;
    // we hold to the law's value with the quoted rounding plus that 12 m, stated here.
    const GPS_QUOTED_SPREAD = 0.02; // km
    expect(Math.abs(meanMotionToSemiMajorAxis(revPerDay(SIDEREAL_DAY_S / 2)) - 26561.75)).toBeLessThan(GPS_QUOTED_SPREAD);
  });

  for (const k of fixture.kepler)
    it(`${k.name}: matches the independent Python evaluation (${k.aKm.toFixed(4)} km)`, () => {
      expect(k.muKm3s2).toBe(MU_EARTH_WGS84);
      const a = meanMotionToSemiMajorAxis(revPerDay(k.periodS));
      expect(Math.abs(a - k.aKm)).toBeLessThan(SAME_FORMULA_KM);
      // Inverse and period close the loop against the same reference numbers.
      expect(Math.abs(semiMajorAxisToMeanMotion(km(k.aKm)) - revPerDay(k.periodS))).toBeLessThan(1e-12);
      expect(Math.abs(periodOfSemiMajorAxis(km(k.aKm)) - k.periodS)).toBeLessThan(1e-6); // s
      expect(periodOfMeanMotion(revPerDay(k.periodS))).toBeCloseTo(k.periodS, 9);
    });

  it('LEO 90-minute orbit: a ≈ 6652.56 km, altitude ≈ 274 km above the WGS-84 equator (Python evaluation)', () => {
    const leo = fixture.kepler.find((k) => k.periodS === 5400)!;
    expect(Math.abs(meanMotionToSemiMajorAxis(16) - leo.aKm)).toBeLessThan(SAME_FORMULA_KM);
  });
});

describe("SGP4's recovered (un-Kozai'd) semi-major axis, WGS-72", () => {
  for (const ref of fixture.sgp4) {
    const set = parseTle(`${ref.line1}\n${ref.line2}`, 'kepler.json').sets[0]!;
    it(`${ref.satnum}: mean motion, a, perigee and apogee match python-sgp4 2.15`, () => {
      const rec = sgp4RecoveredMeanElements(set);
      expect(Math.abs(rec.noRadPerMin - ref.noUnkozaiRadPerMin)).toBeLessThan(SAME_FORMULA_RAD_MIN);
      expect(Math.abs(rec.aEarthRadii - ref.aEarthRadii)).toBeLessThan(SAME_FORMULA_ER);
      const toKm = ref.radiusEarthKm;
      const radii = apsisRadii(set);
      expect(Math.abs(radii.perigeeKm - (ref.altpEarthRadii + 1) * toKm)).toBeLessThan(SAME_FORMULA_ER * toKm * 10);
      expect(Math.abs(radii.apogeeKm - (ref.altaEarthRadii + 1) * toKm)).toBeLessThan(SAME_FORMULA_ER * toKm * 10);
      // satellite.js (our propagator) carries the same value in satrec.a.
      const satrecA = new Sgp4Trajectory(set).satrec.a;
      expect(Math.abs(sgp4SemiMajorAxis(set) - satrecA * toKm)).toBeLessThan(SAME_FORMULA_ER * toKm);
    });
  }

  it('differs from the two-body (Kozai) value by the first-order J2 term (Spacetrack Report #3)', () => {
    // To first order in J2: a = a_K (1 + (2/3) δ), δ = (3/4) J2 (3cos²i − 1) / (a_K² (1 − e²)^{3/2}),
    // a_K in Earth radii (Hoots & Roehrich 1980). Neglected terms are O(δ²) ≈ 1e-8 of a.
    const FIRST_ORDER_KM = 0.001; // km: O(δ²)·a ≈ 0.1 mm, with margin
    const J2 = 0.001082616, RE = 6378.135, MU72 = 398600.8; // WGS-72 (Spacetrack Report #3)
    for (const ref of fixture.sgp4) {
      const set = parseTle(`${ref.line1}\n${ref.line2}`, 'x').sets[0]!;
      const aK = meanMotionToSemiMajorAxis(set.meanMotionRevPerDay, MU72) / RE;
      const c = Math.cos((set.inclinationDeg * Math.PI) / 180);
      const delta = (0.75 * J2 * (3 * c * c - 1)) / (aK * aK * Math.pow(1 - set.eccentricity ** 2, 1.5));
      const expected = aK * (1 + (2 / 3) * delta) * RE;
      expect(Math.abs(sgp4SemiMajorAxis(set) - expected), ref.satnum).toBeLessThan(FIRST_ORDER_KM);
    }
  });
});
