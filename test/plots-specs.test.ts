/**
 * Plot specs render without a single Vega-Lite or Vega warning (renderSpecToSvg turns any into an
 * error) across the edge cases a real week produces: no events, unassessed events, an RTN
 * ellipsoid volume, a one-point series, a series without Pc, a zero miss, a tiny hard-body disk.
 */
import { describe, expect, it } from 'vitest';
import { renderSpecToSvg } from '../app/report/svg.js';
import { encounterPlaneSpec, rtnSeriesSpec, rtnSingleSpec, seriesTrendSpec, weekGlanceSpec } from '../core/plots/index.js';
import { parseDoc, all } from './support/svgProbe.js';

const week = { windowStart: '2026-12-07T00:00:00.000Z', windowEnd: '2026-12-14T00:00:00.000Z' };
const svgDoc = async (spec: Parameters<typeof renderSpecToSvg>[0]) => parseDoc(`<body>${await renderSpecToSvg(spec)}</body>`).document;

describe('plot specs render cleanly', () => {
  it('week: no events still draws the axes and says so', async () => {
    const d = await svgDoc(weekGlanceSpec({ ...week, events: [], screeningRadiusKm: 5 }));
    expect(all(d, 'g.role-axis[aria-label]')).toHaveLength(2);
    expect(all(d, 'g.events_marks > path')).toHaveLength(0);
    expect(all(d, 'g.role-title-subtitle text').map((t) => t.textContent).join(' ')).toMatch(/No close approach/);
  });

  it('week: unassessed events get their own legend entry; an RTN ellipsoid has no radius line', async () => {
    const d = await svgDoc(
      weekGlanceSpec({
        ...week,
        screeningRadiusKm: null,
        events: [
          { id: 'R1-1', primary: '1', secondary: '2', tca: '2026-12-08T01:00:00.000Z', missKm: 0.3, pc: null, tier: null },
          { id: 'R1-2', primary: '1', secondary: '3', tca: '2026-12-09T01:00:00.000Z', missKm: 2, pc: 1e-5, tier: 'monitor' },
        ],
        labelIds: ['R1-2'],
      }),
    );
    expect(all(d, 'g.events_marks > path')).toHaveLength(2);
    expect(all(d, 'g.role-legend text').map((t) => t.textContent)).toContain('Not assessed');
    expect(all(d, 'g.role-mark text').map((t) => t.textContent)).toContain('R1-2');
  });

  it('trend: one point, and a series with no Pc at all', async () => {
    const p = { eventId: 'R1-1', source: 'run' as const, hoursToTca: 30, missKm: 0.2, pc: 1e-5, rtnKm: [0.1, 0.1, 0.1] as const };
    const one = await svgDoc(seriesTrendSpec({ seriesId: 'S1', points: [p], pcPlan: 1e-4, pcMonitor: 1e-7 }));
    expect(all(one, 'g.trend_miss_marks > path')).toHaveLength(1);
    const none = await svgDoc(seriesTrendSpec({ seriesId: 'S1', points: [{ ...p, pc: null }, { ...p, hoursToTca: 5, pc: null }], pcPlan: 1e-4, pcMonitor: 1e-7 }));
    expect(all(none, 'g.trend_pc_marks > path')).toHaveLength(0);
    await renderSpecToSvg(rtnSeriesSpec('S1', [p]));
  });

  it('plane: a zero miss and a hard-body disk under a pixel', async () => {
    await renderSpecToSvg(encounterPlaneSpec({ eventId: 'E', missM: [0, 0], covM2: [[100, 0], [0, 100]], hardBodyRadiusM: 5 }));
    const d = await svgDoc(encounterPlaneSpec({ eventId: 'E', missM: [3000, 0], covM2: [[4e6, 0], [0, 1e6]], hardBodyRadiusM: 5 }));
    expect(all(d, 'g.role-title-subtitle text').map((t) => t.textContent).join(' ')).toMatch(/under a pixel here/);
  });

  it('RTN of one event: three bars, values written with sign and unit', async () => {
    const d = await svgDoc(rtnSingleSpec({ eventId: 'E', rtnKm: [-0.012, 1.5, 0] }));
    expect(all(d, 'g.rtn_bars_marks > path')).toHaveLength(3);
    const texts = all(d, 'g.role-mark text').map((t) => t.textContent);
    expect(texts).toEqual(expect.arrayContaining(['−12 m', '+1.500 km', '+0 m']));
  });
});
