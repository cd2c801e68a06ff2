import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { erf, erfc } from '../core/risk/erf.js';
import { gaussLegendre } from '../core/risk/gaussLegendre.js';
import { normalInterval } from '../core/risk/normalInterval.js';

const fixture = JSON.parse(readFileSync(new URL('./authorities/pc/pc-fixture.json', import.meta.url), 'utf8')) as {
  erf: { x: number; erf: number; erfc: number }[];
};

/** Cody's approximations and SciPy's (Cephes) are both a few ulp; 50 ulp leaves room for both. */
const ERF_REL_TOL = 50 * Number.EPSILON;
const rel = (a: number, b: number): number => (b === 0 ? Math.abs(a) : Math.abs(a / b - 1));

describe('erf / erfc (Cody 1969) against scipy.special', () => {
  for (const p of fixture.erf) {
    it(`x = ${p.x}`, () => {
      expect(rel(erf(p.x), p.erf)).toBeLessThanOrEqual(ERF_REL_TOL);
      expect(rel(erfc(p.x), p.erfc)).toBeLessThanOrEqual(ERF_REL_TOL);
    });
  }
});

describe('Gauss–Legendre rule', () => {
  // An n-point rule integrates polynomials of degree ≤ 2n−1 exactly (∫₋₁¹ x^k = 2/(k+1), k even).
  const RULE_TOL = 1e-14; // rounding of the sum of n weighted terms
  for (const n of [1, 6, 24]) {
    it(`order ${n} is exact to degree ${2 * n - 1}`, () => {
      const { x, w } = gaussLegendre(n);
      for (let k = 0; k <= 2 * n - 1; k++) {
        let s = 0;
        for (let i = 0; i < n; i++) s += w[i]! * x[i]! ** k;
        expect(Math.abs(s - (k % 2 === 0 ? 2 / (k + 1) : 0))).toBeLessThan(RULE_TOL);
      }
    });
  }
});

describe('normal interval probability', () => {
  // Symmetric interval: P(|Z| < a) = erf(a/√2) exactly (a standard identity).
  const IDENTITY_TOL = 1e-14;
  it('matches erf(a/√2) for narrow and wide symmetric intervals', () => {
    for (const a of [1e-6, 1e-3, 0.1, 0.24, 0.26, 1, 3]) {
      expect(rel(normalInterval(-a, a), erf(a / Math.SQRT2))).toBeLessThan(IDENTITY_TOL);
    }
  });
  it('keeps relative accuracy far in the tail (no cancellation)', () => {
    // P(20 < Z < ∞) = ½ erfc(20/√2); the interval [20, 40] carries all of it to double precision.
    const tail = 0.5 * erfc(20 / Math.SQRT2);
    // x/√2 and x·(1/√2) round differently; erfc amplifies an argument error δ by 2x²·δ/x, so at
    // x ≈ 14 one ulp of argument becomes ~4e-14 relative.
    const TAIL_TOL = 1e-12;
    expect(rel(normalInterval(20, 40), tail)).toBeLessThan(TAIL_TOL);
  });
});
