import type { Instant } from '../time/instant.js';
import type { OrbitModel } from './orbitModel.js';
import type { StateGrid } from './primaryGrid.js';
import { TRACK_STRIDE } from './planarTrack.js';
import { BLOCK_NORMAL_LERP_RAD, blockNormalInto, secondaryPlaneWindows, type SecondaryBlocks } from './secondaryWindows.js';
import { intersectRegions, pushRegion, type Regions } from './regions.js';
import { norm2, norm3 } from '../math/norm.js';

export type { Regions } from './regions.js';

/**
 * Candidate time regions of one primary–secondary pair, by conservative filters (the time and
 * orbit-path filters of Hoots, Crawford & Roehrich 1984, in closed form per block):
 *
 * 1b. The secondary must be within D + ε_P + ε_S of the primary's mean plane
 *     (secondaryWindows.ts).
 * 1.  Inside those windows, the primary (exact grid) must be within D + ε_S of the secondary's
 *     mean plane (planeWindows below).
 * 2.  Inside what is left, |r_P − r_S,model| − ε_S − ε_grid is a lower bound of the true
 *     distance; it changes no faster than v_P,max + v_S,max, so while it stays above D the scan
 *     advances by (bound − D)/(v_P,max + v_S,max).
 *
 * Nearly coplanar pairs (same shell, same plane) pass the plane filters everywhere and are
 * handled by filter 2 alone, which stays cheap because their separation changes slowly.
 */

/** Interpolation error of the primary's Hermite grid, with a wide margin (see StateGrid). */
const GRID_EPS_KM = 0.01;
/** Rate bound of the secondary's plane normal (rad/s): J2 nodal regression ≤ ~1e-6 rad/s. */
const NORMAL_RATE_BOUND = 2e-6;
/** Bound of the normal's interpolation error times the radius (km); see tabledNormalInto. */
const NORMAL_INTERP_KM = 0.05;
/** Step inside regions where the distance bound is already below D (ms). */
const INSIDE_STEP_MS = 10_000;

export interface FilterStats {
  planeVisits: number;
  distanceVisits: number;
}

export function candidateRegions(
  grid: StateGrid,
  s: OrbitModel,
  dKm: number,
  start: Instant,
  end: Instant,
  stats?: FilterStats,
  p?: OrbitModel | null,
  /** tables shared between the pairs of one secondary / one primary (secondaryWindows.ts) */
  shared?: { readonly blocks: SecondaryBlocks | null; readonly normals: Float64Array } | null,
): Regions {
  // Filter 1b first (cheapest, most selective): the secondary must be near the primary's mean
  // plane. The primary's true position is within ε_P of that plane, the secondary's within ε_S
  // of its model. Then filter 1 runs only inside those windows.
  const thr1b = dKm + s.epsKm + (p?.epsKm ?? 0) + NORMAL_INTERP_KM;
  const w = p ? secondaryPlaneWindows(s, p, thr1b, start, end, shared?.blocks, shared?.normals) : null;
  let planeRegions: Regions;
  if (!s.hasPlane) planeRegions = w ?? [start, end];
  else if (w) {
    planeRegions = [];
    // Quick test per window before the closed form: g = n_S·r_P at the window's middle, and
    // |ġ| ≤ v_P + |ṅ_S|·r_P over its half-width (same threshold as planeWindows).
    // With the secondary's block tables at hand its normal comes from them (blockNormalInto),
    // within BLOCK_NORMAL_LERP_RAD of the model's; otherwise from the model's own table.
    const sb = shared?.blocks && shared.blocks.start === start && shared.blocks.end === end ? shared.blocks : null;
    const thrP = dKm + s.epsKm + GRID_EPS_KM + (sb ? BLOCK_NORMAL_LERP_RAD * grid.maxRadiusKm() + NORMAL_INTERP_KM : NORMAL_INTERP_KM);
    const gdot = grid.vMaxKmS + NORMAL_RATE_BOUND * grid.maxRadiusKm();
    for (let k = 0; k < w.length; k += 2) {
      const a = Math.max(start, w[k]!), b = Math.min(end, w[k + 1]!);
      if (b < a) continue;
      const tm = 0.5 * (a + b);
      grid.positionInto(tm, POS, 0);
      if (sb) blockNormalInto(sb, tm, NRM);
      else s.tabledNormalInto(tm as Instant, NRM, 0);
      const g = Math.abs(NRM[0]! * POS[0]! + NRM[1]! * POS[1]! + NRM[2]! * POS[2]!);
      if (stats) stats.planeVisits++;
      if (g - gdot * ((b - a) / 2000) > thrP) continue;
      planeWindows(grid, s, dKm, a as Instant, b as Instant, stats, planeRegions);
    }
    planeRegions = intersectRegions(planeRegions, w);
  } else planeRegions = planeWindows(grid, s, dKm, start, end, stats);
  const out: Regions = [];
  const pos = POS;
  const lRate = grid.vMaxKmS + s.vMaxKmS;
  // Second bound on how fast the distance can close (see closingStepS): needs the model's
  // velocity, and both objects on SGP4 (an ephemeris or manoeuvred primary may thrust, and its
  // acceleration has no bound here).
  const withVelocity =
    s.stateInto !== undefined && Number.isFinite(s.velocityErrKmS ?? NaN) && p?.stateInto !== undefined && Number.isFinite(p.velocityErrKmS ?? NaN);
  const rLow = Math.min(grid.minRadiusKm(), s.rMinKm);
  const dvBound = (s.velocityErrKmS ?? 0) + GRID_DV_KMS;
  for (let r = 0; r < planeRegions.length; r += 2) {
    const a = planeRegions[r]!, b = planeRegions[r + 1]!;
    let t = a;
    let inside = -1; // start of the current "maybe within D" run, or −1
    while (t <= b) {
      if (withVelocity) {
        grid.stateInto(t, pos, 0);
        s.stateInto!(t as Instant, pos, 6);
      } else {
        grid.positionInto(t, pos, 0);
        s.positionInto(t as Instant, pos, 6);
      }
      if (stats) stats.distanceVisits++;
      const sep = norm3(pos[0]! - pos[6]!, pos[1]! - pos[7]!, pos[2]! - pos[8]!);
      const lb = sep - s.epsKm - GRID_EPS_KM;
      if (!(lb > dKm)) {
        // NaN (unknown position) also lands here: never prune on missing information.
        if (inside < 0) inside = t;
        t += INSIDE_STEP_MS;
        continue;
      }
      let clearS = (lb - dKm) / lRate;
      if (withVelocity) {
        const v0 = norm3(pos[3]! - pos[9]!, pos[4]! - pos[10]!, pos[5]! - pos[11]!) + dvBound;
        clearS = Math.max(clearS, closingStepS(lb - dKm, v0, sep + s.epsKm + GRID_EPS_KM, lRate, rLow));
      }
      if (inside >= 0) {
        out.push(inside, t);
        inside = -1;
      }
      t += Math.max(clearS * 1000, 1);
    }
    if (inside >= 0) out.push(inside, b);
  }
  return out;
}

