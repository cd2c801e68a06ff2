/**
 * Which owner ephemeris (OEM) a screening run uses for each primary (DESIGN.md "Owner
 * ephemerides"): the newest by CREATION_DATE whose usable windows cover the whole screening
 * window, in place of the element set. An ephemeris is never extrapolated:
 * - an ephemeris that covers part of the window but no ephemeris that covers all of it is an
 *   error naming the file and the first stretch it does not cover;
 * - ephemerides wholly outside the window (last month's, next week's) are not about this
 *   window: the element set is used, and the choice says why (a note), so the run can say it.
 * Screening looks past the window's end by MODEL_MARGIN_MS (1 h: its filter model and validity
 * probe, core/screening/validity.ts), so "covers" means [start, end + 1 h]; the message says so
 * when only that margin is missing.
 */
export const EPHEMERIS_END_MARGIN_MS = MODEL_MARGIN_MS;
import { KeepclearError } from '../core/errors.js';
import { MODEL_MARGIN_MS } from '../core/screening/engine.js';
import { coverageGap, describeCoverageGap, EphemerisTrajectory } from '../core/propagation/ephemeris.js';
import { toIso, type Instant } from '../core/time/instant.js';
import { listEphemerides, loadEphemeris, type EphemerisSummary, type KeepclearDb } from '../db/index.js';
import { describeEphemeris } from './ephemerisText.js';

export interface PrimaryEphemeris {
  readonly summary: EphemerisSummary;
  readonly trajectory: EphemerisTrajectory;
}

export interface EphemerisChoice {
  /** primaries screened from an ephemeris, by object id */
  readonly used: ReadonlyMap<string, PrimaryEphemeris>;
  /** why a primary with ephemerides is screened from its element set */
  readonly notes: readonly string[];
}


export function chooseEphemerides(db: KeepclearDb, primaries: readonly string[], start: Instant, end: Instant): EphemerisChoice {
  const used = new Map<string, PrimaryEphemeris>();
  const notes: string[] = [];
  for (const id of primaries) {
    const all = listEphemerides(db, id); // newest first
    if (all.length === 0) continue;
    const touching = all.filter((e) => e.usableStart < end && e.usableStop > start);
    let firstGap: { e: EphemerisSummary; text: string } | null = null;
    for (const e of touching) {
      const oem = loadEphemeris(db, e.id);
      if (!oem) continue;
      const trajectory = new EphemerisTrajectory(oem, id);
      const gap = coverageGap(trajectory, start, (end + EPHEMERIS_END_MARGIN_MS) as Instant);
      if (!gap) {
        used.set(id, { summary: e, trajectory });
        break;
      }
      const marginOnly = gap.from >= end;
      firstGap ??= {
        e,
        text:
          describeCoverageGap(gap) +
          (marginOnly ? ` (screening needs the ephemeris up to ${EPHEMERIS_END_MARGIN_MS / 3_600_000} h past the window end, for its filter and refinement margins)` : ''),
      };
    }
    if (used.has(id)) continue;
    if (firstGap) {
      const e = firstGap.e;
      throw new KeepclearError(
        'EPHEMERIS_GAP',
        `${firstGap.text.replace(`${e.fileName}: `, '')} for primary ${id} (screening window ${toIso(start)} to ${toIso(end)}; ` +
          `usable ${toIso(e.usableStart)} to ${toIso(e.usableStop)}); an ephemeris is not extrapolated — ` +
          'import an OEM that covers the window, or screen a window inside this one',
        { file: e.fileName, line: 1 },
      );
    }
    const newest = all[0]!;
    notes.push(
      `primary ${id}: no ephemeris covers ${toIso(start)} to ${toIso(end)} (newest ${describeEphemeris(newest)} is usable ` +
        `${toIso(newest.usableStart)} to ${toIso(newest.usableStop)}); its element set is used`,
    );
  }
  return { used, notes };
}
