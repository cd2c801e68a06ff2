import { MU_EARTH_WGS72 } from '../units.js';

/**
 * Two-body conversions with SGP4's own gravitational parameter (WGS-72), so that a semi-major
 * axis drawn here lands at the altitude SGP4 will show. Angles in radians, km, km/s.
 *
 * SGP4's input mean motion is the "Kozai" mean motion; treating it as the Keplerian one (as done
 * here) shifts altitude by well under a kilometre in LEO, which a synthetic world can accept.
 */
export const MU = MU_EARTH_WGS72;
const TWO_PI = 2 * Math.PI;
const SECONDS_PER_DAY = 86_400;

/** Mean motion (rev/day) of a semi-major axis (km), Kepler's third law. */
export const meanMotionRevPerDay = (aKm: number): number =>
  (Math.sqrt(MU / (aKm * aKm * aKm)) * SECONDS_PER_DAY) / TWO_PI;

/** Semi-major axis (km) of a mean motion (rev/day). */
export function semiMajorAxisKm(revPerDay: number): number {
  const n = (revPerDay * TWO_PI) / SECONDS_PER_DAY;
  return Math.cbrt(MU / (n * n));
}

/** Classical elements; angles in radians. */
export interface Keplerian {
  a: number;
  e: number;
  i: number;
  raan: number;
  argp: number;
  meanAnomaly: number;
}

export const wrapTwoPi = (x: number): number => {
  const y = x % TWO_PI;
  return y < 0 ? y + TWO_PI : y;
};

/** Eccentric anomaly from mean anomaly (Newton on Kepler's equation; e < 1). */
export function eccentricAnomaly(meanAnomaly: number, e: number): number {
  const m = wrapTwoPi(meanAnomaly);
  let ea = e < 0.8 ? m : Math.PI;
  for (let k = 0; k < 50; k++) {
    const step = (ea - e * Math.sin(ea) - m) / (1 - e * Math.cos(ea));
    ea -= step;
    if (Math.abs(step) < 1e-14) break;
  }
  return ea;
}

/** Position (km) and velocity (km/s) of classical elements. */
export function stateFromKeplerian(k: Keplerian): { r: number[]; v: number[] } {
  const ea = eccentricAnomaly(k.meanAnomaly, k.e);
  const cosE = Math.cos(ea), sinE = Math.sin(ea);
  const rootOneMinusE2 = Math.sqrt(1 - k.e * k.e);
  // Perifocal coordinates (P toward perigee, Q 90° ahead in the orbit plane).
  const xp = k.a * (cosE - k.e), yp = k.a * rootOneMinusE2 * sinE;
  const rNorm = k.a * (1 - k.e * cosE);
  const vScale = Math.sqrt(MU * k.a) / rNorm;
  const vxp = -vScale * sinE, vyp = vScale * rootOneMinusE2 * cosE;
  const cO = Math.cos(k.raan), sO = Math.sin(k.raan);
  const cw = Math.cos(k.argp), sw = Math.sin(k.argp);
  const ci = Math.cos(k.i), si = Math.sin(k.i);
  const p = [cO * cw - sO * sw * ci, sO * cw + cO * sw * ci, sw * si];
  const q = [-cO * sw - sO * cw * ci, -sO * sw + cO * cw * ci, cw * si];
  return {
    r: [0, 1, 2].map((j) => xp * p[j]! + yp * q[j]!),
    v: [0, 1, 2].map((j) => vxp * p[j]! + vyp * q[j]!),
  };
}

/**
 * Osculating classical elements of a state (Vallado, Fundamentals of Astrodynamics, RV2COE).
 * Near-circular and near-equatorial orbits keep finite angles: ω falls back to the argument of
 * latitude reference (node or x axis); callers that care use equinoctial forms.
 */
export function keplerianFromState(r: readonly number[], v: readonly number[]): Keplerian {
  const [x, y, z] = [r[0]!, r[1]!, r[2]!];
  const [vx, vy, vz] = [v[0]!, v[1]!, v[2]!];
  const rn = Math.hypot(x, y, z);
  const v2 = vx * vx + vy * vy + vz * vz;
  const hx = y * vz - z * vy, hy = z * vx - x * vz, hz = x * vy - y * vx;
  const hn = Math.hypot(hx, hy, hz);
  const rv = x * vx + y * vy + z * vz;
  const ex = ((v2 - MU / rn) * x - rv * vx) / MU;
  const ey = ((v2 - MU / rn) * y - rv * vy) / MU;
  const ez = ((v2 - MU / rn) * z - rv * vz) / MU;
  const e = Math.hypot(ex, ey, ez);
  const a = 1 / (2 / rn - v2 / MU);
  const i = Math.acos(Math.max(-1, Math.min(1, hz / hn)));
  // Node vector n = ẑ × h.
  const nx = -hy, ny = hx;
  const nn = Math.hypot(nx, ny);
  const raan = nn > 1e-12 * hn ? wrapTwoPi(Math.atan2(ny, nx)) : 0;
  // Reference direction in the plane for angles: the node, or x when equatorial.
  const ux = nn > 1e-12 * hn ? nx / nn : 1, uy = nn > 1e-12 * hn ? ny / nn : 0;
  // w = ĥ × u completes an in-plane basis, so angles come from atan2 without acos branches.
  const wx = (hy * 0 - hz * uy) / hn, wy = (hz * ux - hx * 0) / hn, wz = (hx * uy - hy * ux) / hn;
  const angle = (px: number, py: number, pz: number): number =>
    wrapTwoPi(Math.atan2(px * wx + py * wy + pz * wz, px * ux + py * uy));
  const argLat = angle(x, y, z);
  const argp = e > 1e-12 ? angle(ex, ey, ez) : 0;
  const trueAnomaly = wrapTwoPi(argLat - argp);
  const ea = 2 * Math.atan2(Math.sqrt(1 - e) * Math.sin(trueAnomaly / 2), Math.sqrt(1 + e) * Math.cos(trueAnomaly / 2));
  const meanAnomaly = wrapTwoPi(ea - e * Math.sin(ea));
  return { a, e, i, raan, argp, meanAnomaly };
}
