/**
 * All-vs-all through the spatial index (core/screening/spatial) against
 *  1. the brute-force reference (test/support/bruteForce.ts: every object every second, every
 *     sampled minimum refined), and
 *  2. the pair-by-pair engine (ScreeningChunk.screenAllPairs: every pair through the orbit-model
 *     filters of engine.ts), event for event on the same inputs;
 * on a dense shell near 550 km: random planes (±5 km in altitude), nearly coplanar groups (same
 * plane, a few km apart in altitude and a fraction of a degree in phase: slow overtaking passes)
 * and crossing planes; and eccentric objects placed at perigee next to shell objects, faster than
 * the rest (the index's fast objects, broadPhase.ts). Requirements (DESIGN.md "Screening requirements"): recall 100 %, TCA
 * within 1 ms and miss within 1 m; and the sharding contract: the union of N shards equals the
 * unsharded run (DESIGN.md "--shard K/N and merge"), each pair in exactly one shard.
 */
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { runScreening, type ScreeningOutcome } from '../core/screening/run.js';
import { ScreeningChunk } from '../core/screening/chunk.js';
import { Rng } from '../core/synthetic/random.js';
import type { Instant } from '../core/time/instant.js';
import type { Encounter } from '../core/events/index.js';
import { bruteForceEvents, compareToReference, describeFound, describeRef } from './support/bruteForce.js';
import { elementSet, RE_WGS72 } from './support/elements.js';
import { compareEngines, pairKey } from './support/compareEngines.js';
import { BlockTracks } from '../core/screening/spatial/blockTracks.js';
import { indexLayout } from '../core/screening/spatial/broadPhase.js';
import { INDEX_STEP_MS } from '../core/screening/spatial/chunk.js';
import { samplingPlan } from '../core/screening/spatial/sampling.js';

/** Requirement (DESIGN.md): TCA within 1 ms, miss within 1 m of a dense evaluation. */
const TCA_TOL_MS = 1;
const MISS_TOL_KM = 1e-3;
const START = Date.UTC(2026, 11, 3, 6, 0, 0);
const HOUR = 3_600_000;
const DAY = 86_400_000;

const isotropicInclination = (rng: Rng): number => (Math.acos(rng.uniform(-1, 1)) * 180) / Math.PI;

/** A dense shell near 550 km: `random` objects in random planes plus `groups` coplanar groups of 4. */
function denseShell(seed: number, random: number, groups: number): ElementSet[] {
  const rng = new Rng(seed);
  const sets: ElementSet[] = [];
  const epochOf = (): number => START - Math.round(rng.uniform(0, 2) * DAY);
  let id = 40000;
  for (let k = 0; k < random; k++) {
    sets.push(
      elementSet(String(id++), epochOf(), {
        aKm: RE_WGS72 + 550 + rng.uniform(-5, 5),
        e: rng.uniform(0, 0.002),
        iDeg: isotropicInclination(rng),
        raanDeg: rng.uniform(0, 360),
        argpDeg: rng.uniform(0, 360),
        uDeg: rng.uniform(0, 360),
        bstar: rng.uniform(1e-5, 2e-4),
      }, START),
    );
  }
  for (let g = 0; g < groups; g++) {
    const base = { aKm: RE_WGS72 + 550, e: 0.0003, iDeg: rng.uniform(40, 98), raanDeg: rng.uniform(0, 360), argpDeg: 90, uDeg: rng.uniform(0, 360), bstar: 1e-4 };
    for (let m = 0; m < 4; m++) {
      const dA = m === 0 ? 0 : (m % 2 === 0 ? 1 : -1) * rng.uniform(0.5, 3);
      sets.push(
        elementSet(String(id++), epochOf(), {
          ...base,
          aKm: base.aKm + dA,
          e: rng.uniform(0, 0.0005),
          raanDeg: base.raanDeg + rng.uniform(-0.01, 0.01),
          iDeg: base.iDeg + rng.uniform(-0.005, 0.005),
          argpDeg: rng.uniform(0, 360),
          uDeg: base.uDeg + (m === 0 ? 0 : Math.sign(dA) * rng.uniform(0.02, 0.5)),
        }, START),
      );
    }
  }
  return sets;
}

