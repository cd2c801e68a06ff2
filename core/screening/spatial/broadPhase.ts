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
 * The cell grid: with cells of side C ≥ D + 2·max R, two objects passing test 1 are in the same
 * or neighbouring cells (a difference ≤ C in every coordinate moves the cell index by ≤ 1).
 * Only pairs of neighbouring cells are tested; pairs passing test 2 become candidates, refined
 * exactly afterwards (refine.ts). Nearly coplanar pairs need nothing special here: they are
 * tested at every step they share a neighbourhood, whatever their geometry.
 */
import { CandidateList } from './candidates.js';
import { CellGrid, HALF_NEIGHBOURS } from './cellGrid.js';
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
  grid: CellGrid,
  s: IndexStepSettings,
  k0: number,
  k1: number,
  keep: (i: number, j: number) => boolean,
  out: CandidateList,
  stats: BroadPhaseStats,
  cancelled: () => boolean,
): boolean {
  const members: number[] = [];
  for (const i of tracks.members) if (tracks.ok[i]) members.push(i);
  const n = tracks.ok.length;
  const half = s.stepMs / 2000; // Δ/2 in seconds
  const q = stepPads(tracks, members, s.stepMs);
  const cellKm = indexCellKm(tracks, members, s);
  const st = new Float64Array(n * 6);
  const R = new Float64Array(n);
  const D = s.dKm;
  const nb = new Int32Array(HALF_NEIGHBOURS.length + 1);
  const offs = Int32Array.from(HALF_NEIGHBOURS.flat());
  let tests = 0;
  for (let k = k0; k < k1; k++) {
    if (cancelled()) return false;
    const t = s.start + (k + 0.5) * s.stepMs;
    grid.reset(cellKm);
    for (let m = 0; m < members.length; m++) {
      const i = members[m]!;
      const o = i * 6;
      tracks.stateInto(i, t, st, o);
      R[i] = Math.sqrt(st[o + 3]! * st[o + 3]! + st[o + 4]! * st[o + 4]! + st[o + 5]! * st[o + 5]!) * half + q[i]!;
      grid.insert(i, st[o]!, st[o + 1]!, st[o + 2]!);
    }
    stats.steps++;
    stats.objectSteps += members.length;
    const head = grid.head, next = grid.next;
    for (let u = 0; u < grid.usedCount; u++) {
      const slot = grid.used[u]!;
      const cx = grid.usedCx[u]!, cy = grid.usedCy[u]!, cz = grid.usedCz[u]!;
      // the cell itself first, then its existing half-neighbours
      let nn = 0;
      nb[nn++] = slot;
      for (let h = 0; h < offs.length; h += 3) {
        const other = grid.find(cx + offs[h]!, cy + offs[h + 1]!, cz + offs[h + 2]!);
        if (other >= 0) nb[nn++] = other;
      }
      if (nn === 1 && next[head[slot]!]! < 0) continue; // a lone object
      for (let a = head[slot]!; a >= 0; a = next[a]!) {
        const oa = a * 6;
        const xa = st[oa]!, ya = st[oa + 1]!, za = st[oa + 2]!;
        const ua = st[oa + 3]!, va = st[oa + 4]!, wa = st[oa + 5]!;
        const ra = D + R[a]!, qa = D + q[a]!;
        for (let c = 0; c < nn; c++) {
          for (let b = c === 0 ? next[a]! : head[nb[c]!]!; b >= 0; b = next[b]!) {
            tests++;
            const ob = b * 6;
            const dx = st[ob]! - xa, dy = st[ob + 1]! - ya, dz = st[ob + 2]! - za;
            const l1 = ra + R[b]!;
            if (dx * dx + dy * dy + dz * dz > l1 * l1) continue;
            const wx = st[ob + 3]! - ua, wy = st[ob + 4]! - va, wz = st[ob + 5]! - wa;
            const ww = wx * wx + wy * wy + wz * wz;
            let tau = ww > 0 ? -(dx * wx + dy * wy + dz * wz) / ww : 0;
            if (tau > half) tau = half;
            else if (tau < -half) tau = -half;
            const ex = dx + wx * tau, ey = dy + wy * tau, ez = dz + wz * tau;
            const l2 = qa + q[b]!;
            if (ex * ex + ey * ey + ez * ez > l2 * l2) continue;
            const i = a < b ? a : b, j = a < b ? b : a;
            if (!keep(i, j)) continue;
            stats.candidates++;
            out.push(i, j, k);
          }
        }
      }
    }
  }
  stats.pairTests += tests;
  return true;
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
