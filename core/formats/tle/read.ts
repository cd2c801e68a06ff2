/**
 * Two-line element set reader (2-line and 3-line forms, mixed in one file).
 *
 * Columns follow the standard TLE layout (Spacetrack Report #3 / the format as distributed by
 * public catalogues). Every field is checked at its exact columns, because a shifted column
 * usually still "parses" as a number with a wrong value: silently wrong orbits are worse than a
 * rejected record. One bad record never stops the file: the reader moves on to the next line
 * that starts with "1 " and is followed by a "2 " line.
 */
import type { ElementSet } from '../../elements/elementSet.js';
import type { ErrorCode, Rejection } from '../../errors.js';
import { instantFromYearDoy } from '../../time/instant.js';
import { rejection, splitLines, type ParseResult } from '../result.js';
import {
  decodeCatalogNumber,
  decodeExpField,
  designatorToOmm,
  fullYear,
  tleChecksum,
} from './fields.js';


const TLE_LINE_LENGTH = 69;

/** A problem with one record: code and reason, located on one line. */
class RecordProblem {
  constructor(
    readonly code: ErrorCode,
    readonly line: number,
    readonly reason: string,
  ) {}
}

const isLine1 = (l: string): boolean => /^1\s/.test(l);
const isLine2 = (l: string): boolean => /^2\s/.test(l);

/** Cuts cols a..b (1-based, inclusive) out of a line, as the standard numbers them. */
const cols = (l: string, a: number, b: number): string => l.slice(a - 1, b);

/**
 * Character-level checks before any field: tabs and non-ASCII make columns meaningless, so
 * they get their own reason instead of a confusing field error.
 */
function checkCharacters(l: string, which: 1 | 2, lineNo: number): void {
  for (let i = 0; i < l.length; i++) {
    const c = l.charCodeAt(i);
    if (c === 9)
      throw new RecordProblem(
        'TLE_COLUMNS',
        lineNo,
        `line ${which} has a tab at column ${i + 1}: TLE fields sit at fixed columns of spaces; ` +
          'replace tabs with spaces so the fields line up again',
      );
    if (c < 32 || c > 126) {
      const ch = String.fromCodePoint(l.codePointAt(i) ?? c);
      const hex = (l.codePointAt(i) ?? c).toString(16).toUpperCase().padStart(4, '0');
      throw new RecordProblem(
        'TLE_FIELD',
        lineNo,
        `line ${which} column ${i + 1} has the non-ASCII character '${ch}' (U+${hex}): ` +
          'TLE lines are plain ASCII; re-export or re-download the file as ASCII text',
      );
    }
  }
}

/** Length and trailing-text checks; returns the 69 significant columns. */
function checkLength(raw: string, which: 1 | 2, lineNo: number): string {
  // Trailing blanks beyond column 69 are common in files that were padded or hand-edited.
  const l = raw.replace(/[ \t]+$/, '');
  // Characters first: a tab or a multi-byte character also changes the length.
  checkCharacters(l, which, lineNo);
  if (l.length < TLE_LINE_LENGTH)
    throw new RecordProblem(
      'TLE_TRUNCATED',
      lineNo,
      `line ${which} is ${l.length} characters long, a TLE line has ${TLE_LINE_LENGTH}: ` +
        'the line is truncated; restore the missing columns or re-download the element set',
    );
  if (l.length > TLE_LINE_LENGTH)
    throw new RecordProblem(
      'TLE_COLUMNS',
      lineNo,
      `line ${which} has text beyond column ${TLE_LINE_LENGTH} ('${l.slice(TLE_LINE_LENGTH, TLE_LINE_LENGTH + 20)}'): ` +
        'a TLE line ends at column 69; remove the extra text or check for shifted columns',
    );
  return l;
}

/** Reads one field by regex at its columns, or throws the column-exact reason. */
function field(
  l: string,
  which: 1 | 2,
  lineNo: number,
  a: number,
  b: number,
  name: string,
  re: RegExp,
  expected: string,
): string {
  const text = cols(l, a, b);
  if (!re.test(text)) {
    const span = a === b ? `column ${a}` : `column ${a}-${b}`;
    throw new RecordProblem(
      'TLE_COLUMNS',
      lineNo,
      `line ${which} ${span} (${name}) is '${text}': expected ${expected}; ` +
        'check that the fields line up with the standard TLE columns',
    );
  }
  return text;
}

