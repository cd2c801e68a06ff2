import { describe, expect, it } from 'vitest';
import type { Cov2, Vec2 } from '../core/risk/encounterGeometry2d.js';
import { FAST_MAX_R_OVER_SIGMA, pc2dFast, PC_FAST_FLOOR, PC_FAST_REL_ERROR_BOUND } from '../core/risk/pc2dFast.js';
import { pc2dReference } from '../core/risk/pc2dReference.js';

/** Covariance with σ1 along angle t and σ2 across it. */
function rotated(s1: number, s2: number, t: number): Cov2 {
  const c = Math.cos(t), s = Math.sin(t);
  const a = c * c * s1 * s1 + s * s * s2 * s2, b = c * s * (s1 * s1 - s2 * s2), d = s * s * s1 * s1 + c * c * s2 * s2;
  return [[a, b], [b, d]];
}

describe('pc2dFast: stated error bound against the reference integrator', () => {
  it(`|fast − ref| ≤ ${PC_FAST_REL_ERROR_BOUND}·max(ref, ${PC_FAST_FLOOR}) over a grid of geometries`, () => {
    // The reference is itself checked against SciPy (risk-pc-closed-form, risk-pc-anisotropic).
    let worst = 0;
    for (const rOverSigma of [1e-3, 0.1, 0.5, 1, FAST_MAX_R_OVER_SIGMA, 5])
      for (const ratio of [1, 0.3, 0.05, 0.01])
        for (const missSigmas of [0, 0.5, 2, 6, 15])
          for (const t of [0, 0.4, 1.3]) {
            const cov = rotated(100, 100 * ratio, t);
            const r = rOverSigma * 100 * ratio;
            const miss: Vec2 = [missSigmas * 100 * 0.8, missSigmas * 100 * ratio * 0.6];
            const ref = pc2dReference(miss, cov, r);
            const err = Math.abs(pc2dFast(miss, cov, r) - ref) / Math.max(ref, PC_FAST_FLOOR);
            worst = Math.max(worst, err);
          }
    console.log(`pc2dFast worst scaled error on the grid: ${worst.toExponential(2)}`);
    expect(worst).toBeLessThanOrEqual(PC_FAST_REL_ERROR_BOUND);
  });

  it('speed (informational, printed): calls per second', () => {
    const cov: Cov2 = [[4e4, 1e4], [1e4, 1e4]];
    const n = 100_000;
    let sink = 0;
    for (let i = 0; i < 2000; i++) sink += pc2dFast([100 + i * 1e-3, 50], cov, 15); // warm-up
    const t0 = performance.now();
    for (let i = 0; i < n; i++) sink += pc2dFast([100 + i * 1e-3, 50], cov, 15);
    const rate = n / ((performance.now() - t0) / 1000);
    console.log(`pc2dFast: ${Math.round(rate)} calls/s`);
    expect(sink).toBeGreaterThan(0);
  });
});
