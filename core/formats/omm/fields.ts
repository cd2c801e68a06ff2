/**
 * One OMM's keywords → ElementSet, shared by the KVN, XML, JSON and CSV readers so all four
 * apply the same rules (CCSDS 502.0-B-2 §4, OMM with MEAN_ELEMENT_THEORY = SGP4).
 */
import type { ElementSet, SourceRef } from '../../elements/elementSet.js';
import type { ErrorCode } from '../../errors.js';
import { canonicalObjectId } from '../../elements/objectId.js';
import { parseCcsdsEpoch } from '../ccsds-time.js';
import { quoteValue } from '../result.js';

/** One keyword's value as read, with the line it was on and its units when given. */
export interface OmmField {
  readonly value: string | number;
  readonly line: number;
  readonly units?: string | undefined;
}

/** A problem with one OMM; the reader turns it into a Rejection. */
export class OmmProblem {
  constructor(
    readonly code: ErrorCode,
    readonly line: number,
    readonly reason: string,
  ) {}
}

/** Header and metadata keywords mandatory in KVN/XML (502.0-B-2 Tables 4-1, 4-2). */
export const OMM_HEADER_KEYWORDS = [
  'CCSDS_OMM_VERS',
  'CREATION_DATE',
  'ORIGINATOR',
  'CENTER_NAME',
  'REF_FRAME',
  'TIME_SYSTEM',
  'MEAN_ELEMENT_THEORY',
] as const;

/**
 * Mandatory everywhere: object identity, the mean elements (Table 4-3) and the TLE-related
 * parameters SGP4 needs (NORAD_CAT_ID, BSTAR, MEAN_MOTION_DOT, MEAN_MOTION_DDOT).
 */
export const OMM_BODY_KEYWORDS = [
  'OBJECT_NAME',
  'OBJECT_ID',
  'EPOCH',
  'MEAN_MOTION',
  'ECCENTRICITY',
  'INCLINATION',
  'RA_OF_ASC_NODE',
  'ARG_OF_PERICENTER',
  'MEAN_ANOMALY',
  'NORAD_CAT_ID',
  'BSTAR',
  'MEAN_MOTION_DOT',
  'MEAN_MOTION_DDOT',
] as const;

/**
 * Accepted MEAN_ELEMENT_THEORY values: "SGP4" and "SGP/SGP4" (the latter is how the
 * 502.0-B-2 example and public KVN providers write it; their XML says "SGP4"). SGP4-XP and
 * others use different drag terms and are refused.
 */
export const ACCEPTED_THEORIES = ['SGP4', 'SGP/SGP4'] as const;

/** Units a value may carry (case-insensitive); any other unit means a different quantity. */
const UNITS: Record<string, string> = {
  MEAN_MOTION: 'rev/day',
  INCLINATION: 'deg',
  RA_OF_ASC_NODE: 'deg',
  ARG_OF_PERICENTER: 'deg',
  MEAN_ANOMALY: 'deg',
  BSTAR: '1/ER',
  MEAN_MOTION_DOT: 'rev/day**2',
  MEAN_MOTION_DDOT: 'rev/day**3',
};

/** CCSDS numbers: optional sign, digits with optional point (".5" as providers write it), exponent. */
const NUMBER_RE = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

export interface OmmContext {
  readonly file: string;
  /** Line where this OMM starts (its CCSDS_OMM_VERS line, <omm> tag, object brace or CSV row). */
  readonly line: number;
  readonly format: SourceRef['format'];
  /** KVN/XML must carry the header keywords; JSON/CSV from public providers often omit them. */
  readonly requireHeader: boolean;
}

