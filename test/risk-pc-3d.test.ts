/**
 * The 3-D Pc (Coppola, "Including velocity uncertainty in the probability of collision between
 * space objects", AAS 12-247, 2012) against
 *  - the 2-D short-encounter Pc where both hold (fast encounters; Foster & Estes 1992, Chan 2008),
 *  - a Monte Carlo over the trajectories (written here): both objects' states at TCA drawn from
 *    their 6×6 covariances, each propagated by Kepler's problem, the closest approach found, a
 *    hit counted when it is within the hard-body radius. No linearisation, no inflow counting:
 *    it checks both approximations of the 3-D method where the 2-D method fails.
 * The two-body propagator both use is first checked against a Runge–Kutta integration of
 * r̈ = −μr/|r|³ written here (Newton; any text on orbital mechanics).
 */
import { describe, expect, it } from 'vitest';
import { symmetricEigen } from '../core/math/linalg.js';
import { assessEncounter, PC_METHOD_3D } from '../core/risk/assess.js';
import { encounterPlane } from '../core/risk/encounterPlane.js';
import { rtnToInertialCov6, type Vec3n } from '../core/risk/frames.js';
import { pc2dReference } from '../core/risk/pc2dReference.js';
import { pc3d } from '../core/risk/pc3d.js';
import { SeededRandom } from '../core/risk/rng.js';
import { MU_M3_S2, propagateTwoBody, type State6 } from '../core/risk/twoBody.js';
import type { Encounter, StateArray } from '../core/events/index.js';
import { parseIso } from '../core/time/instant.js';

const mu = MU_M3_S2;

function rk4(s: State6, dt: number, steps: number): State6 {
  const f = (x: readonly number[]): number[] => {
    const r3 = Math.hypot(x[0]!, x[1]!, x[2]!) ** 3;
    return [x[3]!, x[4]!, x[5]!, (-mu * x[0]!) / r3, (-mu * x[1]!) / r3, (-mu * x[2]!) / r3];
  };
  const h = dt / steps;
  let x = [...s];
  for (let k = 0; k < steps; k++) {
    const k1 = f(x), k2 = f(x.map((y, i) => y + (h / 2) * k1[i]!)), k3 = f(x.map((y, i) => y + (h / 2) * k2[i]!));
    const k4 = f(x.map((y, i) => y + h * k3[i]!));
    x = x.map((y, i) => y + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!));
  }
  return x as unknown as State6;
}

/** Circular orbit state (m, m/s) of radius rKm, inclination inc, node raan, argument of latitude u. */
function circular(rKm: number, inc: number, raan: number, u: number): State6 {
  const r = rKm * 1000, v = Math.sqrt(mu / r);
  const cu = Math.cos(u), su = Math.sin(u), ci = Math.cos(inc), si = Math.sin(inc), co = Math.cos(raan), so = Math.sin(raan);
  const p = [co * cu - so * su * ci, so * cu + co * su * ci, su * si];
  const q = [-co * su - so * cu * ci, -so * su + co * cu * ci, cu * si];
  return [r * p[0]!, r * p[1]!, r * p[2]!, v * q[0]!, v * q[1]!, v * q[2]!];
}
const P = circular(6928.137, (53 * Math.PI) / 180, 0, 0.3); // 550 km, 53°
const rHat = [P[0], P[1], P[2]].map((x) => x / Math.hypot(P[0], P[1], P[2]));
/** Secondary at the primary's position + missM radially, velocity turned by `turn` about r̂ and scaled. */
function secondary(turn: number, speedFactor: number, missM: number): State6 {
  const v = [P[3], P[4], P[5]];
  const kxv = [rHat[1]! * v[2]! - rHat[2]! * v[1]!, rHat[2]! * v[0]! - rHat[0]! * v[2]!, rHat[0]! * v[1]! - rHat[1]! * v[0]!];
  const w = v.map((x, i) => (x * Math.cos(turn) + kxv[i]! * Math.sin(turn)) * speedFactor);
  return [P[0] + rHat[0]! * missM, P[1] + rHat[1]! * missM, P[2] + rHat[2]! * missM, w[0]!, w[1]!, w[2]!];
}
const diag6 = (s: readonly number[]) => Array.from({ length: 6 }, (_, i) => Array.from({ length: 6 }, (_, j) => (i === j ? s[i]! ** 2 : 0)));
const r3 = (x: State6): Vec3n => [x[0], x[1], x[2]];
const v3 = (x: State6): Vec3n => [x[3], x[4], x[5]];

