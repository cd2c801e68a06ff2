import { TIER_ORDER, TIERS } from '../risk/tiers.js';
import type { GlanceInput } from './inputs.js';
import { placeLabels } from './labelPlacement.js';
import { formatPc, INK, MUTED_INK, PLOT_CONFIG, VL_SCHEMA, WIDE_PX, type PlotSpec } from './style.js';
import { tierLabel, tierRank, tierScales } from './tierScales.js';

/** Misses below this (km) sit on the plot's floor; a log axis cannot show zero. 1 cm is far below any HBR. */
const MISS_FLOOR_KM = 1e-5;

const decadeBelow = (x: number): number => 10 ** Math.floor(Math.log10(x));
const decadeAbove = (x: number): number => 10 ** Math.ceil(Math.log10(x));

const GLANCE_HEIGHT_PX = 300;
const LEGEND = { orient: 'top', direction: 'horizontal', symbolSize: 110, labelFontSize: 12, title: null } as const;

/** Vega-Lite mark name of the event marks; tests and the renderer find the marks by it. */
export const GLANCE_EVENT_MARKS = 'events';

/**
 * The week at a glance: one mark per event at (TCA, miss distance), tier by shape AND colour.
 * Miss is on a log axis: the events that matter are the close ones, and on a linear axis the few
 * at tens of metres would be squeezed against the floor under hundreds of routine ones at 1–5 km.
 */
