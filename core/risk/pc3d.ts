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
import { add, type Matrix } from '../math/linalg.js';
import { erfc } from './erf.js';
import { gaussLegendre } from './gaussLegendre.js';
import { integrateAdaptive } from './gaussKronrod.js';
import { MU_M3_S2, propagateWithStmInto, type State6 } from './twoBody.js';

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

/** Σ_p a[i][p]·b[p][j] over flat row-major 6×6 matrices, summed in p order (as linalg.multiply). */
function mul66(a: Float64Array, b: Float64Array, out: Float64Array): void {
  for (let i = 0; i < 6; i++)
    for (let j = 0; j < 6; j++) {
      let s = 0;
      for (let p = 0; p < 6; p++) s += a[6 * i + p]! * b[6 * p + j]!;
      out[6 * i + j] = s;
    }
}
/** out = a·bᵀ over flat 6×6 matrices (as multiply(a, transpose(b))). */
function mulT66(a: Float64Array, b: Float64Array, out: Float64Array): void {
  for (let i = 0; i < 6; i++)
    for (let j = 0; j < 6; j++) {
      let s = 0;
      for (let p = 0; p < 6; p++) s += a[6 * i + p]! * b[6 * j + p]!;
      out[6 * i + j] = s;
    }
}
const flat66 = (m: Matrix): Float64Array => {
  const out = new Float64Array(36);
  for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) out[6 * i + j] = m[i]![j]!;
  return out;
};

/**
 * Inflow rate Ṗc at time t (s from TCA). Written without allocation in the loop (the 3-D Pc of
 * a dense shell's slow pairs calls it ~100 times per encounter), with the same arithmetic in the
 * same order as the matrix helpers of core/math/linalg.ts, so its values are those of the plain
 * formulation.
 */
