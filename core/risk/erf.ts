/**
 * Error function and its complement, W. J. Cody, "Rational Chebyshev approximations for the
 * error function", Math. Comp. 23 (1969) 631–638 (the CALERF routine of SPECFUN/Netlib).
 *
 * Accuracy: the published approximations have relative error below about 1e-18; in IEEE double
 * the result is limited by rounding to a few ulp (relative ~1e-15). test/risk-erf.test.ts
 * measures this against scipy.special.erf/erfc (fixture in test/authorities/pc/).
 *
 * Why erfc is computed directly (not 1 − erf): the Pc integrand takes differences of normal
 * tail probabilities far out in the tail, where 1 − erf would cancel to zero.
 */

// erf on |x| ≤ 0.46875
const A0 = 3.1611237438705656, A1 = 113.864154151050156, A2 = 377.485237685302021;
const A3 = 3209.37758913846947, A4 = 0.185777706184603153;
const B0 = 23.6012909523441209, B1 = 244.024637934444173, B2 = 1282.61652607737228;
const B3 = 2844.23683343917062;
// exp(x²)·erfc on 0.46875 < |x| ≤ 4
const C = [
  0.564188496988670089, 8.88314979438837594, 66.1191906371416295, 298.635138197400131,
  881.952221241769090, 1712.04761263407058, 2051.07837782607147, 1230.33935479799725,
  2.15311535474403846e-8,
] as const;
const D = [
  15.7449261107098347, 117.693950891312499, 537.181101862009858, 1621.38957456669019,
  3290.79923573345963, 4362.61909014324716, 3439.36767414372164, 1230.33935480374942,
] as const;
// asymptotic exp(x²)·erfc on |x| > 4
const P = [
  0.305326634961232344, 0.360344899949804439, 0.125781726111229246, 0.0160837851487422766,
  6.58749161529837803e-4, 0.0163153871373020978,
] as const;
const Q = [
  2.56852019228982242, 1.87295284992346047, 0.527905102951428412, 0.0605183413124413191,
  0.00233520497626869185,
] as const;
const SQRPI = 0.56418958354775628695; // 1/√π
/** erfc(x) underflows to 0 in double beyond this (Cody's XBIG). */
const XBIG = 26.543;
/** Below this x² is dropped in the small-argument form (Cody's XSMALL). */
const XSMALL = 1.11e-16;

function erfSmall(x: number): number {
  const y = Math.abs(x);
  const z = y > XSMALL ? y * y : 0;
  const num = (((A4 * z + A0) * z + A1) * z + A2) * z + A3;
  const den = (((z + B0) * z + B1) * z + B2) * z + B3;
  return (x * num) / den;
}

/** erfc(y) for y > 0.46875. */
function erfcPositive(y: number): number {
  let r: number;
  if (y <= 4) {
    let num = C[8] * y, den = y;
    for (let i = 0; i < 7; i++) {
      num = (num + C[i]!) * y;
      den = (den + D[i]!) * y;
    }
    r = (num + C[7]) / (den + D[7]);
  } else {
    if (y >= XBIG) return 0;
    const z = 1 / (y * y);
    let num = P[5] * z, den = z;
    for (let i = 0; i < 4; i++) {
      num = (num + P[i]!) * z;
      den = (den + Q[i]!) * z;
    }
    r = (z * (num + P[4])) / (den + Q[4]);
    r = (SQRPI - r) / y;
  }
  // exp(−y²) split as exp(−ys²)·exp(−(y−ys)(y+ys)) so the rounding of y² is not amplified.
  const ys = Math.trunc(16 * y) / 16;
  const del = (y - ys) * (y + ys);
  return Math.exp(-ys * ys - del) * r;
}

export function erf(x: number): number {
  const y = Math.abs(x);
  if (y <= 0.46875) return erfSmall(x);
  const c = erfcPositive(y);
  return x < 0 ? c - 1 : 1 - c;
}

export function erfc(x: number): number {
  const y = Math.abs(x);
  if (y <= 0.46875) return 1 - erfSmall(x);
  const c = erfcPositive(y);
  return x < 0 ? 2 - c : c;
}
