import type { Instant } from '../time/instant.js';
import type { OrbitModel } from './orbitModel.js';
import type { StateGrid } from './primaryGrid.js';

/**
 * Candidate time regions of one primary–secondary pair, by two conservative filters:
 *
 * 1. Orbit-plane filter: an approach within D requires the primary to be within D + ε_S of the
 *    secondary's mean orbit plane (the secondary is on its plane to within ε_S, its model error).
 *    g(t) = n_S(t)·r_P(t) is scanned on the primary's exact grid, skipping ahead by
 *    (|g| − thr)/ġ_max where ġ_max ≥ |v_P| + |ṅ_S||r_P| bounds |dg/dt|: no root is skipped.
 *    (Hoots, Crawford & Roehrich 1984, the orbit-path/time filters, in a time-scan form.)
 * 2. Distance filter inside those regions: |r_P − r_S,model| − ε_S − ε_grid is a lower bound
 *    of the true distance; it changes no faster than v_P,max + v_S,max, so while it stays
 *    above D the scan advances by (bound − D)/(v_P,max + v_S,max).
 *
 * Nearly coplanar pairs (same shell, same plane) pass filter 1 everywhere and are handled by
 * filter 2 alone, which stays cheap because their separation changes slowly.
 */

/** Interpolation error of the primary's Hermite grid, with a wide margin (see StateGrid). */
const GRID_EPS_KM = 0.01;
/** Rate bound of the secondary's plane normal (rad/s): J2 nodal regression ≤ ~1e-6 rad/s. */
const NORMAL_RATE_BOUND = 2e-6;
/** Grid points per linearly interpolated block of the secondary's plane normal. */
const NORMAL_BLOCK = 64;
/** Bound of the normal's interpolation error times the radius (km); actual ≤ ~1e-3 km. */
const NORMAL_INTERP_KM = 0.05;
/** Step inside regions where the distance bound is already below D (ms). */
const INSIDE_STEP_MS = 10_000;

export type Region = [number, number];

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
): Region[] {
  const planeRegions = s.hasPlane ? planeFilter(grid, s, dKm, start, end, stats) : [[start, end] as Region];
  const out: Region[] = [];
  const pos = new Float64Array(6);
  const lRate = grid.vMaxKmS + s.vMaxKmS;
  for (const [a, b] of planeRegions) {
    let t = a;
    let inside = -1; // start of the current "maybe within D" run, or −1
    while (t <= b) {
      grid.positionInto(t, pos, 0);
      s.positionInto(t as Instant, pos, 3);
      if (stats) stats.distanceVisits++;
      const lb = Math.hypot(pos[0]! - pos[3]!, pos[1]! - pos[4]!, pos[2]! - pos[5]!) - s.epsKm - GRID_EPS_KM;
      if (!(lb > dKm)) {
        // NaN (unknown position) also lands here: never prune on missing information.
        if (inside < 0) inside = t;
        t += INSIDE_STEP_MS;
        continue;
      }
      const clear = ((lb - dKm) / lRate) * 1000;
      if (inside >= 0) {
        out.push([inside, t]);
        inside = -1;
      }
      t += Math.max(clear, 1);
    }
    if (inside >= 0) out.push([inside, b]);
  }
  return out;
}

function planeFilter(
  grid: StateGrid,
  s: OrbitModel,
  dKm: number,
  start: Instant,
  end: Instant,
  stats?: FilterStats,
): Region[] {
  const h = grid.stepMs;
  const hS = h / 1000;
  const rMax = grid.maxRadiusKm();
  // The secondary's normal is evaluated every NORMAL_BLOCK grid points and interpolated
  // linearly; the error is ≤ |n̈|·Δ²/8 ≤ (2e-6 rad/s)²·Δ²/8, times r_P (well under NORMAL_INTERP_KM).
  const thr = dKm + s.epsKm + GRID_EPS_KM + NORMAL_INTERP_KM;
  // |dg/dt| ≤ |v_P| + |ṅ_S|·|r_P|.
  const gdot = grid.vMaxKmS * 1.001 + NORMAL_RATE_BOUND * rMax;
  const regions: Region[] = [];
  const n0 = new Float64Array(3), n1 = new Float64Array(3);
  let block = -1;
  const x = grid.states;
  const jStart = Math.max(0, Math.floor((start - grid.start) / h));
  const jEnd = Math.min(grid.count - 1, Math.ceil((end - grid.start) / h));
  let j = jStart;
  while (j <= jEnd) {
    const blk = Math.floor(j / NORMAL_BLOCK);
    if (blk !== block) {
      block = blk;
      s.normalInto((grid.start + blk * NORMAL_BLOCK * h) as Instant, n0, 0);
      s.normalInto((grid.start + (blk + 1) * NORMAL_BLOCK * h) as Instant, n1, 0);
    }
    const w = (j - blk * NORMAL_BLOCK) / NORMAL_BLOCK;
    const nx = n0[0]! + w * (n1[0]! - n0[0]!), ny = n0[1]! + w * (n1[1]! - n0[1]!), nz = n0[2]! + w * (n1[2]! - n0[2]!);
    const g = Math.abs(nx * x[j * 6]! + ny * x[j * 6 + 1]! + nz * x[j * 6 + 2]!);
    if (stats) stats.planeVisits++;
    if (g <= thr + gdot * hS) {
      const t = grid.start + j * h;
      const a = Math.max(start, t - h), b = Math.min(end, t + h);
      const last = regions[regions.length - 1];
      if (last && last[1] >= a) last[1] = b;
      else regions.push([a, b]);
      j++;
    } else {
      j += Math.max(1, Math.floor((g - thr) / gdot / hS));
    }
  }
  return regions;
}
