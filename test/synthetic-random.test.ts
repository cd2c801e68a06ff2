import { describe, expect, it } from 'vitest';
import { Rng } from '../core/synthetic/random.js';

const draw = (seed: number, n: number): number[] => {
  const r = new Rng(seed);
  return Array.from({ length: n }, () => r.next());
};

describe('seeded random numbers', () => {
  it('repeats exactly for the same seed and differs for another', () => {
    expect(draw(42, 1000)).toEqual(draw(42, 1000));
    const a = draw(1, 100), b = draw(2, 100);
    expect(a.filter((x, k) => x === b[k]).length).toBe(0);
  });

  it('forked streams are reproducible and independent of each other', () => {
    const f = (label: number): number[] => {
      const r = new Rng(7).fork(label);
      return Array.from({ length: 50 }, () => r.next());
    };
    expect(f(3)).toEqual(f(3));
    expect(f(3)).not.toEqual(f(4));
  });

  it('uniform draws fill [0, 1) evenly', () => {
    const xs = draw(9, 100_000);
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...xs)).toBeLessThan(1);
    // Ten bins of 10,000 expected each; binomial σ ≈ 95, so ±500 is over 5σ.
    const bins = new Array<number>(10).fill(0);
    for (const x of xs) bins[Math.floor(x * 10)]!++;
    for (const b of bins) expect(Math.abs(b - 10_000)).toBeLessThan(500);
  });

  it('normal draws have the asked mean and standard deviation', () => {
    const r = new Rng(5);
    const n = 100_000;
    const xs = Array.from({ length: n }, () => r.normal(3, 2));
    const mean = xs.reduce((s, x) => s + x, 0) / n;
    const sd = Math.sqrt(xs.reduce((s, x) => s + (x - mean) ** 2, 0) / (n - 1));
    // Standard error of the mean is 2/√n ≈ 0.0063; of the sd about 0.0045. Bounds are ~5σ.
    expect(Math.abs(mean - 3)).toBeLessThan(0.032);
    expect(Math.abs(sd - 2)).toBeLessThan(0.023);
    // Normal: about 68.27 % within one sd.
    const within = xs.filter((x) => Math.abs(x - 3) < 2).length / n;
    expect(Math.abs(within - 0.6827)).toBeLessThan(0.01);
  });

  it('directions are unit vectors spread over the sphere', () => {
    const r = new Rng(11);
    let sz = 0;
    for (let k = 0; k < 20_000; k++) {
      const d = r.direction();
      expect(Math.abs(Math.hypot(...d) - 1)).toBeLessThan(1e-12);
      sz += d[2];
    }
    // Mean z of a uniform sphere is 0 with σ = 1/√(3·20000) ≈ 0.004.
    expect(Math.abs(sz / 20_000)).toBeLessThan(0.02);
  });
});
