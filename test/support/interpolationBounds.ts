/**
 * Pieces of the interpolation error formula the OEM tests need, written from the textbook
 * definitions (Lagrange basis, remainder weight W, Lebesgue function), not from core/:
 * which nodes a centred window of m nodes takes (CCSDS 502.0-B-2: degree N uses N+1 points;
 * "centred", clamped at the ends of the data), L_j(t) = Π_{k≠j} (t − x_k)/(x_j − x_k),
 * W(t) = Π (t − x_j)^μ, Λ(t) = Σ|L_j(t)| (how much an error in the node values can grow).
 */
import type { OemInterpolationMethod } from '../../core/formats/oem/keywords.js';

export interface Method {
  readonly method: OemInterpolationMethod;
  readonly degree: number;
}

/** Nodes a method uses: N+1 for LAGRANGE N, ⌈(d+1)/2⌉ (with velocities) for HERMITE d, 2 for LINEAR. */
export const nodeCount = (m: Method): number =>
  m.method === 'LAGRANGE' ? m.degree + 1 : m.method === 'HERMITE' ? Math.ceil((m.degree + 1) / 2) : 2;

/**
 * Indices of the window for t in interval [i, i+1] of n equally spaced nodes (u = fraction of the
 * interval): m/2 nodes on each side for even m; for odd m the extra node on the side t is nearer
 * to (before the interval when t is at its middle); shifted inwards at the ends of the data.
 */
export function windowNodes(i: number, u: number, m: number, n: number): number[] {
  let first = m % 2 === 0 ? i + 1 - m / 2 : i - (m - 1) / 2 + (u > 0.5 ? 1 : 0);
  first = Math.max(0, Math.min(first, n - m));
  return Array.from({ length: m }, (_, j) => first + j);
}

export function lagrangeBasis(xs: readonly number[], t: number): number[] {
  return xs.map((xj, j) => xs.reduce((p, xk, k) => (k === j ? p : (p * (t - xk)) / (xj - xk)), 1));
}

export interface WindowTerms {
  /** Order of the derivative in the remainder: N+1 (Lagrange), 2n (Hermite), 2 (linear). */
  readonly k: number;
  /** |W(t)| and |W'(t)|. */
  readonly w: number;
  readonly dw: number;
  /** Σ|L_j(t)| (positions) and, for Hermite, Σ|(t − x_j)·L_j(t)²| (velocities), s. */
  readonly lebesgue: number;
  readonly velocityWeight: number;
}

/** Remainder and rounding weights at t for the window `xs` (times in s). */
export function windowTerms(method: OemInterpolationMethod, xs: readonly number[], t: number): WindowTerms {
  const mult = method === 'HERMITE' ? 2 : 1;
  const d = xs.map((x) => t - x);
  const w = d.reduce((p, x) => p * x ** mult, 1);
  const dw = w * d.reduce((s, x) => s + mult / x, 0);
  const L = lagrangeBasis(xs, t);
  const c = xs.map((xj, j) => xs.reduce((s, xk, k) => (k === j ? s : s + 1 / (xj - xk)), 0));
  // Hermite position basis h_j = (1 − 2c_j(t − x_j))·L_j², velocity basis k_j = (t − x_j)·L_j².
  const lebesgue = method === 'HERMITE'
    ? L.reduce((s, l, j) => s + Math.abs((1 - 2 * c[j]! * d[j]!) * l * l), 0)
    : L.reduce((s, l) => s + Math.abs(l), 0);
  const velocityWeight = method === 'HERMITE' ? L.reduce((s, l, j) => s + Math.abs(d[j]! * l * l), 0) : 0;
  return { k: mult * xs.length, w: Math.abs(w), dw: Math.abs(dw), lebesgue, velocityWeight };
}

export const factorial = (k: number): number => (k <= 1 ? 1 : k * factorial(k - 1));
