/**
 * The trade table: for each lead time (burn time = TCA − lead) and each direction asked for,
 * the smallest verified Δv that meets the target.
 *
 * Directions: 'R', 'T', 'N' (either sign: both are solved when the linear map puts them within
 * SIGN_RECHECK_RATIO of each other, else only the cheaper one) or 'best' (bestDirection.ts).
 *
 * What the table shows for a nearly head-on encounter (the relative velocity almost along the
 * track): only the radial and cross-track displacement at TCA counts. An in-track burn's radial
 * offset is (2Δv/n)(1 − cos nt) (Clohessy & Wiltshire 1960): largest half an orbit after the
 * burn, near zero after whole orbits, when the burn mostly shifts TCA. So in-track rows dip at
 * lead times of (k + ½) orbits and climb near whole orbits, and the table says so honestly
 * instead of smoothing it away.
 */
import { KeepclearError } from '../errors.js';
import { MS_PER_S, type Instant } from '../time/instant.js';
import type { RtnAxis, Vec3 } from './burn.js';
import { bestDirection } from './bestDirection.js';
import type { BurnEvaluation } from './evaluateBurn.js';
import { burnSensitivity } from './linearMap.js';
import type { BurnCase, PlanningContext } from './planningContext.js';
import { linearSolve, solveAlong, type DirectionSolution } from './solveAlong.js';

export type DirectionChoice = RtnAxis | 'best';

/** The other sign of an axis is verified too when its linear Δv is within this factor. */
const SIGN_RECHECK_RATIO = 1.5;

export interface TradeRow {
  readonly leadTimeS: number;
  readonly burnTime: Instant;
  readonly direction: DirectionChoice;
  /** met: verified; not-reached: above maxDeltaVMs; failed: could not be computed (see note) */
  readonly status: 'met' | 'not-reached' | 'failed';
  /** |Δv| (m/s) */
  readonly deltaVMs: number | null;
  /** Δv along R, T, N (m/s) */
  readonly deltaVRtnMs: Vec3 | null;
  /** the new closest approach, found again on the manoeuvred trajectory (SGP4 + integrated difference) */
  readonly achievedMissKm: number | null;
  readonly achievedPc: number | null;
  readonly newTca: Instant | null;
  /** the linear map's (STM) estimate of |Δv|, for comparison */
  readonly linearDeltaVMs: number | null;
  readonly note?: string;
}

const AXIS_UNIT: Record<RtnAxis, Vec3> = { R: [1, 0, 0], T: [0, 1, 0], N: [0, 0, 1] };

/** The SGP4 state at the burn and the linear map from there to TCA. */
export function burnCaseAt(ctx: PlanningContext, burnTime: Instant): BurnCase {
  const state = new Float64Array(6);
  const failure = ctx.pair.primary.stateInto(burnTime, state, 0);
  if (failure)
    throw new KeepclearError('PROPAGATION_FAILED', `primary ${ctx.pair.primary.objectId} has no state at the burn time (${failure})`);
  ctx.counters.stmIntegrations++;
  const sensitivity = burnSensitivity(ctx.model, state, (ctx.original.tca - burnTime) / MS_PER_S);
  return { burnTime, stateAtBurn: state, sensitivity };
}

function rowOf(leadTimeS: number, bc: BurnCase, direction: DirectionChoice, sol: DirectionSolution, note?: string): TradeRow {
  const e = sol.evaluation;
  const met = sol.status === 'met' && sol.deltaVMs !== null;
  return {
    leadTimeS,
    burnTime: bc.burnTime,
    direction,
    status: sol.status,
    deltaVMs: met ? sol.deltaVMs : null,
    deltaVRtnMs: met ? e.dvRtnMs : null,
    achievedMissKm: met ? (e.encounter?.missKm ?? null) : null,
    achievedPc: met ? e.pc : null,
    newTca: met ? (e.encounter?.tca ?? null) : null,
    linearDeltaVMs: sol.linearDeltaVMs,
    ...(sol.status === 'not-reached' ? { note: `not met by ${Math.hypot(...e.dvRtnMs).toFixed(3)} m/s, the largest burn allowed` } : {}),
    ...(note ? { note } : {}),
  };
}

function solveAxis(ctx: PlanningContext, bc: BurnCase, axis: RtnAxis, original: BurnEvaluation): DirectionSolution {
  const u = AXIS_UNIT[axis];
  const minus: Vec3 = [-u[0], -u[1], -u[2]];
  const lp = linearSolve(ctx, bc, u), lm = linearSolve(ctx, bc, minus);
  const candidates: [Vec3, number | null][] = [];
  const better = lp === null ? lm : lm === null ? lp : Math.min(lp, lm);
  if (better === null) candidates.push([u, null], [minus, null]);
  else {
    if (lp !== null && lp <= SIGN_RECHECK_RATIO * better) candidates.push([u, lp]);
    if (lm !== null && lm <= SIGN_RECHECK_RATIO * better) candidates.push([minus, lm]);
  }
  let best: DirectionSolution | null = null;
  for (const [dir, lin] of candidates) {
    const sol = solveAlong(ctx, bc, dir, original, lin);
    if (!best || (sol.status === 'met' && (best.status !== 'met' || sol.deltaVMs! < best.deltaVMs!))) best = sol;
  }
  return best!;
}

export function tradeRowsAt(
  ctx: PlanningContext,
  leadTimeS: number,
  directions: readonly DirectionChoice[],
  original: BurnEvaluation,
): TradeRow[] {
  const burnTime = (ctx.original.tca - leadTimeS * MS_PER_S) as Instant;
  let bc: BurnCase;
  try {
    bc = burnCaseAt(ctx, burnTime);
  } catch (e) {
    if (!(e instanceof KeepclearError)) throw e;
    return directions.map((direction) => failedRow(leadTimeS, burnTime, direction, e.message));
  }
  return directions.map((direction) => {
    try {
      if (direction === 'best') {
        const b = bestDirection(ctx, bc);
        if (b) return rowOf(leadTimeS, bc, direction, solveAlong(ctx, bc, b.unit, original, b.linearDeltaVMs));
        const sol = solveAxis(ctx, bc, 'T', original);
        return rowOf(leadTimeS, bc, direction, sol, 'the linear map found no direction meeting the target; in-track tried instead');
      }
      return rowOf(leadTimeS, bc, direction, solveAxis(ctx, bc, direction, original));
    } catch (e) {
      if (!(e instanceof KeepclearError)) throw e;
      return failedRow(leadTimeS, burnTime, direction, e.message);
    }
  });
}

function failedRow(leadTimeS: number, burnTime: Instant, direction: DirectionChoice, note: string): TradeRow {
  return {
    leadTimeS, burnTime, direction, status: 'failed', deltaVMs: null, deltaVRtnMs: null, achievedMissKm: null,
    achievedPc: null, newTca: null, linearDeltaVMs: null, note,
  };
}

/** Default lead times: every quarter orbit from ¼ to 5 orbits (20 rows per direction). */
export const defaultLeadTimesS = (periodS: number): number[] => Array.from({ length: 20 }, (_, k) => ((k + 1) * periodS) / 4);
