/**
 * GCRF ↔ EME2000 (mean equator and equinox of J2000.0, the FK5 "J2000" frame that CCSDS
 * messages call EME2000). They differ only by the frame bias, a fixed rotation of ~23 mas
 * (≈ 0.8 m at LEO radius, ≈ 4.7 m at GEO radius). Bias angles: IERS Conventions 2003/2010
 * §5.5.4 — dα₀ = −14.6 mas, ξ₀ = −16.617 mas, η₀ = −6.8192 mas; r_EME2000 = B · r_GCRF,
 * B = R1(−η₀) R2(ξ₀) R3(dα₀) in the passive convention of rotation.ts.
 *
 * Note: the FK5 reduction of teme.ts without δΔψ/δΔε lands in a frame that is neither exactly
 * (its equator carries the 1980 nutation's errors); both are within ~0.05″ of each other.
 */
import { vec3, type Frame, type Km, type KmS, type StateVector } from '../units.js';
import { apply, ARCSEC, chain, rot1, rot2, rot3, transpose, type Mat3 } from './rotation.js';

const MAS = 1e-3 * ARCSEC;
const D_ALPHA0 = -14.6 * MAS;
const XI0 = -16.617 * MAS;
const ETA0 = -6.8192 * MAS;

/** r_EME2000 = FRAME_BIAS · r_GCRF. */
export const FRAME_BIAS: Mat3 = chain(rot1(-ETA0), rot2(XI0), rot3(D_ALPHA0));

function rotate<A extends Frame, B extends Frame>(m: Mat3, s: StateVector<A>): StateVector<B> {
  const r = apply(m, s.r[0], s.r[1], s.r[2]);
  const v = apply(m, s.v[0], s.v[1], s.v[2]);
  return { r: vec3<B, Km>(r[0], r[1], r[2]), v: vec3<B, KmS>(v[0], v[1], v[2]) };
}

export const gcrfToEme2000 = (s: StateVector<'GCRF'>): StateVector<'EME2000'> => rotate(FRAME_BIAS, s);
export const eme2000ToGcrf = (s: StateVector<'EME2000'>): StateVector<'GCRF'> => rotate(transpose(FRAME_BIAS), s);
