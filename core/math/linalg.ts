/**
 * Small dense linear algebra for covariance work (2×2 to 9×9). Matrices are row-major arrays
 * of rows. Sizes are tiny, so clarity beats speed here.
 */
export type Matrix = number[][];

/** n×m of zeros. Plain loops: Array.from with a callback cost ~10× as much in V8, and assessing
 * an all-vs-all run's 10⁵ encounters makes millions of these (profiled: ~4 % of the risk phase). */
export function zeros(n: number, m = n): Matrix {
  const a: Matrix = [];
  for (let i = 0; i < n; i++) {
    const row: number[] = [];
    for (let j = 0; j < m; j++) row.push(0);
    a.push(row);
  }
  return a;
}

export const identity = (n: number): Matrix => {
  const a = zeros(n);
  for (let i = 0; i < n; i++) a[i]![i] = 1;
  return a;
};

export const transpose = (a: Matrix): Matrix => a[0]!.map((_, j) => a.map((row) => row[j]!));

export function multiply(a: Matrix, b: Matrix): Matrix {
  const n = a.length, k = b.length, m = b[0]!.length;
  const c = zeros(n, m);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < m; j++) {
      let s = 0;
      for (let p = 0; p < k; p++) s += a[i]![p]! * b[p]![j]!;
      c[i]![j] = s;
    }
  return c;
}

/** A · B · Aᵀ, the covariance transform. */
export const congruence = (a: Matrix, b: Matrix): Matrix => multiply(multiply(a, b), transpose(a));

export const add = (a: Matrix, b: Matrix): Matrix => a.map((row, i) => row.map((x, j) => x + b[i]![j]!));
export const scale = (a: Matrix, s: number): Matrix => a.map((row) => row.map((x) => x * s));

/** Largest |a_ij − a_ji| relative to the largest |a_ii|. */
export function asymmetry(a: Matrix): number {
  let maxDiag = 0, maxDiff = 0;
  for (let i = 0; i < a.length; i++) {
    maxDiag = Math.max(maxDiag, Math.abs(a[i]![i]!));
    for (let j = 0; j < i; j++) maxDiff = Math.max(maxDiff, Math.abs(a[i]![j]! - a[j]![i]!));
  }
  return maxDiag === 0 ? maxDiff : maxDiff / maxDiag;
}

export const symmetrize = (a: Matrix): Matrix =>
  a.map((row, i) => row.map((x, j) => 0.5 * (x + a[j]![i]!)));

/**
 * Eigen-decomposition of a symmetric matrix by cyclic Jacobi rotations (Golub & Van Loan,
 * Matrix Computations, §8.5). Returns eigenvalues ascending and eigenvectors as columns.
 */
export function symmetricEigen(input: Matrix): { values: number[]; vectors: Matrix } {
  const n = input.length;
  const a = symmetrize(input);
  const v = identity(n);
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0, total = 0;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const x = a[i]![j]! * a[i]![j]!;
        total += x;
        if (i !== j) off += x;
      }
    // Converged when off-diagonal mass is at rounding level of the whole matrix.
    if (off <= 1e-30 * total || off === 0) break;
    for (let p = 0; p < n - 1; p++)
      for (let q = p + 1; q < n; q++) {
        const apq = a[p]![q]!;
        if (apq === 0) continue;
        const theta = (a[q]![q]! - a[p]![p]!) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1), s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k]![p]!, akq = a[k]![q]!;
          a[k]![p] = c * akp - s * akq;
          a[k]![q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p]![k]!, aqk = a[q]![k]!;
          a[p]![k] = c * apk - s * aqk;
          a[q]![k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k]![p]!, vkq = v[k]![q]!;
          v[k]![p] = c * vkp - s * vkq;
          v[k]![q] = s * vkp + c * vkq;
        }
      }
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => a[i]![i]! - a[j]![j]!);
  return {
    values: order.map((i) => a[i]![i]!),
    vectors: v.map((row) => order.map((i) => row[i]!)),
  };
}

/**
 * Nearest positive semi-definite matrix in the Frobenius norm for a symmetric input (Higham 1988,
 * "Computing a nearest symmetric positive semidefinite matrix"): clip negative eigenvalues to 0.
 */
export function nearestPsd(a: Matrix): { matrix: Matrix; clipped: number[] } {
  const { values, vectors } = symmetricEigen(a);
  const clipped = values.filter((x) => x < 0);
  const d = values.map((x) => Math.max(x, 0));
  const n = a.length;
  const out = zeros(n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += vectors[i]![k]! * d[k]! * vectors[j]![k]!;
      out[i]![j] = s;
    }
  return { matrix: symmetrize(out), clipped };
}

/** Lower Cholesky factor L with A = L·Lᵀ, or null if A is not positive definite. */
export function cholesky(a: Matrix): Matrix | null {
  const n = a.length;
  const l = zeros(n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      let s = a[i]![j]!;
      for (let k = 0; k < j; k++) s -= l[i]![k]! * l[j]![k]!;
      if (i === j) {
        if (!(s > 0)) return null;
        l[i]![i] = Math.sqrt(s);
      } else l[i]![j] = s / l[j]![j]!;
    }
  return l;
}

/** Inverse of a symmetric positive definite 2×2. */
export function inverse2(a: Matrix): Matrix {
  const [[p, q], [r, s]] = a as [[number, number], [number, number]];
  const det = p * s - q * r;
  return [
    [s / det, -q / det],
    [-r / det, p / det],
  ];
}
