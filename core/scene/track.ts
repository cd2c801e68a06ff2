import type { Vec3n } from './ellipsoid.js';

/**
 * Linear interpolation of a sampled track (flat xyz) at time t (s from TCA), clamped to its ends.
 * Shared by the renderer (markers follow the scrubber) and tests.
 */
export function trackPointAt(timesS: readonly number[], flat: readonly number[], t: number): Vec3n {
  const n = timesS.length;
  if (n === 0) return [NaN, NaN, NaN];
  if (t <= timesS[0]!) return [flat[0]!, flat[1]!, flat[2]!];
  if (t >= timesS[n - 1]!) return [flat[3 * n - 3]!, flat[3 * n - 2]!, flat[3 * n - 1]!];
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (timesS[mid]! <= t) lo = mid;
    else hi = mid;
  }
  const f = (t - timesS[lo]!) / (timesS[hi]! - timesS[lo]!);
  return [0, 1, 2].map((c) => flat[3 * lo + c]! + f * (flat[3 * hi + c]! - flat[3 * lo + c]!)) as unknown as Vec3n;
}
