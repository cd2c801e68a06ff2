/**
 * IAU-76/FK5 building blocks as Vallado publishes them for SGP4's TEME (Vallado, Crawford,
 * Hujsak, Kelso 2006, AIAA 2006-6753 App. C; Vallado, Fundamentals of Astrodynamics and
 * Applications §3.7): IAU-1976 precession, IAU-1980 nutation, IAU-1982 GMST.
 * Argument T: Julian centuries of TT (UT1 for GMST) since J2000.0.
 */
import { NUTATION_1980 } from './nutation1980Terms.js';
import { ARCSEC, chain, rot1, rot2, rot3, type Mat3 } from './rotation.js';

const TWO_PI = 2 * Math.PI;
/** Amplitude unit of the 1980 series: 0.1 mas. */
const SERIES_UNIT = 1e-4 * ARCSEC;

/** Mean obliquity of the ecliptic, IAU 1980 (Lieske et al. 1977), rad. */
export const meanObliquity1980 = (T: number): number =>
  (84381.448 + (-46.815 + (-0.00059 + 0.001813 * T) * T) * T) * ARCSEC;

/**
 * Delaunay arguments l, l', F, D, Ω of the 1980 theory (Explanatory Supplement 1992 §3.222),
 * rad. Whole revolutions per century are kept apart so the polynomial stays small.
 */
function delaunay1980(T: number): [number, number, number, number, number] {
  const arg = (c0: number, c1: number, c2: number, c3: number, revs: number): number =>
    ((c0 + (c1 + (c2 + c3 * T) * T) * T) * ARCSEC + ((revs * T) % 1) * TWO_PI) % TWO_PI;
  return [
    arg(485866.733, 715922.633, 31.31, 0.064, 1325),
    arg(1287099.804, 1292581.224, -0.577, -0.012, 99),
    arg(335778.877, 295263.137, -13.257, 0.011, 1342),
    arg(1072261.307, 1105601.328, -6.891, 0.019, 1236),
    arg(450160.28, -482890.539, 7.455, 0.008, -5),
  ];
}

/** Nutation in longitude and obliquity, IAU 1980 (106 terms), rad. */
export function nutation1980(T: number): { dPsi: number; dEps: number } {
  const [l, lp, f, d, om] = delaunay1980(T);
  let dPsi = 0, dEps = 0;
  // Smallest terms first: summing small to large loses less to rounding.
  for (let i = NUTATION_1980.length - 1; i >= 0; i--) {
    const [a, b, c, e, g, sp, spt, ce, cet] = NUTATION_1980[i]! as [number, number, number, number, number, number, number, number, number];
    const x = a * l + b * lp + c * f + e * d + g * om;
    dPsi += (sp + spt * T) * Math.sin(x);
    dEps += (ce + cet * T) * Math.cos(x);
  }
  return { dPsi: dPsi * SERIES_UNIT, dEps: dEps * SERIES_UNIT };
}

/** IAU 1976 precession angles ζ, θ, z (Lieske et al. 1977), rad. */
export function precession1976(T: number): { zeta: number; theta: number; z: number } {
  return {
    zeta: (2306.2181 + (0.30188 + 0.017998 * T) * T) * T * ARCSEC,
    theta: (2004.3109 + (-0.42665 - 0.041833 * T) * T) * T * ARCSEC,
    z: (2306.2181 + (1.09468 + 0.018203 * T) * T) * T * ARCSEC,
  };
}

/** r_J2000 = P · r_MOD (mean of date to mean J2000 equator and equinox). */
export function precessionMatrix(T: number): Mat3 {
  const { zeta, theta, z } = precession1976(T);
  return chain(rot3(zeta), rot2(-theta), rot3(z));
}

/** r_MOD = N · r_TOD (true of date to mean of date). */
export function nutationMatrix(meanEps: number, dPsi: number, trueEps: number): Mat3 {
  return chain(rot1(-meanEps), rot3(dPsi), rot1(trueEps));
}

/**
 * Greenwich mean sidereal time, IAU 1982 (Aoki et al. 1982; the gstime of SGP4), rad.
 * Input split as whole + fractional UT1 days since J2000.0 so the day fraction, which carries
 * the 2π-per-day term, keeps full precision.
 */
export function gmst1982(ut1DaysSinceJ2000: number): number {
  const Tu = ut1DaysSinceJ2000 / 36525;
  // Seconds of time; the 86400 s/day × days term is applied through the day fraction below.
  const s = 67310.54841 + (8640184.812866 + (0.093104 - 6.2e-6 * Tu) * Tu) * Tu;
  const dayFraction = ut1DaysSinceJ2000 - Math.floor(ut1DaysSinceJ2000);
  const g = ((s / 86400 + dayFraction) % 1) * TWO_PI;
  return g < 0 ? g + TWO_PI : g;
}

/** Earth rotation rate used with GMST 1982 (Vallado, Fundamentals §3.7), rad/s; LOD in s. */
export const earthRotationRate = (lodS = 0): number => 7.29211514670698e-5 * (1 - lodS / 86400);
