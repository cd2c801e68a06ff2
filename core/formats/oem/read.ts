/**
 * The standard's checks on an OEM, written once for both syntaxes (raw.ts → message.ts):
 * mandatory keywords, value syntax, units, time order of the metadata, data lines and
 * covariance blocks. What is refused costs as little as possible:
 * - a bad header refuses the file (the message's identity and date are unknown);
 * - bad metadata refuses its segment;
 * - a bad data line or covariance block is rejected alone, and the segment still loads.
 */
import type { ErrorCode, Rejection } from '../../errors.js';
import { parseCcsdsTime, parseCdmInteger, parseCdmNumber } from '../cdm/values.js';
import {
  COVARIANCE_TERMS, HEADER_MANDATORY, HEADER_OPTIONAL, METADATA_KEYWORDS, METADATA_MANDATORY, METADATA_TIMES,
  OEM_VERSIONS, sameUnit, STATE_ELEMENTS, STATE_UNITS,
} from './keywords.js';
import type {
  OemHeader, OemMessage, OemMessageCovariance, OemMessageMetadata, OemMessageSegment, OemMessageState, ScaleTime,
} from './message.js';
import type { RawCovariance, RawEntry, RawOem, RawSegment, RawValue } from './raw.js';

export interface OemReadResult {
  /** null when the header cannot be used; otherwise the segments that passed (possibly none). */
  readonly message: OemMessage | null;
  readonly rejections: readonly Rejection[];
  /** Why the file as a whole was refused (also among the rejections); null when message is set. */
  readonly fatal: Rejection | null;
}

const TIME_HINT = 'write YYYY-MM-DDThh:mm:ss[.fff] or YYYY-DDDThh:mm:ss[.fff]';

class Checker {
  readonly rejections: Rejection[] = [];
  constructor(readonly file: string) {}

  reject(code: ErrorCode, line: number, reason: string): void {
    this.rejections.push({ code, file: this.file, line, reason });
  }

  /** Keyword → entry, reporting duplicates; returns null when a duplicate makes the block doubtful. */
  index(entries: readonly RawEntry[], where: string): Map<string, RawEntry> | null {
    const map = new Map<string, RawEntry>();
    let ok = true;
    for (const e of entries) {
      const first = map.get(e.keyword);
      if (first) {
        this.reject('OEM_FIELD', e.line, `${where} ${e.keyword} appears twice (first at line ${first.line}); keep one`);
        ok = false;
      } else map.set(e.keyword, e);
    }
    return ok ? map : null;
  }

  time(e: RawEntry, where: string): ScaleTime | null {
    const t = parseCcsdsTime(e.value);
    if (t === null) this.reject('OEM_FIELD', e.line, `${where} ${e.keyword} = "${e.value}" is not a CCSDS time; ${TIME_HINT}`);
    return t as number as ScaleTime | null;
  }

  /** Numbers of a data or covariance line with their units checked; a reason when one is bad. */
  numbers(values: readonly RawValue[], units: readonly string[], names: readonly string[], what: string): number[] | { code: ErrorCode; reason: string } {
    const out: number[] = [];
    for (let i = 0; i < values.length; i++) {
      const v = values[i]!;
      const name = `${what} ${names[i]} (value ${i + 1})`;
      const x = parseCdmNumber(v.text);
      if (x === null || !Number.isFinite(x))
        return { code: 'OEM_FIELD', reason: `${name} "${v.text}" is not a number` };
      if (v.unit !== undefined && !sameUnit(v.unit, units[i]!))
        return { code: 'OEM_UNITS', reason: `${name} has unit [${v.unit}], expected [${units[i]}] (CCSDS 502.0-B-2); convert it` };
      out.push(x);
    }
    return out;
  }
}

