/**
 * The linking service (app/series.ts) on three synthetic weekly runs (core/synthetic/demoWeeks.ts,
 * a 300-object catalogue re-issued each week with orbit-determination errors) plus the received
 * message, replayed through the import and screening services (app/demo.ts) as the demo does.
 *
 * What is checked, and against what:
 * - links and states: each designed approach ends as one series holding the weeks that should see
 *   it ("expected" in core/synthetic/demoDesigns.ts, written from the design, not from this code)
 *   and the designed final state (grows riskier → updated, with the message joined; goes away →
 *   no longer predicted by week 3's run; appears → new; seen then past → past);
 * - TCA drift inside the tolerance links (the designed beliefs move the TCA by −0.25 s and +0.12 s;
 *   τ ≥ 1 s, DEVELOPERS.md "Series"), the same pair one orbit later does not (one pair's distinct
 *   approaches are at least about half a revolution apart: common practice of conjunction
 *   screening, the quarter-period cap of core/events/seriesTolerance.ts);
 * - arrival order does not matter: the same runs and message stored in another order (the newest
 *   week first, the message last) give the same series and states (DESIGN.md "Series": events in
 *   the order their data was created, a CDM by its CREATION_DATE).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { replayDemoWeeks, type ReplayedWeek } from '../app/demo.js';
import { importFile } from '../app/import/index.js';
import { changesOfRun, linkRun, seriesView } from '../app/series.js';
import { eventReportModelFromDb, renderEventReportHtml, renderRunReportHtml, runReportModelFromDb } from '../app/report/index.js';
import { all, axesOf, parseDoc } from './support/svgProbe.js';
import { orbitOfState } from '../core/events/index.js';
import { buildDemoWeeks, type DemoApproach, type DemoWeeks } from '../core/synthetic/demoWeeks.js';
import { toIso, type Instant } from '../core/time/instant.js';
import {
  createRun, eventsOfRun, eventsOfSeries, finishRun, getEvent, listSeries, openDatabase, setRunDataAt,
  type KeepclearDb, type StoredSeries,
} from '../db/index.js';

const SIZE = 300;
/** Half-period gate around a design's TCA, s: a quarter of a ~95-minute LEO revolution. */
const GATE_S = 1400;

let dir: string;
let demo: DemoWeeks;
let db: KeepclearDb;
let weeks: ReplayedWeek[];

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-series-'));
  demo = buildDemoWeeks({ catalogSize: SIZE });
  db = openDatabase(join(dir, 'a.db'));
  weeks = await replayDemoWeeks(db, dir, demo, { workers: 0 });
}, 300_000);
afterAll(() => {
  db.close();
  rmSync(dir, { recursive: true, force: true });
});

const seriesOfApproach = (d: KeepclearDb, a: DemoApproach): StoredSeries[] =>
  listSeries(d, { objectId: a.secondary }).filter(
    (s) => [s.primary, s.secondary].sort().join() === [a.primary, a.secondary].sort().join() && Math.abs(s.tca - a.tca) / 1000 < GATE_S,
  );

