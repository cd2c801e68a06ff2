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

/**
 * The encounter's fields in a new object, with `more` added (later keys win): what
 * `{ ...e, ...more }` gives. Written out because in V8 (Node 20) every key added to a spread
 * copy costs ~2 µs — about a second for the risk and ids of an all-vs-all run's 10⁵ events.
 * Encounter fields are copied by name: an event's other fields (id, run, risk, series) must be
 * passed in `more`.
 */
export function encounterWith<X extends object>(e: Encounter, more: X): Encounter & X {
  const copy: { -readonly [K in keyof Encounter]: Encounter[K] } = encounterFields(e);
  if (e.atWindowEdge !== undefined) copy.atWindowEdge = e.atWindowEdge;
  return Object.assign(copy, more);
}

/**
 * The encounter's fields that a stored event keeps, in a new object (everything but
 * atWindowEdge, which has no column): what encounterWith copies, and what insertEvents hands back.
 */
export function encounterFields(e: Encounter): Omit<Encounter, 'atWindowEdge'> {
  return {
    primary: e.primary,
    secondary: e.secondary,
    tca: e.tca,
    missKm: e.missKm,
    relativeSpeedKmS: e.relativeSpeedKmS,
    rtnKm: e.rtnKm,
    approachAngleDeg: e.approachAngleDeg,
    entry: e.entry,
    exit: e.exit,
    primaryState: e.primaryState,
    secondaryState: e.secondaryState,
    primaryEpoch: e.primaryEpoch,
    secondaryEpoch: e.secondaryEpoch,
  };
}
