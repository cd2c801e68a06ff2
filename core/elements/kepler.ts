/**
 * Kepler's third law, n² a³ = μ, and the apsis radii the screening filters use.
 *
 * Two semi-major axes exist for a TLE/OMM mean element set and they differ by kilometres in LEO:
 * - the plain two-body value from the stated ("Kozai") mean motion, and
 * - SGP4's own recovered ("un-Kozai'd", Brouwer) mean motion and semi-major axis, computed
 *   with SGP4's WGS-72 constants and J2 (Hoots & Roehrich, Spacetrack Report #3, 1980;
 *   Vallado, Crawford, Hujsak, Kelso 2006, routine initl).
 * Filters must use the second: it is the a that SGP4 actually propagates around.
 */
import type { ElementSet } from './elementSet.js';
import { km, MU_EARTH_WGS72, MU_EARTH_WGS84, R_EARTH_WGS72, seconds, type Km, type Seconds } from '../units.js';

const SECONDS_PER_DAY = 86_400;
const TWO_PI = 2 * Math.PI;
/** WGS-72 J2 as SGP4 uses it (Spacetrack Report #3; Vallado et al. 2006 getgravconst). */
const J2_WGS72 = 0.001082616;

/** Two-body semi-major axis (km) of a mean motion in rev/day: a = (μ/n²)^(1/3). */
export function meanMotionToSemiMajorAxis(nRevPerDay: number, mu: number = MU_EARTH_WGS84): Km {
  const n = (nRevPerDay * TWO_PI) / SECONDS_PER_DAY;
  return km(Math.cbrt(mu / (n * n)));
}

/** Two-body mean motion (rev/day) of a semi-major axis in km: n = √(μ/a³). */
export function semiMajorAxisToMeanMotion(aKm: Km, mu: number = MU_EARTH_WGS84): number {
  return (Math.sqrt(mu / (aKm * aKm * aKm)) * SECONDS_PER_DAY) / TWO_PI;
}

/** Two-body period (s) of a semi-major axis: T = 2π √(a³/μ). */
export function periodOfSemiMajorAxis(aKm: Km, mu: number = MU_EARTH_WGS84): Seconds {
  return seconds(TWO_PI * Math.sqrt((aKm * aKm * aKm) / mu));
}

/** Period (s) of a mean motion in rev/day (nodal/anomalistic distinctions ignored). */
export const periodOfMeanMotion = (nRevPerDay: number): Seconds => seconds(SECONDS_PER_DAY / nRevPerDay);

/**
 * SGP4's recovered mean motion (rad/min) and semi-major axis (Earth radii, WGS-72), as SGP4's
 * initialisation computes them from the Kozai mean motion: the J2 correction δ is found
 * iteratively twice (Spacetrack Report #3 eqs. for a₁, δ₁, a₀, δ₀).
 */
export function sgp4RecoveredMeanElements(es: ElementSet): { noRadPerMin: number; aEarthRadii: number } {
  // xke = √(μ/R³) in Earth radii^{3/2} per minute.
  const xke = 60 / Math.sqrt((R_EARTH_WGS72 * R_EARTH_WGS72 * R_EARTH_WGS72) / MU_EARTH_WGS72);
  const noKozai = (es.meanMotionRevPerDay * TWO_PI) / 1440;
  const e2 = es.eccentricity * es.eccentricity;
  const omeosq = 1 - e2;
  const cosio = Math.cos((es.inclinationDeg * Math.PI) / 180);
  const d1 = (0.75 * J2_WGS72 * (3 * cosio * cosio - 1)) / (Math.sqrt(omeosq) * omeosq);
  const ak = Math.pow(xke / noKozai, 2 / 3);
  let del = d1 / (ak * ak);
  const adel = ak * (1 - del * del - del * (1 / 3 + (134 * del * del) / 81));
  del = d1 / (adel * adel);
  const no = noKozai / (1 + del);
  return { noRadPerMin: no, aEarthRadii: Math.pow(xke / no, 2 / 3) };
}

/** SGP4's recovered semi-major axis in km (WGS-72 Earth radius). */
export const sgp4SemiMajorAxis = (es: ElementSet): Km =>
  km(sgp4RecoveredMeanElements(es).aEarthRadii * R_EARTH_WGS72);

export interface ApsisRadii {
  readonly semiMajorAxisKm: Km;
  readonly perigeeKm: Km;
  readonly apogeeKm: Km;
}

/**
 * Mean perigee and apogee radii, a(1 ∓ e), from SGP4's recovered semi-major axis: what the
 * apogee/perigee filter (Hoots, Crawford, Roehrich 1984) compares. Osculating radii swing
 * around these by the short-period terms; the filter's pad must cover that.
 */
export function apsisRadii(es: ElementSet): ApsisRadii {
  const a = sgp4SemiMajorAxis(es);
  return {
    semiMajorAxisKm: a,
    perigeeKm: km(a * (1 - es.eccentricity)),
    apogeeKm: km(a * (1 + es.eccentricity)),
  };
}
