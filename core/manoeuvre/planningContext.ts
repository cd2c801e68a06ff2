/**
 * What stays fixed while one event is planned (the pair, the encounter without a burn, the
 * target, the force model), and what stays fixed for one burn time (the SGP4 state at the burn
 * and the linear map to TCA). Counters record the work done, for the plan's statistics.
 */
import type { ForceModel } from '../propagation/numerical/forceModel.js';
import type { Encounter } from '../events/index.js';
import type { Instant } from '../time/instant.js';
import type { PairSpec } from './closestApproach.js';
import type { BurnSensitivity } from './linearMap.js';
import type { AvoidanceTarget, PcCallback } from './target.js';

export interface WorkCounters {
  /** burn-difference integrations (each one manoeuvred + unmanoeuvred pair) */
  integrations: number;
  /** STM integrations */
  stmIntegrations: number;
  /** Pc callback calls */
  pcCalls: number;
  /** linear predictions */
  predictions: number;
}

export interface PlanningContext {
  readonly pair: PairSpec;
  /** the encounter without a burn, found again on the trajectories */
  readonly original: Encounter;
  readonly target: AvoidanceTarget;
  readonly pcOf: PcCallback | null;
  readonly model: ForceModel;
  /** the new closest approach is searched within TCA ± this (s) */
  readonly halfWindowS: number;
  /** burns above this magnitude are not considered (m/s) */
  readonly maxDeltaVMs: number;
  readonly counters: WorkCounters;
}

export interface BurnCase {
  readonly burnTime: Instant;
  /** SGP4 (base trajectory) state just before the burn, TEME */
  readonly stateAtBurn: Float64Array;
  readonly sensitivity: BurnSensitivity;
}

export const newCounters = (): WorkCounters => ({ integrations: 0, stmIntegrations: 0, pcCalls: 0, predictions: 0 });