interface Case {
  readonly prim: State6;
  readonly sec: State6;
  readonly cp: number[][];
  readonly cs: number[][];
  readonly radiusM: number;
}
function makeCase(sec: State6, sigP: readonly number[], sigS: readonly number[], radiusM: number): Case {
  return { prim: P, sec, cp: rtnToInertialCov6(diag6(sigP), r3(P), v3(P)), cs: rtnToInertialCov6(diag6(sigS), r3(sec), v3(sec)), radiusM };
}
function pc2d(c: Case): number {
  const km = (x: State6) => x.map((y) => y / 1000) as unknown as StateArray;
  const pos = (m: number[][]) => m.slice(0, 3).map((row) => row.slice(0, 3));
  const plane = encounterPlane(km(c.prim), km(c.sec), pos(c.cp), pos(c.cs));
  return pc2dReference(plane.missM, plane.covM2, c.radiusM);
}
const pc3dOf = (c: Case) => pc3d({ primary: c.prim, secondary: c.sec, primaryCov: c.cp, secondaryCov: c.cs, radiusM: c.radiusM });

function sqrtFactor(c: number[][]): number[][] {
  const { values, vectors } = symmetricEigen(c);
  return vectors.map((row) => row.map((x, k) => x * Math.sqrt(Math.max(values[k]!, 0))));
}
/** Trajectory Monte Carlo over [−half, half] s around TCA (see the file comment). */
function monteCarlo(c: Case, half: number, n: number, seed: number): { pc: number; sigma: number } {
  const a = sqrtFactor(c.cp), b = sqrtFactor(c.cs);
  const rng = new SeededRandom(seed);
  const STEP_S = 10; // coarse scan; the distance has one minimum per ~orbit, refined below
  let hits = 0;
  for (let k = 0; k < n; k++) {
    const zp = Array.from({ length: 6 }, () => rng.normal()), zs = Array.from({ length: 6 }, () => rng.normal());
    const p = c.prim.map((x, i) => x + a[i]!.reduce((s, y, j) => s + y * zp[j]!, 0)) as unknown as State6;
    const s = c.sec.map((x, i) => x + b[i]!.reduce((t, y, j) => t + y * zs[j]!, 0)) as unknown as State6;
    const d = (t: number): number => {
      const x = propagateTwoBody(p, t), y = propagateTwoBody(s, t);
      return Math.hypot(y[0] - x[0], y[1] - x[1], y[2] - x[2]);
    };
    let best = Infinity, bt = 0;
    for (let t = -half; t <= half; t += STEP_S) {
      const v = d(t);
      if (v < best) [best, bt] = [v, t];
    }
    let lo = Math.max(-half, bt - STEP_S), hi = Math.min(half, bt + STEP_S);
    const g = (Math.sqrt(5) - 1) / 2;
    let x1 = hi - g * (hi - lo), x2 = lo + g * (hi - lo), f1 = d(x1), f2 = d(x2);
    for (let it = 0; it < 40; it++) {
      if (f1 < f2) [hi, x2, f2, x1] = [x2, x1, f1, x2 - g * (x2 - lo)], (f1 = d(x1));
      else [lo, x1, f1, x2] = [x1, x2, f2, x1 + g * (hi - x1)], (f2 = d(x2));
    }
    if (Math.min(best, f1, f2) <= c.radiusM) hits++;
  }
  const pc = hits / n;
  return { pc, sigma: Math.sqrt((pc * (1 - pc)) / n) };
}

describe('two-body propagation (universal variables) against a Runge–Kutta integration', () => {
  it('agrees over an hour to better than 1 mm', () => {
    const a = propagateTwoBody(P, 3600), b = rk4(P, 3600, 7200);
    expect(Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2])).toBeLessThan(1e-3);
    const e = propagateTwoBody(P, -1234.5), f = rk4(P, -1234.5, 2469);
    expect(Math.hypot(e[0] - f[0], e[1] - f[1], e[2] - f[2])).toBeLessThan(1e-3);
  });
});

describe('3-D Pc where the short-encounter assumption holds: equals the 2-D Pc', () => {
  for (const [name, turn, miss] of [['crossing at 90°, 10.7 km/s', Math.PI / 2, 150], ['near head-on, 15 km/s', (170 * Math.PI) / 180, 100]] as const) {
    it(name, () => {
      const c = makeCase(secondary(turn, 1, miss), [100, 500, 150, 0, 0, 0], [200, 1000, 300, 0, 0, 0], 20);
      const two = pc2d(c), three = pc3dOf(c);
      expect(three.converged).toBe(true);
      // Over the ~1 s crossing the paths are straight to ~1e-4 of σ: agreement to 0.1 %.
      expect(Math.abs(three.pc / two - 1)).toBeLessThan(1e-3);
    });
  }
});

