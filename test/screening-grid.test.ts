/**
 * The primary's exact ephemeris is kept on a grid and interpolated (cubic Hermite); the filters
 * pad with GRID_EPS_KM = 10 m for its error (core/screening/pairFilter.ts). Reference: SGP4
 * itself at random instants between grid points, for LEO, eccentric (GTO, Molniya-like) and GEO.
 */
import { describe, expect, it } from 'vitest';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { buildStateGrid, gridStepMs } from '../core/screening/primaryGrid.js';
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
