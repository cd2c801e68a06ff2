/**
 * Which row of the trade table becomes the proposal.
 *
 * Rule: among rows that meet the target, whose burn is no earlier than the earliest burn time
 * the operator can execute and whose lead time is at least the operator's minimum, the
 * smallest Δv; when several are within DV_TIE_FRACTION of that smallest Δv, the one with the
 * shortest lead time — a later burn is planned on newer tracking data and is less often
 * wasted on an event that later clears by itself (common practice).
 */
import type { Instant } from '../time/instant.js';
import type { TradeRow } from './leadTimeSweep.js';

export const DV_TIE_FRACTION = 0.02;

export interface BurnConstraints {
  /** no burn before this instant (e.g. now + command upload time) */
  readonly earliestBurn?: Instant;
  /** no burn closer to TCA than this (s) */
  readonly minLeadS?: number;
}

export function chooseProposal(rows: readonly TradeRow[], c: BurnConstraints = {}): TradeRow | null {
  const ok = rows.filter(
    (r) =>
      r.status === 'met' &&
      r.deltaVMs !== null &&
      r.leadTimeS >= (c.minLeadS ?? 0) &&
      (c.earliestBurn === undefined || r.burnTime >= c.earliestBurn),
  );
  if (ok.length === 0) return null;
  const least = Math.min(...ok.map((r) => r.deltaVMs!));
  const near = ok.filter((r) => r.deltaVMs! <= least * (1 + DV_TIE_FRACTION));
  return near.reduce((a, b) => (b.leadTimeS < a.leadTimeS ? b : a));
}