function readHeader(raw: RawOem, c: Checker): OemHeader | null {
  const known = new Set<string>([...HEADER_MANDATORY, ...HEADER_OPTIONAL]);
  const entries = raw.header.filter((e) => {
    if (known.has(e.keyword)) return true;
    c.reject('OEM_STRUCTURE', e.line,
      METADATA_KEYWORDS.has(e.keyword)
        ? `${e.keyword} is metadata but appears before any META_START; the segment's metadata must be between META_START and META_STOP`
        : `${e.keyword} is not an OEM header keyword (${[...known].join(', ')}); it is ignored`);
    return false;
  });
  const map = c.index(entries, 'header');
  if (!map) return null;
  const missing = HEADER_MANDATORY.filter((k) => !map.has(k));
  if (missing.length > 0) {
    c.reject('OEM_MISSING_KEYWORD', raw.headerLine,
      `the OEM header lacks ${missing.join(', ')}; an OEM starts with CCSDS_OEM_VERS = 2.0, CREATION_DATE and ORIGINATOR — the file was not imported`);
    return null;
  }
  const vers = map.get('CCSDS_OEM_VERS')!;
  const version = vers.value.trim();
  if (!(OEM_VERSIONS as readonly string[]).includes(version)) {
    c.reject('OEM_FIELD', vers.line,
      `CCSDS_OEM_VERS = "${version}" is not a version Keepclear reads (${OEM_VERSIONS.join(', ')}); the file was not imported`);
    return null;
  }
  const created = map.get('CREATION_DATE')!;
  const creationDate = parseCcsdsTime(created.value);
  if (creationDate === null) {
    c.reject('OEM_FIELD', created.line, `CREATION_DATE = "${created.value}" is not a CCSDS time; ${TIME_HINT} — the file was not imported`);
    return null;
  }
  const originator = map.get('ORIGINATOR')!.value.trim();
  if (originator === '') {
    c.reject('OEM_FIELD', map.get('ORIGINATOR')!.line, 'ORIGINATOR is empty; name the producer of the message — the file was not imported');
    return null;
  }
  const messageId = map.get('MESSAGE_ID')?.value.trim();
  return {
    version, creationDate, originator, comments: raw.headerComments, line: raw.headerLine,
    ...(messageId ? { messageId } : {}),
  };
}

function readMetadata(seg: RawSegment, c: Checker): OemMessageMetadata | null {
  const where = `segment at line ${seg.line}:`;
  const entries = seg.metadata.filter((e) => {
    if (METADATA_KEYWORDS.has(e.keyword)) return true;
    c.reject('OEM_STRUCTURE', e.line, `${e.keyword} is not an OEM metadata keyword; it is ignored`);
    return false;
  });
  const map = c.index(entries, where);
  if (!map) return null;
  const missing = METADATA_MANDATORY.filter((k) => !map.has(k) || map.get(k)!.value.trim() === '');
  if (missing.length > 0) {
    c.reject('OEM_MISSING_KEYWORD', seg.line,
      `${where} metadata lacks ${missing.join(', ')}; add ${missing.length > 1 ? 'them' : 'it'} between META_START and META_STOP — this segment is skipped`);
    return null;
  }
  const times: Partial<Record<(typeof METADATA_TIMES)[number], ScaleTime>> = {};
  for (const k of METADATA_TIMES) {
    const e = map.get(k);
    if (!e) continue;
    const t = c.time(e, where);
    if (t === null && k !== 'REF_FRAME_EPOCH') return null;
    if (t !== null) times[k] = t;
  }
  const start = times.START_TIME!, stop = times.STOP_TIME!;
  const us = times.USEABLE_START_TIME ?? start, ue = times.USEABLE_STOP_TIME ?? stop;
  if (!(start <= us && us <= ue && ue <= stop && start < stop)) {
    c.reject('OEM_FIELD', map.get('START_TIME')!.line,
      `${where} times out of order: CCSDS 502.0-B-2 needs START_TIME ≤ USEABLE_START_TIME ≤ USEABLE_STOP_TIME ≤ STOP_TIME ` +
      'with START_TIME before STOP_TIME — this segment is skipped');
    return null;
  }
  let interpolationDegree: number | undefined;
  const deg = map.get('INTERPOLATION_DEGREE');
  if (deg) {
    const d = parseCdmInteger(deg.value);
    if (d === null || d < 1)
      c.reject('OEM_FIELD', deg.line, `INTERPOLATION_DEGREE = "${deg.value}" is not a positive whole number; it is ignored (the default degree is used)`);
    else interpolationDegree = d;
  }
  const text = (k: string): string => map.get(k)!.value.trim();
  const interpolation = map.get('INTERPOLATION')?.value.trim();
  return {
    objectName: text('OBJECT_NAME'), objectId: text('OBJECT_ID'), centerName: text('CENTER_NAME'),
    refFrame: text('REF_FRAME'), timeSystem: text('TIME_SYSTEM'),
    startTime: start, stopTime: stop,
    ...(times.REF_FRAME_EPOCH !== undefined ? { refFrameEpoch: times.REF_FRAME_EPOCH } : {}),
    ...(times.USEABLE_START_TIME !== undefined ? { useableStartTime: times.USEABLE_START_TIME } : {}),
    ...(times.USEABLE_STOP_TIME !== undefined ? { useableStopTime: times.USEABLE_STOP_TIME } : {}),
    ...(interpolation ? { interpolation } : {}),
    ...(interpolationDegree !== undefined ? { interpolationDegree } : {}),
    comments: seg.metadataComments,
    lines: Object.fromEntries([...map].map(([k, e]) => [k, e.line])),
  };
}