describe('three weekly runs and a received message', () => {
  it('every designed approach is one series with the designed sightings and final state', () => {
    expect(demo.approaches.length).toBeGreaterThan(4);
    for (const a of demo.approaches) {
      const found = seriesOfApproach(db, a);
      const label = `${a.role} ${a.primary}/${a.secondary}`;
      if (!a.expected.includes('seen') && a.role !== 'grows-riskier') {
        expect(found, label).toEqual([]);
        continue;
      }
      expect(found, label).toHaveLength(1);
      const members = eventsOfSeries(db, found[0]!.id);
      const runsSeen = members.filter((m) => m.source.kind === 'screening').map((m) => m.source.id);
      const runsExpected = a.expected.flatMap((x, k) => (x === 'seen' ? [weeks[k]!.run.id] : []));
      expect(runsSeen, label).toEqual(runsExpected);
      expect(found[0]!.state, label).toBe(a.finalState);
    }
  });

  it('the approach that grows riskier holds the message between its runs, by CREATION_DATE, and week 3 uses its covariance', () => {
    const a = demo.approaches.find((x) => x.role === 'grows-riskier')!;
    const [s] = seriesOfApproach(db, a);
    const members = eventsOfSeries(db, s!.id);
    expect(members.map((m) => m.source.kind)).toEqual(['screening', 'cdm', 'screening']);
    const message = demo.weeks.flatMap((w) => w.messages).find((m) => m.object2 === a.secondary || m.object1 === a.secondary)!;
    expect(members[1]!.source.createdAt).toBe(message.creationDate);
    expect(members[2]!.event.risk!.covarianceSource).toBe('cdm / cdm');
    // the designed TCA drift (−0.25 s week 2, +0.12 s the message) stayed inside the series
    const tcas = members.map((m) => m.event.tca);
    expect(Math.max(...tcas) - Math.min(...tcas)).toBeGreaterThan(200);
    const view = seriesView(db, s!.id)!;
    expect(view.trend.points.map((p) => p.sourceKind)).toEqual(['screening', 'cdm', 'screening']);
    expect(view.trend.sinceFirst!.missDirection).toBe('closing');
  });

  it('the approach that goes away is "no longer predicted" by week 3, and week 3 says so', () => {
    const a = demo.approaches.find((x) => x.role === 'goes-away')!;
    const [s] = seriesOfApproach(db, a);
    expect(s!.missedByRun).toBe(weeks[2]!.run.id);
    const changes = changesOfRun(db, weeks[2]!.run.id)!.changes;
    expect(changes.find((c) => c.seriesId === s!.id)?.change).toBe('no-longer-predicted');
    const appears = seriesOfApproach(db, demo.approaches.find((x) => x.role === 'appears')!)[0]!;
    expect(changes.find((c) => c.seriesId === appears.id)?.change).toBe('new');
  });

  it('every event of a screening run has a series, and no series spans more than a quarter period', () => {
    for (const w of weeks) for (const e of eventsOfRun(db, w.run.id)) expect(e.seriesId, e.id).toBeTruthy();
    for (const s of listSeries(db)) {
      const m = eventsOfSeries(db, s.id);
      const tcas = m.map((x) => x.event.tca);
      const period = Math.min(...m.flatMap((x) => [orbitOfState(x.event.primaryState).periodS, orbitOfState(x.event.secondaryState).periodS]));
      expect((Math.max(...tcas) - Math.min(...tcas)) / 1000, s.id).toBeLessThan(period / 4);
    }
  });
});

/** A key of an event that does not depend on ids: data time, pair, TCA to the ms. */
const keyOf = (dataAt: number, p: string, s: string, tca: number): string => `${toIso(dataAt as Instant)} ${p}/${s} ${Math.round(tca)}`;

function partition(d: KeepclearDb): string[] {
  return listSeries(d)
    .map((s) => `${s.state}: ${eventsOfSeries(d, s.id).map((m) => keyOf(m.source.createdAt, m.event.primary, m.event.secondary, m.event.tca)).join(' | ')}`)
    .sort();
}

