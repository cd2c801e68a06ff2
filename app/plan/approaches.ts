/**
 * The re-screen's approaches, each marked new or seen before: an approach of the manoeuvred
 * primary is "before" when the event's screening run already had an event of the same pair
 * within a quarter of the shorter orbital period (a pair's distinct approaches are at least
 * about half a revolution apart — the cap of the series rule in DEVELOPERS.md), otherwise new.
 */
import type { ConjunctionEvent, Encounter } from '../../core/events/index.js';
import { toIso, type Instant } from '../../core/time/instant.js';

export interface RescreenApproach {
  readonly secondary: string;
  readonly tca: Instant;
  readonly missKm: number;
  readonly relativeSpeedKmS: number;
  readonly rtnKm: readonly [number, number, number];
  readonly pc: number | null;
  readonly tier: string | null;
  /** true: no event of the same pair near this TCA before the burn */
  readonly isNew: boolean;
  /** the matching event of the run before the burn */
  readonly before: { readonly eventId: string; readonly tca: Instant; readonly missKm: number } | null;
}

export const SAME_APPROACH_PERIOD_FRACTION = 0.25;

export function classifyApproaches(
  found: readonly Encounter[],
  primary: string,
  runEvents: readonly ConjunctionEvent[] | null,
  periodMinOf: (id: string) => number,
  assess: (e: Encounter) => { pc: number | null; tier: string | null },
): RescreenApproach[] {
  return found.map((e) => {
    const toleranceMs = SAME_APPROACH_PERIOD_FRACTION * Math.min(periodMinOf(primary), periodMinOf(e.secondary)) * 60_000;
    const match = (runEvents ?? []).find(
      (r) =>
        ((r.primary === primary && r.secondary === e.secondary) || (r.secondary === primary && r.primary === e.secondary)) &&
        Math.abs(r.tca - e.tca) <= toleranceMs,
    );
    const risk = assess(e);
    return {
      secondary: e.secondary,
      tca: e.tca,
      missKm: e.missKm,
      relativeSpeedKmS: e.relativeSpeedKmS,
      rtnKm: e.rtnKm,
      pc: risk.pc,
      tier: risk.tier,
      isNew: !match,
      before: match ? { eventId: match.id, tca: match.tca, missKm: match.missKm } : null,
    };
  });
}

export const approachToJson = (a: RescreenApproach): Record<string, unknown> => ({
  secondary: a.secondary,
  tca: toIso(a.tca),
  missKm: a.missKm,
  relativeSpeedKmS: a.relativeSpeedKmS,
  rtnKm: [...a.rtnKm],
  pc: a.pc,
  tier: a.tier,
  new: a.isNew,
  before: a.before ? { event: a.before.eventId, tca: toIso(a.before.tca), missKm: a.before.missKm } : null,
});