describe('3-D Pc where the short-encounter assumption fails: checked by trajectory Monte Carlo', () => {
  it('slow overtaking at 5 m/s (the relative path curves radially by ~100 m while crossing ±3σ): 3-D agrees with Monte Carlo, 2-D does not', () => {
    // Secondary 100 m above, 5 m/s faster along track: relative motion of Clohessy–Wiltshire type.
    const c = makeCase(secondary(0, 1 + 5 / Math.hypot(P[3], P[4], P[5]), 100), [60, 150, 60, 0, 0, 0], [80, 200, 80, 0, 0, 0], 60);
    const three = pc3dOf(c), two = pc2d(c);
    expect(three.windowCapped).toBe(false);
    const mc = monteCarlo(c, three.halfWindowS, 12_000, 11);
    expect(Math.abs(three.pc - mc.pc)).toBeLessThan(4 * mc.sigma);
    expect(Math.abs(two - mc.pc)).toBeGreaterThan(4 * mc.sigma);
  });
  it('slow crossing at 6.6 m/s from a small plane difference (nearly straight relative path): all three agree', () => {
    const c = makeCase(secondary((0.05 * Math.PI) / 180, 1, 100), [60, 150, 60, 0, 0, 0], [80, 200, 80, 0, 0, 0], 60);
    const three = pc3dOf(c), two = pc2d(c);
    expect(Math.abs(three.pc / two - 1)).toBeLessThan(0.01);
    const mc = monteCarlo(c, three.halfWindowS, 6_000, 5);
    expect(Math.abs(three.pc - mc.pc)).toBeLessThan(4 * mc.sigma);
  });
});

describe('assessEncounter chooses the method by the short-encounter check and names it', () => {
  const tca = parseIso('2026-12-07T10:00:00Z')!;
  const enc = (sec: State6): Encounter => {
    const km = (x: State6) => x.map((y) => y / 1000) as unknown as StateArray;
    const rel = [0, 1, 2].map((i) => sec[3 + i]! - P[3 + i]!);
    return {
      primary: '100001', secondary: '330001', tca, missKm: 0.1, relativeSpeedKmS: Math.hypot(...rel) / 1000,
      rtnKm: [0.1, 0, 0], approachAngleDeg: 0, entry: null, exit: null,
      primaryState: km(P), secondaryState: km(sec), primaryEpoch: tca, secondaryEpoch: tca,
    };
  };
  const cov = { cdmRtnM2: diag6([60, 150, 60, 0.05, 0.05, 0.05]) };
  it('slow encounter (29.5 m/s, like the demo week): 3-D method, 2-D value kept in the warnings', () => {
    const a = assessEncounter(enc(secondary(0, 1 + 29.5 / Math.hypot(P[3], P[4], P[5]), 100)), { primary: cov, secondary: cov, hbrPrimaryM: 10, hbrSecondaryM: 10 });
    expect(a.pcMethod).toBe(PC_METHOD_3D);
    expect(a.warnings.join(' ')).toMatch(/slow encounter/);
    expect(a.warnings.join(' ')).toMatch(/Pc by the 3-D method \(Coppola 2012.*the 2-D Pc would be \d/);
    expect(a.pc).toBeGreaterThan(0);
  });
  it('fast encounter: 2-D reference, no 3-D note', () => {
    const a = assessEncounter(enc(secondary(Math.PI / 2, 1, 100)), { primary: cov, secondary: cov, hbrPrimaryM: 10, hbrSecondaryM: 10 });
    expect(a.pcMethod).toBe('2d-reference');
    expect(a.warnings.join(' ')).not.toMatch(/3-D/);
  });
  it("encounterModel '2d' keeps the 2-D method (with the warning) for callers that need it", () => {
    const a = assessEncounter(enc(secondary(0, 1 + 29.5 / Math.hypot(P[3], P[4], P[5]), 100)), {
      primary: cov, secondary: cov, hbrPrimaryM: 10, hbrSecondaryM: 10, encounterModel: '2d',
    });
    expect(a.pcMethod).toBe('2d-reference');
    expect(a.warnings.join(' ')).toMatch(/slow encounter/);
  });
});