describe('reports', () => {
  it("week 3's run report says what changed, by series (DOM, not regex)", async () => {
    const html = await renderRunReportHtml(runReportModelFromDb(db, weeks[2]!.run.id));
    const doc = parseDoc(html).document;
    const section = doc.querySelector('section[data-section="changes"]')!;
    expect(section).toBeTruthy();
    const rows = all(section, 'tr[data-change]');
    const byKind = (k: string) => rows.filter((r) => r.getAttribute('data-change') === k).map((r) => r.getAttribute('data-series'));
    const changes = changesOfRun(db, weeks[2]!.run.id)!.changes;
    expect(rows).toHaveLength(changes.length);
    const away = seriesOfApproach(db, demo.approaches.find((x) => x.role === 'goes-away')!)[0]!;
    const riskier = seriesOfApproach(db, demo.approaches.find((x) => x.role === 'grows-riskier')!)[0]!;
    const appears = seriesOfApproach(db, demo.approaches.find((x) => x.role === 'appears')!)[0]!;
    expect(byKind('no-longer-predicted')).toEqual([away.id]);
    expect(byKind('updated')).toContain(riskier.id);
    expect(byKind('new')).toContain(appears.id);
    // every event of week 3 is either new or updated
    expect(byKind('new').length + byKind('updated').length).toBe(eventsOfRun(db, weeks[2]!.run.id).length);
  });

  it("an event report carries its series' trend plot with axes and the series' events in data order", async () => {
    const riskier = seriesOfApproach(db, demo.approaches.find((x) => x.role === 'grows-riskier')!)[0]!;
    const html = await renderEventReportHtml(eventReportModelFromDb(db, riskier.lastEventId));
    const doc = parseDoc(html).document;
    const section = doc.querySelector('section[data-section="series"]')!;
    expect(section.querySelector('h2')!.textContent).toContain(`Series ${riskier.id}: updated`);
    const fig = section.querySelector('figure[data-plot="series-trend"]')!;
    expect(fig).toBeTruthy();
    const titles = axesOf(fig.querySelector('svg')!).map((a) => a.title);
    expect(titles.some((t) => /time to TCA/.test(t))).toBe(true);
    const rows = all(section, 'table[data-table="series-events"] tbody tr');
    const members = eventsOfSeries(db, riskier.id);
    expect(rows.map((r) => r.querySelector('td')!.textContent!.split(' ')[0])).toEqual(members.map((m) => m.event.id));
    expect(rows[2]!.textContent).toContain('(this report)');
  });
});

describe('arrival order and the next orbit', () => {
  it('the same runs and message stored newest first, the message last, give the same series and states', () => {
    const b = openDatabase(join(dir, 'b.db'));
    try {
      for (const k of [2, 0, 1]) {
        const w = weeks[k]!;
        const id = createRun(b, w.run.settings, w.run.catalogFingerprint, w.run.objectCount);
        setRunDataAt(b, id, w.run.dataAt);
        finishRun(b, id, { status: 'done', wallMs: 1, flagged: w.run.flagged, events: eventsOfRun(db, w.run.id) });
        linkRun(b, id);
      }
      for (const w of weeks) for (const m of w.files.messages) expect(importFile(b, m).ok).toBe(true);
      expect(partition(b)).toEqual(partition(db));
      // the message still reaches week 3's event (created before week 3's run), not week 2's
      const a = demo.approaches.find((x) => x.role === 'grows-riskier')!;
      const members = eventsOfSeries(b, seriesOfApproach(b, a)[0]!.id);
      expect(members.map((m) => m.event.risk!.covarianceSource.includes('cdm'))).toEqual([false, true, true]);
    } finally {
      b.close();
    }
  });

  it('the same pair one orbit later is another series', () => {
    const a = demo.approaches.find((x) => x.role === 'appears')!;
    const [s] = seriesOfApproach(db, a);
    const e = getEvent(db, s!.lastEventId)!;
    const periodMs = orbitOfState(e.primaryState).periodS * 1000;
    const w = weeks[2]!;
    const id = createRun(db, w.run.settings, w.run.catalogFingerprint, w.run.objectCount);
    setRunDataAt(db, id, (w.run.dataAt + 3_600_000) as Instant);
    finishRun(db, id, { status: 'done', wallMs: 1, flagged: [], events: [e, { ...e, tca: (e.tca + periodMs) as Instant }] });
    linkRun(db, id);
    const [same, later] = eventsOfRun(db, id);
    expect(same!.seriesId).toBe(s!.id);
    expect(later!.seriesId).not.toBe(s!.id);
    expect(eventsOfSeries(db, later!.seriesId!)).toHaveLength(1);
  });
});
