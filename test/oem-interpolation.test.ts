/**
 * Interpolation error of an OEM-backed trajectory against the closed-form two-body solution
 * (test/support/twoBody.ts, written independently of core/), nodes every 60 s, checked at the
 * midpoint of every interval (where the error is largest), the off-centre windows at the ends
 * of the data included; each point's bound uses the window actually needed there
 * (test/support/interpolationBounds.ts).
 *
 * Tolerances come from the interpolation remainder (e.g. Stoer & Bulirsch, Introduction to
 * Numerical Analysis, §2.1.4 (Lagrange) and §2.1.5 (Hermite); from memory):
 *   e(t) = f[x_0 … x_N, t] · W(t),  W(t) = Π (t − x_j)^μ  (μ = 1 Lagrange, μ = 2 Hermite),
 *   e'(t) = f[x_0 … x_N, t, t] · W(t) + f[x_0 … x_N, t] · W'(t),
 * with |f[k+1 points]| ≤ max|f^(k)|/k!, k = N+1 (Lagrange) or 2n (Hermite on n nodes).
 * - Circular orbit: each position component is A_i·cos(nt + φ_i) with Σ A_i² = 2R², so
 *   |f^(k)| ≤ A_i n^k exactly and the bound is √2·R·n^k·|W|/k!.
 * - Eccentric orbit: Cauchy's estimate |f^(k)(ξ)| ≤ k!·M/ρ^k, with M the largest |x_i(z)| on
 *   complex times within ρ of the window (x(t) is analytic closer to the real axis than the
 *   singularities of Kepler's equation, test/support/twoBody.ts), so |e_i| ≤ |W|·M_i/ρ^k.
 * Plus a floor for double rounding (below). Where the bound is far above that floor, the
 * largest error must also come within a factor of the bound (the circular case reaches
 * 1/√2 of it): that shows the degree the message asks for is the one used.
 */
import { describe, expect, it } from 'vitest';
import { sampleOem } from '../core/formats/oem/index.js';
import { EphemerisTrajectory } from '../core/propagation/ephemeris.js';
import { instantFromMs } from '../core/time/instant.js';
import { factorial, nodeCount, windowNodes, windowTerms, type Method, type WindowTerms } from './support/interpolationBounds.js';
import { TwoBody, TwoBodyTrajectory } from './support/twoBody.js';

/** Any μ serves: the interpolant is compared with the very orbit it was sampled from. WGS-84 value. */
const MU = 398600.4418; // km³/s²
const STEP_S = 60;
const T0 = Date.UTC(2026, 2, 1);
/**
 * Double rounding: coordinates of ~7,000–34,000 km carry ε·|r| ≈ 1.5e-12–7.5e-12 km, the basis
 * of ≤ 10 equally spaced nodes amplifies that by its Lebesgue constant (< 30 at mid-interval),
 * and Kepler's equation is solved to 1e-15 rad; 1e-9 km (1 µm) covers all with a wide margin.
 */
const FLOOR_KM = 1e-9; // km
/** The same rounding divided by a node spacing of 60 s, with margin. */
const FLOOR_KMS = 1e-10; // km/s
/** Sampling the complex boundary at 240 points can miss its true maximum slightly. */
const BOUNDARY_SAMPLING_MARGIN = 1.2;

const METHODS: readonly Method[] = [
  { method: 'LAGRANGE', degree: 5 },
  { method: 'LAGRANGE', degree: 7 },
  { method: 'LAGRANGE', degree: 9 },
  { method: 'HERMITE', degree: 3 },
  { method: 'HERMITE', degree: 5 },
  { method: 'LINEAR', degree: 1 },
];

const dist = (a: ArrayLike<number>, b: ArrayLike<number>, o = 0): number =>
  Math.hypot(a[o]! - b[0]!, a[o + 1]! - b[1]!, a[o + 2]! - b[2]!);

interface Measured {
  worstPos: number;
  worstVel: number;
  worstPosRatio: number;
  boundAtWorst: number;
}

/** The window's node times (s from T0) and remainder terms at the midpoint of interval i. */
function midpoint(m: Method, i: number, nodes: number): { t: number; xs: number[]; terms: WindowTerms } {
  const xs = windowNodes(i, 0.5, nodeCount(m), nodes + 1).map((j) => j * STEP_S);
  const t = (i + 0.5) * STEP_S;
  return { t, xs, terms: windowTerms(m.method, xs, t) };
}

