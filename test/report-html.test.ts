/**
 * Reports as HTML, read through a DOM (linkedom), not with regular expressions: the plots are
 * there with their axes, one mark per event, the encounter plane is to scale (pixel extents of
 * the contours against the axes' own tick labels), the caution stands in every report, and
 * nothing is loaded from outside the file.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  eventReportModelFromDb,
  renderEventReportHtml,
  renderRunReportHtml,
  runReportModelFromDb,
  type EventReportModel,
  type PlanModel,
  type SeriesModel,
} from '../app/report/index.js';
import { renderSpecToSvg } from '../app/report/svg.js';
import { encounterPlaneSpec } from '../core/plots/index.js';
import { DECISION_AID_NOTE } from '../core/risk/assess.js';
import { TIERS, type TierId } from '../core/risk/tiers.js';
import { instantFromMs } from '../core/time/instant.js';
import { storeCdm } from '../db/index.js';
import { all, axesOf, extentPx, parseDoc, pathPoints, pxPerUnit, type Node } from './support/svgProbe.js';
import { reportFixture, WEEK_START, type Fixture } from './support/reportFixture.js';

/** Vega rounds path coordinates to 1e-3 px and tick positions to whole px; one pixel is the tolerance of "to scale". */
const PX = 1;
const N_EVENTS = 250;
const GENERATED = instantFromMs(WEEK_START + 8 * 86_400_000);

let fx: Fixture;
let runHtml: string;
let run: Node;
beforeAll(async () => {
  fx = reportFixture(N_EVENTS);
  runHtml = await renderRunReportHtml(runReportModelFromDb(fx.db, fx.runId, { generatedAt: GENERATED }));
  run = parseDoc(runHtml).document;
});
afterAll(() => fx.db.close());

const figure = (doc: Node, name: string): Node => {
  const f = doc.querySelector(`figure[data-plot="${name}"]`);
  expect(f, `figure ${name}`).not.toBeNull();
  return f!;
};
const svgOf = (fig: Node): Node => fig.querySelector('svg')!;
const tierOfFixture = (i: number): TierId => fx.events[i]!.risk!.tier as TierId;
/** Event id of a fixture event, by its secondary, from the full table. */
const idOf = (secondary: string): string =>
  all(run, 'table[data-table="all"] tbody tr').find((tr) => all(tr, 'td')[4]!.textContent === secondary)!.getAttribute('data-event')!;

