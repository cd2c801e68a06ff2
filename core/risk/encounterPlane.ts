import { KeepclearError } from '../errors.js';
import { add, multiply, transpose, type Matrix } from '../math/linalg.js';
import type { StateArray } from '../events/index.js';
import type { Cov2, Vec2 } from './encounterGeometry2d.js';
import type { Vec3n } from './frames.js';

/**
 * Units inside core/risk: metres, m/s and m² (CDM units), converted once here from the km of
 * screening states. Relative quantities are secondary minus primary.
 */
export interface EncounterPlane {
  /** 2-D miss in the plane: x̂ along the miss, so this is [|miss⊥|, 0] (m) */
  readonly missM: Vec2;
  /** combined position covariance projected on the plane (m²) */
  readonly covM2: Cov2;
  readonly relPosM: Vec3n;
  readonly relVelMps: Vec3n;
  readonly relSpeedMps: number;
  /** inertial unit vectors: x̂ (miss direction), ŷ = ẑ × x̂, ẑ (relative velocity) */
  readonly axes: { readonly x: Vec3n; readonly y: Vec3n; readonly z: Vec3n };
  /** combined inertial 3×3 position covariance (m²) */
  readonly combinedCovM2: Matrix;
}

const dot = (a: Vec3n, b: Vec3n): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: Vec3n, b: Vec3n): Vec3n => [
  a[1] * b[2] - a[2] * b[1],
  a[2] * b[0] - a[0] * b[2],
  a[0] * b[1] - a[1] * b[0],
];

/** Below this relative speed (m/s) no encounter plane is defined (objects co-moving). */
export const MIN_PLANE_SPEED_MPS = 1e-6;

/**
 * Encounter (B-)plane at TCA: perpendicular to the relative velocity. The combined covariance is
 * the sum of both objects' inertial position covariances (errors assumed uncorrelated, the usual
 * assumption of the 2-D method: Foster & Estes 1992; Chan 2008).
 */
export function encounterPlane(
  primary: StateArray,
  secondary: StateArray,
  covPrimaryM2: Matrix,
  covSecondaryM2: Matrix,
): EncounterPlane {
  const rel: Vec3n = [
    (secondary[0] - primary[0]) * 1000,
    (secondary[1] - primary[1]) * 1000,
    (secondary[2] - primary[2]) * 1000,
  ];
  const vel: Vec3n = [
    (secondary[3] - primary[3]) * 1000,
    (secondary[4] - primary[4]) * 1000,
    (secondary[5] - primary[5]) * 1000,
  ];
  const speed = Math.hypot(...vel);
  if (!(speed > MIN_PLANE_SPEED_MPS))
    throw new KeepclearError('BAD_ARGUMENT', `encounter plane undefined: relative speed ${speed} m/s`);
  const z: Vec3n = [vel[0] / speed, vel[1] / speed, vel[2] / speed];
  // At an exact TCA rel ⟂ vel; removing the along-velocity part makes small TCA errors harmless.
  const along = dot(rel, z);
  const perp: Vec3n = [rel[0] - along * z[0], rel[1] - along * z[1], rel[2] - along * z[2]];
  const miss = Math.hypot(...perp);
  let x: Vec3n;
  if (miss > 0) x = [perp[0] / miss, perp[1] / miss, perp[2] / miss];
  else {
    // Zero miss: any direction in the plane; take the one furthest from the z-axis choice.
    const k = Math.abs(z[0]) < 0.9 ? ([1, 0, 0] as Vec3n) : ([0, 1, 0] as Vec3n);
    const c = cross(z, k), n = Math.hypot(...c);
    x = [c[0] / n, c[1] / n, c[2] / n];
  }
  const y = cross(z, x);
  const combined = add(covPrimaryM2, covSecondaryM2);
  const p = [[...x], [...y]];
  const c2 = multiply(multiply(p, combined), transpose(p));
  const off = 0.5 * (c2[0]![1]! + c2[1]![0]!);
  return {
    missM: [miss, 0],
    covM2: [[c2[0]![0]!, off], [off, c2[1]![1]!]],
    relPosM: rel,
    relVelMps: vel,
    relSpeedMps: speed,
    axes: { x, y, z },
    combinedCovM2: combined,
  };
}
