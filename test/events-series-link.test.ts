/**
 * Series linking, states and trend on hand-built sightings (test/support/sightings.ts).
 * Expected links follow from the tolerance rule (core/events/seriesTolerance.ts) with numbers
 * worked out beside each case; the physical facts used are the period of a circular 550 km
 * orbit, 2π√(r³/μ) = 5738.8 s (WGS-72 μ, Vallado et al. 2006), and that one pair's distinct
 * close approaches are at least about half a revolution apart (common practice).
 */
import { describe, expect, it } from 'vitest';
import {
  linkSeries, seriesStatus, seriesTrend, SeriesLinker, newestDataTime,
  type ScreeningCoverage, type Series, type SeriesMember,
} from '../core/events/index.js';
import type { Instant } from '../core/time/instant.js';
import { angleForRelativeSpeedDeg, at, PERIOD_LEO_S, sighting, shuffled } from './support/sightings.js';

/** The partition as sorted lists of event ids: what "the same series" means. */
const partition = (series: readonly Series[]): string[][] =>
  series.map((s) => s.members.map((m) => m.event.id).sort()).sort((a, b) => (a[0]! < b[0]! ? -1 : 1));
const seriesOfEvent = (series: readonly Series[], eventId: string): Series =>
  series.find((s) => s.members.some((m) => m.event.id === eventId))!;

const ms = (s: number): number => s * 1000;

describe('TCA drift inside the tolerance links; the next orbit does not', () => {
  it('fast crossing (10 km/s): 0.6 s drift links, one period later is another series', () => {
    // τ = 1.24 s here (events-series-tolerance.test.ts, first case): 0.6 s is inside.
    const angleDeg = angleForRelativeSpeedDeg(10);
    const base = at('2026-12-08T00:00:00Z');
    const common = { primary: '100001', secondary: '330001', angleDeg };
    const members = [
      sighting({ ...common, id: 'w2', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: base, sigmaAlongM: 300 }),
      sighting({ ...common, id: 'w3', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(0.6)) as Instant, sigmaAlongM: 400 }),
      sighting({ ...common, id: 'w3next', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(PERIOD_LEO_S)) as Instant, sigmaAlongM: 400 }),
    ];
    expect(partition(linkSeries(members))).toEqual([['w2', 'w3'], ['w3next']]);
  });

  it('fast crossing: a 3 s drift, beyond τ = 1.24 s, starts a new series', () => {
    const angleDeg = angleForRelativeSpeedDeg(10);
    const base = at('2026-12-08T00:00:00Z');
    const common = { primary: '100001', secondary: '330001', angleDeg };
    const members = [
      sighting({ ...common, id: 'w2', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: base, sigmaAlongM: 300 }),
      sighting({ ...common, id: 'w3', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(3)) as Instant, sigmaAlongM: 400 }),
    ];
    expect(partition(linkSeries(members))).toEqual([['w2'], ['w3']]);
  });

  it('slow same-shell encounter (30 m/s): 400 s drift links (τ = 472 s); one period later does not', () => {
    const angleDeg = angleForRelativeSpeedDeg(0.03);
    const base = at('2026-12-08T00:00:00Z');
    const common = { primary: '100002', secondary: '330004', angleDeg };
    const members = [
      sighting({ ...common, id: 'w2', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: base, sigmaAlongM: 800 }),
      sighting({ ...common, id: 'w3', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(400)) as Instant, sigmaAlongM: 300 }),
      sighting({ ...common, id: 'w3next', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(400 + PERIOD_LEO_S)) as Instant, sigmaAlongM: 300 }),
    ];
    expect(partition(linkSeries(members))).toEqual([['w2', 'w3'], ['w3next']]);
  });

  it('even with no covariance at all (tolerance at its cap) the next revolution stays apart', () => {
    // Fallback σ makes τ = P/4 = 1434.7 s; the next approach is ~P = 5738.8 s later.
    const angleDeg = angleForRelativeSpeedDeg(0.02);
    const base = at('2026-12-08T00:00:00Z');
    const common = { primary: '100002', secondary: '330004', angleDeg };
    const members = [
      sighting({ ...common, id: 'w2', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: base }),
      sighting({ ...common, id: 'w3', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(1400)) as Instant }),
      sighting({ ...common, id: 'w2next', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: (base + ms(PERIOD_LEO_S)) as Instant }),
      sighting({ ...common, id: 'w3next', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(PERIOD_LEO_S + 900)) as Instant }),
    ];
    expect(partition(linkSeries(members))).toEqual([['w2', 'w3'], ['w2next', 'w3next']]);
  });

  it('other pairs never link, whatever their TCA', () => {
    const common = { tca: '2026-12-08T00:00:00Z', createdAt: '2026-12-07T00:00:00Z', sigmaAlongM: 300 };
    const members = [
      sighting({ ...common, id: 'a', source: 'R3', primary: '100001', secondary: '330001' }),
      sighting({ ...common, id: 'b', source: 'R3', primary: '100001', secondary: '330002' }),
      sighting({ ...common, id: 'c', source: 'M1', kind: 'cdm', primary: '330001', secondary: '100001' }),
    ];
    expect(partition(linkSeries(members))).toEqual([['a', 'c'], ['b']]);
  });
});

