/**
 * From what the message says (message.ts) to what Keepclear uses (model.ts): segments around
 * the Earth only, times converted to UTC, states converted once to TEME, interpolation settled,
 * usable windows narrowed to the data present. A segment Keepclear cannot use is refused alone
 * with a reason; every conversion or choice made is said in a note.
 */
import type { ErrorCode, Rejection } from '../../errors.js';
import { toIso, type Instant } from '../../time/instant.js';
import {
  DEFAULT_DEGREE, DEFAULT_INTERPOLATION, MAX_INTERPOLATION_DEGREE, nodesFor,
} from '../../propagation/interpolation.js';
import { fullCovariance, needsState } from './covariance.js';
import { stateToTeme } from './frames.js';
import {
  OEM_INTERPOLATIONS, OEM_TIME_SYSTEMS, readCovarianceFrame, readInterpolation, readStateFrame, readTimeSystem,
  SUPPORTED_FRAMES_TEXT, type OemTimeSystem,
} from './keywords.js';
import type { OemMessage, OemMessageSegment } from './message.js';
import type {
  Oem, OemCovariance, OemInterpolation, OemMetadata, OemNote, OemSegment, TemeNodeStates,
} from './model.js';
import { toUtc } from './timeSystems.js';

export interface OemParseResult {
  /** The usable part of the message; null when nothing in the file can be used. */
  readonly oem: Oem | null;
  /** Every line, covariance block or segment refused, FILE:LINE: reason. */
  readonly rejections: readonly Rejection[];
  /** Conversions and choices made (ICRF read as GCRF, default interpolation, narrowed window …). */
  readonly notes: readonly OemNote[];
  /** Set when the whole file is refused; its reason is also among the rejections. */
  readonly fatal: Rejection | null;
}

class Loader {
  readonly rejections: Rejection[] = [];
  readonly notes: OemNote[] = [];
  constructor(readonly file: string) {}
  reject(code: ErrorCode, line: number, reason: string): null {
    this.rejections.push({ code, file: this.file, line, reason });
    return null;
  }
  note(line: number, note: string): void {
    this.notes.push({ file: this.file, line, note });
  }
}

function interpolationOf(seg: OemMessageSegment, nodes: number, l: Loader): OemInterpolation | null {
  const meta = seg.metadata;
  const line = meta.lines['INTERPOLATION'] ?? seg.line;
  let method = DEFAULT_INTERPOLATION.method as OemInterpolation['method'];
  if (meta.interpolation !== undefined) {
    const m = readInterpolation(meta.interpolation);
    if (!m)
      return l.reject('OEM_UNSUPPORTED', line,
        `INTERPOLATION = ${meta.interpolation} is not supported: Keepclear interpolates ${OEM_INTERPOLATIONS.join(', ')} — this segment is skipped`);
    method = m;
  }
  let degree = meta.interpolationDegree ?? (meta.interpolation === undefined ? DEFAULT_INTERPOLATION.degree : DEFAULT_DEGREE[method]);
  if (meta.interpolation === undefined)
    l.note(seg.line, `no INTERPOLATION given: ${method} of degree ${degree} is used (Keepclear's default method)`);
  else if (meta.interpolationDegree === undefined)
    l.note(line, `no INTERPOLATION_DEGREE given: degree ${degree} is used for ${method}`);
  if (method === 'LINEAR' && degree !== 1) {
    l.note(meta.lines['INTERPOLATION_DEGREE'] ?? line, `INTERPOLATION = LINEAR has degree 1; INTERPOLATION_DEGREE = ${degree} is ignored`);
    degree = 1;
  }
  if (degree > MAX_INTERPOLATION_DEGREE) {
    l.note(meta.lines['INTERPOLATION_DEGREE'] ?? line,
      `INTERPOLATION_DEGREE = ${degree} is above ${MAX_INTERPOLATION_DEGREE}; degree ${MAX_INTERPOLATION_DEGREE} is used (higher degrees on equally spaced nodes amplify noise)`);
    degree = MAX_INTERPOLATION_DEGREE;
  }
  if (nodesFor(method, degree) > nodes) {
    const lower = method === 'LAGRANGE' ? nodes - 1 : method === 'HERMITE' ? 2 * nodes - 1 : 1;
    l.note(seg.line, `only ${nodes} data lines: ${method} degree ${degree} needs ${nodesFor(method, degree)}, so degree ${lower} is used`);
    degree = lower;
  }
  return { method, degree, stated: meta.interpolation !== undefined && meta.interpolationDegree !== undefined };
}

