/**
 * Time regions, the one toolkit for them: a flat, sorted list of disjoint closed intervals
 * [a0, b0, a1, b1, …] in ms (no tuple per region: filters produce hundreds per pair). Build by
 * appending in order of start (`pushRegion`, which clips and merges), pad/clip/merge a finished
 * list (`padClipMerge`), intersect two lists (`intersectRegions`).
 */
export type Regions = number[];

/**
 * Appends [a, b] ∩ [lo, hi] to `out`, merging with the last region when they touch or overlap;
 * an empty intersection adds nothing. Regions must arrive in order of their start.
 */
export function pushRegion(out: Regions, a: number, b: number, lo = -Infinity, hi = Infinity): void {
  if (a < lo) a = lo;
  if (b > hi) b = hi;
  if (b < a) return;
  const n = out.length;
  if (n > 0 && out[n - 1]! >= a) {
    if (b > out[n - 1]!) out[n - 1] = b;
  } else out.push(a, b);
}

/** Each region widened by `pad` on both sides, clipped to [lo, hi], overlaps merged. */
export function padClipMerge(regions: Regions, pad: number, lo: number, hi: number): Regions {
  // Sorted and disjoint in, so the padded starts stay in order: one pass.
  const out: Regions = [];
  for (let r = 0; r < regions.length; r += 2) pushRegion(out, regions[r]! - pad, regions[r + 1]! + pad, lo, hi);
  return out;
}

/** Intersection of two sorted disjoint lists. */
export function intersectRegions(x: Regions, y: Regions): Regions {
  const out: Regions = [];
  let i = 0, k = 0;
  while (i < x.length && k < y.length) {
    const a = x[i]!, b = x[i + 1]!;
    const c = y[k]!, d = y[k + 1]!;
    const lo = Math.max(a, c), hi = Math.min(b, d);
    if (lo <= hi) out.push(lo, hi);
    if (b < d) i += 2;
    else k += 2;
  }
  return out;
}

/** Total length of the regions (ms). */
export const regionsLength = (r: Regions): number => {
  let s = 0;
  for (let i = 0; i < r.length; i += 2) s += r[i + 1]! - r[i]!;
  return s;
};
