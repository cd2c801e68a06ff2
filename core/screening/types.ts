import type { Instant } from '../time/instant.js';

/** Screening volume around the primary. */
export type ScreeningVolume =
  | { readonly kind: 'sphere'; readonly radiusKm: number }
  /** Ellipsoid with semi-axes along the primary's R, T, N directions at each instant. */
  | { readonly kind: 'rtn-ellipsoid'; readonly rKm: number; readonly tKm: number; readonly nKm: number };

/** Immutable settings of one screening run. */
export interface ScreeningSettings {
  readonly start: Instant;
  readonly end: Instant;
  readonly volume: ScreeningVolume;
  /** Object ids screened as primaries; 'all' for all-vs-all. */
  readonly primaries: readonly string[] | 'all';
}

/** An object left out of a run, with the reason (propagation failure, bad elements, …). */
export interface FlaggedObject {
  readonly id: string;
  readonly reason: string;
}

/** TEME state: x y z (km) vx vy vz (km/s). */
export type StateArray = readonly [number, number, number, number, number, number];

/** One close approach found by screening (before risk assessment). */
export interface Encounter {
  readonly primary: string;
  readonly secondary: string;
  readonly tca: Instant;
  readonly missKm: number;
  readonly relativeSpeedKmS: number;
  /** secondary minus primary, in the primary's RTN frame at TCA, km */
  readonly rtnKm: readonly [number, number, number];
  /** angle between the two velocity vectors at TCA, degrees (0 = overtaking, 180 = head-on) */
  readonly approachAngleDeg: number;
  /** first entry into / last exit from the screening volume around this TCA; null at a window edge */
  readonly entry: Instant | null;
  readonly exit: Instant | null;
  readonly primaryState: StateArray;
  readonly secondaryState: StateArray;
  /** epochs of the element sets (or ephemeris) used */
  readonly primaryEpoch: Instant;
  readonly secondaryEpoch: Instant;
  /** true when the minimum lies on an edge of the screening window (TCA outside it) */
  readonly atWindowEdge?: boolean;
}

/** Risk assessment of one encounter (issue 3/6 fills these). */
export interface RiskAssessment {
  /** probability of collision; null where none could be computed */
  readonly pc: number | null;
  readonly pcMethod: string;
  readonly covarianceSource: string;
  readonly hardBodyRadiusM: number;
  readonly tier: string;
  readonly warnings: readonly string[];
}

export interface ConjunctionEvent extends Encounter {
  readonly id: string;
  readonly runId: string;
  readonly risk: RiskAssessment | null;
}