const SPACE = /^ $/;
/** Decimal right-aligned in its columns: leading spaces allowed, trailing ones mean a shift. */
const ANGLE_RE = /^ *\d{1,3}\.\d+$/;
const ANGLE_EXPECTED = 'a right-aligned angle in degrees like ' + "' 51.6416'";

/** A blank column between fields; the fast path avoids building a substring per check. */
function checkSeparator(l: string, which: 1 | 2, lineNo: number, c: number): void {
  if (l.charCodeAt(c - 1) !== 32) field(l, which, lineNo, c, c, 'separator', SPACE, 'a space');
}

interface Line1 {
  catalog: number;
  classification: string;
  intlDesignator: string | null;
  epochYear: number;
  epochDoy: number;
  meanMotionDot: number;
  meanMotionDdot: number;
  bstar: number;
  ephemerisType: number;
  elementSetNo: number;
}

function readCatalog(l: string, which: 1 | 2, lineNo: number): number {
  const text = field(l, which, lineNo, 3, 7, 'catalogue number', /^.{5}$/, '5 characters');
  const n = decodeCatalogNumber(text);
  if (n === null)
    throw new RecordProblem(
      'TLE_COLUMNS',
      lineNo,
      `line ${which} column 3-7 (catalogue number) is '${text}': expected 5 digits or an ` +
        "Alpha-5 number (a letter other than I or O and 4 digits, e.g. 'A0001'); " +
        'check that the fields line up with the standard TLE columns',
    );
  return n;
}

function checkChecksum(l: string, which: 1 | 2, lineNo: number, verify: boolean): void {
  const stated = field(l, which, lineNo, 69, 69, 'checksum', /^\d$/, 'one digit');
  if (!verify) return;
  const computed = tleChecksum(l);
  if (Number(stated) !== computed)
    throw new RecordProblem(
      'TLE_CHECKSUM',
      lineNo,
      `line ${which} checksum is ${stated} but columns 1-68 give ${computed} ` +
        '(sum of digits plus 1 per minus sign, modulo 10): the line is corrupted; ' +
        're-download the element set',
    );
}

function readLine1(raw: string, lineNo: number, verify: boolean): Line1 {
  const l = checkLength(raw, 1, lineNo);
  // Fields and the separators between them are checked left to right, so the reason names
  // the first column where a shift shows.
  const sep = (c: number): void => checkSeparator(l, 1, lineNo, c);
  field(l, 1, lineNo, 1, 1, 'line number', /^1$/, "'1'");
  sep(2);
  const catalog = readCatalog(l, 1, lineNo);
  // Blank classification appears in some generated files; it is read as unclassified.
  const cls = field(l, 1, lineNo, 8, 8, 'classification', /^[UCS ]$/, "'U', 'C' or 'S'");
  sep(9);
  const desigText = cols(l, 10, 17);
  const intlDesignator = designatorToOmm(desigText);
  if (intlDesignator === undefined)
    throw new RecordProblem(
      'TLE_COLUMNS',
      lineNo,
      `line 1 column 10-17 (international designator) is '${desigText}': expected launch ` +
        "year, launch number and piece like '98067A  ', or blanks; " +
        'check that the fields line up with the standard TLE columns',
    );
  sep(18);
  const epochText = field(
    l, 1, lineNo, 19, 32, 'epoch', /^\d{2}[ \d]{2}\d\.\d{8}$/,
    "year and day of year like '24123.45678901'",
  );
  const epochYear = fullYear(Number(epochText.slice(0, 2)));
  const epochDoy = Number(epochText.slice(2));
  const daysInYear = new Date(Date.UTC(epochYear, 1, 29)).getUTCDate() === 29 ? 366 : 365;
  if (!(epochDoy >= 1 && epochDoy < daysInYear + 1))
    throw new RecordProblem(
      'VALUE_OUT_OF_RANGE',
      lineNo,
      `line 1 column 19-32 (epoch) day of year ${epochDoy} is outside 1..${daysInYear + 1} ` +
        `(exclusive) for ${epochYear}: the epoch is invalid; re-download the element set`,
    );
  sep(33);
  const ndotText = field(
    l, 1, lineNo, 34, 43, 'first derivative of mean motion', /^[ +-](?:\.\d{8}|\d\.\d{7})$/,
    "a sign and 8 decimals like ' .00001234' or '-.00001234'",
  );
  const expExpected = "an implied-decimal value with exponent like ' 12345-4'";
  sep(44);
  const nddotText = field(l, 1, lineNo, 45, 52, 'second derivative of mean motion', /^.{8}$/, expExpected);
  const meanMotionDdot = decodeExpField(nddotText);
  if (meanMotionDdot !== null) sep(53);
  const bstarText = cols(l, 54, 61);
  const bstar = decodeExpField(bstarText);
  if (meanMotionDdot === null || bstar === null) {
    const [span, name, text] =
      meanMotionDdot === null
        ? ['45-52', 'second derivative of mean motion', nddotText]
        : ['54-61', 'B* drag term', bstarText];
    throw new RecordProblem(
      'TLE_COLUMNS',
      lineNo,
      `line 1 column ${span} (${name}) is '${text}': expected ${expExpected}; ` +
        'check that the fields line up with the standard TLE columns',
    );
  }
  sep(62);
  const eph = field(l, 1, lineNo, 63, 63, 'ephemeris type', /^[\d ]$/, 'one digit');
  sep(64);
  const setNo = field(l, 1, lineNo, 65, 68, 'element set number', /^ *\d* *$/, 'up to 4 digits');
  checkChecksum(l, 1, lineNo, verify);
  return {
    catalog,
    classification: cls === ' ' ? 'U' : cls,
    intlDesignator,
    epochYear,
    epochDoy,
    meanMotionDot: Number(ndotText.replace(' ', '')),
    meanMotionDdot,
    bstar,
    ephemerisType: eph === ' ' ? 0 : Number(eph),
    elementSetNo: setNo.trim() === '' ? 0 : Number(setNo),
  };
}

