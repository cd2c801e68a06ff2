/**
 * The numerical propagator (Dormand–Prince 5(4), core/propagation/numerical) against closed
 * forms and SGP4.
 *
 * - Two-body (J2 off) against Kepler's equation, solved here by Newton iteration (Vallado,
 *   Fundamentals of Astrodynamics and Applications, §2.2 — KepEqtnE), over one day.
 * - Energy v²/2 − μ/r and angular momentum r×v conserved (two-body).
 * - J2 on: the secular node rate against dΩ/dt = −(3/2) n J2 (R/p)² cos i (Vallado §9.6).
 * - Against SGP4 (core/propagation/sgp4.ts) over short arcs from the same state.
 * - Dense output and the tabulated trajectory against an integration stopped exactly there.
 */
import { describe, expect, it } from 'vitest';
import { DormandPrince } from '../core/propagation/numerical/dormandPrince.js';
import { dragFromBstar } from '../core/propagation/numerical/ballistic.js';
import { forceModel, TWO_BODY } from '../core/propagation/numerical/forceModel.js';
import { ORBIT_STEP_CONTROL } from '../core/propagation/numerical/integrateOnGrid.js';
import { NumericalTrajectory, stateDerivative } from '../core/propagation/numerical/numericalTrajectory.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import type { Instant } from '../core/time/instant.js';
import { elementSet } from './support/elements.js';

const MU = TWO_BODY.mu;
const DAY_S = 86_400;
const T0 = Date.UTC(2026, 11, 3, 4, 5, 6) as Instant;
/**
 * Requirement stated in integrateOnGrid.ts for ORBIT_STEP_CONTROL: ≤ 0.1 m per day of position
 * error (measured 1–2.5 cm; the global error of a 5th-order method grows about linearly here).
 */
const KEPLER_DAY_TOL_KM = 1e-4;
/**
 * Energy and |h| drift over a day, relative: a 2.5 cm along-track error means δa/a ≈ 3e-11, so
 * energy drifts by about that; 1e-10 leaves margin yet fails on any real integration fault.
 */
const CONSERVATION_TOL = 1e-10;
/**
 * First-order J2 theory vs a full integration: the formula wants mean elements and we feed the
 * orbit-averaged osculating a and the initial e, i (their short-period parts are ~J2 (R/a)² ≈
 * 1e-3 relative, ×3.5 in the rate), and second-order J2² terms are ~1e-3: 1 % covers both.
 */
const NODE_RATE_REL_TOL = 0.01;

function kepler(a: number, e: number, tS: number): [number, number] {
  const n = Math.sqrt(MU / a ** 3);
  const M = n * tS;
  let E = M;
  for (let k = 0; k < 50; k++) E -= (E - e * Math.sin(E) - M) / (1 - e * Math.cos(E));
  return [a * (Math.cos(E) - e), a * Math.sqrt(1 - e * e) * Math.sin(E)];
}

/** Perigee state in the x-y plane: perifocal frame = TEME, so Kepler's x, y compare directly. */
function perigeeState(a: number, e: number): number[] {
  const rp = a * (1 - e);
  return [rp, 0, 0, 0, Math.sqrt((MU * (1 + e)) / rp), 0];
}

describe('two-body integration against Kepler\'s equation', () => {
  for (const [a, e] of [[7000, 0.001], [7200, 0.1], [26000, 0.7]] as const)
    it(`a = ${a} km, e = ${e}: within 0.1 m after one day`, () => {
      const ode = new DormandPrince(stateDerivative(TWO_BODY), 0, perigeeState(a, e), ORBIT_STEP_CONTROL);
      while (ode.step(DAY_S));
      const [x, y] = kepler(a, e, DAY_S);
      expect(Math.hypot(ode.y[0]! - x, ode.y[1]! - y, ode.y[2]!)).toBeLessThan(KEPLER_DAY_TOL_KM);
    });

  it('conserves energy and angular momentum over a day', () => {
    const s0 = perigeeState(7000, 0.001);
    const inc = 1.2; // tilt the plane so every component of h takes part
    s0[5] = s0[4]! * Math.sin(inc);
    s0[4] = s0[4]! * Math.cos(inc);
    const energy = (s: ArrayLike<number>) => 0.5 * (s[3]! ** 2 + s[4]! ** 2 + s[5]! ** 2) - MU / Math.hypot(s[0]!, s[1]!, s[2]!);
    const h = (s: ArrayLike<number>) => [s[1]! * s[5]! - s[2]! * s[4]!, s[2]! * s[3]! - s[0]! * s[5]!, s[0]! * s[4]! - s[1]! * s[3]!];
    const e0 = energy(s0), h0 = h(s0);
    const ode = new DormandPrince(stateDerivative(TWO_BODY), 0, s0, ORBIT_STEP_CONTROL);
    let worstE = 0, worstH = 0;
    while (ode.step(DAY_S)) {
      worstE = Math.max(worstE, Math.abs(energy(ode.y) / e0 - 1));
      const hh = h(ode.y);
      worstH = Math.max(worstH, Math.hypot(hh[0]! - h0[0]!, hh[1]! - h0[1]!, hh[2]! - h0[2]!) / Math.hypot(...h0));
    }
    expect(worstE).toBeLessThan(CONSERVATION_TOL);
    expect(worstH).toBeLessThan(CONSERVATION_TOL);
  });
});

