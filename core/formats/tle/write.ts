/**
 * TLE writer: exact-column lines with checksums, Alpha-5 catalogue numbers from 100000.
 * Values that a TLE field cannot hold are an error, never silently clipped.
 */
import type { ElementSet } from '../../elements/elementSet.js';
import { KeepclearError } from '../../errors.js';
import { MS_PER_DAY } from '../../time/instant.js';
import {
  designatorToTle,
  encodeCatalogNumber,
  encodeExpField,
  tleChecksum,
} from './fields.js';

const fail = (es: ElementSet, what: string): never => {
  throw new KeepclearError(
    'VALUE_OUT_OF_RANGE',
    `object ${es.objectId}: ${what} cannot be written in a TLE; export this set as OMM instead`,
  );
};

/** YYDDD.DDDDDDDD; the day fraction is rounded to 1e-8 day (0.864 ms), the TLE resolution. */
function epochField(es: ElementSet): string {
  let year = new Date(es.epoch).getUTCFullYear();
  let doy = ((es.epoch - Date.UTC(year, 0, 1)) / MS_PER_DAY + 1).toFixed(8);
  const daysInYear = (Date.UTC(year + 1, 0, 1) - Date.UTC(year, 0, 1)) / MS_PER_DAY;
  // Rounding to 8 decimals can reach the first instant of the next year.
  if (Number(doy) >= daysInYear + 1) {
    year += 1;
    doy = (Number(doy) - daysInYear).toFixed(8);
  }
  if (year < 1957 || year > 2056) fail(es, `epoch year ${year} (TLE years cover 1957..2056)`);
  return String(year % 100).padStart(2, '0') + doy.padStart(12, '0');
}

/** First derivative field: sign and 8 decimals with no leading zero, " .00001234". */
function ndotField(es: ElementSet): string {
  const x = es.meanMotionDot;
  const body = Math.abs(x).toFixed(8);
  if (!Number.isFinite(x) || body.startsWith('1') || body.length !== 10)
    fail(es, `first derivative of mean motion ${x}`);
  return (x < 0 ? '-' : ' ') + body.slice(1);
}

function expField(es: ElementSet, x: number, what: string): string {
  return encodeExpField(x) ?? fail(es, `${what} ${x}`);
}

/** Angle in 8 columns, 4 decimals; 360.0000 after rounding folds to 0. */
function angleField(x: number): string {
  const t = x.toFixed(4);
  return (t === '360.0000' ? '0.0000' : t).padStart(8, ' ');
}

const withChecksum = (l: string): string => l + String(tleChecksum(l));

/** Lines 1 and 2 of one element set. */
export function formatTle(es: ElementSet): [line1: string, line2: string] {
  const cat = encodeCatalogNumber(Number(es.objectId));
  if (cat === null || !/^\d+$/.test(es.objectId))
    fail(es, `catalogue number '${es.objectId}' (0..339999 with Alpha-5)`);
  if (!(es.eccentricity >= 0 && es.eccentricity < 1)) fail(es, `eccentricity ${es.eccentricity}`);
  if (!(es.meanMotionRevPerDay > 0 && es.meanMotionRevPerDay < 100)) fail(es, `mean motion ${es.meanMotionRevPerDay}`);
  const ecc = Math.round(es.eccentricity * 1e7);
  if (ecc >= 1e7) fail(es, `eccentricity ${es.eccentricity} (rounds to 1)`);
  const cls = /^[UCS]$/.test(es.classification) ? es.classification : 'U';
  const l1 =
    `1 ${cat}${cls} ${designatorToTle(es.intlDesignator)} ${epochField(es)} ` +
    `${ndotField(es)} ${expField(es, es.meanMotionDdot, 'second derivative of mean motion')} ` +
    `${expField(es, es.bstar, 'B*')} ${String(es.ephemerisType % 10)} ` +
    `${String(es.elementSetNo % 10_000).padStart(4, ' ')}`;
  const l2 =
    `2 ${cat} ${angleField(es.inclinationDeg)} ${angleField(es.raanDeg)} ` +
    `${String(ecc).padStart(7, '0')} ${angleField(es.argPerigeeDeg)} ` +
    `${angleField(es.meanAnomalyDeg)} ${es.meanMotionRevPerDay.toFixed(8).padStart(11, ' ')}` +
    // The revolution counter wraps at 100000 in the 5-column field (common practice).
    `${String(es.revAtEpoch % 100_000).padStart(5, ' ')}`;
  return [withChecksum(l1), withChecksum(l2)];
}

/** One record as text: a name line ("0 NAME" is not used; plain name) when asked and known. */
export function formatTleRecord(es: ElementSet, withName = true): string {
  const [l1, l2] = formatTle(es);
  return withName && es.name !== null ? `${es.name}\n${l1}\n${l2}` : `${l1}\n${l2}`;
}

/** A whole file, one record after another, ending with a newline. */
export function formatTleFile(sets: readonly ElementSet[], withName = true): string {
  return sets.map((s) => formatTleRecord(s, withName)).join('\n') + '\n';
}
