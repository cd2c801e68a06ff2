/** Conjunction events as a domain of their own: what screening finds, what risk adds, what is stored. */
export type { StateArray, Encounter } from './encounter.js';
export { encounterFields, encounterWith } from './encounter.js';
export type { Matrix2, Matrix3, RiskDetail, RiskAssessment } from './risk.js';
export type { ConjunctionEvent } from './event.js';
export {
  SERIES_SIGMA_COUNT, SERIES_TCA_FLOOR_S, SERIES_PERIOD_FRACTION, tcaTolerance, sightingView, pairKeyOf, orbitOfState,
  type TcaTolerance, type SightingView,
} from './seriesTolerance.js';
export {
  linkSeries, SeriesLinker, seriesIdFor, compareByData,
  type Series, type SeriesMember, type SeriesSource, type SeriesSourceKind, type SeriesUpdate,
} from './seriesLink.js';
export {
  seriesStatus, newestDataTime, SERIES_STATE_MEANING,
  type SeriesState, type SeriesStatus, type ScreeningCoverage,
} from './seriesState.js';
export {
  seriesTrend, PC_STEADY_FACTOR, PC_RATIO_FLOOR, MISS_STEADY_FRACTION,
  type SeriesTrend, type TrendPoint, type TrendChange, type PcDirection, type MissDirection,
} from './seriesTrend.js';
