import { KeepclearError } from '../errors.js';
import type { Cov2, Vec2 } from './encounterGeometry2d.js';
import { pc2dReference } from './pc2dReference.js';

export interface PcMaxResult {
  /** the largest Pc over all scale factors of the covariance shape */
  readonly pc: number;
  /** the factor s with covariance s·shape at the maximum (0 when the miss is inside the disk) */
  readonly scale: number;
}

/** Coarse scan of ln s around the small-R estimate before the golden-section refinement: wide
 * enough to hold the maximum for any R < |miss| (the maximum moves to smaller s as R → |miss|). */
const SCAN_LOW = -14, SCAN_HIGH = 4, SCAN_STEP = 0.5;
/** Golden-section stopping width in ln s; Pc is flat at the maximum, so the Pc error is ~width². */
const LN_S_TOL = 1e-7;

/**
 * Maximum Pc when the covariance is missing or doubtful (Alfano, "Relating Position Uncertainty
 * to Maximum Conjunction Probability", J. Astronaut. Sci. 53(2), 2005): the covariance is taken
 * as s·shape and Pc maximised over s > 0. Without a shape the covariance is isotropic
 * (shape = identity), where for R ≪ d the maximum is R²/(e·d²) at σ = d/√2.
 *
 * For small R, Pc(s) ≈ R²/(2 s √det C0)·exp(−M²/(2s)) with M² = mᵀC0⁻¹m, largest at s = M²/2;
 * we scan around that and refine by golden section on ln s with the reference integrator.
 */
export function pcMax(miss: Vec2, shape: Cov2 | null, radiusM: number, pcFn = pc2dReference): PcMaxResult {
  if (!(radiusM > 0)) return { pc: 0, scale: 0 };
  const d = Math.hypot(miss[0], miss[1]);
  // Miss inside the hard body: Pc → 1 as the covariance shrinks.
  if (d <= radiusM) return { pc: 1, scale: 0 };
  const c0: Cov2 = shape ?? [[1, 0], [0, 1]];
  const a = c0[0][0], b = c0[0][1], c = c0[1][1];
  const det = a * c - b * b;
  if (!(det > 0) || !(a > 0))
    throw new KeepclearError('BAD_ARGUMENT', 'pcMax: the covariance shape must be positive definite');
  const m2 = (c * miss[0] * miss[0] - 2 * b * miss[0] * miss[1] + a * miss[1] * miss[1]) / det;
  const ln0 = Math.log(m2 / 2);
  const f = (lnS: number): number => {
    const s = Math.exp(lnS);
    return pcFn(miss, [[s * a, s * b], [s * b, s * c]], radiusM);
  };
  let best = ln0 + SCAN_LOW, bestVal = -1;
  for (let k = SCAN_LOW; k <= SCAN_HIGH; k += SCAN_STEP) {
    const val = f(ln0 + k);
    if (val > bestVal) {
      bestVal = val;
      best = ln0 + k;
    }
  }
  const g = (Math.sqrt(5) - 1) / 2;
  let lo = best - SCAN_STEP, hi = best + SCAN_STEP;
  let x1 = hi - g * (hi - lo), x2 = lo + g * (hi - lo);
  let f1 = f(x1), f2 = f(x2);
  while (hi - lo > LN_S_TOL) {
    if (f1 < f2) {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + g * (hi - lo);
      f2 = f(x2);
    } else {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - g * (hi - lo);
      f1 = f(x1);
    }
  }
  const lnS = f1 > f2 ? x1 : x2;
  const pc = Math.max(f1, f2, bestVal);
  return { pc, scale: Math.exp(pc === bestVal ? best : lnS) };
}
