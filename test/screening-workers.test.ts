/**
 * runScreening across worker counts, flagged objects and cancellation.
 *
 * References: DESIGN.md "Screening requirements" — results must not depend on how the work is
 * split (run.ts: "Results are sorted, so they do not depend on the worker count"); objects whose
 * propagation fails are flagged in the run, never fatal; long runs report progress and can be
 * cancelled. Element sets come from the seeded synthetic catalogue (core/synthetic/catalog.ts).
 */
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { runScreening, type ScreeningOutcome } from '../core/screening/run.js';
import type { ScreeningSettings } from '../core/screening/types.js';
import { generateCatalog } from '../core/synthetic/catalog.js';
import type { Instant } from '../core/time/instant.js';
import { elementSet, RE_WGS72 } from './support/elements.js';

const START = Date.UTC(2026, 11, 3, 6, 0, 0) as Instant;
const HOUR = 3_600_000;
const DAY = 86_400_000;
const at = (ms: number): Instant => ms as Instant;

const catalog = generateCatalog({ size: 3000, seed: 5, epoch: START });
/** Four primaries from the constellation shell (densest region: many encounters). */
const SHELL_PRIMARIES = catalog.filter((c) => c.name?.startsWith('SKEIN')).slice(0, 4).map((c) => c.objectId);

/** What must be identical between runs: ids, TCA and miss (exact: same arithmetic per pair). */
const key = (o: ScreeningOutcome) => o.encounters.map((e) => ({ p: e.primary, s: e.secondary, tca: e.tca, miss: e.missKm }));

describe('identical results for workers 0, 1 and 2', () => {
  it('fleet mode: 4 primaries vs 3000 objects, 1 day, 20 km', async () => {
    const settings: ScreeningSettings = {
      start: START,
      end: at(START + DAY),
      volume: { kind: 'sphere', radiusKm: 20 },
      primaries: SHELL_PRIMARIES,
    };
    const runs = [];
    for (const workers of [0, 1, 2]) runs.push(await runScreening(catalog, settings, { workers }));
    // Meaningful only with events, including primary–primary pairs if any.
    expect(runs[0]!.encounters.length).toBeGreaterThanOrEqual(20);
    for (const r of runs) expect(r.cancelled).toBe(false);
    expect(key(runs[1]!)).toEqual(key(runs[0]!));
    expect(key(runs[2]!)).toEqual(key(runs[0]!));
    expect(runs[1]!.flagged).toEqual(runs[0]!.flagged);
    expect(runs[2]!.flagged).toEqual(runs[0]!.flagged);
    // A pair of two primaries is screened once, whichever worker holds it.
    const pairs = runs[2]!.encounters.map((e) => `${[e.primary, e.secondary].sort().join('-')}@${e.tca}`);
    expect(new Set(pairs).size).toBe(pairs.length);
  });

  it('all-vs-all: 600 objects, 6 h, 10 km', async () => {
    const sets = catalog.slice(0, 600);
    const settings: ScreeningSettings = {
      start: START,
      end: at(START + 6 * HOUR),
      volume: { kind: 'sphere', radiusKm: 10 },
      primaries: 'all',
    };
    const runs = [];
    for (const workers of [0, 1, 2]) runs.push(await runScreening(sets, settings, { workers }));
    expect(runs[0]!.encounters.length).toBeGreaterThanOrEqual(10);
    expect(key(runs[1]!)).toEqual(key(runs[0]!));
    expect(key(runs[2]!)).toEqual(key(runs[0]!));
    // Each unordered pair and TCA once.
    const pairs = runs[0]!.encounters.map((e) => `${[e.primary, e.secondary].sort().join('-')}@${e.tca}`);
    expect(new Set(pairs).size).toBe(pairs.length);
  });
});

