/**
 * Δv against lead time for a manoeuvre plan: one line per direction tried (in-track, best
 * direction, …) over the lead times swept, and the chosen burn ringed. Lead time in orbits, so
 * the half-orbit pattern of in-track burns in a nearly head-on encounter (dips at k + ½ orbits;
 * Clohessy & Wiltshire 1960) reads directly off the axis. Rows that did not meet the target
 * are left out (there is no Δv to draw) and the subtitle says how many.
 */
import { INK, MUTED_INK, PANEL_HEIGHT_PX, PLOT_CONFIG, VL_SCHEMA, WIDE_PX, type PlotSpec } from './style.js';

export interface PlanTradeInput {
  readonly eventId: string;
  readonly periodS: number;
  readonly rows: readonly { readonly leadTimeS: number; readonly direction: string; readonly deltaVMs: number | null }[];
  readonly chosen: { readonly leadTimeS: number; readonly deltaVMs: number } | null;
}

export const PLAN_TRADE_MARKS = { lines: 'trade_lines', points: 'trade_points', chosen: 'trade_chosen' } as const;

const DIRECTION_LABEL: Record<string, string> = { R: 'radial', T: 'in-track', N: 'cross-track', best: 'best direction' };
/** Directions in ink and a blue, told apart by dash and shape too (never tier colours). */
const COLOURS = [INK, '#2E5E8C', '#8A6A2F', MUTED_INK];
const DASH = [[1, 0], [6, 3], [2, 2], [8, 2, 2, 2]];
const SHAPES = ['circle', 'square', 'triangle-up', 'diamond'];

export function planTradeSpec(input: PlanTradeInput): PlotSpec {
  const values = input.rows
    .filter((r) => r.deltaVMs !== null)
    .map((r) => {
      const orbits = r.leadTimeS / input.periodS;
      const name = DIRECTION_LABEL[r.direction] ?? r.direction;
      return { orbits, dv: r.deltaVMs!, name, hover: `${name}, ${orbits.toFixed(2)} orbits (${r.leadTimeS.toFixed(0)} s) before TCA: Δv ${r.deltaVMs!.toFixed(4)} m/s` };
    });
  const missing = input.rows.length - values.length;
  const names = [...new Set(values.map((v) => v.name))];
  const dir = (range: unknown[]) => ({ field: 'name', type: 'nominal' as const, title: 'direction', sort: names, scale: { domain: names, range: range.slice(0, Math.max(1, names.length)) } });
  const x = { field: 'orbits', type: 'quantitative' as const, title: 'lead time before TCA (orbits)', axis: { tickMinStep: 0.5 } };
  const y = { field: 'dv', type: 'quantitative' as const, title: 'Δv (m/s)', scale: { zero: true } };
  const c = input.chosen;
  return {
    $schema: VL_SCHEMA,
    config: PLOT_CONFIG,
    title: {
      text: `Δv against lead time for ${input.eventId}`,
      subtitle: [
        'Smallest verified Δv meeting the target at each lead time; the ring marks the chosen burn.',
        ...(missing > 0 ? [`${missing} row(s) did not meet the target and are not drawn.`] : []),
      ],
    },
    width: WIDE_PX,
    height: PANEL_HEIGHT_PX + 40,
    data: { values },
    layer: [
      { name: PLAN_TRADE_MARKS.lines, mark: { type: 'line', strokeWidth: 1.5, aria: false }, encoding: { x, y, color: dir(COLOURS), strokeDash: dir(DASH) } },
      {
        name: PLAN_TRADE_MARKS.points,
        mark: { type: 'point', filled: true, size: 40 },
        encoding: { x, y, color: dir(COLOURS), shape: dir(SHAPES), tooltip: { field: 'hover' }, description: { field: 'hover' } },
      },
      ...(c
        ? [{
            name: PLAN_TRADE_MARKS.chosen,
            data: { values: [{ orbits: c.leadTimeS / input.periodS, dv: c.deltaVMs, hover: `chosen burn: Δv ${c.deltaVMs.toFixed(4)} m/s, ${(c.leadTimeS / input.periodS).toFixed(2)} orbits before TCA` }] },
            mark: { type: 'point', filled: false, size: 260, strokeWidth: 2, color: INK },
            encoding: { x, y, tooltip: { field: 'hover' }, description: { field: 'hover' } },
          }]
        : []),
    ],
  } as PlotSpec;
}
