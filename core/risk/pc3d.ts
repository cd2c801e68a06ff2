/**
 * Three-dimensional Pc for encounters where the short-encounter assumption fails (slow or long
 * encounters: the relative path curves and the covariances change while the objects cross each
 * other's uncertainty region). The method is Coppola's (V. T. Coppola, "Including velocity
 * uncertainty in the probability of collision between space objects", AAS 12-247, 2012):
 *
 *   Pc ≈ ∫ Ṗc(t) dt,   Ṗc(t) = R² ∮ p_r(Rû, t) · E[(−û·v)⁺ | r = Rû, t] dΩ(û)
 *
 * the rate at which probability flows into the hard-body sphere of radius R, from the Gaussian of
 * the relative position r and velocity v at each time t. With w = −û·v ~ N(m, s²) given r = Rû,
 * E[w⁺] = m·Φ(m/s) + s·φ(m/s). Summing the inflow counts every entry, so Pc is the expected
 * number of entries: an upper bound on the probability of at least one, equal to it while
 * re-entries are negligible (checked against a trajectory Monte Carlo in test/risk-pc-3d).
 *
 * Dynamics (our choice, stated): each object's mean state and covariance are carried from TCA by
 * two-body motion (mean by Kepler's problem, covariance by its state transition matrix). Both
 * objects feel almost the same J2 and drag when they are close, so what two-body leaves out is
 * common to both and cancels in the relative motion to first order in their separation.
 * Errors of the two objects are independent (as in the 2-D method).
 */
import { KeepclearError } from '../errors.js';
import { add, multiply, transpose, type Matrix } from '../math/linalg.js';
import { erfc } from './erf.js';
import { gaussLegendre } from './gaussLegendre.js';
import { integrateAdaptive } from './gaussKronrod.js';
import { MU_M3_S2, propagateWithStm, type State6 } from './twoBody.js';

/** The time window spans ± this many σ_t = σ(along relative velocity)/speed around TCA: the
 * inflow falls like exp(−k²/2), so at 8σ it is ~1e-14 of its peak. */
export const PC3D_SIGMA_SPAN = 8;
/** Largest half-window as a fraction of the shorter orbital period: ¼ period apart is another
 * approach of the same pair (the series rule, core/events/seriesTolerance.ts, uses the same cap). */
export const PC3D_MAX_WINDOW_FRACTION = 0.25;
/** Relative accuracy asked of the time quadrature (adaptive Gauss–Kronrod; its estimate is conservative). */
export const PC3D_TIME_REL_TOL = 1e-6;
/** Sphere quadrature (sphereRule): nodes in cos θ per hemisphere; 2·n in φ. Grows with R/σmin
 * (the density then varies over the sphere). 8 and 24 gave the same Pc to 1.5e-4 relative on
 * the cases of test/risk-pc-3d (fast, slow crossing, slow overtaking; measured when chosen). */
const SPHERE_BASE_NODES = 8;
const SPHERE_MAX_NODES = 48;
const MAX_TIME_INTERVALS = 400;
/**
 * Absolute accuracy of the time quadrature: a Pc known to ±1e-15 is exact for every purpose (tier
 * thresholds are 1e-4 and 1e-7; Pc is shown down to 1e-10). Without it, encounters with Pc near
 * 1e-200 (a 2 km miss with 50 m covariances) would be refined to full relative accuracy in
 * vain, at ~10× the cost.
 */
export const PC3D_ABS_TOL = 1e-15;

const INV_SQRT_2PI = 0.3989422804014327;
const TWO_PI_POW_1_5 = Math.pow(2 * Math.PI, 1.5);

/** Standard normal CDF, from erfc for accuracy in the lower tail. */
const normCdf = (x: number): number => 0.5 * erfc(-x * Math.SQRT1_2);

export interface Pc3dInput {
  /** states at TCA, inertial, m and m/s */
  readonly primary: State6;
  readonly secondary: State6;
  /** 6×6 inertial position-velocity covariances at TCA (m², m²/s, m²/s²) */
  readonly primaryCov: Matrix;
  readonly secondaryCov: Matrix;
  readonly radiusM: number;
}

export interface Pc3dResult {
  readonly pc: number;
  /** half-width of the time window integrated, s */
  readonly halfWindowS: number;
  /** true when the window was cut at PC3D_MAX_WINDOW_FRACTION of the period */
  readonly windowCapped: boolean;
  readonly converged: boolean;
  /** evaluations of the inflow rate (each propagates both objects with their STMs) */
  readonly evaluations: number;
}

function periodS(x: State6, mu: number): number {
  const r = Math.hypot(x[0], x[1], x[2]);
  const inv = 2 / r - (x[3] * x[3] + x[4] * x[4] + x[5] * x[5]) / mu;
  return inv > 0 ? 2 * Math.PI * Math.sqrt(1 / (inv * inv * inv) / mu) : Infinity;
}