export function weekGlanceSpec(input: GlanceInput): PlotSpec {
  const scales = tierScales(input.events.some((e) => e.tier === null));
  const rows = [...input.events]
    .sort((a, b) => tierRank(a.tier) - tierRank(b.tier) || b.missKm - a.missKm)
    .map((e) => {
      const missText = e.missKm < 1 ? `${(e.missKm * 1000).toFixed(0)} m` : `${e.missKm.toFixed(3)} km`;
      const tier = tierLabel(e.tier);
      const pcText = formatPc(e.pc);
      return {
        id: e.id,
        pair: `${e.primary} → ${e.secondary}`,
        tca: e.tca,
        tcaText: e.tca.replace('T', ' ').replace(/\.\d+Z$/, 'Z'),
        missKm: Math.max(e.missKm, MISS_FLOOR_KM),
        missText,
        pcText,
        tier,
        rank: tierRank(e.tier),
        sizePx2: scales.sizes[scales.domain.indexOf(tier)] ?? 50,
        hover: `${e.id} ${tier}: ${e.primary} → ${e.secondary}, TCA ${e.tca}, miss ${missText}, Pc ${pcText}`,
      };
    });
  const misses = rows.map((r) => r.missKm);
  const top = Math.max(input.screeningRadiusKm ?? 0, ...misses, 1e-3);
  const bottom = misses.length ? Math.min(...misses) : top / 1000;
  const yDomain = [decadeBelow(bottom * 0.9), decadeAbove(top * 1.05)] as const;
  const t0 = Date.parse(input.windowStart), t1 = Date.parse(input.windowEnd);
  const ly0 = Math.log10(yDomain[0]), ly1 = Math.log10(yDomain[1]);
  const pxOf = (tca: string, missKm: number) => ({
    px: ((Date.parse(tca) - t0) / (t1 - t0)) * WIDE_PX,
    py: (1 - (Math.log10(missKm) - ly0) / (ly1 - ly0)) * GLANCE_HEIGHT_PX,
  });
  // Labels for the chosen events, placed clear of each other and of every mark, then mapped back
  // to data coordinates so the text rides on the same scales as the marks.
  const byId = new Map(rows.map((r) => [r.id, r]));
  const requests = (input.labelIds ?? []).flatMap((id) => {
    const r = byId.get(id);
    return r ? [{ text: id, ...pxOf(r.tca, r.missKm) }] : [];
  });
  const labels = placeLabels(requests, {
    widthPx: WIDE_PX,
    heightPx: GLANCE_HEIGHT_PX,
    marks: rows.map((r) => pxOf(r.tca, r.missKm)),
  }).map((l) => ({
    text: l.text,
    align: l.align,
    t: t0 + (l.x / WIDE_PX) * (t1 - t0),
    missKm: 10 ** (ly0 + (1 - l.y / GLANCE_HEIGHT_PX) * (ly1 - ly0)),
  }));
  const decades: number[] = [];
  for (let v = yDomain[0]!; v <= yDomain[1]! * 1.0001; v *= 10) decades.push(Number(v.toPrecision(1)));
  const counts = TIER_ORDER.map((t) => `${TIERS[t].glyph} ${input.events.filter((e) => e.tier === t).length} ${TIERS[t].label}`);
  const subtitle = input.events.length
    ? `${input.events.length} events: ${counts.join(' · ')}.${
        input.screeningRadiusKm === null ? '' : ` Dashed line: the screening sphere, ${input.screeningRadiusKm} km.`
      } Hover a mark for its event.`
    : 'No close approach in this window.';
  const x = {
    field: 'tca',
    type: 'temporal' as const,
    title: 'TCA (UTC)',
    scale: { type: 'utc' as const, domain: [Date.parse(input.windowStart), Date.parse(input.windowEnd)] },
    axis: { format: '%a %d %b', tickCount: { interval: 'day' as const, step: 1 }, labelAngle: 0, labelOverlap: false },
  };
  const y = {
    field: 'missKm',
    type: 'quantitative' as const,
    title: 'miss distance (km, log scale)',
    scale: { type: 'log' as const, domain: yDomain, nice: false },
    axis: { values: [...decades, ...(input.screeningRadiusKm === null ? [] : [input.screeningRadiusKm])], format: '~g', grid: true },
  };
  const layers: unknown[] = [
    {
      name: GLANCE_EVENT_MARKS,
      mark: { type: 'point', filled: true, stroke: INK, strokeWidth: 0.7, opacity: 1 },
      encoding: {
        x,
        y,
        // Legend above the plot, so the plot keeps the page's width.
        color: { field: 'tier', type: 'nominal', title: 'tier', scale: { domain: scales.domain, range: scales.colours }, legend: LEGEND },
        shape: { field: 'tier', type: 'nominal', title: 'tier', scale: { domain: scales.domain, range: scales.shapes }, legend: LEGEND },
        // Raw px² from the data: a size scale keyed by tier would merge into (and hide) the tier legend.
        size: { field: 'sizePx2', type: 'quantitative', scale: null },
        order: { field: 'rank', type: 'quantitative' },
        tooltip: [
          { field: 'id', title: 'event' },
          { field: 'pair', title: 'primary → secondary' },
          { field: 'tcaText', title: 'TCA (UTC)' },
          { field: 'missText', title: 'miss' },
          { field: 'pcText', title: 'Pc' },
          { field: 'tier', title: 'tier' },
        ],
        description: { field: 'hover' },
      },
    },
    {
      data: { values: labels },
      mark: { type: 'text', align: { expr: 'datum.align' }, baseline: 'middle', fontSize: 11, fontWeight: 'bold', color: INK, aria: false },
      encoding: { x: { ...x, field: 't' }, y, text: { field: 'text' } },
    },
  ];
  if (input.screeningRadiusKm !== null) {
    const r = input.screeningRadiusKm;
    layers.push({
      data: { values: [{ r, label: `screening sphere, ${r} km` }] },
      mark: { type: 'rule', color: MUTED_INK, strokeDash: [6, 4], aria: false },
      encoding: { y: { field: 'r', type: 'quantitative' } },
    });
  }
  return {
    $schema: VL_SCHEMA,
    config: PLOT_CONFIG,
    title: { text: 'The week at a glance: TCA against miss distance', subtitle },
    width: WIDE_PX,
    height: GLANCE_HEIGHT_PX,
    data: { values: rows },
    layer: layers,
    resolve: { legend: { color: 'shared', shape: 'shared' } },
  } as PlotSpec;
}
