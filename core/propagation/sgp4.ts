import { json2satrec, sgp4, type SatRec } from 'satellite.js';
import type { ElementSet } from '../elements/elementSet.js';
import { toIso, type Instant } from '../time/instant.js';
import type { FailureReason, Trajectory } from './trajectory.js';
import { vec3, type StateVector, type Km, type KmPerS } from '../units.js';

const MS_PER_MIN = 60_000;

/** satellite.js SatRecError codes (Vallado et al. 2006) to named reasons. */
const REASONS: Record<number, FailureReason> = {
  1: 'bad-mean-eccentricity',
  2: 'negative-mean-motion',
  3: 'bad-perturbed-eccentricity',
  4: 'negative-semi-latus-rectum',
  5: 'suborbital-epoch',
  6: 'decayed',
};

export const reasonForSgp4Code = (code: number): FailureReason => REASONS[code] ?? 'bad-elements';

/**
 * Builds the SGP4 record of an element set. satellite.js reads the epoch through a JS Date
 * (millisecond resolution); the exact epoch is kept here and every propagation time is
 * measured from it, so the rounding only touches deep-space lunar/solar terms (checked
 * against the published verification vectors in test/sgp4-verification.test.ts).
 */
export function makeSatrec(es: ElementSet): SatRec {
  return json2satrec({
    OBJECT_NAME: es.name ?? '',
    OBJECT_ID: es.intlDesignator ?? '',
    EPOCH: toIso(es.epoch),
    MEAN_MOTION: es.meanMotion,
    ECCENTRICITY: es.eccentricity,
    INCLINATION: es.inclinationDeg,
    RA_OF_ASC_NODE: es.raanDeg,
    ARG_OF_PERICENTER: es.argPerigeeDeg,
    MEAN_ANOMALY: es.meanAnomalyDeg,
    EPHEMERIS_TYPE: 0,
    CLASSIFICATION_TYPE: es.classification,
    NORAD_CAT_ID: Number.parseInt(es.objectId, 10) || 0,
    ELEMENT_SET_NO: es.elementSetNo,
    REV_AT_EPOCH: es.revAtEpoch,
    BSTAR: es.bstar,
    MEAN_MOTION_DOT: es.meanMotionDot,
    MEAN_MOTION_DDOT: es.meanMotionDdot,
  } as Parameters<typeof json2satrec>[0]);
}

/** SGP4/SDP4 trajectory of one element set. Never throws: failures come back as reasons. */
export class Sgp4Trajectory implements Trajectory {
  readonly objectId: string;
  readonly span = null;
  readonly epoch: Instant;
  readonly satrec: SatRec;
  /** Set when the element set cannot even be initialised (e.g. eccentricity ≥ 1). */
  readonly initFailure: FailureReason | null;

  constructor(readonly elements: ElementSet) {
    this.objectId = elements.objectId;
    this.epoch = elements.epoch;
    this.satrec = makeSatrec(elements);
    this.initFailure = this.satrec.error ? reasonForSgp4Code(this.satrec.error) : null;
  }

  /** State at minutes from epoch, the propagator's native time argument. */
  stateAtMinutesInto(tsince: number, out: Float64Array, offset: number): FailureReason | null {
    if (this.initFailure) return this.initFailure;
    const pv = sgp4(this.satrec, tsince);
    if (!pv) return reasonForSgp4Code(this.satrec.error);
    const p = pv.position, v = pv.velocity;
    out[offset] = p.x;
    out[offset + 1] = p.y;
    out[offset + 2] = p.z;
    out[offset + 3] = v.x;
    out[offset + 4] = v.y;
    out[offset + 5] = v.z;
    return null;
  }

  stateInto(t: Instant, out: Float64Array, offset: number): FailureReason | null {
    return this.stateAtMinutesInto((t - this.epoch) / MS_PER_MIN, out, offset);
  }

  /** Convenience (allocating) form for non-hot paths. */
  stateAt(t: Instant): StateVector<'TEME'> | FailureReason {
    const buf = new Float64Array(6);
    const failure = this.stateInto(t, buf, 0);
    if (failure) return failure;
    return {
      r: vec3<'TEME', Km>(buf[0]!, buf[1]!, buf[2]!),
      v: vec3<'TEME', KmPerS>(buf[3]!, buf[4]!, buf[5]!),
    };
  }
}
