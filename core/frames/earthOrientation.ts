/**
 * Earth orientation parameters the reductions accept (IERS Bulletin A/B values). All default
 * to 0, which is what Keepclear uses without an EOP file: UT1 = UTC (error bound in
 * core/time/leapSeconds.ts), no polar motion (|xp|, |yp| < ~0.6″ ≈ 20 m at the surface, 120 m
 * at GEO radius in ITRF), no nutation corrections.
 */
export interface EarthOrientation {
  /** UT1 − UTC, s. */
  readonly ut1MinusUtcS?: number;
  /** Polar motion, rad. */
  readonly xpRad?: number;
  readonly ypRad?: number;
  /** Excess length of day, s (scales Earth's rotation rate in the velocity term). */
  readonly lodS?: number;
  /**
   * Corrections to the IAU-1980 nutation, δΔψ and δΔε, rad. Vallado's worked examples apply
   * them for TEME → GCRF; with them, the FK5 result approaches the true GCRF (they absorb the
   * frame bias and the 1980 model's errors, up to ~0.05″).
   */
  readonly ddPsiRad?: number;
  readonly ddEpsRad?: number;
}

export const NO_EOP: EarthOrientation = {};
