import { TIERS } from '../risk/tiers.js';
import type { SeriesPoint, SeriesSource, TrendInput } from './inputs.js';
import { formatPc, INK, MUTED_INK, PANEL_HEIGHT_PX, PC_PLOT_FLOOR, PLOT_CONFIG, VL_SCHEMA, WIDE_PX, type PlotSpec } from './style.js';

export const SOURCE_LABEL: Readonly<Record<SeriesSource, string>> = { run: 'screening run', cdm: 'received CDM' };
/** Screening runs and received messages are told apart by shape (and by a hollow/filled mark). */
const SOURCE_SHAPES = ['circle', 'square'];

/** Vega-Lite mark names of the two panels' points. */
export const TREND_MARKS = { miss: 'trend_miss', pc: 'trend_pc' } as const;

/** The time axis shared by the series plots: hours to TCA, decreasing to 0 at the right. */
export function hoursToTcaAxis(points: readonly SeriesPoint[], title = 'time to TCA (h), decreasing to TCA at 0 →') {
  const maxH = Math.max(1, ...points.map((p) => p.hoursToTca));
  return {
    field: 'h',
    type: 'quantitative' as const,
    title,
    // Domain from the oldest point down to 0: time runs left to right towards TCA.
    scale: { domain: [Math.ceil(maxH * 1.05), 0], nice: false },
    axis: { format: ',~r' },
  };
}

const sourceEncoding = {
  field: 'source',
  type: 'nominal' as const,
  title: 'data from',
  legend: { orient: 'top' as const, direction: 'horizontal' as const },
  scale: { domain: [SOURCE_LABEL.run, SOURCE_LABEL.cdm], range: SOURCE_SHAPES },
};

/**
 * The trend of one series: miss distance (top) and Pc (bottom, log) against time to TCA, one
 * point per event of the series in the order its data was created. The tiers' Pc thresholds are
 * reference lines. Two panels share the time axis instead of one dual-axis plot, whose two
 * y-scales invite reading crossings that mean nothing.
 */
export function seriesTrendSpec(input: TrendInput): PlotSpec {
  const rows = [...input.points]
    .sort((a, b) => b.hoursToTca - a.hoursToTca)
    .map((p, order) => ({
      order,
      id: p.eventId,
      h: p.hoursToTca,
      source: SOURCE_LABEL[p.source],
      missKm: p.missKm,
      pc: p.pc === null || !Number.isFinite(p.pc) ? null : Math.max(p.pc, PC_PLOT_FLOOR),
      pcText: formatPc(p.pc),
      hover: `${p.eventId} (${SOURCE_LABEL[p.source]}), ${p.hoursToTca.toFixed(1)} h before TCA: miss ${p.missKm.toFixed(3)} km, Pc ${formatPc(p.pc)}`,
    }));
  const x = hoursToTcaAxis(input.points);
  const withPc = rows.filter((r) => r.pc !== null);
  const pcs = withPc.map((r) => r.pc!);
  const pcLow = Math.min(PC_PLOT_FLOOR, ...pcs);
  const pcHigh = Math.max(input.pcPlan * 10, ...pcs.map((p) => p * 3), 1e-3);
  const pcDomain = [10 ** Math.floor(Math.log10(pcLow)), Math.min(1, 10 ** Math.ceil(Math.log10(pcHigh)))];
  const tooltip = [
    { field: 'id', title: 'event' },
    { field: 'source', title: 'data from' },
    { field: 'h', title: 'hours to TCA', format: '.1f' },
    { field: 'missKm', title: 'miss (km)', format: '.3f' },
    { field: 'pcText', title: 'Pc' },
  ];
  const pointsMark = { type: 'point', filled: true, size: 70, color: INK, opacity: 1 };
  const missPanel = {
    height: PANEL_HEIGHT_PX,
    width: WIDE_PX,
    data: { values: rows },
    layer: [
      { mark: { type: 'line', color: MUTED_INK, strokeWidth: 1, aria: false }, encoding: { x: { ...x, axis: { ...x.axis, title: null, labels: true } }, y: { field: 'missKm', type: 'quantitative' }, order: { field: 'order' } } },
      {
        name: TREND_MARKS.miss,
        mark: pointsMark,
        encoding: {
          x,
          y: { field: 'missKm', type: 'quantitative', title: 'miss (km)', scale: { zero: true } },
          shape: sourceEncoding,
          tooltip,
          description: { field: 'hover' },
        },
      },
    ],
  };
  const thresholds = [
    { pc: input.pcPlan, label: `${TIERS.plan.glyph} Plan from ${input.pcPlan.toExponential(0)}`, colour: TIERS.plan.colour },
    { pc: input.pcMonitor, label: `${TIERS.monitor.glyph} Monitor from ${input.pcMonitor.toExponential(0)}`, colour: TIERS.monitor.colour },
  ];
  const pcY = {
    field: 'pc',
    type: 'quantitative' as const,
    title: 'Pc (log scale)',
    scale: { type: 'log' as const, domain: pcDomain, nice: false },
    axis: { format: '.0e', tickCount: 6 },
  };
  const pcPanel = {
    height: PANEL_HEIGHT_PX,
    width: WIDE_PX,
    layer: [
      {
        data: { values: thresholds },
        mark: { type: 'rule', strokeDash: [6, 4], strokeWidth: 1.5, aria: false },
        encoding: { y: { ...pcY, field: 'pc' }, color: { field: 'colour', type: 'nominal', scale: null } },
      },
      {
        data: { values: thresholds },
        // Written just right of the panel, where no point can sit under them.
        mark: { type: 'text', align: 'left', baseline: 'middle', x: WIDE_PX + 6, fontSize: 11, aria: false },
        encoding: { y: { ...pcY, field: 'pc' }, text: { field: 'label' }, color: { value: INK } },
      },
      {
        data: { values: withPc },
        mark: { type: 'line', color: MUTED_INK, strokeWidth: 1, aria: false },
        encoding: { x, y: pcY, order: { field: 'order' } },
      },
      {
        name: TREND_MARKS.pc,
        data: { values: withPc },
        mark: pointsMark,
        encoding: { x, y: pcY, shape: sourceEncoding, tooltip, description: { field: 'hover' } },
      },
    ],
  };
  const missing = rows.length - withPc.length;
  const subtitle = [
    `${rows.length} point(s), one per event of the series, oldest at the left; shape tells a screening run from a received CDM.`,
    `Pc below 1e-10 is drawn at 1e-10${missing ? `; ${missing} point(s) without Pc are left out of the Pc panel` : ''}.`,
  ];
  return {
    $schema: VL_SCHEMA,
    config: PLOT_CONFIG,
    title: { text: `Trend of series ${input.seriesId}: miss and Pc against time to TCA`, subtitle },
    vconcat: [missPanel, pcPanel],
    resolve: { scale: { x: 'shared' } },
  } as PlotSpec;
}