/** Samples the orbit into an OEM, interpolates at every midpoint, compares with the bound there. */
function measure(body: TwoBody, spanS: number, m: Method, bound: (xs: number[], terms: WindowTerms) => { pos: number; vel: number }): Measured {
  const oem = sampleOem(
    [{ trajectory: new TwoBodyTrajectory('90001', body), start: instantFromMs(T0), end: instantFromMs(T0 + spanS * 1000), stepS: STEP_S }],
    { objectName: 'TWO-BODY', objectId: '90001', originator: 'KEEPCLEAR TEST', creationDate: instantFromMs(T0), frame: 'TEME', interpolation: m },
  );
  const traj = new EphemerisTrajectory(oem);
  expect(oem.segments[0]!.metadata.interpolation).toMatchObject(m);
  const out = new Float64Array(6);
  const nodes = Math.round(spanS / STEP_S);
  const res: Measured = { worstPos: 0, worstVel: 0, worstPosRatio: 0, boundAtWorst: 0 };
  for (let i = 0; i < nodes; i++) {
    const { t: tS, xs, terms } = midpoint(m, i, nodes);
    const t = T0 + tS * 1000;
    expect(traj.stateInto(instantFromMs(t), out, 0)).toBeNull();
    const truth = body.state(t);
    const b = bound(xs, terms);
    const ePos = dist(out, truth.r), eVel = dist(out, truth.v, 3);
    expect(ePos, `position error at ${new Date(t).toISOString()}`).toBeLessThanOrEqual(b.pos + FLOOR_KM);
    expect(eVel, `velocity error at ${new Date(t).toISOString()}`).toBeLessThanOrEqual(b.vel + FLOOR_KMS);
    if (ePos > res.worstPos) Object.assign(res, { worstPos: ePos, boundAtWorst: b.pos });
    res.worstVel = Math.max(res.worstVel, eVel);
    res.worstPosRatio = Math.max(res.worstPosRatio, ePos / b.pos);
  }
  return res;
}

describe('circular LEO (500 km, 60-s nodes): error within the remainder bound √2·R·n^k·|W|/k!', () => {
  const body = new TwoBody({ aKm: 6878.137, e: 0, iDeg: 51.6, raanDeg: 30, argpDeg: 0, m0Deg: 10, t0: T0, mu: MU });
  const R = body.o.aKm, n = body.n;
  for (const m of METHODS) {
    it(`${m.method} ${m.degree}`, () => {
      const r = measure(body, 3 * 3600, m, (_xs, { k, w, dw }) => ({
        pos: (Math.SQRT2 * R * n ** k * w) / factorial(k),
        vel: Math.SQRT2 * R * ((n ** (k + 1) * w) / factorial(k + 1) + (n ** k * dw) / factorial(k)),
      }));
      const pos = r.boundAtWorst;
      console.info(`circular ${m.method} ${m.degree}: worst ${(r.worstPos * 1e6).toExponential(2)} mm, bound there ${(pos * 1e6).toExponential(2)} mm, ` +
        `velocity ${(r.worstVel * 1e6).toExponential(2)} mm/s`);
      // The error term's own size: a lower degree than asked would exceed the bound, a higher
      // one would stay far below it. Only meaningful where the bound is far above rounding.
      const DEGREE_SHOWS = 0.3; // the circular orbit reaches 1/√2 ≈ 0.71 of the bound
      if (pos > 100 * FLOOR_KM) expect(r.worstPosRatio).toBeGreaterThan(DEGREE_SHOWS);
    });
  }
});

describe('eccentric orbit (e = 0.7, perigee 7,980 km, 60-s nodes over a full period): error within the Cauchy bound', () => {
  const body = new TwoBody({ aKm: 26600, e: 0.7, iDeg: 63.4, raanDeg: 40, argpDeg: 270, m0Deg: -30, t0: T0, mu: MU });
  const period = (2 * Math.PI) / body.n;
  const tau = body.singularityDistanceS();
  /** Largest |x_i(z)| on the boundary of the complex stadium of radius ρ around [a, b] (ms, s). */
  function boundaryMax(a: number, b: number, rho: number): [number, number, number] {
    const M: [number, number, number] = [0, 0, 0];
    const take = (tMs: number, imS: number): void => {
      const x = body.complexPositionModuli(tMs, imS);
      for (let c = 0; c < 3; c++) M[c] = Math.max(M[c]!, x[c]! * BOUNDARY_SAMPLING_MARGIN);
    };
    const N = 60;
    for (let j = 0; j <= N; j++) {
      const u = a + ((b - a) * j) / N;
      take(u, rho);
      take(u, -rho);
      const ang = Math.PI / 2 + (Math.PI * j) / N;
      take(a + rho * 1000 * Math.cos(ang), rho * Math.sin(ang));
      take(b - rho * 1000 * Math.cos(ang), rho * Math.sin(ang));
    }
    return M;
  }
  for (const m of METHODS) {
    it(`${m.method} ${m.degree}`, () => {
      const bound = (xs: number[], { k, w, dw }: WindowTerms): { pos: number; vel: number } => {
        const a = T0 + xs[0]! * 1000, b = T0 + xs.at(-1)! * 1000;
        let best = { pos: Infinity, vel: Infinity };
        // Any ρ below the singularity distance gives a valid bound; the smallest of a few is kept.
        for (const f of [0.5, 0.7, 0.85]) {
          const rho = f * tau;
          const M = boundaryMax(a, b, rho);
          const Mn = Math.hypot(...M);
          const pos = (w * Mn) / rho ** k;
          const vel = (w * Mn) / rho ** (k + 1) + (dw * Mn) / rho ** k;
          if (pos < best.pos) best = { pos, vel };
        }
        return best;
      };
      const r = measure(body, period, m, bound);
      console.info(`eccentric ${m.method} ${m.degree}: worst ${(r.worstPos * 1e3).toExponential(2)} m (bound there ${(r.boundAtWorst * 1e3).toExponential(2)} m), ` +
        `velocity ${(r.worstVel * 1e6).toExponential(2)} mm/s`);
      expect(r.worstPos).toBeGreaterThan(0);
    });
  }
});
