/**
 * The one time type inside Keepclear: UTC milliseconds since 1970-01-01T00:00:00Z, as a double.
 *
 * Why a double of milliseconds: at 2026 a double near 1.8e12 ms resolves ~2.4e-4 ms (0.24 µs), far below
 * the 1 ms TCA requirement. Precision is lost only where stated: TLE epochs carry 1e-8 day
 * (0.864 ms) and ISO text is printed to the millisecond.
 * Leap seconds: UTC milliseconds here, like JavaScript Date, ignore them; converting to TT/TAI
 * (frames) goes through `leapSeconds.ts`.
 */
declare const instantBrand: unique symbol;
export type Instant = number & { readonly [instantBrand]: 'utc-ms' };

export const MS_PER_DAY = 86_400_000;
export const MS_PER_S = 1000;

export const instantFromMs = (ms: number): Instant => ms as Instant;
export const addSeconds = (t: Instant, s: number): Instant => (t + s * MS_PER_S) as Instant;
export const secondsBetween = (from: Instant, to: Instant): number => (to - from) / MS_PER_S;

/** Day number and its 'YYYY-MM-DDT' of the last day toIso printed. */
let isoDay = Number.NaN;
let isoDayText = '';
/** Year 10000 (ms): from there on, and before 1970, Date's own formatting (extended years). */
const ISO_FAST_END_MS = 253_402_300_800_000;
const pad2 = (x: number): string => (x < 10 ? '0' : '') + x;

/**
 * ISO 8601 with milliseconds and Z, rounded to the nearest millisecond (edge format): exactly
 * Date's toISOString. The date part is kept for the last day printed and the time of day written
 * from integers: an event's JSON prints ~9 instants, nearly all of one or two days, and
 * Date + toISOString cost ~0.3 µs each (~0.3 s for an all-vs-all run's 10⁵ events, profiled).
 */
export function toIso(t: Instant): string {
  const ms = Math.round(t);
  if (!(ms >= 0 && ms < ISO_FAST_END_MS)) return new Date(ms).toISOString();
  const day = Math.floor(ms / MS_PER_DAY);
  if (day !== isoDay) {
    isoDay = day;
    isoDayText = new Date(day * MS_PER_DAY).toISOString().slice(0, 11);
  }
  let r = ms - day * MS_PER_DAY;
  const milli = r % 1000;
  r = (r - milli) / 1000;
  const sec = r % 60;
  r = (r - sec) / 60;
  const min = r % 60;
  const hour = (r - min) / 60;
  return `${isoDayText}${pad2(hour)}:${pad2(min)}:${pad2(sec)}.${milli < 10 ? '00' : milli < 100 ? '0' : ''}${milli}Z`;
}

const ISO_RE =
  /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?)?(Z|[+-]\d{2}:?\d{2})?$/;

/**
 * Parses ISO 8601 (date, or date-time with optional fraction of any length). A time without zone
 * is taken as UTC (CCSDS messages carry UTC without a "Z"). Returns null when not a valid time.
 * Keeps sub-millisecond fractions (Date.parse would drop them).
 */
export function parseIso(text: string): Instant | null {
  const m = ISO_RE.exec(text.trim());
  if (!m) return null;
  const [, y, mo, d, h = '0', mi = '0', s = '0', frac, zone] = m;
  const year = Number(y), month = Number(mo), day = Number(d);
  const hour = Number(h), minute = Number(mi), second = Number(s);
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 24 || minute > 59 || second > 60)
    return null;
  let ms = Date.UTC(year, month - 1, day, hour, minute, second);
  if (new Date(Date.UTC(year, month - 1, day)).getUTCDate() !== day) return null;
  if (frac) ms += Number(frac) * 1000;
  if (zone && zone !== 'Z') {
    const sign = zone[0] === '-' ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    ms -= sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2))) * 60_000;
  }
  return ms as Instant;
}

/** Day of year (1-based, fractional) form used by TLE and CCSDS "YYYY-DDD" epochs. */
export function instantFromYearDoy(year: number, doyFraction: number): Instant {
  return (Date.UTC(year, 0, 1) + (doyFraction - 1) * MS_PER_DAY) as Instant;
}

/** Julian date (UTC) of an instant; JD of the Unix epoch is 2440587.5. */
export function julianDateUtc(t: Instant): number {
  return t / MS_PER_DAY + 2440587.5;
}
