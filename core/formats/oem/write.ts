/**
 * KVN writer for the OEM (CCSDS 502.0-B-2 §5, §7): every mandatory keyword, times in UTC with
 * milliseconds (3 decimals, rounded to the nearest ms), states converted from the model's TEME
 * to each segment's REF_FRAME with core/frames, positions in km and velocities in km/s with
 * enough digits that reading the file back keeps positions to 1 mm (0.05 mm here).
 */
import { toIso, type Instant } from '../../time/instant.js';
import { vec3, type Km, type KmS } from '../../units.js';
import { formatCdmNumber } from '../cdm/values.js';
import { lowerTriangleOf } from './covariance.js';
import { stateFromTeme } from './frames.js';
import { COVARIANCE_TERMS } from './keywords.js';
import type { Oem, OemCovariance, OemSegment } from './model.js';

/** 1e-7 km = 0.1 mm: rounding moves a position by at most 0.05 mm per axis. */
export const POSITION_DECIMALS = 7;
/** 1e-10 km/s = 0.1 µm/s: over a 60-s node spacing that is 6 µm of Hermite position, far below 1 mm. */
export const VELOCITY_DECIMALS = 10;

/** CCSDS calendar time without zone letter, 3 decimals (UTC). */
const time = (t: Instant): string => toIso(t).slice(0, -1);

const kv = (k: string, v: string): string => `${k.padEnd(20)} = ${v}`;
const comments = (list: readonly string[]): string[] => list.map((c) => `COMMENT ${c}`);

function covarianceLines(c: OemCovariance): string[] {
  const terms = lowerTriangleOf(c.matrix).map(formatCdmNumber);
  const rows: string[] = [];
  let k = 0;
  for (let row = 0; row < 6; row++) {
    const n = COVARIANCE_TERMS.filter((t) => t.row === row).length;
    rows.push(terms.slice(k, k + n).join(' '));
    k += n;
  }
  return [...comments(c.comments), kv('EPOCH', time(c.epoch)), kv('COV_REF_FRAME', c.frameName), ...rows];
}

function segmentLines(s: OemSegment): string[] {
  const m = s.metadata;
  const out = [
    'META_START',
    ...comments(m.comments),
    kv('OBJECT_NAME', m.objectName),
    kv('OBJECT_ID', m.objectId),
    kv('CENTER_NAME', m.centerName),
    kv('REF_FRAME', m.refFrame),
    ...(m.refFrameEpoch !== undefined ? [kv('REF_FRAME_EPOCH', time(m.refFrameEpoch))] : []),
    kv('TIME_SYSTEM', 'UTC'),
    kv('START_TIME', time(m.startTime)),
    ...(m.useableStartTime !== undefined ? [kv('USEABLE_START_TIME', time(m.useableStartTime))] : []),
    ...(m.useableStopTime !== undefined ? [kv('USEABLE_STOP_TIME', time(m.useableStopTime))] : []),
    kv('STOP_TIME', time(m.stopTime)),
    kv('INTERPOLATION', m.interpolation.method),
    kv('INTERPOLATION_DEGREE', String(m.interpolation.degree)),
    'META_STOP',
    '',
    ...comments(s.dataComments),
  ];
  for (let i = 0; i < s.epochs.length; i++) {
    const t = s.epochs[i]! as Instant;
    const o = 6 * i;
    const teme = {
      r: vec3<'TEME', Km>(s.teme[o]!, s.teme[o + 1]!, s.teme[o + 2]!),
      v: vec3<'TEME', KmS>(s.teme[o + 3]!, s.teme[o + 4]!, s.teme[o + 5]!),
    };
    const st = stateFromTeme(m.stateFrame, teme, t);
    out.push([
      time(t),
      ...st.r.map((x) => x.toFixed(POSITION_DECIMALS)),
      ...st.v.map((x) => x.toFixed(VELOCITY_DECIMALS)),
    ].join(' '));
  }
  if (s.covariances.length > 0)
    out.push('', 'COVARIANCE_START', ...s.covariances.flatMap((c, i) => [...(i > 0 ? [''] : []), ...covarianceLines(c)]), 'COVARIANCE_STOP');
  return out;
}

/**
 * The message as KVN text. Version 2.0, unless the header carries a MESSAGE_ID: that keyword
 * came with version 3.0 of the ODM (502.0-B-3; from memory), so such a message is written as 3.0.
 */
export function formatOemKvn(oem: Oem): string {
  const h = oem.header;
  const lines = [
    kv('CCSDS_OEM_VERS', h.messageId !== undefined ? '3.0' : '2.0'),
    ...comments(h.comments),
    kv('CREATION_DATE', time(h.creationDate)),
    kv('ORIGINATOR', h.originator),
    ...(h.messageId !== undefined ? [kv('MESSAGE_ID', h.messageId)] : []),
    ...oem.segments.flatMap((s) => ['', ...segmentLines(s)]),
  ];
  return `${lines.join('\n')}\n`;
}
