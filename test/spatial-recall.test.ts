/**
 * All-vs-all through the spatial index (core/screening/spatial) against
 *  1. the brute-force reference (test/support/bruteForce.ts: every object every second, every
 *     sampled minimum refined), and
 *  2. the pair-by-pair engine (ScreeningChunk.screenAllPairs: every pair through the orbit-model
 *     filters of engine.ts), event for event on the same inputs;
 * on a dense shell near 550 km: random planes (±5 km in altitude), nearly coplanar groups (same
 * plane, a few km apart in altitude and a fraction of a degree in phase: slow overtaking passes)
 * and crossing planes. Requirements (DESIGN.md "Screening requirements"): recall 100 %, TCA
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