/** Inverse and determinant of a symmetric positive definite 3×3 (cofactors). */
function inverse3(a: Matrix): { inv: Matrix; det: number } {
  const p = a[0]![0]!, q = a[0]![1]!, r = a[0]![2]!, s = a[1]![1]!, t = a[1]![2]!, u = a[2]![2]!;
  const c00 = s * u - t * t, c01 = r * t - q * u, c02 = q * t - r * s;
  const det = p * c00 + q * c01 + r * c02;
  if (!(det > 0)) throw new KeepclearError('BAD_ARGUMENT', `3-D Pc: relative position covariance is singular (det ${det})`);
  const c11 = p * u - r * r, c12 = q * r - p * t, c22 = p * s - q * q;
  return { inv: [[c00 / det, c01 / det, c02 / det], [c01 / det, c11 / det, c12 / det], [c02 / det, c12 / det, c22 / det]], det };
}

/**
 * Nodes on the unit sphere in a frame whose pole e₃ is set per time (along the relative mean
 * velocity): Gauss–Legendre in cos θ on each hemisphere separately × uniform in φ. The inflow
 * E[(−û·v)⁺] has a kink where û ⟂ v; with the pole along v that kink lies on the hemispheres'
 * common edge, so each half is smooth and the Gauss rule converges fast.
 */
interface SphereRule {
  /** per node: cos θ, sin θ cos φ, sin θ sin φ (in the pole frame) and weight */
  readonly c: Float64Array;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly w: Float64Array;
}
function sphereRule(nTheta: number): SphereRule {
  const nPhi = 2 * nTheta;
  const gl = gaussLegendre(nTheta);
  const size = 2 * nTheta * nPhi;
  const c = new Float64Array(size), x = new Float64Array(size), y = new Float64Array(size), w = new Float64Array(size);
  let q = 0;
  for (const side of [-1, 1])
    for (let i = 0; i < nTheta; i++) {
      const ct = side * 0.5 * (1 + gl.x[i]!), st = Math.sqrt(Math.max(0, 1 - ct * ct));
      for (let k = 0; k < nPhi; k++) {
        const phi = (2 * Math.PI * (k + 0.5)) / nPhi;
        c[q] = ct;
        x[q] = st * Math.cos(phi);
        y[q] = st * Math.sin(phi);
        w[q] = (0.5 * gl.w[i]! * 2 * Math.PI) / nPhi;
        q++;
      }
    }
  return { c, x, y, w };
}

/** Orthonormal e₁, e₂ completing a unit e₃. */
function completeBasis(e3: readonly number[]): [number[], number[]] {
  const k = Math.abs(e3[0]!) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  const a = [e3[1]! * k[2]! - e3[2]! * k[1]!, e3[2]! * k[0]! - e3[0]! * k[2]!, e3[0]! * k[1]! - e3[1]! * k[0]!];
  const n = Math.hypot(a[0]!, a[1]!, a[2]!);
  const e1 = a.map((v) => v / n);
  const e2 = [e3[1]! * e1[2]! - e3[2]! * e1[1]!, e3[2]! * e1[0]! - e3[0]! * e1[2]!, e3[0]! * e1[1]! - e3[1]! * e1[0]!];
  return [e1, e2];
}

const sub6 = (a: State6, b: State6): number[] => a.map((x, i) => x - b[i]!);
const block = (m: Matrix, r0: number, c0: number): Matrix => [0, 1, 2].map((i) => [0, 1, 2].map((j) => m[r0 + i]![c0 + j]!));

