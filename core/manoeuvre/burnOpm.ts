/**
 * A planned burn as an OPM (CCSDS 502.0-B-2) for the screening provider: the primary's state at
 * the burn, before it, in EME2000 (converted from SGP4's TEME with core/frames: TEME → GCRF by
 * the IAU-76/FK5 reduction, then the EME2000 frame bias), and one impulsive manoeuvre block with
 * Δv in RTN (km/s, MAN_DURATION 0) and the propellant as MAN_DELTA_MASS (negative).
 */
import { gcrfToEme2000, eme2000ToGcrf } from '../frames/eme2000.js';
import { gcrfToTeme, temeToGcrf } from '../frames/teme.js';
import { KeepclearError } from '../errors.js';
import type { OpmMessage } from '../formats/opm/opmModel.js';
import type { StateArray } from '../events/index.js';
import type { Instant } from '../time/instant.js';
import { vec3, type Frame, type Km, type KmS, type StateVector } from '../units.js';
import type { ImpulsiveBurn } from './burn.js';

export interface BurnOpmInput {
  readonly objectName: string;
  /** international designator or catalogue number, as the provider knows the object */
  readonly objectId: string;
  /** the primary's TEME state at the burn, before it */
  readonly stateAtBurn: StateArray;
  readonly burn: ImpulsiveBurn;
  readonly propellantKg: number;
  /** wet mass before the burn (MASS), when known */
  readonly massKg?: number;
  readonly originator?: string;
  /** CREATION_DATE; default now (pass one for reproducible files) */
  readonly creationDate?: Instant;
  readonly comments?: readonly string[];
}

const teme = (s: StateArray): StateVector<'TEME'> => ({
  r: vec3<'TEME', Km>(s[0], s[1], s[2]),
  v: vec3<'TEME', KmS>(s[3], s[4], s[5]),
});

export function burnOpm(input: BurnOpmInput): OpmMessage {
  if (!(input.propellantKg > 0))
    throw new KeepclearError('BAD_ARGUMENT', `an OPM manoeuvre needs a propellant mass > 0 kg (MAN_DELTA_MASS < 0), got ${input.propellantKg}`);
  const t = input.burn.time;
  const eme = gcrfToEme2000(temeToGcrf(teme(input.stateAtBurn), t));
  const dv = input.burn.deltaVRtnMs;
  return {
    version: '2.0',
    creationDate: input.creationDate ?? (Date.now() as Instant),
    originator: input.originator ?? 'KEEPCLEAR',
    objectName: input.objectName,
    objectId: input.objectId,
    centerName: 'EARTH',
    refFrame: 'EME2000',
    timeSystem: 'UTC',
    epoch: t,
    positionKm: [eme.r[0], eme.r[1], eme.r[2]],
    velocityKmS: [eme.v[0], eme.v[1], eme.v[2]],
    spacecraft: input.massKg !== undefined ? { massKg: input.massKg } : null,
    manoeuvres: [
      {
        epochIgnition: t,
        durationS: 0,
        deltaMassKg: -input.propellantKg,
        refFrame: 'RTN',
        dvKmS: [dv[0] / 1000, dv[1] / 1000, dv[2] / 1000],
        comments: ['impulsive avoidance burn; Δv along radial, transverse, normal of the state above'],
      },
    ],
    comments: input.comments ?? [],
    other: {},
  };
}

/** The OPM's state vector in TEME (REF_FRAME EME2000, GCRF or TEME; centre EARTH). */
export function opmStateTeme(m: OpmMessage): StateArray {
  if (m.centerName.toUpperCase() !== 'EARTH')
    throw new KeepclearError('BAD_ARGUMENT', `OPM of ${m.objectName}: CENTER_NAME ${m.centerName}, Keepclear handles EARTH only`);
  const s = <F extends Frame>(): StateVector<F> => ({
    r: vec3<F, Km>(...m.positionKm),
    v: vec3<F, KmS>(...m.velocityKmS),
  });
  let out: StateVector<'TEME'>;
  switch (m.refFrame.toUpperCase()) {
    case 'EME2000':
      out = gcrfToTeme(eme2000ToGcrf(s<'EME2000'>()), m.epoch);
      break;
    case 'GCRF':
      out = gcrfToTeme(s<'GCRF'>(), m.epoch);
      break;
    case 'TEME':
      out = s<'TEME'>();
      break;
    default:
      throw new KeepclearError('BAD_ARGUMENT', `OPM of ${m.objectName}: REF_FRAME ${m.refFrame} — Keepclear reads EME2000, GCRF or TEME states`);
  }
  return [out.r[0], out.r[1], out.r[2], out.v[0], out.v[1], out.v[2]];
}
