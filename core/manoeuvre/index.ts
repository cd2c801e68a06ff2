/**
 * Manoeuvre planning: what app services call. See plan.ts for the flow and the other files for
 * the pieces (burn model, Clohessy–Wiltshire, linear map, solver, sweep, proposal, propellant,
 * manoeuvred trajectory, OPM of a burn).
 */
export { planAvoidance, SEARCH_HALF_WINDOW_PERIODS, DEFAULT_MAX_DELTA_V_MS, LINEAR_MODEL_NOTE } from './plan.js';
export type { PlanInput, PlanResult, Proposal } from './plan.js';
export type { AvoidanceTarget, PcCallback } from './target.js';
export type { DirectionChoice, TradeRow } from './leadTimeSweep.js';
export { defaultLeadTimesS } from './leadTimeSweep.js';
export { chooseProposal, DV_TIE_FRACTION, type BurnConstraints } from './proposal.js';
export type { Verification, VerifiedApproach } from './verifyProposal.js';
export { VERIFICATION_METHOD } from './verifyProposal.js';
export { ManoeuvredTrajectory } from './manoeuvredTrajectory.js';
export { applyBurn, deltaVTemeKmS, rtnRows, type ImpulsiveBurn, type RtnAxis, type Vec3 } from './burn.js';
export { cwTransition, cwImpulseResponse, cwOffsetRtnKm } from './clohessyWiltshire.js';
export { propellantKg, checkPropulsion, type SpacecraftPropulsion } from './propellant.js';
export { burnOpm, opmStateTeme, type BurnOpmInput } from './burnOpm.js';
export { sampleTrajectory, type TemeSample } from './sampleTrajectory.js';
export { closestApproachNear, type PairSpec } from './closestApproach.js';
export { dragFromBstar, dragFromSpacecraft, NO_DRAG, type DragParameter } from '../propagation/numerical/ballistic.js';
