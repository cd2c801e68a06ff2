/**
 * The primary's exact ephemeris is kept on a grid and interpolated (cubic Hermite); the filters
 * pad with GRID_EPS_KM = 10 m for its error (core/screening/pairFilter.ts). Reference: SGP4
 * itself at random instants between grid points, for LEO, eccentric (GTO, Molniya-like) and GEO.
 */
import { describe, expect, it } from 'vitest';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { buildStateGrid, buildStateGridUntil, gridEnd, gridStepMs } from '../core/screening/primaryGrid.js';
import type { Trajectory } from '../core/propagation/trajectory.js';
import { elementSet } from './support/elements.js';
import type { Instant } from '../core/time/instant.js';

const START = Date.parse('2026-12-07T00:00:00.000Z') as Instant;
const DAY_MS = 86_400_000;
/** The filters' pad for the grid's interpolation error (pairFilter.ts GRID_EPS_KM). */
const GRID_EPS_KM = 0.01;

describe('primary grid interpolation error against SGP4', () => {
  const cases = [
    { name: 'LEO 400 km', n: 15.5, e: 0.0005, i: 51.6 },
    { name: 'LEO 550 km', n: 15.06, e: 0.0001, i: 53 },
    { name: 'GTO', n: 2.25, e: 0.73, i: 27 },
    { name: 'Molniya-like', n: 2.006, e: 0.72, i: 63.4 },
    { name: 'GEO', n: 1.0027, e: 0.0002, i: 0.05 },
  ];
  for (const c of cases) {
    it(`stays within GRID_EPS_KM for ${c.name}`, () => {
      const es = elementSet('1', START - DAY_MS / 2, {
        aKm: 0, e: c.e, iDeg: c.i, raanDeg: 40, argpDeg: 250, uDeg: 30, bstar: 1e-5, meanMotionRevPerDay: c.n,
      });
      const tr = new Sgp4Trajectory(es);
      const end = (START + 2 * DAY_MS) as Instant;
      const g = buildStateGrid(tr, START, end, gridStepMs(c.n, c.e));
      if ('failure' in g) throw new Error(g.failure);
      const exact = new Float64Array(6), interp = new Float64Array(3);
      let worst = 0;
      let rng = 7;
      for (let k = 0; k < 4000; k++) {
        rng = (rng * 1103515245 + 12345) % 2147483648;
        const t = START + (rng / 2147483648) * (end - START);
        tr.stateInto(t as Instant, exact, 0);
        g.positionInto(t, interp, 0);
        worst = Math.max(worst, Math.hypot(exact[0]! - interp[0]!, exact[1]! - interp[1]!, exact[2]! - interp[2]!));
      }
      expect(worst).toBeLessThan(GRID_EPS_KM);
    });
  }
});

describe('the grid of an object that stops propagating inside the window (buildStateGridUntil)', () => {
  /** SGP4 at 550 km, made to fail inside [failFrom, failTo) — like a decayed set between valid stretches. */
  const sgp4 = new Sgp4Trajectory(elementSet('1', START, { aKm: 0, e: 0.0001, iDeg: 53, raanDeg: 40, argpDeg: 250, uDeg: 30, meanMotionRevPerDay: 15.06 }));
  const failingBetween = (failFrom: number, failTo = Infinity): Trajectory => ({
    objectId: '1',
    span: null,
    stateInto: (t, out, off) => (t >= failFrom && t < failTo ? 'decayed' : sgp4.stateInto(t, out, off)),
  });
  const step = gridStepMs(15.06, 0.0001);

  it('ends exactly at the decay, with a step no longer than asked, for spans that are and are not whole steps', () => {
    // 1/3 of a step short of a whole number, a whole number (up to floating point), and a sliver past it.
    const cases: [number, number][] = [[97.66, 98], [97, 97], [97.000001, 98], [0.4, 1]]; // span in steps, steps expected
    for (const [steps, expected] of cases) {
      const until = START + steps * step;
      const r = buildStateGridUntil(failingBetween(until + 1), START, until, step);
      expect(r, `span ${steps} steps`).not.toBeNull();
      expect(r!.failure).toBeNull();
      expect(gridEnd(r!.grid)).toBeCloseTo(until, 3);
      expect(r!.grid.stepMs).toBeLessThanOrEqual(step + 1e-6); // (1 µs: rounding of the span, primaryGrid.ts)
      // no more points than a grid of the asked step needs (a whole number of steps counts as such)
      expect(r!.grid.count - 1, `span ${steps} steps`).toBe(expected);
    }
  });

  it('a point failing before the decay given ends the grid at the point before it, and says where it failed', () => {
    const until = START + 40 * step;
    const r = buildStateGridUntil(failingBetween(START + 25.5 * step, START + 27 * step), START, until, step);
    expect(r!.failure).toBe('decayed');
    expect(r!.failedAt).toBeCloseTo(START + 26 * step, 3);
    expect(r!.grid.count).toBe(26);
    expect(gridEnd(r!.grid)).toBeCloseTo(START + 25 * step, 3);
    // Nothing computable past the first step: no grid.
    expect(buildStateGridUntil(failingBetween(START + 0.5 * step), START, until, step)).toBeNull();
  });
});
