import type { RtnSingleInput, SeriesPoint } from './inputs.js';
import { hoursToTcaAxis, SOURCE_LABEL } from './seriesTrend.js';
import { INK, MUTED_INK, PANEL_HEIGHT_PX, PLOT_CONFIG, VL_SCHEMA, WIDE_PX, type PlotSpec } from './style.js';

/** Component names as the axis reads them (DESIGN.md: R = r/|r|, N = r×v/|r×v|, T = N×R). */
export const RTN_NAMES = ['R (radial)', 'T (in-track)', 'N (cross-track)'] as const;

/** Vega-Lite mark names (tests and the renderer find the marks by them). */
export const RTN_MARKS = { bars: 'rtn_bars', points: 'rtn_points' } as const;

/** Components drawn in greys and a blue, never in tier colours; dash and shape tell them apart without colour. */
const COMPONENT_COLOURS = [INK, '#2E5E8C', '#8A6A2F'];
const COMPONENT_DASH = [[1, 0], [6, 3], [2, 2]];
const COMPONENT_SHAPES = ['circle', 'square', 'triangle-up'];

const kmText = (x: number): string => `${x >= 0 ? '+' : '−'}${Math.abs(x) < 1 ? `${(Math.abs(x) * 1000).toFixed(0)} m` : `${Math.abs(x).toFixed(3)} km`}`;

/**
 * The miss of one event in the primary's RTN frame (secondary minus primary, km): one bar per
 * component from zero, with its value written at the bar's end.
 */
export function rtnSingleSpec(input: RtnSingleInput): PlotSpec {
  const rows = RTN_NAMES.map((name, i) => ({ name, km: input.rtnKm[i]!, text: kmText(input.rtnKm[i]!) }));
  const maxAbs = Math.max(1e-3, ...rows.map((r) => Math.abs(r.km)));
  const x = {
    field: 'km',
    type: 'quantitative' as const,
    title: 'secondary minus primary (km)',
    scale: { domain: [-maxAbs * 1.3, maxAbs * 1.3] },
    axis: { tickCount: 5 },
  };
  const y = { field: 'name', type: 'nominal' as const, title: null, sort: [...RTN_NAMES] };
  return {
    $schema: VL_SCHEMA,
    config: PLOT_CONFIG,
    title: { text: `Miss of ${input.eventId} in the primary's RTN frame at TCA`, subtitle: 'Secondary minus primary, km.' },
    width: 340,
    height: 110,
    data: { values: rows },
    layer: [
      { name: RTN_MARKS.bars, mark: { type: 'bar', color: '#2E5E8C', height: 18 }, encoding: { x, y, description: { field: 'text' }, tooltip: { field: 'text' } } },
      { data: { values: [{ z: 0 }] }, mark: { type: 'rule', color: INK, aria: false }, encoding: { x: { field: 'z', type: 'quantitative' } } },
      {
        mark: { type: 'text', dx: { expr: 'datum.km >= 0 ? 6 : -6' }, align: { expr: "datum.km >= 0 ? 'left' : 'right'" }, fontSize: 11, aria: false },
        encoding: { x, y, text: { field: 'text' } },
      },
    ],
  } as PlotSpec;
}

/**
 * R, T and N of the miss across a series' events against time to TCA (hours, decreasing to 0):
 * how the predicted geometry settled as TCA came near.
 */
export function rtnSeriesSpec(seriesId: string, points: readonly SeriesPoint[]): PlotSpec {
  const rows = points.flatMap((p) =>
    RTN_NAMES.map((name, i) => ({
      h: p.hoursToTca,
      name,
      km: p.rtnKm[i]!,
      id: p.eventId,
      source: SOURCE_LABEL[p.source],
      hover: `${p.eventId} (${SOURCE_LABEL[p.source]}), ${p.hoursToTca.toFixed(1)} h before TCA: ${name} ${kmText(p.rtnKm[i]!)}`,
    })),
  );
  const x = hoursToTcaAxis(points);
  const component = (range: unknown[]) => ({ field: 'name', type: 'nominal' as const, title: 'component', sort: [...RTN_NAMES], scale: { domain: [...RTN_NAMES], range } });
  const y = { field: 'km', type: 'quantitative' as const, title: 'secondary minus primary (km)' };
  return {
    $schema: VL_SCHEMA,
    config: PLOT_CONFIG,
    title: { text: `Series ${seriesId}: RTN miss components against time to TCA`, subtitle: "In the primary's RTN frame at TCA, one point per event of the series." },
    width: WIDE_PX,
    height: PANEL_HEIGHT_PX + 40,
    data: { values: rows },
    layer: [
      { data: { values: [{ z: 0 }] }, mark: { type: 'rule', color: MUTED_INK, aria: false }, encoding: { y: { field: 'z', type: 'quantitative' } } },
      {
        mark: { type: 'line', strokeWidth: 1.5, aria: false },
        encoding: { x, y, color: component(COMPONENT_COLOURS), strokeDash: component(COMPONENT_DASH), order: { field: 'h', sort: 'descending' } },
      },
      {
        name: RTN_MARKS.points,
        mark: { type: 'point', filled: true, size: 45, opacity: 1 },
        encoding: { x, y, color: component(COMPONENT_COLOURS), shape: component(COMPONENT_SHAPES), tooltip: { field: 'hover' }, description: { field: 'hover' } },
      },
    ],
  } as PlotSpec;
}
