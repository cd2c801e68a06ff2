/**
 * Default 1-σ position uncertainty of a public element set, by orbit regime, in the object's RTN
 * frame (metres), and its growth per day of element-set age.
 *
 * PROVENANCE: common practice / from memory — order-of-magnitude values in line with published
 * TLE accuracy studies (e.g. Flohrer et al., ESA, 2008/2009; Vallado et al. on TLE-derived
 * covariance). These numbers are NOT copied from any table of those papers and are not
 * authoritative; replace them with statistics of your own (element-set history) or a received
 * CDM wherever possible. They exist only so a Pc can be estimated when nothing better is known.
 */
export type Regime = 'LEO-low' | 'LEO' | 'MEO' | 'GEO' | 'HEO';

export interface RegimeSigma {
  /** 1-σ at element-set epoch, R T N (m) */
  readonly atEpochM: readonly [number, number, number];
  /** 1-σ growth per day of age, R T N (m/day) */
  readonly growthMPerDay: readonly [number, number, number];
}

export const DEFAULT_COVARIANCE_TABLE: Readonly<Record<Regime, RegimeSigma>> = {
  // perigee below 500 km: drag uncertainty dominates along-track growth
  'LEO-low': { atEpochM: [200, 1000, 300], growthMPerDay: [100, 3000, 50] },
  LEO: { atEpochM: [100, 500, 150], growthMPerDay: [30, 1000, 20] },
  MEO: { atEpochM: [300, 1500, 500], growthMPerDay: [50, 500, 50] },
  GEO: { atEpochM: [500, 3000, 1000], growthMPerDay: [100, 1000, 100] },
  HEO: { atEpochM: [1000, 5000, 1000], growthMPerDay: [300, 3000, 200] },
};

export const DEFAULT_COVARIANCE_PROVENANCE =
  'common practice / from memory, order-of-magnitude of published TLE accuracy studies';