/**
 * How long (s) the true distance surely stays above D, from the relative speed instead of the
 * sum of speeds: for a nearly coplanar pair the distance changes far more slowly than
 * v_P + v_S, and the plain bound made the scan crawl along whole weeks in steps of seconds.
 * With a margin `slack` = lower bound − D, the true relative speed now ≤ v0 (model and grid
 * velocities plus their error bounds) and the relative acceleration ≤ A, the distance cannot
 * shrink by `slack` before v0·τ + ½·A·τ² = slack. A bounds the difference of the two
 * accelerations: central gravity changes by at most 2μ/z³ per km of separation (the tidal
 * tensor's largest eigenvalue, z the smallest radius on the segment between them, for a
 * separation up to ρmax over the step), plus what SGP4 adds to central gravity for each object
 * (MAX_EXTRA_ACCEL_KMS2: measured ≤ 2.6e-5 km/s² over the synthetic catalogue and ≤ ~2.7e-4 on the
 * published verification sets, 23333 near perigee; test/screening-closing-step.test.ts).
 * Capped at CLOSING_STEP_CAP_S, for which ρmax is sized; 0 when the bound does not apply.
 */
function closingStepS(slack: number, v0: number, sepUpper: number, lRate: number, rLowKm: number): number {
  const rhoMax = sepUpper + lRate * CLOSING_STEP_CAP_S;
  const z2 = rLowKm * rLowKm - (rhoMax * rhoMax) / 4;
  if (!(z2 > 0)) return 0;
  const z = Math.sqrt(z2);
  const A = (2 * MU_KM3_S2 * rhoMax) / (z * z * z) + 2 * MAX_EXTRA_ACCEL_KMS2;
  const tau = (2 * slack) / (v0 + Math.sqrt(v0 * v0 + 2 * A * slack)); // root of ½Aτ² + v0τ − slack
  return Math.min(tau, CLOSING_STEP_CAP_S);
}

/** Longest step of the relative-speed bound (s): limits the separation growth it must allow for. */
const CLOSING_STEP_CAP_S = 120;
/** Bound of SGP4's acceleration beyond central gravity, per object (km/s²): see closingStepS. */
export const MAX_EXTRA_ACCEL_KMS2 = 1e-3;
/** Bound of |dr/dt − grid velocity| for the primary (km/s): Hermite derivative error (≤ 1e-5) and SGP4's velocity gap (≤ 2e-3). */
const GRID_DV_KMS = 0.01;
/** WGS-72 μ (km³/s²), as the models use. */
const MU_KM3_S2 = 398600.8;

