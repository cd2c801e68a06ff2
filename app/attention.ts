/**
 * The attention signal of a scheduled screening (issue 7, "Scheduled use"): does the run hold an
 * event at or above a tier, and a small JSON flag file that says so for the job around it (a
 * mail step, a monitoring check). The file exists only while the newest run needs attention: it
 * is written when it does and removed when a later run does not, so its presence is the signal.
 */
import { rmSync, writeFileSync, renameSync } from 'node:fs';
import type { ConjunctionEvent, SeriesState } from '../core/events/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { TIER_ORDER, type TierId } from '../core/risk/tiers.js';
import { toIso, type Instant } from '../core/time/instant.js';
import type { RunRecord } from '../db/index.js';

export interface Attention {
  readonly needed: boolean;
  readonly tier: TierId;
  /** the run's events at or above the tier, most urgent tier first, then highest Pc */
  readonly events: readonly ConjunctionEvent[];
}

const rank = (tier: string | undefined): number => {
  const i = TIER_ORDER.indexOf(tier as TierId);
  return i < 0 ? TIER_ORDER.length : i;
};

/** Events at or above `tier` (plan is above monitor above routine). */
export function attentionOf(events: readonly ConjunctionEvent[], tier: TierId): Attention {
  const limit = rank(tier);
  const hits = events
    .filter((e) => e.risk !== null && rank(e.risk.tier) <= limit)
    .sort((a, b) => rank(a.risk!.tier) - rank(b.risk!.tier) || (b.risk!.pc ?? -1) - (a.risk!.pc ?? -1) || a.tca - b.tca);
  return { needed: hits.length > 0, tier, events: hits };
}

/** The flag file's JSON (it carries tiers and Pc, hence the caution). */
export function attentionJson(
  run: RunRecord,
  a: Attention,
  seriesStates: ReadonlyMap<string, SeriesState>,
  now: Instant,
): Record<string, unknown> & { attention: boolean } {
  return {
    caution: DECISION_AID_NOTE,
    attention: a.needed,
    tier: a.tier,
    runId: run.id,
    runDataAt: toIso(run.dataAt),
    writtenAt: toIso(now),
    events: a.events.map((e) => ({
      id: e.id,
      seriesId: e.seriesId ?? null,
      seriesState: (e.seriesId && seriesStates.get(e.seriesId)) ?? null,
      primary: e.primary,
      secondary: e.secondary,
      tca: toIso(e.tca),
      missKm: e.missKm,
      pc: e.risk?.pc ?? null,
      tier: e.risk?.tier ?? null,
    })),
  };
}

/**
 * Writes the flag file when attention is needed (whole or not at all: written beside and
 * renamed), removes a stale one otherwise. Returns whether the file now exists.
 */
export function updateAttentionFile(path: string, doc: Record<string, unknown> & { attention: unknown }): boolean {
  if (doc.attention !== true) {
    rmSync(path, { force: true });
    return false;
  }
  const tmp = `${path}.${process.pid}.tmp`;
  writeFileSync(tmp, `${JSON.stringify(doc, null, 2)}\n`);
  renameSync(tmp, path);
  return true;
}
