/**
 * Gauss–Legendre nodes and weights on [−1, 1] by Newton iteration on P_n (the classic
 * three-term recurrence; Golub & Welsch give the same rule). Accurate to ~1e-15; computed once
 * per order and cached because the fast Pc method uses a fixed order on every call.
 */
export interface QuadratureRule {
  readonly x: Float64Array;
  readonly w: Float64Array;
}

const cache = new Map<number, QuadratureRule>();

export function gaussLegendre(n: number): QuadratureRule {
  const hit = cache.get(n);
  if (hit) return hit;
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`Gauss–Legendre order must be ≥ 1, got ${n}`);
  const x = new Float64Array(n), w = new Float64Array(n);
  const half = Math.floor((n + 1) / 2);
  for (let i = 0; i < half; i++) {
    // Tricomi's initial guess for the i-th root, then Newton to machine precision.
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 0;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1, p1 = z;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      const pn = p1, pn1 = p0;
      dp = (n * (z * pn - pn1)) / (z * z - 1);
      const dz = pn / dp;
      z -= dz;
      if (Math.abs(dz) < 1e-16) break;
    }
    x[i] = -z;
    x[n - 1 - i] = z;
    w[i] = w[n - 1 - i] = 2 / ((1 - z * z) * dp * dp);
  }
  const rule = { x, w };
  cache.set(n, rule);
  return rule;
}
