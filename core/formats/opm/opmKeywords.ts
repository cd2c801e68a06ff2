/**
 * OPM keywords of CCSDS 502.0-B-2 (tables 3-1 header, 3-2 metadata, 3-3 data) with the units the
 * standard gives them. Units in square brackets in a file are optional; when present they must
 * be these (compared without case and spaces).
 */
export const HEADER_KEYS = ['CCSDS_OPM_VERS', 'CREATION_DATE', 'ORIGINATOR'] as const;
export const METADATA_KEYS = ['OBJECT_NAME', 'OBJECT_ID', 'CENTER_NAME', 'REF_FRAME', 'REF_FRAME_EPOCH', 'TIME_SYSTEM'] as const;
export const STATE_KEYS = ['EPOCH', 'X', 'Y', 'Z', 'X_DOT', 'Y_DOT', 'Z_DOT'] as const;
export const KEPLERIAN_KEYS = [
  'SEMI_MAJOR_AXIS', 'ECCENTRICITY', 'INCLINATION', 'RA_OF_ASC_NODE', 'ARG_OF_PERICENTER', 'TRUE_ANOMALY', 'MEAN_ANOMALY', 'GM',
] as const;
export const SPACECRAFT_KEYS = ['MASS', 'SOLAR_RAD_AREA', 'SOLAR_RAD_COEFF', 'DRAG_AREA', 'DRAG_COEFF'] as const;
const COV_AXES = ['X', 'Y', 'Z', 'X_DOT', 'Y_DOT', 'Z_DOT'];
/** CX_X, CY_X, CY_Y, … CZ_DOT_Z_DOT: the lower triangle, row by row. */
export const COVARIANCE_KEYS = ['COV_REF_FRAME', ...COV_AXES.flatMap((r, i) => COV_AXES.slice(0, i + 1).map((c) => `C${r}_${c}`))];
/** Every manoeuvre repeats all of these, in this order (502.0-B-2 §3.2.4.8). */
export const MANOEUVRE_KEYS = [
  'MAN_EPOCH_IGNITION', 'MAN_DURATION', 'MAN_DELTA_MASS', 'MAN_REF_FRAME', 'MAN_DV_1', 'MAN_DV_2', 'MAN_DV_3',
] as const;

export const REQUIRED_KEYS = [
  'CREATION_DATE', 'ORIGINATOR', 'OBJECT_NAME', 'OBJECT_ID', 'CENTER_NAME', 'REF_FRAME', 'TIME_SYSTEM', ...STATE_KEYS,
] as const;

export const UNITS: Readonly<Record<string, string>> = {
  X: 'km', Y: 'km', Z: 'km', X_DOT: 'km/s', Y_DOT: 'km/s', Z_DOT: 'km/s',
  SEMI_MAJOR_AXIS: 'km', INCLINATION: 'deg', RA_OF_ASC_NODE: 'deg', ARG_OF_PERICENTER: 'deg', TRUE_ANOMALY: 'deg',
  MEAN_ANOMALY: 'deg', GM: 'km**3/s**2',
  MASS: 'kg', SOLAR_RAD_AREA: 'm**2', DRAG_AREA: 'm**2',
  MAN_DURATION: 's', MAN_DELTA_MASS: 'kg', MAN_DV_1: 'km/s', MAN_DV_2: 'km/s', MAN_DV_3: 'km/s',
};

export const KNOWN_KEYS: ReadonlySet<string> = new Set<string>([
  ...HEADER_KEYS, ...METADATA_KEYS, ...STATE_KEYS, ...KEPLERIAN_KEYS, ...SPACECRAFT_KEYS, ...COVARIANCE_KEYS, ...MANOEUVRE_KEYS,
]);