describe('flagged objects: reported with a reason, never fatal', () => {
  /*
   * Element sets that fail (found by propagating them with SGP4, satellite.js 7.1):
   *  - 90001: circular at ~220 km, B* = 0.05 — SGP4 fails (bad mean eccentricity, the decay
   *    signature) ~6.5 h after its epoch. Its radius band is far below the 550 km primaries, so
   *    it cannot approach them: it must still be flagged (DESIGN.md: "Objects whose propagation
   *    fails (decayed, bad elements) are flagged in the run");
   *  - 90002: perigee ~320 km, apogee ~810 km (crosses the 550 km shell), B* = 1 — fails ~12 h
   *    after its epoch;
   *  - 90003: eccentricity 1.2 — SGP4 refuses it at initialisation (bad mean eccentricity).
   * Epochs at the window start, window 1 day, so both decays fall inside the window.
   */
  const FAILURE = /decayed|eccentricity|semi-latus|mean-motion|bad-elements/;
  const bad: ElementSet[] = [
    elementSet('90001', START, { aKm: 6598, e: 0.0005, iDeg: 51.6, raanDeg: 10, argpDeg: 30, uDeg: 70, meanMotionRevPerDay: 16.2, bstar: 0.05 }),
    elementSet('90002', START, { aKm: 6945, e: 0.035, iDeg: 53, raanDeg: 10, argpDeg: 30, uDeg: 70, meanMotionRevPerDay: 15.0, bstar: 1.0 }),
    elementSet('90003', START, { aKm: RE_WGS72 + 550, e: 1.2, iDeg: 53, raanDeg: 10, argpDeg: 30, uDeg: 70, meanMotionRevPerDay: 15.0 }),
  ];
  const settings: ScreeningSettings = {
    start: START,
    end: at(START + DAY),
    volume: { kind: 'sphere', radiusKm: 20 },
    primaries: SHELL_PRIMARIES,
  };

  it('a set decaying across the primaries\' shell and one with eccentricity 1.2 are flagged; the other results are unchanged', async () => {
    const clean = await runScreening(catalog, settings, { workers: 0 });
    for (const workers of [0, 2]) {
      // All three failing sets are in the run; it must complete.
      const out = await runScreening([...catalog, ...bad], settings, { workers });
      expect(out.cancelled).toBe(false);
      const flagged = new Map(out.flagged.map((f) => [f.id, f.reason]));
      for (const id of ['90002', '90003']) {
        expect(flagged.has(id), `${id} flagged (workers ${workers})`).toBe(true);
        expect(flagged.get(id)).toMatch(FAILURE);
      }
      const others = out.encounters.filter((e) => !bad.some((b) => b.objectId === e.primary || b.objectId === e.secondary));
      expect(others.map((e) => [e.primary, e.secondary, e.tca, e.missKm])).toEqual(
        clean.encounters.map((e) => [e.primary, e.secondary, e.tca, e.missKm]),
      );
      // Never an encounter with an object that cannot be propagated at all.
      expect(out.encounters.some((e) => e.secondary === '90003' || e.primary === '90003')).toBe(false);
    }
  });

  it('a set that decays during the window far from every primary is flagged too', async () => {
    for (const workers of [0, 2]) {
      const out = await runScreening([...catalog, ...bad], settings, { workers });
      const flagged = new Map(out.flagged.map((f) => [f.id, f.reason]));
      expect(flagged.has('90001'), `90001 flagged (workers ${workers})`).toBe(true);
      expect(flagged.get('90001')).toMatch(FAILURE);
    }
  });

  it('a failing primary is flagged; the other primaries are still screened', async () => {
    const sets = [...catalog, ...bad];
    for (const workers of [0, 2]) {
      const out = await runScreening(sets, { ...settings, primaries: [SHELL_PRIMARIES[0]!, '90002', '90003'] }, { workers });
      expect(out.cancelled).toBe(false);
      const flagged = new Map(out.flagged.map((f) => [f.id, f.reason]));
      expect(flagged.get('90002')).toMatch(FAILURE);
      expect(flagged.get('90003')).toMatch(FAILURE);
      expect(out.encounters.filter((e) => e.primary === SHELL_PRIMARIES[0]).length).toBeGreaterThan(0);
    }
  });
});

describe('cancellation through AbortSignal', () => {
  it('aborting a long run in workers returns promptly with cancelled: true', async () => {
    // All-vs-all 3000 objects over a day: far longer than the time to the first progress report.
    const ac = new AbortController();
    let abortedAt = 0;
    let total = 0;
    const t0 = performance.now();
    const out = await runScreening(
      catalog,
      { start: START, end: at(START + DAY), volume: { kind: 'sphere', radiusKm: 5 }, primaries: 'all' },
      {
        workers: 2,
        signal: ac.signal,
        onProgress: (done, n) => {
          total = n;
          if (done > 0 && !abortedAt) {
            abortedAt = performance.now();
            ac.abort();
          }
        },
      },
    );
    expect(abortedAt).toBeGreaterThan(0);
    expect(out.cancelled).toBe(true);
    expect(total).toBe(catalog.length);
    // Stops within one unit of work per worker (one primary against the catalogue: well under
    // 10 s on a loaded 2-core machine), not after the whole run.
    expect(performance.now() - abortedAt).toBeLessThan(10_000);
    expect(performance.now() - t0).toBeLessThan(60_000);
  });

  for (const workers of [0, 2]) {
    it(`a signal already aborted before the run starts gives cancelled: true (workers ${workers})`, async () => {
      const ac = new AbortController();
      ac.abort();
      const out = await runScreening(
        catalog,
        { start: START, end: at(START + DAY), volume: { kind: 'sphere', radiusKm: 20 }, primaries: SHELL_PRIMARIES },
        { workers, signal: ac.signal },
      );
      expect(out.cancelled).toBe(true);
    });
  }
});