describe('one source sees a conjunction at most once', () => {
  it('two sightings of one run inside one tolerance are split at the widest gap', () => {
    // Slow pair, fallback σ → τ at the cap (1434.7 s). A run reports minima at t and t+1000 s;
    // a later run one at t+100 s. Without the rule all three would chain into one series.
    const angleDeg = angleForRelativeSpeedDeg(0.02);
    const base = at('2026-12-08T00:00:00Z');
    const common = { primary: '100002', secondary: '330004', angleDeg };
    const members = [
      sighting({ ...common, id: 'r2a', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: base }),
      sighting({ ...common, id: 'r2b', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: (base + ms(1000)) as Instant }),
      sighting({ ...common, id: 'r3', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(100)) as Instant }),
    ];
    const series = linkSeries(members);
    expect(partition(series)).toEqual([['r2a', 'r3'], ['r2b']]);
    for (const s of series) expect(new Set(s.members.map((m) => m.source.id)).size).toBe(s.members.length);
  });
});

/**
 * Three weekly screening runs (Mondays 23 Nov, 30 Nov, 7 Dec 2026, each 10 days ahead) and two
 * received messages, shaped like the demo's design:
 * - 330001 grows riskier: R2 (miss 0.9 km), message M1 of 4 Dec (0.35 km), R3 (0.05 km);
 * - 330002 appears: only R3 finds it, although R2's window covered its TCA;
 * - 330003 goes away: R2 finds it, R3 covers its TCA and does not;
 * - 330004 was seen by R1 and R2 and its TCA (2 Dec) has passed by R3;
 * - 330005: a message M2 naming the pair the other way round (OBJECT1 = the secondary), then R3.
 */