function makeRate(inp: Pc3dInput, rule: SphereRule, mu: number): { rate: (t: number) => number; count: () => number } {
  let n = 0;
  const R = inp.radiusM;
  const covP = flat66(inp.primaryCov), covS = flat66(inp.secondaryCov);
  const ps = new Float64Array(6), ss = new Float64Array(6), pPhi = new Float64Array(36), sPhi = new Float64Array(36);
  const plus = new Float64Array(6), moved = new Float64Array(6);
  const t1 = new Float64Array(36), cp = new Float64Array(36), cs = new Float64Array(36);
  const nodes = rule.w.length;
  const rate = (t: number): number => {
    n++;
    propagateWithStmInto(inp.primary, t, mu, ps, pPhi, plus, moved);
    propagateWithStmInto(inp.secondary, t, mu, ss, sPhi, plus, moved);
    const m0 = ss[0]! - ps[0]!, m1 = ss[1]! - ps[1]!, m2_ = ss[2]! - ps[2]!;
    const m3 = ss[3]! - ps[3]!, m4 = ss[4]! - ps[4]!, m5 = ss[5]! - ps[5]!;
    // Φ·C·Φᵀ of each object, then their sum (add(multiply(multiply(Φ, C), transpose(Φ)), …))
    mul66(pPhi, covP, t1);
    mulT66(t1, pPhi, cp);
    mul66(sPhi, covS, t1);
    mulT66(t1, sPhi, cs);
    const c = (i: number, j: number): number => cp[6 * i + j]! + cs[6 * i + j]!;
    // the position block, symmetrised; its inverse and determinant by cofactors
    const p = 0.5 * (c(0, 0) + c(0, 0)), q = 0.5 * (c(0, 1) + c(1, 0)), r = 0.5 * (c(0, 2) + c(2, 0));
    const s = 0.5 * (c(1, 1) + c(1, 1)), tt = 0.5 * (c(1, 2) + c(2, 1)), u_ = 0.5 * (c(2, 2) + c(2, 2));
    const c00 = s * u_ - tt * tt, c01 = r * tt - q * u_, c02 = q * tt - r * s;
    const det = p * c00 + q * c01 + r * c02;
    if (!(det > 0)) throw new KeepclearError('BAD_ARGUMENT', `3-D Pc: relative position covariance is singular (det ${det})`);
    const c11 = p * u_ - r * r, c12 = q * r - p * tt, c22 = p * s - q * q;
    const i00 = c00 / det, i01 = c01 / det, i02 = c02 / det;
    const i10 = c01 / det, i11 = c11 / det, i12 = c12 / det;
    const i20 = c02 / det, i21 = c12 / det, i22 = c22 / det;
    // pvr[i][j] = cov[3+i][j]; K = pvr·inv (conditional mean gain of v on r)
    const v00 = c(3, 0), v01 = c(3, 1), v02 = c(3, 2);
    const v10 = c(4, 0), v11 = c(4, 1), v12 = c(4, 2);
    const v20 = c(5, 0), v21 = c(5, 1), v22 = c(5, 2);
    const k00 = v00 * i00 + v01 * i10 + v02 * i20, k01 = v00 * i01 + v01 * i11 + v02 * i21, k02 = v00 * i02 + v01 * i12 + v02 * i22;
    const k10 = v10 * i00 + v11 * i10 + v12 * i20, k11 = v10 * i01 + v11 * i11 + v12 * i21, k12 = v10 * i02 + v11 * i12 + v12 * i22;
    const k20 = v20 * i00 + v21 * i10 + v22 * i20, k21 = v20 * i01 + v21 * i11 + v22 * i21, k22 = v20 * i02 + v21 * i12 + v22 * i22;
    // Γ = pvv − K·pvrᵀ
    const g00 = c(3, 3) - (k00 * v00 + k01 * v01 + k02 * v02), g01 = c(3, 4) - (k00 * v10 + k01 * v11 + k02 * v12), g02 = c(3, 5) - (k00 * v20 + k01 * v21 + k02 * v22);
    const g10 = c(4, 3) - (k10 * v00 + k11 * v01 + k12 * v02), g11 = c(4, 4) - (k10 * v10 + k11 * v11 + k12 * v12), g12 = c(4, 5) - (k10 * v20 + k11 * v21 + k12 * v22);
    const g20 = c(5, 3) - (k20 * v00 + k21 * v01 + k22 * v02), g21 = c(5, 4) - (k20 * v10 + k21 * v11 + k22 * v12), g22 = c(5, 5) - (k20 * v20 + k21 * v21 + k22 * v22);
    const norm = 1 / (TWO_PI_POW_1_5 * Math.sqrt(det));
    const vn = Math.hypot(m3, m4, m5);
    const e3 = vn > 0 ? [m3 / vn, m4 / vn, m5 / vn] : [0, 0, 1];
    const [e1, e2] = completeBasis(e3);
    const e10 = e1[0]!, e11 = e1[1]!, e12 = e1[2]!, e20 = e2[0]!, e21 = e2[1]!, e22 = e2[2]!, e30 = e3[0]!, e31 = e3[1]!, e32 = e3[2]!;
    let sum = 0;
    for (let qn = 0; qn < nodes; qn++) {
      const a = rule.x[qn]!, b = rule.y[qn]!, cz = rule.c[qn]!;
      const u0 = a * e10 + b * e20 + cz * e30;
      const u1 = a * e11 + b * e21 + cz * e31;
      const u2 = a * e12 + b * e22 + cz * e32;
      const d0 = R * u0 - m0, d1 = R * u1 - m1, d2 = R * u2 - m2_;
      const m2 =
        d0 * (i00 * d0 + i01 * d1 + i02 * d2) +
        d1 * (i10 * d0 + i11 * d1 + i12 * d2) +
        d2 * (i20 * d0 + i21 * d1 + i22 * d2);
      const dens = norm * Math.exp(-0.5 * m2);
      if (dens === 0) continue;
      // conditional velocity mean ν = μv + K·d, and w = −û·v
      const nu0 = m3 + k00 * d0 + k01 * d1 + k02 * d2;
      const nu1 = m4 + k10 * d0 + k11 * d1 + k12 * d2;
      const nu2 = m5 + k20 * d0 + k21 * d1 + k22 * d2;
      let m = 0;
      m -= u0 * nu0;
      m -= u1 * nu1;
      m -= u2 * nu2;
      let s2 = 0;
      s2 += u0 * g00 * u0; s2 += u0 * g01 * u1; s2 += u0 * g02 * u2;
      s2 += u1 * g10 * u0; s2 += u1 * g11 * u1; s2 += u1 * g12 * u2;
      s2 += u2 * g20 * u0; s2 += u2 * g21 * u1; s2 += u2 * g22 * u2;
      const sd = Math.sqrt(Math.max(s2, 0));
      const flux = sd > 0 ? m * normCdf(m / sd) + sd * INV_SQRT_2PI * Math.exp((-0.5 * m * m) / (sd * sd)) : Math.max(m, 0);
      sum += rule.w[qn]! * dens * flux;
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
