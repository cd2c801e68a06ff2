import type { StateGrid } from './primaryGrid.js';
import { norm2, norm3 } from '../math/norm.js';

/**
 * The primary's exact grid expressed, block by block, in a basis of its own orbit plane:
 * r_j = ρ_j·(cos u_j·p̂ + sin u_j·q̂) + z_j·n̂. With it, "where is the primary within D of
 * another plane?" becomes a question about the angle u, answered per block in closed form
 * instead of point by point (see pairFilter.planeWindows). z_j is measured, not assumed zero,
 * so the block's fixed basis costs nothing in rigour.
 */
export interface PlanarTrack {
  readonly blockSize: number;
  readonly blocks: number;
  /**
   * argument of latitude in the block's basis, unwrapped (increasing); blockSize + 1 entries per
   * block: the last is the next block's first point in this block's basis, so consecutive
   * blocks leave no gap between them.
   */
  readonly u: Float64Array;
  /** per block: p̂ (3), q̂ (3), ρ_min, ρ_max, |z|_max */
  readonly basis: Float64Array;
}

export const TRACK_STRIDE = 9;
/** Grid points per block: ≈ 15 min in LEO (14 s steps), short enough for small normal drift. */
export const TRACK_BLOCK = 64;

export function buildPlanarTrack(grid: StateGrid): PlanarTrack {
  const n = grid.count, x = grid.states;
  const blocks = Math.ceil(n / TRACK_BLOCK);
  const u = new Float64Array(blocks * (TRACK_BLOCK + 1));
  const basis = new Float64Array(blocks * TRACK_STRIDE);
  for (let b = 0; b < blocks; b++) {
    const j0 = b * TRACK_BLOCK, j1 = Math.min(n, j0 + TRACK_BLOCK);
    const jLast = Math.min(n - 1, j1); // inclusive: one point into the next block
    // Mean angular-momentum direction over the block.
    let hx = 0, hy = 0, hz = 0;
    for (let j = j0; j < j1; j++) {
      const o = j * 6;
      const rx = x[o]!, ry = x[o + 1]!, rz = x[o + 2]!, vx = x[o + 3]!, vy = x[o + 4]!, vz = x[o + 5]!;
      const r = norm3(rx, ry, rz);
      hx += (ry * vz - rz * vy) / r;
      hy += (rz * vx - rx * vz) / r;
      hz += (rx * vy - ry * vx) / r;
    }
    const hn = norm3(hx, hy, hz);
    const nx = hx / hn, ny = hy / hn, nz = hz / hn;
    // p̂ toward the ascending node (ẑ × n̂); any in-plane direction serves if the orbit is equatorial.
    let px = -ny, py = nx, pz = 0;
    let pn = norm2(px, py);
    if (pn < 1e-9) { px = 1; py = 0; pn = 1; }
    px /= pn; py /= pn;
    const qx = ny * pz - nz * py, qy = nz * px - nx * pz, qz = nx * py - ny * px;
    let rhoMin = Infinity, rhoMax = 0, zMax = 0, prev = 0;
    for (let j = j0; j <= jLast; j++) {
      const o = j * 6;
      const a = x[o]! * px + x[o + 1]! * py + x[o + 2]! * pz;
      const c = x[o]! * qx + x[o + 1]! * qy + x[o + 2]! * qz;
      const z = x[o]! * nx + x[o + 1]! * ny + x[o + 2]! * nz;
      let ang = Math.atan2(c, a);
      if (j > j0) ang += 2 * Math.PI * Math.round((prev - ang) / (2 * Math.PI));
      // Motion is prograde in the plane of its own angular momentum: u increases.
      if (j > j0 && ang < prev) ang += 2 * Math.PI;
      u[b * (TRACK_BLOCK + 1) + (j - j0)] = ang;
      prev = ang;
      const rho = norm2(a, c);
      if (rho < rhoMin) rhoMin = rho;
      if (rho > rhoMax) rhoMax = rho;
      if (Math.abs(z) > zMax) zMax = Math.abs(z);
    }
    const o = b * TRACK_STRIDE;
    basis[o] = px; basis[o + 1] = py; basis[o + 2] = pz;
    basis[o + 3] = qx; basis[o + 4] = qy; basis[o + 5] = qz;
    basis[o + 6] = rhoMin; basis[o + 7] = rhoMax; basis[o + 8] = zMax;
  }
  return { blockSize: TRACK_BLOCK, blocks, u, basis };
}
