import type { Instant } from '../time/instant.js';
import type { OrbitModel } from './orbitModel.js';
import { pushRegion, type Regions } from './regions.js';
import { norm2 } from '../math/norm.js';

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

/** Windows are time regions (regions.ts). */
export type Windows = Regions;

/**
 * What one secondary contributes to every pair it is in, computed once per secondary and shared
 * by all primaries (fleet screening visits a secondary once per primary): per block boundary
 * the model's mean elements turned into ρ_min, e, ω, M, the node/inclination trigonometry and ν;
 * per block centre e, ω, M and dM/dt. Built for the whole window; a pair whose window ends
 * earlier (an object that decays) computes its own.
 */
export interface SecondaryBlocks {
  readonly start: number;
  readonly end: number;
  readonly count: number; // blocks
  /** per boundary b = 0 … count: a(1−e), e, ω, cos Ω, sin Ω, cos i, sin i, ν */
  readonly bnd: Float64Array;
  /** per block: e (clamped), ω, M, dM/dt at its centre */
  readonly ctr: Float64Array;
}
const BND = 8, CTR = 4;

const blockEnd = (start: number, end: number, b: number): number => Math.min(end, start + b * BLOCK_MS);

export function secondaryBlocks(s: OrbitModel, start: number, end: number, reuse?: SecondaryBlocks): SecondaryBlocks | null {
  if (!s.meanElementsInto) return null;
  const count = Math.max(0, Math.ceil((end - start) / BLOCK_MS));
  const bnd = reuse && reuse.bnd.length >= (count + 1) * BND ? reuse.bnd : new Float64Array((count + 1) * BND);
  const ctr = reuse && reuse.ctr.length >= count * CTR ? reuse.ctr : new Float64Array(Math.max(1, count) * CTR);
  const me = ME0;
  for (let b = 0; b <= count; b++) {
    s.meanElementsInto(blockEnd(start, end, b) as Instant, me);
    const o = b * BND;
    bnd[o] = me[0]! * (1 - me[1]!);
    bnd[o + 1] = me[1]!;
    bnd[o + 2] = me[4]!;
    bnd[o + 3] = Math.cos(me[3]!);
    bnd[o + 4] = Math.sin(me[3]!);
    bnd[o + 5] = Math.cos(me[2]!);
    bnd[o + 6] = Math.sin(me[2]!);
    bnd[o + 7] = trueFromMean(me[5]!, me[1]!);
  }
  for (let b = 0; b < count; b++) {
    const t0 = blockEnd(start, end, b), t1 = blockEnd(start, end, b + 1);
    s.meanElementsInto((0.5 * (t0 + t1)) as Instant, me);
    const o = b * CTR;
    ctr[o] = Math.min(Math.max(me[1]!, 0), 0.999);
    ctr[o + 1] = me[4]!;
    ctr[o + 2] = me[5]!;
    ctr[o + 3] = me[6]!;
  }
  return { start, end, count, bnd, ctr };
}

/**
 * The secondary's mean-plane normal at t, linear between the block boundaries' normals: no
 * trigonometry and no interpolation weights per call. A normal turning at ≤ ω rad/s departs
 * from its chord by ≤ (ω·BLOCK_MS)²/8 (2.6e-5 rad at ω = 2e-6 rad/s); see BLOCK_NORMAL_LERP_RAD.
 */
export function blockNormalInto(sb: SecondaryBlocks, t: number, out: Float64Array): void {
  let b = Math.floor((t - sb.start) / BLOCK_MS);
  if (b < 0) b = 0;
  if (b > sb.count - 1) b = Math.max(0, sb.count - 1);
  const t0 = blockEnd(sb.start, sb.end, b), t1 = blockEnd(sb.start, sb.end, b + 1);
  const f = t1 > t0 ? (t - t0) / (t1 - t0) : 0;
  const bnd = sb.bnd, o0 = b * BND, o1 = o0 + BND;
  // n = (sin i·sin Ω, −sin i·cos Ω, cos i) from the boundary tables
  const x0 = bnd[o0 + 6]! * bnd[o0 + 4]!, y0 = -bnd[o0 + 6]! * bnd[o0 + 3]!, z0 = bnd[o0 + 5]!;
  const x1 = bnd[o1 + 6]! * bnd[o1 + 4]!, y1 = -bnd[o1 + 6]! * bnd[o1 + 3]!, z1 = bnd[o1 + 5]!;
  out[0] = x0 + f * (x1 - x0);
  out[1] = y0 + f * (y1 - y0);
  out[2] = z0 + f * (z1 - z0);
}

