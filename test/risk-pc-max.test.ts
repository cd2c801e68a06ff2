import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { pcMax } from '../core/risk/pcMax.js';

const fixture = JSON.parse(readFileSync(new URL('./authorities/pc/pc-fixture.json', import.meta.url), 'utf8')) as {
  maxIsotropic: { missM: number; radiusM: number; sigmaAtMaxM: number; pcMax: number }[];
  maxShape: { miss: [number, number]; covShape: [[number, number], [number, number]]; radiusM: number; scaleAtMax: number; pcMax: number }[];
};

/** SciPy's Brent search stops at tol 1e-12 (isotropic) / 1e-10 (shape) in ln σ or ln s; at a
 * maximum the Pc error is quadratic in that, so values agree far below this. The dblquad
 * values carry ~1e-12. */
const MAX_PC_REL_TOL = 1e-8;
/** Position of the maximum: Pc is flat there, so its argument is only good to ~√(Pc error). */
const ARGMAX_REL_TOL = 1e-3;

describe('maximum Pc, isotropic covariance of unknown size (Alfano 2005)', () => {
  it('small R/d: Pc_max ≈ R²/(e·d²) at σ = d/√2 (closed form, leading order in R/d)', () => {
    const d = 2000, r = 4; // R/d = 2e-3: next-order terms are O((R/d)²) relative
    const SMALL_R_REL_TOL = 1e-5;
    const res = pcMax([d, 0], null, r);
    expect(Math.abs(res.pc / ((r * r) / (Math.E * d * d)) - 1)).toBeLessThan(SMALL_R_REL_TOL);
    expect(Math.abs(Math.sqrt(res.scale) / (d / Math.SQRT2) - 1)).toBeLessThan(ARGMAX_REL_TOL);
  });
  for (const c of fixture.maxIsotropic) {
    it(`d = ${c.missM} m, R = ${c.radiusM} m vs SciPy maximisation of ncx2.cdf`, () => {
      const res = pcMax([c.missM * 0.28, c.missM * 0.96], null, c.radiusM);
      expect(Math.abs(res.pc / c.pcMax - 1)).toBeLessThan(MAX_PC_REL_TOL);
      expect(Math.abs(Math.sqrt(res.scale) / c.sigmaAtMaxM - 1)).toBeLessThan(ARGMAX_REL_TOL);
    });
  }
  it('miss inside the hard body: Pc_max = 1', () => {
    expect(pcMax([3, 0], null, 5).pc).toBe(1);
  });
});

describe('maximum Pc over the scale of a given covariance shape vs SciPy brute force (dblquad + Brent)', () => {
  for (const c of fixture.maxShape) {
    it(`miss ${c.miss.join(', ')} m`, () => {
      const res = pcMax(c.miss, c.covShape, c.radiusM);
      expect(Math.abs(res.pc / c.pcMax - 1)).toBeLessThan(MAX_PC_REL_TOL);
      expect(Math.abs(res.scale / c.scaleAtMax - 1)).toBeLessThan(ARGMAX_REL_TOL);
    });
  }
});
