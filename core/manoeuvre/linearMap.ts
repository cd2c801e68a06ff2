/**
 * The linear effect at TCA of a burn: δx(TCA) = Φ(TCA, t_b) · [0; Mᵀ·Δv_RTN], with Φ the
 * numerically integrated state-transition matrix (core/propagation/numerical/variational.ts) and
 * M the RTN rows at the burn. Valid while the offsets it predicts stay small beside the orbit
 * radius (errors ∝ Δv²); the planner uses it for first guesses and for choosing a direction,
 * and verifies every answer non-linearly.
 */
import type { ForceModel } from '../propagation/numerical/forceModel.js';
import { SEARCH_STEP_CONTROL } from '../propagation/numerical/integrateOnGrid.js';
import { propagateWithStm } from '../propagation/numerical/variational.js';
import { rtnRows, type Vec3 } from './burn.js';

export interface BurnSensitivity {
  /** 6×3 row-major: δ[x y z vx vy vz] at TCA (km, km/s) per Δv_RTN in km/s */
  readonly matrix: Float64Array;
  /** the integrated (unmanoeuvred) state at TCA that Φ linearises about */
  readonly stateAtTca: Float64Array;
}

export function burnSensitivity(model: ForceModel, stateAtBurn: ArrayLike<number>, durationS: number): BurnSensitivity {
  const { state, stm } = propagateWithStm(model, stateAtBurn, durationS, SEARCH_STEP_CONTROL);
  const rows = rtnRows(stateAtBurn);
  const out = new Float64Array(18);
  for (let i = 0; i < 6; i++)
    for (let j = 0; j < 3; j++) {
      // Column j of Mᵀ is the j-th RTN unit vector in TEME.
      const u = rows[j]!;
      out[3 * i + j] = stm[6 * i + 3]! * u[0] + stm[6 * i + 4]! * u[1] + stm[6 * i + 5]! * u[2];
    }
  return { matrix: out, stateAtTca: state };
}

/** δ state at TCA (km, km/s) of an RTN Δv in m/s. */
export function linearOffset(s: BurnSensitivity, dvRtnMs: Vec3): number[] {
  const m = s.matrix, k = 1e-3;
  return Array.from({ length: 6 }, (_, i) => k * (m[3 * i]! * dvRtnMs[0] + m[3 * i + 1]! * dvRtnMs[1] + m[3 * i + 2]! * dvRtnMs[2]));
}
