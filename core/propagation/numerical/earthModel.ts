/**
 * Earth constants of the numerical force model.
 *
 * Gravity: EGM-96 (Lemoine et al., "The Development of the Joint NASA GSFC and NIMA Geopotential
 * Model EGM96", NASA/TP-1998-206861): GM and reference radius of the model, and the fully
 * normalised zonal coefficients C̄20, C̄30, C̄40 as published in its coefficient file. The
 * unnormalised zonal harmonics are J_n = −√(2n+1)·C̄n0, giving J2 = 1.0826267e-3,
 * J3 = −2.5326565e-6, J4 = −1.6196216e-6 (the values of Vallado, Fundamentals of
 * Astrodynamics and Applications, 4th ed., Table D-1 — from memory).
 *
 * Why these and not SGP4's WGS-72 set: the integrator is an independent model. Seeded from an
 * SGP4 state, the μ difference (0.36 km³/s², 9e-7 relative) moves the mean motion by 4.5e-7
 * relative, ≈ 20 m along track per LEO orbit — small beside the other differences between SGP4
 * and a numerical model, and it cancels in the manoeuvred-minus-unmanoeuvred difference.
 */
const C20_NORMALISED = -0.484165371736e-3;
const C30_NORMALISED = 0.957254173792e-6;
const C40_NORMALISED = 0.539873863789e-6;

/** km³/s², EGM-96 */
export const MU_EGM96 = 398600.4415;
/** km, EGM-96 reference radius */
export const R_EGM96 = 6378.1363;
export const J2_EGM96 = -Math.sqrt(5) * C20_NORMALISED;
export const J3_EGM96 = -Math.sqrt(7) * C30_NORMALISED;
export const J4_EGM96 = -3 * C40_NORMALISED;

/**
 * Earth's rotation rate (rad/s), WGS-84 (NIMA TR8350.2): turns the atmosphere with the Earth
 * about TEME's z axis (the true pole, which differs from the rotation axis only by polar
 * motion, < 0.6″).
 */
export const EARTH_ROTATION_RAD_S = 7.292115e-5;
/** WGS-84 equatorial radius (km) and flattening, for the height above the ellipsoid in the drag model. */
export const WGS84_A_KM = 6378.137;
export const WGS84_FLATTENING = 1 / 298.257223563;
