/**
 * THE positive-semi-definiteness policy of Keepclear: one judge for every covariance, whether
 * received in a CDM (core/formats/cdm/covariance.ts calls it while reading) or built by a
 * covariance source (element-set history, default table) before a Pc (assess.ts). A matrix is
 * judged once by the same rule wherever it comes from, so a message accepted on reading is
 * never turned away later by a second, different test.
 *
 * Why judge the correlation-scaled matrix S = D^-½ C D^-½ (D = diag C) rather than C itself:
 * C mixes m², m²/s² and m⁴/kg², so an eigenvalue "tiny relative to the largest" in C can still be
 * a large error in the velocity or drag terms. S is dimensionless with unit diagonal, and its
 * eigenvalues show how far from a valid covariance a matrix is, whatever its units.
 *
 * Verdicts: `psd` (use as is), `repaired` (negative eigenvalues of S within rounding, clipped:
 * Higham 1988 nearest PSD), `extension-dropped` (rows beyond 6 spoil an otherwise usable 6×6,
 * which is kept), `not-psd` (indefinite beyond rounding, negative variance, non-finite or not
 * symmetric), `zero` (the position block is all zero: it states no uncertainty at all — not a
 * covariance a Pc can use; a producer's placeholder for "none"). The last two are refused: the
 * assessment then uses another source or maximum Pc; the CDM reader refuses a message with a
 * `not-psd` covariance and keeps one with a `zero` covariance, with a note.
 */
import { nearestPsd, symmetricEigen, type Matrix } from '../math/linalg.js';

/**
 * Relative error of one correlation ρᵢⱼ = Cᵢⱼ/√(CᵢᵢCⱼⱼ) when each term is printed to 4
 * significant digits (the coarsest precision in the CDM standard's examples, e.g. 4.142E+01):
 * half a unit in the 4th digit is 5e-4 per term, and ρ involves three terms, so about 1e-3 at
 * most. Computed covariances (history, default table) are far more precise, so the same bound
 * is only more generous to them; one rule keeps the policy single.
 */
export const CORRELATION_ROUNDING = 1e-3;

/**
 * Most negative eigenvalue of S that rounding alone can cause, for an n×n matrix. By Weyl's
 * inequality eigenvalues move at most ‖E‖₂ ≤ ‖E‖_F ≤ n·max|Eᵢⱼ| ≤ n·1e-3 (|ρ| ≤ 1). Anything more
 * negative is an error in the matrix, not rounding.
 */
export const psdTolerance = (n: number): number => n * CORRELATION_ROUNDING;

/** Eigenvalues above −1e-12 are Jacobi round-off on an exactly PSD matrix, not a defect. */
const NUMERICAL_ZERO = 1e-12;
/** Relative asymmetry |Cᵢⱼ − Cⱼᵢ|/√(CᵢᵢCⱼⱼ) beyond which a matrix is not a covariance (a CDM is
 * symmetric by construction; this guards computed and hand-built inputs). Our choice. */
export const MAX_RELATIVE_ASYMMETRY = 1e-6;
/** Size of a position-velocity covariance: rows beyond it (drag, SRP, thrust) may be dropped. */
export const POSITION_VELOCITY_DIM = 6;

export type CovarianceStatus = 'psd' | 'repaired' | 'extension-dropped' | 'not-psd' | 'zero';

export interface CovarianceVerdict {
  readonly status: CovarianceStatus;
  /** the matrix to compute with (symmetric PSD; 6×6 when the extension was dropped); null when refused */
  readonly usable: Matrix | null;
  readonly note?: string;
}

/** How messages name a term (i, j) with j ≤ i, an axis, and a value; the CDM reader passes its keywords. */
export interface TermNamer {
  term(i: number, j: number): { readonly name: string; readonly unit: string };
  axis(i: number): string;
  value(x: number): string;
}

const AXES = ['R', 'T', 'N', 'Rdot', 'Tdot', 'Ndot', 'DRG', 'SRP', 'THR'];
const unitOfAxis = (i: number): number => (i < 3 ? 1 : i < 6 ? 2 : 3);
/** Default names: C(T,R) [m²] … for RTN-ordered covariances of any source. */
export const rtnTermNamer: TermNamer = {
  term(i, j) {
    const u = [unitOfAxis(i), unitOfAxis(j)].sort().join('');
    const unit = ({ '11': 'm²', '12': 'm²/s', '22': 'm²/s²' } as Record<string, string>)[u] ?? '';
    return { name: `C(${AXES[i] ?? i},${AXES[j] ?? j})`, unit };
  },
  axis: (i) => AXES[i] ?? String(i),
  value: (x) => x.toPrecision(4),
};

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

function worstCorrelation(c: Matrix, s: Matrix, name: TermNamer): string {
  let bi = -1, bj = -1, worst = 1;
  for (let i = 0; i < s.length; i++)
    for (let j = 0; j < i; j++)
      if (c[i]![i]! > 0 && c[j]![j]! > 0 && Math.abs(s[i]![j]!) > worst) [bi, bj, worst] = [i, j, Math.abs(s[i]![j]!)];
  if (bi < 0) return '';
  const t = name.term(bi, bj);
  return `; ${t.name} = ${name.value(c[bi]![bj]!)} [${t.unit}] implies correlation ${fmt(s[bi]![bj]!)} between ${name.axis(bj)} and ${name.axis(bi)}, beyond ±1`;
}

