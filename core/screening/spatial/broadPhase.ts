/**
 * The spatial index over time: which pairs can come within the screening distance D during
 * which index step. Nothing here is approximate in the unsafe direction; every pad is derived.
 *
 * Step k covers [S + kΔ, S + (k+1)Δ] with centre t_k. For object i, H_i is the Hermite
 * interpolant of its SGP4 samples (blockTracks.ts), p_i = H_i(t_k), w_i = H_i'(t_k). For |τ| ≤ Δ/2:
 *
 *   |r_i(t_k+τ) − p_i − w_i·τ| ≤ E_i + A_i·τ²/2 ≤ q_i := E_i + A_i·Δ²/8
 *
 * (E_i: |SGP4 − H_i|, sampling.ts; A_i: max |H_i''|, exact; Taylor with remainder on H_i).
 * So if the true distance of i and j is ≤ D at some instant of the step,
 *
 *   (test 2)  min_{|τ| ≤ Δ/2} |(p_j − p_i) + (w_j − w_i)·τ|  ≤  D + q_i + q_j,
 *
 * and, since |w| ≤ V (speed bound of the block), also
 *
 *   (test 1)  |p_j − p_i|  ≤  D + R_i + R_j,   R_i := |w_i|·Δ/2 + q_i.
 *
 * The cells (sortedCells.ts): with cells of side C ≥ D + 2·R for the R of all objects but the
 * fastest few (FAST_SHARE), two such objects passing test 1 are in the same or neighbouring cells
 * (a difference ≤ C in every coordinate moves the cell index by ≤ 1); a fast object f and any
 * partner j satisfy |p_j − p_f| ≤ D + 2·max R ≤ L·C, so j is at most L cells away from f in every
 * coordinate (fastPairs). Only those pairs of cells are tested; pairs passing test 2 become
 * candidates, refined exactly afterwards (refine.ts). Nearly coplanar pairs need nothing special
 * here: they are tested at every step they share a neighbourhood, whatever their geometry.
 */
import { CandidateList } from './candidates.js';
import { CELL_LIMIT, cellKey, HALF_NEIGHBOUR_ROWS, type SortedCells } from './sortedCells.js';
import type { BlockTracks } from './blockTracks.js';

export interface BroadPhaseStats {
  steps: number;
  objectSteps: number;
  pairTests: number;
  candidates: number;
}

export interface IndexStepSettings {
  /** window start (ms): step k starts at start + k·stepMs */
  readonly start: number;
  readonly stepMs: number;
  /** screening distance D (km): the largest distance still inside the volume */
  readonly dKm: number;
}

/**
 * Runs the index over steps [k0, k1) of one block. `keep(i, j)` decides whether a pair belongs
 * to this run (shards); candidates (i < j) go to `out`.
 */