/**
 * An eccentric element set at its perigee at `at`, through the point r (km, TEME) with perigee
 * radius |r|, in the plane of (r, v) turned by turnDeg about r, apogee radius apogeeKm.
 */
function throughPoint(id: string, at: number, r: number[], v: number[], turnDeg: number, apogeeKm: number): ElementSet {
  const unit = (a: number[]) => a.map((x) => x / Math.hypot(...a));
  const cross = (a: number[], b: number[]) => [a[1]! * b[2]! - a[2]! * b[1]!, a[2]! * b[0]! - a[0]! * b[2]!, a[0]! * b[1]! - a[1]! * b[0]!];
  const dot = (a: number[], b: number[]) => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
  const rHat = unit(r), nHat = unit(cross(r, v));
  const b = (turnDeg * Math.PI) / 180;
  const rxn = cross(rHat, nHat);
  const n = nHat.map((x, c) => x * Math.cos(b) + rxn[c]! * Math.sin(b));
  const iDeg = (Math.acos(n[2]!) * 180) / Math.PI;
  const raan = Math.atan2(n[0]!, -n[1]!);
  const node = [Math.cos(raan), Math.sin(raan), 0];
  const uDeg = (Math.atan2(dot(cross(node, rHat), n), dot(node, rHat)) * 180) / Math.PI;
  const rp = Math.hypot(...r);
  return elementSet(id, at, { aKm: (rp + apogeeKm) / 2, e: (apogeeKm - rp) / (apogeeKm + rp), iDeg, raanDeg: (raan * 180) / Math.PI, argpDeg: uDeg, uDeg }, at);
}

const settingsOf = (start: number, end: number, radiusKm: number) => ({
  start: start as Instant,
  end: end as Instant,
  volume: { kind: 'sphere' as const, radiusKm },
});

describe('spatial index vs brute force: dense 550 km shell, all vs all', () => {
  it('every reference event is found (TCA ≤ 1 ms, miss ≤ 1 m) and nothing else', async () => {
    const sets = denseShell(550, 64, 4);
    const start = START, end = START + 2 * HOUR, R = 30;
    const out = await runScreening(sets, { ...settingsOf(start, end, R), primaries: 'all' }, { workers: 0 });
    expect(out.flagged).toEqual([]);
    const trs = sets.map((s) => new Sgp4Trajectory(s));
    const ref = bruteForceEvents(trs, trs, start, end, R);
    const cmp = compareToReference(out.encounters, ref.events);
    const slow = ref.events.filter((r) => {
      const e = out.encounters.find((x) => pairKey(x) === [r.primary, r.secondary].sort().join('~') && Math.abs(x.tca - r.tcaMs) < 1000);
      return e !== undefined && e.relativeSpeedKmS < 0.1;
    }).length;
    console.log(
      `spatial vs brute force: ${ref.events.length} reference events (${slow} slower than 100 m/s, ` +
        `${ref.events.filter((e) => e.atEdge).length} on window edges), ${out.encounters.length} found; ` +
        `worst |ΔTCA| ${cmp.worstTcaErrorMs.toExponential(2)} ms, |Δmiss| ${(cmp.worstMissErrorKm * 1e6).toExponential(2)} mm; ` +
        `index: ${out.stats.pairTests} pair tests, ${out.stats.candidates} candidates`,
    );
    expect(ref.events.length).toBeGreaterThanOrEqual(20);
    expect(slow).toBeGreaterThanOrEqual(3); // the nearly coplanar groups meet slowly
    expect(cmp.missing.map(describeRef), 'reference events the index missed').toEqual([]);
    expect(cmp.extra.map(describeFound), 'encounters not in the reference').toEqual([]);
    for (const { ref: r, found } of cmp.matched) {
      expect(Math.abs(found.tca - r.tcaMs), describeRef(r)).toBeLessThan(TCA_TOL_MS);
      expect(Math.abs(found.missKm - r.missKm), describeRef(r)).toBeLessThan(MISS_TOL_KM);
      expect(Boolean(found.atWindowEdge), describeRef(r)).toBe(r.atEdge);
    }
  });
});

