/**
 * Polynomial interpolation of ephemeris nodes (positions and velocities), position and velocity
 * from one interpolant so that velocity is exactly the derivative of the interpolated position:
 *
 * - LAGRANGE, degree N: the polynomial through N+1 node positions; velocity is its derivative
 *   (node velocities are not used).
 * - HERMITE, degree d: the osculating polynomial through n = ⌈(d+1)/2⌉ nodes matching position
 *   and velocity at each, of degree 2n−1 (= d for odd d, d+1 for even d). Keepclear reads
 *   INTERPOLATION_DEGREE as the polynomial's degree, so HERMITE 7 uses 4 nodes.
 * - LINEAR: straight line between the two neighbouring nodes; velocity is the chord's slope.
 *
 * Basis functions come from prefix and suffix products of (t − x_k) with their derivatives, so
 * nothing divides by (t − x_k) and times at or near a node are as accurate as any other.
 * Everything works in scratch arrays allocated once per interpolator (the hot path allocates
 * nothing).
 */
import type { OemInterpolationMethod } from '../formats/oem/keywords.js';

/**
 * Used when the message names no INTERPOLATION: HERMITE of degree 7. Every OEM data line
 * carries a velocity; Hermite uses it, so degree 7 needs only 4 nodes (a short window, which
 * stays accurate close to segment ends and with sparse nodes), and 7 is the degree the
 * standard's own examples name (CCSDS 502.0-B-2 OEM example, test/authorities/ccsds-502).
 */
export const DEFAULT_INTERPOLATION = { method: 'HERMITE', degree: 7 } as const satisfies {
  method: OemInterpolationMethod;
  degree: number;
};

/** Degree used when the method is named but INTERPOLATION_DEGREE is not: 7 as above, 1 for LINEAR. */
export const DEFAULT_DEGREE: Readonly<Record<OemInterpolationMethod, number>> = { HERMITE: 7, LAGRANGE: 7, LINEAR: 1 };

/**
 * Highest degree honoured. Lagrange on equally spaced nodes amplifies rounding and data noise by
 * its Lebesgue constant, which grows like 2^(N+1)/(e·N·ln N) (≈ 1e3 at N = 15, ≈ 3e4 at N = 20),
 * so a higher requested degree is capped here and the load says so.
 */
export const MAX_INTERPOLATION_DEGREE = 15;

/** Nodes a method of a given degree uses. */
export function nodesFor(method: OemInterpolationMethod, degree: number): number {
  if (method === 'LINEAR') return 2;
  return method === 'LAGRANGE' ? degree + 1 : Math.ceil((degree + 1) / 2);
}

/** Largest number of nodes any honoured degree needs (Lagrange 15 → 16). */
export const MAX_WINDOW_NODES = MAX_INTERPOLATION_DEGREE + 1;

/**
 * Evaluates interpolants over a window of `m` consecutive nodes starting at `first`.
 * Node times `x` are in seconds (relative to any origin, the same as `t`); `y` holds 6 numbers
 * per node (x y z in km, then velocity in km/s). Writes position and velocity into out[off..off+5].
 */
export class WindowInterpolator {
  private readonly w: Float64Array;
  private readonly c: Float64Array;
  private readonly p: Float64Array;
  private readonly dp: Float64Array;
  private readonly s: Float64Array;
  private readonly ds: Float64Array;
  private readonly l: Float64Array;
  private readonly dl: Float64Array;
  // The window whose weights are in w and c (weights depend on the nodes only, not on t).
  private wx: Float64Array | null = null;
  private wFirst = -1;
  private wM = -1;

  constructor(maxNodes: number = MAX_WINDOW_NODES) {
    this.w = new Float64Array(maxNodes);
    this.c = new Float64Array(maxNodes);
    this.p = new Float64Array(maxNodes + 1);
    this.dp = new Float64Array(maxNodes + 1);
    this.s = new Float64Array(maxNodes + 1);
    this.ds = new Float64Array(maxNodes + 1);
    this.l = new Float64Array(maxNodes);
    this.dl = new Float64Array(maxNodes);
  }

