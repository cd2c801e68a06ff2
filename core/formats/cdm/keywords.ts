/**
 * The CDM keyword tables of CCSDS 508.0-B-1 (tables 3-1 header, 3-2 relative metadata/data,
 * 3-3 object metadata, 3-4 object data), one row per keyword: block, value kind, unit as the
 * standard spells it, and whether it is mandatory. Readers, validation and the writer all work
 * from this one table so they cannot disagree.
 *
 * Mandatory flags and units were taken from the standard's tables as recalled from memory and
 * cross-checked against the standard's own obligatory-keywords example
 * (test/authorities/ccsds-508/cdm-obligatory.kvn), which carries exactly the mandatory set.
 */
export type CdmBlock =
  | 'header'
  | 'relative'
  | 'metadata'
  | 'od'
  | 'additional'
  | 'state'
  | 'covariance';

export type CdmValueKind = 'text' | 'number' | 'integer' | 'time' | 'enum' | 'version';

export interface CdmKeywordSpec {
  readonly keyword: string;
  readonly block: CdmBlock;
  readonly kind: CdmValueKind;
  /** Unit exactly as the standard prints it between brackets; undefined = dimensionless/none. */
  readonly unit?: string;
  readonly mandatory: boolean;
  readonly values?: readonly string[];
  /** Property name in the model (camelCase of the keyword). */
  readonly prop: string;
}

const camel = (kw: string): string =>
  kw.toLowerCase().replace(/_([a-z0-9])/g, (_, c: string) => c.toUpperCase());

type Row = [keyword: string, kind: CdmValueKind, unit: string | undefined, mandatory: boolean, values?: readonly string[]];

const YES_NO = ['YES', 'NO'] as const;
export const CDM_REF_FRAMES = ['EME2000', 'GCRF', 'ITRF'] as const;

const rows: Record<Exclude<CdmBlock, 'covariance'>, Row[]> = {
  header: [
    ['CCSDS_CDM_VERS', 'version', undefined, true],
    ['CREATION_DATE', 'time', undefined, true],
    ['ORIGINATOR', 'text', undefined, true],
    ['MESSAGE_FOR', 'text', undefined, false],
    ['MESSAGE_ID', 'text', undefined, true],
  ],
  relative: [
    ['TCA', 'time', undefined, true],
    ['MISS_DISTANCE', 'number', 'm', true],
    ['RELATIVE_SPEED', 'number', 'm/s', false],
    ['RELATIVE_POSITION_R', 'number', 'm', false],
    ['RELATIVE_POSITION_T', 'number', 'm', false],
    ['RELATIVE_POSITION_N', 'number', 'm', false],
    ['RELATIVE_VELOCITY_R', 'number', 'm/s', false],
    ['RELATIVE_VELOCITY_T', 'number', 'm/s', false],
    ['RELATIVE_VELOCITY_N', 'number', 'm/s', false],
    ['START_SCREEN_PERIOD', 'time', undefined, false],
    ['STOP_SCREEN_PERIOD', 'time', undefined, false],
    ['SCREEN_VOLUME_FRAME', 'enum', undefined, false, ['RTN', 'TVN']],
    ['SCREEN_VOLUME_SHAPE', 'enum', undefined, false, ['ELLIPSOID', 'BOX']],
    ['SCREEN_VOLUME_X', 'number', 'm', false],
    ['SCREEN_VOLUME_Y', 'number', 'm', false],
    ['SCREEN_VOLUME_Z', 'number', 'm', false],
    ['SCREEN_ENTRY_TIME', 'time', undefined, false],
    ['SCREEN_EXIT_TIME', 'time', undefined, false],
    ['COLLISION_PROBABILITY', 'number', undefined, false],
    ['COLLISION_PROBABILITY_METHOD', 'text', undefined, false],
  ],
  metadata: [
    ['OBJECT', 'enum', undefined, true, ['OBJECT1', 'OBJECT2']],
    ['OBJECT_DESIGNATOR', 'text', undefined, true],
    ['CATALOG_NAME', 'text', undefined, true],
    ['OBJECT_NAME', 'text', undefined, true],
    ['INTERNATIONAL_DESIGNATOR', 'text', undefined, true],
    ['OBJECT_TYPE', 'enum', undefined, false, ['PAYLOAD', 'ROCKET BODY', 'DEBRIS', 'UNKNOWN', 'OTHER']],
    ['OPERATOR_CONTACT_POSITION', 'text', undefined, false],
    ['OPERATOR_ORGANIZATION', 'text', undefined, false],
    ['OPERATOR_PHONE', 'text', undefined, false],
    ['OPERATOR_EMAIL', 'text', undefined, false],
    ['EPHEMERIS_NAME', 'text', undefined, true],
    ['COVARIANCE_METHOD', 'enum', undefined, true, ['CALCULATED', 'DEFAULT']],
    ['MANEUVERABLE', 'enum', undefined, true, ['YES', 'NO', 'N/A']],
    ['ORBIT_CENTER', 'text', undefined, false],
    ['REF_FRAME', 'enum', undefined, true, CDM_REF_FRAMES],
    ['GRAVITY_MODEL', 'text', undefined, false],
    ['ATMOSPHERIC_MODEL', 'text', undefined, false],
    ['N_BODY_PERTURBATIONS', 'text', undefined, false],
    ['SOLAR_RAD_PRESSURE', 'enum', undefined, false, YES_NO],
    ['EARTH_TIDES', 'enum', undefined, false, YES_NO],
    ['INTRACK_THRUST', 'enum', undefined, false, YES_NO],
  ],
  od: [
    ['TIME_LASTOB_START', 'time', undefined, false],
    ['TIME_LASTOB_END', 'time', undefined, false],
    ['RECOMMENDED_OD_SPAN', 'number', 'd', false],
    ['ACTUAL_OD_SPAN', 'number', 'd', false],
    ['OBS_AVAILABLE', 'integer', undefined, false],
    ['OBS_USED', 'integer', undefined, false],
    ['TRACKS_AVAILABLE', 'integer', undefined, false],
    ['TRACKS_USED', 'integer', undefined, false],
    ['RESIDUALS_ACCEPTED', 'number', '%', false],
    ['WEIGHTED_RMS', 'number', undefined, false],
  ],
  additional: [
    ['AREA_PC', 'number', 'm**2', false],
    ['AREA_DRG', 'number', 'm**2', false],
    ['AREA_SRP', 'number', 'm**2', false],
    ['MASS', 'number', 'kg', false],
    ['CD_AREA_OVER_MASS', 'number', 'm**2/kg', false],
    ['CR_AREA_OVER_MASS', 'number', 'm**2/kg', false],
    ['THRUST_ACCELERATION', 'number', 'm/s**2', false],
    ['SEDR', 'number', 'W/kg', false],
  ],
  state: [
    ['X', 'number', 'km', true],
    ['Y', 'number', 'km', true],
    ['Z', 'number', 'km', true],
    ['X_DOT', 'number', 'km/s', true],
    ['Y_DOT', 'number', 'km/s', true],
    ['Z_DOT', 'number', 'km/s', true],
  ],
};