describe('spatial index vs the pair-by-pair engine: same inputs, event for event', () => {
  it('dense shell, 480 objects, 6 h, 10 km', async () => {
    const sets = denseShell(551, 400, 20);
    const win = settingsOf(START, START + 6 * HOUR, 10);
    const spatial = await runScreening(sets, { ...win, primaries: 'all' }, { workers: 0 });
    const pairwise = new ScreeningChunk(sets, win, new Int32Array(new SharedArrayBuffer(8))).screenAllPairs(0, 1);
    const cmp = compareEngines(pairwise.encounters, spatial.encounters);
    console.log(
      `spatial vs pair-by-pair: ${pairwise.encounters.length} / ${spatial.encounters.length} events; ` +
        `worst |ΔTCA| ${cmp.worstTca.toExponential(2)} ms, |Δmiss| ${(cmp.worstMiss * 1e6).toExponential(2)} mm`,
    );
    expect(pairwise.encounters.length).toBeGreaterThanOrEqual(30);
    expect(cmp.missing.map(describeFound), 'pair-by-pair events the index missed').toEqual([]);
    expect(cmp.extra.map(describeFound), 'index events the pair-by-pair engine did not find').toEqual([]);
    expect(cmp.worstTca).toBeLessThan(TCA_TOL_MS);
    expect(cmp.worstMiss).toBeLessThan(MISS_TOL_KM);
  });

  it('eccentric objects crossing the shell at perigee, faster than the rest (the index\'s fast objects)', async () => {
    // Each eccentric object (perigee at the shell, apogee 26,000 km: ~9.5 km/s at perigee against
    // 7.6) is placed at its perigee next to a shell object at a chosen instant, in a plane turned
    // about the meeting point. With 405 objects FAST_SHARE lets the index treat 4 as fast.
    const shell = denseShell(553, 400, 0);
    const trs = shell.map((x) => new Sgp4Trajectory(x));
    const st = new Float64Array(6);
    const eccentric = [1, 2, 3, 4, 5].map((h, n) => {
      const at = START + h * HOUR - 600_000;
      expect(trs[n * 70]!.stateInto(at as Instant, st, 0)).toBeNull();
      // the meeting point: (n + 1)·0.8 km above the shell object
      const lift = 1 + ((n + 1) * 0.8) / Math.hypot(st[0]!, st[1]!, st[2]!);
      const r = [st[0]! * lift, st[1]! * lift, st[2]! * lift], v = [st[3]!, st[4]!, st[5]!];
      // SGP4's elements are mean elements: aim again where the first tries missed r
      const aim = [...r];
      let set = throughPoint(`E${n}`, at, aim, v, [5, 20, 45, 90, 160][n]!, 26_000);
      for (let pass = 0; pass < 4; pass++) {
        expect(new Sgp4Trajectory(set).stateInto(at as Instant, st, 0)).toBeNull();
        for (let c = 0; c < 3; c++) aim[c] = aim[c]! - (st[c]! - r[c]!);
        set = throughPoint(`E${n}`, at, aim, v, [5, 20, 45, 90, 160][n]!, 26_000);
      }
      return set;
    });
    const sets = [...shell, ...eccentric];
    const win = settingsOf(START, START + 6 * HOUR, 10);
    // Each eccentric object is one of the index's fast objects in the hour it meets its partner.
    const members = sets.map((_, i) => i);
    const fastInItsHour = eccentric.map((E, n) => {
      const t0 = START + Math.floor((E.epoch - START) / HOUR) * HOUR;
      const tracks = new BlockTracks(t0, t0 + HOUR, sets.map((x) => new Sgp4Trajectory(x)), sets.map((x) => samplingPlan(x.meanMotionRevPerDay, x.eccentricity)), Int32Array.from(members));
      const layout = indexLayout(tracks, members, { start: START, stepMs: INDEX_STEP_MS, dKm: 10 });
      expect(members.filter((i) => layout.fast[i] === 1).length).toBe(4);
      return layout.fast[shell.length + n] === 1;
    });
    const spatial = await runScreening(sets, { ...win, primaries: 'all' }, { workers: 0 });
    const pairwise = new ScreeningChunk(sets, win, new Int32Array(new SharedArrayBuffer(8))).screenAllPairs(0, 1);
    const cmp = compareEngines(pairwise.encounters, spatial.encounters);
    const withEccentric = pairwise.encounters.filter((e) => e.primary.startsWith('E') || e.secondary.startsWith('E'));
    console.log(
      `spatial vs pair-by-pair, eccentric objects through the shell: ${pairwise.encounters.length} / ${spatial.encounters.length} events, ` +
        `${withEccentric.length} with an eccentric object (${withEccentric.map((e) => `${e.primary}~${e.secondary} ${e.missKm.toFixed(2)} km`).join(', ')}); ` +
        `each fast in its hour: ${fastInItsHour.join(' ')}`,
    );
    expect(fastInItsHour).toEqual([true, true, true, true, true]);
    expect(withEccentric.length).toBeGreaterThanOrEqual(5);
    expect(cmp.missing.map(describeFound), 'pair-by-pair events the index missed').toEqual([]);
    expect(cmp.extra.map(describeFound), 'index events the pair-by-pair engine did not find').toEqual([]);
    expect(cmp.worstTca).toBeLessThan(TCA_TOL_MS);
    expect(cmp.worstMiss).toBeLessThan(MISS_TOL_KM);
  });

  it('the same with 2 worker threads', async () => {
    const sets = denseShell(552, 200, 10);
    const win = settingsOf(START, START + 2 * HOUR + 7_000, 10); // not a whole number of steps or blocks
    const inThread = await runScreening(sets, { ...win, primaries: 'all' }, { workers: 0 });
    const threaded = await runScreening(sets, { ...win, primaries: 'all' }, { workers: 2 });
    const key = (o: ScreeningOutcome) => o.encounters.map((e) => ({ p: e.primary, s: e.secondary, tca: e.tca, miss: e.missKm }));
    expect(inThread.encounters.length).toBeGreaterThanOrEqual(5);
    expect(key(threaded)).toEqual(key(inThread));
  });
});