function loadSegment(seg: OemMessageSegment, l: Loader): OemSegment | null {
  const meta = seg.metadata;
  const lineOf = (k: string): number => meta.lines[k] ?? seg.line;
  if (meta.centerName.toUpperCase() !== 'EARTH')
    return l.reject('OEM_UNSUPPORTED', lineOf('CENTER_NAME'),
      `CENTER_NAME = ${meta.centerName}: Keepclear screens Earth orbits and reads only ephemerides centred on the Earth ` +
      '(CENTER_NAME = EARTH) — this segment is skipped');
  const scale = readTimeSystem(meta.timeSystem);
  if (!scale)
    return l.reject('OEM_UNSUPPORTED', lineOf('TIME_SYSTEM'),
      `TIME_SYSTEM = ${meta.timeSystem} is not supported: Keepclear converts ${OEM_TIME_SYSTEMS.join(', ')} to UTC; ` +
      're-export the ephemeris in UTC — this segment is skipped');
  const frame = readStateFrame(meta.refFrame);
  if (!frame)
    return l.reject('OEM_UNSUPPORTED', lineOf('REF_FRAME'),
      `REF_FRAME = ${meta.refFrame} is not supported: Keepclear reads ${SUPPORTED_FRAMES_TEXT}; ` +
      're-export the ephemeris in one of them (EME2000 is the common choice) — this segment is skipped');
  if (frame.note) l.note(lineOf('REF_FRAME'), frame.note);
  if (scale !== 'UTC') l.note(lineOf('TIME_SYSTEM'), `TIME_SYSTEM = ${scale}: times converted to UTC (leap seconds of IERS Bulletin C)`);

  const utc = (t: number): Instant => toUtc(t as Parameters<typeof toUtc>[0], scale);
  const epochs: number[] = [], lines: number[] = [], teme: number[] = [];
  for (const s of seg.states) {
    const t = utc(s.epoch);
    if (epochs.length > 0 && t <= epochs.at(-1)!) {
      l.reject('OEM_EPOCH_ORDER', s.line, `epoch does not come after the previous one once converted from ${scale} to UTC (a leap second); this data line is skipped`);
      continue;
    }
    const st = stateToTeme(frame.frame, s.r, s.v, t);
    epochs.push(t);
    lines.push(s.line);
    teme.push(st.r[0], st.r[1], st.r[2], st.v[0], st.v[1], st.v[2]);
  }
  if (epochs.length < 2)
    return l.reject('OEM_STRUCTURE', seg.line,
      `segment at line ${seg.line} has ${epochs.length} usable data line; interpolation needs at least two — this segment is skipped`);
  const first = epochs[0]! as Instant, last = epochs.at(-1)! as Instant;
  const interpolation = interpolationOf(seg, epochs.length, l);
  if (!interpolation) return null;

  let start = utc(meta.useableStartTime ?? meta.startTime);
  let end = utc(meta.useableStopTime ?? meta.stopTime);
  const which = meta.useableStartTime !== undefined ? 'USEABLE_START_TIME' : 'START_TIME';
  const whichEnd = meta.useableStopTime !== undefined ? 'USEABLE_STOP_TIME' : 'STOP_TIME';
  if (start < first) {
    l.note(lineOf(which), `${which} ${toIso(start)} precedes the first data line (${toIso(first)}); the usable window starts there (no extrapolation)`);
    start = first;
  }
  if (end > last) {
    l.note(lineOf(whichEnd), `${whichEnd} ${toIso(end)} is after the last data line (${toIso(last)}); the usable window ends there (no extrapolation)`);
    end = last;
  }
  if (!(start < end))
    return l.reject('OEM_STRUCTURE', seg.line, `segment at line ${seg.line}: its data lines do not cover any of its usable window — this segment is skipped`);

  const covariances = seg.covariances.map((c): OemCovariance | null => {
    const frameName = c.covRefFrame ?? meta.refFrame;
    const cf = readCovarianceFrame(frameName);
    if (!cf)
      return l.reject('OEM_UNSUPPORTED', c.line,
        `COV_REF_FRAME = ${frameName} is not supported: Keepclear reads RTN (or RSW), TNW and ${SUPPORTED_FRAMES_TEXT} — this covariance is skipped`);
    if (cf.note) l.note(c.line, cf.note);
    const epoch = utc(c.epoch);
    if (needsState(cf) && (epoch < first || epoch > last))
      return l.reject('OEM_COVARIANCE', c.line,
        `covariance EPOCH ${toIso(epoch)} lies outside the data lines (${toIso(first)} … ${toIso(last)}); ` +
        `a ${frameName} covariance needs the object's state at its epoch to become RTN — this covariance is skipped`);
    const matrix = fullCovariance(c.lowerTriangle);
    if ([0, 1, 2, 3, 4, 5].some((i) => !(matrix[i]![i]! >= 0)))
      return l.reject('OEM_COVARIANCE', c.line, 'covariance has a negative variance on its diagonal; this covariance is skipped');
    return { epoch, frameName, frame: cf.frame, matrix, comments: c.comments, line: c.line };
  }).filter((c) => c !== null);

  const metadata: OemMetadata = {
    objectName: meta.objectName, objectId: meta.objectId, centerName: 'EARTH',
    refFrame: meta.refFrame, stateFrame: frame.frame, timeSystem: scale as OemTimeSystem,
    startTime: utc(meta.startTime), stopTime: utc(meta.stopTime),
    ...(meta.refFrameEpoch !== undefined ? { refFrameEpoch: utc(meta.refFrameEpoch) } : {}),
    ...(meta.useableStartTime !== undefined ? { useableStartTime: utc(meta.useableStartTime) } : {}),
    ...(meta.useableStopTime !== undefined ? { useableStopTime: utc(meta.useableStopTime) } : {}),
    interpolation, comments: meta.comments,
  };
  return {
    metadata, dataComments: seg.dataComments,
    epochs: Float64Array.from(epochs), teme: Float64Array.from(teme) as TemeNodeStates, nodeLines: Int32Array.from(lines),
    usable: { start, end }, covariances, line: seg.line,
  };
}

/** Turns a checked message into the model; `file` names the source in every rejection and note. */
export function loadOem(message: OemMessage, file: string, earlier: readonly Rejection[] = []): OemParseResult {
  const l = new Loader(file);
  const segments: OemSegment[] = [];
  for (const seg of message.segments) {
    const s = loadSegment(seg, l);
    if (!s) continue;
    for (const prev of segments)
      if (s.usable.start < prev.usable.end && prev.usable.start < s.usable.end)
        l.note(s.line, `this segment's usable window overlaps the segment at line ${prev.line}; where they overlap, the later segment in the file is used`);
    segments.push(s);
  }
  const rejections = [...earlier, ...l.rejections].sort((a, b) => a.line - b.line);
  if (segments.length === 0) {
    const fatal: Rejection = {
      code: 'OEM_STRUCTURE', file, line: 1,
      reason: `no usable segment in this OEM (${message.segments.length} passed the standard's checks, ` +
        `${rejections.length} problem${rejections.length === 1 ? '' : 's'} reported); nothing was imported`,
    };
    return { oem: null, rejections: [fatal, ...rejections], notes: l.notes, fatal };
  }
  return { oem: { file, header: message.header, segments }, rejections, notes: l.notes, fatal: null };
}
