import { symmetricEigen, type Matrix } from '../math/linalg.js';
import type { Cov2, Vec2 } from './encounterGeometry2d.js';
import { SeededRandom } from './rng.js';

export interface MonteCarloResult {
  readonly pc: number;
  /** binomial standard error √(p(1−p)/n); 0 when no sample (or every sample) hit */
  readonly stdErr: number;
  readonly hits: number;
  readonly samples: number;
}

export interface MonteCarloOptions {
  readonly samples: number;
  readonly seed: number;
}

/** Square root factor S with S·Sᵀ = C from the eigen-decomposition (works for PSD-singular C). */
function sqrtFactor(c: Matrix): Matrix {
  const { values, vectors } = symmetricEigen(c);
  return vectors.map((row) => row.map((x, k) => x * Math.sqrt(Math.max(values[k]!, 0))));
}

const result = (hits: number, n: number): MonteCarloResult => {
  const p = hits / n;
  return { pc: p, stdErr: Math.sqrt((p * (1 - p)) / n), hits, samples: n };
};

/** Monte Carlo of the 2-D Pc: draw the relative position in the encounter plane, count hits. */
export function pcMonteCarlo2d(miss: Vec2, cov: Cov2, radiusM: number, opt: MonteCarloOptions): MonteCarloResult {
  const s = sqrtFactor([[...cov[0]], [...cov[1]]]);
  const rng = new SeededRandom(opt.seed);
  const r2 = radiusM * radiusM;
  let hits = 0;
  for (let i = 0; i < opt.samples; i++) {
    const z0 = rng.normal(), z1 = rng.normal();
    const x = miss[0] + s[0]![0]! * z0 + s[0]![1]! * z1;
    const y = miss[1] + s[1]![0]! * z0 + s[1]![1]! * z1;
    if (x * x + y * y <= r2) hits++;
  }
  return result(hits, opt.samples);
}

/**
 * Monte Carlo in 3-D: the relative position at TCA is drawn from N(relPos, combined covariance)
 * and moved along the straight line of the (fixed) relative velocity; a hit is a closest approach
 * of that line within R. Under straight-line motion this equals the 2-D projection, so it checks
 * the projection code independently.
 */
export function pcMonteCarlo3d(
  relPosM: readonly [number, number, number],
  relVelMps: readonly [number, number, number],
  combinedCovM2: Matrix,
  radiusM: number,
  opt: MonteCarloOptions,
): MonteCarloResult {
  const s = sqrtFactor(combinedCovM2);
  const vn = Math.hypot(...relVelMps);
  const e = relVelMps.map((x) => x / vn) as [number, number, number];
  const rng = new SeededRandom(opt.seed);
  const r2 = radiusM * radiusM;
  let hits = 0;
  const p = [0, 0, 0];
  for (let i = 0; i < opt.samples; i++) {
    const z0 = rng.normal(), z1 = rng.normal(), z2 = rng.normal();
    for (let k = 0; k < 3; k++) {
      const row = s[k]!;
      p[k] = relPosM[k]! + row[0]! * z0 + row[1]! * z1 + row[2]! * z2;
    }
    const along = p[0]! * e[0] + p[1]! * e[1] + p[2]! * e[2];
    const d2 = p[0]! * p[0]! + p[1]! * p[1]! + p[2]! * p[2]! - along * along;
    if (d2 <= r2) hits++;
  }
  return result(hits, opt.samples);
}
