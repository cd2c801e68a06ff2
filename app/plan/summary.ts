/** What event lists show of an event's newest plan (events --json, the terminal, serve). */
import { toIso } from '../../core/time/instant.js';
import type { PlanSummary } from '../../db/index.js';

export function planSummaryToJson(s: PlanSummary): Record<string, unknown> {
  return {
    id: s.id,
    createdAt: toIso(s.createdAt),
    status: s.status,
    target: s.target.kind === 'miss' ? { missKm: s.target.missKm } : { pc: s.target.pc },
    burnTime: s.burnTime === null ? null : toIso(s.burnTime),
    leadTimeS: s.leadTimeS,
    direction: s.direction,
    deltaVMs: s.deltaVMs,
    achievedMissKm: s.achievedMissKm,
    achievedPc: s.achievedPc,
    propellantKg: s.propellantKg,
    newApproaches: s.newApproaches,
  };
}

/** One short cell: "0.1298 m/s → 1.001 km", or the status when no burn was proposed. */
export function planCell(s: PlanSummary | undefined): string {
  if (!s) return '';
  if (s.status !== 'planned' || s.deltaVMs === null) return s.status;
  return `${s.deltaVMs.toFixed(4)} m/s → ${s.achievedMissKm === null ? '?' : s.achievedMissKm.toFixed(3)} km`;
}
