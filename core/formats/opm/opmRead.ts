/**
 * OPM reader, KVN (CCSDS 502.0-B-2 §3, §6). One message per file. Every problem is a
 * KeepclearError with the file and the 1-based line: `FILE:LINE: what is wrong — what to do`.
 *
 * Checked: the first keyword is CCSDS_OPM_VERS; every line is `KEYWORD = value` or a COMMENT;
 * keywords are those of the standard; no keyword twice (outside manoeuvres); units, when given
 * in brackets, are the standard's; numbers and epochs parse; TIME_SYSTEM is UTC (the only time
 * scale Keepclear handles); each manoeuvre has all seven MAN_ keywords in the standard's order
 * (§3.2.4.8); MAN_DURATION ≥ 0 and MAN_DELTA_MASS ≤ 0 (the standard: "value is < 0").
 */
import { KeepclearError, type ErrorCode } from '../../errors.js';
import type { Instant } from '../../time/instant.js';
import { parseCcsdsEpoch } from '../ccsds-time.js';
import { splitLines } from '../result.js';
import { KNOWN_KEYS, MANOEUVRE_KEYS, REQUIRED_KEYS, UNITS } from './opmKeywords.js';
import type { OpmManoeuvre, OpmMessage, OpmSpacecraft } from './opmModel.js';

const KVN_RE = /^([A-Z][A-Z0-9_]*)\s*=\s*(.*)$/;
const UNITS_RE = /^(.*?)\s*\[([^\]]*)\]$/;
/** Free text where brackets belong to the value. */
const TEXT_KEYS = new Set(['OBJECT_NAME', 'OBJECT_ID', 'ORIGINATOR']);

interface Field {
  readonly value: string;
  readonly line: number;
}

export function parseOpmKvn(text: string, file: string): OpmMessage {
  const fail = (code: ErrorCode, line: number, message: string): never => {
    throw new KeepclearError(code, message, { file, line });
  };
  const fields = new Map<string, Field>();
  const manoeuvres: OpmManoeuvre[] = [];
  const comments: string[] = [];
  let pendingComments: string[] = [];
  let man: { fields: Map<string, Field>; start: number; comments: string[] } | null = null;
  let versionLine = 0;
  let lastLine = 1;

  const closeManoeuvre = (atLine: number): void => {
    if (!man) return;
    const missing = MANOEUVRE_KEYS.filter((k) => !man!.fields.has(k));
    if (missing.length > 0)
      fail(
        'OPM_MISSING_KEYWORD',
        man.start,
        `manoeuvre starting here lacks ${missing.join(', ')} (before line ${atLine}) — every manoeuvre ` +
          'repeats all seven MAN_ keywords in order (CCSDS 502.0-B-2 §3.2.4.8)',
      );
    manoeuvres.push(toManoeuvre(man.fields, man.start, man.comments, fail));
    man = null;
  };

  const lines = splitLines(text);
  for (let i = 0; i < lines.length; i++) {
    const t = (lines[i] ?? '').trim();
    const lineNo = i + 1;
    if (t === '') continue;
    lastLine = lineNo;
    if (t === 'COMMENT' || t.startsWith('COMMENT ')) {
      if (versionLine === 0) fail('OPM_STRUCTURE', lineNo, 'a COMMENT before CCSDS_OPM_VERS — the message must start with CCSDS_OPM_VERS');
      pendingComments.push(t.slice(7).trim());
      continue;
    }
    const m = KVN_RE.exec(t);
    if (!m)
      fail('OPM_FIELD', lineNo, `line '${t.slice(0, 60)}' is not 'KEYWORD = value' — fix or remove it (comments start with COMMENT)`);
    const key = m![1]!;
    let value = m![2]!.trim();
    if (versionLine === 0) {
      if (key !== 'CCSDS_OPM_VERS')
        fail('OPM_STRUCTURE', lineNo, `first keyword is ${key}, expected CCSDS_OPM_VERS — is this an OPM? (an OEM or OMM starts with its own _VERS keyword)`);
      versionLine = lineNo;
    }
    if (!KNOWN_KEYS.has(key) && !key.startsWith('USER_DEFINED_'))
      fail('OPM_FIELD', lineNo, `unknown keyword ${key} — not an OPM keyword of CCSDS 502.0-B-2; check the spelling or remove the line`);
    const u = TEXT_KEYS.has(key) ? null : UNITS_RE.exec(value);
    if (u) {
      value = u[1]!.trim();
      const want = UNITS[key];
      const got = u[2]!.replace(/\s+/g, '');
      if (want && got.toLowerCase() !== want.toLowerCase())
        fail('OPM_FIELD', lineNo, `${key} is given in [${u[2]}], the standard's unit is [${want}] — convert the value or fix the unit`);
    }
    if (key.startsWith('MAN_')) {
      const idx = MANOEUVRE_KEYS.indexOf(key as (typeof MANOEUVRE_KEYS)[number]);
      if (idx === 0) {
        closeManoeuvre(lineNo);
        man = { fields: new Map(), start: lineNo, comments: pendingComments };
        pendingComments = [];
      } else if (!man || man.fields.size !== idx)
        fail(
          'OPM_STRUCTURE',
          lineNo,
          `${key} out of order — a manoeuvre is MAN_EPOCH_IGNITION, MAN_DURATION, MAN_DELTA_MASS, MAN_REF_FRAME, ` +
            `MAN_DV_1, MAN_DV_2, MAN_DV_3 in this order (expected ${man ? MANOEUVRE_KEYS[man.fields.size] : 'MAN_EPOCH_IGNITION'})`,
        );
      man!.fields.set(key, { value, line: lineNo });
      continue;
    }
    closeManoeuvre(lineNo);
    comments.push(...pendingComments);
    pendingComments = [];
    const prev = fields.get(key);
    if (prev) fail('OPM_FIELD', lineNo, `${key} appears twice (first on line ${prev.line}) — one OPM holds one state; remove the duplicate`);
    fields.set(key, { value, line: lineNo });
  }
  if (versionLine === 0) fail('OPM_STRUCTURE', 1, 'no CCSDS_OPM_VERS line — the file is not an OPM');
  closeManoeuvre(lastLine + 1);

  for (const k of REQUIRED_KEYS)
    if (!fields.has(k))
      fail('OPM_MISSING_KEYWORD', versionLine, `mandatory keyword ${k} is missing from the OPM starting here — add it`);
  const get = (k: string): Field => fields.get(k)!;
  const num = (k: string): number => numberOf(get(k), k, fail);
  const timeSystem = get('TIME_SYSTEM').value;
  if (timeSystem !== 'UTC')
    fail('OPM_FIELD', get('TIME_SYSTEM').line, `TIME_SYSTEM = ${timeSystem}: Keepclear reads UTC only — convert the epochs to UTC`);
  const spacecraft: OpmSpacecraft = {
    ...(fields.has('MASS') ? { massKg: num('MASS') } : {}),
    ...(fields.has('SOLAR_RAD_AREA') ? { solarRadAreaM2: num('SOLAR_RAD_AREA') } : {}),
    ...(fields.has('SOLAR_RAD_COEFF') ? { solarRadCoeff: num('SOLAR_RAD_COEFF') } : {}),
    ...(fields.has('DRAG_AREA') ? { dragAreaM2: num('DRAG_AREA') } : {}),
    ...(fields.has('DRAG_COEFF') ? { dragCoeff: num('DRAG_COEFF') } : {}),
  };
  const interpreted = new Set<string>([...REQUIRED_KEYS, 'CCSDS_OPM_VERS', 'MASS', 'SOLAR_RAD_AREA', 'SOLAR_RAD_COEFF', 'DRAG_AREA', 'DRAG_COEFF']);
  const other: Record<string, string> = {};
  for (const [k, f] of fields) if (!interpreted.has(k)) other[k] = f.value;
  return {
    version: get('CCSDS_OPM_VERS').value,
    creationDate: epochOf(get('CREATION_DATE'), 'CREATION_DATE', fail),
    originator: get('ORIGINATOR').value,
    objectName: get('OBJECT_NAME').value,
    objectId: get('OBJECT_ID').value,
    centerName: get('CENTER_NAME').value,
    refFrame: get('REF_FRAME').value,
    timeSystem,
    epoch: epochOf(get('EPOCH'), 'EPOCH', fail),
    positionKm: [num('X'), num('Y'), num('Z')],
    velocityKmS: [num('X_DOT'), num('Y_DOT'), num('Z_DOT')],
    spacecraft: Object.keys(spacecraft).length > 0 ? spacecraft : null,
    manoeuvres,
    comments,
    other,
  };
}

