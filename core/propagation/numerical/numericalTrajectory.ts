/**
 * A trajectory integrated numerically from one state (force model of forceModel.ts) and
 * tabulated for cheap, allocation-free evaluation (hermiteTable.ts).
 */
import { KeepclearError } from '../../errors.js';
import type { Instant } from '../../time/instant.js';
import type { FailureReason, Trajectory } from '../trajectory.js';
import type { StepControl } from './dormandPrince.js';
import { accelerationInto, heightAboveEllipsoidKm, type ForceModel } from './forceModel.js';
import { HermiteStateTable } from './hermiteTable.js';
import { integrateOnGrid, ORBIT_STEP_CONTROL } from './integrateOnGrid.js';
import { nodeSpacingS, orbitScale } from './orbitScale.js';

/** Nodes per revolution of the fastest motion: error of the table ≪ 1 mm (hermiteTable.ts). */
export const NODES_PER_REVOLUTION = 64;
/** Below this height (km) the integration stops: the object has re-entered. */
export const REENTRY_HEIGHT_KM = 80;

/** dy/dt of one state x y z vx vy vz under a force model. */
export function stateDerivative(model: ForceModel): (t: number, y: Float64Array, dy: Float64Array) => void {
  return (_t, y, dy) => {
    dy[0] = y[3]!;
    dy[1] = y[4]!;
    dy[2] = y[5]!;
    accelerationInto(model, y, 0, dy, 3);
  };
}

export interface NumericalOptions {
  readonly control?: StepControl;
  readonly nodesPerRevolution?: number;
}

/** Throws PROPAGATION_FAILED when the state at a node lies below REENTRY_HEIGHT_KM. */
export function assertAboveReentry(y: ArrayLike<number>, o: number, tS: number): void {
  const h = heightAboveEllipsoidKm(y[o]!, y[o + 1]!, y[o + 2]!);
  if (h < REENTRY_HEIGHT_KM)
    throw new KeepclearError(
      'PROPAGATION_FAILED',
      `numerical propagation reached ${h.toFixed(1)} km height ${tS.toFixed(0)} s after its start: the object re-enters`,
    );
}

export class NumericalTrajectory implements Trajectory {
  readonly span: { readonly start: Instant; readonly end: Instant };
  /** force evaluations spent building the table */
  readonly evaluations: number;

  constructor(
    readonly objectId: string,
    private readonly table: HermiteStateTable,
    evaluations = 0,
  ) {
    this.span = { start: table.startMs as Instant, end: table.endMs as Instant };
    this.evaluations = evaluations;
  }

  /** Integrates `state` (TEME, at `epoch`) forward to `end` and tabulates it. */
  static propagate(
    objectId: string,
    epoch: Instant,
    state: ArrayLike<number>,
    end: Instant,
    model: ForceModel,
    opts: NumericalOptions = {},
  ): NumericalTrajectory {
    const durationS = (end - epoch) / 1000;
    if (!(durationS > 0)) throw new KeepclearError('BAD_ARGUMENT', `numerical propagation needs end after epoch (${durationS} s)`);
    const spacing = nodeSpacingS(orbitScale(state, model.mu), opts.nodesPerRevolution ?? NODES_PER_REVOLUTION);
    const nodes = Math.max(2, Math.ceil(durationS / spacing) + 1);
    const table = new HermiteStateTable(epoch, end, nodes);
    const acc = new Float64Array(3);
    const ode = integrateOnGrid(stateDerivative(model), state, { startS: 0, durationS, nodes }, opts.control ?? ORBIT_STEP_CONTROL, (k, tS, y) => {
      assertAboveReentry(y, 0, tS);
      accelerationInto(model, y, 0, acc, 0);
      table.setNode(k, y, 0, acc, 0);
    });
    return new NumericalTrajectory(objectId, table, ode.evaluations + nodes);
  }

  stateInto(t: Instant, out: Float64Array, offset: number): FailureReason | null {
    return this.table.stateInto(t, out, offset) ? null : 'outside-ephemeris';
  }
}
