/**
 * Keepclear's decision tiers. Names and colours are our own. They grade an encounter for
 * attention; they are a decision aid only (see DECISION_AID_NOTE in assess.ts).
 *
 * Default Pc thresholds are common practice: Pc ≥ 1e-4 commonly triggers mitigation planning and
 * Pc ≥ 1e-7 draws attention (NASA Conjunction Assessment Best Practices Handbook,
 * NASA/SP-20205011318, 2020).
 */
export type TierId = 'plan' | 'monitor' | 'routine';

export interface TierInfo {
  readonly id: TierId;
  readonly label: string;
  /** colour for reports and the renderer (our palette) */
  readonly colour: string;
  readonly meaning: string;
}

export const TIERS: Readonly<Record<TierId, TierInfo>> = {
  plan: { id: 'plan', label: 'Plan', colour: '#8e3b8e', meaning: 'prepare a response and consult the screening provider' },
  monitor: { id: 'monitor', label: 'Monitor', colour: '#2f72b8', meaning: 'follow updates of this conjunction' },
  routine: { id: 'routine', label: 'Routine', colour: '#7d8590', meaning: 'no action beyond routine screening' },
};

export interface TierThresholds {
  readonly pcPlan: number;
  readonly pcMonitor: number;
  /**
   * Fallback when no Pc could be computed (our choice): a miss distance this small is graded
   * "plan" / "monitor". Without Pc we cannot weigh geometry against uncertainty, so the distances
   * are generous compared with typical uncertainties of public element sets (hundreds of m).
   */
  readonly missPlanKm: number;
  readonly missMonitorKm: number;
}

export const DEFAULT_TIER_THRESHOLDS: TierThresholds = {
  pcPlan: 1e-4,
  pcMonitor: 1e-7,
  missPlanKm: 1,
  missMonitorKm: 5,
};

export function tierFor(pc: number | null, missKm: number, t: TierThresholds = DEFAULT_TIER_THRESHOLDS): TierId {
  if (pc !== null && Number.isFinite(pc)) return pc >= t.pcPlan ? 'plan' : pc >= t.pcMonitor ? 'monitor' : 'routine';
  return missKm <= t.missPlanKm ? 'plan' : missKm <= t.missMonitorKm ? 'monitor' : 'routine';
}
