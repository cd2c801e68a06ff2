/**
 * The spatial index's pads (core/screening/spatial), checked against SGP4 itself and on
 * straight lines placed on the edges of cells and time steps.
 *
 * Sources: the remainder of two-point cubic Hermite interpolation, |f − H| ≤ h⁴/384·max|f⁗|
 * (standard numerical analysis, e.g. Burden & Faires, Numerical Analysis, §3.4 — from memory);
 * Taylor's theorem with remainder for the motion within a step; SGP4 of satellite.js 7.1 as the
 * trajectory (verified against Vallado et al. 2006 in sgp4-verification.test.ts). Catalogues
 * come from the seeded synthetic generator (core/synthetic/catalog.ts), every family included.
 */
import { describe, expect, it } from 'vitest';
import { generateCatalog } from '../core/synthetic/catalog.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { StraightLineTrajectory } from '../core/propagation/straightLine.js';
import { BlockTracks } from '../core/screening/spatial/blockTracks.js';
import { broadPhase, FAST_SHARE, indexCellKm, indexLayout, stepPads } from '../core/screening/spatial/broadPhase.js';
import { HALF_NEIGHBOUR_ROWS, SortedCells } from '../core/screening/spatial/sortedCells.js';
import { CandidateList } from '../core/screening/spatial/candidates.js';
import { samplingPlan } from '../core/screening/spatial/sampling.js';
import { Rng } from '../core/synthetic/random.js';
import type { Instant } from '../core/time/instant.js';

const START = Date.UTC(2026, 11, 3, 6, 0, 0);
const STEP_MS = 20_000;

/** Meeting points inside a cell of side C (km), near one of its faces, edges and corners. */
const cellPlaces = (C: number): [string, [number, number, number]][] => [
  ['face', [30 * C, 0.4 * C, 0.3 * C]],
  ['edge', [30 * C, 2 * C, 0.5 * C]],
  ['corner', [30 * C, 2 * C, -3 * C]],
];

describe('interpolation and in-step motion pads hold against SGP4', () => {
  it('|SGP4 − Hermite| ≤ E and |SGP4 − (p + w·τ)| ≤ q at random instants, every family', () => {
    const sets = generateCatalog({ size: 1200, seed: 11, epoch: START as Instant });
    const trs = sets.map((s) => new Sgp4Trajectory(s));
    const plans = sets.map((s) => samplingPlan(s.meanMotionRevPerDay, s.eccentricity));
    const members = Int32Array.from(sets.map((_, i) => i));
    const t0 = START + 3 * 3_600_000, t1 = t0 + 3_600_000;
    const tracks = new BlockTracks(t0, t1, trs, plans, members);
    const q = stepPads(tracks, [...members], STEP_MS);
    const rng = new Rng(7);
    const truth = new Float64Array(6), interp = new Float64Array(6), mid = new Float64Array(6);
    let worstE = 0, worstQ = 0, worstEKm = 0;
    const byFamily = new Map<string, number>();
    for (let i = 0; i < trs.length; i++) {
      expect(tracks.ok[i], sets[i]!.objectId).toBe(1);
      for (let s = 0; s < 30; s++) {
        const t = rng.uniform(t0, t1);
        expect(trs[i]!.stateInto(t as Instant, truth, 0)).toBeNull();
        tracks.stateInto(i, t, interp, 0);
        const err = Math.hypot(truth[0]! - interp[0]!, truth[1]! - interp[1]!, truth[2]! - interp[2]!);
        worstE = Math.max(worstE, err / tracks.epsKm[i]!);
        worstEKm = Math.max(worstEKm, err);
        // in-step motion: centre of a step, a random offset within ±Δ/2
        const k = Math.floor((t - START) / STEP_MS);
        const tc = START + (k + 0.5) * STEP_MS;
        if (tc < t0 || tc > t1) continue;
        tracks.stateInto(i, tc, mid, 0);
        const tau = (t - tc) / 1000;
        const lin = Math.hypot(truth[0]! - mid[0]! - mid[3]! * tau, truth[1]! - mid[1]! - mid[4]! * tau, truth[2]! - mid[2]! - mid[5]! * tau);
        const ratio = lin / q[i]!;
        worstQ = Math.max(worstQ, ratio);
        const fam = (sets[i]!.name ?? '').split(/[ -]/)[0]!;
        byFamily.set(fam, Math.max(byFamily.get(fam) ?? 0, ratio));
      }
    }
    console.log(
      `spatial pads: worst |SGP4 − Hermite| = ${(worstEKm * 1000).toFixed(1)} m, ${(worstE * 100).toFixed(1)} % of E; ` +
        `worst in-step deviation ${(worstQ * 100).toFixed(1)} % of q; by family ${JSON.stringify(Object.fromEntries(byFamily))}`,
    );
    expect(worstE).toBeLessThan(1);
    expect(worstQ).toBeLessThan(1);
  });
});

