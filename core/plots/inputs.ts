import type { TierId } from '../risk/tiers.js';
import type { Cov2M2, Point2 } from './ellipse.js';

/**
 * Plain inputs of the plot spec builders: numbers with units in their names, ISO strings for
 * times, no database or screening types. The report model and the renderer both fill them.
 */

/** One event on the week-at-a-glance plot. */
export interface GlanceEvent {
  readonly id: string;
  readonly primary: string;
  readonly secondary: string;
  /** ISO 8601 UTC */
  readonly tca: string;
  readonly missKm: number;
  readonly pc: number | null;
  /** null: not assessed */
  readonly tier: TierId | null;
}

export interface GlanceInput {
  readonly events: readonly GlanceEvent[];
  /** the screening window (ISO 8601 UTC), so an empty day still shows */
  readonly windowStart: string;
  readonly windowEnd: string;
  /** radius of a spherical screening volume (km), drawn as the upper limit; null for an RTN ellipsoid */
  readonly screeningRadiusKm: number | null;
  /** ids to label on the plot (e.g. the Plan-tier events); at most a handful */
  readonly labelIds?: readonly string[];
}

/**
 * One event's encounter plane (m): the secondary's position relative to the primary projected
 * on the plane, x̂ along the miss, ẑ along the relative velocity, ŷ = ẑ × x̂.
 */
export interface EncounterPlaneInput {
  readonly eventId: string;
  readonly missM: Point2;
  /** combined position covariance on the plane (m²); null when none is known */
  readonly covM2: Cov2M2 | null;
  readonly hardBodyRadiusM: number;
  /** a line for the subtitle (e.g. why no covariance is drawn) */
  readonly note?: string | null;
}

/** Where a point of a series came from: a screening run or a received CDM. */
export type SeriesSource = 'run' | 'cdm';

export interface SeriesPoint {
  readonly eventId: string;
  readonly source: SeriesSource;
  /** TCA minus the time the data was created (run time, CDM CREATION_DATE), hours (≥ 0 before TCA) */
  readonly hoursToTca: number;
  readonly missKm: number;
  readonly pc: number | null;
  /** secondary minus primary in the primary's RTN frame at TCA (km) */
  readonly rtnKm: readonly [number, number, number];
}

export interface TrendInput {
  readonly seriesId: string;
  readonly points: readonly SeriesPoint[];
  /** Pc thresholds drawn as reference lines (the tiers' Plan and Monitor thresholds) */
  readonly pcPlan: number;
  readonly pcMonitor: number;
}

export interface RtnSingleInput {
  readonly eventId: string;
  readonly rtnKm: readonly [number, number, number];
}
