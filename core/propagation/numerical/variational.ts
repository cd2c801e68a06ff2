/**
 * The state-transition matrix Φ(t, t0) = ∂x(t)/∂x(t0) (6×6), integrated alongside the state:
 * dΦ/dt = A(t)·Φ with A = [[0, I], [G, 0]] and G = ∂a/∂r (gravityGradient.ts: two-body + J2).
 * The state itself follows the full force model, so Φ is the linearisation about the real path.
 *
 * Step control acts on the six state components only: Φ's entries mix km, s and km/s, and the
 * state's steps (≈ 400 per revolution) already resolve the orbital frequency that Φ carries.
 */
import { DormandPrince, type StepControl } from './dormandPrince.js';
import { accelerationInto, type ForceModel } from './forceModel.js';
import { gravityGradientInto } from './gravityGradient.js';
import { ORBIT_STEP_CONTROL } from './integrateOnGrid.js';

export const STM_DIM = 6 + 36;

function derivative(model: ForceModel): (t: number, y: Float64Array, dy: Float64Array) => void {
  const g = new Float64Array(9);
  return (_t, y, dy) => {
    dy[0] = y[3]!;
    dy[1] = y[4]!;
    dy[2] = y[5]!;
    accelerationInto(model, y, 0, dy, 3);
    gravityGradientInto(model, y[0]!, y[1]!, y[2]!, g);
    // Φ stored row-major at y[6 + 6i + j]. Rows 0..2 (position): dΦ_ij = Φ_(i+3)j.
    // Rows 3..5 (velocity): dΦ_(3+i)j = Σ_k G_ik Φ_kj.
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 6; j++) {
        dy[6 + 6 * i + j] = y[6 + 6 * (i + 3) + j]!;
        dy[6 + 6 * (i + 3) + j] =
          g[3 * i]! * y[6 + j]! + g[3 * i + 1]! * y[6 + 6 + j]! + g[3 * i + 2]! * y[6 + 12 + j]!;
      }
  };
}

export interface StmResult {
  /** state at the end (TEME km, km/s) */
  readonly state: Float64Array;
  /** Φ(end, start), row-major 6×6 */
  readonly stm: Float64Array;
}

/** Integrates state and Φ from `state` at t0 for `durationS` seconds (forward). */
export function propagateWithStm(
  model: ForceModel,
  state: ArrayLike<number>,
  durationS: number,
  control: StepControl = ORBIT_STEP_CONTROL,
): StmResult {
  const y0 = new Float64Array(STM_DIM);
  for (let i = 0; i < 6; i++) y0[i] = state[i]!;
  for (let i = 0; i < 6; i++) y0[6 + 7 * i] = 1;
  const ode = new DormandPrince(derivative(model), 0, y0, { ...control, controlledDim: 6 });
  if (durationS > 0) while (ode.step(durationS));
  return { state: ode.y.slice(0, 6), stm: ode.y.slice(6) };
}