describe('the broad phase\'s cursor over the tracks', () => {
  it('gives the same doubles as stateInto, at instants in any order (interval changes both ways)', () => {
    // TrackCursor keeps each object's current interval and reloads it on change; a stale
    // interval would show as a different double here.
    const sets = generateCatalog({ size: 300, seed: 12, epoch: START as Instant });
    const trs = sets.map((s) => new Sgp4Trajectory(s));
    const plans = sets.map((s) => samplingPlan(s.meanMotionRevPerDay, s.eccentricity));
    const members = Int32Array.from(sets.map((_, i) => i).filter((i) => i % 3 !== 1));
    const t0 = START + 3_600_000, t1 = t0 + 3_600_000;
    const tracks = new BlockTracks(t0, t1, trs, plans, Int32Array.from(sets.map((_, i) => i)));
    const cursor = tracks.cursor(members);
    const n = members.length;
    const out = Array.from({ length: 6 }, () => new Float64Array(n));
    const one = new Float64Array(6);
    const rng = new Rng(5);
    const instants = [t0, t1, ...Array.from({ length: 40 }, () => rng.uniform(t0, t1)), t0 + 600_000, t0 + 600_001, t0];
    let compared = 0;
    for (const t of instants) {
      cursor.statesAt(t, out[0]!, out[1]!, out[2]!, out[3]!, out[4]!, out[5]!);
      for (let k = 0; k < n; k++) {
        tracks.stateInto(members[k]!, t, one, 0);
        for (let c = 0; c < 6; c++) expect(out[c]![k], `object ${members[k]} at ${t}`).toBe(one[c]);
        compared++;
      }
    }
    expect(compared).toBe(instants.length * n);
  });
});

describe('pairs that meet only at the edge of a cell or a time step are candidates', () => {
  // Straight lines: the Hermite interpolant is exact and the in-step motion is linear, so the
  // only pads at work are the cell geometry and the step bounds. D = 5 km, miss 0.999·D.
  const D = 5;
  const meet = (tcaMs: number, where: [number, number, number], missDir: [number, number, number], vA: number[], vB: number[]) => {
    const miss = 0.999 * D;
    const n = Math.hypot(...missDir);
    const m = missDir.map((x) => (x / n) * miss);
    const tcaS = (tcaMs - START) / 1000;
    // A passes through `where` at TCA, B through where + miss; positions given at START.
    const a = new StraightLineTrajectory('A', START as Instant, [where[0] - vA[0]! * tcaS, where[1] - vA[1]! * tcaS, where[2] - vA[2]! * tcaS], vA as [number, number, number]);
    const b = new StraightLineTrajectory(
      'B', START as Instant,
      [where[0] + m[0]! - vB[0]! * tcaS, where[1] + m[1]! - vB[1]! * tcaS, where[2] + m[2]! - vB[2]! * tcaS],
      vB as [number, number, number],
    );
    return [a, b];
  };

  it('on step boundaries and cell faces, edges and corners, head-on and slow', () => {
    const plan = samplingPlan(15.2, 0.0005);
    const steps = 90; // 30 min
    const end = START + steps * STEP_MS;
    // Cell size of this block: a probe pair sets the speeds (same speeds for every case).
    const probe = meet(START + 600_000, [7000, 0, 0], [0, 0, 1], [0, 7.6, 0], [0, -7.6, 0]);
    const probeTracks = new BlockTracks(START, end, probe, [plan, plan], Int32Array.from([0, 1]));
    const C = indexCellKm(probeTracks, [0, 1], { start: START, stepMs: STEP_MS, dKm: D });
    const cases: { label: string; k: number; dt: number; where: [number, number, number]; missDir: [number, number, number]; vA: number[]; vB: number[] }[] = [];
    for (const [name, where] of cellPlaces(C)) {
      for (const dt of [0, -1, 1, STEP_MS / 2]) {
        // the miss vector straddles the cell boundary (towards −x, −y, −z)
        cases.push({ label: `${name}, TCA at step edge ${dt} ms, head-on`, k: 40, dt, where, missDir: [-1, -1, -1], vA: [0, 7.6, 0.5], vB: [0, -7.5, -0.4] });
        cases.push({ label: `${name}, TCA at step edge ${dt} ms, slow`, k: 41, dt, where, missDir: [-1, -0.5, -0.2], vA: [0, 7.6, 0], vB: [0.002, 7.601, 0] });
        cases.push({ label: `${name}, TCA at step edge ${dt} ms, crossing`, k: 42, dt, where, missDir: [-0.2, -1, 1], vA: [0, 7.6, 0], vB: [0, 0, 7.6] });
      }
    }
    for (const c of cases) {
      const tca = START + c.k * STEP_MS + c.dt;
      const [a, b] = meet(tca, c.where, c.missDir, c.vA, c.vB);
      const tracks = new BlockTracks(START, end, [a!, b!], [plan, plan], Int32Array.from([0, 1]));
      const cK = indexCellKm(tracks, [0, 1], { start: START, stepMs: STEP_MS, dKm: D });
      const out = new CandidateList();
      const stats = { steps: 0, objectSteps: 0, pairTests: 0, candidates: 0 };
      broadPhase(tracks, new SortedCells(2), { start: START, stepMs: STEP_MS, dKm: D }, 0, steps, () => true, out, stats, () => false);
      const found = [...out.take().k];
      // The step holding the TCA must be a candidate (both steps when the TCA is on their edge).
      const kT = Math.floor((tca - START) / STEP_MS);
      const want = (tca - START) % STEP_MS === 0 ? [kT - 1, kT] : [kT];
      expect(found, `${c.label}; cell ${cK.toFixed(1)} km`).toEqual(expect.arrayContaining(want));
      // The two objects really sit in different cells at that step (else the case tests nothing).
      const st = new Float64Array(12);
      const tc = START + (kT + 0.5) * STEP_MS;
      a!.stateInto(tc as Instant, st, 0);
      b!.stateInto(tc as Instant, st, 6);
      const cellOf = (o: number) => [0, 1, 2].map((x) => Math.floor(st[o + x]! / cK)).join(',');
      if (c.dt === 0 && c.label.startsWith('corner') && c.label.endsWith('head-on')) expect(cellOf(0)).not.toBe(cellOf(6));
    }
    // And a pass outside D + pads is no candidate: the filter does filter.
    const [a, b] = meet(START + 40 * STEP_MS, [7000, 0, 0], [0, 0, 1], [0, 7.6, 0], [0, -7.6, 0]);
    const far = new StraightLineTrajectory('F', START as Instant, [b!.r0[0], b!.r0[1], b!.r0[2] + 20], b!.v);
    const tracks = new BlockTracks(START, end, [a!, far], [plan, plan], Int32Array.from([0, 1]));
    const out = new CandidateList();
    broadPhase(tracks, new SortedCells(2), { start: START, stepMs: STEP_MS, dKm: D }, 0, steps, () => true, out, { steps: 0, objectSteps: 0, pairTests: 0, candidates: 0 }, () => false);
    expect(out.length).toBe(0);
  });
});

