import { integrateAdaptive } from './gaussKronrod.js';
import { integrandTheta, toPrincipal, type Cov2, type Vec2 } from './encounterGeometry2d.js';

/** Target relative accuracy of the reference integrator (its error estimate is conservative). */
export const PC_REFERENCE_REL_TOL = 1e-13;

/** Offsets (in σ) where the integrand changes fastest; breakpoints there stop the adaptive rule
 * from stepping over a peak narrower than its first nodes (σ ≪ R). */
const SIGMA_MARKS = [-8, -4, -2, -1, 0, 1, 2, 4, 8];
/** Uniform starting pieces over [−π/2, π/2]. */
const START_PIECES = 8;

function breakpoints(sx: number, sy: number, u: number, v: number, r: number): number[] {
  const h = Math.PI / 2;
  const set = new Set<number>();
  for (let i = 0; i <= START_PIECES; i++) set.add(-h + (2 * h * i) / START_PIECES);
  for (const k of SIGMA_MARKS) {
    const s = (u + k * sx) / r; // density peak along x = R sin θ
    if (s > -1 && s < 1) set.add(Math.asin(s));
    const c = (v + k * sy) / r; // edges of the y-window at R cos θ = v ± kσy
    if (c > 0 && c < 1) {
      const t = Math.acos(c);
      set.add(t);
      set.add(-t);
    }
  }
  return [...set].sort((a, b) => a - b);
}

export interface PcDetail {
  readonly pc: number;
  readonly errorEstimate: number;
  readonly converged: boolean;
}

/**
 * Reference 2-D Pc (short-encounter): bivariate normal N(miss, cov) integrated over the disk of
 * radius R at the origin of the encounter plane. Metres and m². Adaptive Gauss–Kronrod on the
 * 1-D erf form (see integrandTheta), relative accuracy ~1e-13 (checked against SciPy).
 */
export function pc2dReferenceDetail(miss: Vec2, cov: Cov2, radiusM: number): PcDetail {
  if (!(radiusM > 0)) return { pc: 0, errorEstimate: 0, converged: true };
  const p = toPrincipal(miss, cov, radiusM);
  const res = integrateAdaptive(integrandTheta(p), breakpoints(p.sx, p.sy, p.u, p.v, p.r), PC_REFERENCE_REL_TOL);
  return { pc: Math.min(1, Math.max(0, res.value)), errorEstimate: res.errorEstimate, converged: res.converged };
}

export const pc2dReference = (miss: Vec2, cov: Cov2, radiusM: number): number =>
  pc2dReferenceDetail(miss, cov, radiusM).pc;
