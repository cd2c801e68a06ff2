/**
 * CDM covariance: the lower triangle as received becomes a full symmetric matrix, which is then
 * judged by THE covariance policy of Keepclear (core/risk/covariancePsd.ts: PSD, repaired,
 * trimmed to 6×6, refused as indefinite, or refused as all zero) — the same judge the risk
 * assessment applies to every covariance source, so a matrix is judged once, by one rule.
 */
import type { Matrix } from '../../math/linalg.js';
import { judgeCovariance as judge, type CovarianceVerdict, type TermNamer } from '../../risk/covariancePsd.js';
import { COV_AXES, COV_TERMS, covKeyword } from './keywords.js';
import { formatCdmNumber } from './values.js';

export { CORRELATION_ROUNDING, psdTolerance, type CovarianceVerdict } from '../../risk/covariancePsd.js';

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

/** Terms named by their CDM keyword and unit in messages (e.g. CT_R [m**2]). */
const cdmTermNamer: TermNamer = {
  term: (i, j) => ({ name: covKeyword(i, j), unit: COV_TERMS.find((t) => t.row === i && t.col === j)?.unit ?? '' }),
  axis: (i) => COV_AXES[i] ?? String(i),
  value: formatCdmNumber,
};

/** Verdict on a received covariance by the one policy (see core/risk/covariancePsd.ts). */
export const judgeCovariance = (c: Matrix, who: string): CovarianceVerdict => judge(c, who, cdmTermNamer);
