/**
 * OEM state frames to and from TEME, through core/frames only (IAU-76/FK5 as Vallado publishes
 * it, EME2000 frame bias, ITRF with UT1 = UTC and no polar motion — see core/frames/teme.ts).
 */
import { eme2000ToGcrf, gcrfToEme2000 } from '../../frames/eme2000.js';
import { gcrfToTeme, itrfToTeme, temeToGcrf, temeToItrf } from '../../frames/teme.js';
import type { Mat3 } from '../../frames/rotation.js';
import type { Instant } from '../../time/instant.js';
import { vec3, type Frame, type Km, type KmS, type StateVector } from '../../units.js';
import type { OemStateFrame } from './keywords.js';

const state = <F extends Frame>(r: readonly number[], v: readonly number[]): StateVector<F> => ({
  r: vec3<F, Km>(r[0]!, r[1]!, r[2]!),
  v: vec3<F, KmS>(v[0]!, v[1]!, v[2]!),
});

/** A state given in `frame` (km, km/s) as a TEME state at UTC instant t. */
export function stateToTeme(frame: OemStateFrame, r: readonly number[], v: readonly number[], t: Instant): StateVector<'TEME'> {
  switch (frame) {
    case 'TEME':
      return state<'TEME'>(r, v);
    case 'GCRF':
      return gcrfToTeme(state<'GCRF'>(r, v), t);
    case 'EME2000':
      return gcrfToTeme(eme2000ToGcrf(state<'EME2000'>(r, v)), t);
    case 'ITRF':
      return itrfToTeme(state<'ITRF'>(r, v), t);
  }
}

/** A TEME state at UTC instant t, in `frame`. */
export function stateFromTeme(frame: OemStateFrame, s: StateVector<'TEME'>, t: Instant): StateVector<Frame> {
  switch (frame) {
    case 'TEME':
      return s;
    case 'GCRF':
      return temeToGcrf(s, t);
    case 'EME2000':
      return gcrfToEme2000(temeToGcrf(s, t));
    case 'ITRF':
      return temeToItrf(s, t);
  }
}

/**
 * Rotation taking position vectors of `frame` to TEME at t (row-major, r_TEME = M · r_frame),
 * built by converting the frame's unit vectors with the state functions above, so there is one
 * definition of each conversion. Positions only: for ITRF the velocity term ω × r is not part of it.
 */
export function frameToTemeRotation(frame: OemStateFrame, t: Instant): Mat3 {
  const zero = [0, 0, 0];
  const cols = [[1, 0, 0], [0, 1, 0], [0, 0, 1]].map((e) => stateToTeme(frame, e, zero, t).r);
  return [
    cols[0]![0], cols[1]![0], cols[2]![0],
    cols[0]![1], cols[1]![1], cols[2]![1],
    cols[0]![2], cols[1]![2], cols[2]![2],
  ];
}