function readStates(seg: RawSegment, meta: OemMessageMetadata, c: Checker): OemMessageState[] {
  const out: OemMessageState[] = [];
  for (const s of seg.states) {
    const skip = (code: ErrorCode, reason: string): void => c.reject(code, s.line, `${reason} — this data line is skipped, the segment still loads`);
    const epoch = parseCcsdsTime(s.epoch) as number as ScaleTime | null;
    if (epoch === null) {
      skip('OEM_FIELD', `data line epoch "${s.epoch}" is not a CCSDS time; ${TIME_HINT}`);
      continue;
    }
    if (s.values.length !== 6 && s.values.length !== 9) {
      skip('OEM_FIELD', `data line has ${s.values.length} numbers after the epoch, expected 6 ` +
        '(x y z in km, x_dot y_dot z_dot in km/s) or 9 (with accelerations in km/s**2)');
      continue;
    }
    const n = c.numbers(s.values, STATE_UNITS, STATE_ELEMENTS, 'data line');
    if (!Array.isArray(n)) {
      skip(n.code, n.reason);
      continue;
    }
    if (epoch < meta.startTime || epoch > meta.stopTime) {
      skip('OEM_FIELD', `data line epoch ${s.epoch.trim()} is outside the segment's START_TIME … STOP_TIME`);
      continue;
    }
    const prev = out.at(-1);
    if (prev && epoch <= prev.epoch) {
      skip('OEM_EPOCH_ORDER', `data line epoch ${s.epoch.trim()} does not come after the previous one (line ${prev.line}); ` +
        'epochs must increase within a segment');
      continue;
    }
    out.push({
      epoch, line: s.line,
      r: [n[0]!, n[1]!, n[2]!], v: [n[3]!, n[4]!, n[5]!],
      ...(n.length === 9 ? { a: [n[6]!, n[7]!, n[8]!] as const } : {}),
    });
  }
  return out;
}

function readCovariance(cov: RawCovariance, meta: OemMessageMetadata, c: Checker): OemMessageCovariance | null {
  const skip = (code: ErrorCode, line: number, reason: string): null => {
    c.reject(code, line, `${reason} — this covariance is skipped, the states still load`);
    return null;
  };
  const map = c.index(cov.entries, 'covariance');
  if (!map) return null;
  const epochEntry = map.get('EPOCH');
  if (!epochEntry) return skip('OEM_MISSING_KEYWORD', cov.line, 'covariance matrix without EPOCH');
  const epoch = c.time(epochEntry, 'covariance');
  if (epoch === null) return null;
  if (epoch < meta.startTime || epoch > meta.stopTime)
    return skip('OEM_FIELD', epochEntry.line, `covariance EPOCH ${epochEntry.value.trim()} is outside the segment's START_TIME … STOP_TIME`);
  const n = c.numbers(cov.terms, COVARIANCE_TERMS.map((t) => t.unit), COVARIANCE_TERMS.map((t) => t.element), 'covariance');
  if (!Array.isArray(n)) return skip(n.code, cov.line, n.reason);
  const frame = map.get('COV_REF_FRAME')?.value.trim();
  return { epoch, lowerTriangle: n, comments: cov.comments, line: cov.line, ...(frame ? { covRefFrame: frame } : {}) };
}

/** Applies the standard's checks to what a lexer found. */
export function readOemRaw(raw: RawOem, file: string): OemReadResult {
  const c = new Checker(file);
  const header = readHeader(raw, c);
  if (!header) return { message: null, rejections: c.rejections, fatal: c.rejections.at(-1) ?? null };
  const segments: OemMessageSegment[] = [];
  for (const seg of raw.segments) {
    const metadata = readMetadata(seg, c);
    if (!metadata) continue;
    const states = readStates(seg, metadata, c);
    if (states.length === 0) {
      c.reject('OEM_STRUCTURE', seg.line, `segment at line ${seg.line} has no usable data lines; this segment is skipped`);
      continue;
    }
    const covariances = seg.covariances.map((cv) => readCovariance(cv, metadata, c)).filter((x) => x !== null);
    segments.push({ metadata, dataComments: seg.dataComments, states, covariances, line: seg.line });
  }
  return { message: { header, segments }, rejections: c.rejections, fatal: null };
}