type Fail = (code: ErrorCode, line: number, message: string) => never;

function numberOf(f: Field, key: string, fail: Fail): number {
  const x = f.value === '' ? NaN : Number(f.value);
  if (!Number.isFinite(x)) fail('OPM_FIELD', f.line, `${key} = '${f.value}' is not a number — write a decimal number`);
  return x;
}

function epochOf(f: Field, key: string, fail: Fail): Instant {
  const t = parseCcsdsEpoch(f.value);
  if (t === null) fail('OPM_FIELD', f.line, `${key} = '${f.value}' is not a CCSDS time — write YYYY-MM-DDThh:mm:ss[.fff] or YYYY-DDDThh:mm:ss[.fff]`);
  return t!;
}

function toManoeuvre(m: Map<string, Field>, start: number, comments: string[], fail: Fail): OpmManoeuvre {
  const num = (k: string): number => numberOf(m.get(k)!, k, fail);
  const durationS = num('MAN_DURATION');
  if (durationS < 0) fail('OPM_FIELD', m.get('MAN_DURATION')!.line, `MAN_DURATION = ${durationS} s is negative — a duration is ≥ 0 (0 = impulsive)`);
  const deltaMassKg = num('MAN_DELTA_MASS');
  if (deltaMassKg > 0)
    fail('OPM_FIELD', m.get('MAN_DELTA_MASS')!.line, `MAN_DELTA_MASS = ${deltaMassKg} kg is positive — the standard's mass change of a burn is negative`);
  return {
    epochIgnition: epochOf(m.get('MAN_EPOCH_IGNITION')!, 'MAN_EPOCH_IGNITION', fail),
    durationS,
    deltaMassKg,
    refFrame: m.get('MAN_REF_FRAME')!.value,
    dvKmS: [num('MAN_DV_1'), num('MAN_DV_2'), num('MAN_DV_3')],
    comments,
    line: start,
  };
}
