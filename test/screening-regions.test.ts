/**
 * The time-region toolkit (core/screening/regions.ts) against a brute-force reference: each
 * operation's result, as a set of instants on a fine integer grid, equals the same set built
 * point by point (membership of closed intervals). Random inputs from the seeded generator.
 */
import { describe, expect, it } from 'vitest';
import { intersectRegions, padClipMerge, pushRegion, regionsLength, type Regions } from '../core/screening/regions.js';
import { Rng } from '../core/synthetic/random.js';

const inAny = (r: Regions, t: number): boolean => {
  for (let i = 0; i < r.length; i += 2) if (r[i]! <= t && t <= r[i + 1]!) return true;
  return false;
};
const members = (r: Regions, lo: number, hi: number): boolean[] => {
  const out: boolean[] = [];
  for (let t = lo; t <= hi; t++) out.push(inAny(r, t));
  return out;
};
const sortedDisjoint = (r: Regions): boolean => r.every((x, i) => i === 0 || x > r[i - 1]! || (i % 2 === 1 && x >= r[i - 1]!));

/** Random intervals in order of start, some overlapping or touching. */
function randomIntervals(rng: Rng, n: number): [number, number][] {
  const out: [number, number][] = [];
  let a = 0;
  for (let k = 0; k < n; k++) {
    a += Math.floor(rng.uniform(0, 12));
    out.push([a, a + Math.floor(rng.uniform(0, 10))]);
  }
  return out;
}

describe('time regions', () => {
  it('pushRegion builds sorted disjoint regions equal to the union, clipped', () => {
    const rng = new Rng(3);
    for (let trial = 0; trial < 50; trial++) {
      const iv = randomIntervals(rng, 20);
      const lo = 15, hi = 120;
      const r: Regions = [];
      for (const [a, b] of iv) pushRegion(r, a, b, lo, hi);
      expect(sortedDisjoint(r)).toBe(true);
      const ref = members([], lo, hi).map((_, k) => iv.some(([a, b]) => a <= lo + k && lo + k <= b));
      expect(members(r, lo, hi)).toEqual(ref);
      expect(members(r, 0, lo - 1).some(Boolean)).toBe(false);
    }
  });

  it('padClipMerge widens each region, clips and merges', () => {
    const rng = new Rng(4);
    for (let trial = 0; trial < 50; trial++) {
      const r: Regions = [];
      for (const [a, b] of randomIntervals(rng, 12)) pushRegion(r, a, b);
      const pad = Math.floor(rng.uniform(0, 5)), lo = 5, hi = 90;
      const out = padClipMerge(r, pad, lo, hi);
      expect(sortedDisjoint(out)).toBe(true);
      const ref = members([], lo, hi).map((_, k) => {
        const t = lo + k;
        for (let i = 0; i < r.length; i += 2) if (r[i]! - pad <= t && t <= r[i + 1]! + pad) return true;
        return false;
      });
      expect(members(out, lo, hi)).toEqual(ref);
      expect(out.every((x) => x >= lo && x <= hi)).toBe(true);
    }
  });

  it('intersectRegions is the set intersection', () => {
    const rng = new Rng(5);
    for (let trial = 0; trial < 50; trial++) {
      const x: Regions = [], y: Regions = [];
      for (const [a, b] of randomIntervals(rng, 10)) pushRegion(x, a, b);
      for (const [a, b] of randomIntervals(rng, 10)) pushRegion(y, a, b);
      const z = intersectRegions(x, y);
      expect(sortedDisjoint(z)).toBe(true);
      const ref = members(x, 0, 130).map((m, k) => m && inAny(y, k));
      expect(members(z, 0, 130)).toEqual(ref);
    }
    expect(regionsLength([0, 2, 5, 9])).toBe(6);
  });
});
