import type { Instant } from '../time/instant.js';
import type { OrbitModel } from './orbitModel.js';

/**
 * Time windows in which the secondary's model position can be within `thrKm` of the primary's
 * mean orbit plane (Hoots, Crawford & Roehrich 1984, time filter, in closed form per block).
 *
 * The secondary's model position is r = ρ·(cos u·p̂_S + sin u·q̂_S) with u = ω + ν, so
 * g = n_P·r = ρ·A·cos(u − θ), A and θ from n_P against the secondary's node basis. Per block
 * (BLOCK_MS long) θ is bounded by its values at the block ends (plus CURVE_PAD_RAD for the
 * slow, smooth drift of both planes within it) and A by the smaller end value; |g| ≤ thr needs
 * u within θ + π/2 + kπ ± asin(thr/(ρ_min·A)). That u window becomes a ν window (ω taken over its
 * range in the block), an M window in closed form (Kepler's equation forward), and a time
 * window through M(t), linear in a block to ≪ 1 ms; TIME_PAD_MS covers what is left.
 */
const BLOCK_MS = 7_200_000;
/** Bound of the drift of θ and A inside a block beyond linear-in-ends (rad). */
const CURVE_PAD_RAD = 1e-4;
/** Padding of each time window (ms): M(t) non-linearity, e drift and rounding. */
const TIME_PAD_MS = 1000;

export type Windows = number[]; // flat [a0, b0, a1, b1, ...], sorted, disjoint

// Scratch buffers (single-threaded per worker; no allocation per call).
const ME0 = new Float64Array(7);

function pushWindow(out: Windows, a: number, b: number): void {
  if (b < a) return;
  const n = out.length;
  if (n > 0 && out[n - 1]! >= a) {
    if (b > out[n - 1]!) out[n - 1] = b;
  } else out.push(a, b);
}

const TWO_PI = 2 * Math.PI;

/**
 * ν → M (unwrapped consistently: ν in [(2k−1)π, (2k+1)π) gives M in the same revolution).
 * Near-circular orbits use the series M = ν − 2e·sin ν + (3/4)e²·sin 2ν, remainder ≤ e³ ≤ 1e-6
 * rad for e < 0.01: ≪ 1 ms in time, inside TIME_PAD_MS.
 */
function meanFromTrue(nu: number, e: number): number {
  if (e < 0.01) return nu - 2 * e * Math.sin(nu) + 0.75 * e * e * Math.sin(2 * nu);
  const k = Math.floor((nu + Math.PI) / TWO_PI);
  const v = nu - k * TWO_PI;
  const E = 2 * Math.atan(Math.sqrt((1 - e) / (1 + e)) * Math.tan(v / 2));
  return E - e * Math.sin(E) + k * TWO_PI;
}

/**
 * M → ν (unwrapped the same way). Near-circular orbits use the equation of the centre,
 * ν = M + 2e·sin M + (5/4)e²·sin 2M, whose remainder ≤ (13/12)e³ ≤ 1.1e-6 rad for e < 0.01
 * (covered by CURVE_PAD_RAD where this feeds a window bound).
 */
function trueFromMean(M: number, e: number): number {
  if (e < 0.01) return M + 2 * e * Math.sin(M) + 1.25 * e * e * Math.sin(2 * M);
  const k = Math.floor((M + Math.PI) / TWO_PI);
  const m = M - k * TWO_PI;
  let E = e < 0.8 ? m : Math.PI * Math.sign(m || 1);
  for (let it = 0; it < 30; it++) {
    const d = (E - e * Math.sin(E) - m) / (1 - e * Math.cos(E));
    E -= d;
    if (Math.abs(d) < 1e-13) break;
  }
  const nu = 2 * Math.atan2(Math.sqrt(1 + e) * Math.sin(E / 2), Math.sqrt(1 - e) * Math.cos(E / 2));
  return nu + k * TWO_PI;
}

/** Per-model tables at the block boundaries of one window, shared by every pair of the run. */
interface SecondaryTable {
  readonly key: string;
  /** per boundary: a e i Ω ω M Ṁ (7), node basis p̂ q̂ (6), ν (1) */
  readonly bnd: Float64Array;
  /** per block centre: e ω M Ṁ */
  readonly ctr: Float64Array;
  readonly times: Float64Array;
}
const B_STRIDE = 14;
const C_STRIDE = 4;
const sTables = new WeakMap<OrbitModel, SecondaryTable>();
const pTables = new WeakMap<OrbitModel, { key: string; normals: Float64Array }>();

function blockTimes(start: number, end: number): Float64Array {
  const n = Math.max(1, Math.ceil((end - start) / BLOCK_MS));
  const t = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) t[k] = Math.min(end, start + k * BLOCK_MS);
  return t;
}