interface Line2 {
  catalog: number;
  inclinationDeg: number;
  raanDeg: number;
  eccentricity: number;
  argPerigeeDeg: number;
  meanAnomalyDeg: number;
  meanMotionRevPerDay: number;
  revAtEpoch: number;
}

function angle(l: string, lineNo: number, a: number, b: number, name: string, max: number): number {
  const v = Number(field(l, 2, lineNo, a, b, name, ANGLE_RE, ANGLE_EXPECTED));
  if (v > max)
    throw new RecordProblem(
      'VALUE_OUT_OF_RANGE',
      lineNo,
      `line 2 column ${a}-${b} (${name}) is ${v} degrees, outside 0..${max}: ` +
        'the element set is invalid; re-download it',
    );
  return v;
}

function readLine2(raw: string, lineNo: number, verify: boolean): Line2 {
  const l = checkLength(raw, 2, lineNo);
  const sep = (c: number): void => checkSeparator(l, 2, lineNo, c);
  field(l, 2, lineNo, 1, 1, 'line number', /^2$/, "'2'");
  sep(2);
  const catalog = readCatalog(l, 2, lineNo);
  sep(8);
  const inclinationDeg = angle(l, lineNo, 9, 16, 'inclination', 180);
  sep(17);
  const raanDeg = angle(l, lineNo, 18, 25, 'right ascension of the ascending node', 360);
  sep(26);
  const eccText = field(
    l, 2, lineNo, 27, 33, 'eccentricity', /^\d{7}$/,
    "7 digits (implied leading decimal point, e.g. '0001234' for 0.0001234)",
  );
  sep(34);
  const argPerigeeDeg = angle(l, lineNo, 35, 42, 'argument of perigee', 360);
  sep(43);
  const meanAnomalyDeg = angle(l, lineNo, 44, 51, 'mean anomaly', 360);
  sep(52);
  const mmText = field(
    l, 2, lineNo, 53, 63, 'mean motion', /^ *\d{1,2}\.\d+$/,
    "revolutions per day with 8 decimals like '15.49876543'",
  );
  const meanMotionRevPerDay = Number(mmText);
  if (!(meanMotionRevPerDay > 0))
    throw new RecordProblem(
      'VALUE_OUT_OF_RANGE',
      lineNo,
      `line 2 column 53-63 (mean motion) is ${meanMotionRevPerDay} rev/day: it must be greater than 0; ` +
        'the element set is invalid; re-download it',
    );
  const revText = field(l, 2, lineNo, 64, 68, 'revolution number at epoch', /^ *\d*$/, 'up to 5 digits');
  checkChecksum(l, 2, lineNo, verify);
  return {
    catalog,
    inclinationDeg,
    raanDeg,
    eccentricity: Number(`0.${eccText}`),
    argPerigeeDeg,
    meanAnomalyDeg,
    meanMotionRevPerDay,
    revAtEpoch: revText.trim() === '' ? 0 : Number(revText),
  };
}

