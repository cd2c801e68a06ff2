/**
 * Globally adaptive Gauss–Kronrod (7/15) quadrature, after QUADPACK's QAG (Piessens et al.,
 * 1983). Nodes and weights are QUADPACK's qk15 constants; K15 integrates polynomials to degree
 * 22 and G7 to degree 13 exactly (checked when they were copied in).
 *
 * The error estimate is the plain |K15 − G7|, which overstates the true K15 error by orders of
 * magnitude for smooth integrands; so stopping on it is conservative.
 */
const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
  0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
] as const;
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204,
  0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
] as const;
const WG = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378,
  0.381830050505118944950369775488975, 0.417959183673469387755102040816327,
] as const;

/** Relative rounding floor of one K15 sum: below this an interval cannot be improved. */
const ROUNDING_FLOOR = 50 * Number.EPSILON;

interface Piece {
  a: number;
  b: number;
  value: number;
  error: number;
}

function gk15(f: (x: number) => number, a: number, b: number): Piece {
  const c = 0.5 * (a + b), h = 0.5 * (b - a);
  const fc = f(c);
  let k = WGK[7] * fc, g = WG[3] * fc;
  for (let j = 0; j < 7; j++) {
    const dx = h * XGK[j]!;
    const s = f(c - dx) + f(c + dx);
    k += WGK[j]! * s;
    if (j % 2 === 1) g += WG[(j - 1) / 2]! * s;
  }
  k *= h;
  g *= h;
  let error = Math.abs(k - g);
  if (error <= ROUNDING_FLOOR * Math.abs(k)) error = 0;
  return { a, b, value: k, error };
}

export interface AdaptiveResult {
  readonly value: number;
  /** sum of the per-interval |K15 − G7| (a conservative bound) */
  readonly errorEstimate: number;
  readonly intervals: number;
  readonly converged: boolean;
}

/**
 * ∫ f over [breaks[0], breaks[last]], starting from the given breakpoints (ascending), bisecting
 * the interval with the largest error until Σerror ≤ relTol·|Σvalue| (or every piece is at
 * its rounding floor, or maxIntervals is reached → converged = false). With absTol > 0 it also
 * stops once Σerror ≤ absTol (for integrals whose size below some level does not matter).
 */
export function integrateAdaptive(
  f: (x: number) => number,
  breaks: readonly number[],
  relTol: number,
  maxIntervals = 4000,
  absTol = 0,
): AdaptiveResult {
  const pieces: Piece[] = [];
  for (let i = 0; i + 1 < breaks.length; i++) {
    const a = breaks[i]!, b = breaks[i + 1]!;
    if (b > a) pieces.push(gk15(f, a, b));
  }
  for (;;) {
    let value = 0, error = 0, worst = -1, worstErr = -1;
    for (let i = 0; i < pieces.length; i++) {
      const p = pieces[i]!;
      value += p.value;
      error += p.error;
      if (p.error > worstErr) {
        worstErr = p.error;
        worst = i;
      }
    }
    if (error <= Math.max(relTol * Math.abs(value), absTol) || worstErr === 0)
      return { value, errorEstimate: error, intervals: pieces.length, converged: true };
    if (pieces.length >= maxIntervals)
      return { value, errorEstimate: error, intervals: pieces.length, converged: false };
    const p = pieces[worst]!;
    const mid = 0.5 * (p.a + p.b);
    pieces[worst] = gk15(f, p.a, mid);
    pieces.push(gk15(f, mid, p.b));
  }
}