function secondaryTable(s: OrbitModel, start: number, end: number): SecondaryTable {
  const key = `${start}:${end}`;
  const cached = sTables.get(s);
  if (cached && cached.key === key) return cached;
  const times = blockTimes(start, end);
  const nB = times.length - 1;
  const bnd = new Float64Array((nB + 1) * B_STRIDE);
  const ctr = new Float64Array(nB * C_STRIDE);
  const me = ME0;
  for (let k = 0; k <= nB; k++) {
    s.meanElementsInto!(times[k]! as Instant, me);
    const o = k * B_STRIDE;
    for (let j = 0; j < 7; j++) bnd[o + j] = me[j]!;
    const inc = me[2]!, node = me[3]!;
    const cO = Math.cos(node), sO = Math.sin(node), ci = Math.cos(inc), si = Math.sin(inc);
    bnd[o + 7] = cO; bnd[o + 8] = sO; bnd[o + 9] = 0; // p̂: toward the ascending node
    bnd[o + 10] = -sO * ci; bnd[o + 11] = cO * ci; bnd[o + 12] = si; // q̂ = n̂ × p̂
    bnd[o + 13] = trueFromMean(me[5]!, me[1]!);
    if (k < nB) {
      s.meanElementsInto!((0.5 * (times[k]! + times[k + 1]!)) as Instant, me);
      const c = k * C_STRIDE;
      ctr[c] = me[1]!; ctr[c + 1] = me[4]!; ctr[c + 2] = me[5]!; ctr[c + 3] = me[6]!;
    }
  }
  const t = { key, bnd, ctr, times };
  sTables.set(s, t);
  return t;
}

function primaryNormals(p: OrbitModel, times: Float64Array, key: string): Float64Array {
  const cached = pTables.get(p);
  if (cached && cached.key === key) return cached.normals;
  const normals = new Float64Array(times.length * 3);
  for (let k = 0; k < times.length; k++) p.tabledNormalInto(times[k]! as Instant, normals, k * 3);
  pTables.set(p, { key, normals });
  return normals;
}

export function secondaryPlaneWindows(
  s: OrbitModel,
  p: OrbitModel,
  thrKm: number,
  start: Instant,
  end: Instant,
): Windows | null {
  if (!s.meanElementsInto || !p.hasPlane) return null;
  const out: Windows = [];
  const tab = secondaryTable(s, start, end);
  const { bnd, ctr, times } = tab;
  const np = primaryNormals(p, times, tab.key);
  const nB = times.length - 1;
  // θ and A of n_P against the secondary's node basis at boundary k.
  const thetaAt = (k: number): number => {
    const o = k * B_STRIDE, q = k * 3;
    return Math.atan2(
      np[q]! * bnd[o + 10]! + np[q + 1]! * bnd[o + 11]! + np[q + 2]! * bnd[o + 12]!,
      np[q]! * bnd[o + 7]! + np[q + 1]! * bnd[o + 8]!,
    );
  };
  const ampAt = (k: number): number => {
    const o = k * B_STRIDE, q = k * 3;
    return Math.hypot(
      np[q]! * bnd[o + 10]! + np[q + 1]! * bnd[o + 11]! + np[q + 2]! * bnd[o + 12]!,
      np[q]! * bnd[o + 7]! + np[q + 1]! * bnd[o + 8]!,
    );
  };
  let th0 = thetaAt(0), A0 = ampAt(0);
  for (let k = 0; k < nB; k++) {
    const t0 = times[k]!, t1 = times[k + 1]!;
    const o0 = k * B_STRIDE, o1 = (k + 1) * B_STRIDE, c = k * C_STRIDE;
    let th1 = thetaAt(k + 1);
    const A1 = ampAt(k + 1);
    th1 += TWO_PI * Math.round((th0 - th1) / TWO_PI);
    const e = Math.min(Math.max(ctr[c]!, 0), 0.999);
    const rhoMin = Math.min(bnd[o0]! * (1 - bnd[o0 + 1]!), bnd[o1]! * (1 - bnd[o1 + 1]!)) - s.epsKm;
    const A = Math.min(A0, A1) - CURVE_PAD_RAD;
    const cc = thrKm / (rhoMin * A);
    if (!(cc < 1) || !(A > 0) || !(rhoMin > 0)) {
      pushWindow(out, t0 - TIME_PAD_MS, t1 + TIME_PAD_MS);
    } else {
      const beta = Math.asin(cc);
      const thLo = Math.min(th0, th1) - CURVE_PAD_RAD, thHi = Math.max(th0, th1) + CURVE_PAD_RAD;
      // ω drifts secularly (J2): its range over the block is that of its end and centre values, padded.
      const wLo = Math.min(bnd[o0 + 4]!, bnd[o1 + 4]!, ctr[c + 1]!) - CURVE_PAD_RAD;
      const wHi = Math.max(bnd[o0 + 4]!, bnd[o1 + 4]!, ctr[c + 1]!) + CURVE_PAD_RAD;
      const tc = 0.5 * (t0 + t1), Mc = ctr[c + 2]!, Mdot = ctr[c + 3]!;
      // u range of the block from the model's own M and e at both ends, padded for the series' remainder.
      const uLo = wLo + bnd[o0 + 13]! - CURVE_PAD_RAD, uHi = wHi + bnd[o1 + 13]! + CURVE_PAD_RAD;
      const kFirst = Math.ceil((uLo - beta - thHi - Math.PI / 2) / Math.PI);
      const kLast = Math.floor((uHi + beta - thLo - Math.PI / 2) / Math.PI);
      for (let j = kFirst; j <= kLast; j++) {
        const u1 = thLo + Math.PI / 2 + j * Math.PI - beta, u2 = thHi + Math.PI / 2 + j * Math.PI + beta;
        const Ma = meanFromTrue(u1 - wHi, e), Mb = meanFromTrue(u2 - wLo, e);
        const ta = tc + (Ma - Mc) / Mdot, tb = tc + (Mb - Mc) / Mdot;
        pushWindow(out, Math.max(t0, ta) - TIME_PAD_MS, Math.min(t1, tb) + TIME_PAD_MS);
      }
    }
    th0 = th1;
    A0 = A1;
  }
  return out;
}