describe('shards: the union of N shards is the unsharded run', () => {
  it('N = 1, 2, 3, 7: every event in exactly one shard, nothing lost or added', async () => {
    const sets = denseShell(553, 300, 15);
    const win = settingsOf(START, START + 3 * HOUR, 10);
    const whole = await runScreening(sets, { ...win, primaries: 'all' }, { workers: 0 });
    const asKeys = (es: readonly Encounter[]) => es.map((e) => `${pairKey(e)}@${e.tca}:${e.missKm}`).sort();
    expect(whole.encounters.length).toBeGreaterThanOrEqual(20);
    for (const n of [1, 2, 3, 7]) {
      const shards: ScreeningOutcome[] = [];
      for (let k = 1; k <= n; k++) {
        shards.push(await runScreening(sets, { ...win, primaries: 'all', shard: { index: k, count: n } }, { workers: 0 }));
      }
      const union = shards.flatMap((s) => s.encounters);
      expect(asKeys(union), `N = ${n}`).toEqual(asKeys(whole.encounters));
      // each pair's events all come from one shard
      const shardOfPair = new Map<string, number>();
      shards.forEach((s, k) => {
        for (const e of s.encounters) {
          expect(shardOfPair.get(pairKey(e)) ?? k, `pair ${pairKey(e)} in two shards`).toBe(k);
          shardOfPair.set(pairKey(e), k);
        }
      });
      if (n > 1) expect(shards.filter((s) => s.encounters.length > 0).length, `N = ${n}: work is spread`).toBeGreaterThan(1);
    }
  });
});