describe('fast objects find partners further than one cell away', () => {
  // The cells are sized for all but the fastest FAST_SHARE of a block's objects; a fast object
  // (here 11 km/s among 7.6 km/s ones) looks L cells away. Straight lines, as above: the pads at
  // work are the cell geometry, the step bounds and L. D = 5 km, miss 0.999·D.
  const D = 5;
  const plan = samplingPlan(15.2, 0.0005);
  const steps = 90;
  const end = START + steps * STEP_MS;
  const line = (id: string, r: [number, number, number], v: [number, number, number]) => new StraightLineTrajectory(id, START as Instant, r, v);
  /** Slow objects on parallel lines 400 km apart, far from the meetings, a little faster than A: they set the cell size. */
  const fillers = Array.from({ length: 250 }, (_, n) => line(`S${n}`, [-20000 + 400 * (n % 16), -20000 + 400 * Math.floor(n / 16), 3000], [0, 7.7, 0]));
  /** x passes `where` at tca, y passes where + miss at tca. */
  const pair = (ids: [string, string], tca: number, where: [number, number, number], missDir: [number, number, number], vx: [number, number, number], vy: [number, number, number]) => {
    const n = Math.hypot(...missDir);
    const t = (tca - START) / 1000;
    return [
      line(ids[0], [where[0] - vx[0] * t, where[1] - vx[1] * t, where[2] - vx[2] * t], vx),
      line(ids[1], [0, 1, 2].map((c) => where[c]! + (missDir[c]! / n) * 0.999 * D - vy[c]! * t) as [number, number, number], vy),
    ];
  };

  it('slow–fast and fast–fast meetings on step edges and cell faces, edges and corners', () => {
    const probe = [...fillers, line('F', [0, 0, 0], [0, -11, 0])];
    const probeTracks = new BlockTracks(START, end, probe, probe.map(() => plan), Int32Array.from(probe.map((_, i) => i)));
    const layout0 = indexLayout(probeTracks, probe.map((_, i) => i), { start: START, stepMs: STEP_MS, dKm: D });
    const C = layout0.cellKm;
    let furtherThanOneCell = 0, cases = 0;
    for (const [place, where] of cellPlaces(C)) {
      for (const dt of [0, -1, 1, STEP_MS / 2]) {
        for (const [kind, vx, vy] of [
          ['slow–fast head-on', [0, 7.6, 0.3], [0, -11, -0.2]],
          ['fast–fast head-on', [0.1, 11, 0], [0, -11, 0.1]],
          ['slow–fast crossing', [0, 7.6, 0], [11, 0, 0]],
        ] as [string, [number, number, number], [number, number, number]][]) {
          const k = 40;
          const tca = START + k * STEP_MS + dt;
          const ids: [string, string] = kind.startsWith('fast–fast') ? ['F1', 'F2'] : ['A', 'F'];
          const objects = [...fillers, ...pair(ids, tca, where, [-1, -1, -1], vx, vy)];
          const members = objects.map((_, i) => i);
          const tracks = new BlockTracks(START, end, objects, objects.map(() => plan), Int32Array.from(members));
          const layout = indexLayout(tracks, members, { start: START, stepMs: STEP_MS, dKm: D });
          const label = `${kind}, ${place}, TCA at step edge ${dt} ms; cell ${layout.cellKm.toFixed(1)} km, L ${layout.fastReachCells}`;
          // the 11 km/s objects are the fast ones, and only they
          const fastIds = members.filter((i) => layout.fast[i] === 1).map((i) => objects[i]!.objectId);
          expect(fastIds, label).toEqual(ids.filter((id) => id.startsWith('F')));
          expect(layout.fastReachCells, label).toBe(2);
          const out = new CandidateList();
          broadPhase(tracks, new SortedCells(objects.length), { start: START, stepMs: STEP_MS, dKm: D }, 0, steps, () => true, out, { steps: 0, objectSteps: 0, pairTests: 0, candidates: 0 }, () => false);
          const got = out.take();
          const x = objects.length - 2, y = objects.length - 1;
          const found = [...got.k].filter((_, c) => got.i[c] === x && got.j[c] === y);
          const kT = Math.floor((tca - START) / STEP_MS);
          const want = (tca - START) % STEP_MS === 0 ? [kT - 1, kT] : [kT];
          expect(found, label).toEqual(expect.arrayContaining(want));
          // no candidate among the fillers, and each candidate once per step
          expect(got.i.length, label).toBe(new Set([...got.k].map((kk, c) => `${got.i[c]}-${got.j[c]}-${kk}`)).size);
          expect([...got.i].every((i) => i >= x), label).toBe(true);
          // how far apart their cells are at the step centre (the cases must need L = 2)
          const st = new Float64Array(12);
          for (const kk of want) {
            const tc = START + (kk + 0.5) * STEP_MS;
            objects[x]!.stateInto(tc as Instant, st, 0);
            objects[y]!.stateInto(tc as Instant, st, 6);
            const apart = Math.max(...[0, 1, 2].map((c) => Math.abs(Math.floor(st[c]! / layout.cellKm) - Math.floor(st[6 + c]! / layout.cellKm))));
            if (apart >= 2) furtherThanOneCell++;
          }
          cases++;
        }
      }
    }
    expect(cases).toBe(36);
    // a good part of the meetings are two cells apart at the step centre: one-cell neighbourhoods would miss them
    expect(furtherThanOneCell).toBeGreaterThanOrEqual(4);
    expect(FAST_SHARE * fillers.length).toBeGreaterThanOrEqual(2);
  });
});