export function broadPhase(
  tracks: BlockTracks,
  cells: SortedCells,
  s: IndexStepSettings,
  k0: number,
  k1: number,
  keep: (i: number, j: number) => boolean,
  out: CandidateList,
  stats: BroadPhaseStats,
  cancelled: () => boolean,
): boolean {
  const list: number[] = [];
  for (const i of tracks.members) if (tracks.ok[i]) list.push(i);
  const members = Int32Array.from(list);
  const nm = members.length;
  const half = s.stepMs / 2000; // Δ/2 in seconds
  const q = stepPads(tracks, list, s.stepMs);
  const layout = indexLayout(tracks, list, s);
  const L = layout.fastReachCells;
  const D = s.dKm;
  // The step's states by member (structure of arrays), then gathered in cell order, so pair
  // loops read memory in sequence.
  const px = new Float64Array(nm), py = new Float64Array(nm), pz = new Float64Array(nm);
  const pu = new Float64Array(nm), pv = new Float64Array(nm), pw = new Float64Array(nm);
  const qm = new Float64Array(nm);
  const fm = new Uint8Array(nm);
  for (let m = 0; m < nm; m++) {
    qm[m] = q[members[m]!]!;
    fm[m] = layout.fast[members[m]!]!;
  }
  const gx = new Float64Array(nm), gy = new Float64Array(nm), gz = new Float64Array(nm);
  const gu = new Float64Array(nm), gv = new Float64Array(nm), gw = new Float64Array(nm);
  const gR = new Float64Array(nm), gq = new Float64Array(nm);
  const gF = new Uint8Array(nm);
  const fastAt = new Int32Array(nm);
  const cursor = tracks.cursor(members);
  let tests = 0;
  for (let k = k0; k < k1; k++) {
    if (cancelled()) return false;
    const t = s.start + (k + 0.5) * s.stepMs;
    cursor.statesAt(t, px, py, pz, pu, pv, pw);
    cells.reset(layout.cellKm);
    for (let m = 0; m < nm; m++) cells.add(m, px[m]!, py[m]!, pz[m]!);
    cells.build();
    const sorted = cells.sorted;
    let nFast = 0;
    for (let x = 0; x < nm; x++) {
      const m = sorted[x]!;
      const u = pu[m]!, v = pv[m]!, w = pw[m]!;
      gx[x] = px[m]!; gy[x] = py[m]!; gz[x] = pz[m]!;
      gu[x] = u; gv[x] = v; gw[x] = w;
      // D + R_m, R_m = |w_m|·Δ/2 + q_m
      gR[x] = D + (Math.sqrt(u * u + v * v + w * w) * half + qm[m]!);
      gq[x] = qm[m]!;
      gF[x] = fm[m]!;
      if (fm[m] !== 0) fastAt[nFast++] = x;
    }
    stats.steps++;
    stats.objectSteps += nm;
    const nc = cells.cells, keys = cells.cellKeys, at = cells.cellStart;
    // pairs inside each cell
    for (let c = 0; c < nc; c++) if (at[c + 1]! - at[c]! > 1) pairsOf(at[c]!, at[c + 1]!, -1, -1, k);
    // pairs of neighbouring cells: for each row of offsets, one merge walk over the sorted keys
    for (let h = 0; h < HALF_NEIGHBOUR_ROWS.length; h++) {
      const row = HALF_NEIGHBOUR_ROWS[h]!;
      let j = 0;
      for (let c = 0; c < nc; c++) {
        const lo = keys[c]! + row.base + row.dzFrom, hi = keys[c]! + row.base + 1;
        while (j < nc && keys[j]! < lo) j++;
        if (j === nc) break;
        // the neighbouring cells of the row are consecutive, and so are their objects
        let m = j;
        while (m < nc && keys[m]! <= hi) m++;
        if (m > j) pairsOf(at[c]!, at[c + 1]!, at[j]!, at[m]!, k);
      }
    }
    for (let f = 0; f < nFast; f++) fastPairs(fastAt[f]!, k);
  }
  stats.pairTests += tests;
  return true;

  /**
   * Tests the pairs of sorted[a0..a1) × sorted[b0..b1), or within sorted[a0..a1) when b0 < 0.
   * Pairs with a fast object are left to fastPairs, which sees all of that object's partners.
   */
  function pairsOf(a0: number, a1: number, b0: number, b1: number, k: number): void {
    for (let x = a0; x < a1; x++) {
      const from = b0 < 0 ? x + 1 : b0, to = b0 < 0 ? a1 : b1;
      for (let y = from; y < to; y++) if (near(x, y) && gF[x] === 0 && gF[y] === 0) emit(x, y, k);
    }
  }

  /** Every pair of the fast object at sorted position x, up to L cells away (a pair of two fast objects from the first). */
  function fastPairs(x: number, k: number): void {
    const keys = cells.cellKeys, at = cells.cellStart, nc = cells.cells;
    const cx = cells.coord(gx[x]!), cy = cells.coord(gy[x]!), cz = cells.coord(gz[x]!);
    const z0 = Math.max(-CELL_LIMIT, cz - L), z1 = Math.min(CELL_LIMIT, cz + L);
    for (let ix = Math.max(-CELL_LIMIT, cx - L); ix <= Math.min(CELL_LIMIT, cx + L); ix++) {
      for (let iy = Math.max(-CELL_LIMIT, cy - L); iy <= Math.min(CELL_LIMIT, cy + L); iy++) {
        const hi = cellKey(ix, iy, z1);
        for (let c = cells.firstCellFrom(cellKey(ix, iy, z0)); c < nc && keys[c]! <= hi; c++) {
          for (let y = at[c]!; y < at[c + 1]!; y++) {
            if (y === x || (gF[y] !== 0 && y < x)) continue;
            if (near(x, y)) emit(x, y, k);
          }
        }
      }
    }
  }

  /** Tests 1 and 2 of the header for the objects at sorted positions x and y. */
  function near(x: number, y: number): boolean {
    tests++;
    const dx = gx[y]! - gx[x]!, dy = gy[y]! - gy[x]!, dz = gz[y]! - gz[x]!;
    const l1 = gR[x]! + gR[y]! - D; // D + R_x + R_y
    if (dx * dx + dy * dy + dz * dz > l1 * l1) return false;
    const wx = gu[y]! - gu[x]!, wy = gv[y]! - gv[x]!, wz = gw[y]! - gw[x]!;
    const ww = wx * wx + wy * wy + wz * wz;
    let tau = ww > 0 ? -(dx * wx + dy * wy + dz * wz) / ww : 0;
    if (tau > half) tau = half;
    else if (tau < -half) tau = -half;
    const ex = dx + wx * tau, ey = dy + wy * tau, ez = dz + wz * tau;
    const l2 = D + gq[x]! + gq[y]!;
    return ex * ex + ey * ey + ez * ez <= l2 * l2;
  }

  function emit(x: number, y: number, k: number): void {
    // sorted holds member indices: back to object indices
    const sorted = cells.sorted;
    const a = members[sorted[x]!]!, b = members[sorted[y]!]!;
    const i = a < b ? a : b, j = a < b ? b : a;
    if (!keep(i, j)) return;
    stats.candidates++;
    out.push(i, j, k);
  }
}

