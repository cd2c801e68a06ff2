import { R_EARTH_WGS72 } from '../units.js';
import { MU } from './kepler.js';

/**
 * First-order J2 secular rates (Vallado, Fundamentals of Astrodynamics, §9.6; common practice),
 * with SGP4's WGS-72 constants so that drawn orbits agree with what SGP4 will do.
 * Radians per second; a in km.
 */
export const J2_WGS72 = 0.001082616; // Spacetrack Report #3 / Vallado et al. 2006 (WGS-72)
export const RE = R_EARTH_WGS72 as number;

/** Tropical year, days (mean, IERS conventions value 365.242190…; 365.2422 is the common figure). */
export const TROPICAL_YEAR_DAYS = 365.2422;
/** Sidereal day, seconds (one rotation relative to the stars; 86164.0905 s, common figure). */
export const SIDEREAL_DAY_S = 86_164.0905;

/** The sun's mean motion in right ascension: what a sun-synchronous node must follow, rad/s. */
export const SUN_SYNC_NODAL_RATE = (2 * Math.PI) / (TROPICAL_YEAR_DAYS * 86_400);

const factor = (a: number, e: number): number => {
  const p = a * (1 - e * e);
  return Math.sqrt(MU / (a * a * a)) * J2_WGS72 * (RE / p) * (RE / p);
};

/** dΩ/dt = −(3/2) n J2 (R/p)² cos i. */
export const nodalRate = (a: number, e: number, i: number): number => -1.5 * factor(a, e) * Math.cos(i);

/** dω/dt = (3/4) n J2 (R/p)² (5 cos² i − 1). */
export const apsidalRate = (a: number, e: number, i: number): number => {
  const c = Math.cos(i);
  return 0.75 * factor(a, e) * (5 * c * c - 1);
};

/** dM/dt = n + (3/4) n J2 (R/p)² √(1−e²) (3 cos² i − 1). */
export const meanAnomalyRate = (a: number, e: number, i: number): number => {
  const c = Math.cos(i);
  return Math.sqrt(MU / (a * a * a)) + 0.75 * factor(a, e) * Math.sqrt(1 - e * e) * (3 * c * c - 1);
};

/**
 * Inclination (rad) whose J2 nodal rate equals the sun's mean motion: solves the nodal-rate
 * equation for cos i. Throws above ~6000 km altitude, where no inclination suffices.
 */
export function sunSynchronousInclination(a: number, e: number): number {
  const c = -SUN_SYNC_NODAL_RATE / (1.5 * factor(a, e));
  if (c < -1) throw new RangeError(`no sun-synchronous inclination at a = ${a} km`);
  return Math.acos(c);
}

/** Semi-major axis (km) of a circular orbit with the given period (s), Kepler's third law. */
export const semiMajorAxisForPeriod = (periodS: number): number =>
  Math.cbrt((MU * periodS * periodS) / (4 * Math.PI * Math.PI));