function weeklyWorld(): { members: SeriesMember[]; runs: ScreeningCoverage[]; asOf: Instant } {
  const fast = angleForRelativeSpeedDeg(14);
  const w = (
    id: string, source: string, createdAt: string, secondary: string, tca: string, missKm: number, pc: number | null,
    extra: Partial<Parameters<typeof sighting>[0]> = {},
  ) => sighting({ id, source, createdAt, primary: '100001', secondary, tca, missKm, pc, angleDeg: fast, sigmaAlongM: 500, ...extra });
  const members = [
    w('R2-1', 'R2', '2026-11-30T00:00:00Z', '330001', '2026-12-07T14:52:48.067Z', 0.9, 1e-9),
    w('M1-1', 'M1', '2026-12-04T09:15:00Z', '330001', '2026-12-07T14:52:48.437Z', 0.35, 2e-6, { kind: 'cdm' }),
    w('R3-1', 'R3', '2026-12-07T00:00:00Z', '330001', '2026-12-07T14:52:48.317Z', 0.05, 3e-4),
    w('R3-2', 'R3', '2026-12-07T00:00:00Z', '330002', '2026-12-08T08:53:12.904Z', 0.8, 1e-6),
    w('R2-2', 'R2', '2026-11-30T00:00:00Z', '330003', '2026-12-08T19:27:41.733Z', 0.6, 5e-6),
    w('R1-1', 'R1', '2026-11-23T00:00:00Z', '330004', '2026-12-02T03:10:27.806Z', 1.5, 1e-7),
    w('R2-3', 'R2', '2026-11-30T00:00:00Z', '330004', '2026-12-02T03:10:27.506Z', 1.3, 2e-7),
    sighting({
      id: 'M2-1', source: 'M2', kind: 'cdm', createdAt: '2026-12-05T12:00:00Z', primary: '330005', secondary: '100001',
      tca: '2026-12-09T06:00:00.200Z', missKm: 2, pc: 1e-8, angleDeg: fast, sigmaAlongM: 500,
    }),
    w('R3-3', 'R3', '2026-12-07T00:00:00Z', '330005', '2026-12-09T06:00:00.000Z', 1.8, 2e-8),
  ];
  const run = (id: string, startIso: string): ScreeningCoverage => ({
    id, createdAt: at(startIso), start: at(startIso), end: (at(startIso) + 10 * 86_400_000) as Instant, primaries: ['100001'],
  });
  const runs = [run('R1', '2026-11-23T00:00:00Z'), run('R2', '2026-11-30T00:00:00Z'), run('R3', '2026-12-07T00:00:00Z')];
  const asOf = newestDataTime([...runs, ...members.map((m) => m.source)])!;
  return { members, runs, asOf };
}

