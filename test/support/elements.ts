/**
 * Element sets built directly for screening tests (no file format in between).
 * Mean motion from the semi-major axis by Kepler's third law with WGS-72 μ (the constant SGP4
 * uses); SGP4 reads it as a Kozai mean motion, which only shifts the radius by ~10 km in LEO —
 * irrelevant here, the tests compare the engine with a reference on the same SGP4 trajectories.
 */
import type { ElementSet } from '../../core/elements/elementSet.js';
import type { Instant } from '../../core/time/instant.js';

/** WGS-72 gravitational parameter (km³/s²), Vallado et al. 2006. */
export const MU_WGS72 = 398600.8;
/** WGS-72 equatorial radius (km). */
export const RE_WGS72 = 6378.135;
/** GEO semi-major axis (km): one sidereal day period. */
export const A_GEO_KM = 42164.2;

export const revPerDayFromA = (aKm: number): number => (Math.sqrt(MU_WGS72 / aKm ** 3) * 86_400) / (2 * Math.PI);

export interface Orbit {
  aKm: number;
  e: number;
  iDeg: number;
  raanDeg: number;
  argpDeg: number;
  /**
   * Mean argument of latitude ω + M (deg) wanted at `phaseAt`; the mean anomaly at the epoch is
   * set back from it by the Keplerian mean motion, so objects can be phased at the window start.
   */
  uDeg: number;
  bstar?: number;
  meanMotionRevPerDay?: number;
}

const wrap360 = (x: number): number => ((x % 360) + 360) % 360;

export function elementSet(id: string, epoch: number, o: Orbit, phaseAt: number = epoch): ElementSet {
  const n = o.meanMotionRevPerDay ?? revPerDayFromA(o.aKm);
  const dtDays = (phaseAt - epoch) / 86_400_000;
  const meanAnomalyDeg = wrap360(o.uDeg - o.argpDeg - n * 360 * dtDays);
  return {
    objectId: id,
    name: `TEST ${id}`,
    intlDesignator: null,
    classification: 'U',
    epoch: epoch as Instant,
    meanMotionRevPerDay: n,
    eccentricity: o.e,
    inclinationDeg: o.iDeg,
    raanDeg: wrap360(o.raanDeg),
    argPerigeeDeg: wrap360(o.argpDeg),
    meanAnomalyDeg,
    bstar: o.bstar ?? 0,
    meanMotionDot: 0,
    meanMotionDdot: 0,
    elementSetNo: 999,
    revAtEpoch: 0,
    ephemerisType: 0,
    source: { file: 'test', line: 0, format: 'SYNTHETIC' },
  };
}