/** Inflow rate Ṗc at time t (s from TCA). */
function makeRate(inp: Pc3dInput, rule: SphereRule, mu: number): { rate: (t: number) => number; count: () => number } {
  let n = 0;
  const R = inp.radiusM;
  const rate = (t: number): number => {
    n++;
    const p = propagateWithStm(inp.primary, t, mu), s = propagateWithStm(inp.secondary, t, mu);
    const mean = sub6(s.state, p.state);
    const cov = add(
      multiply(multiply(p.stm, inp.primaryCov), transpose(p.stm)),
      multiply(multiply(s.stm, inp.secondaryCov), transpose(s.stm)),
    );
    const prr = block(cov, 0, 0), pvr = block(cov, 3, 0), pvv = block(cov, 3, 3);
    const sym = prr.map((row, i) => row.map((x, j) => 0.5 * (x + prr[j]![i]!)));
    const { inv, det } = inverse3(sym);
    const k = multiply(pvr, inv); // conditional mean gain of v on r
    const gamma = multiply(k, transpose(pvr)).map((row, i) => row.map((x, j) => pvv[i]![j]! - x));
    const norm = 1 / (TWO_PI_POW_1_5 * Math.sqrt(det));
    const vn = Math.hypot(mean[3]!, mean[4]!, mean[5]!);
    const e3 = vn > 0 ? [mean[3]! / vn, mean[4]! / vn, mean[5]! / vn] : [0, 0, 1];
    const [e1, e2] = completeBasis(e3);
    let sum = 0;
    const u = [0, 0, 0];
    for (let q = 0; q < rule.w.length; q++) {
      const a = rule.x[q]!, b = rule.y[q]!, cz = rule.c[q]!;
      u[0] = a * e1[0]! + b * e2[0]! + cz * e3[0]!;
      u[1] = a * e1[1]! + b * e2[1]! + cz * e3[1]!;
      u[2] = a * e1[2]! + b * e2[2]! + cz * e3[2]!;
      const d0 = R * u[0]! - mean[0]!, d1 = R * u[1]! - mean[1]!, d2 = R * u[2]! - mean[2]!;
      const m2 =
        d0 * (inv[0]![0]! * d0 + inv[0]![1]! * d1 + inv[0]![2]! * d2) +
        d1 * (inv[1]![0]! * d0 + inv[1]![1]! * d1 + inv[1]![2]! * d2) +
        d2 * (inv[2]![0]! * d0 + inv[2]![1]! * d1 + inv[2]![2]! * d2);
      const dens = norm * Math.exp(-0.5 * m2);
      if (dens === 0) continue;
      // conditional velocity mean ν = μv + K·d, and w = −û·v
      let m = 0, s2 = 0;
      for (let i = 0; i < 3; i++) {
        const nu = mean[3 + i]! + k[i]![0]! * d0 + k[i]![1]! * d1 + k[i]![2]! * d2;
        m -= u[i]! * nu;
        for (let j = 0; j < 3; j++) s2 += u[i]! * gamma[i]![j]! * u[j]!;
      }
      const sd = Math.sqrt(Math.max(s2, 0));
      const flux = sd > 0 ? m * normCdf(m / sd) + sd * INV_SQRT_2PI * Math.exp((-0.5 * m * m) / (sd * sd)) : Math.max(m, 0);
      sum += rule.w[q]! * dens * flux;
    }
    return R * R * sum;
  };
  return { rate, count: () => n };
}

/** Coppola's 3-D Pc over a window around TCA (see the file comment). */
export function pc3d(inp: Pc3dInput, mu = MU_M3_S2): Pc3dResult {
  if (!(inp.radiusM > 0)) return { pc: 0, halfWindowS: 0, windowCapped: false, converged: true, evaluations: 0 };
  const rel = sub6(inp.secondary, inp.primary);
  const speed = Math.hypot(rel[3]!, rel[4]!, rel[5]!);
  if (!(speed > 0)) throw new KeepclearError('BAD_ARGUMENT', '3-D Pc: zero relative speed at TCA');
  const z = [rel[3]! / speed, rel[4]! / speed, rel[5]! / speed];
  const crr = add(block(inp.primaryCov, 0, 0), block(inp.secondaryCov, 0, 0));
  let along = 0, minVar = Infinity;
  for (let i = 0; i < 3; i++) {
    minVar = Math.min(minVar, crr[i]![i]!);
    for (let j = 0; j < 3; j++) along += z[i]! * crr[i]![j]! * z[j]!;
  }
  const sigmaT = (Math.sqrt(Math.max(along, 0)) + inp.radiusM) / speed;
  const cap = PC3D_MAX_WINDOW_FRACTION * Math.min(periodS(inp.primary, mu), periodS(inp.secondary, mu));
  const wanted = PC3D_SIGMA_SPAN * sigmaT;
  const half = Math.min(wanted, cap);
  // Nodes on the sphere grow with R/σ (σ: the smallest axis-aligned σ, a cheap lower-ish bound).
  const ratio = inp.radiusM / Math.sqrt(Math.max(minVar, 1e-300));
  const nTheta = Math.min(SPHERE_MAX_NODES, Math.ceil(SPHERE_BASE_NODES * Math.max(1, ratio)));
  const { rate, count } = makeRate(inp, sphereRule(nTheta), mu);
  const marks = [0, 1.5, 4].map((k) => k * sigmaT).filter((x) => x < half);
  const breaks = [...new Set([-half, ...marks.slice(1).map((x) => -x).reverse(), ...marks, half])].sort((a, b) => a - b);
  const res = integrateAdaptive(rate, breaks, PC3D_TIME_REL_TOL, MAX_TIME_INTERVALS, PC3D_ABS_TOL);
  return {
    pc: Math.min(1, Math.max(0, res.value)),
    halfWindowS: half,
    windowCapped: wanted > cap,
    converged: res.converged,
    evaluations: count(),
  };
}
