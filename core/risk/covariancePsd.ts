import { asymmetry, nearestPsd, symmetrize, type Matrix } from '../math/linalg.js';

/**
 * Negative eigenvalues up to this fraction of the largest are rounding from the producer's
 * printing/propagation and are repaired silently-ish (noted); larger ones mean the matrix is
 * not a covariance, and it is called "doubtful" (Pc then falls back to maximum Pc). Our choice.
 */
export const REPAIRABLE_NEGATIVE_FRACTION = 1e-3;
/** Asymmetry beyond this (relative to the largest diagonal) also makes a covariance doubtful. */
export const MAX_ASYMMETRY = 1e-6;

export interface CheckedCovariance {
  readonly matrix: Matrix;
  readonly status: 'ok' | 'repaired' | 'doubtful';
  readonly note: string | null;
}

/** Symmetrise, then clip negative eigenvalues (Higham 1988, via nearestPsd); grade the repair. */
export function checkCovariance(c: Matrix, label: string): CheckedCovariance {
  if (!c.every((row) => row.every(Number.isFinite)))
    return { matrix: c, status: 'doubtful', note: `${label}: covariance has non-finite entries` };
  const asym = asymmetry(c);
  const sym = symmetrize(c);
  const { matrix, clipped } = nearestPsd(sym);
  const maxDiag = Math.max(...sym.map((row, i) => Math.abs(row[i]!)));
  if (!(maxDiag > 0)) return { matrix, status: 'doubtful', note: `${label}: covariance is zero` };
  const worst = clipped.length ? -Math.min(...clipped) / maxDiag : 0;
  if (asym > MAX_ASYMMETRY)
    return { matrix, status: 'doubtful', note: `${label}: covariance not symmetric (relative asymmetry ${asym.toExponential(2)})` };
  if (worst > REPAIRABLE_NEGATIVE_FRACTION)
    return { matrix, status: 'doubtful', note: `${label}: covariance indefinite (negative eigenvalue ${worst.toExponential(2)} of largest)` };
  if (clipped.length && worst > 0)
    return { matrix, status: 'repaired', note: `${label}: covariance slightly indefinite, repaired to nearest PSD` };
  return { matrix: sym, status: 'ok', note: null };
}
