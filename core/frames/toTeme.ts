/**
 * States received in a message's frame (CDM REF_FRAME, OEM REF_FRAME) into TEME, the frame
 * screening works in. A message names its frame at run time, so the frame brand is given here,
 * from the name, to plain numbers — never by casting a vector branded for another frame.
 */
import type { Instant } from '../time/instant.js';
import { vec3, type Frame, type Km, type KmS, type StateVector } from '../units.js';
import type { EarthOrientation } from './earthOrientation.js';
import { eme2000ToGcrf } from './eme2000.js';
import { gcrfToTeme, itrfToTeme } from './teme.js';

/** Frames a received state can be given in and converted from. */
export const TEME_SOURCE_FRAMES = ['TEME', 'GCRF', 'EME2000', 'ITRF'] as const;
export type TemeSourceFrame = (typeof TEME_SOURCE_FRAMES)[number];

type Triple = readonly [number, number, number] | ArrayLike<number>;

/** Position (km) and velocity (km/s) as plain numbers, branded with the frame they are in. */
export function stateIn<F extends Frame>(_frame: F, r: Triple, v: Triple): StateVector<F> {
  return { r: vec3<F, Km>(r[0]!, r[1]!, r[2]!), v: vec3<F, KmS>(v[0]!, v[1]!, v[2]!) };
}

/** A state given in `frame` at UTC instant `t`, in TEME (IAU-76/FK5 reduction of teme.ts). */
export function toTemeFrom(
  frame: TemeSourceFrame,
  r: Triple,
  v: Triple,
  t: Instant,
  eop: EarthOrientation = {},
): StateVector<'TEME'> {
  switch (frame) {
    case 'TEME':
      return stateIn('TEME', r, v);
    case 'GCRF':
      return gcrfToTeme(stateIn('GCRF', r, v), t, eop);
    case 'EME2000':
      return gcrfToTeme(eme2000ToGcrf(stateIn('EME2000', r, v)), t, eop);
    case 'ITRF':
      return itrfToTeme(stateIn('ITRF', r, v), t, eop);
  }
}