describe('three weekly runs plus received messages', () => {
  const { members, runs, asOf } = weeklyWorld();
  const series = linkSeries(members);
  const stateOf = (eventId: string) => seriesStatus(seriesOfEvent(series, eventId), runs, asOf);

  it('links each conjunction across runs and messages, and nothing else', () => {
    expect(partition(series)).toEqual([['M1-1', 'R2-1', 'R3-1'], ['M2-1', 'R3-3'], ['R1-1', 'R2-3'], ['R2-2'], ['R3-2']]);
  });

  it('names the pair as screening does, even when a message names it the other way round', () => {
    const s = seriesOfEvent(series, 'M2-1');
    expect([s.primary, s.secondary]).toEqual(['100001', '330005']);
    // founder: the message (its data, 5 Dec, is older than R3's)
    expect(s.id).toBe('S-M2-1');
  });

  it('gives each series its state as of the newest data (R3, 7 Dec)', () => {
    expect(asOf).toBe(at('2026-12-07T00:00:00Z'));
    expect(stateOf('R3-1').state).toBe('updated');
    expect(stateOf('R3-2').state).toBe('new');
    const gone = stateOf('R2-2');
    expect(gone.state).toBe('no-longer-predicted');
    expect(gone.missedBy).toBe('R3');
    expect(stateOf('R1-1').state).toBe('past');
    expect(stateOf('R3-3').state).toBe('updated');
  });

  it('states as of week 2: what R2 knew', () => {
    const upTo = (t: string) => members.filter((m) => m.source.createdAt <= at(t));
    const s2 = linkSeries(upTo('2026-11-30T00:00:00Z'));
    const runs2 = runs.slice(0, 2);
    const st = (id: string) => seriesStatus(seriesOfEvent(s2, id), runs2, at('2026-11-30T00:00:00Z')).state;
    expect(st('R2-1')).toBe('new');
    expect(st('R2-2')).toBe('new');
    expect(st('R2-3')).toBe('updated');
  });

  it('a run that did not screen either object, or flagged one, cannot drop a series', () => {
    const gone = seriesOfEvent(series, 'R2-2');
    const other: ScreeningCoverage = { ...runs[2]!, primaries: ['100002'] };
    expect(seriesStatus(gone, [runs[1]!, other], asOf).state).toBe('new');
    const flagged: ScreeningCoverage = { ...runs[2]!, flagged: ['330003'] };
    expect(seriesStatus(gone, [runs[1]!, flagged], asOf).state).toBe('new');
    const all: ScreeningCoverage = { ...runs[2]!, primaries: 'all' };
    expect(seriesStatus(gone, [runs[1]!, all], asOf).state).toBe('no-longer-predicted');
  });

  it('a run whose volume would not have held the last miss cannot drop it; one that would, does', () => {
    const gone = seriesOfEvent(series, 'R2-2');
    const miss = gone.members[gone.members.length - 1]!.event.missKm;
    const smaller: ScreeningCoverage = { ...runs[2]!, volume: { kind: 'sphere', radiusKm: miss * 0.9 } };
    expect(seriesStatus(gone, [runs[1]!, smaller], asOf).state).toBe('new');
    const larger: ScreeningCoverage = { ...runs[2]!, volume: { kind: 'sphere', radiusKm: miss * 1.1 } };
    expect(seriesStatus(gone, [runs[1]!, larger], asOf).state).toBe('no-longer-predicted');
    // an ellipsoid counts only its smallest semi-axis (the frame of the last sighting may differ)
    const thin: ScreeningCoverage = { ...runs[2]!, volume: { kind: 'rtn-ellipsoid', rKm: miss * 0.5, tKm: 25, nKm: 25 } };
    expect(seriesStatus(gone, [runs[1]!, thin], asOf).state).toBe('new');
  });

  it('a run whose window ends before the TCA cannot drop it', () => {
    const gone = seriesOfEvent(series, 'R2-2');
    const short: ScreeningCoverage = { ...runs[2]!, end: at('2026-12-08T19:00:00Z') };
    expect(seriesStatus(gone, [runs[1]!, short], asOf).state).toBe('new');
  });

  it('trend: points in data order with time to TCA, miss, Pc, RTN, source; Pc rising as data', () => {
    const trend = seriesTrend(seriesOfEvent(series, 'R3-1'));
    expect(trend.points.map((p) => [p.eventId, p.sourceKind])).toEqual([['R2-1', 'screening'], ['M1-1', 'cdm'], ['R3-1', 'screening']]);
    // time to TCA: 7 Dec 14:52:48.317 − 7 Dec 00:00 = 14.8801 h (hand arithmetic)
    expect(trend.points[2]!.timeToTcaH).toBeCloseTo(14 + 52 / 60 + 48.317 / 3600, 9);
    expect(trend.points.map((p) => p.missKm)).toEqual([0.9, 0.35, 0.05]);
    expect(trend.sincePrevious!.pcDirection).toBe('rising');
    expect(trend.sincePrevious!.pcFactor).toBeCloseTo(3e-4 / 2e-6, 6);
    expect(trend.sinceFirst!.pcLog10Change).toBeCloseTo(Math.log10(3e-4 / 1e-9), 9);
    expect(trend.sinceFirst!.missDirection).toBe('closing');
    expect(trend.sinceFirst!.missChangeKm).toBeCloseTo(-0.85, 12);
  });

  it('trend RTN is always of the series primary, also for a message that swapped the objects', () => {
    const trend = seriesTrend(seriesOfEvent(series, 'R3-3'));
    // The hand-built geometry puts the message's OBJECT2 (here 100001, the series primary) 2 km
    // radially above its OBJECT1 (330005): seen from 100001, 330005 is 2 km radially below.
    // The message's own RTN (of 330005) says +2 km; the trend must not take it as it is.
    const fromMessage = trend.points[0]!;
    expect(fromMessage.sourceKind).toBe('cdm');
    expect(fromMessage.rtnKm[0]).toBeCloseTo(-2, 9);
    expect(trend.points[1]!.rtnKm[0]).toBeCloseTo(1.8, 9);
  });
});

