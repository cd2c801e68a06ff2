/**
 * CDM covariance: the lower triangle as received becomes a full symmetric matrix, which is then
 * judged positive semi-definite (PSD), repaired, trimmed to 6×6, or refused.
 *
 * Why judge the correlation-scaled matrix S = D^-½ C D^-½ (D = diag C) rather than C itself:
 * C mixes m², m²/s² and m⁴/kg², so an eigenvalue "tiny relative to the largest" in C can still be
 * a large error in the velocity or drag terms. S is dimensionless with unit diagonal, and its
 * eigenvalues show how far from a valid covariance the message is, whatever its units.
 */
import { nearestPsd, symmetricEigen, type Matrix } from '../../math/linalg.js';
import { COV_AXES, COV_MANDATORY_DIM, COV_TERMS, covKeyword } from './keywords.js';
import { formatCdmNumber } from './values.js';
import type { CdmCovarianceStatus } from './model.js';

/**
 * Relative error of one correlation ρᵢⱼ = Cᵢⱼ/√(CᵢᵢCⱼⱼ) when each term is printed to 4
 * significant digits (the coarsest precision in the standard's examples, e.g. 4.142E+01): half a
 * unit in the 4th digit is 5e-4 per term, and ρ involves three terms, so about 1e-3 at most.
 */
export const CORRELATION_ROUNDING = 1e-3;

/**
 * Most negative eigenvalue of S that rounding alone can cause, for an n×n matrix. By Weyl's
 * inequality eigenvalues move at most ‖E‖₂ ≤ ‖E‖_F ≤ n·max|Eᵢⱼ| ≤ n·1e-3 (|ρ| ≤ 1). Anything more
 * negative is an error in the message, not rounding.
 */
export const psdTolerance = (n: number): number => n * CORRELATION_ROUNDING;

/** Eigenvalues above −1e-12 are Jacobi round-off on an exactly PSD matrix, not a defect. */
const NUMERICAL_ZERO = 1e-12;

/** Builds the full symmetric n×n matrix from lower-triangle terms keyed by keyword. */
export function assembleCovariance(terms: ReadonlyMap<string, number>, n: number): Matrix {
  const c = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (const t of COV_TERMS) {
    if (t.row >= n) continue;
    const v = terms.get(t.keyword) ?? 0;
    c[t.row]![t.col] = v;
    c[t.col]![t.row] = v;
  }
  return c;
}

export interface CovarianceVerdict {
  readonly status: CdmCovarianceStatus;
  readonly usable: Matrix | null;
  readonly note?: string;
}

const unitOf = (i: number, j: number): string =>
  COV_TERMS.find((t) => t.row === Math.max(i, j) && t.col === Math.min(i, j))!.unit;
const termText = (c: Matrix, i: number, j: number): string =>
  `${covKeyword(Math.max(i, j), Math.min(i, j))} = ${formatCdmNumber(c[i]![j]!)} [${unitOf(i, j)}]`;
const fmt = (x: number): string => x.toPrecision(3);

interface Scaled {
  readonly s: Matrix;
  readonly d: number[];
  readonly lambdaMin: number;
}

function scale(c: Matrix): Scaled {
  // A zero variance keeps scale 1 so a non-zero covariance against it still shows as non-PSD.
  const d = c.map((row, i) => (row[i]! > 0 ? Math.sqrt(row[i]!) : 1));
  const s = c.map((row, i) => row.map((x, j) => x / (d[i]! * d[j]!)));
  return { s, d, lambdaMin: symmetricEigen(s).values[0]! };
}

/** Worst implied correlation beyond ±1, to name the term at fault. */
function worstCorrelation(c: Matrix, s: Matrix): string {
  let bi = -1, bj = -1, worst = 1;
  for (let i = 0; i < s.length; i++)
    for (let j = 0; j < i; j++)
      if (c[i]![i]! > 0 && c[j]![j]! > 0 && Math.abs(s[i]![j]!) > worst) [bi, bj, worst] = [i, j, Math.abs(s[i]![j]!)];
  return bi < 0
    ? ''
    : `; ${termText(c, bi, bj)} implies correlation ${fmt(s[bi]![bj]!)} between ${COV_AXES[bj]} and ${COV_AXES[bi]}, beyond ±1`;
}

function negativeVariance(c: Matrix): string | null {
  for (let i = 0; i < c.length; i++) if (c[i]![i]! < 0) return `variance ${termText(c, i, i)} is negative`;
  return null;
}

function repair(c: Matrix, sc: Scaled, who: string, n: number): { usable: Matrix; note: string } {
  const { matrix } = nearestPsd(sc.s);
  const usable = matrix.map((row, i) => row.map((x, j) => x * sc.d[i]! * sc.d[j]!));
  let bi = 0, bj = 0, worst = -1;
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      const rel = Math.abs(usable[i]![j]! - c[i]![j]!) / (sc.d[i]! * sc.d[j]!);
      if (rel > worst) [bi, bj, worst] = [i, j, rel];
    }
  const kw = covKeyword(bi, bj);
  return {
    usable,
    note:
      `${who} covariance repaired to nearest PSD: clipped eigenvalue ${fmt(sc.lambdaMin)} of the ` +
      `correlation-scaled ${n}×${n} matrix (rounding tolerance ${fmt(psdTolerance(n))}); largest change ` +
      `${kw} ${formatCdmNumber(c[bi]![bj]!)} → ${usable[bi]![bj]!.toPrecision(6)} [${unitOf(bi, bj)}]`,
  };
}

/** Judges one n×n block: PSD as is, repairable within rounding, or not. */
function judgeBlock(c: Matrix, who: string): CovarianceVerdict {
  const n = c.length;
  const neg = negativeVariance(c);
  const sc = scale(c);
  if (!neg && sc.lambdaMin >= -NUMERICAL_ZERO) return { status: 'psd', usable: c };
  if (!neg && sc.lambdaMin >= -psdTolerance(n)) {
    const { usable, note } = repair(c, sc, who, n);
    return { status: 'repaired', usable, note };
  }
  const why = neg ?? `smallest eigenvalue ${fmt(sc.lambdaMin)} of the correlation-scaled matrix is below the rounding tolerance -${fmt(psdTolerance(n))}${worstCorrelation(c, sc.s)}`;
  return { status: 'not-psd', usable: null, note: `${who} ${n}×${n} covariance is not positive semi-definite: ${why}` };
}

/**
 * Verdict on a whole received covariance. With drag/SRP/thrust rows that spoil an otherwise good
 * 6×6, only the 6×6 is kept: risk needs position and velocity, and refusing the message for
 * rows it does not use would lose a usable conjunction.
 */
export function judgeCovariance(c: Matrix, who: string): CovarianceVerdict {
  const full = judgeBlock(c, who);
  if (full.status !== 'not-psd' || c.length === COV_MANDATORY_DIM) return full;
  const six = c.slice(0, COV_MANDATORY_DIM).map((row) => row.slice(0, COV_MANDATORY_DIM));
  const core = judgeBlock(six, who);
  if (core.status === 'not-psd') return core;
  return {
    status: 'extension-dropped',
    usable: core.usable,
    note: `${full.note}; its 6×6 position-velocity block is ${core.status === 'psd' ? 'PSD' : 'repairable'} and is used alone${core.note ? ` (${core.note})` : ''}`,
  };
}