describe('J2: secular node rate (Vallado, dΩ/dt = −(3/2) n J2 (R/p)² cos i)', () => {
  const J2_ONLY = forceModel({ zonalDegree: 2 });
  for (const incDeg of [51.6, 97.8, 30])
    it(`i = ${incDeg}°, a = 7000 km, 20 orbits`, () => {
      const i = (incDeg * Math.PI) / 180;
      const v = Math.sqrt(MU / 7000);
      // Start at the ascending node (on +x, moving up): node crossings then come every orbit.
      const s0 = [7000, 0, 0, 0, v * Math.cos(i), v * Math.sin(i)];
      const periodS = 2 * Math.PI * Math.sqrt(7000 ** 3 / MU);
      const end = (T0 + 20.5 * periodS * 1000) as Instant;
      const tr = NumericalTrajectory.propagate('node', T0, s0, end, J2_ONLY);
      const b = new Float64Array(6);
      const zAt = (t: number) => (tr.stateInto(t as Instant, b, 0), b[2]!);
      // Ascending-node crossings by bisection on z (sampled every 1/8 orbit); the node Ω from h there.
      const nodes: { t: number; raan: number }[] = [];
      let sumA = 0, nA = 0;
      const step = (periodS * 1000) / 8;
      for (let t = T0 + step; t + step <= end; t += step) {
        if (zAt(t) < 0 && zAt(t + step) >= 0) {
          let lo = t, hi = t + step;
          while (hi - lo > 1e-3) {
            const mid = 0.5 * (lo + hi);
            if (zAt(mid) < 0) lo = mid;
            else hi = mid;
          }
          tr.stateInto(hi as Instant, b, 0);
          const hx = b[1]! * b[5]! - b[2]! * b[4]!, hy = b[2]! * b[3]! - b[0]! * b[5]!;
          nodes.push({ t: hi, raan: Math.atan2(hx, -hy) });
        }
        // Orbit-averaged osculating a over the first revolution: close to the mean a.
        if (t < T0 + periodS * 1000) {
          tr.stateInto(t as Instant, b, 0);
          const r = Math.hypot(b[0]!, b[1]!, b[2]!), v2 = b[3]! ** 2 + b[4]! ** 2 + b[5]! ** 2;
          sumA += 1 / (2 / r - v2 / MU);
          nA++;
        }
      }
      expect(nodes.length).toBeGreaterThanOrEqual(19);
      const first = nodes[0]!, last = nodes[nodes.length - 1]!;
      let dRaan = last.raan - first.raan;
      dRaan = Math.atan2(Math.sin(dRaan), Math.cos(dRaan));
      const measured = dRaan / ((last.t - first.t) / 1000);
      const a = sumA / nA;
      const n = Math.sqrt(MU / a ** 3);
      const expected = -1.5 * n * J2_ONLY.j2 * (J2_ONLY.radiusKm / a) ** 2 * Math.cos(i);
      expect(Math.abs(measured / expected - 1)).toBeLessThan(NODE_RATE_REL_TOL);
    });
});