/** q_i = E_i + A_i·Δ²/8 (km) of each member: how far it can leave its linear motion in a step. */
export function stepPads(tracks: BlockTracks, members: readonly number[], stepMs: number): Float64Array {
  const half = stepMs / 2000;
  const q = new Float64Array(tracks.ok.length);
  for (const i of members) q[i] = tracks.epsKm[i]! + (tracks.accelKmS2[i]! * half * half) / 2;
  return q;
}

/**
 * Share of a block's objects whose reach may exceed the one the cells are sized for ("fast":
 * eccentric orbits near perigee, up to ~10 km/s against LEO's 7.6). Sizing the cells for every
 * object let 0.1 % of them set the cell side for all: 229 km on the 30,000-object bench
 * catalogue, where 99 % of the objects need at most 183 km (measured). The pair tests per step grow
 * with the cell volume; each fast object instead looks further for its own partners (fastPairs).
 */
export const FAST_SHARE = 0.01;

export interface IndexLayout {
  /** cell side C (km) */
  readonly cellKm: number;
  /** 1 for the fast objects (by object index) */
  readonly fast: Uint8Array;
  /** L: how many cells away (in each coordinate) a fast object's partners can be */
  readonly fastReachCells: number;
}

/**
 * The cells of a block: R_i ≤ V_i·Δ/2 + q_i over the block (V_i its speed bound); C = D + 2·R_base,
 * R_base the largest such bound once the FAST_SHARE largest are set aside; objects above R_base
 * are fast, and L = ⌈(D + 2·max R)/C⌉ (see the header).
 */
export function indexLayout(tracks: BlockTracks, members: readonly number[], s: IndexStepSettings): IndexLayout {
  const half = s.stepMs / 2000;
  const q = stepPads(tracks, members, s.stepMs);
  const reach = Float64Array.from(members, (i) => tracks.speedKmS[i]! * half + q[i]!);
  const fast = new Uint8Array(tracks.ok.length);
  const n = reach.length;
  if (n === 0) return { cellKm: s.dKm, fast, fastReachCells: 1 };
  const ascending = Float64Array.from(reach).sort();
  const rBase = ascending[n - 1 - Math.floor(FAST_SHARE * n)]!;
  const rMax = ascending[n - 1]!;
  members.forEach((i, m) => {
    if (reach[m]! > rBase) fast[i] = 1;
  });
  const cellKm = s.dKm + 2 * rBase;
  return { cellKm, fast, fastReachCells: Math.max(1, Math.ceil((s.dKm + 2 * rMax) / cellKm)) };
}

/** The cell side C of a block (km): indexLayout's. */
export function indexCellKm(tracks: BlockTracks, members: readonly number[], s: IndexStepSettings): number {
  return indexLayout(tracks, members, s).cellKm;
}
