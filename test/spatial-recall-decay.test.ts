/**
 * All-vs-all with objects that stop propagating inside the window (SGP4 reports decay): their
 * approaches BEFORE the decay must be found, by the spatial index path (`screen --all`) exactly as
 * by the pair-by-pair engine, and both must match brute force. DESIGN.md "Screening
 * requirements": recall 100 %, TCA within 1 ms, miss within 1 m; objects whose propagation fails
 * are flagged, never fatal, and screened up to the failure.
 *
 * Reference (test/support/bruteForce.ts, 1-s sampling): each object's valid span is found here
 * independently of the engine, by propagating it every second from the window start to its first
 * SGP4 failure; every pair is brute-forced over the shorter of its two spans.
 *
 * The decaying element sets (their failure times measured here with satellite.js, asserted below):
 *  - 90101: perigee ~320 km, apogee ~810 km (e = 0.035), B* = 1 — fails ~12.2 h after epoch
 *    (the set of test/screening-sgp4.test.ts "a secondary that decays"); drag makes it gain on
 *    five companions on nearly the same orbit (B* = 1e-4, a few tenths of a degree ahead), so it
 *    passes them one after another before it decays;
 *  - 90102: circular at ~220 km, B* = 0.05 — fails ~6.5 h after epoch (as in
 *    test/screening-workers.test.ts); four companions on nearly the same orbit ahead of it;
 *  - 90103: 0.3° ahead of 90102 with B* = 0.02 — fails ~16.2 h; a decaying–decaying pair.
 * SGP4's failure is not monotonic in time (90101 is "decayed" at 12.23 h, valid again at
 * 12.28 h): the engine must screen up to the first failure, not to a later valid instant.
 * B* of 0.02–1 is what element sets of objects in their last days carry (common practice).
 */
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import type { Encounter } from '../core/events/index.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { ScreeningChunk } from '../core/screening/chunk.js';
import { runScreening, type ScreeningOutcome } from '../core/screening/run.js';
import { Rng } from '../core/synthetic/random.js';
import type { Instant } from '../core/time/instant.js';
import { bruteForceEvents, compareToReference, describeFound, describeRef, type ReferenceEvent } from './support/bruteForce.js';
import { compareEngines, pairKey } from './support/compareEngines.js';
import { elementSet, type Orbit } from './support/elements.js';

/** Requirement (DESIGN.md): TCA within 1 ms, miss within 1 m of a dense evaluation. */
const TCA_TOL_MS = 1;
const MISS_TOL_KM = 1e-3;
const START = Date.UTC(2026, 11, 3, 6, 0, 0);
const HOUR = 3_600_000;
const WINDOW_MS = 18 * HOUR;
const RADIUS_KM = 25;
const DECAYING = ['90101', '90102', '90103'];

const ECCENTRIC: Orbit = { aKm: 6945, e: 0.035, iDeg: 53, raanDeg: 10, argpDeg: 30, uDeg: 70, meanMotionRevPerDay: 15.0 };
const LOW: Orbit = { aKm: 6598, e: 0.0005, iDeg: 51.6, raanDeg: 200, argpDeg: 30, uDeg: 150, meanMotionRevPerDay: 16.2 };

/**
 * Decaying sets first, in the middle and last (a decaying object is the primary of some pairs
 * and the secondary of others in the pair-by-pair engine), with their companions and a few
 * objects in random planes between 300 and 800 km that cross 90101's radius band.
 */
