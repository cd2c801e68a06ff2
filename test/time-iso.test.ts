/**
 * toIso (core/time/instant.ts) writes the time of day itself and keeps the date of the last day
 * printed. Reference: the JavaScript engine's own Date.prototype.toISOString (ECMA-262, "Date
 * Time String Format"), which toIso must equal character for character, rounding included.
 */
import { describe, expect, it } from 'vitest';
import { toIso, MS_PER_DAY, type Instant } from '../core/time/instant.js';
import { Rng } from '../core/synthetic/random.js';

const reference = (t: number): string => new Date(Math.round(t)).toISOString();

describe('toIso equals Date.prototype.toISOString', () => {
  it('at random instants from 1970 to 9999, in any order (the kept day changes both ways)', () => {
    const rng = new Rng(3);
    let checked = 0;
    for (let k = 0; k < 20_000; k++) {
      const t = rng.uniform(0, 253_402_300_800_000);
      expect(toIso(t as Instant), String(t)).toBe(reference(t));
      checked++;
    }
    expect(checked).toBe(20_000);
  });

  it('around day boundaries, leap days and millisecond rounding', () => {
    const days = [0, 59, 789, 11_016, 20_454, 20_455, 2_932_896 - 1].map((d) => d * MS_PER_DAY); // incl. 2000-02-29, 2026-01-01, 9999-12-31
    for (const d of days) {
      for (const dt of [-1000.5, -1, -0.5, -0.49, 0, 0.49, 0.5, 1, 999, 999.5, 1000, 59_999.5, 3_599_999.6, MS_PER_DAY - 0.5, MS_PER_DAY - 0.51]) {
        const t = d + dt;
        expect(toIso(t as Instant), String(t)).toBe(reference(t));
      }
    }
  });

  it('outside the fast range: before 1970 and from year 10000 on', () => {
    for (const t of [-1, -0.6, -MS_PER_DAY * 365.25 * 100, 253_402_300_800_000, 253_402_300_799_999.5, 8.64e15]) {
      expect(toIso(t as Instant), String(t)).toBe(reference(t));
    }
  });
});