describe('arrival order does not matter', () => {
  /** A dense set: the weekly world, plus chains that bridge, repeats of one source, swaps. */
  function denseSet(): SeriesMember[] {
    const { members } = weeklyWorld();
    const slow = angleForRelativeSpeedDeg(0.02);
    const base = at('2026-12-10T00:00:00Z');
    const extra: SeriesMember[] = [];
    const sources = ['R1', 'R2', 'R3', 'M1', 'M2', 'M3'];
    const created = ['2026-11-23', '2026-11-30', '2026-12-07', '2026-12-01', '2026-12-04', '2026-12-05'];
    for (let k = 0; k < 24; k++) {
      const src = k % sources.length;
      extra.push(sighting({
        id: `x${k}`, source: sources[src]!, kind: src >= 3 ? 'cdm' : 'screening', createdAt: `${created[src]!}T00:00:00Z`,
        primary: k % 5 === 0 ? '330077' : '100003', secondary: k % 5 === 0 ? '100003' : '330077',
        tca: (base + ms((k * 397) % 3000) + ms(Math.floor(k / 8) * PERIOD_LEO_S)) as Instant, angleDeg: slow,
        ...(k % 3 === 0 ? {} : { sigmaAlongM: 200 + 50 * k }),
      }));
    }
    return [...members, ...extra];
  }

  it('any permutation gives the same series, ids included (200 seeded permutations)', () => {
    const all = denseSet();
    const reference = linkSeries(all);
    const key = (ss: readonly Series[]) => JSON.stringify(ss.map((s) => [s.id, s.primary, s.secondary, s.members.map((m) => m.event.id)]));
    expect(reference.length).toBeGreaterThan(6);
    for (let seed = 1; seed <= 200; seed++) expect(key(linkSeries(shuffled(all, seed)))).toBe(key(reference));
  });

  it('incremental adds in any order and any batch sizes end where linking everything at once does', () => {
    const all = denseSet();
    const reference = JSON.stringify(linkSeries(all).map((s) => [s.id, s.members.map((m) => m.event.id)]));
    for (let seed = 1; seed <= 50; seed++) {
      const order = shuffled(all, seed);
      const linker = new SeriesLinker();
      const assigned = new Map<string, string>();
      for (let k = 0; k < order.length; ) {
        const size = 1 + ((seed * 7 + k) % 5);
        const upd = linker.add(order.slice(k, k + size));
        for (const [e, s] of upd.reassigned) assigned.set(e, s);
        k += size;
      }
      expect(JSON.stringify(linker.all().map((s) => [s.id, s.members.map((m) => m.event.id)]))).toBe(reference);
      // What a store wrote from `reassigned` alone is every event's final series id.
      for (const s of linker.all()) for (const m of s.members) expect(assigned.get(m.event.id)).toBe(s.id);
    }
  });

  it('an event bridging two series merges them and reports the retired id', () => {
    const fast = angleForRelativeSpeedDeg(10);
    const base = at('2026-12-08T00:00:00Z');
    const common = { primary: '100001', secondary: '330001', angleDeg: fast, sigmaAlongM: 300 };
    // τ(R1, R3), spans 16 d and 2 d: 5·√(300²+300²)/10⁴ + √2·1000·14/10⁴ = 0.212 + 1.980 = 2.19 s,
    // so 2.5 s apart they do not link. R2 (σ 2 km, span 9 d) reaches both:
    // τ(R1, R2) = τ(R2, R3) = 5·√(300²+2000²)/10⁴ + √2·1000·7/10⁴ = 1.011 + 0.990 = 2.00 s.
    const r1 = sighting({ ...common, id: 'r1', source: 'R1', createdAt: '2026-11-23T00:00:00Z', tca: base });
    const r3 = sighting({ ...common, id: 'r3', source: 'R3', createdAt: '2026-12-07T00:00:00Z', tca: (base + ms(2.5)) as Instant });
    const r2 = sighting({ ...common, id: 'r2', source: 'R2', createdAt: '2026-11-30T00:00:00Z', tca: (base + ms(1.2)) as Instant, sigmaAlongM: 2000 });
    const linker = new SeriesLinker([r1, r3]);
    expect(linker.all().map((s) => s.id)).toEqual(['S-r1', 'S-r3']);
    const upd = linker.add([r2]);
    expect(linker.all().map((s) => s.id)).toEqual(['S-r1']);
    expect(upd.retired).toEqual(['S-r3']);
    expect([...upd.reassigned.entries()].sort()).toEqual([['r2', 'S-r1'], ['r3', 'S-r1']]);
  });
});