  /** Barycentric weights w_j = 1/Π(x_j − x_k) and c_j = Σ 1/(x_j − x_k), k ≠ j. */
  private weights(x: Float64Array, first: number, m: number): void {
    if (x === this.wx && first === this.wFirst && m === this.wM) return;
    for (let j = 0; j < m; j++) {
      const xj = x[first + j]!;
      let prod = 1, sum = 0;
      for (let k = 0; k < m; k++) {
        if (k === j) continue;
        const d = xj - x[first + k]!;
        prod *= d;
        sum += 1 / d;
      }
      this.w[j] = 1 / prod;
      this.c[j] = sum;
    }
    this.wx = x;
    this.wFirst = first;
    this.wM = m;
  }

  /** Lagrange basis values L_j(t) and derivatives L_j'(t) into l and dl. */
  private basis(x: Float64Array, first: number, m: number, t: number): void {
    this.weights(x, first, m);
    const { p, dp, s, ds } = this;
    p[0] = 1;
    dp[0] = 0;
    for (let k = 0; k < m; k++) {
      const d = t - x[first + k]!;
      p[k + 1] = p[k]! * d;
      dp[k + 1] = dp[k]! * d + p[k]!;
    }
    s[m] = 1;
    ds[m] = 0;
    for (let k = m - 1; k >= 0; k--) {
      const d = t - x[first + k]!;
      s[k] = s[k + 1]! * d;
      ds[k] = ds[k + 1]! * d + s[k + 1]!;
    }
    for (let j = 0; j < m; j++) {
      const wj = this.w[j]!;
      this.l[j] = wj * p[j]! * s[j + 1]!;
      this.dl[j] = wj * (dp[j]! * s[j + 1]! + p[j]! * ds[j + 1]!);
    }
  }

  lagrange(x: Float64Array, y: Float64Array, first: number, m: number, t: number, out: Float64Array, off: number): void {
    this.basis(x, first, m, t);
    for (let c = 0; c < 3; c++) {
      let r = 0, v = 0;
      for (let j = 0; j < m; j++) {
        const f = y[6 * (first + j) + c]!;
        r += this.l[j]! * f;
        v += this.dl[j]! * f;
      }
      out[off + c] = r;
      out[off + 3 + c] = v;
    }
  }

  hermite(x: Float64Array, y: Float64Array, first: number, n: number, t: number, out: Float64Array, off: number): void {
    this.basis(x, first, n, t);
    for (let c = 0; c < 6; c++) out[off + c] = 0;
    for (let j = 0; j < n; j++) {
      const u = t - x[first + j]!;
      const lj = this.l[j]!, dlj = this.dl[j]!, cj = this.c[j]!;
      const l2 = lj * lj;
      const a = 1 - 2 * cj * u;
      const h = a * l2, dh = -2 * cj * l2 + 2 * a * lj * dlj;
      const k = u * l2, dk = l2 + 2 * u * lj * dlj;
      const base = 6 * (first + j);
      for (let c = 0; c < 3; c++) {
        const f = y[base + c]!, g = y[base + 3 + c]!;
        out[off + c] = out[off + c]! + h * f + k * g;
        out[off + 3 + c] = out[off + 3 + c]! + dh * f + dk * g;
      }
    }
  }

  /** Straight line between nodes i and i+1. */
  linear(x: Float64Array, y: Float64Array, i: number, t: number, out: Float64Array, off: number): void {
    const dt = x[i + 1]! - x[i]!;
    const u = (t - x[i]!) / dt;
    for (let c = 0; c < 3; c++) {
      const a = y[6 * i + c]!, b = y[6 * (i + 1) + c]!;
      out[off + c] = a + (b - a) * u;
      out[off + 3 + c] = (b - a) / dt;
    }
  }
}