describe('against SGP4 over short arcs, from the same state', () => {
  /**
   * SGP4 is an analytic theory: short-period terms to first order in J2, WGS-72 constants
   * (μ differs by 9e-7 → ~20 m per orbit along track), its own drag and J3/J4 treatment. It
   * and a numerical J2..J4 model part at about 100–300 m per LEO orbit (measured 150 m after one
   * orbit at 500 km altitude; SGP4's own accuracy is commonly quoted as ~1 km at epoch, Vallado
   * et al. 2006 — from memory). Tolerances: 0.1 km after 0.1 orbit, 0.5 km after one orbit.
   * The J2-off check shows the tolerance is tight enough to notice a missing J2.
   */
  const SHORT_TOL_KM = 0.1;
  const ORBIT_TOL_KM = 0.5;
  const NO_J2_MIN_KM = 5;
  for (const [aKm, incDeg, bstar] of [[6878, 97.4, 1e-4], [7000, 53, 5e-5], [7500, 98, 0]] as const)
    it(`a = ${aKm} km, i = ${incDeg}°, B* = ${bstar}`, () => {
      const sgp4 = new Sgp4Trajectory(elementSet('1', T0, { aKm, e: 0.001, iDeg: incDeg, raanDeg: 30, argpDeg: 40, uDeg: 10, bstar }));
      const s0 = new Float64Array(6);
      sgp4.stateInto(T0, s0, 0);
      const periodS = 2 * Math.PI * Math.sqrt(aKm ** 3 / MU);
      const end = (T0 + periodS * 1000) as Instant;
      const full = NumericalTrajectory.propagate('x', T0, s0, end, forceModel({ drag: dragFromBstar(bstar) }));
      const twoBody = NumericalTrajectory.propagate('x', T0, s0, end, TWO_BODY);
      const a = new Float64Array(6), b = new Float64Array(6);
      const gap = (tr: NumericalTrajectory, f: number) => {
        const t = (T0 + f * periodS * 1000) as Instant;
        sgp4.stateInto(t, a, 0);
        tr.stateInto(t, b, 0);
        return Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!);
      };
      expect(gap(full, 0.1)).toBeLessThan(SHORT_TOL_KM);
      expect(gap(full, 1)).toBeLessThan(ORBIT_TOL_KM);
      expect(gap(twoBody, 1)).toBeGreaterThan(NO_J2_MIN_KM);
    });
});

describe('dense output and tabulation', () => {
  /**
   * Both sides are integrations at rtol 1e-13 over one orbit (global error < 1 mm); the table's
   * own error is ≈ (n·h)⁶·r/46080 = 0.15 mm at 64 nodes per orbit (hermiteTable.ts): 1 mm.
   */
  const TABLE_TOL_KM = 1e-6;
  /** Velocity from the derivative of the quintic: one order less, ≈ 1e-9 km/s here. */
  const TABLE_VEL_TOL_KMS = 1e-8;
  it('the tabulated trajectory matches integrations stopped exactly at random instants', () => {
    const control = { rtol: 1e-13, atol: 1e-10 };
    const model = forceModel({ drag: dragFromBstar(2e-4) });
    const s0 = [6800, 100, 50, -0.01, 5.12, 5.69]; // near-circular, 420 km, i ≈ 48°
    const end = (T0 + 6000e3) as Instant;
    const tr = NumericalTrajectory.propagate('x', T0, s0, end, model, { control });
    const b = new Float64Array(6);
    for (const f of [0.013, 0.2718, 0.5, 0.77777, 0.999]) {
      const tS = f * 6000;
      const ode = new DormandPrince(stateDerivative(model), 0, s0, control);
      while (ode.step(tS));
      expect(tr.stateInto((T0 + tS * 1000) as Instant, b, 0)).toBeNull();
      expect(Math.hypot(b[0]! - ode.y[0]!, b[1]! - ode.y[1]!, b[2]! - ode.y[2]!)).toBeLessThan(TABLE_TOL_KM);
      expect(Math.hypot(b[3]! - ode.y[3]!, b[4]! - ode.y[4]!, b[5]! - ode.y[5]!)).toBeLessThan(TABLE_VEL_TOL_KMS);
    }
    expect(tr.stateInto((T0 - 1) as Instant, b, 0)).toBe('outside-ephemeris');
    expect(tr.stateInto((end + 1) as Instant, b, 0)).toBe('outside-ephemeris');
  });

  it('dense output inside a step matches an integration stopped there', () => {
    const s0 = perigeeState(7000, 0.05);
    const ode = new DormandPrince(stateDerivative(TWO_BODY), 0, s0, ORBIT_STEP_CONTROL);
    for (let k = 0; k < 10; k++) ode.step(DAY_S);
    const mid = 0.5 * (ode.tPrev + ode.t);
    const out = new Float64Array(6);
    ode.denseInto(mid, out);
    const [x, y] = kepler(7000, 0.05, mid);
    // Order-4 extension over a ~15 s step: error ≪ 1 mm.
    expect(Math.hypot(out[0]! - x, out[1]! - y)).toBeLessThan(1e-6);
  });

  it('a state below 80 km height stops the propagation with a clear error', () => {
    const s0 = [6478, 0, 0, 0, 7.0, 0]; // 100 km altitude, far below circular speed
    expect(() => NumericalTrajectory.propagate('x', T0, s0, (T0 + 3600e3) as Instant, TWO_BODY)).toThrow(/re-enters/);
  });
});
