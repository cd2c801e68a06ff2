/**
 * Integrates the unmanoeuvred and the manoeuvred copy of the primary together, both from the
 * same state at the burn (the second with Δv added), and tabulates their difference.
 *
 * Why together, as one 12-component system: both copies then take identical steps, so the
 * integrator's truncation errors (centimetres per day, smooth in the initial state) are nearly
 * the same in both and cancel in the difference, which is what the burn changes.
 */
import { KeepclearError } from '../errors.js';
import type { StepControl } from '../propagation/numerical/dormandPrince.js';
import { accelerationInto, type ForceModel } from '../propagation/numerical/forceModel.js';
import { HermiteStateTable } from '../propagation/numerical/hermiteTable.js';
import { integrateOnGrid, ORBIT_STEP_CONTROL } from '../propagation/numerical/integrateOnGrid.js';
import { assertAboveReentry, NODES_PER_REVOLUTION } from '../propagation/numerical/numericalTrajectory.js';
import { nodeSpacingS, orbitScale } from '../propagation/numerical/orbitScale.js';
import type { Instant } from '../time/instant.js';
import { applyBurn, type ImpulsiveBurn } from './burn.js';

export interface BurnDifferenceSpec {
  /** the primary's state just before the burn (TEME km, km/s) — the SGP4 state at the burn */
  readonly stateAtBurn: ArrayLike<number>;
  readonly burn: ImpulsiveBurn;
  /** tabulate from here (≥ burn time) … */
  readonly tableStart: Instant;
  /** … to here */
  readonly tableEnd: Instant;
  readonly model: ForceModel;
  /** also tabulate both copies themselves (the fully numerical trajectories) */
  readonly keepAbsolute?: boolean;
  readonly control?: StepControl;
}

export interface BurnDifference {
  /** manoeuvred minus unmanoeuvred, on [tableStart, tableEnd] */
  readonly difference: HermiteStateTable;
  readonly unmanoeuvred: HermiteStateTable | null;
  readonly manoeuvred: HermiteStateTable | null;
  readonly evaluations: number;
}

export function integrateBurnDifference(spec: BurnDifferenceSpec): BurnDifference {
  const { model, burn } = spec;
  if (!(spec.tableStart >= burn.time && spec.tableEnd > spec.tableStart))
    throw new KeepclearError(
      'BAD_ARGUMENT',
      `burn difference table must lie after the burn: burn ${burn.time}, table ${spec.tableStart}..${spec.tableEnd} (UTC ms)`,
    );
  const y0 = new Float64Array(12);
  for (let i = 0; i < 6; i++) y0[i] = spec.stateAtBurn[i]!;
  y0.set(applyBurn(spec.stateAtBurn, burn.deltaVRtnMs), 6);
  const durationS = (spec.tableEnd - burn.time) / 1000;
  const startS = (spec.tableStart - burn.time) / 1000;
  const spacing = nodeSpacingS(orbitScale(y0, model.mu), NODES_PER_REVOLUTION);
  const nodes = Math.max(2, Math.ceil((durationS - startS) / spacing) + 1);
  const difference = new HermiteStateTable(spec.tableStart, spec.tableEnd, nodes);
  const unmanoeuvred = spec.keepAbsolute ? new HermiteStateTable(spec.tableStart, spec.tableEnd, nodes) : null;
  const manoeuvred = spec.keepAbsolute ? new HermiteStateTable(spec.tableStart, spec.tableEnd, nodes) : null;
  const acc = new Float64Array(6);
  const diff = new Float64Array(6);
  const accDiff = new Float64Array(3);
  const ode = integrateOnGrid(
    pairDerivative(model),
    y0,
    { startS, durationS, nodes },
    spec.control ?? ORBIT_STEP_CONTROL,
    (k, tS, y) => {
      assertAboveReentry(y, 0, tS);
      assertAboveReentry(y, 6, tS);
      accelerationInto(model, y, 0, acc, 0);
      accelerationInto(model, y, 6, acc, 3);
      for (let i = 0; i < 6; i++) diff[i] = y[6 + i]! - y[i]!;
      for (let i = 0; i < 3; i++) accDiff[i] = acc[3 + i]! - acc[i]!;
      difference.setNode(k, diff, 0, accDiff, 0);
      unmanoeuvred?.setNode(k, y, 0, acc, 0);
      manoeuvred?.setNode(k, y, 6, acc, 3);
    },
  );
  return { difference, unmanoeuvred, manoeuvred, evaluations: 2 * (ode.evaluations + nodes) };
}

function pairDerivative(model: ForceModel): (t: number, y: Float64Array, dy: Float64Array) => void {
  return (_t, y, dy) => {
    for (let c = 0; c < 12; c += 6) {
      dy[c] = y[c + 3]!;
      dy[c + 1] = y[c + 4]!;
      dy[c + 2] = y[c + 5]!;
      accelerationInto(model, y, c, dy, c + 3);
    }
  };
}
