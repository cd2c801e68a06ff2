/**
 * The manoeuvred trajectory (core/manoeuvre/manoeuvredTrajectory.ts): SGP4 before the burn;
 * SGP4 + (integrated manoeuvred − integrated unmanoeuvred) from the burn on.
 *
 * Reference for the difference: two independent NumericalTrajectory propagations (separate
 * integrations with their own step sequences) from the SGP4 state at the burn, with and without
 * Δv, differenced here. Both at rtol 1e-13: their own errors are ≪ 1 mm over three orbits.
 */
import { describe, expect, it } from 'vitest';
import { applyBurn, deltaVTemeKmS, rtnRows } from '../core/manoeuvre/burn.js';
import { integrateBurnDifference } from '../core/manoeuvre/burnDifference.js';
import { ManoeuvredTrajectory } from '../core/manoeuvre/manoeuvredTrajectory.js';
import { sampleTrajectory } from '../core/manoeuvre/sampleTrajectory.js';
import { dragFromBstar } from '../core/propagation/numerical/ballistic.js';
import { forceModel } from '../core/propagation/numerical/forceModel.js';
import { NumericalTrajectory } from '../core/propagation/numerical/numericalTrajectory.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import type { Instant } from '../core/time/instant.js';
import { elementSet } from './support/elements.js';

const T0 = Date.UTC(2026, 11, 7, 3, 0, 0) as Instant;
const BURN = (T0 + 3_600_000) as Instant;
const END = (BURN + 3 * 5_700_000) as Instant;
const DV: readonly [number, number, number] = [0.03, -0.12, 0.05]; // m/s, RTN
const es = elementSet('41', T0, { aKm: 6900, e: 0.0012, iDeg: 97.6, raanDeg: 120, argpDeg: 80, uDeg: 33, bstar: 2.2e-4 });
const sgp4 = new Sgp4Trajectory(es);
const model = forceModel({ drag: dragFromBstar(es.bstar) });
const TIGHT = { rtol: 1e-13, atol: 1e-12 };
/** Independent integrations differ by their own errors, ≪ 1 mm here; tables add ≈ 0.15 mm. */
const DIFF_TOL_KM = 1e-6;
const DIFF_VEL_TOL_KMS = 1e-8;

const stateAtBurn = new Float64Array(6);
sgp4.stateInto(BURN, stateAtBurn, 0);
const d = integrateBurnDifference({
  stateAtBurn,
  burn: { time: BURN, deltaVRtnMs: DV },
  tableStart: BURN,
  tableEnd: END,
  model,
  control: TIGHT,
});
const traj = new ManoeuvredTrajectory(sgp4, { time: BURN, deltaVRtnMs: DV }, d.difference);

