/**
 * The trend of a series: one point per sighting in the order its data was created, with what the
 * report's trend plots draw (miss and Pc against time to TCA, RTN components), and the direction
 * of change as numbers (Pc factor, miss change) as well as words.
 */
import { relativeRtn } from '../screening/geometry.js';
import type { Instant } from '../time/instant.js';
import type { Series, SeriesSourceKind } from './seriesLink.js';

export interface TrendPoint {
  readonly eventId: string;
  readonly sourceKind: SeriesSourceKind;
  readonly sourceId: string;
  /** when the sighting's data was created */
  readonly createdAt: Instant;
  readonly tca: Instant;
  /** TCA minus creation time, hours (negative when the data came after the TCA) */
  readonly timeToTcaH: number;
  readonly missKm: number;
  readonly pc: number | null;
  /** the series' secondary relative to its primary, in the primary's RTN frame at TCA, km */
  readonly rtnKm: readonly [number, number, number];
  readonly relativeSpeedKmS: number;
  /** combined σ along the relative velocity (m), when the risk kept it */
  readonly sigmaAlongVelocityM: number | null;
}

export type PcDirection = 'rising' | 'falling' | 'steady' | 'unknown';
export type MissDirection = 'closing' | 'opening' | 'steady';

export interface TrendChange {
  readonly fromEventId: string;
  readonly toEventId: string;
  /** Pc(to) / Pc(from), both floored at PC_RATIO_FLOOR; null when either Pc is unknown */
  readonly pcFactor: number | null;
  /** log10 of pcFactor: readable where the factor spans hundreds of decades */
  readonly pcLog10Change: number | null;
  readonly pcDirection: PcDirection;
  /** miss(to) − miss(from), km */
  readonly missChangeKm: number;
  /** miss(to) / miss(from); null when the earlier miss is 0 */
  readonly missFactor: number | null;
  readonly missDirection: MissDirection;
  /** time between the two sightings' data, hours */
  readonly elapsedH: number;
}

export interface SeriesTrend {
  readonly points: readonly TrendPoint[];
  /** newest sighting against the one before; null with one sighting */
  readonly sincePrevious: TrendChange | null;
  /** newest sighting against the first; null with one sighting */
  readonly sinceFirst: TrendChange | null;
}

/**
 * Pc changes within a factor of 2 either way count as steady (our choice): Pc estimates move by
 * such factors with every covariance update, and decision thresholds are decades apart
 * (1e-7, 1e-4: NASA CA Best Practices Handbook, common practice).
 */
export const PC_STEADY_FACTOR = 2;
/** Smallest Pc taken as such in ratios: below it a double has no precision left (Pc can underflow to 0). */
export const PC_RATIO_FLOOR = 1e-300;
/** Miss changes within 10 % count as steady (our choice: below typical prediction noise). */
export const MISS_STEADY_FRACTION = 0.1;

const MS_PER_H = 3_600_000;

function change(a: TrendPoint, b: TrendPoint): TrendChange {
  let pcFactor: number | null = null, pcLog10Change: number | null = null;
  let pcDirection: PcDirection = 'unknown';
  if (a.pc !== null && b.pc !== null) {
    pcLog10Change = Math.log10(Math.max(b.pc, PC_RATIO_FLOOR)) - Math.log10(Math.max(a.pc, PC_RATIO_FLOOR));
    pcFactor = 10 ** pcLog10Change;
    const steady = Math.log10(PC_STEADY_FACTOR);
    pcDirection = pcLog10Change > steady ? 'rising' : pcLog10Change < -steady ? 'falling' : 'steady';
  }
  const missChangeKm = b.missKm - a.missKm;
  const missDirection: MissDirection =
    missChangeKm < -MISS_STEADY_FRACTION * a.missKm ? 'closing' : missChangeKm > MISS_STEADY_FRACTION * a.missKm ? 'opening' : 'steady';
  return {
    fromEventId: a.eventId,
    toEventId: b.eventId,
    pcFactor,
    pcLog10Change,
    pcDirection,
    missChangeKm,
    missFactor: a.missKm > 0 ? b.missKm / a.missKm : null,
    missDirection,
    elapsedH: (b.createdAt - a.createdAt) / MS_PER_H,
  };
}

export function seriesTrend(series: Series): SeriesTrend {
  const points: TrendPoint[] = series.members.map(({ event: e, source }) => {
    // A message may name the pair the other way round: RTN is always of the series' primary.
    const rtn = e.primary === series.primary ? e.rtnKm : relativeRtn(e.secondaryState, e.primaryState);
    return {
      eventId: e.id,
      sourceKind: source.kind,
      sourceId: source.id,
      createdAt: source.createdAt,
      tca: e.tca,
      timeToTcaH: (e.tca - source.createdAt) / MS_PER_H,
      missKm: e.missKm,
      pc: e.risk?.pc ?? null,
      rtnKm: [rtn[0], rtn[1], rtn[2]],
      relativeSpeedKmS: e.relativeSpeedKmS,
      sigmaAlongVelocityM: e.risk?.detail?.sigmaAlongVelocityM ?? null,
    };
  });
  const n = points.length;
  return {
    points,
    sincePrevious: n >= 2 ? change(points[n - 2]!, points[n - 1]!) : null,
    sinceFirst: n >= 2 ? change(points[0]!, points[n - 1]!) : null,
  };
}