/**
 * Bound of the chord error of blockNormalInto (rad), twice (2e-6 rad/s × BLOCK_MS)²/8: J2 turns a
 * mean plane at ≤ ~1e-6 rad/s (pairFilter's NORMAL_RATE_BOUND allows 2e-6).
 */
export const BLOCK_NORMAL_LERP_RAD = 2 * ((2e-6 * BLOCK_MS) / 1000) ** 2 / 8;

/** The primary's mean-plane normal at every block boundary of [start, end] (3 per boundary). */
export function primaryBlockNormals(p: OrbitModel, start: number, end: number): Float64Array {
  const count = Math.max(0, Math.ceil((end - start) / BLOCK_MS));
  const out = new Float64Array((count + 1) * 3);
  for (let b = 0; b <= count; b++) p.tabledNormalInto(blockEnd(start, end, b) as Instant, out, b * 3);
  return out;
}

/** Eccentricity below which ν ↔ M use their series (remainder ≤ ~e³, see meanFromTrue). */
const SERIES_MAX_E = 0.01;

// Scratch buffers (single-threaded per worker; no allocation per call).
const ME0 = new Float64Array(7);

const TWO_PI = 2 * Math.PI;

/**
 * ν → M (unwrapped consistently: ν in [(2k−1)π, (2k+1)π) gives M in the same revolution).
 * Near-circular orbits use the series M = ν − 2e·sin ν + (3/4)e²·sin 2ν, remainder ≤ e³ ≤ 1e-6
 * rad for e < 0.01: ≪ 1 ms in time, inside TIME_PAD_MS.
 */
