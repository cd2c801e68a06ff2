import type { ElementSet } from '../elements/elementSet.js';
import type { Matrix } from '../math/linalg.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import { rtnJacobian } from './frames.js';

/** Older sets needed for a sample covariance of 3 axes to mean anything. */
export const MIN_OLDER_SETS = 3;
/** Comparison points: the newest epoch and then every quarter of its orbital period, so orbit-
 * phase dependent errors (cross-track, radial) are averaged. */
export const HISTORY_SAMPLE_POINTS = 4;
/** Floor (days) of the along-track growth model, so an age near zero does not shrink the
 * along-track error to nothing: the newest set has error at its own epoch too. Our choice. */
export const GROWTH_FLOOR_DAYS = 0.5;

export interface HistoryCovariance {
  /** RTN covariance at the requested time (m²), after the growth model: the 3×3 position block */
  readonly rtnM2: Matrix;
  /**
   * The same as a 6×6 position-velocity covariance in the rotating RTN frame (m², m²/s, m²/s²):
   * velocity differences seen in the newest set's rotating frame (with the ω×r term,
   * frames.rtnJacobian). Growth scales the T position row and column only.
   */
  readonly rtn6: Matrix;
  /** mean-square RTN differences of the older sets' predictions (m²), before growth */
  readonly sampleRtnM2: Matrix;
  /** mean propagation span of the older sets to the newest epoch, days */
  readonly meanSpanDays: number;
  /** |at − newest epoch|, days */
  readonly ageDays: number;
  /** along-track scale applied: (floor + age)/(floor + meanSpan) */
  readonly alongTrackScale: number;
  readonly sets: number;
  readonly source: string;
}

/**
 * What an object's element-set history says before any growth to a time: the mean-square RTN
 * differences of the older sets' predictions (6×6, m², m²/s, m²/s²), how many sets were used and
 * their mean propagation span. Independent of the time asked for, so one object's history is
 * propagated once however many encounters it has (RiskContext caches it per object).
 */
export interface HistorySample {
  readonly sample6: Matrix;
  readonly newestEpoch: Instant;
  readonly meanSpanDays: number;
  readonly sets: number;
}

/**
 * The history statistics of covarianceFromHistory (see there); null with fewer than
 * MIN_OLDER_SETS usable older sets.
 */
export function historySample(sets: readonly ElementSet[]): HistorySample | null {
  const newest = sets[sets.length - 1];
  if (!newest) return null;
  const older = sets.filter((s) => s.epoch < newest.epoch);
  if (older.length < MIN_OLDER_SETS) return null;
  const ref = new Sgp4Trajectory(newest);
  const periodMs = MS_PER_DAY / newest.meanMotionRevPerDay;
  const times = Array.from({ length: HISTORY_SAMPLE_POINTS }, (_, k) => (newest.epoch + (k * periodMs) / HISTORY_SAMPLE_POINTS) as Instant);
  const refStates = new Float64Array(6 * times.length);
  for (let k = 0; k < times.length; k++) if (ref.stateInto(times[k]!, refStates, 6 * k)) return null;
  const acc = new Float64Array(36);
  const buf = new Float64Array(6);
  const jacobians = times.map((_, k) => {
    const o = 6 * k;
    return rtnJacobian(
      [refStates[o]!, refStates[o + 1]!, refStates[o + 2]!],
      [refStates[o + 3]!, refStates[o + 4]!, refStates[o + 5]!],
    );
  });
  let used = 0, spanSum = 0, samples = 0;
  for (const s of older) {
    const traj = new Sgp4Trajectory(s);
    const diffs: number[][] = [];
    for (let k = 0; k < times.length; k++) {
      if (traj.stateInto(times[k]!, buf, 0)) break;
      const o = 6 * k;
      const dx = [0, 1, 2, 3, 4, 5].map((i) => (buf[i]! - refStates[o + i]!) * 1000); // m, m/s
      diffs.push(jacobians[k]!.map((row) => row.reduce((a, x, i) => a + x * dx[i]!, 0)));
    }
    if (diffs.length !== times.length) continue; // propagation failed: leave this set out
    for (const d of diffs) for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) acc[6 * i + j] = acc[6 * i + j]! + d[i]! * d[j]!;
    samples += diffs.length;
    used++;
    spanSum += (newest.epoch - s.epoch) / MS_PER_DAY;
  }
  if (used < MIN_OLDER_SETS) return null;
  const sample6 = [0, 1, 2, 3, 4, 5].map((i) => [0, 1, 2, 3, 4, 5].map((j) => acc[6 * i + j]! / samples));
  return { sample6, newestEpoch: newest.epoch, meanSpanDays: spanSum / used, sets: used };
}

/** The history statistics grown to `at` (the growth model of covarianceFromHistory). */
export function growHistorySample(h: HistorySample, at: Instant): HistoryCovariance {
  const sample = h.sample6.slice(0, 3).map((row) => row.slice(0, 3));
  const meanSpan = h.meanSpanDays;
  const age = Math.abs(at - h.newestEpoch) / MS_PER_DAY;
  const g = (GROWTH_FLOOR_DAYS + age) / (GROWTH_FLOOR_DAYS + meanSpan);
  const scaleOf = [1, g, 1, 1, 1, 1];
  const grown6 = h.sample6.map((row, i) => row.map((x, j) => x * scaleOf[i]! * scaleOf[j]!));
  return {
    rtnM2: grown6.slice(0, 3).map((row) => row.slice(0, 3)),
    rtn6: grown6,
    sampleRtnM2: sample,
    meanSpanDays: meanSpan,
    ageDays: age,
    alongTrackScale: g,
    sets: h.sets,
    source: `history(n=${h.sets})`,
  };
}

/**
 * Covariance of an object from its own element-set history (ascending epochs; the last is the
 * newest). Each older set is propagated (SGP4) to the newest epoch and to points after it, and
 * its position minus the newest set's is taken in the newest set's RTN frame. The statistic is
 * the mean square about zero, not about the sample mean: an older set's bias is part of the
 * error of a prediction of that age, and it must not be removed.
 *
 * Growth to `at` (documented model, our choice): the statistics describe a prediction of age
 * meanSpan; along-track error is taken to grow linearly with age (a mean-motion error moves the
 * object along its orbit at a constant rate), so the T row and column are scaled by
 * (floor + age)/(floor + meanSpan); radial and cross-track are kept (they stay bounded to first
 * order). Returns null with fewer than MIN_OLDER_SETS usable older sets.
 */
export function covarianceFromHistory(sets: readonly ElementSet[], at: Instant): HistoryCovariance | null {
  const h = historySample(sets);
  return h ? growHistorySample(h, at) : null;
}
