/**
 * Dormand–Prince 5(4) with adaptive steps and dense output (Dormand & Prince, "A family of
 * embedded Runge–Kutta formulae", J. Comput. Appl. Math. 6 (1980); dense output of order 4 as in
 * Hairer, Nørsett & Wanner, Solving Ordinary Differential Equations I, 2nd ed., §II.5–II.6, the
 * code DOPRI5 and its CONTD5).
 *
 * Why this integrator: orbits from LEO to eccentric need step control; the dense output gives
 * states at any instant inside a step at no extra force evaluation, which is what tabulating a
 * trajectory on a fixed grid needs. The 5th-order solution is propagated (local extrapolation),
 * the 4th-order one only estimates the error. The last stage is the first of the next step
 * (FSAL), so an accepted step costs six force evaluations.
 *
 * Forward integration only (t1 > t0): every use in Keepclear starts at a burn and runs forward.
 */
import { KeepclearError } from '../../errors.js';

export type Derivative = (t: number, y: Float64Array, dydt: Float64Array) => void;

export interface StepControl {
  /** relative tolerance per component */
  readonly rtol: number;
  /** absolute tolerance per component (units of the state: km and km/s here) */
  readonly atol: number;
  /** only the first `controlledDim` components enter the error norm (default: all) */
  readonly controlledDim?: number;
  /** first trial step (s); default 60 s (the controller adapts it within a few steps) */
  readonly initialStepS?: number;
  /** largest step (s) */
  readonly maxStepS?: number;
  /** guard against runaway (default 2 million steps) */
  readonly maxSteps?: number;
}

// Butcher tableau (Dormand & Prince 1980, Table 2 "RK5(4)7M").
const C2 = 1 / 5, C3 = 3 / 10, C4 = 4 / 5, C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40, A32 = 9 / 40;
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
const A71 = 35 / 384, A73 = 500 / 1113, A74 = 125 / 192, A75 = -2187 / 6784, A76 = 11 / 84;
// Error coefficients: 5th-order weights minus the embedded 4th-order ones.
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;
// Dense output coefficients (Hairer's CONTD5).
const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072;
const D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423;

/** Step-size control (Hairer et al. §II.4): safety factor and limits of growth and shrink. */
const SAFETY = 0.9;
const MAX_GROWTH = 5;
const MIN_SHRINK = 0.2;

/**
 * One integration in progress. `step()` advances by one accepted step; between steps,
 * `denseInto(t, out)` gives the solution anywhere in [tPrev, t].
 */
export class DormandPrince {
  readonly dim: number;
  t: number;
  tPrev: number;
  readonly y: Float64Array;
  private h: number;
  private readonly yPrev: Float64Array;
  private readonly k1: Float64Array;
  private readonly k2: Float64Array;
  private readonly k3: Float64Array;
  private readonly k4: Float64Array;
  private readonly k5: Float64Array;
  private readonly k6: Float64Array;
  private readonly k7: Float64Array;
  private readonly tmp: Float64Array;
  private readonly yNew: Float64Array;
  /** Hairer's rcont1..5, filled lazily after each accepted step */
  private readonly cont: Float64Array;
  private contValid = false;
  private readonly controlled: number;
  steps = 0;
  rejected = 0;
  evaluations = 0;

  constructor(
    private readonly f: Derivative,
    t0: number,
    y0: ArrayLike<number>,
    private readonly ctl: StepControl,
  ) {
    this.dim = y0.length;
    const n = this.dim;
    this.t = t0;
    this.tPrev = t0;
    this.y = Float64Array.from(y0);
    this.yPrev = Float64Array.from(y0);
    this.k1 = new Float64Array(n);
    this.k2 = new Float64Array(n);
    this.k3 = new Float64Array(n);
    this.k4 = new Float64Array(n);
    this.k5 = new Float64Array(n);
    this.k6 = new Float64Array(n);
    this.k7 = new Float64Array(n);
    this.tmp = new Float64Array(n);
    this.yNew = new Float64Array(n);
    this.cont = new Float64Array(5 * n);
    this.controlled = Math.min(n, ctl.controlledDim ?? n);
    this.h = ctl.initialStepS ?? 60;
    this.f(t0, this.y, this.k1);
    this.evaluations++;
  }

