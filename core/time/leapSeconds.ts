/**
 * UTC to the uniform time scales the frame reductions need: TAI − UTC (leap seconds) and
 * TT = TAI + 32.184 s, plus the UT1 assumption.
 *
 * Table: IERS Bulletin C (values from 1972-01-01 on; 37 s since 2017-01-01, no leap second
 * announced since). Before 1972 UTC used fractional steps and rate offsets; those dates get the
 * 1972 value (10 s), stated here because no screening input predates it.
 *
 * UT1: Keepclear takes UT1 = UTC unless UT1 − UTC is supplied. |UT1 − UTC| < 0.9 s by the
 * definition of UTC, i.e. at most 0.9 s × 7.29e-5 rad/s ≈ 6.6e-5 rad of Earth rotation:
 * ≈ 0.44 km along-track at LEO radius (6,700 km) and ≈ 2.8 km at GEO radius in TEME → ITRF.
 * TEME → GCRF does not use UT1 (only TT), so that conversion carries no such error.
 */
import { MS_PER_S, type Instant } from './instant.js';

/** [UTC ms at which the value starts, TAI − UTC in s], ascending (IERS Bulletin C). */
const STEPS: readonly (readonly [number, number])[] = [
  [Date.UTC(1972, 0, 1), 10],
  [Date.UTC(1972, 6, 1), 11],
  [Date.UTC(1973, 0, 1), 12],
  [Date.UTC(1974, 0, 1), 13],
  [Date.UTC(1975, 0, 1), 14],
  [Date.UTC(1976, 0, 1), 15],
  [Date.UTC(1977, 0, 1), 16],
  [Date.UTC(1978, 0, 1), 17],
  [Date.UTC(1979, 0, 1), 18],
  [Date.UTC(1980, 0, 1), 19],
  [Date.UTC(1981, 6, 1), 20],
  [Date.UTC(1982, 6, 1), 21],
  [Date.UTC(1983, 6, 1), 22],
  [Date.UTC(1985, 6, 1), 23],
  [Date.UTC(1988, 0, 1), 24],
  [Date.UTC(1990, 0, 1), 25],
  [Date.UTC(1991, 0, 1), 26],
  [Date.UTC(1992, 6, 1), 27],
  [Date.UTC(1993, 6, 1), 28],
  [Date.UTC(1994, 6, 1), 29],
  [Date.UTC(1996, 0, 1), 30],
  [Date.UTC(1997, 6, 1), 31],
  [Date.UTC(1999, 0, 1), 32],
  [Date.UTC(2006, 0, 1), 33],
  [Date.UTC(2009, 0, 1), 34],
  [Date.UTC(2012, 6, 1), 35],
  [Date.UTC(2015, 6, 1), 36],
  [Date.UTC(2017, 0, 1), 37],
];

/** TT − TAI, s (IAU 1991 definition of TT). */
export const TT_MINUS_TAI_S = 32.184;

/** TAI − UTC in seconds at a UTC instant. */
export function taiMinusUtc(t: Instant): number {
  let value = STEPS[0]![1];
  for (const [start, s] of STEPS) {
    if (t < start) break;
    value = s;
  }
  return value;
}

/** TT − UTC in seconds. */
export const ttMinusUtc = (t: Instant): number => taiMinusUtc(t) + TT_MINUS_TAI_S;

/** J2000.0 = 2000-01-01T12:00:00 on whichever scale is meant (JD 2451545.0). */
const J2000_MS = Date.UTC(2000, 0, 1, 12);
const MS_PER_CENTURY = 36525 * 86_400_000;

/**
 * Julian centuries of TT since J2000.0, the argument of the precession and nutation series.
 * Counted from milliseconds rather than from a Julian date to keep sub-microsecond digits.
 */
export const ttCenturiesSinceJ2000 = (t: Instant): number =>
  (t + ttMinusUtc(t) * MS_PER_S - J2000_MS) / MS_PER_CENTURY;

/** UT1 days since J2000.0 (UT1 = UTC + ut1MinusUtcS). */
export const ut1DaysSinceJ2000 = (t: Instant, ut1MinusUtcS = 0): number =>
  (t + ut1MinusUtcS * MS_PER_S - J2000_MS) / 86_400_000;
