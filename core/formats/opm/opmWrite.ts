/**
 * OPM writer, KVN (CCSDS 502.0-B-2 §3 and §6). Numbers are JavaScript's shortest round-trip
 * form, so reading the file back gives the same doubles; epochs keep microseconds. Writes the
 * header, metadata, comments, state vector, spacecraft parameters and manoeuvres; `other`
 * (keywords read but not interpreted) is not written.
 */
import { formatCcsdsEpoch } from '../ccsds-time.js';
import type { OpmMessage } from './opmModel.js';
import { UNITS } from './opmKeywords.js';

const line = (key: string, value: string | number): string => {
  const u = UNITS[key];
  return `${key.padEnd(18)} = ${value}${u ? ` [${u}]` : ''}`;
};
const comments = (c: readonly string[]): string[] => c.map((t) => `COMMENT ${t}`);

export function formatOpmKvn(m: OpmMessage): string {
  const out: string[] = [
    line('CCSDS_OPM_VERS', m.version),
    line('CREATION_DATE', formatCcsdsEpoch(m.creationDate)),
    line('ORIGINATOR', m.originator),
    '',
    line('OBJECT_NAME', m.objectName),
    line('OBJECT_ID', m.objectId),
    line('CENTER_NAME', m.centerName),
    line('REF_FRAME', m.refFrame),
    line('TIME_SYSTEM', m.timeSystem),
    '',
    ...comments(m.comments),
    line('EPOCH', formatCcsdsEpoch(m.epoch)),
    line('X', m.positionKm[0]),
    line('Y', m.positionKm[1]),
    line('Z', m.positionKm[2]),
    line('X_DOT', m.velocityKmS[0]),
    line('Y_DOT', m.velocityKmS[1]),
    line('Z_DOT', m.velocityKmS[2]),
  ];
  const sc = m.spacecraft;
  if (sc) {
    const rows: [string, number | undefined][] = [
      ['MASS', sc.massKg], ['SOLAR_RAD_AREA', sc.solarRadAreaM2], ['SOLAR_RAD_COEFF', sc.solarRadCoeff],
      ['DRAG_AREA', sc.dragAreaM2], ['DRAG_COEFF', sc.dragCoeff],
    ];
    const present = rows.filter((r): r is [string, number] => r[1] !== undefined);
    if (present.length > 0) out.push('', ...present.map(([k, v]) => line(k, v)));
  }
  for (const man of m.manoeuvres) {
    out.push(
      '',
      ...comments(man.comments),
      line('MAN_EPOCH_IGNITION', formatCcsdsEpoch(man.epochIgnition)),
      line('MAN_DURATION', man.durationS),
      line('MAN_DELTA_MASS', man.deltaMassKg),
      line('MAN_REF_FRAME', man.refFrame),
      line('MAN_DV_1', man.dvKmS[0]),
      line('MAN_DV_2', man.dvKmS[1]),
      line('MAN_DV_3', man.dvKmS[2]),
    );
  }
  return `${out.join('\n')}\n`;
}
