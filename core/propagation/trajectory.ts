import type { SatRec } from 'satellite.js';
import type { Instant } from '../time/instant.js';
import type { OrbitElements } from '../elements/elementSet.js';

/**
 * Why a trajectory could not give a state. SGP4's numeric error codes become these names
 * (satellite.js SatRecError 1..6, Vallado et al. 2006 sgp4 error codes).
 */
export type FailureReason =
  | 'bad-mean-eccentricity' // SGP4 code 1: mean eccentricity outside [0, 1)
  | 'negative-mean-motion' // code 2
  | 'bad-perturbed-eccentricity' // code 3: perturbed eccentricity outside [0, 1]
  | 'negative-semi-latus-rectum' // code 4
  | 'suborbital-epoch' // code 5 (older SGP4 versions)
  | 'decayed' // code 6: radius below one Earth radius
  | 'outside-ephemeris' // an ephemeris source asked outside its span
  | 'bad-elements'; // the element set could not be initialised at all

/** Status returned by the hot-path state function: 0 is success. */
export const STATE_OK = 0;

/**
 * One object's trajectory in TEME (km, km/s), whatever its source: SGP4 element sets, an
 * owner ephemeris (OEM, converted to TEME), or a straight line for tests.
 *
 * `stateInto` is the hot path of screening: it writes x y z vx vy vz into `out` at `offset`
 * and returns null on success or the failure reason. No allocation per call.
 */
export interface Trajectory {
  readonly objectId: string;
  /** Span where the source is valid; SGP4 is unbounded (null). */
  readonly span: { readonly start: Instant; readonly end: Instant } | null;
  stateInto(t: Instant, out: Float64Array, offset: number): FailureReason | null;
  /**
   * Capability: present when the states are exactly SGP4 of a mean element set. Screening then
   * builds its mean-element filters (radius band, orbit plane, time windows) from it and can
   * skip probing propagation; without it, a trajectory is screened by its states alone.
   */
  readonly meanElementSource?: MeanElementSource;
  /**
   * Instants where the state is not smooth (an impulsive burn, a switch between ephemeris
   * segments); the state at a break is the state after it. Interpolation must not span them.
   */
  readonly breaks?: readonly Instant[];
}

/** SGP4 element set behind a trajectory (see Trajectory.meanElementSource). */
export interface MeanElementSource {
  readonly elements: OrbitElements;
  /** the SGP4 record, initialised on first use */
  readonly satrec: SatRec;
  /** set when the element set cannot even be initialised (e.g. eccentricity ≥ 1) */
  readonly initFailure: FailureReason | null;
}
