/**
 * ∂a/∂r of two-body + J2 gravity (3×3, symmetric, 1/s²), the block of the variational
 * equations that matters: J3, J4 (~1e-3 of J2) and drag (≲ 1e-6 of gravity in LEO above
 * 300 km) are left out of the state-transition matrix. Their effect on the STM over a few
 * orbits is far below what the STM is used for — a first guess that the planner then verifies
 * with the full model — and test/numerical-stm.test.ts measures it against finite differences
 * of the full integrator.
 *
 * Derivation: a = −μ r/r³ − k (x g₁, y g₁, z g₃)/r⁵ with k = (3/2) J2 μ R², g₁ = 1 − 5z²/r²,
 * g₃ = 3 − 5z²/r², differentiated term by term (∂r⁻ⁿ/∂x_j = −n x_j r⁻ⁿ⁻²).
 */
import type { ForceModel } from './forceModel.js';

/** Writes the 9 entries (row-major) of ∂a/∂r at position (x, y, z) into g[0..8]. */
export function gravityGradientInto(m: ForceModel, x: number, y: number, z: number, g: Float64Array): void {
  const r2 = x * x + y * y + z * z;
  const r = Math.sqrt(r2);
  const r3 = r2 * r, r5 = r3 * r2;
  const mu = m.mu;
  // Two-body: μ (3 r rᵀ/r⁵ − I/r³).
  const a = mu / r3, b = (3 * mu) / r5;
  let gxx = b * x * x - a, gyy = b * y * y - a, gzz = b * z * z - a;
  let gxy = b * x * y, gxz = b * x * z, gyz = b * y * z;
  if (m.zonalDegree >= 2) {
    const k = 1.5 * m.j2 * mu * m.radiusKm * m.radiusKm;
    const r7 = r5 * r2, r9 = r7 * r2;
    const z2 = z * z;
    // ∂(x g₁/r⁵)/∂x = 1/r⁵ − 5x²/r⁷ − 5z²/r⁷ + 35x²z²/r⁹, and so on; a = −k · (these).
    const i5 = 1 / r5, i7 = 1 / r7, i9 = 1 / r9;
    gxx -= k * (i5 - 5 * x * x * i7 - 5 * z2 * i7 + 35 * x * x * z2 * i9);
    gyy -= k * (i5 - 5 * y * y * i7 - 5 * z2 * i7 + 35 * y * y * z2 * i9);
    gzz -= k * (3 * i5 - 30 * z2 * i7 + 35 * z2 * z2 * i9);
    gxy -= k * (-5 * x * y * i7 + 35 * x * y * z2 * i9);
    gxz -= k * (-15 * x * z * i7 + 35 * x * z * z2 * i9);
    gyz -= k * (-15 * y * z * i7 + 35 * y * z * z2 * i9);
  }
  g[0] = gxx; g[1] = gxy; g[2] = gxz;
  g[3] = gxy; g[4] = gyy; g[5] = gyz;
  g[6] = gxz; g[7] = gyz; g[8] = gzz;
}
