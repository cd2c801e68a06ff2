/**
 * Branded units and frames.
 *
 * A plain `number` or `number[]` carries no unit; these brands make mixing km and m, or a TEME
 * vector and an ITRF vector, a compile error. Brands cost nothing at run time.
 */
declare const unitBrand: unique symbol;
declare const frameBrand: unique symbol;

export type Km = number & { readonly [unitBrand]: 'km' };
export type M = number & { readonly [unitBrand]: 'm' };
/**
 * Speeds are spelled unit + "S" everywhere, in types and in names: `KmS` (km/s, as in
 * `relativeSpeedKmS`) and `MS` (m/s). A name ending in `Ms` (lower-case s) is milliseconds
 * (`wallMs`); the plan JSON of DESIGN.md keeps its contract names (`deltaVMs` is m/s there).
 */
export type KmS = number & { readonly [unitBrand]: 'km/s' };
export type MS = number & { readonly [unitBrand]: 'm/s' };
export type Seconds = number & { readonly [unitBrand]: 's' };
export type Deg = number & { readonly [unitBrand]: 'deg' };
export type Rad = number & { readonly [unitBrand]: 'rad' };

export const km = (x: number): Km => x as Km;
export const m = (x: number): M => x as M;
export const kmS = (x: number): KmS => x as KmS;
export const mS = (x: number): MS => x as MS;
export const seconds = (x: number): Seconds => x as Seconds;
export const deg = (x: number): Deg => x as Deg;
export const rad = (x: number): Rad => x as Rad;

export const kmToM = (x: Km): M => (x * 1000) as M;
export const mToKm = (x: M): Km => (x / 1000) as Km;
export const kmSToMS = (x: KmS): MS => (x * 1000) as MS;
export const mSToKmS = (x: MS): KmS => (x / 1000) as KmS;
export const degToRad = (x: Deg): Rad => ((x * Math.PI) / 180) as Rad;
export const radToDeg = (x: Rad): Deg => ((x * 180) / Math.PI) as Deg;

/** Reference frames used in Keepclear. */
export type Frame = 'TEME' | 'ITRF' | 'GCRF' | 'EME2000' | 'RTN';

/** A 3-vector in a named frame with a named unit: `Vec3<'TEME', Km>`. */
export type Vec3<F extends Frame, U extends number = number> = readonly [U, U, U] & {
  readonly [frameBrand]: F;
};

export const vec3 = <F extends Frame, U extends number = number>(
  x: number,
  y: number,
  z: number,
): Vec3<F, U> => [x, y, z] as unknown as Vec3<F, U>;

/** Position and velocity in one frame, km and km/s. */
export interface StateVector<F extends Frame> {
  readonly r: Vec3<F, Km>;
  readonly v: Vec3<F, KmS>;
}

/** Physical constants. WGS-84 for conversions at the edges; SGP4 uses its own WGS-72 set inside. */
export const MU_EARTH_WGS84 = 398600.4418 as number; // km^3/s^2, NIMA TR8350.2 (WGS-84)
export const MU_EARTH_WGS72 = 398600.8 as number; // km^3/s^2, Spacetrack Report #3 / Vallado 2006 (WGS-72)
export const R_EARTH_WGS84 = 6378.137 as Km; // km, WGS-84 equatorial radius
export const R_EARTH_WGS72 = 6378.135 as Km; // km, WGS-72 equatorial radius (SGP4)
export const G0 = 9.80665; // m/s² standard gravity (CGPM 1901), used in the rocket equation (an acceleration, not a speed)
