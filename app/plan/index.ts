/**
 * Manoeuvre planning as a service (CLI `plan` now, `serve` and the desktop app later):
 *
 *   planForEvent(db, eventId, { target, onProgress, signal }) → EventPlan
 *
 * EventPlan carries the typed result (core planner output, re-screen, new approaches, timings)
 * and `document`, the plan's JSON as DESIGN.md fixes it. planOemText / planOpmText make the
 * files that send the plan to a screening provider. Progress comes per phase ('trade': lead
 * times done; 'rescreen': catalogue objects done); an aborted signal stops with CANCELLED.
 */
export { planForEvent, PLAN_CAUTION, type EventPlan, type PlanProgress, type PlanPhase, type PlanRequest, type RescreenSummary } from './service.js';
export { planDocument, cheapestPerLeadTime, type PlanDocument, type PlanProposalJson, type PlanTradeJson } from './json.js';
export type { RescreenApproach } from './approaches.js';
export { planInputs, spacecraftCommand, type PlanInputs } from './inputs.js';
export { rescreenTrajectory, type RescreenInput, type RescreenOutcome } from './rescreen.js';
export { planOemText, planOpmText, OEM_STEP_S } from './files.js';
export { planSummaryToJson, planCell } from './summary.js';