/**
 * Covariance rows and columns in the standard's order. The unit of a term is the product of the
 * row's and column's "standard deviation" units; the standard prints them in its own spelling,
 * so they are listed explicitly rather than derived.
 */
export const COV_AXES = ['R', 'T', 'N', 'RDOT', 'TDOT', 'NDOT', 'DRG', 'SRP', 'THR'] as const;

const COV_UNITS: readonly (readonly string[])[] = [
  ['m**2'],
  ['m**2', 'm**2'],
  ['m**2', 'm**2', 'm**2'],
  ['m**2/s', 'm**2/s', 'm**2/s', 'm**2/s**2'],
  ['m**2/s', 'm**2/s', 'm**2/s', 'm**2/s**2', 'm**2/s**2'],
  ['m**2/s', 'm**2/s', 'm**2/s', 'm**2/s**2', 'm**2/s**2', 'm**2/s**2'],
  ['m**3/kg', 'm**3/kg', 'm**3/kg', 'm**3/(kg*s)', 'm**3/(kg*s)', 'm**3/(kg*s)', 'm**4/kg**2'],
  ['m**3/kg', 'm**3/kg', 'm**3/kg', 'm**3/(kg*s)', 'm**3/(kg*s)', 'm**3/(kg*s)', 'm**4/kg**2', 'm**4/kg**2'],
  [
    'm**2/s**2', 'm**2/s**2', 'm**2/s**2', 'm**2/s**3', 'm**2/s**3', 'm**2/s**3',
    'm**3/(kg*s**2)', 'm**3/(kg*s**2)', 'm**2/s**4',
  ],
];

/** Keyword of covariance term (row i, column j), j ≤ i, e.g. (3,1) → CRDOT_T. */
export const covKeyword = (i: number, j: number): string => `C${COV_AXES[i]}_${COV_AXES[j]}`;

export interface CovTerm {
  readonly keyword: string;
  readonly row: number;
  readonly col: number;
  readonly unit: string;
}

/** All 45 lower-triangle terms, row by row as the standard orders them (5.2.7). */
export const COV_TERMS: readonly CovTerm[] = COV_UNITS.flatMap((units, i) =>
  units.map((unit, j) => ({ keyword: covKeyword(i, j), row: i, col: j, unit })),
);

/** The 6×6 position-velocity block is mandatory; rows 7–9 (drag, SRP, thrust) are optional. */
export const COV_MANDATORY_DIM = 6;

export const CDM_KEYWORDS: ReadonlyMap<string, CdmKeywordSpec> = new Map(
  [
    ...Object.entries(rows).flatMap(([block, list]) =>
      list.map(([keyword, kind, unit, mandatory, values]): CdmKeywordSpec => ({
        keyword, block: block as CdmBlock, kind, unit, mandatory, values, prop: camel(keyword),
      })),
    ),
    ...COV_TERMS.map((t): CdmKeywordSpec => ({
      keyword: t.keyword, block: 'covariance', kind: 'number', unit: t.unit,
      mandatory: t.row < COV_MANDATORY_DIM, prop: t.keyword,
    })),
  ].map((s) => [s.keyword, s] as const),
);

/** Specs of one block in the standard's order (the writer's order). */
export const specsOf = (block: CdmBlock): CdmKeywordSpec[] =>
  [...CDM_KEYWORDS.values()].filter((s) => s.block === block);

export const OBJECT_BLOCKS: readonly CdmBlock[] = ['metadata', 'od', 'additional', 'state', 'covariance'];
