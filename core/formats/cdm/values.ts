/**
 * Value syntax of CCSDS navigation messages as the CDM uses it: numbers and UTC times
 * (CCSDS 508.0-B-1 section 6 / CCSDS 502.0 conventions), read strictly and written back so that
 * reading the text again gives the same double.
 */
import { instantFromMs, MS_PER_DAY, parseIso, type Instant } from '../../time/instant.js';

const NUMBER_RE = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const INTEGER_RE = /^[+-]?\d+$/;

/** A decimal or E-notation number; null when the text is anything else (no hex, no "NaN"). */
export function parseCdmNumber(text: string): number | null {
  const t = text.trim();
  return NUMBER_RE.test(t) ? Number(t) : null;
}

export function parseCdmInteger(text: string): number | null {
  const t = text.trim();
  return INTEGER_RE.test(t) ? Number(t) : null;
}

const CAL_RE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(?:\.\d+)?Z?$/;
const DOY_RE = /^(\d{4})-(\d{3})T(\d{2}):(\d{2}):(\d{2}(?:\.\d+)?)Z?$/;

/**
 * UTC time in either CCSDS form: YYYY-MM-DDThh:mm:ss[.d…][Z] or YYYY-DDDThh:mm:ss[.d…][Z].
 * Fractions below a millisecond are kept (Instant is a double of ms).
 */
export function parseCcsdsTime(text: string): Instant | null {
  const t = text.trim();
  if (CAL_RE.test(t)) return parseIso(t);
  const m = DOY_RE.exec(t);
  if (!m) return null;
  const [, y, doy, h, mi, s] = m;
  const day = Number(doy);
  const year = Number(y);
  const daysInYear = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 366 : 365;
  if (day < 1 || day > daysInYear || Number(h) > 23 || Number(mi) > 59 || Number(s) >= 61) return null;
  // Summed in ms rather than via a fractional day so whole milliseconds stay exact.
  const msOfDay = (Number(h) * 3600 + Number(mi) * 60) * 1000 + Number(s) * 1000;
  return instantFromMs(Date.UTC(year, 0, 1) + (day - 1) * MS_PER_DAY + msOfDay);
}

/**
 * Calendar form without zone letter, as the standard's examples print it. Whole milliseconds
 * print with 3 decimals; a sub-millisecond part adds 3 more (microseconds), which is as far as a
 * double of ms near 2030 resolves (~0.2 µs).
 */
export function formatCcsdsTime(t: Instant): string {
  const whole = Math.floor(t);
  const subMs = t - whole;
  const base = new Date(whole).toISOString().slice(0, -1);
  const micro = Math.round(subMs * 1000);
  if (micro === 0) return base;
  if (micro === 1000) return new Date(whole + 1).toISOString().slice(0, -1);
  return base + String(micro).padStart(3, '0');
}

/**
 * Shortest text that reads back to the same double (JavaScript's number-to-string guarantees
 * that), in E-notation outside [1e-3, 1e7) so covariance terms look like the standard's.
 */
export function formatCdmNumber(x: number): string {
  const a = Math.abs(x);
  if (a === 0 || (a >= 1e-3 && a < 1e7)) return String(x);
  return x.toExponential().toUpperCase();
}
