/** Plot spec builders: Vega-Lite JSON from plain inputs, shared by reports (SVG) and the renderer. */
export { weekGlanceSpec, GLANCE_EVENT_MARKS } from './weekGlance.js';
export { encounterPlaneSpec, PLANE_MARKS, PLANE_SIDE_PX, SIGMA_LEVELS, sigmaLabel } from './encounterPlane.js';
export { seriesTrendSpec, TREND_MARKS, SOURCE_LABEL } from './seriesTrend.js';
export { rtnSingleSpec, rtnSeriesSpec, RTN_MARKS, RTN_NAMES } from './rtn.js';
export { principalAxes, ellipsePolyline, circlePolyline, ellipseHalfExtents, type Cov2M2, type Point2, type PrincipalAxes } from './ellipse.js';
export { formatPc, PC_PLOT_FLOOR, PLOT_CONFIG, type PlotSpec } from './style.js';
export { NOT_ASSESSED, tierLabel } from './tierScales.js';
export type { GlanceEvent, GlanceInput, EncounterPlaneInput, SeriesPoint, SeriesSource, TrendInput, RtnSingleInput } from './inputs.js';
export { planTradeSpec, PLAN_TRADE_MARKS, type PlanTradeInput } from './planTrade.js';
