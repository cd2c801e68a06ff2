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
const ME0 = new Float64Array(7), ME1 = new Float64Array(7), MC = new Float64Array(7), NP = new Float64Array(3);

// θ and A of n_P against the secondary's node basis at t, from its elements in `me`
// (written to gTheta / gA: no allocation in this hot loop).
let gTheta = 0, gA = 0;
function geom(p: OrbitModel, t: number, me: Float64Array): void {
  p.tabledNormalInto(t as Instant, NP, 0);
  const inc = me[2]!, node = me[3]!;
  const cO = Math.cos(node), sO = Math.sin(node), ci = Math.cos(inc), si = Math.sin(inc);
  const a = NP[0]! * cO + NP[1]! * sO;
  const b = -NP[0]! * sO * ci + NP[1]! * cO * ci + NP[2]! * si;
  gTheta = Math.atan2(b, a);
  gA = Math.hypot(a, b);
}

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

export function secondaryPlaneWindows(
  s: OrbitModel,
  p: OrbitModel,
  thrKm: number,
  start: Instant,
  end: Instant,
): Windows | null {
  if (!s.meanElementsInto || !p.hasPlane) return null;
  const out: Windows = [];
  const me0 = ME0, me1 = ME1, mc = MC;
  let t0 = start as number;
  s.meanElementsInto(t0 as Instant, me0);
  geom(p, t0, me0);
  let th0 = gTheta, A0 = gA;
  let nuStart = Number.NaN; // ν at t0, carried over from the previous block's end
  while (t0 < end) {
    const t1 = Math.min(end, t0 + BLOCK_MS);
    s.meanElementsInto(t1 as Instant, me1);
    geom(p, t1, me1);
    let th1 = gTheta;
    const A1 = gA;
    th1 += TWO_PI * Math.round((th0 - th1) / TWO_PI);
    const tc = 0.5 * (t0 + t1);
    s.meanElementsInto(tc as Instant, mc);
    const e = Math.min(Math.max(mc[1]!, 0), 0.999);
    const rhoMin = Math.min(me0[0]! * (1 - me0[1]!), me1[0]! * (1 - me1[1]!)) - s.epsKm;
    const A = Math.min(A0, A1) - CURVE_PAD_RAD;
    const c = thrKm / (rhoMin * A);
    if (!(c < 1) || !(A > 0) || !(rhoMin > 0)) {
      pushWindow(out, t0 - TIME_PAD_MS, t1 + TIME_PAD_MS);
      nuStart = Number.NaN;
    } else {
      const beta = Math.asin(c);
      const thLo = Math.min(th0, th1) - CURVE_PAD_RAD, thHi = Math.max(th0, th1) + CURVE_PAD_RAD;
      const halfBlock = (t1 - t0) / 2;
      // ω drifts secularly (J2): its range over the block is that of its end values, padded.
      const wLo = Math.min(me0[4]!, me1[4]!, mc[4]!) - CURVE_PAD_RAD;
      const wHi = Math.max(me0[4]!, me1[4]!, mc[4]!) + CURVE_PAD_RAD;
      const Mc = mc[5]!, Mdot = mc[6]!;
      // u range of the block (ω + ν at both ends, ν from M(t) through Kepler's equation).
      // u range of the block from the model's own M and e at both ends (ν at the start is the
      // previous block's end value: the same M and e), padded for the series' remainder.
      const nu0 = Number.isNaN(nuStart) ? trueFromMean(me0[5]!, me0[1]!) : nuStart;
      const nu1 = trueFromMean(me1[5]!, me1[1]!);
      nuStart = nu1;
      const uLo = wLo + nu0 - CURVE_PAD_RAD, uHi = wHi + nu1 + CURVE_PAD_RAD;
      const kFirst = Math.ceil((uLo - beta - thHi - Math.PI / 2) / Math.PI);
      const kLast = Math.floor((uHi + beta - thLo - Math.PI / 2) / Math.PI);
      for (let k = kFirst; k <= kLast; k++) {
        const u1 = thLo + Math.PI / 2 + k * Math.PI - beta, u2 = thHi + Math.PI / 2 + k * Math.PI + beta;
        const Ma = meanFromTrue(u1 - wHi, e), Mb = meanFromTrue(u2 - wLo, e);
        const ta = tc + (Ma - Mc) / Mdot, tb = tc + (Mb - Mc) / Mdot;
        pushWindow(out, Math.max(t0, ta) - TIME_PAD_MS, Math.min(t1, tb) + TIME_PAD_MS);
      }
    }
    t0 = t1;
    for (let j = 0; j < 7; j++) me0[j] = me1[j]!;
    th0 = th1;
    A0 = A1;

  }
  return out;
}
