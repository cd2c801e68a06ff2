/**
 * The OEM vocabulary of CCSDS 502.0-B-2 (section 5: header, metadata, data lines, covariance)
 * and what Keepclear accepts of it. Readers, validation and the writer work from these lists so
 * they cannot disagree. Keyword obligations are as the standard's OEM tables give them (recalled
 * from memory, cross-checked against the standard's example in test/authorities/ccsds-502).
 */

/** Versions read: 2.0 is the standard's; 1.0 and 3.0 differ only in keywords Keepclear ignores. */
export const OEM_VERSIONS = ['1.0', '2.0', '3.0'] as const;

export const HEADER_MANDATORY = ['CCSDS_OEM_VERS', 'CREATION_DATE', 'ORIGINATOR'] as const;
/** MESSAGE_ID is optional in 2.0; CLASSIFICATION exists from 3.0 on and is kept as a comment-like extra. */
export const HEADER_OPTIONAL = ['MESSAGE_ID', 'CLASSIFICATION'] as const;

export const METADATA_MANDATORY = [
  'OBJECT_NAME', 'OBJECT_ID', 'CENTER_NAME', 'REF_FRAME', 'TIME_SYSTEM', 'START_TIME', 'STOP_TIME',
] as const;
export const METADATA_OPTIONAL = [
  'REF_FRAME_EPOCH', 'USEABLE_START_TIME', 'USEABLE_STOP_TIME', 'INTERPOLATION', 'INTERPOLATION_DEGREE',
] as const;
export const METADATA_KEYWORDS: ReadonlySet<string> = new Set([...METADATA_MANDATORY, ...METADATA_OPTIONAL]);
export const METADATA_TIMES = ['REF_FRAME_EPOCH', 'START_TIME', 'USEABLE_START_TIME', 'USEABLE_STOP_TIME', 'STOP_TIME'] as const;

/** Units of the data-line columns after the epoch (502.0-B-2 §5.2.4): km, km/s, optional km/s². */
export const STATE_UNITS = ['km', 'km', 'km', 'km/s', 'km/s', 'km/s', 'km/s**2', 'km/s**2', 'km/s**2'] as const;
/** XML element names of those columns, in order. */
export const STATE_ELEMENTS = ['X', 'Y', 'Z', 'X_DOT', 'Y_DOT', 'Z_DOT', 'X_DDOT', 'Y_DDOT', 'Z_DDOT'] as const;

/** Axes of the 6×6 covariance in the standard's order. */
const COV_AXES = ['X', 'Y', 'Z', 'X_DOT', 'Y_DOT', 'Z_DOT'] as const;
export const COV_DIMENSION = 6;
/** 21 lower-triangle terms, row by row (the KVN line order). */
export const COV_TERM_COUNT = 21;

export interface CovarianceTerm {
  readonly row: number;
  readonly col: number;
  /** XML element name, e.g. CY_DOT_X. */
  readonly element: string;
  /** Unit: km**2 (position × position), km**2/s (position × velocity), km**2/s**2. */
  readonly unit: 'km**2' | 'km**2/s' | 'km**2/s**2';
}

export const COVARIANCE_TERMS: readonly CovarianceTerm[] = COV_AXES.flatMap((a, row) =>
  COV_AXES.slice(0, row + 1).map((b, col): CovarianceTerm => ({
    row, col, element: `C${a}_${b}`,
    unit: row < 3 ? 'km**2' : col < 3 ? 'km**2/s' : 'km**2/s**2',
  })),
);

/** The frames core/frames can turn into TEME. */
export type OemStateFrame = 'EME2000' | 'GCRF' | 'ITRF' | 'TEME';

export interface FrameReading<F extends string> {
  readonly frame: F;
  /** Said to the user when the name is read as another frame. */
  readonly note?: string;
}

const ITRF_RE = /^ITRF(?:-?\d{2}|\d{4})?$/;

/**
 * REF_FRAME names Keepclear reads (SANA reference-frame names as 502.0-B-2 annex A lists them).
 * ICRF around the Earth has the GCRF's axes; ITRF realisations differ by centimetres, far below
 * what the UT1 = UTC assumption of core/frames costs, so all are read as one ITRF.
 */
export function readStateFrame(name: string): FrameReading<OemStateFrame> | null {
  const n = name.trim().toUpperCase();
  if (n === 'EME2000' || n === 'GCRF' || n === 'TEME') return { frame: n };
  if (n === 'ICRF')
    return { frame: 'GCRF', note: 'REF_FRAME = ICRF is read as GCRF (the geocentric frame with ICRF axes)' };
  if (ITRF_RE.test(n))
    return {
      frame: 'ITRF',
      note:
        `REF_FRAME = ${n} is read as ITRF and rotated to TEME with UT1 = UTC and no polar motion ` +
        '(no Earth orientation file): that rotation can be off by up to 0.44 km along-track at LEO radius; ' +
        'an ephemeris in EME2000 or GCRF avoids this',
    };
  return null;
}

export const SUPPORTED_FRAMES_TEXT = 'EME2000, GCRF, ICRF (read as GCRF), ITRF, ITRF-93, ITRF-97, ITRF2000 … ITRF2020 (read as ITRF) or TEME';

/** Covariance frames: the state frames plus the object's local orbital frames. */
export type OemCovarianceFrame = OemStateFrame | 'RTN' | 'TNW';

export function readCovarianceFrame(name: string): FrameReading<OemCovarianceFrame> | null {
  const n = name.trim().toUpperCase();
  if (n === 'RTN') return { frame: 'RTN' };
  if (n === 'RSW') return { frame: 'RTN', note: 'COV_REF_FRAME = RSW is the same frame as RTN (radial, along-track, cross-track)' };
  if (n === 'TNW') return { frame: 'TNW' };
  return readStateFrame(n);
}

/** Time scales Keepclear converts to UTC (through core/time/leapSeconds.ts). */
export const OEM_TIME_SYSTEMS = ['UTC', 'TAI', 'TT', 'GPS'] as const;
export type OemTimeSystem = (typeof OEM_TIME_SYSTEMS)[number];

export const readTimeSystem = (name: string): OemTimeSystem | null => {
  const n = name.trim().toUpperCase();
  return (OEM_TIME_SYSTEMS as readonly string[]).includes(n) ? (n as OemTimeSystem) : null;
};

export const OEM_INTERPOLATIONS = ['HERMITE', 'LAGRANGE', 'LINEAR'] as const;
export type OemInterpolationMethod = (typeof OEM_INTERPOLATIONS)[number];

export const readInterpolation = (name: string): OemInterpolationMethod | null => {
  const n = name.trim().toUpperCase();
  return (OEM_INTERPOLATIONS as readonly string[]).includes(n) ? (n as OemInterpolationMethod) : null;
};

/** Unit comparison: the standard writes units in lower case; some producers do not. */
export const sameUnit = (given: string, expected: string): boolean =>
  given.trim().toLowerCase() === expected.toLowerCase();
