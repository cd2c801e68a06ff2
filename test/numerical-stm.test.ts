/**
 * The state-transition matrix (core/propagation/numerical/variational.ts) against central
 * finite differences of the integrator itself: column j of Φ(t, t0) ≈ [x(t; x0 + δe_j) −
 * x(t; x0 − δe_j)] / 2δ (common practice for checking variational equations).
 *
 * Steps δ: 10 m in position, 1 cm/s in velocity. Central differences err by O(δ²·x'''/x') ≈
 * (δ/r)² ≈ 1e-12 relative; integration noise at rtol 1e-13 is ≈ 1e-9 km / δ ≈ 1e-7 relative.
 */
import { describe, expect, it } from 'vitest';
import { DormandPrince } from '../core/propagation/numerical/dormandPrince.js';
import { dragFromBstar } from '../core/propagation/numerical/ballistic.js';
import { forceModel, type ForceModel } from '../core/propagation/numerical/forceModel.js';
import { stateDerivative } from '../core/propagation/numerical/numericalTrajectory.js';
import { propagateWithStm } from '../core/propagation/numerical/variational.js';

const CONTROL = { rtol: 1e-13, atol: 1e-12 };
const STEP = [0.01, 0.01, 0.01, 1e-5, 1e-5, 1e-5];
/** J2-only model (the STM's own): 1e-7 of each column's size, the FD noise level (measured 3e-9). */
const SAME_MODEL_TOL = 1e-7;
/**
 * Full model (J3, J4, drag left out of the variational equations): J3 and J4 are ~2e-3 of J2,
 * which itself makes ~1e-3 of the gradient, and drag ~1e-6 of gravity at 500 km, so the columns
 * may differ by up to ~1e-3 of their size over a few orbits (measured 1.5e-4): 2e-3. This is the
 * accuracy of the planner's first guesses, which it then verifies.
 */
const FULL_MODEL_TOL = 2e-3;

function propagate(model: ForceModel, s0: number[], dtS: number): Float64Array {
  const ode = new DormandPrince(stateDerivative(model), 0, s0, CONTROL);
  while (ode.step(dtS));
  return ode.y;
}

function finiteDifferenceColumns(model: ForceModel, s0: number[], dtS: number): number[][] {
  return STEP.map((d, j) => {
    const plus = [...s0], minus = [...s0];
    plus[j]! += d;
    minus[j]! -= d;
    const a = propagate(model, plus, dtS), b = propagate(model, minus, dtS);
    return [0, 1, 2, 3, 4, 5].map((i) => (a[i]! - b[i]!) / (2 * d));
  });
}

const S0 = [4200, -3900, 4100, 5.9, 4.6, -1.6]; // r ≈ 7000 km, near-circular, i ≈ 64°
const ORBITS_S = [0.3 * 5830, 2.5 * 5830];

describe('state-transition matrix against finite differences', () => {
  for (const [label, model, tol] of [
    ['two-body + J2 (the STM\'s own model)', forceModel({ zonalDegree: 2 }), SAME_MODEL_TOL],
    ['full model (J2..J4 + drag)', forceModel({ drag: dragFromBstar(3e-4) }), FULL_MODEL_TOL],
  ] as const)
    for (const dt of ORBITS_S)
      it(`${label}, ${(dt / 5830).toFixed(1)} orbits`, () => {
        const { stm } = propagateWithStm(model, S0, dt, CONTROL);
        const fd = finiteDifferenceColumns(model, S0, dt);
        for (let j = 0; j < 6; j++) {
          // Compare position and velocity rows on their own scales.
          for (const rows of [[0, 1, 2], [3, 4, 5]]) {
            const size = Math.hypot(...rows.map((i) => fd[j]![i]!));
            const err = Math.hypot(...rows.map((i) => stm[6 * i + j]! - fd[j]![i]!));
            expect(err / size).toBeLessThan(tol);
          }
        }
      });
});