const POS = new Float64Array(12);
const NRM = new Float64Array(3);

/** Slack for radius and out-of-plane distance between grid points (km): ≤ v²h²/(8r) ≪ 1 km. */
const BETWEEN_POINTS_KM = 1;

/**
 * Filter 1 in closed form, block by block of the primary's planar track. In a block,
 * g = n_S·r_P = ρ·A·cos(u − φ) + z·(n_S·n̂_P) + ρ·(n_S − n_S,c)·(in-plane), where A, φ come from
 * the secondary's normal n_S,c at the block centre. So |g| ≤ thr needs
 * |cos(u − φ)| ≤ (thr + |z|max + ρmax·δn + pad)/((ρmin − pad)·A): two windows of u around
 * φ ± π/2 per revolution. u is monotonic, so each window maps to grid indices by bisection; the
 * time span between those grid points contains every instant with u inside the window.
 */
export function planeWindows(
  grid: StateGrid,
  s: OrbitModel,
  dKm: number,
  start: Instant,
  end: Instant,
  stats?: FilterStats,
  regions: Regions = [],
): Regions {
  const track = grid.track();
  const B = track.blockSize, u = track.u, basis = track.basis;
  const h = grid.stepMs;
  const thr = dKm + s.epsKm + GRID_EPS_KM + NORMAL_INTERP_KM;
  // The normal at the block centre differs from the normal anywhere in the block by ≤ rate·(half block + h).
  const dn = NORMAL_RATE_BOUND * ((B / 2 + 1) * h) / 1000;
  const nrm = NRM;
  const bStart = Math.max(0, Math.floor((start - grid.start) / h / B));
  const bEnd = Math.min(track.blocks - 1, Math.floor((end - grid.start) / h / B));
  for (let blk = bStart; blk <= bEnd; blk++) {
    if (stats) stats.planeVisits++;
    const j0 = blk * B;
    const jLast = Math.min(grid.count - 1, j0 + B); // inclusive
    const tc = grid.start + ((j0 + jLast) / 2) * h;
    s.tabledNormalInto(tc as Instant, nrm, 0);
    const o = blk * TRACK_STRIDE;
    const a = nrm[0]! * basis[o]! + nrm[1]! * basis[o + 1]! + nrm[2]! * basis[o + 2]!;
    const b = nrm[0]! * basis[o + 3]! + nrm[1]! * basis[o + 4]! + nrm[2]! * basis[o + 5]!;
    const A = norm2(a, b);
    const rhoMin = basis[o + 6]! - BETWEEN_POINTS_KM, rhoMax = basis[o + 7]!, zMax = basis[o + 8]!;
    const c = (thr + zMax + BETWEEN_POINTS_KM + rhoMax * dn) / (rhoMin * A);
    const t0 = grid.start + j0 * h, t1 = grid.start + jLast * h;
    if (!(c < 1)) {
      pushRegion(regions, t0, t1, start, end);
      continue;
    }
    const alpha = Math.asin(c);
    const ub = blk * (B + 1);
    const uLo = u[ub]!, uHi = u[ub + (jLast - j0)]!;
    const phi = Math.atan2(b, a) + Math.PI / 2;
    const kFirst = Math.ceil((uLo - alpha - phi) / Math.PI);
    const kLast = Math.floor((uHi + alpha - phi) / Math.PI);
    for (let k = kFirst; k <= kLast; k++) {
      const wLo = phi + k * Math.PI - alpha, wHi = phi + k * Math.PI + alpha;
      // last grid index with u ≤ wLo, first with u ≥ wHi (clamped to the block)
      const iLo = lastAtOrBelow(u, ub, jLast - j0, wLo);
      const iHi = firstAtOrAbove(u, ub, jLast - j0, wHi);
      pushRegion(regions, t0 + iLo * h, t0 + iHi * h, start, end);
    }
  }
  return regions;
}

/** Largest i in [0, n] with u[base + i] ≤ x, or 0. */
function lastAtOrBelow(u: Float64Array, base: number, n: number, x: number): number {
  if (u[base]! > x) return 0;
  let lo = 0, hi = n;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (u[base + mid]! <= x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** Smallest i in [0, n] with u[base + i] ≥ x, or n. */
function firstAtOrAbove(u: Float64Array, base: number, n: number, x: number): number {
  if (u[base + n]! < x) return n;
  let lo = 0, hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (u[base + mid]! >= x) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