/** A name line: optional "0 " prefix (3-line form as distributed by public catalogues). */
const nameOf = (l: string): string | null => {
  const t = l.trim().replace(/^0 +/, '').trim();
  return t === '' ? null : t;
};

function buildSet(
  n1: Line1,
  n2: Line2,
  name: string | null,
  file: string,
  recordLine: number,
  line2No: number,
): ElementSet {
  if (n1.catalog !== n2.catalog)
    throw new RecordProblem(
      'TLE_FIELD',
      line2No,
      `catalogue number on line 2 (${n2.catalog}) does not match line 1 (${n1.catalog}): ` +
        'the two lines belong to different objects; check the file for a missing or extra line',
    );
  return {
    objectId: String(n1.catalog),
    name,
    intlDesignator: n1.intlDesignator,
    classification: n1.classification,
    epoch: instantFromYearDoy(n1.epochYear, n1.epochDoy),
    meanMotionRevPerDay: n2.meanMotionRevPerDay,
    eccentricity: n2.eccentricity,
    inclinationDeg: n2.inclinationDeg,
    raanDeg: n2.raanDeg,
    argPerigeeDeg: n2.argPerigeeDeg,
    meanAnomalyDeg: n2.meanAnomalyDeg,
    bstar: n1.bstar,
    meanMotionDot: n1.meanMotionDot,
    meanMotionDdot: n1.meanMotionDdot,
    elementSetNo: n1.elementSetNo,
    revAtEpoch: n2.revAtEpoch,
    ephemerisType: n1.ephemerisType,
    source: { file, line: recordLine, format: 'TLE' },
  };
}

export interface TleOptions {
  /**
   * Skip checksum verification. Only for known hand-edited sets: the published SGP4
   * verification file (AIAA 2006-6753) holds three error-case sets (33333..33335) whose
   * checksums were not updated after editing. Imports always verify.
   */
  readonly ignoreChecksum?: boolean;
}

/**
 * Parses TLE text. Lines starting with '#' are comments (used by the published SGP4
 * verification file). Name lines are trimmed and may carry non-ASCII text (operator names);
 * only lines 1 and 2 must be strict ASCII.
 * Line numbers are 1-based: a set's source line is its name line when it has one.
 */
export function parseTle(text: string, file: string, options: TleOptions = {}): ParseResult {
  const verify = !options.ignoreChecksum;
  const lines = splitLines(text);
  const sets: ElementSet[] = [];
  const rejections: Rejection[] = [];
  let pendingName: { name: string | null; line: number } | null = null;
  const strayText = (line: number): void => {
    rejections.push(
      rejection(
        'TLE_LINE_ORDER',
        file,
        line,
        'text line is not followed by a TLE line 1 (a line starting with "1 "): ' +
          'it is neither a name line nor part of an element set; remove it or restore the missing lines',
      ),
    );
  };

  for (let i = 0; i < lines.length; i++) {
    const l = lines[i] ?? '';
    if (l.trim() === '' || l.startsWith('#')) continue;
    const lineNo = i + 1;
    if (isLine1(l)) {
      const next = lines[i + 1];
      const name = pendingName;
      pendingName = null;
      if (next === undefined || !isLine2(next)) {
        rejections.push(
          rejection(
            'TLE_LINE_ORDER',
            file,
            lineNo,
            'TLE line 1 is not followed by a line 2 (a line starting with "2 "): ' +
              'the element set is incomplete; restore its line 2 or remove line 1',
          ),
        );
        continue;
      }
      i += 1;
      try {
        const n1 = readLine1(l, lineNo, verify);
        const n2 = readLine2(next, lineNo + 1, verify);
        sets.push(buildSet(n1, n2, name?.name ?? null, file, name?.line ?? lineNo, lineNo + 1));
      } catch (e) {
        if (!(e instanceof RecordProblem)) throw e;
        rejections.push(rejection(e.code, file, e.line, e.reason));
      }
    } else if (isLine2(l)) {
      pendingName = null;
      rejections.push(
        rejection(
          'TLE_LINE_ORDER',
          file,
          lineNo,
          'TLE line 2 without a line 1 before it: the element set is incomplete; ' +
            'restore its line 1 or remove this line',
        ),
      );
    } else {
      if (pendingName) strayText(pendingName.line);
      pendingName = { name: nameOf(l), line: lineNo };
    }
  }
  if (pendingName) strayText(pendingName.line);
  return { sets, rejections };
}
