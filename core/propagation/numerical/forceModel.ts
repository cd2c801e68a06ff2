/**
 * Accelerations of the numerical propagator, in TEME (km, km/s, km/s²):
 * two-body + zonal harmonics J2, J3, J4 (EGM-96, earthModel.ts) + drag in an exponential
 * atmosphere turning with the Earth (atmosphere.ts, ballistic.ts).
 *
 * Zonal terms are the gradients of U_n = −(μ/r)·J_n·(R/r)^n·P_n(z/r) (Vallado, Fundamentals of
 * Astrodynamics and Applications, §8.6.1, the J2/J3/J4 acceleration components). They depend
 * only on the distance from the polar axis and the height above the equator, so they are the
 * same in TEME (true equator of date) as in an Earth-fixed frame, up to polar motion (< 0.6″).
 *
 * Why TEME may be treated as inertial here: its axes follow precession and nutation, which turn
 * them by < 0.2″ per day (50″/yr precession; the fastest sizeable nutation term, 13.7 days,
 * ~0.2″). Over the days of a plan that is < 7 m at LEO radius on an absolute state and a
 * 1e-6 relative error on the manoeuvred-minus-unmanoeuvred difference, which is what the planner
 * uses (both copies carry the same frame error).
 */
import { exponentialDensity } from './atmosphere.js';
import type { DragParameter } from './ballistic.js';
import {
  EARTH_ROTATION_RAD_S,
  J2_EGM96,
  J3_EGM96,
  J4_EGM96,
  MU_EGM96,
  R_EGM96,
  WGS84_A_KM,
  WGS84_FLATTENING,
} from './earthModel.js';

export interface ForceModel {
  readonly mu: number;
  readonly radiusKm: number;
  /** 0 = two-body only, 2 = J2, 3 = J2+J3, 4 = J2+J3+J4 */
  readonly zonalDegree: 0 | 2 | 3 | 4;
  readonly j2: number;
  readonly j3: number;
  readonly j4: number;
  /** C_D·A/m in m²/kg; 0 = no drag */
  readonly cdAreaOverMassM2PerKg: number;
  /** where the drag parameter came from (ballistic.ts) */
  readonly dragSource: DragParameter['source'];
}

export function forceModel(opts: { zonalDegree?: 0 | 2 | 3 | 4; drag?: DragParameter | null } = {}): ForceModel {
  return {
    mu: MU_EGM96,
    radiusKm: R_EGM96,
    zonalDegree: opts.zonalDegree ?? 4,
    j2: J2_EGM96,
    j3: J3_EGM96,
    j4: J4_EGM96,
    cdAreaOverMassM2PerKg: opts.drag?.cdAreaOverMassM2PerKg ?? 0,
    dragSource: opts.drag?.source ?? 'none',
  };
}

/** Two-body only: the model of the closed-form checks. */
export const TWO_BODY: ForceModel = forceModel({ zonalDegree: 0 });

/**
 * Height above the WGS-84 ellipsoid (km), to first order in the flattening:
 * h ≈ r − a(1 − f·sin²φ) with sin φ ≈ z/r. Good to ~10 m, far below what an exponential
 * atmosphere can resolve; a sphere instead would put the poles 21 km too high.
 */
export function heightAboveEllipsoidKm(x: number, y: number, z: number): number {
  const r = Math.sqrt(x * x + y * y + z * z);
  const s = z / r;
  return r - WGS84_A_KM * (1 - WGS84_FLATTENING * s * s);
}

/**
 * Acceleration of state y (offset `o`: x y z vx vy vz) into out[oo..oo+2]. Allocation-free: it
 * runs several hundred thousand times per plan.
 */
export function accelerationInto(m: ForceModel, y: ArrayLike<number>, o: number, out: Float64Array, oo: number): void {
  const x = y[o]!, yy = y[o + 1]!, z = y[o + 2]!;
  const r2 = x * x + yy * yy + z * z;
  const r = Math.sqrt(r2);
  const mu = m.mu;
  const k0 = -mu / (r2 * r);
  let ax = k0 * x, ay = k0 * yy, az = k0 * z;

  if (m.zonalDegree >= 2) {
    const R = m.radiusKm;
    const s = z / r, s2 = s * s;
    const q = R / r, q2 = q * q;
    const mr3 = mu / (r2 * r); // μ/r³: the factor x/r · μ/r² of every term
    // J2: a_xy = −(3/2) J2 μ/r³ (R/r)² (1 − 5s²) (x, y), a_z = −(3/2) J2 μ/r³ (R/r)² (3 − 5s²) z
    const c2 = -1.5 * m.j2 * mr3 * q2;
    const f2 = c2 * (1 - 5 * s2);
    ax += f2 * x;
    ay += f2 * yy;
    az += c2 * (3 - 5 * s2) * z;
    if (m.zonalDegree >= 3) {
      // J3: a_xy = −(5/2) J3 μ/r³ (R/r)³ (3s − 7s³)(x, y), a_z = −(5/2) J3 μ/r² (R/r)³ (6s² − 7s⁴ − 3/5)
      const c3 = -2.5 * m.j3 * mr3 * q2 * q;
      const f3 = c3 * (3 * s - 7 * s2 * s);
      ax += f3 * x;
      ay += f3 * yy;
      az += c3 * r * (6 * s2 - 7 * s2 * s2 - 0.6);
      if (m.zonalDegree >= 4) {
        // J4: a_xy = (15/8) J4 μ/r³ (R/r)⁴ (1 − 14s² + 21s⁴)(x, y), a_z = (15/8) J4 μ/r³ (R/r)⁴ (5 − 70s²/3 + 21s⁴) z
        const c4 = 1.875 * m.j4 * mr3 * q2 * q2;
        const f4 = c4 * (1 - 14 * s2 + 21 * s2 * s2);
        ax += f4 * x;
        ay += f4 * yy;
        az += c4 * (5 - (70 / 3) * s2 + 21 * s2 * s2) * z;
      }
    }
  }

  if (m.cdAreaOverMassM2PerKg > 0) {
    const rho = exponentialDensity(heightAboveEllipsoidKm(x, yy, z));
    // Velocity relative to the atmosphere turning with the Earth: v − ω × r, ω along +z.
    const w = EARTH_ROTATION_RAD_S;
    const vx = y[o + 3]! + w * yy, vy = y[o + 4]! - w * x, vz = y[o + 5]!;
    const v = Math.sqrt(vx * vx + vy * vy + vz * vz);
    // −½ ρ B |v| v: ρ·B in 1/m times (km/s)² is 1000 km/s².
    const k = -0.5 * rho * m.cdAreaOverMassM2PerKg * v * 1000;
    ax += k * vx;
    ay += k * vy;
    az += k * vz;
  }
  out[oo] = ax;
  out[oo + 1] = ay;
  out[oo + 2] = az;
}