/** What a self-contained page must not have: scripts, external styles, images, fonts or frames. */
function expectSelfContained(doc: Node, html: string): void {
  expect(all(doc, 'script')).toHaveLength(0);
  expect(all(doc, 'link')).toHaveLength(0);
  expect(all(doc, 'iframe, img, object, embed, video, audio')).toHaveLength(0);
  for (const el of all(doc, '[src], [href]')) {
    for (const a of ['src', 'href']) {
      const v = el.getAttribute(a);
      if (v !== null) expect(v, `${a}=${v}`).toMatch(/^#/);
    }
  }
  expect(html).not.toMatch(/url\(|@import/);
}

describe('run report', () => {
  it('states the caution, the synthetic catalogue and the run header', () => {
    expect(run.querySelector('[data-caution]')?.textContent).toContain(DECISION_AID_NOTE);
    expect(run.querySelector('.banner[data-synthetic="true"]')?.textContent).toContain('Synthetic catalogue');
    const meta = run.querySelector('dl.meta')!.textContent!;
    expect(meta).toContain(fx.runId);
    expect(meta).toContain('2026-12-07 00:00:00Z to 2026-12-14 00:00:00Z (7 days)');
    expect(meta).toContain('sphere, radius 5 km');
    expect(meta).toContain('30,000 objects');
  });

  it('is self-contained', () => expectSelfContained(run, runHtml));

  it('counts events per tier (against the fixture, counted here)', () => {
    for (const id of Object.keys(TIERS) as TierId[]) {
      const expected = fx.events.filter((_, i) => tierOfFixture(i) === id).length;
      expect(run.querySelector(`.card[data-tier="${id}"]`)?.getAttribute('data-count'), id).toBe(String(expected));
    }
    // the fixture has every tier, so the cards are not trivially zero
    expect(new Set(fx.events.map((_, i) => tierOfFixture(i))).size).toBe(3);
  });

  it('the week at a glance has both axes and one mark per event, each with a hover title', () => {
    const svg = svgOf(figure(run, 'week-glance'));
    const axes = axesOf(svg);
    const x = axes.find((a) => a.label.startsWith('X-axis'))!;
    const y = axes.find((a) => a.label.startsWith('Y-axis'))!;
    expect(x.title).toBe('TCA (UTC)');
    expect(y.title).toMatch(/miss distance \(km, log scale\)/);
    expect(x.ticks.map((t) => t.text)).toEqual(['Mon 07 Dec', 'Tue 08 Dec', 'Wed 09 Dec', 'Thu 10 Dec', 'Fri 11 Dec', 'Sat 12 Dec', 'Sun 13 Dec', 'Mon 14 Dec']);
    const marks = all(svg, 'g.events_marks > path');
    expect(marks).toHaveLength(N_EVENTS);
    const titles = new Set(marks.map((m) => m.querySelector('title')?.textContent?.split(' ')[0]));
    expect(titles.size).toBe(N_EVENTS);
    // legend: the three tiers, by name
    const legend = all(svg, 'g.role-legend text').map((t) => t.textContent);
    for (const t of Object.values(TIERS)) expect(legend).toContain(t.label);
  });

  it('tier is told by shape as well as colour: each tier draws one distinct symbol path', () => {
    const svg = svgOf(figure(run, 'week-glance'));
    const byTier = new Map<string, Set<string>>();
    for (const m of all(svg, 'g.events_marks > path')) {
      const tier = / (Plan|Monitor|Routine):/.exec(m.querySelector('title')!.textContent!)![1]!;
      // the symbol's outline without its size: the command letters of the path
      const shape = (m.getAttribute('d') ?? '').replace(/[^A-Za-z]/g, '');
      if (!byTier.has(tier)) byTier.set(tier, new Set());
      byTier.get(tier)!.add(shape);
    }
    const shapes = [...byTier.values()].map((s) => [...s]);
    expect(shapes.every((s) => s.length === 1)).toBe(true);
    expect(new Set(shapes.map((s) => s[0])).size).toBe(3);
  });

  it('miss is on a log axis: marks a factor 4 apart in miss sit log10(4) decades apart', () => {
    const svg = svgOf(figure(run, 'week-glance'));
    const y = axesOf(svg).find((a) => a.label.startsWith('Y-axis'))!;
    const at = (label: string) => y.ticks.find((t) => t.text === label)!.at;
    const pxPerDecade = at('0.1') - at('1');
    const yOf = (id: string) => {
      const m = all(svg, 'g.events_marks > path').find((p) => p.querySelector('title')!.textContent!.startsWith(`${id} `))!;
      return Number(/translate\([-\d.]+,([-\d.]+)\)/.exec(m.getAttribute('transform')!)![1]);
    };
    // fixture events 0 and 2 have misses 0.05 and 0.2 km (secondaries 20000 and 20002)
    const dy = yOf(idOf('20000')) - yOf(idOf('20002'));
    expect(Math.abs(dy - Math.log10(4) * pxPerDecade)).toBeLessThan(PX);
  });

  it('lists the events needing attention by tier then Pc, and every event', () => {
    const attention = all(run, 'table[data-table="attention"] tbody tr');
    const expected = fx.events.filter((_, i) => tierOfFixture(i) !== 'routine');
    expect(attention).toHaveLength(expected.length);
    // the Pc cell holds the value and, in a span below it, the method
    const pcs = attention.map((tr) => {
      const cell = all(tr, 'td')[9]!;
      return Number(cell.textContent!.slice(0, cell.textContent!.length - (cell.querySelector('span')?.textContent?.length ?? 0)));
    });
    expect(pcs.every(Number.isFinite)).toBe(true);
    expect(pcs[0]).toBeCloseTo(fx.events[0]!.risk!.pc!, 5);
    const tiers = attention.map((tr) => all(tr, 'td')[1]!.textContent);
    expect(tiers[0]).toContain('Plan');
    for (let i = 1; i < attention.length; i++) {
      if (tiers[i] === tiers[i - 1]) expect(pcs[i]!).toBeLessThanOrEqual(pcs[i - 1]!);
    }
    expect(all(run, 'table[data-table="all"] tbody tr')).toHaveLength(N_EVENTS);
    expect(run.querySelector('table[data-table="flagged"]')?.textContent).toContain('29999');
  });
});

describe('encounter plane to scale', () => {
  async function planeSvg(covM2: [[number, number], [number, number]] | null, missM: [number, number] = [150, 0], hardBodyRadiusM = 20): Promise<Node> {
    const svg = await renderSpecToSvg(encounterPlaneSpec({ eventId: 'E1', missM, covM2, hardBodyRadiusM }));
    return parseDoc(`<!doctype html><body>${svg}</body>`).document.querySelector('svg')!;
  }
  const contour = (svg: Node, k: number): [number, number][] => {
    const p = all(svg, 'g.contours_marks > path').find((x) => x.getAttribute('aria-label')?.startsWith(`${k}σ`));
    expect(p, `${k}σ contour`).toBeDefined();
    return pathPoints(p!.getAttribute('d')!);
  };
  const scales = (svg: Node) => {
    const axes = axesOf(svg);
    return { x: pxPerUnit(axes.find((a) => a.label.startsWith('X-axis'))!), y: pxPerUnit(axes.find((a) => a.label.startsWith('Y-axis'))!) };
  };

  it('isotropic covariance: the 1σ contour is as wide as it is high, and 2σ across at the axes\' scale', async () => {
    const sigma = 100;
    const svg = await planeSvg([[sigma ** 2, 0], [0, sigma ** 2]]);
    const s = scales(svg);
    expect(Math.abs(s.x - s.y)).toBeLessThan(1e-3);
    const e1 = extentPx(contour(svg, 1));
    expect(Math.abs(e1.width - e1.height)).toBeLessThan(PX);
    expect(Math.abs(e1.width - 2 * sigma * s.x)).toBeLessThan(PX);
    const e3 = extentPx(contour(svg, 3));
    expect(Math.abs(e3.width - 3 * e1.width)).toBeLessThan(PX);
    const axes = axesOf(svg);
    expect(axes.find((a) => a.label.startsWith('X-axis'))!.title).toContain('along the miss (m)');
    expect(axes.find((a) => a.label.startsWith('Y-axis'))!.title).toContain('ŷ = ẑ × x̂ (m)');
  });

  it('correlated covariance: contour extents are k·√Cxx and k·√Cyy (support function of the ellipse)', async () => {
    const [sa, sb, rho] = [400, 90, -0.7];
    const svg = await planeSvg([[sa * sa, rho * sa * sb], [rho * sa * sb, sb * sb]]);
    const s = scales(svg);
    for (const k of [1, 2, 3]) {
      const e = extentPx(contour(svg, k));
      expect(Math.abs(e.width - 2 * k * sa * s.x), `${k}σ width`).toBeLessThan(PX);
      expect(Math.abs(e.height - 2 * k * sb * s.y), `${k}σ height`).toBeLessThan(PX);
    }
    // the tilt: with negative correlation the contour's top point lies left of its centre
    const pts = contour(svg, 1);
    const top = pts.reduce((a, b) => (b[1] < a[1] ? b : a));
    const cx = (Math.max(...pts.map((p) => p[0])) + Math.min(...pts.map((p) => p[0]))) / 2;
    expect(top[0]).toBeLessThan(cx);
  });

  it('a detail panel joins when miss and disk vanish next to km-sized ellipses; it is to scale too', async () => {
    const svg = await planeSvg([[2000 ** 2, -0.3 * 2000 * 600], [-0.3 * 2000 * 600, 600 ** 2]], [150, 0], 10);
    const detail = svg.querySelector('g.concat_1_group');
    expect(detail, 'detail panel').not.toBeNull();
    const s = scales(detail!);
    expect(Math.abs(s.x - s.y)).toBeLessThan(1e-3);
    const disk = extentPx(pathPoints(detail!.querySelector('g.hardbody_zoom_marks > path')!.getAttribute('d')!));
    expect(Math.abs(disk.width - 20 * s.x)).toBeLessThan(PX);
    expect(Math.abs(disk.height - 20 * s.y)).toBeLessThan(PX);
    // readable there: the disk is at least 10 px across, where the main panel drew it under 6 px
    expect(disk.width).toBeGreaterThan(10);
    const main = svg.querySelector('g.concat_0_group')!;
    expect(20 * scales(main).x).toBeLessThan(12);
    // and no detail panel when the geometry reads on the main plot
    expect((await planeSvg([[100 ** 2, 0], [0, 100 ** 2]])).querySelector('g.concat_1_group')).toBeNull();
  });

  it('the hard-body disk is round with the combined radius; without covariance no contour is drawn and the subtitle says so', async () => {
    const svg = await planeSvg(null, [60, 0], 20);
    expect(all(svg, 'g.contours_marks')).toHaveLength(0);
    const s = scales(svg);
    const disk = extentPx(pathPoints(svg.querySelector('g.hardbody_marks > path')!.getAttribute('d')!));
    expect(Math.abs(disk.width - 40 * s.x)).toBeLessThan(PX);
    expect(Math.abs(disk.height - 40 * s.y)).toBeLessThan(PX);
    expect(all(svg, 'g.role-title-subtitle text').map((t) => t.textContent).join(' ')).toMatch(/no ellipse is drawn/);
  });
});

describe('event report', () => {
  const series: SeriesModel = {
    id: 'S1',
    state: 'updated: Pc grew',
    points: [
      { eventId: 'R0-5', source: 'run', hoursToTca: 150, missKm: 0.4, pc: 1e-6, rtnKm: [0.1, -0.35, 0.15] },
      { eventId: 'C1-1', source: 'cdm', hoursToTca: 96, missKm: 0.2, pc: 3e-5, rtnKm: [0.06, -0.17, 0.08] },
      { eventId: 'R1-1', source: 'run', hoursToTca: 50, missKm: 0.05, pc: 9e-4, rtnKm: [0.05, 0, 0] },
      { eventId: 'C2-1', source: 'cdm', hoursToTca: 20, missKm: 0.06, pc: null, rtnKm: [0.05, 0.02, 0.01] },
    ],
  };
  const plan: PlanModel = {
    target: { pc: 1e-6 },
    proposal: { burnTime: '2026-12-07T13:12:00.000Z', leadTimeS: 6000, direction: 'T', deltaVMs: 0.08, deltaVRtnMs: [0, 0.08, 0], achievedMissKm: 1.9, achievedPc: 2e-8, propellantKg: 0.004 },
    trade: [
      { leadTimeS: 3000, deltaVMs: 0.16, achievedMissKm: 1.9 },
      { leadTimeS: 6000, deltaVMs: 0.08, achievedMissKm: 1.9 },
      { leadTimeS: 9000, deltaVMs: 0.055, achievedMissKm: 1.9 },
    ],
    verification: { method: 'numerical propagation (two-body + J2..J4 + drag)', missKm: 1.87, pc: 3e-8 },
    newApproaches: [{ secondary: '41234', tca: '2026-12-08T02:00:00.000Z', missKm: 4.2 }],
  };
  let model: EventReportModel;
  let doc: Node;
  let html: string;
  beforeAll(async () => {
    model = eventReportModelFromDb(fx.db, idOf('20000'), { series, plan, generatedAt: GENERATED });
    html = await renderEventReportHtml(model);
    doc = parseDoc(html).document;
  });

  it('carries the caution and is self-contained', () => {
    expect(doc.querySelector('[data-caution]')?.textContent).toContain(DECISION_AID_NOTE);
    expectSelfContained(doc, html);
  });

  it('gives every number with a unit and a source, and the warnings', () => {
    const rows = all(doc, 'table[data-table="facts"] tbody tr').map((tr) => all(tr, 'td').map((td) => td.textContent ?? ''));
    expect(rows.length).toBeGreaterThan(10);
    for (const [label, value, unit, source] of rows) {
      expect(value, label).not.toBe('');
      expect(unit, label).not.toBe('');
      expect(source, label).not.toBe('');
    }
    const fact = (l: string) => rows.find((r) => r[0] === l)!;
    // the fixture's states put the secondary 50 m radially from the primary, ⟂ the relative velocity
    expect(fact('Miss in the encounter plane (x, y)')[1]).toBe('50.0, 0.0');
    expect(fact('Miss in the encounter plane (x, y)')[2]).toBe('m');
    expect(fact('Pc')[3]).toContain('2d-reference');
    expect(fact('Covariance (primary / secondary)')[1]).toBe('history(n=4) / default(LEO, age 2.0 d)');
    expect(doc.querySelector('[data-warnings]')?.textContent).toContain('hard-body radius default');
  });

  it('draws the encounter plane (without stored covariance: the subtitle says so) and the RTN miss', () => {
    const plane = svgOf(figure(doc, 'encounter-plane'));
    expect(axesOf(plane)).toHaveLength(2);
    expect(all(plane, 'g.role-title-subtitle text').map((t) => t.textContent).join(' ')).toMatch(/no ellipse/);
    const rtn = svgOf(figure(doc, 'rtn'));
    expect(all(rtn, 'g.rtn_bars_marks > path')).toHaveLength(3);
    expect(axesOf(rtn).find((a) => a.label.startsWith('X-axis'))!.title).toBe('secondary minus primary (km)');
  });

  it('with a series: the trend has a point per event in each panel (Pc only where known), runs and CDMs by shape', () => {
    const svg = svgOf(figure(doc, 'series-trend'));
    const titles = axesOf(svg).map((a) => a.title);
    expect(titles).toContain('miss (km)');
    expect(titles).toContain('Pc (log scale)');
    expect(titles.some((t) => /time to TCA \(h\)/.test(t))).toBe(true);
    const miss = all(svg, 'g.trend_miss_marks > path');
    expect(miss).toHaveLength(series.points.length);
    expect(all(svg, 'g.trend_pc_marks > path')).toHaveLength(series.points.filter((p) => p.pc !== null).length);
    const shapeOf = (p: Node) => (p.getAttribute('d') ?? '').replace(/[^A-Za-z]/g, '');
    const runShapes = new Set(miss.filter((_, i) => series.points[i]!.source === 'run').map(shapeOf));
    const cdmShapes = new Set(miss.filter((_, i) => series.points[i]!.source === 'cdm').map(shapeOf));
    expect(runShapes.size).toBe(1);
    expect(cdmShapes.size).toBe(1);
    expect([...runShapes][0]).not.toBe([...cdmShapes][0]);
    // time runs towards TCA: the oldest point (150 h) is left of the newest (20 h)
    const x = (p: Node) => Number(/translate\(([-\d.]+),/.exec(p.getAttribute('transform')!)![1]);
    expect(x(miss[0]!)).toBeLessThan(x(miss[miss.length - 1]!));
    const rtn = svgOf(figure(doc, 'rtn-series'));
    expect(all(rtn, 'g.rtn_points_marks > path')).toHaveLength(3 * series.points.length);
  });

  it('with a plan: the chosen burn, the verified result, the trade and the new approaches', () => {
    expect(all(doc, 'table[data-table="plan-burn"] tbody tr')).toHaveLength(1);
    expect(all(doc, 'table[data-table="plan-trade"] tbody tr')).toHaveLength(plan.trade.length);
    expect(all(doc, 'table[data-table="plan-new-approaches"] tbody tr')).toHaveLength(1);
    expect(doc.querySelector('[data-plan="verified"]')?.textContent).toContain('1.870 km');
  });

  it('lists the received messages linked to the event, with the originator\'s own Pc', async () => {
    const id = idOf('20001');
    storeCdm(fx.db, {
      messageId: 'MSG-0001',
      creationDate: instantFromMs(WEEK_START - 3_600_000),
      originator: 'SCREENING PROVIDER X',
      tca: instantFromMs(WEEK_START + 86_400_000),
      missDistanceM: 118.5,
      object1Id: '80002',
      object2Id: '20001',
      reportedPc: 4.2e-5,
      parsed: {},
      eventId: id,
    });
    const d = parseDoc(await renderEventReportHtml(eventReportModelFromDb(fx.db, id, { generatedAt: GENERATED }))).document;
    const rows = all(d, 'table[data-table="messages"] tbody tr').map((tr) => all(tr, 'td').map((td) => td.textContent));
    expect(rows).toEqual([['SCREENING PROVIDER X', 'MSG-0001', '2026-12-06 23:00:00Z', '2026-12-08 00:00:00Z', '118.5', '4.20e-5']]);
  });

  it('without series or plan those sections are absent', async () => {
    const bare = parseDoc(await renderEventReportHtml({ ...model, series: null, plan: null })).document;
    expect(bare.querySelector('[data-section="series"]')).toBeNull();
    expect(bare.querySelector('[data-section="plan"]')).toBeNull();
    expect(bare.querySelector('[data-caution]')?.textContent).toContain(DECISION_AID_NOTE);
  });
});
