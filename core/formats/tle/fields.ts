/**
 * Field encodings shared by the TLE reader and writer: Alpha-5 catalogue numbers, the
 * implied-decimal exponent fields (B*, n̈/6), two-digit years, international designators and
 * the line checksum. Kept in one place so reader and writer cannot disagree.
 */

import { ALPHA5_MAX, alpha5ToNumber, numberToAlpha5 } from '../../elements/objectId.js';

export { ALPHA5_MAX };

/**
 * Decodes the 5-character catalogue field. Returns the number, or null when the text is not a
 * catalogue number. Leading spaces are accepted because some older generators right-align
 * without zero padding (common practice; python-sgp4 reads them too).
 */
export function decodeCatalogNumber(field: string): number | null {
  if (field.length !== 5) return null;
  if (/^[A-Z]/.test(field)) return alpha5ToNumber(field);
  if (!/^ *\d+$/.test(field)) return null;
  return Number(field);
}

/** Encodes a catalogue number in 5 columns (Alpha-5 from 100000); null if out of range. */
export function encodeCatalogNumber(n: number): string | null {
  if (!Number.isInteger(n) || n < 0 || n > ALPHA5_MAX) return null;
  return n < 100_000 ? String(n).padStart(5, '0') : numberToAlpha5(n);
}

/** TLE checksum of columns 1–68: sum of digits, plus 1 for each '-', modulo 10. */
export function tleChecksum(line: string): number {
  let sum = 0;
  const end = Math.min(line.length, 68);
  for (let i = 0; i < end; i++) {
    const c = line.charCodeAt(i);
    if (c >= 48 && c <= 57) sum += c - 48;
    else if (c === 45) sum += 1;
  }
  return sum % 10;
}

/**
 * Two-digit TLE/designator year: 57–99 → 19xx, 00–56 → 20xx (the first satellite was
 * catalogued in 1957; common practice, used by Spacetrack Report #3 era software).
 */
export const fullYear = (yy: number): number => (yy >= 57 ? 1900 + yy : 2000 + yy);

/**
 * Implied-decimal exponent field, 8 columns "SMMMMMEX" e.g. " 28098-4" = 0.28098e-4.
 * A space in the exponent sign is read as '+', as older generators wrote it.
 */
const EXP_FIELD_RE = /^([ +-])(\d{5})([ +-])(\d)$/;

export function decodeExpField(field: string): number | null {
  const m = EXP_FIELD_RE.exec(field);
  if (!m) return null;
  const sign = m[1] === '-' ? '-' : '';
  const expSign = m[3] === '-' ? '-' : '';
  // Parsing the decimal text as a whole keeps the value as close as a double can get.
  return Number(`${sign}0.${m[2]}e${expSign}${m[4]}`);
}

/** Encodes a value in the 8-column implied-decimal form; null if |x| ≥ 1e9 cannot fit. */
export function encodeExpField(x: number): string | null {
  if (!Number.isFinite(x)) return null;
  if (x === 0) return ' 00000-0';
  const [mant = '', expText = '0'] = Math.abs(x).toExponential(4).split('e');
  const digits = mant.replace('.', '');
  const exp = Number(expText) + 1; // d.dddd·10^k = 0.ddddd·10^(k+1)
  if (exp > 9) return null;
  // Below 0.00001e-9 the field cannot hold the value: it is written as zero, as generators do.
  if (exp < -9) return ' 00000-0';
  return `${x < 0 ? '-' : ' '}${digits}${exp < 0 ? '-' : '+'}${Math.abs(exp)}`;
}

/** TLE "58002B  " → OMM "1958-002B"; null when blank (analyst objects often have none). */
export function designatorToOmm(field: string): string | null | undefined {
  const t = field.trim();
  if (t === '') return null;
  const m = /^(\d{2})(\d{3})([A-Z]{1,3})$/.exec(t);
  if (!m) return undefined;
  return `${fullYear(Number(m[1]))}-${m[2]}${m[3]}`;
}

/** OMM "1958-002B" → TLE 8 columns "58002B  "; blank when unknown or not in that form. */
export function designatorToTle(id: string | null): string {
  const m = id === null ? null : /^\d{2}(\d{2})-(\d{3})([A-Z]{1,3})$/.exec(id);
  if (!m) return '        ';
  return `${m[1]}${m[2]}${m[3]}`.padEnd(8, ' ');
}
