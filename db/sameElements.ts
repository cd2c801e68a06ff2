import type { OrbitElements } from '../core/elements/elementSet.js';

/**
 * When two element sets are "the same set". Not SQL: the rule is shared by the store (idempotent
 * re-import) and the catalogue fingerprint.
 */

/**
 * Epochs closer than this are the same epoch. A TLE epoch is quantised to 1e-8 day = 0.864 ms, so
 * the same set read from a TLE and from an OMM (microseconds) can differ by up to 0.432 ms;
 * distinct sets of one object are hours apart.
 */
export const EPOCH_MATCH_MS = 0.5;

/**
 * Significant digits compared. TLE fields carry at most 8 digits and OMM text rarely more than
 * 13; 12 digits absorbs the last-bit differences of parsing one decimal through different paths
 * (e.g. "0.12345e-4" vs "1.2345E-05") while any real change of a field is still seen.
 */
export const ELEMENT_DIGITS = 12;

const num = (x: number): string => (x === 0 ? '0' : x.toPrecision(ELEMENT_DIGITS));

/** Canonical text of the orbit-defining fields (not name, designator or source). */
export function elementsKey(s: OrbitElements): string {
  return [
    s.classification,
    num(s.meanMotionRevPerDay),
    num(s.eccentricity),
    num(s.inclinationDeg),
    num(s.raanDeg),
    num(s.argPerigeeDeg),
    num(s.meanAnomalyDeg),
    num(s.bstar),
    num(s.meanMotionDot),
    num(s.meanMotionDdot),
    String(s.elementSetNo),
    String(s.revAtEpoch),
    String(s.ephemerisType),
  ].join('|');
}
