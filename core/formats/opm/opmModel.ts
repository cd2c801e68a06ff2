/**
 * An Orbit Parameter Message (CCSDS 502.0-B-2, Orbit Data Messages, §3): one state vector
 * with optional spacecraft parameters and any number of manoeuvres. Keepclear writes it to send
 * a planned avoidance burn to a screening provider, and reads it back.
 */
import type { Instant } from '../../time/instant.js';

export interface OpmManoeuvre {
  /** MAN_EPOCH_IGNITION */
  readonly epochIgnition: Instant;
  /** MAN_DURATION, s (0 = impulsive) */
  readonly durationS: number;
  /** MAN_DELTA_MASS, kg (the standard: value < 0) */
  readonly deltaMassKg: number;
  /** MAN_REF_FRAME: 'RTN' (or its synonym 'RSW') for Keepclear's burns; any frame name is read */
  readonly refFrame: string;
  /** MAN_DV_1..3, km/s, in refFrame (RTN: radial, transverse, normal) */
  readonly dvKmS: readonly [number, number, number];
  readonly comments: readonly string[];
  /** line of MAN_EPOCH_IGNITION when read from a file */
  readonly line?: number;
}

export interface OpmSpacecraft {
  readonly massKg?: number;
  readonly solarRadAreaM2?: number;
  readonly solarRadCoeff?: number;
  readonly dragAreaM2?: number;
  readonly dragCoeff?: number;
}

export interface OpmMessage {
  readonly version: string;
  readonly creationDate: Instant;
  readonly originator: string;
  readonly objectName: string;
  readonly objectId: string;
  readonly centerName: string;
  readonly refFrame: string;
  readonly timeSystem: string;
  /** state vector epoch */
  readonly epoch: Instant;
  readonly positionKm: readonly [number, number, number];
  readonly velocityKmS: readonly [number, number, number];
  readonly spacecraft: OpmSpacecraft | null;
  readonly manoeuvres: readonly OpmManoeuvre[];
  /** COMMENT lines outside the manoeuvres (a manoeuvre's own comments precede its MAN_EPOCH_IGNITION) */
  readonly comments: readonly string[];
  /**
   * Keywords of the standard that Keepclear keeps but does not interpret (osculating Keplerian
   * elements, covariance, REF_FRAME_EPOCH, USER_DEFINED_*), verbatim.
   */
  readonly other: Readonly<Record<string, string>>;
}
