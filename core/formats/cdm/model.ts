/**
 * A validated CCSDS Conjunction Data Message (CCSDS 508.0-B-1) in memory.
 *
 * Units are those of the message (m, m/s, km, km/s, m² …), branded where Keepclear computes with
 * them. Every block keeps its COMMENT lines, the source line of each keyword, and the keywords
 * the standard does not define (`extras`), so nothing received is lost.
 */
import type { Matrix } from '../../math/linalg.js';
import type { CovarianceStatus } from '../../risk/covariancePsd.js';
import type { Instant } from '../../time/instant.js';
import type { M, MS, StateVector } from '../../units.js';
import type { CDM_REF_FRAMES } from './keywords.js';

export type CdmRefFrame = (typeof CDM_REF_FRAMES)[number];

/** A keyword the standard does not define, kept as received. */
export interface CdmExtra {
  readonly value: string;
  readonly unit?: string;
  readonly line: number;
}

/** What every block carries besides its values. */
export interface CdmBlockInfo {
  comments: string[];
  /** Keyword → 1-based source line. */
  lines: Record<string, number>;
  extras: Record<string, CdmExtra>;
}

export interface CdmHeader extends CdmBlockInfo {
  ccsdsCdmVers: string;
  creationDate: Instant;
  originator: string;
  messageFor?: string;
  messageId: string;
}

export interface CdmRelative extends CdmBlockInfo {
  tca: Instant;
  missDistance: M;
  relativeSpeed?: MS;
  relativePositionR?: M;
  relativePositionT?: M;
  relativePositionN?: M;
  relativeVelocityR?: MS;
  relativeVelocityT?: MS;
  relativeVelocityN?: MS;
  startScreenPeriod?: Instant;
  stopScreenPeriod?: Instant;
  screenVolumeFrame?: 'RTN' | 'TVN';
  screenVolumeShape?: 'ELLIPSOID' | 'BOX';
  screenVolumeX?: M;
  screenVolumeY?: M;
  screenVolumeZ?: M;
  screenEntryTime?: Instant;
  screenExitTime?: Instant;
  collisionProbability?: number;
  collisionProbabilityMethod?: string;
}

export interface CdmObjectMetadata extends CdmBlockInfo {
  object: 'OBJECT1' | 'OBJECT2';
  objectDesignator: string;
  catalogName: string;
  objectName: string;
  internationalDesignator: string;
  objectType?: 'PAYLOAD' | 'ROCKET BODY' | 'DEBRIS' | 'UNKNOWN' | 'OTHER';
  operatorContactPosition?: string;
  operatorOrganization?: string;
  operatorPhone?: string;
  operatorEmail?: string;
  ephemerisName: string;
  covarianceMethod: 'CALCULATED' | 'DEFAULT';
  maneuverable: 'YES' | 'NO' | 'N/A';
  orbitCenter?: string;
  refFrame: CdmRefFrame;
  gravityModel?: string;
  atmosphericModel?: string;
  nBodyPerturbations?: string;
  solarRadPressure?: 'YES' | 'NO';
  earthTides?: 'YES' | 'NO';
  intrackThrust?: 'YES' | 'NO';
}

export interface CdmOdParameters extends CdmBlockInfo {
  timeLastobStart?: Instant;
  timeLastobEnd?: Instant;
  /** days */
  recommendedOdSpan?: number;
  /** days */
  actualOdSpan?: number;
  obsAvailable?: number;
  obsUsed?: number;
  tracksAvailable?: number;
  tracksUsed?: number;
  /** percent */
  residualsAccepted?: number;
  weightedRms?: number;
}

export interface CdmAdditionalParameters extends CdmBlockInfo {
  /** m² — the object's area for collision probability (hard-body disc). */
  areaPc?: number;
  areaDrg?: number;
  areaSrp?: number;
  /** kg */
  mass?: number;
  /** m²/kg */
  cdAreaOverMass?: number;
  /** m²/kg */
  crAreaOverMass?: number;
  /** m/s² */
  thrustAcceleration?: number;
  /** W/kg */
  sedr?: number;
}

/** Position in km and velocity in km/s, in the object's REF_FRAME. */
export interface CdmStateVector extends CdmBlockInfo, StateVector<CdmRefFrame> {}

/**
 * How the received covariance was judged. `psd`: usable as received. `repaired`: clipped to the
 * nearest PSD matrix within rounding tolerance. `extension-dropped`: the 6×6 block is fine but
 * the drag/SRP/thrust rows made it non-PSD beyond rounding, so only the 6×6 is usable.
 * `not-psd`: unusable; `zero`: the position block is all zero (no uncertainty stated), unusable.
 * Unusable ones are kept only when the caller asked to keep such messages. The judge is THE
 * covariance policy, core/risk/covariancePsd.ts.
 */
export type CdmCovarianceStatus = CovarianceStatus;

export interface CdmCovariance extends CdmBlockInfo {
  /** Size as received: 6, or 7–9 with the drag, SRP and thrust rows. */
  dimension: 6 | 7 | 8 | 9;
  /**
   * Full symmetric matrix as received (lower triangle mirrored), rows R, T, N, RDOT, TDOT, NDOT,
   * DRG, SRP, THR; units m², m²/s, m²/s² … as the standard gives them.
   */
  matrix: Matrix;
  status: CdmCovarianceStatus;
  /** The matrix to compute with (PSD; 6×6 when the extension was dropped); null if `not-psd` or `zero`. */
  usable: Matrix | null;
  /** Why the status is not `psd`. */
  note?: string;
}

export interface CdmObject {
  metadata: CdmObjectMetadata;
  /** COMMENTs of the object's data section as a whole (XML `<data><COMMENT>`). */
  dataComments: string[];
  od: CdmOdParameters;
  additional: CdmAdditionalParameters;
  state: CdmStateVector;
  covariance: CdmCovariance;
}

export interface Cdm {
  header: CdmHeader;
  relative: CdmRelative;
  object1: CdmObject;
  object2: CdmObject;
}

/**
 * Hard-body radius of an object from its AREA_PC, taking the area as a disc: R = √(A/π).
 * (Keepclear design notes: per-object radius from CDM AREA_PC.)
 */
export function hardBodyRadiusFromAreaPc(areaM2: number): M {
  if (!(areaM2 >= 0) || !Number.isFinite(areaM2)) throw new RangeError(`AREA_PC must be ≥ 0 m², got ${areaM2}`);
  return Math.sqrt(areaM2 / Math.PI) as M;
}