function catalogue(): ElementSet[] {
  const rng = new Rng(1010);
  const sets: ElementSet[] = [elementSet('90101', START, { ...ECCENTRIC, bstar: 1.0 })];
  [0.2, 0.5, 0.9, 1.4, 2.0].forEach((du, k) =>
    sets.push(elementSet(String(10100 + k), START, {
      ...ECCENTRIC, uDeg: ECCENTRIC.uDeg + du, raanDeg: ECCENTRIC.raanDeg + rng.uniform(-0.01, 0.01), bstar: 1e-4,
    })));
  for (let k = 0; k < 6; k++) {
    const aKm = 6378.135 + rng.uniform(300, 800);
    sets.push(elementSet(String(10300 + k), START - rng.uniform(0, 1) * 86_400_000, {
      aKm, e: rng.uniform(0, 0.002), iDeg: rng.uniform(30, 100), raanDeg: rng.uniform(0, 360),
      argpDeg: rng.uniform(0, 360), uDeg: rng.uniform(0, 360), bstar: 1e-4,
    }, START));
  }
  sets.push(elementSet('90102', START, { ...LOW, bstar: 0.05 }));
  [0.1, 0.4, 0.8, 1.5].forEach((du, k) =>
    sets.push(elementSet(String(10200 + k), START, {
      ...LOW, uDeg: LOW.uDeg + du, iDeg: LOW.iDeg + rng.uniform(-0.005, 0.005), bstar: 1e-4,
    })));
  sets.push(elementSet('90103', START, { ...LOW, uDeg: LOW.uDeg + 0.3, bstar: 0.02 }));
  return sets;
}

const settings = (end = START + WINDOW_MS) => ({
  start: START as Instant,
  end: end as Instant,
  volume: { kind: 'sphere' as const, radiusKm: RADIUS_KM },
});

/** Last whole second (from the window start, ≤ end) up to which every second propagates. */
function validSpanEnd(tr: Sgp4Trajectory, start: number, end: number): number {
  const buf = new Float64Array(6);
  let t = start;
  while (t + 1000 <= end && !tr.stateInto((t + 1000) as Instant, buf, 0)) t += 1000;
  return t;
}

/** Brute force over each pair's common valid span (objects sorted by span, each against the longer-lived); computed once. */
let cached: { events: ReferenceEvent[]; spanEnd: Map<string, number> } | null = null;
function reference(sets: readonly ElementSet[]): { events: ReferenceEvent[]; spanEnd: Map<string, number> } {
  return (cached ??= bruteForceOverSpans(sets, START + WINDOW_MS));
}

function bruteForceOverSpans(sets: readonly ElementSet[], end: number): { events: ReferenceEvent[]; spanEnd: Map<string, number> } {
  const trs = sets.map((s) => new Sgp4Trajectory(s));
  const spanEnd = new Map(trs.map((t) => [t.objectId, validSpanEnd(t, START, end)]));
  const byEnd = [...trs].sort((a, b) => spanEnd.get(a.objectId)! - spanEnd.get(b.objectId)!);
  const events: ReferenceEvent[] = [];
  for (let k = 0; k < byEnd.length; k++) {
    const p = byEnd[k]!;
    const later = byEnd.slice(k + 1);
    if (later.length > 0) events.push(...bruteForceEvents([p], later, START, spanEnd.get(p.objectId)!, RADIUS_KM).events);
  }
  return { events, spanEnd };
}

function expectMatches(found: readonly Encounter[], ref: readonly ReferenceEvent[], label: string): void {
  const cmp = compareToReference(found, ref);
  expect(cmp.missing.map(describeRef), `${label}: reference events missed`).toEqual([]);
  expect(cmp.extra.map(describeFound), `${label}: encounters not in the reference`).toEqual([]);
  for (const { ref: r, found: f } of cmp.matched) {
    expect(Math.abs(f.tca - r.tcaMs), `${label}: ${describeRef(r)}`).toBeLessThan(TCA_TOL_MS);
    expect(Math.abs(f.missKm - r.missKm), `${label}: ${describeRef(r)}`).toBeLessThan(MISS_TOL_KM);
    expect(Boolean(f.atWindowEdge), `${label}: ${describeRef(r)}`).toBe(r.atEdge);
  }
}

