/**
 * SGP4's True Equator, Mean Equinox frame to and from GCRF and ITRF: the IAU-76/FK5 reduction as
 * published by Vallado (Vallado, Crawford, Hujsak, Kelso 2006, AIAA 2006-6753 App. C; Vallado,
 * Fundamentals of Astrodynamics and Applications §3.7, functions teme2eci / teme2ecef).
 *
 *   GCRF ← P(IAU-76) ← N(IAU-80) ← R3(−Eq_e) ← TEME,  Eq_e = Δψ cos ε̄ (no kinematic terms)
 *   ITRF ← W(xp, yp) ← R3(GMST 1982) ← TEME,  v gains −ω × r_PEF
 *
 * The TEME ↔ GCRF velocity ignores the rotation rate of precession-nutation (~1e-11 rad/s;
 * < 1e-7 km/s even at GEO radius). Inverses are exact transposes (round trip to ~1e-12 km).
 */
import type { Instant } from '../time/instant.js';
import { ttCenturiesSinceJ2000, ut1DaysSinceJ2000 } from '../time/leapSeconds.js';
import { vec3, type Frame, type Km, type KmS, type StateVector } from '../units.js';
import type { EarthOrientation } from './earthOrientation.js';
import {
  earthRotationRate,
  gmst1982,
  meanObliquity1980,
  nutation1980,
  nutationMatrix,
  precessionMatrix,
} from './fk5.js';
import { apply, chain, rot1, rot2, rot3, transpose, type Mat3 } from './rotation.js';

function state<F extends Frame>(r: [number, number, number], v: [number, number, number]): StateVector<F> {
  return { r: vec3<F, Km>(r[0], r[1], r[2]), v: vec3<F, KmS>(v[0], v[1], v[2]) };
}

/** r_GCRF = M · r_TEME at a UTC instant. */
export function temeToGcrfMatrix(t: Instant, eop: EarthOrientation = {}): Mat3 {
  const T = ttCenturiesSinceJ2000(t);
  const meanEps = meanObliquity1980(T);
  const nut = nutation1980(T);
  const dPsi = nut.dPsi + (eop.ddPsiRad ?? 0);
  const trueEps = meanEps + nut.dEps + (eop.ddEpsRad ?? 0);
  const eqEquinoxes = dPsi * Math.cos(meanEps);
  return chain(precessionMatrix(T), nutationMatrix(meanEps, dPsi, trueEps), rot3(-eqEquinoxes));
}

export function temeToGcrf(s: StateVector<'TEME'>, t: Instant, eop: EarthOrientation = {}): StateVector<'GCRF'> {
  const m = temeToGcrfMatrix(t, eop);
  return state<'GCRF'>(apply(m, s.r[0], s.r[1], s.r[2]), apply(m, s.v[0], s.v[1], s.v[2]));
}

export function gcrfToTeme(s: StateVector<'GCRF'>, t: Instant, eop: EarthOrientation = {}): StateVector<'TEME'> {
  const m = transpose(temeToGcrfMatrix(t, eop));
  return state<'TEME'>(apply(m, s.r[0], s.r[1], s.r[2]), apply(m, s.v[0], s.v[1], s.v[2]));
}

/** r_PEF = W · r_ITRF (Vallado's polarm for IAU-76/FK5). */
const polarMotion = (eop: EarthOrientation): Mat3 => chain(rot1(eop.ypRad ?? 0), rot2(eop.xpRad ?? 0));

export function temeToItrf(s: StateVector<'TEME'>, t: Instant, eop: EarthOrientation = {}): StateVector<'ITRF'> {
  const st = rot3(gmst1982(ut1DaysSinceJ2000(t, eop.ut1MinusUtcS)));
  const w = earthRotationRate(eop.lodS);
  const rp = apply(st, s.r[0], s.r[1], s.r[2]);
  const vp = apply(st, s.v[0], s.v[1], s.v[2]);
  // Earth-fixed velocity: subtract ω × r, ω along +z.
  vp[0] += w * rp[1];
  vp[1] -= w * rp[0];
  const wt = transpose(polarMotion(eop));
  return state<'ITRF'>(apply(wt, rp[0], rp[1], rp[2]), apply(wt, vp[0], vp[1], vp[2]));
}

export function itrfToTeme(s: StateVector<'ITRF'>, t: Instant, eop: EarthOrientation = {}): StateVector<'TEME'> {
  const pm = polarMotion(eop);
  const rp = apply(pm, s.r[0], s.r[1], s.r[2]);
  const vp = apply(pm, s.v[0], s.v[1], s.v[2]);
  const w = earthRotationRate(eop.lodS);
  vp[0] -= w * rp[1];
  vp[1] += w * rp[0];
  const st = transpose(rot3(gmst1982(ut1DaysSinceJ2000(t, eop.ut1MinusUtcS))));
  return state<'TEME'>(apply(st, rp[0], rp[1], rp[2]), apply(st, vp[0], vp[1], vp[2]));
}
