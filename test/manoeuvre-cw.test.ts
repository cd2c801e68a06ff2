/**
 * A small tangential impulse on a circular orbit against Clohessy & Wiltshire (1960), "Terminal
 * Guidance System for Satellite Rendezvous", J. Aerospace Sci. 27(9): with x radial, y along
 * track and an impulse Δv along the track at t = 0 from zero offset,
 *   x(t) = (2Δv/n)(1 − cos nt),   y(t) = (4Δv/n) sin nt − 3Δv·t.
 * Checked: the CW module (core/manoeuvre/clohessyWiltshire.ts, the general 6×6 solution), the
 * numerical integrator with J2 off (manoeuvred minus unmanoeuvred, in the unmanoeuvred orbit's
 * RTN frame), and the integrated STM's response, which for a circular two-body reference is
 * CW exactly.
 */
import { describe, expect, it } from 'vitest';
import { integrateBurnDifference } from '../core/manoeuvre/burnDifference.js';
import { rtnRows } from '../core/manoeuvre/burn.js';
import { cwImpulseResponse, cwOffsetRtnKm } from '../core/manoeuvre/clohessyWiltshire.js';
import { burnSensitivity, linearOffset } from '../core/manoeuvre/linearMap.js';
import { forceModel, TWO_BODY } from '../core/propagation/numerical/forceModel.js';
import { NumericalTrajectory } from '../core/propagation/numerical/numericalTrajectory.js';
import type { Instant } from '../core/time/instant.js';

const MU = TWO_BODY.mu;
const R_KM = 7000;
const N = Math.sqrt(MU / R_KM ** 3);
const PERIOD_S = (2 * Math.PI) / N;
const T0 = Date.UTC(2026, 11, 7) as Instant;
const DV_MS = 0.1;
const DV_KMS = DV_MS / 1000;
/** The CW module against the paper's closed form: same mathematics, so only rounding (km). */
const CW_FORM_TOL_KM = 1e-12;

const xCw = (t: number) => ((2 * DV_KMS) / N) * (1 - Math.cos(N * t));
const yCw = (t: number) => ((4 * DV_KMS) / N) * Math.sin(N * t) - 3 * DV_KMS * t;

describe('Clohessy–Wiltshire module', () => {
  it('tangential impulse: x(t), y(t) of the paper', () => {
    for (const f of [0.1, 0.25, 0.5, 1, 1.7, 3]) {
      const t = f * PERIOD_S;
      const s = cwImpulseResponse(N, t, [0, DV_KMS, 0]);
      expect(Math.abs(s[0]! - xCw(t))).toBeLessThan(CW_FORM_TOL_KM);
      expect(Math.abs(s[1]! - yCw(t))).toBeLessThan(CW_FORM_TOL_KM);
      expect(s[2]).toBe(0);
    }
  });
  it('offset at TCA from a state: n from the state\'s semi-major axis', () => {
    const v = Math.sqrt(MU / R_KM);
    const off = cwOffsetRtnKm([R_KM, 0, 0, 0, v, 0], 0.3 * PERIOD_S, [0, DV_MS, 0], MU);
    expect(off[0]).toBeCloseTo(xCw(0.3 * PERIOD_S), 12);
    expect(off[1]).toBeCloseTo(yCw(0.3 * PERIOD_S), 12);
  });
  it('radial offset peaks half an orbit after the burn and vanishes after a whole one', () => {
    expect(cwImpulseResponse(N, PERIOD_S / 2, [0, DV_KMS, 0])[0]).toBeCloseTo((4 * DV_KMS) / N, 12);
    expect(Math.abs(cwImpulseResponse(N, PERIOD_S, [0, DV_KMS, 0])[0]!)).toBeLessThan(CW_FORM_TOL_KM);
  });
});

