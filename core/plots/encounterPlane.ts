import { circlePolyline, ellipseHalfExtents, ellipsePolyline, type Point2 } from './ellipse.js';
import type { EncounterPlaneInput } from './inputs.js';
import { INK, MUTED_INK, PLOT_CONFIG, VL_SCHEMA, wrapLines, type PlotSpec } from './style.js';

/** Side of the square plot area (px). Equal sides and equal domain spans make 1 m the same length on both axes. */
export const PLANE_SIDE_PX = 380;
/** Covariance contours drawn, in σ. */
export const SIGMA_LEVELS = [1, 2, 3] as const;
/** Margin around the drawn content, as a share of its span, so no contour touches the frame. */
const MARGIN = 0.08;
/** Below this radius (px) the hard-body disk would vanish at this scale; its place is marked instead. */
const TINY_DISK_PX = 1.5;

/** Subtitle line length (characters) that stays within the plot's width at 11 px. */
const SUBTITLE_CHARS = 76;

/** Vega-Lite mark names; tests and the renderer find the contours and the disk by them. */
export const PLANE_MARKS = { contours: 'contours', disk: 'hardbody' } as const;

/** Labels of the contour lines (each polyline's description in the SVG: "1σ covariance contour"). */
export const sigmaLabel = (k: number): string => `${k}σ covariance contour`;

/**
 * Length shown for a metre value: metres below 10 km, km above (the axes stay in metres).
 */
const lengthText = (m: number): string => (Math.abs(m) < 10_000 ? `${Number(m.toPrecision(3))} m` : `${Number((m / 1000).toPrecision(3))} km`);

/**
 * The encounter plane of one event, TO SCALE: the primary at the origin with the hard-body disk
 * (combined radius), the secondary at the miss vector with the combined covariance's 1, 2, 3 σ
 * contours around it. x̂ along the miss, ŷ = ẑ × x̂, ẑ along the relative velocity (out of the
 * page, since x̂ × ŷ = ẑ). The x and y domains have the same span and the plot is square, so a
 * circle is round; contours and disk are sampled polylines (data), not hand-drawn shapes.
 */
