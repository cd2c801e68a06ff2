/**
 * The burn direction needing the least Δv for one burn time, by the linear map.
 *
 * Only the in-plane part of the primary's displacement at TCA changes the miss (the encounter
 * plane is perpendicular to the relative velocity; along it, a displacement only shifts TCA).
 * Let B be the 2×3 map from Δv_RTN to that in-plane displacement. A Δv component in B's null
 * space moves nothing that counts, so the cheapest burns lie in B's row space, spanned by the
 * right singular vectors V₁, V₂ (the two largest eigenvectors of BᵀB). The search runs over the
 * angle ψ of u = cos ψ·V₁ + sin ψ·V₂: for each, the smallest magnitude meeting the target by
 * linear prediction (Pc through the event's own callback), coarse angles then golden-section
 * refinement around the best. Parametrising the burn rather than the displacement
 * keeps every trial finite when B nearly loses rank (lead times of whole orbits, where R and T
 * burns both give mostly along-track motion). Exact for the linear map whatever the covariance
 * shape; the magnitude along the chosen direction is then verified by re-propagation
 * (solveAlong.ts).
 */
import { goldenMin } from '../math/brent.js';
import { symmetricEigen } from '../math/linalg.js';
import type { Vec3 } from './burn.js';
import type { BurnCase, PlanningContext } from './planningContext.js';
import { linearSolve } from './solveAlong.js';

/**
 * 16 coarse angles, then golden section to 1°: near its minimum the cost is flat (quadratic in
 * the angle), so a 1° error costs ~1e-4 of the Δv.
 */
const COARSE_ANGLES = 16;
const ANGLE_TOLERANCE_RAD = Math.PI / 180;

export interface BestDirection {
  readonly unit: Vec3;
  readonly linearDeltaVMs: number;
}

export function bestDirection(ctx: PlanningContext, bc: BurnCase): BestDirection | null {
  const { x, y } = planeAxes(ctx);
  const m = bc.sensitivity.matrix;
  // B rows: x̂ᵀ S_r and ŷᵀ S_r, S_r the position rows of the sensitivity (km per km/s).
  const B = [x, y].map((a) => [0, 1, 2].map((j) => a[0] * m[j]! + a[1] * m[3 + j]! + a[2] * m[6 + j]!));
  const btb = [0, 1, 2].map((i) => [0, 1, 2].map((j) => B[0]![i]! * B[0]![j]! + B[1]![i]! * B[1]![j]!));
  const { vectors } = symmetricEigen(btb); // ascending eigenvalues: columns 2 and 1 span the row space
  const v1 = [0, 1, 2].map((i) => vectors[i]![2]!), v2 = [0, 1, 2].map((i) => vectors[i]![1]!);
  const directionAt = (psi: number): Vec3 => {
    const c = Math.cos(psi), s = Math.sin(psi);
    return [c * v1[0]! + s * v2[0]!, c * v1[1]! + s * v2[1]!, c * v1[2]! + s * v2[2]!];
  };
  let hint: number | undefined;
  const cost = (psi: number): number => {
    const s = linearSolve(ctx, bc, directionAt(psi), hint);
    if (s !== null) hint = s;
    return s ?? Infinity;
  };
  const step = (2 * Math.PI) / COARSE_ANGLES;
  let bestK = 0, bestCost = Infinity;
  for (let k = 0; k < COARSE_ANGLES; k++) {
    const c = cost(k * step);
    if (c < bestCost) {
      bestCost = c;
      bestK = k;
    }
  }
  if (!Number.isFinite(bestCost)) return null;
  const refined = goldenMin(cost, (bestK - 1) * step, (bestK + 1) * step, ANGLE_TOLERANCE_RAD);
  const psi = refined.fx < bestCost ? refined.x : bestK * step;
  return { unit: directionAt(psi), linearDeltaVMs: Math.min(refined.fx, bestCost) };
}

const dot3 = (a: readonly number[], b: readonly number[]): number => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;

/** Encounter-plane axes of the unmanoeuvred encounter: x̂ along the miss, ŷ = ẑ × x̂, ẑ along the relative velocity. */
function planeAxes(ctx: PlanningContext): { x: Vec3; y: Vec3 } {
  const p = ctx.original.primaryState, s = ctx.original.secondaryState;
  const w = [s[3] - p[3], s[4] - p[4], s[5] - p[5]];
  const wn = Math.hypot(w[0]!, w[1]!, w[2]!);
  const z = w.map((c) => c / wn);
  const rho = [s[0] - p[0], s[1] - p[1], s[2] - p[2]];
  const along = dot3(rho, z);
  let x = rho.map((c, i) => c - along * z[i]!);
  let xn = Math.hypot(x[0]!, x[1]!, x[2]!);
  if (!(xn > 1e-9)) {
    // Zero miss: any in-plane axis will do.
    const k = Math.abs(z[0]!) < 0.9 ? [1, 0, 0] : [0, 1, 0];
    x = [z[1]! * k[2]! - z[2]! * k[1]!, z[2]! * k[0]! - z[0]! * k[2]!, z[0]! * k[1]! - z[1]! * k[0]!];
    xn = Math.hypot(x[0]!, x[1]!, x[2]!);
  }
  const xu: Vec3 = [x[0]! / xn, x[1]! / xn, x[2]! / xn];
  const yu: Vec3 = [z[1]! * xu[2] - z[2]! * xu[1], z[2]! * xu[0] - z[0]! * xu[2], z[0]! * xu[1] - z[1]! * xu[0]];
  return { x: xu, y: yu };
}
