/**
 * Before any filter model is built, a pair is dismissed when the element sets' radius bands
 * (engine.ts coarseRadiusBand: a(1 ∓ e) padded) are more than D apart. The band must therefore
 * hold every radius SGP4 gives over the window. Reference: SGP4 itself (satellite.js, verified
 * against Vallado et al. 2006 in sgp4-verification.test.ts), sampled every minute over a week,
 * on the published verification element sets (real objects: near-Earth, deep-space, high drag,
 * Molniya, GEO) and on every population of the synthetic catalogue.
 */
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { coarseRadiusBand, objectFromElements } from '../core/screening/engine.js';
import { generateCatalog } from '../core/synthetic/catalog.js';
import type { Instant } from '../core/time/instant.js';
import { verificationSets } from './support/verificationSets.js';

const WEEK_MS = 7 * 86_400_000;
const MINUTE_MS = 60_000;

/** Radii outside the band over [start, start + a week), sampled every minute (SGP4 failures end the object). */
function outside(sets: readonly ElementSet[], startOf: (es: ElementSet) => number): { banded: number; bad: string[] } {
  const bad: string[] = [];
  const s = new Float64Array(6);
  let banded = 0;
  for (const es of sets) {
    const band = coarseRadiusBand(objectFromElements(es), WEEK_MS);
    if (!band) continue;
    banded++;
    const tr = new Sgp4Trajectory(es);
    const start = startOf(es);
    let lo = Infinity, hi = 0;
    for (let t = start; t <= start + WEEK_MS; t += MINUTE_MS) {
      if (tr.stateInto(t as Instant, s, 0)) break;
      const r = Math.hypot(s[0]!, s[1]!, s[2]!);
      lo = Math.min(lo, r);
      hi = Math.max(hi, r);
    }
    if (lo < band[0] || hi > band[1]) bad.push(`${es.objectId}: SGP4 radius ${lo.toFixed(1)}–${hi.toFixed(1)} km, band ${band[0].toFixed(1)}–${band[1].toFixed(1)} km`);
  }
  return { banded, bad };
}

describe('element-set radius band (before any model) against SGP4', () => {
  it('holds a week of SGP4 radii for the published verification sets', () => {
    const sets = verificationSets();
    expect(sets.length).toBe(33);
    const { banded, bad } = outside(sets, (es) => es.epoch);
    expect(banded).toBeGreaterThanOrEqual(10); // the others are refused a band (drag, eccentricity)
    expect(bad).toEqual([]);
  });

  it('holds a week of SGP4 radii for every population of the synthetic catalogue, a week after epoch', () => {
    const START = Date.parse('2026-12-07T00:00:00.000Z');
    const sets = generateCatalog({ size: 600, seed: 11, epoch: START as Instant });
    const { banded, bad } = outside(sets, () => START + WEEK_MS);
    expect(banded).toBeGreaterThan(500);
    expect(bad.slice(0, 10)).toEqual([]);
  });

  it('holds for near-Earth drag at the limits it accepts (perigee 300 km, |B*| 1e-3), over 8 days', () => {
    // A grid of worst cases built on a verification set's fields: the band's drag allowance
    // must cover them, or the band must refuse them.
    const base = verificationSets().find((es) => es.objectId === '88888')!;
    const MU = 398600.8, RE = 6378.135;
    const sets: ElementSet[] = [];
    for (const hp of [300, 350, 450, 600]) {
      for (const e of [0, 0.002, 0.02, 0.08]) {
        for (const bstar of [1e-4, 3e-4, 1e-3]) {
          for (const inc of [0, 51.6, 97.5]) {
            const a = (RE + hp) / (1 - e);
            const n = (Math.sqrt(MU / a ** 3) * 86_400) / (2 * Math.PI);
            sets.push({ ...base, objectId: `${hp}-${e}-${bstar}-${inc}`, meanMotionRevPerDay: n, eccentricity: e, bstar, inclinationDeg: inc });
          }
        }
      }
    }
    const { banded, bad } = outside(sets, (es) => es.epoch);
    expect(banded).toBe(sets.length);
    expect(bad.slice(0, 10)).toEqual([]);
  });

  it('gives no band for windows or drag beyond what its pad was sized for', () => {
    const es = verificationSets()[0]!;
    expect(coarseRadiusBand(objectFromElements(es), WEEK_MS)).not.toBeNull();
    expect(coarseRadiusBand(objectFromElements(es), 30 * 86_400_000)).toBeNull();
    expect(coarseRadiusBand(objectFromElements({ ...es, bstar: 0.002 }), WEEK_MS)).toBeNull();
  });
});