const involves = (id: string) => (e: { primary: string; secondary: string }) => e.primary === id || e.secondary === id;
const involvesDecaying = (e: { primary: string; secondary: string }) => DECAYING.includes(e.primary) || DECAYING.includes(e.secondary);

describe('all-vs-all with objects that decay inside the window', () => {
  const sets = catalogue();

  it('the spatial index and the pair-by-pair engine both find every brute-force event (TCA ≤ 1 ms, miss ≤ 1 m)', async () => {
    const { events: ref, spanEnd } = reference(sets);
    // The scenario is what it claims: the three sets fail inside the window, nothing else does.
    const failAt = (id: string) => (spanEnd.get(id)! - START) / HOUR;
    expect(failAt('90101')).toBeGreaterThan(11);
    expect(failAt('90101')).toBeLessThan(13);
    expect(failAt('90102')).toBeGreaterThan(5.5);
    expect(failAt('90102')).toBeLessThan(7.5);
    expect(failAt('90103')).toBeGreaterThan(15);
    expect(failAt('90103')).toBeLessThan(17);
    for (const s of sets) if (!DECAYING.includes(s.objectId)) expect(spanEnd.get(s.objectId), s.objectId).toBe(START + WINDOW_MS);
    // Genuine approaches before each decay, none of them on the decay instant itself.
    const decayEvents = ref.filter(involvesDecaying);
    for (const id of DECAYING) {
      expect(decayEvents.filter((e) => (e.primary === id || e.secondary === id) && !e.atEdge).length, id).toBeGreaterThanOrEqual(1);
    }
    expect(decayEvents.some((e) => e.atEdge && e.tcaMs > START)).toBe(false);

    const spatial = await runScreening(sets, { ...settings(), primaries: 'all' }, { workers: 0 });
    const pairwise = new ScreeningChunk(sets, settings(), new Int32Array(new SharedArrayBuffer(8))).screenAllPairs(0, 1);
    const count = (es: readonly { primary: string; secondary: string }[]) => `${es.filter(involvesDecaying).length} with a decaying object`;
    console.log(
      `decay recall: reference ${ref.length} events (${count(ref)}); spatial ${spatial.encounters.length} (${count(spatial.encounters)}); ` +
        `pair by pair ${pairwise.encounters.length} (${count(pairwise.encounters)}); decays at ` +
        DECAYING.map((id) => `${id} ${((spanEnd.get(id)! - START) / HOUR).toFixed(3)} h`).join(', '),
    );
    expectMatches(spatial.encounters, ref, 'spatial');
    expectMatches(pairwise.encounters, ref, 'pair by pair');
    const cmp = compareEngines(pairwise.encounters, spatial.encounters);
    expect(cmp.missing.map(describeFound), 'pair-by-pair events the index missed').toEqual([]);
    expect(cmp.extra.map(describeFound), 'index events the pair-by-pair engine did not find').toEqual([]);
    // Each decaying object is flagged with the instant it is screened up to.
    expect(spatial.flagged.map((f) => f.id).sort()).toEqual(DECAYING);
    // ... and that instant is the first failure (within the reference's 1-s sampling), not a later one.
    for (const f of spatial.flagged) {
      const m = /after (\S+); screened until then/.exec(f.reason);
      expect(m, f.reason).not.toBeNull();
      expect(Math.abs(Date.parse(m![1]!) - spanEnd.get(f.id)!), f.reason).toBeLessThanOrEqual(1000);
    }
  });

  it('fleet screening with the decaying objects as primaries (grids in shared memory, 2 workers) finds the same events', async () => {
    const { events: ref } = reference(sets);
    const out = await runScreening(sets, { ...settings(), primaries: DECAYING }, { workers: 2 });
    expectMatches(out.encounters, ref.filter(involvesDecaying), 'fleet');
    expect(out.flagged.map((f) => f.id).sort()).toEqual(DECAYING);
  });

  it('a decay between the validity probes (window ending 4 min after it) is found where the object is used', async () => {
    // 90101 fails at 12.229 h, propagates again from 12.275 h to 13.360 h: with the window ending
    // at 12.3 h, the engine's hourly probes (validity.ts, up to 1 h past the end) all pass.
    const end = START + 12.3 * HOUR;
    const group = sets.filter((s) => s.objectId === '90101' || s.objectId.startsWith('101') || s.objectId.startsWith('103'));
    const d = new Sgp4Trajectory(group[0]!);
    const buf = new Float64Array(6);
    for (let t = START; t <= end + HOUR; t = Math.min(t + HOUR, end + HOUR)) {
      expect(d.stateInto(t as Instant, buf, 0), `90101 at ${(t - START) / HOUR} h`).toBeNull();
      if (t === end + HOUR) break;
    }
    const { events: ref, spanEnd } = bruteForceOverSpans(group, end);
    expect((spanEnd.get('90101')! - START) / HOUR).toBeLessThan(12.25);
    expect(ref.filter(involves('90101')).length).toBeGreaterThanOrEqual(2);
    const win = settings(end);
    const spatial = await runScreening(group, { ...win, primaries: 'all' }, { workers: 0 });
    const pairwise = new ScreeningChunk(group, win, new Int32Array(new SharedArrayBuffer(8))).screenAllPairs(0, 1);
    const fleet = await runScreening(group, { ...win, primaries: ['90101'] }, { workers: 0 });
    const threaded = await runScreening(group, { ...win, primaries: 'all' }, { workers: 2 });
    expectMatches(spatial.encounters, ref, 'spatial');
    expectMatches(threaded.encounters, ref, 'spatial, 2 workers');
    expectMatches(pairwise.encounters, ref, 'pair by pair');
    expectMatches(fleet.encounters, ref.filter(involves('90101')), 'fleet');
    for (const out of [spatial, fleet]) expect(out.flagged.map((f) => f.id)).toEqual(['90101']);
  });

  it('worker threads give the same events as the calling thread', async () => {
    const inThread = await runScreening(sets, { ...settings(), primaries: 'all' }, { workers: 0 });
    const threaded = await runScreening(sets, { ...settings(), primaries: 'all' }, { workers: 2 });
    const key = (o: ScreeningOutcome) => o.encounters.map((e) => ({ p: e.primary, s: e.secondary, tca: e.tca, miss: e.missKm }));
    expect(inThread.encounters.filter(involvesDecaying).length).toBeGreaterThanOrEqual(3);
    expect(key(threaded)).toEqual(key(inThread));
    expect(threaded.flagged.map((f) => f.id).sort()).toEqual(DECAYING);
  });

  it('shards: the union of N shards is the unsharded run, decaying objects included', async () => {
    const whole = await runScreening(sets, { ...settings(), primaries: 'all' }, { workers: 0 });
    const asKeys = (es: readonly Encounter[]) => es.map((e) => `${pairKey(e)}@${e.tca}:${e.missKm}`).sort();
    expect(whole.encounters.filter(involvesDecaying).length).toBeGreaterThanOrEqual(3);
    for (const n of [2, 3, 7]) {
      const shards: ScreeningOutcome[] = [];
      for (let k = 1; k <= n; k++) {
        shards.push(await runScreening(sets, { ...settings(), primaries: 'all', shard: { index: k, count: n } }, { workers: 0 }));
      }
      const union = shards.flatMap((s) => s.encounters);
      expect(asKeys(union), `N = ${n}`).toEqual(asKeys(whole.encounters));
      expectMatches(union, reference(sets).events, `union of ${n} shards`);
      // The decaying objects' events are spread over more than one shard (they are members, not owners).
      const withDecay = shards.filter((s) => s.encounters.some(involvesDecaying)).length;
      expect(withDecay, `N = ${n}: shards holding a decaying object's events`).toBeGreaterThan(1);
    }
  });
});
