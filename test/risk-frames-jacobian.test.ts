import { describe, expect, it } from 'vitest';
import { multiply } from '../core/math/linalg.js';
import { rtnBasis, rtnJacobian, rtnJacobianInverse, type Vec3n } from '../core/risk/frames.js';
import { MU_EARTH_WGS84 } from '../core/units.js';

/**
 * The 6×6 RTN Jacobian against its definition, by finite differences of the nonlinear map: the
 * deviated object's position in the reference object's RTN frame, ρ(t) = B(t)·(r₂(t) − r₁(t)),
 * and ρ̇ = dρ/dt computed by a central difference of two-body motion (fourth-order Runge–Kutta,
 * written here for the test, independent of the code under test). Source of the relation:
 * kinematics of a rotating frame (Vallado, Fundamentals of Astrodynamics, 4th ed., §3.3 —
 * "from memory" as to the section number): v_rot = v_inertial − ω × r.
 */
const mu = MU_EARTH_WGS84; // km³/s²

type S = [number, number, number, number, number, number];
const deriv = (s: S): S => {
  const r3 = Math.hypot(s[0], s[1], s[2]) ** 3;
  return [s[3], s[4], s[5], (-mu * s[0]) / r3, (-mu * s[1]) / r3, (-mu * s[2]) / r3];
};
function rk4(s: S, dt: number, steps: number): S {
  const h = dt / steps;
  let x = s;
  for (let k = 0; k < steps; k++) {
    const add = (a: S, b: S, f: number): S => a.map((y, i) => y + f * b[i]!) as S;
    const k1 = deriv(x), k2 = deriv(add(x, k1, h / 2)), k3 = deriv(add(x, k2, h / 2)), k4 = deriv(add(x, k3, h));
    x = x.map((y, i) => y + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!)) as S;
  }
  return x;
}
/** Deviated object's position in the reference's RTN frame, metres. */
function rho(ref: S, dev: S): Vec3n {
  const b = rtnBasis([ref[0], ref[1], ref[2]], [ref[3], ref[4], ref[5]]);
  const d = [[(dev[0] - ref[0]) * 1000], [(dev[1] - ref[1]) * 1000], [(dev[2] - ref[2]) * 1000]];
  const y = multiply(b, d);
  return [y[0]![0]!, y[1]![0]!, y[2]![0]!];
}

// An eccentric, inclined LEO state (km, km/s) and a deviation of 200 m / 0.3 m/s.
const ref: S = [-4200.5, 5100.2, 1800.7, -3.1, -4.4, 5.2];
const delta = [0.12, -0.15, 0.05, 0.0002, 0.0001, -0.00018]; // km, km/s
const dev = ref.map((x, i) => x + delta[i]!) as S;
const H = 0.5; // s, central-difference step

function finiteDifference(): number[] {
  const before = rho(rk4(ref, -H, 10), rk4(dev, -H, 10));
  const after = rho(rk4(ref, H, 10), rk4(dev, H, 10));
  const now = rho(ref, dev);
  return [...now, ...[0, 1, 2].map((i) => (after[i]! - before[i]!) / (2 * H))];
}

describe('RTN Jacobian with the ω×r term', () => {
  const r: Vec3n = [ref[0], ref[1], ref[2]], v: Vec3n = [ref[3], ref[4], ref[5]];
  const deltaM = delta.map((x) => x * 1000);
  const fd = finiteDifference();
  it('maps an inertial deviation to the RTN position and rotating-frame velocity (finite differences)', () => {
    const j = rtnJacobian(r, v);
    const lin = j.map((row) => row.reduce((s, x, k) => s + x * deltaM[k]!, 0));
    // Linearisation error ~ |δr|²/|r| ≈ 0.04 mm in position, ~1e-5 m/s in velocity here; the
    // central difference adds ~H²·|d³ρ/dt³| ≈ 1e-6 m/s. Tolerances with a factor ~10 margin.
    for (let i = 0; i < 3; i++) expect(Math.abs(lin[i]! - fd[i]!)).toBeLessThan(1e-3);
    for (let i = 3; i < 6; i++) expect(Math.abs(lin[i]! - fd[i]!)).toBeLessThan(2e-4);
  });
  it('a velocity block rotated without ω×r is off by |ω|·|δr| (about 0.3 m/s here)', () => {
    const b = rtnBasis(r, v);
    const rotatedOnly = [0, 1, 2].map((i) => b[i]!.reduce((s, x, k) => s + x * deltaM[3 + k]!, 0));
    const worst = Math.max(...[0, 1, 2].map((i) => Math.abs(rotatedOnly[i]! - fd[3 + i]!)));
    expect(worst).toBeGreaterThan(0.1);
  });
  it('rtnJacobianInverse is the inverse', () => {
    const p = multiply(rtnJacobianInverse(r, v), rtnJacobian(r, v));
    for (let i = 0; i < 6; i++) for (let k = 0; k < 6; k++) expect(Math.abs(p[i]![k]! - (i === k ? 1 : 0))).toBeLessThan(1e-14);
  });
});