describe('numerical integration (J2 off) against Clohessy–Wiltshire', () => {
  /**
   * CW is linear and rectilinear: the true relative motion differs at second order, chiefly by
   * the orbit's curvature (an along-track offset y puts the point y²/(2r) below the straight
   * T axis) and by terms ∝ (Δv/v)². Tolerance: y_max²/r, here 0.1 m/s over two orbits
   * (y_max = 3.5 km): 1.8 m, against a radial amplitude 4Δv/n = 0.36 km. Integration error
   * (< 1 mm) does not count at this scale.
   */
  const durationS = 2 * PERIOD_S;
  const yMax = 3 * DV_KMS * durationS + (4 * DV_KMS) / N;
  const NONLINEAR_TOL_KM = (yMax * yMax) / R_KM;

  it(`Δv = ${DV_MS} m/s in-track on a ${R_KM} km circular orbit, two orbits`, () => {
    const v = Math.sqrt(MU / R_KM), inc = 0.9;
    const s0 = [R_KM, 0, 0, 0, v * Math.cos(inc), v * Math.sin(inc)];
    const end = (T0 + durationS * 1000) as Instant;
    const d = integrateBurnDifference({
      stateAtBurn: s0,
      burn: { time: T0, deltaVRtnMs: [0, DV_MS, 0] },
      tableStart: T0,
      tableEnd: end,
      model: TWO_BODY,
      keepAbsolute: true,
    });
    const ref = new NumericalTrajectory('ref', d.unmanoeuvred!);
    const diff = new Float64Array(6), base = new Float64Array(6);
    let worst = 0;
    for (let k = 1; k <= 40; k++) {
      const t = (k / 40) * durationS;
      const at = (T0 + t * 1000) as Instant;
      d.difference.stateInto(at, diff, 0);
      ref.stateInto(at, base, 0);
      const [R, T] = rtnRows(base);
      const x = R[0] * diff[0]! + R[1] * diff[1]! + R[2] * diff[2]!;
      const y = T[0] * diff[0]! + T[1] * diff[1]! + T[2] * diff[2]!;
      worst = Math.max(worst, Math.abs(x - xCw(t)), Math.abs(y - yCw(t)));
    }
    expect(worst).toBeLessThan(NONLINEAR_TOL_KM);
    // And the check has teeth: the signal is hundreds of times the tolerance.
    expect((4 * DV_KMS) / N).toBeGreaterThan(100 * NONLINEAR_TOL_KM);
  });
});

describe('integrated STM against Clohessy–Wiltshire', () => {
  /** Circular two-body reference: the STM's response is CW exactly, up to integration error. */
  const STM_CW_REL_TOL = 1e-7;
  /** With J2 the in-plane frequency and the node move by ~1e-3 per orbit: where CW stops holding. */
  const J2_MIN_REL = 1e-4;
  const v = Math.sqrt(MU / R_KM), inc = 1.2;
  const s0 = [R_KM, 0, 0, 0, v * Math.cos(inc), v * Math.sin(inc)];
  for (const burn of [[0, 1, 0], [1, 0, 0], [0, 0, 1]] as const)
    it(`Δv along ${burn.join(',')} (RTN), 1.3 orbits`, () => {
      const dt = 1.3 * PERIOD_S;
      const response = (model: typeof TWO_BODY) => {
        const sens = burnSensitivity(model, s0, dt);
        const off = linearOffset(sens, [burn[0] * DV_MS, burn[1] * DV_MS, burn[2] * DV_MS]);
        const [R, T, Nn] = rtnRows(sens.stateAtTca);
        return [R, T, Nn].map((u) => u[0] * off[0]! + u[1] * off[1]! + u[2] * off[2]!);
      };
      const cw = cwImpulseResponse(N, dt, [burn[0] * DV_KMS, burn[1] * DV_KMS, burn[2] * DV_KMS]).slice(0, 3);
      const size = Math.hypot(...cw);
      const twoBody = response(TWO_BODY);
      expect(Math.hypot(...twoBody.map((c, i) => c - cw[i]!)) / size).toBeLessThan(STM_CW_REL_TOL);
      const j2 = response(forceModel({ zonalDegree: 2 }));
      expect(Math.hypot(...j2.map((c, i) => c - cw[i]!)) / size).toBeGreaterThan(J2_MIN_REL);
    });
});
