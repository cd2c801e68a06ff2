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
 * The cells (sortedCells.ts): with cells of side C ≥ D + 2·max R, two objects passing test 1 are in the same
 * or neighbouring cells (a difference ≤ C in every coordinate moves the cell index by ≤ 1).
 * Only pairs of neighbouring cells are tested; pairs passing test 2 become candidates, refined
 * exactly afterwards (refine.ts). Nearly coplanar pairs need nothing special here: they are
 * tested at every step they share a neighbourhood, whatever their geometry.
 */
import { CandidateList } from './candidates.js';
import { HALF_NEIGHBOUR_ROWS, type SortedCells } from './sortedCells.js';
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
  const cellKm = indexCellKm(tracks, list, s);
  const D = s.dKm;
  // The step's states by member (structure of arrays), then gathered in cell order, so pair
  // loops read memory in sequence.
  const px = new Float64Array(nm), py = new Float64Array(nm), pz = new Float64Array(nm);
  const pu = new Float64Array(nm), pv = new Float64Array(nm), pw = new Float64Array(nm);
  const qm = new Float64Array(nm);
  for (let m = 0; m < nm; m++) qm[m] = q[members[m]!]!;
  const gx = new Float64Array(nm), gy = new Float64Array(nm), gz = new Float64Array(nm);
  const gu = new Float64Array(nm), gv = new Float64Array(nm), gw = new Float64Array(nm);
  const gR = new Float64Array(nm), gq = new Float64Array(nm);
  const cursor = tracks.cursor(members);
  let tests = 0;
  for (let k = k0; k < k1; k++) {
    if (cancelled()) return false;
    const t = s.start + (k + 0.5) * s.stepMs;
    cursor.statesAt(t, px, py, pz, pu, pv, pw);
    cells.reset(cellKm);
    for (let m = 0; m < nm; m++) cells.add(m, px[m]!, py[m]!, pz[m]!);
    cells.build();
    const sorted = cells.sorted;
    for (let x = 0; x < nm; x++) {
      const m = sorted[x]!;
      const u = pu[m]!, v = pv[m]!, w = pw[m]!;
      gx[x] = px[m]!; gy[x] = py[m]!; gz[x] = pz[m]!;
      gu[x] = u; gv[x] = v; gw[x] = w;
      // D + R_m, R_m = |w_m|·Δ/2 + q_m
      gR[x] = D + (Math.sqrt(u * u + v * v + w * w) * half + qm[m]!);
      gq[x] = qm[m]!;
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
        for (let m = j; m < nc && keys[m]! <= hi; m++) pairsOf(at[c]!, at[c + 1]!, at[m]!, at[m + 1]!, k);
      }
    }
  }
  stats.pairTests += tests;
  return true;

  /** Tests the pairs of sorted[a0..a1) × sorted[b0..b1), or within sorted[a0..a1) when b0 < 0. */
  function pairsOf(a0: number, a1: number, b0: number, b1: number, k: number): void {
    const sorted = cells.sorted;
    for (let x = a0; x < a1; x++) {
      const xa = gx[x]!, ya = gy[x]!, za = gz[x]!;
      const ua = gu[x]!, va = gv[x]!, wa = gw[x]!;
      const ra = gR[x]!, qa = D + gq[x]!;
      const from = b0 < 0 ? x + 1 : b0, to = b0 < 0 ? a1 : b1;
      for (let y = from; y < to; y++) {
        tests++;
        const dx = gx[y]! - xa, dy = gy[y]! - ya, dz = gz[y]! - za;
        const l1 = ra + gR[y]! - D; // D + R_a + R_b
        if (dx * dx + dy * dy + dz * dz > l1 * l1) continue;
        const wx = gu[y]! - ua, wy = gv[y]! - va, wz = gw[y]! - wa;
        const ww = wx * wx + wy * wy + wz * wz;
        let tau = ww > 0 ? -(dx * wx + dy * wy + dz * wz) / ww : 0;
        if (tau > half) tau = half;
        else if (tau < -half) tau = -half;
        const ex = dx + wx * tau, ey = dy + wy * tau, ez = dz + wz * tau;
        const l2 = qa + gq[y]!;
        if (ex * ex + ey * ey + ez * ez > l2 * l2) continue;
        // sorted holds member indices: back to object indices
        const a = members[sorted[x]!]!, b = members[sorted[y]!]!;
        const i = a < b ? a : b, j = a < b ? b : a;
        if (!keep(i, j)) continue;
        stats.candidates++;
        out.push(i, j, k);
      }
    }
  }
}

/** q_i = E_i + A_i·Δ²/8 (km) of each member: how far it can leave its linear motion in a step. */
export function stepPads(tracks: BlockTracks, members: readonly number[], stepMs: number): Float64Array {
  const half = stepMs / 2000;
  const q = new Float64Array(tracks.ok.length);
  for (const i of members) q[i] = tracks.epsKm[i]! + (tracks.accelKmS2[i]! * half * half) / 2;
  return q;
}

/** Cell side C = D + 2·max R_i with R_i ≤ V_i·Δ/2 + q_i (km): see the header. */
export function indexCellKm(tracks: BlockTracks, members: readonly number[], s: IndexStepSettings): number {
  const half = s.stepMs / 2000;
  const q = stepPads(tracks, members, s.stepMs);
  let rMax = 0;
  for (const i of members) rMax = Math.max(rMax, tracks.speedKmS[i]! * half + q[i]!);
  return s.dKm + 2 * rMax;
}