describe('neighbour rows of the sorted cells', () => {
  it('cover exactly the 13 cells of a half neighbourhood, each once', () => {
    // Key layout of sortedCells.ts: x·2²⁰ + y·2¹⁰ + z. The half neighbourhood: the 26 neighbours
    // with (dx, dy, dz) lexicographically positive — one of each ± pair.
    const key = (dx: number, dy: number, dz: number) => dx * (1 << 20) + dy * (1 << 10) + dz;
    const want: number[] = [];
    for (let dx = -1; dx <= 1; dx++)
      for (let dy = -1; dy <= 1; dy++)
        for (let dz = -1; dz <= 1; dz++) {
          if (dx === 0 && dy === 0 && dz === 0) continue;
          if (dx > 0 || (dx === 0 && (dy > 0 || (dy === 0 && dz > 0)))) want.push(key(dx, dy, dz));
        }
    const got = HALF_NEIGHBOUR_ROWS.flatMap((r) => Array.from({ length: 2 - r.dzFrom }, (_, m) => r.base + r.dzFrom + m));
    expect(got.length).toBe(13);
    expect([...got].sort((a, b) => a - b)).toEqual([...want].sort((a, b) => a - b));
    // and the opposite of each is not there (each unordered pair of cells once)
    for (const d of got) expect(got).not.toContain(-d);
  });
});
