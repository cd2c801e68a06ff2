/**
 * Default 1-σ position uncertainty of a public element set, by orbit regime, in the object's RTN
 * frame (metres), and its growth per day of element-set age. Used only when neither a received
 * CDM nor the object's own element-set history gives a covariance.
 *
 * PROVENANCE, value by value (full citations and the quoted numbers in
 * test/authorities/tle-accuracy/README.md):
 * - LEO-low along-track growth 10 km/day: Riesing, "Orbit determination from two line element
 *   sets of ISS-deployed CubeSats", AIAA/USU Conference on Small Satellites 2015, SSC15-VIII-5,
 *   abstract: "The 1-σ in-track propagation error after one day ranges from 10-30 km among the 10
 *   satellites, and the two-day 1-σ error ranges from 20-70 km" (Flock 1B CubeSats near 400 km,
 *   September 2014). We take the low end: the study's objects are small, high-drag CubeSats,
 *   larger objects below 500 km do better, and a table value far above most objects' error
 *   dilutes every Pc.
 * - LEO along-track growth 1 km/day: Levit & Marshall, "Improved orbit predictions using
 *   two-line elements", Advances in Space Research 47 (2011), abstract: their fitted orbits'
 *   "predicted range error ... increases at a typical rate of 100 meters per day, approximately a
 *   10-fold improvement over individual TLE's propagated with their associated analytic
 *   propagator (SGP4)" — so about 1 km/day for a single TLE (ILRS satellites, including the
 *   sun-synchronous region). Range error after a day or more is dominated by along-track.
 * - Everything else (errors at epoch, radial and cross-track growth, MEO, GEO, HEO): FROM MEMORY,
 *   common-practice orders of magnitude; no published table of these was found whose numbers we
 *   could check. Not authoritative.
 * Replace them with a covariance of your own (element-set history) or a received CDM wherever
 * possible; test/risk-covariance-realism.test.ts shows how they compare with the errors of the
 * synthetic demo world.
 */
export type Regime = 'LEO-low' | 'LEO' | 'MEO' | 'GEO' | 'HEO';

export interface RegimeSigma {
  /** 1-σ at element-set epoch, R T N (m) */
  readonly atEpochM: readonly [number, number, number];
  /** 1-σ growth per day of age, R T N (m/day) */
  readonly growthMPerDay: readonly [number, number, number];
  /** where the numbers come from */
  readonly provenance: string;
}

const FROM_MEMORY = 'from memory (common practice, order of magnitude)';

export const DEFAULT_COVARIANCE_TABLE: Readonly<Record<Regime, RegimeSigma>> = {
  // perigee below 500 km: drag uncertainty dominates along-track growth
  'LEO-low': {
    atEpochM: [200, 1000, 300],
    growthMPerDay: [100, 10_000, 50],
    provenance: `T growth: Riesing 2015 (SSC15-VIII-5), low end of 10–30 km after one day; rest ${FROM_MEMORY}`,
  },
  LEO: {
    atEpochM: [100, 500, 150],
    growthMPerDay: [30, 1000, 20],
    provenance: `T growth: Levit & Marshall 2011 (Adv. Space Res. 47), SGP4 ≈ 10 × 100 m/day; rest ${FROM_MEMORY}`,
  },
  MEO: { atEpochM: [300, 1500, 500], growthMPerDay: [50, 500, 50], provenance: FROM_MEMORY },
  GEO: { atEpochM: [500, 3000, 1000], growthMPerDay: [100, 1000, 100], provenance: FROM_MEMORY },
  HEO: { atEpochM: [1000, 5000, 1000], growthMPerDay: [300, 3000, 200], provenance: FROM_MEMORY },
};

export const DEFAULT_COVARIANCE_PROVENANCE =
  'LEO along-track growth from Levit & Marshall 2011, LEO-low along-track growth from Riesing 2015; ' +
  'the other values from memory (common practice, order of magnitude)';
