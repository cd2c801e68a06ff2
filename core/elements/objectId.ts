/**
 * Object ids: THE one place that turns what a file or a user names an object by into the id the
 * database keys it by. Catalogue numbers are stored in decimal without leading zeros ("00005" →
 * "5"); an Alpha-5 number is decoded ("A0001" → "100001"); anything else (an international
 * designator such as "2026-100A", an analyst's name) is kept as written, trimmed.
 *
 * Alpha-5 (common practice for catalogue numbers above 99,999 in the 5 columns of a TLE): a
 * letter A–Z without I and O (so they cannot be read as 1 and 0) stands for 10–33, followed by
 * 4 digits: A0000 = 100,000, Z9999 = 339,999.
 */

export const ALPHA5_LETTERS = 'ABCDEFGHJKLMNPQRSTUVWXYZ';
/** Largest catalogue number Alpha-5 can express: Z9999 = 33·10000 + 9999. */
export const ALPHA5_MAX = 339_999;

/** "A0001" → 100001; null when the text is not an Alpha-5 number (letter + 4 digits). */
export function alpha5ToNumber(text: string): number | null {
  const m = /^([A-Z])(\d{4})$/.exec(text);
  if (!m) return null;
  const k = ALPHA5_LETTERS.indexOf(m[1]!);
  return k < 0 ? null : (k + 10) * 10_000 + Number(m[2]);
}

/** 100001 → "A0001"; null outside 100,000..339,999 (below, the number is written as digits). */
export function numberToAlpha5(n: number): string | null {
  if (!Number.isInteger(n) || n < 100_000 || n > ALPHA5_MAX) return null;
  return ALPHA5_LETTERS[Math.floor(n / 10_000) - 10]! + String(n % 10_000).padStart(4, '0');
}

/**
 * The canonical id of an object from any designator a file or a user gives: digits with or
 * without leading zeros, an Alpha-5 number (either case), or another designator kept as written.
 * A blank text gives '' (callers say what was expected there).
 */
export function canonicalObjectId(text: string): string {
  const t = text.trim();
  // Leading zeros go as text, so a number of any length stays exact.
  if (/^\d+$/.test(t)) return t.replace(/^0+(?=\d)/, '');
  const n = alpha5ToNumber(t.toUpperCase());
  return n === null ? t : String(n);
}