export function encounterPlaneSpec(input: EncounterPlaneInput): PlotSpec {
  const [mx, my] = input.missM;
  const r = input.hardBodyRadiusM;
  const cov = input.covM2;
  // Extent of what is drawn: disk at the origin, secondary, outermost contour.
  const [hx, hy] = cov ? ellipseHalfExtents(cov, Math.max(...SIGMA_LEVELS)) : [0, 0];
  const xs = [-r, r, mx - hx, mx + hx, 0, mx];
  const ys = [-r, r, my - hy, my + hy, 0, my];
  const spanRaw = Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys), 1e-3);
  const span = spanRaw * (1 + 2 * MARGIN);
  const cx = 0.5 * (Math.max(...xs) + Math.min(...xs));
  const cy = 0.5 * (Math.max(...ys) + Math.min(...ys));
  const xDomain = [cx - span / 2, cx + span / 2];
  const yDomain = [cy - span / 2, cy + span / 2];
  const mPerPx = span / PLANE_SIDE_PX;

  const contours: { k: string; i: number; x: number; y: number; label: string }[] = [];
  const contourLabels: { x: number; y: number; text: string }[] = [];
  if (cov) {
    for (const k of SIGMA_LEVELS) {
      const pts = ellipsePolyline([mx, my], cov, k);
      pts.forEach(([x, y], i) => contours.push({ k: `${k}σ`, i, x, y, label: sigmaLabel(k) }));
      // Label each contour at the parametric angle 45°: the labels then step out along a diagonal
      // and stay apart even for a flat ellipse (where the highest points would stack).
      const at = pts[Math.round(pts.length / 8)]!;
      contourLabels.push({ x: at[0], y: at[1], text: `${k}σ` });
    }
  }
  const disk = circlePolyline([0, 0], r).map(([x, y], i) => ({ i, x, y, label: `hard-body disk, radius ${lengthText(r)}` }));
  const tinyDisk = r / mPerPx < TINY_DISK_PX;

  const points = [
    { x: 0, y: 0, who: 'primary', hover: 'primary (origin)' },
    { x: mx, y: my, who: 'secondary', hover: `secondary at (${lengthText(mx)}, ${lengthText(my)}), miss ${lengthText(Math.hypot(mx, my))}` },
  ];
  // Labels point away from each other along the miss, so they never overlap.
  const away = mx >= 0 ? 1 : -1;
  const x = { field: 'x', type: 'quantitative' as const, title: 'x̂ — along the miss (m)', scale: { domain: xDomain, nice: false, zero: false } };
  const y = { field: 'y', type: 'quantitative' as const, title: 'ŷ = ẑ × x̂ (m)', scale: { domain: yDomain, nice: false, zero: false } };
  const axisX = { ...x, axis: { format: ',~r', tickCount: 6, grid: true } };
  const axisY = { ...y, axis: { format: ',~r', tickCount: 6, grid: true } };

  const subtitle = wrapLines([
    `To scale: 1 px = ${lengthText(mPerPx)} on both axes. ẑ along the relative velocity, out of the page.`,
    cov
      ? 'Secondary relative to the primary, combined covariance at 1, 2, 3 σ.'
      : 'No covariance given: no ellipse is drawn.',
    `Hard-body disk (grey) at the primary, radius ${lengthText(r)}${tinyDisk ? ': under a pixel here, centre marked +' : ''}.`,
    ...(input.note ? [input.note] : []),
  ], SUBTITLE_CHARS);

  const layers: unknown[] = [
    {
      name: PLANE_MARKS.disk,
      data: { values: disk },
      mark: { type: 'line', color: INK, strokeWidth: 1.2, fill: INK, fillOpacity: 0.28, interpolate: 'linear' },
      encoding: { x: axisX, y: axisY, order: { field: 'i', type: 'quantitative' }, description: { field: 'label' } },
    },
    {
      data: { values: [{ x: 0, y: 0, x2: mx, y2: my }] },
      mark: { type: 'rule', color: MUTED_INK, strokeDash: [4, 3], strokeWidth: 1, aria: false },
      encoding: { x, y, x2: { field: 'x2' }, y2: { field: 'y2' } },
    },
    {
      data: { values: points },
      mark: { type: 'point', filled: true, color: INK, size: 50, opacity: 1 },
      encoding: {
        x,
        y,
        shape: { field: 'who', type: 'nominal', legend: null, scale: { domain: ['primary', 'secondary'], range: ['cross', 'circle'] } },
        tooltip: { field: 'hover' },
        description: { field: 'hover' },
      },
    },
    {
      data: { values: [points[0]] },
      mark: { type: 'text', align: away > 0 ? 'right' : 'left', dx: -8 * away, dy: 14, fontSize: 11, color: INK, aria: false },
      encoding: { x, y, text: { field: 'who' } },
    },
    {
      data: { values: [points[1]] },
      mark: { type: 'text', align: away > 0 ? 'left' : 'right', dx: 8 * away, dy: 14, fontSize: 11, color: INK, aria: false },
      encoding: { x, y, text: { field: 'who' } },
    },
  ];
  if (cov) {
    layers.unshift(
      {
        name: PLANE_MARKS.contours,
        data: { values: contours },
        mark: { type: 'line', color: '#2E5E8C', interpolate: 'linear' },
        encoding: {
          x: axisX,
          y: axisY,
          detail: { field: 'k', type: 'nominal' },
          order: { field: 'i', type: 'quantitative' },
          strokeWidth: { field: 'k', type: 'ordinal', legend: null, scale: { domain: ['1σ', '2σ', '3σ'], range: [2, 1.4, 1] } },
          strokeDash: { field: 'k', type: 'nominal', legend: null, scale: { domain: ['1σ', '2σ', '3σ'], range: [[1, 0], [6, 3], [2, 3]] } },
          description: { field: 'label' },
        },
      },
      {
        data: { values: contourLabels },
        mark: { type: 'text', align: 'left', baseline: 'bottom', dx: 2, dy: -2, fontSize: 11, fontWeight: 'bold', color: '#2E5E8C', aria: false },
        encoding: { x, y, text: { field: 'text' } },
      },
    );
  }
  return {
    $schema: VL_SCHEMA,
    config: PLOT_CONFIG,
    title: { text: `Encounter plane of ${input.eventId}`, subtitle },
    width: PLANE_SIDE_PX,
    height: PLANE_SIDE_PX,
    layer: layers,
  } as PlotSpec;
}