export function ommToElementSet(get: (k: string) => OmmField | undefined, ctx: OmmContext): ElementSet {
  const required = ctx.requireHeader ? [...OMM_HEADER_KEYWORDS, ...OMM_BODY_KEYWORDS] : OMM_BODY_KEYWORDS;
  const missing = required.filter((k) => get(k) === undefined);
  if (missing.length > 0)
    throw new OmmProblem(
      'OMM_MISSING_KEYWORD',
      ctx.line,
      `OMM is missing the mandatory keyword${missing.length > 1 ? 's' : ''} ${missing.join(', ')} ` +
        `(CCSDS 502.0-B-2 with SGP4 elements): add ${missing.length > 1 ? 'them' : 'it'}, or re-export the OMM complete`,
    );

  const text = (k: string): string | null => {
    const f = get(k);
    return f === undefined ? null : String(f.value).trim();
  };
  const lineOf = (k: string): number => get(k)?.line ?? ctx.line;
  const bad = (k: string, what: string, code: ErrorCode = 'OMM_FIELD'): never => {
    throw new OmmProblem(code, lineOf(k), `${k} is '${quoteValue(text(k) ?? '')}': ${what}`);
  };

  // Header values, checked whenever present (also in JSON/CSV, where an empty cell is absent).
  const headerText = (k: string): string | null => {
    const t = text(k);
    return t === '' && !ctx.requireHeader ? null : t;
  };
  const vers = headerText('CCSDS_OMM_VERS');
  if (vers !== null && !/^[123]\.\d+$/.test(vers))
    bad('CCSDS_OMM_VERS', 'expected an OMM version such as 2.0; this file may not be an OMM');
  const center = headerText('CENTER_NAME');
  if (center !== null && center.toUpperCase() !== 'EARTH')
    bad('CENTER_NAME', 'SGP4 elements are Earth-centred; expected EARTH');
  const frame = headerText('REF_FRAME');
  if (frame !== null && frame.toUpperCase() !== 'TEME')
    bad('REF_FRAME', 'SGP4 mean elements are in TEME; expected TEME (re-export the elements for SGP4)');
  const ts = headerText('TIME_SYSTEM');
  if (ts !== null && ts.toUpperCase() !== 'UTC')
    bad('TIME_SYSTEM', 'SGP4 element epochs are UTC; expected UTC');
  const theory = headerText('MEAN_ELEMENT_THEORY');
  if (theory !== null && !(ACCEPTED_THEORIES as readonly string[]).includes(theory.toUpperCase()))
    bad(
      'MEAN_ELEMENT_THEORY',
      `only ${ACCEPTED_THEORIES.join(' or ')} mean elements can be propagated here; ` +
        'request SGP4 elements from the provider',
    );

  const num = (k: string): number => {
    const f = get(k);
    if (f === undefined) return bad(k, 'missing', 'OMM_MISSING_KEYWORD');
    const want = UNITS[k];
    if (f.units !== undefined && want !== undefined && f.units.toLowerCase() !== want.toLowerCase())
      bad(k, `its units are [${f.units}] but ${k} must be in [${want}]`);
    if (typeof f.value === 'number') {
      if (!Number.isFinite(f.value)) bad(k, 'expected a finite number');
      return f.value;
    }
    const t = f.value.trim();
    if (!NUMBER_RE.test(t)) bad(k, 'expected a number; correct the value or re-export the OMM');
    return Number(t);
  };
  const optInt = (k: string, dflt: number): number => {
    if (get(k) === undefined || text(k) === '') return dflt;
    const v = num(k);
    if (!Number.isInteger(v) || v < 0) bad(k, 'expected a whole number ≥ 0');
    return v;
  };
  const range = (k: string, lo: number, hi: number, hiOpen: boolean, unit: string): number => {
    const v = num(k);
    if (v < lo || v > hi || (hiOpen && v === hi))
      bad(k, `outside ${lo}..${hi}${hiOpen ? ' (exclusive)' : ''}${unit}; the element set is invalid: correct it or re-download it`, 'VALUE_OUT_OF_RANGE');
    return v;
  };

  const epochText = text('EPOCH') ?? '';
  const epoch = parseCcsdsEpoch(epochText);
  if (epoch === null)
    bad('EPOCH', "expected a UTC time like '2007-03-05T10:34:41.4264' or '2007-064T10:34:41.4264'");

  const eccentricity = range('ECCENTRICITY', 0, 1, true, '');
  const meanMotionRevPerDay = num('MEAN_MOTION');
  if (!(meanMotionRevPerDay > 0)) bad('MEAN_MOTION', 'mean motion must be greater than 0 rev/day; the element set is invalid: correct it or re-download it', 'VALUE_OUT_OF_RANGE');
  const inclinationDeg = range('INCLINATION', 0, 180, false, ' deg');
  const raanDeg = range('RA_OF_ASC_NODE', 0, 360, false, ' deg');
  const argPerigeeDeg = range('ARG_OF_PERICENTER', 0, 360, false, ' deg');
  const meanAnomalyDeg = range('MEAN_ANOMALY', 0, 360, false, ' deg');

  const objectId = canonicalObjectId(text('NORAD_CAT_ID') ?? '');
  if (!/^\d+$/.test(objectId)) bad('NORAD_CAT_ID', 'expected a catalogue number (digits, or Alpha-5 such as A0001)');
  const cls = text('CLASSIFICATION_TYPE') || 'U';
  if (cls.length !== 1) bad('CLASSIFICATION_TYPE', "expected one letter such as 'U'");

  const name = text('OBJECT_NAME');
  const id = text('OBJECT_ID');
  return {
    objectId,
    // Empty OBJECT_NAME / OBJECT_ID are accepted as unknown (public providers write them blank).
    name: name ? name : null,
    intlDesignator: id ? id : null,
    classification: cls,
    epoch: epoch!,
    meanMotionRevPerDay,
    eccentricity,
    inclinationDeg,
    raanDeg,
    argPerigeeDeg,
    meanAnomalyDeg,
    bstar: num('BSTAR'),
    meanMotionDot: num('MEAN_MOTION_DOT'),
    meanMotionDdot: num('MEAN_MOTION_DDOT'),
    elementSetNo: optInt('ELEMENT_SET_NO', 0),
    revAtEpoch: optInt('REV_AT_EPOCH', 0),
    ephemerisType: optInt('EPHEMERIS_TYPE', 0),
    source: { file: ctx.file, line: ctx.line, format: ctx.format },
  };
}
