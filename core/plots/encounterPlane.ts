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
/** The same with the detail panel beside the plot. */
const SUBTITLE_CHARS_WIDE = 120;
const CONTOUR_INK = '#2E5E8C';

/** Vega-Lite mark names; tests and the renderer find the contours and the disk by them. */
export const PLANE_MARKS = { contours: 'contours', disk: 'hardbody', zoomContours: 'contours_zoom', zoomDisk: 'hardbody_zoom' } as const;

/** Side of the detail panel (px). */
export const ZOOM_SIDE_PX = 250;
/**
 * A detail panel around the primary joins the plot when, at the main scale, both the miss and
 * the hard-body disk are this small (px): the primary, its disk and the secondary then sit on top
 * of each other next to km-sized ellipses. (A tiny disk far from the secondary needs no detail:
 * its place is marked and the miss reads on the main plot.)
 */
const ZOOM_DISK_PX = 6;
const ZOOM_MISS_PX = 25;

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
  const miss = Math.hypot(mx, my);
  // Extent of what is drawn: disk at the origin, secondary, outermost contour.
  const [hx, hy] = cov ? ellipseHalfExtents(cov, Math.max(...SIGMA_LEVELS)) : [0, 0];
  const main = squareDomain([-r, r, mx - hx, mx + hx, 0, mx], [-r, r, my - hy, my + hy, 0, my], PLANE_SIDE_PX);
  const zoomNeeded = r / main.mPerPx < ZOOM_DISK_PX && miss / main.mPerPx < ZOOM_MISS_PX;
  // Detail: the disk and the secondary with room around them, still equal scales.
  const zoomHalf = 0.7 * Math.max(miss + 2 * r, 6 * r);
  const zoom = squareDomain([mx / 2 - zoomHalf, mx / 2 + zoomHalf], [my / 2 - zoomHalf, my / 2 + zoomHalf], ZOOM_SIDE_PX, 0);

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
  const tinyDisk = r / main.mPerPx < TINY_DISK_PX;
  const points = [
    { x: 0, y: 0, who: 'primary', hover: 'primary (origin)' },
    { x: mx, y: my, who: 'secondary', hover: `secondary at (${lengthText(mx)}, ${lengthText(my)}), miss ${lengthText(miss)}` },
  ];

  const panel = (d: SquareDomain, side: number, names: { contours: string; disk: string }, detail: boolean): Record<string, unknown> => {
    const x = { field: 'x', type: 'quantitative' as const, title: 'x̂ — along the miss (m)', scale: { domain: d.x, nice: false, zero: false } };
    const y = { field: 'y', type: 'quantitative' as const, title: 'ŷ = ẑ × x̂ (m)', scale: { domain: d.y, nice: false, zero: false } };
    const axisX = { ...x, axis: { format: ',~r', tickCount: detail ? 4 : 6, grid: true } };
    const axisY = { ...y, axis: { format: ',~r', tickCount: detail ? 4 : 6, grid: true } };
    // Labels point away from each other along the miss, so they never overlap.
    const away = mx >= 0 ? 1 : -1;
    const layers: unknown[] = [
      {
        name: names.disk,
        data: { values: disk },
        mark: { type: 'line', color: INK, strokeWidth: 1.2, fill: INK, fillOpacity: 0.28, interpolate: 'linear', clip: detail },
        encoding: { x: axisX, y: axisY, order: { field: 'i', type: 'quantitative' }, description: { field: 'label' } },
      },
      {
        data: { values: [{ x: 0, y: 0, x2: mx, y2: my }] },
        mark: { type: 'rule', color: MUTED_INK, strokeDash: [4, 3], strokeWidth: 1, aria: false, clip: detail },
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
      layers.unshift({
        name: names.contours,
        data: { values: contours },
        mark: { type: 'line', color: CONTOUR_INK, interpolate: 'linear', clip: detail },
        encoding: {
          x: axisX,
          y: axisY,
          detail: { field: 'k', type: 'nominal' },
          order: { field: 'i', type: 'quantitative' },
          strokeWidth: { field: 'k', type: 'ordinal', legend: null, scale: { domain: ['1σ', '2σ', '3σ'], range: [2, 1.4, 1] } },
          strokeDash: { field: 'k', type: 'nominal', legend: null, scale: { domain: ['1σ', '2σ', '3σ'], range: [[1, 0], [6, 3], [2, 3]] } },
          description: { field: 'label' },
        },
      });
      if (!detail) {
        layers.splice(1, 0, {
          data: { values: contourLabels },
          mark: { type: 'text', align: 'left', baseline: 'bottom', dx: 2, dy: -2, fontSize: 11, fontWeight: 'bold', color: CONTOUR_INK, aria: false },
          encoding: { x, y, text: { field: 'text' } },
        });
      }
    }
    return {
      title: { text: detail ? `Detail around the primary: 1 px = ${lengthText(d.mPerPx)}` : `1 px = ${lengthText(d.mPerPx)}`, fontSize: 11, fontWeight: 'normal' },
      width: side,
      height: side,
      layer: layers,
    };
  };

  const subtitle = wrapLines([
    `To scale: equal lengths on both axes${zoomNeeded ? '' : ` (1 px = ${lengthText(main.mPerPx)})`}. ẑ along the relative velocity, out of the page.`,
    cov
      ? 'Secondary relative to the primary, combined covariance at 1, 2, 3 σ.'
      : 'No covariance given: no ellipse is drawn.',
    `Hard-body disk (grey) at the primary, radius ${lengthText(r)}${tinyDisk ? ': under a pixel here, centre marked +' : ''}${zoomNeeded ? '; the detail panel on the right shows it with the secondary.' : '.'}`,
    ...(input.note ? [input.note] : []),
  ], zoomNeeded ? SUBTITLE_CHARS_WIDE : SUBTITLE_CHARS);
  const mainPanel = panel(main, PLANE_SIDE_PX, { contours: PLANE_MARKS.contours, disk: PLANE_MARKS.disk }, false);
  const top = { $schema: VL_SCHEMA, config: PLOT_CONFIG, title: { text: `Encounter plane of ${input.eventId}`, subtitle } };
  if (!zoomNeeded) return { ...top, ...mainPanel, title: top.title } as unknown as PlotSpec;
  const zoomPanel = panel(zoom, ZOOM_SIDE_PX, { contours: PLANE_MARKS.zoomContours, disk: PLANE_MARKS.zoomDisk }, true);
  return { ...top, hconcat: [mainPanel, zoomPanel], spacing: 24 } as unknown as PlotSpec;
}

interface SquareDomain {
  readonly x: [number, number];
  readonly y: [number, number];
  readonly mPerPx: number;
}

/** Equal x and y spans around the given extents (plus a margin): with a square panel, 1 m is the same length on both axes. */
function squareDomain(xs: readonly number[], ys: readonly number[], sidePx: number, margin = MARGIN): SquareDomain {
  const spanRaw = Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys), 1e-3);
  const span = spanRaw * (1 + 2 * margin);
  const cx = 0.5 * (Math.max(...xs) + Math.min(...xs));
  const cy = 0.5 * (Math.max(...ys) + Math.min(...ys));
  return { x: [cx - span / 2, cx + span / 2], y: [cy - span / 2, cy + span / 2], mPerPx: span / sidePx };
}
