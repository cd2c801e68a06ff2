import type { ElementSet } from '../elements/elementSet.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../units.js';
import type { Matrix } from '../math/linalg.js';
import { DEFAULT_COVARIANCE_TABLE, type Regime } from './defaultCovarianceTable.js';

/** Regime boundaries (our choice): perigee altitude for low LEO, apogee for LEO, eccentricity
 * for HEO, mean motion near one revolution per sidereal day for GEO. */
export const LEO_LOW_PERIGEE_KM = 500;
export const LEO_APOGEE_KM = 2000;
export const HEO_MIN_ECCENTRICITY = 0.25;
export const GEO_MEAN_MOTION_RANGE: readonly [number, number] = [0.9, 1.1];

export function regimeOf(es: Pick<ElementSet, 'meanMotionRevPerDay' | 'eccentricity'>): Regime {
  const n = (es.meanMotionRevPerDay * 2 * Math.PI) / 86400; // rad/s
  const a = Math.cbrt(MU_EARTH_WGS72 / (n * n));
  const perigee = a * (1 - es.eccentricity) - R_EARTH_WGS72;
  const apogee = a * (1 + es.eccentricity) - R_EARTH_WGS72;
  if (es.eccentricity >= HEO_MIN_ECCENTRICITY) return 'HEO';
  if (apogee < LEO_APOGEE_KM) return perigee < LEO_LOW_PERIGEE_KM ? 'LEO-low' : 'LEO';
  if (es.meanMotionRevPerDay >= GEO_MEAN_MOTION_RANGE[0] && es.meanMotionRevPerDay <= GEO_MEAN_MOTION_RANGE[1]) return 'GEO';
  return 'MEO';
}

export interface DefaultCovariance {
  /** diagonal RTN covariance, m² */
  readonly rtnM2: Matrix;
  readonly sigmaM: readonly [number, number, number];
  readonly source: string;
}

/**
 * RTN covariance from the default table: σ(age) = √(σ₀² + (g·age)²) per axis (our choice of
 * combination: the epoch error and the error grown since are taken as independent), diagonal.
 */
export function defaultCovariance(regime: Regime, ageDays: number): DefaultCovariance {
  const row = DEFAULT_COVARIANCE_TABLE[regime];
  const age = Math.abs(ageDays);
  const sigma = row.atEpochM.map((s0, i) => Math.hypot(s0, row.growthMPerDay[i]! * age)) as [number, number, number];
  return {
    rtnM2: [
      [sigma[0] ** 2, 0, 0],
      [0, sigma[1] ** 2, 0],
      [0, 0, sigma[2] ** 2],
    ],
    sigmaM: sigma,
    source: `default(${regime}, age ${age.toFixed(1)} d)`,
  };
}