  /** Takes one accepted step, not beyond tEnd. Returns false when already at tEnd. */
  step(tEnd: number): boolean {
    const n = this.dim;
    if (this.t >= tEnd) return false;
    const maxSteps = this.ctl.maxSteps ?? 2_000_000;
    const maxH = this.ctl.maxStepS ?? Infinity;
    const { y, k1, k2, k3, k4, k5, k6, k7, tmp, yNew } = this;
    for (;;) {
      if (this.steps + this.rejected > maxSteps)
        throw new KeepclearError('PROPAGATION_FAILED', `numerical integration exceeded ${maxSteps} steps at t = ${this.t} s`);
      const proposed = Math.min(this.h, maxH);
      let h = proposed;
      // Land exactly on tEnd; avoid a sliver of a last step.
      if (this.t + 1.01 * h >= tEnd) h = tEnd - this.t;
      const t = this.t;
      for (let i = 0; i < n; i++) tmp[i] = y[i]! + h * A21 * k1[i]!;
      this.f(t + C2 * h, tmp, k2);
      for (let i = 0; i < n; i++) tmp[i] = y[i]! + h * (A31 * k1[i]! + A32 * k2[i]!);
      this.f(t + C3 * h, tmp, k3);
      for (let i = 0; i < n; i++) tmp[i] = y[i]! + h * (A41 * k1[i]! + A42 * k2[i]! + A43 * k3[i]!);
      this.f(t + C4 * h, tmp, k4);
      for (let i = 0; i < n; i++) tmp[i] = y[i]! + h * (A51 * k1[i]! + A52 * k2[i]! + A53 * k3[i]! + A54 * k4[i]!);
      this.f(t + C5 * h, tmp, k5);
      for (let i = 0; i < n; i++)
        tmp[i] = y[i]! + h * (A61 * k1[i]! + A62 * k2[i]! + A63 * k3[i]! + A64 * k4[i]! + A65 * k5[i]!);
      this.f(t + h, tmp, k6);
      for (let i = 0; i < n; i++)
        yNew[i] = y[i]! + h * (A71 * k1[i]! + A73 * k3[i]! + A74 * k4[i]! + A75 * k5[i]! + A76 * k6[i]!);
      this.f(t + h, yNew, k7);
      this.evaluations += 6;
      // Error norm: RMS of the scaled embedded error over the controlled components.
      let err = 0;
      for (let i = 0; i < this.controlled; i++) {
        const e = h * (E1 * k1[i]! + E3 * k3[i]! + E4 * k4[i]! + E5 * k5[i]! + E6 * k6[i]! + E7 * k7[i]!);
        const sc = this.ctl.atol + this.ctl.rtol * Math.max(Math.abs(y[i]!), Math.abs(yNew[i]!));
        err += (e / sc) * (e / sc);
      }
      err = Math.sqrt(err / this.controlled);
      if (!Number.isFinite(err))
        throw new KeepclearError('PROPAGATION_FAILED', `numerical integration produced a non-finite state at t = ${t} s`);
      const factor = err === 0 ? MAX_GROWTH : Math.min(MAX_GROWTH, Math.max(MIN_SHRINK, SAFETY * Math.pow(err, -0.2)));
      if (err <= 1) {
        this.yPrev.set(y);
        this.tPrev = t;
        // Dense output needs k1..k7 of this step; keep them before k1 becomes the next step's.
        this.fillDense(h);
        y.set(yNew);
        k1.set(k7);
        this.t = h === tEnd - t ? tEnd : t + h;
        // A step cut short to land on tEnd says nothing about the step size that works.
        this.h = h < proposed ? proposed : h * factor;
        this.steps++;
        return true;
      }
      this.h = h * Math.max(MIN_SHRINK, factor);
      this.rejected++;
    }
  }

  private fillDense(h: number): void {
    const n = this.dim;
    const { yPrev, yNew, k1, k3, k4, k5, k6, k7, cont } = this;
    for (let i = 0; i < n; i++) {
      const ydiff = yNew[i]! - yPrev[i]!;
      const bspl = h * k1[i]! - ydiff;
      cont[i] = yPrev[i]!;
      cont[n + i] = ydiff;
      cont[2 * n + i] = bspl;
      cont[3 * n + i] = ydiff - h * k7[i]! - bspl;
      cont[4 * n + i] = h * (D1 * k1[i]! + D3 * k3[i]! + D4 * k4[i]! + D5 * k5[i]! + D6 * k6[i]! + D7 * k7[i]!);
    }
    this.contValid = true;
  }

  /**
   * Solution at t ∈ [tPrev, t] of the last accepted step into out[offset…]; components
   * [from, from + count) only (default all). Order-4 continuous extension.
   */
  denseInto(t: number, out: Float64Array, offset = 0, from = 0, count = this.dim): void {
    if (!this.contValid) {
      for (let i = 0; i < count; i++) out[offset + i] = this.y[from + i]!;
      return;
    }
    const n = this.dim;
    const h = this.t - this.tPrev;
    const th = h === 0 ? 1 : (t - this.tPrev) / h;
    const th1 = 1 - th;
    const c = this.cont;
    for (let j = 0; j < count; j++) {
      const i = from + j;
      out[offset + j] = c[i]! + th * (c[n + i]! + th1 * (c[2 * n + i]! + th * (c[3 * n + i]! + th1 * c[4 * n + i]!)));
    }
  }
}
