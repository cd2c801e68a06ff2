import type { Instant } from '../time/instant.js';

/** TEME state: x y z (km) vx vy vz (km/s). */
export type StateArray = readonly [number, number, number, number, number, number];

/**
 * One close approach of two objects, as screening finds it or a received CDM describes it
 * (before risk assessment). Relative quantities are secondary minus primary.
 */
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
