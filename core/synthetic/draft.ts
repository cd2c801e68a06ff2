import type { ElementSet } from '../elements/elementSet.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import { meanMotionRevPerDay, wrapTwoPi } from './kepler.js';
import { RE } from './j2.js';
import type { Rng } from './random.js';

/** One drawn orbit before it gets an id: mean elements at `epoch`, angles in radians. */
export interface Draft {
  name: string;
  epoch: Instant;
  a: number; // km
  e: number;
  i: number;
  raan: number;
  argp: number;
  meanAnomaly: number;
  bstar: number; // 1/earth radii
}

const RAD_TO_DEG = 180 / Math.PI;
const round = (x: number, decimals: number): number => {
  const s = 10 ** decimals;
  return Math.round(x * s) / s;
};
/** Significant-digit rounding by arithmetic (toPrecision is much slower on 100k sets). */
const roundSignificant = (x: number, digits: number): number =>
  x === 0 ? 0 : round(x, digits - 1 - Math.floor(Math.log10(Math.abs(x))));

/**
 * Epochs fall on whole milliseconds that are also whole 1e-8 days since the start of the year
 * (multiples of 108 ms), so the same epoch is exact both in ISO text and in a TLE's 8-decimal
 * day of year.
 */
let cachedYear = { start: 0, end: -1 };
export function tleExactEpoch(t: number, mode: 'nearest' | 'floor' = 'nearest'): Instant {
  if (!(t >= cachedYear.start && t < cachedYear.end)) {
    const year = new Date(t).getUTCFullYear();
    cachedYear = { start: Date.UTC(year, 0, 1), end: Date.UTC(year + 1, 0, 1) };
  }
  const yearStart = cachedYear.start;
  const steps = (t - yearStart) / 108;
  return (yearStart + (mode === 'floor' ? Math.floor(steps) : Math.round(steps)) * 108) as Instant;
}

/**
 * Element-set age at the reference time, days: most sets are less than a day old, a tail
 * reaches the maximum (rough shape of a public catalogue, from memory).
 */
export function drawAgeDays(rng: Rng, maxAgeDays: number): number {
  const u = rng.next();
  const f = u < 0.7 ? rng.uniform(0, 1 / 3) : u < 0.95 ? rng.uniform(1 / 3, 5 / 6) : rng.uniform(5 / 6, 1);
  return f * maxAgeDays;
}

/**
 * Median SGP4 B* (1/ER) of an intact object by perigee altitude (km). Rough figures from memory:
 * ~1e-4 in low LEO falling to ~1e-5 above ~1000 km, where fitted B* is small and noisy.
 */
export const medianBstar = (perigeeAltKm: number): number =>
  Math.max(5e-6, 1.5e-4 * Math.exp(-(perigeeAltKm - 400) / 300));

/**
 * Mean-motion derivative ṅ/2 (rev/day²) loosely consistent with drag. SGP4 ignores it, so it
 * only needs to look plausible in a TLE: ~1e-5 near 400 km, ~1e-7 by 800 km.
 */
const meanMotionDotHalf = (bstar: number, perigeeAltKm: number): number =>
  Math.max(0, bstar) * 0.1 * Math.exp(-(perigeeAltKm - 400) / 80);

export const SYNTHETIC_SOURCE = { file: 'synthetic', format: 'SYNTHETIC' } as const;

/** Draft → element set, rounded to the precision a TLE carries so exports lose nothing. */
export function draftToElementSet(d: Draft, objectId: string, line: number, rng: Rng): ElementSet {
  const perigeeAlt = d.a * (1 - d.e) - RE;
  const nRevPerDay = round(meanMotionRevPerDay(d.a), 8);
  return {
    objectId,
    name: d.name,
    intlDesignator: null,
    classification: 'U',
    epoch: d.epoch,
    meanMotionRevPerDay: nRevPerDay,
    eccentricity: round(d.e, 7),
    inclinationDeg: round(d.i * RAD_TO_DEG, 4),
    raanDeg: round(wrapTwoPi(d.raan) * RAD_TO_DEG, 4) % 360,
    argPerigeeDeg: round(wrapTwoPi(d.argp) * RAD_TO_DEG, 4) % 360,
    meanAnomalyDeg: round(wrapTwoPi(d.meanAnomaly) * RAD_TO_DEG, 4) % 360,
    bstar: roundSignificant(d.bstar, 5),
    meanMotionDot: round(meanMotionDotHalf(d.bstar, perigeeAlt), 8),
    meanMotionDdot: 0,
    elementSetNo: 1 + rng.int(999),
    revAtEpoch: rng.int(Math.max(1, Math.floor(nRevPerDay * 3000))) % 100000,
    ephemerisType: 0,
    source: { ...SYNTHETIC_SOURCE, line },
  };
}

/**
 * The same set with every element rounded as a TLE prints it (epochs must already be TLE-exact):
 * what a TLE export then writes reads back unchanged.
 */
export function roundToTlePrecision(es: ElementSet): ElementSet {
  return {
    ...es,
    meanMotionRevPerDay: round(es.meanMotionRevPerDay, 8),
    eccentricity: round(es.eccentricity, 7),
    inclinationDeg: round(es.inclinationDeg, 4),
    raanDeg: round(es.raanDeg, 4) % 360,
    argPerigeeDeg: round(es.argPerigeeDeg, 4) % 360,
    meanAnomalyDeg: round(es.meanAnomalyDeg, 4) % 360,
    bstar: roundSignificant(es.bstar, 5),
    meanMotionDot: round(es.meanMotionDot, 8),
  };
}

/** An epoch `ageDays` before the reference, never after it. */
export const epochBefore = (reference: Instant, ageDays: number): Instant =>
  tleExactEpoch(reference - ageDays * MS_PER_DAY, 'floor');