describe('ManoeuvredTrajectory', () => {
  it('is SGP4 exactly before the burn', () => {
    const a = new Float64Array(6), b = new Float64Array(6);
    for (const t of [T0, BURN - 60_000, BURN - 1]) {
      expect(traj.stateInto(t as Instant, a, 0)).toBeNull();
      sgp4.stateInto(t as Instant, b, 0);
      expect([...a]).toEqual([...b]);
    }
  });

  it('at the burn: same position, velocity plus Δv turned from RTN into TEME', () => {
    const a = new Float64Array(6);
    traj.stateInto(BURN, a, 0);
    const dv = deltaVTemeKmS(stateAtBurn, DV);
    for (let i = 0; i < 3; i++) {
      expect(a[i]).toBeCloseTo(stateAtBurn[i]!, 12);
      expect(a[3 + i]).toBeCloseTo(stateAtBurn[3 + i]! + dv[i]!, 12);
    }
    // The RTN rows are orthonormal and Δv keeps its size (a rotation).
    const [R, T, N] = rtnRows(stateAtBurn);
    expect(R[0] * T[0] + R[1] * T[1] + R[2] * T[2]).toBeCloseTo(0, 14);
    expect(T[0] * N[0] + T[1] * N[1] + T[2] * N[2]).toBeCloseTo(0, 14);
    expect(Math.hypot(...dv) * 1000).toBeCloseTo(Math.hypot(...DV), 12);
    // T is along the velocity for a near-circular orbit: an in-track burn raises the speed.
    const post = applyBurn(stateAtBurn, [0, 1, 0]);
    expect(Math.hypot(post[3]!, post[4]!, post[5]!)).toBeGreaterThan(Math.hypot(stateAtBurn[3]!, stateAtBurn[4]!, stateAtBurn[5]!));
  });

  it('after the burn: SGP4 plus the difference of two independent integrations', () => {
    const plain = NumericalTrajectory.propagate('a', BURN, stateAtBurn, END, model, { control: TIGHT });
    const burned = NumericalTrajectory.propagate('b', BURN, applyBurn(stateAtBurn, DV), END, model, { control: TIGHT });
    const m = new Float64Array(6), s = new Float64Array(6), p = new Float64Array(6), q = new Float64Array(6);
    for (const f of [0.01, 0.137, 0.5, 0.618, 0.9, 1]) {
      const t = (BURN + f * (END - BURN)) as Instant;
      expect(traj.stateInto(t, m, 0)).toBeNull();
      sgp4.stateInto(t, s, 0);
      plain.stateInto(t, p, 0);
      burned.stateInto(t, q, 0);
      const pos = [0, 1, 2].map((i) => m[i]! - s[i]! - (q[i]! - p[i]!));
      const vel = [3, 4, 5].map((i) => m[i]! - s[i]! - (q[i]! - p[i]!));
      expect(Math.hypot(...pos)).toBeLessThan(DIFF_TOL_KM);
      expect(Math.hypot(...vel)).toBeLessThan(DIFF_VEL_TOL_KMS);
    }
  });

  it('says outside-ephemeris after the tabulated span, and reports that span', () => {
    const a = new Float64Array(6);
    expect(traj.stateInto((END + 1) as Instant, a, 0)).toBe('outside-ephemeris');
    expect(traj.span.end).toBe(END);
    expect(traj.span.start).toBe(-Infinity);
  });

  it('sampleTrajectory starts at the burn (post-burn state) and ends exactly at the end', () => {
    const samples = sampleTrajectory(traj, BURN, END, 60);
    expect(samples[0]!.t).toBe(BURN);
    expect(samples[samples.length - 1]!.t).toBe(END);
    // 285 whole minutes: samples at 0, 1, …, 285 min.
    expect(samples.length).toBe(286);
    const uneven = sampleTrajectory(traj, BURN, (END - 30_000) as Instant, 60);
    expect(uneven.length).toBe(286); // 0 … 284 min, then the end at 284.5 min
    expect(uneven[uneven.length - 1]!.t).toBe(END - 30_000);
    const a = new Float64Array(6);
    traj.stateInto(BURN, a, 0);
    expect([...samples[0]!.state]).toEqual([...a]);
    expect(() => sampleTrajectory(traj, BURN, (END + 120_000) as Instant, 60)).toThrow(/outside-ephemeris/);
  });
});

describe('displacement bound for screening filters', () => {
  it('bounds |manoeuvred − SGP4| at every instant sampled', () => {
    const a = new Float64Array(6), b = new Float64Array(6);
    let worst = 0;
    for (let t: number = BURN; t <= END; t += 7_000) {
      traj.stateInto(t as Instant, a, 0);
      sgp4.stateInto(t as Instant, b, 0);
      worst = Math.max(worst, Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!));
    }
    expect(worst).toBeLessThanOrEqual(traj.maxDisplacementKm);
    // and is not loose: the pad (h²/8)·max|δa| is a few tens of metres here
    expect(traj.maxDisplacementKm).toBeLessThan(worst + 0.05);
  });
});