function meanFromTrue(nu: number, e: number): number {
  if (e < SERIES_MAX_E) return nu - 2 * e * Math.sin(nu) + 0.75 * e * e * Math.sin(2 * nu);
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

/**
 * θ and A of the primary's normal n_P against the secondary's node basis at boundary b, into
 * out[0], out[1]. A module-level function writing into a Float64Array, not a closure over two
 * `let`s: a closure's numbers live boxed in its context, and each block's pair of writes made two
 * heap numbers (the largest share of the time filter's garbage, measured).
 */
function geomInto(bnd: Float64Array, nrm: Float64Array, b: number, out: Float64Array): void {
  const o = b * BND, n = b * 3;
  const cO = bnd[o + 3]!, sO = bnd[o + 4]!, ci = bnd[o + 5]!, si = bnd[o + 6]!;
  const x = nrm[n]! * cO + nrm[n + 1]! * sO;
  const y = -nrm[n]! * sO * ci + nrm[n + 1]! * cO * ci + nrm[n + 2]! * si;
  out[0] = Math.atan2(y, x);
  out[1] = norm2(x, y);
}
const GEOM = new Float64Array(2);

/**
 * The windows of one pair. `blocks` and `normals` are the secondary's and the primary's shared
 * tables (secondaryBlocks, primaryBlockNormals) for exactly this [start, end]; built here when
 * not given.
 */
export function secondaryPlaneWindows(
  s: OrbitModel,
  p: OrbitModel,
  thrKm: number,
  start: Instant,
  end: Instant,
  blocks?: SecondaryBlocks | null,
  normals?: Float64Array,
): Windows | null {
  if (!s.meanElementsInto || !p.hasPlane) return null;
  const sb = blocks && blocks.start === start && blocks.end === end ? blocks : secondaryBlocks(s, start, end)!;
  const nrm = normals ?? primaryBlockNormals(p, start, end);
  const { bnd, ctr, count } = sb;
  const out: Windows = [];
  const g = GEOM;
  geomInto(bnd, nrm, 0, g);
  let th0 = g[0]!, A0 = g[1]!;
  for (let blk = 0; blk < count; blk++) {
    const t0 = blockEnd(start, end, blk), t1 = blockEnd(start, end, blk + 1);
    const o0 = blk * BND, o1 = o0 + BND, oc = blk * CTR;
    geomInto(bnd, nrm, blk + 1, g);
    let th1 = g[0]!;
    const A1 = g[1]!;
    th1 += TWO_PI * Math.round((th0 - th1) / TWO_PI);
    const tc = 0.5 * (t0 + t1);
    const e = ctr[oc]!;
    const rhoMin = Math.min(bnd[o0]!, bnd[o1]!) - s.epsKm;
    const A = Math.min(A0, A1) - CURVE_PAD_RAD;
    const c = thrKm / (rhoMin * A);
    if (!(c < 1) || !(A > 0) || !(rhoMin > 0)) {
      pushRegion(out, t0 - TIME_PAD_MS, t1 + TIME_PAD_MS);
    } else {
      const beta = Math.asin(c);
      const thLo = Math.min(th0, th1) - CURVE_PAD_RAD, thHi = Math.max(th0, th1) + CURVE_PAD_RAD;
      // ω drifts secularly (J2): its range over the block is that of its end values, padded.
      const wc = ctr[oc + 1]!;
      const wLo = Math.min(bnd[o0 + 2]!, bnd[o1 + 2]!, wc) - CURVE_PAD_RAD;
      const wHi = Math.max(bnd[o0 + 2]!, bnd[o1 + 2]!, wc) + CURVE_PAD_RAD;
      const Mc = ctr[oc + 2]!, Mdot = ctr[oc + 3]!;
      // u range of the block from the model's own M and e at both ends (ν through Kepler's
      // equation), padded for the series' remainder.
      const uLo = wLo + bnd[o0 + 7]! - CURVE_PAD_RAD, uHi = wHi + bnd[o1 + 7]! + CURVE_PAD_RAD;
      const kFirst = Math.ceil((uLo - beta - thHi - Math.PI / 2) / Math.PI);
      const kLast = Math.floor((uHi + beta - thLo - Math.PI / 2) / Math.PI);
      // Near-circular: the series' sines at ν + jπ are ±sin ν and sin 2ν, so one pair of sines
      // per block serves every window of it.
      const series = e < SERIES_MAX_E;
      const nuA0 = thLo + Math.PI / 2 + kFirst * Math.PI - beta - wHi, nuB0 = thHi + Math.PI / 2 + kFirst * Math.PI + beta - wLo;
      const sA = series ? Math.sin(nuA0) : 0, s2A = series ? Math.sin(2 * nuA0) : 0;
      const sB = series ? Math.sin(nuB0) : 0, s2B = series ? Math.sin(2 * nuB0) : 0;
      for (let k = kFirst; k <= kLast; k++) {
        const u1 = thLo + Math.PI / 2 + k * Math.PI - beta, u2 = thHi + Math.PI / 2 + k * Math.PI + beta;
        let Ma: number, Mb: number;
        if (series) {
          const sign = (k - kFirst) % 2 === 0 ? 1 : -1;
          const nuA = u1 - wHi, nuB = u2 - wLo;
          Ma = nuA - 2 * e * sign * sA + 0.75 * e * e * s2A;
          Mb = nuB - 2 * e * sign * sB + 0.75 * e * e * s2B;
        } else {
          Ma = meanFromTrue(u1 - wHi, e);
          Mb = meanFromTrue(u2 - wLo, e);
        }
        const ta = tc + (Ma - Mc) / Mdot, tb = tc + (Mb - Mc) / Mdot;
        pushRegion(out, Math.max(t0, ta) - TIME_PAD_MS, Math.min(t1, tb) + TIME_PAD_MS);
      }
    }
    th0 = th1;
    A0 = A1;
  }
  return out;
}
