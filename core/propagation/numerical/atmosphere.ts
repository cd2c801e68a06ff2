/**
 * Exponential atmosphere: ρ(h) = ρ0 · exp(−(h − h0)/H) with base height h0, base density ρ0 and
 * scale height H taken from the band that contains h. Values: Vallado, Fundamentals of
 * Astrodynamics and Applications, 4th ed. (2013), Table 8-4 (CIRA-72 below 25 km and above,
 * U.S. Standard Atmosphere 1976 in between); the same table appears in open implementations
 * (e.g. SatelliteToolboxAtmosphericModels.jl, src/exponential/constants.jl).
 *
 * A static model of mean solar activity: real densities at 400–600 km vary by a factor of ~10
 * over the solar cycle. For avoidance planning this matters little: drag acts almost equally on
 * the manoeuvred and unmanoeuvred copies, and only their difference is used on the SGP4
 * trajectory (see core/manoeuvre/manoeuvredTrajectory.ts).
 */

/** [h0 km, ρ0 kg/m³, H km], ascending h0; each band reaches up to the next h0. */
export const EXPONENTIAL_BANDS: ReadonlyArray<readonly [number, number, number]> = [
  [0, 1.225, 7.249],
  [25, 3.899e-2, 6.349],
  [30, 1.774e-2, 6.682],
  [40, 3.972e-3, 7.554],
  [50, 1.057e-3, 8.382],
  [60, 3.206e-4, 7.714],
  [70, 8.77e-5, 6.549],
  [80, 1.905e-5, 5.799],
  [90, 3.396e-6, 5.382],
  [100, 5.297e-7, 5.877],
  [110, 9.661e-8, 7.263],
  [120, 2.438e-8, 9.473],
  [130, 8.484e-9, 12.636],
  [140, 3.845e-9, 16.149],
  [150, 2.07e-9, 22.523],
  [180, 5.464e-10, 29.74],
  [200, 2.789e-10, 37.105],
  [250, 7.248e-11, 45.546],
  [300, 2.418e-11, 53.628],
  [350, 9.518e-12, 53.298],
  [400, 3.725e-12, 58.515],
  [450, 1.585e-12, 60.828],
  [500, 6.967e-13, 63.822],
  [600, 1.454e-13, 71.835],
  [700, 3.614e-14, 88.667],
  [800, 1.17e-14, 124.64],
  [900, 5.245e-15, 181.05],
  [1000, 3.019e-15, 268.0],
];

/** Density (kg/m³) at a height above the ellipsoid (km). Below 0 km the sea-level band is used. */
export function exponentialDensity(heightKm: number): number {
  const bands = EXPONENTIAL_BANDS;
  // Bands are few and the hot path is near one altitude: a backwards linear scan is enough.
  let i = bands.length - 1;
  while (i > 0 && heightKm < bands[i]![0]) i--;
  const [h0, rho0, scale] = bands[i]!;
  return rho0 * Math.exp(-(heightKm - h0) / scale);
}
