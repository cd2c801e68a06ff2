import { julianDateUtc, type Instant } from '../time/instant.js';

/**
 * Low-precision angles used only to place synthetic orbits (GEO longitudes, sun-synchronous
 * local times); errors of a few hundredths of a degree do not matter here.
 */
const DEG = Math.PI / 180;

/** Greenwich mean sidereal angle, rad (IAU-82 linear term; UT1 ≈ UTC is fine for placement). */
export function gmstRad(t: Instant): number {
  const d = julianDateUtc(t) - 2451545.0;
  const deg = 280.46061837 + 360.98564736629 * d;
  return (((deg % 360) + 360) % 360) * DEG;
}

/**
 * Right ascension of the mean sun, rad: the Astronomical Almanac's low-precision solar
 * coordinates (about 0.01° over 1950–2050).
 */
export function sunRightAscensionRad(t: Instant): number {
  const n = julianDateUtc(t) - 2451545.0;
  const meanLongitude = (280.46 + 0.9856474 * n) * DEG;
  const meanAnomaly = (357.528 + 0.9856003 * n) * DEG;
  const eclipticLongitude =
    meanLongitude + (1.915 * Math.sin(meanAnomaly) + 0.02 * Math.sin(2 * meanAnomaly)) * DEG;
  const obliquity = (23.439 - 0.0000004 * n) * DEG;
  return Math.atan2(Math.cos(obliquity) * Math.sin(eclipticLongitude), Math.cos(eclipticLongitude));
}