function repair(c: Matrix, sc: Scaled, who: string, name: TermNamer): { usable: Matrix; note: string } {
  const n = c.length;
  const { matrix } = nearestPsd(sc.s);
  const usable = matrix.map((row, i) => row.map((x, j) => x * sc.d[i]! * sc.d[j]!));
  let bi = 0, bj = 0, worst = -1;
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      const rel = Math.abs(usable[i]![j]! - c[i]![j]!) / (sc.d[i]! * sc.d[j]!);
      if (rel > worst) [bi, bj, worst] = [i, j, rel];
    }
  const t = name.term(bi, bj);
  return {
    usable,
    note:
      `${who} covariance repaired to nearest PSD: clipped eigenvalue ${fmt(sc.lambdaMin)} of the ` +
      `correlation-scaled ${n}×${n} matrix (rounding tolerance ${fmt(psdTolerance(n))}); largest change ` +
      `${t.name} ${name.value(c[bi]![bj]!)} → ${usable[bi]![bj]!.toPrecision(6)} [${t.unit}]`,
  };
}

function judgeBlock(c: Matrix, who: string, name: TermNamer): CovarianceVerdict {
  const n = c.length;
  const negIndex = c.findIndex((row, i) => row[i]! < 0);
  const sc = scale(c);
  if (negIndex < 0 && sc.lambdaMin >= -NUMERICAL_ZERO) return { status: 'psd', usable: c };
  if (negIndex < 0 && sc.lambdaMin >= -psdTolerance(n)) {
    const { usable, note } = repair(c, sc, who, name);
    return { status: 'repaired', usable, note };
  }
  let why: string;
  if (negIndex >= 0) {
    const t = name.term(negIndex, negIndex);
    why = `variance ${t.name} = ${name.value(c[negIndex]![negIndex]!)} [${t.unit}] is negative`;
  } else
    why =
      `smallest eigenvalue ${fmt(sc.lambdaMin)} of the correlation-scaled matrix is below the rounding ` +
      `tolerance -${fmt(psdTolerance(n))}${worstCorrelation(c, sc.s, name)}`;
  return { status: 'not-psd', usable: null, note: `${who} ${n}×${n} covariance is not positive semi-definite: ${why}` };
}

/**
 * The verdict on a covariance (3×3 position, 6×6 position-velocity, or up to 9×9 with a CDM's
 * drag/SRP/thrust rows), RTN order. With rows beyond 6 that spoil an otherwise good 6×6, only
 * the 6×6 is kept: risk needs position and velocity, and refusing a matrix for rows it does not
 * use would lose a usable conjunction.
 */
export function judgeCovariance(c: Matrix, who: string, name: TermNamer = rtnTermNamer): CovarianceVerdict {
  const n = c.length;
  if (n < 3 || c.some((row) => row.length !== n))
    return { status: 'not-psd', usable: null, note: `${who} covariance must be square and at least 3×3 (got ${n} rows)` };
  if (!c.every((row) => row.every(Number.isFinite)))
    return { status: 'not-psd', usable: null, note: `${who} covariance has non-finite entries` };
  if (c.slice(0, 3).every((row) => row.slice(0, 3).every((x) => x === 0)))
    return {
      status: 'zero',
      usable: null,
      note: `${who} covariance has an all-zero position block: it states no uncertainty and is not used for Pc`,
    };
  for (let i = 0; i < n; i++)
    for (let j = 0; j < i; j++) {
      const sd = Math.sqrt(Math.abs(c[i]![i]! * c[j]![j]!));
      const gap = Math.abs(c[i]![j]! - c[j]![i]!);
      if (gap > MAX_RELATIVE_ASYMMETRY * (sd > 0 ? sd : 1))
        return {
          status: 'not-psd',
          usable: null,
          note: `${who} covariance is not symmetric: ${name.term(i, j).name} differs from its mirror by ${gap.toPrecision(3)}`,
        };
    }
  // Make it exactly symmetric (the gap above is within rounding).
  const sym = c.map((row, i) => row.map((x, j) => (j === i ? x : 0.5 * (x + c[j]![i]!))));
  const full = judgeBlock(sym, who, name);
  if (full.status !== 'not-psd' || n <= POSITION_VELOCITY_DIM) return full;
  const six = sym.slice(0, POSITION_VELOCITY_DIM).map((row) => row.slice(0, POSITION_VELOCITY_DIM));
  const core = judgeBlock(six, who, name);
  if (core.status === 'not-psd') return core;
  return {
    status: 'extension-dropped',
    usable: core.usable,
    note: `${full.note}; its 6×6 position-velocity block is ${core.status === 'psd' ? 'PSD' : 'repairable'} and is used alone${core.note ? ` (${core.note})` : ''}`,
  };
}

/** True when the verdict gives a matrix to compute with. */
export const usableVerdict = (v: CovarianceVerdict): v is CovarianceVerdict & { usable: Matrix } => v.usable !== null;
