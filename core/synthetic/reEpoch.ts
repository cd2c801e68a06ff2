import type { SatRec } from 'satellite.js';
import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import { roundToTlePrecision } from './draft.js';
import { toEquinoctial, type Equinoctial, type FitTarget } from './fit.js';
import { keplerianFromState, meanMotionRevPerDay, wrapTwoPi } from './kepler.js';

/**
 * A newer (or older) element set of the same object: the set's own SGP4 state at another epoch,
 * optionally disturbed (an orbit-determination error), refitted as mean elements at that epoch.
 * This is how the demo's weekly catalogue updates stay consistent with one truth.
 *
 * Why not fit.ts: its Newton iteration differentiates through SGP4 (13 propagations per step)
 * and is built for long spans between the fit epoch and the state. Here the state lies AT the
 * new epoch, where SGP4's mean-to-osculating map is the identity plus short-period terms of
 * order J2 (~1e-3). So a fixed-point iteration on osculating equinoctial elements,
 *   x ← x + (osc(target) − osc(SGP4(x) at epoch)),
 * contracts by ~1e-3 per step. Started from the source's mean elements carried along SGP4's own
 * secular rates, it usually needs one correction: two SGP4 initialisations per object and week,
 * which keeps three weekly catalogues of 30,000 objects within a few seconds.
 */
/** Contract: SGP4 of the result (before TLE rounding) reproduces the target within 1 m, 1 mm/s. */
export const RE_EPOCH_POSITION_TOLERANCE_KM = 1e-3;
export const RE_EPOCH_VELOCITY_TOLERANCE_KMS = 1e-6;
/** Without TLE rounding, iterate on to 1 mm and 1 µm/s, for margin below the contract. */
const FINE_POSITION_KM = 1e-6;
const FINE_VELOCITY_KMS = 1e-9;
const MAX_ITERATIONS = 8;

const TWO_PI = 2 * Math.PI;
const RAD = 180 / Math.PI;
const wrapPi = (x: number): number => x - TWO_PI * Math.round(x / TWO_PI);

/**
 * The source's mean elements carried to `epoch` by SGP4's own secular rates: gravity, the leading
 * drag terms, and for deep-space sets the lunar-solar rates (resonance left out).
 */
function secularShift(source: ElementSet, rec: SatRec, epoch: Instant): Equinoctial {
  const t = (epoch - source.epoch) / 60_000; // minutes, SGP4's time argument
  const tempa = 1 - rec.cc1 * t;
  let e = rec.ecco - rec.bstar * rec.cc4 * t;
  let i = rec.inclo;
  let argp = rec.argpo + rec.argpdot * t;
  let node = rec.nodeo + rec.nodedot * t + rec.nodecf * t * t;
  let m = rec.mo + rec.mdot * t + rec.no * rec.t2cof * t * t;
  if (rec.method === 'd') {
    e += rec.dedt * t;
    i += rec.didt * t;
    argp += rec.domdt * t;
    node += rec.dnodt * t;
    m += rec.dmdt * t;
  }
  // Drag shrinks a as tempa² (SGP4), so n grows as tempa⁻³ (Kepler's third law).
  const n = source.meanMotionRevPerDay / (tempa * tempa * tempa);
  return toEquinoctial(n, Math.min(Math.max(e, 0), 0.99), i, node, argp, m);
}

function osculatingEquinoctial(s: ArrayLike<number>): Equinoctial {
  const k = keplerianFromState([s[0]!, s[1]!, s[2]!], [s[3]!, s[4]!, s[5]!]);
  return toEquinoctial(meanMotionRevPerDay(k.a), k.e, k.i, k.raan, k.argp, k.meanAnomaly);
}

/** x + (goal − now), the mean longitude difference wrapped. */
const corrected = (x: Equinoctial, goal: Equinoctial, now: Equinoctial): Equinoctial => [
  x[0] + goal[0] - now[0], x[1] + goal[1] - now[1], x[2] + goal[2] - now[2],
  x[3] + goal[3] - now[3], x[4] + goal[4] - now[4], x[5] + wrapPi(goal[5] - now[5]),
];

/** The element set of equinoctial mean elements; every other field from `base` (one object shape). */
function withElements(base: ElementSet, x: Equinoctial): ElementSet {
  const [n, af, ag, chi, psi, lambda] = x;
  const e = Math.hypot(af, ag);
  const lonPerigee = e > 0 ? Math.atan2(ag, af) : 0;
  const tanHalfI = Math.hypot(chi, psi);
  const raan = tanHalfI > 0 ? Math.atan2(chi, psi) : 0;
  return {
    objectId: base.objectId, name: base.name, intlDesignator: base.intlDesignator,
    classification: base.classification, epoch: base.epoch,
    meanMotionRevPerDay: n, eccentricity: e, inclinationDeg: 2 * Math.atan(tanHalfI) * RAD,
    raanDeg: wrapTwoPi(raan) * RAD, argPerigeeDeg: wrapTwoPi(lonPerigee - raan) * RAD,
    meanAnomalyDeg: wrapTwoPi(lambda - lonPerigee) * RAD,
    bstar: base.bstar, meanMotionDot: base.meanMotionDot, meanMotionDdot: base.meanMotionDdot,
    elementSetNo: base.elementSetNo, revAtEpoch: base.revAtEpoch, ephemerisType: base.ephemerisType,
    source: base.source,
  };
}

export interface ReEpochOptions {
  /** disturbs the state (TEME km, km/s) at the new epoch before the fit: an orbit-determination error */
  readonly perturb?: (r: readonly number[], v: readonly number[]) => FitTarget;
  /** round the result to TLE precision, so a TLE export loses nothing (default true) */
  readonly roundToTle?: boolean;
  /** the source's trajectory, when the caller already has one (saves an initialisation) */
  readonly trajectory?: Sgp4Trajectory;
  /**
   * 'fit' (default): iterate to the contract. 'secular': the starting estimate only (secular
   * rates plus the disturbance), consistent with the source to kilometres, not metres — for
   * orbits where that cannot matter (see demoWeeks.ts).
   */
  readonly mode?: 'fit' | 'secular';
}

/**
 * The set `source` re-issued at `epoch` (a TLE-exact instant). Element-set number and revolution
 * count follow on; B*, name and the rest are kept. Throws KeepclearError INTERNAL when SGP4
 * cannot propagate the source to `epoch` or the iteration does not reach the contract (seen
 * with near-equatorial deep-space orbits, whose low-inclination periodics defeat it).
 */
export function reEpochElementSet(source: ElementSet, epoch: Instant, opts: ReEpochOptions = {}): ElementSet {
  const trajectory = opts.trajectory ?? new Sgp4Trajectory(source);
  const truth = new Float64Array(6);
  const failure = trajectory.stateInto(epoch, truth, 0);
  if (failure) throw new KeepclearError('INTERNAL', `re-epoch of ${source.objectId}: ${failure}`);
  const target = opts.perturb
    ? opts.perturb([truth[0]!, truth[1]!, truth[2]!], [truth[3]!, truth[4]!, truth[5]!])
    : { r: [truth[0]!, truth[1]!, truth[2]!], v: [truth[3]!, truth[4]!, truth[5]!] };
  const t6 = [...target.r, ...target.v];
  const goal = osculatingEquinoctial(t6);
  const days = (epoch - source.epoch) / MS_PER_DAY;
  const base: ElementSet = {
    ...source,
    epoch,
    elementSetNo: Math.max(1, (source.elementSetNo + Math.round(days)) % 10_000),
    revAtEpoch: Math.max(0, Math.round(source.revAtEpoch + days * source.meanMotionRevPerDay) % 100_000),
  };
  const round = opts.roundToTle !== false;
  const finish = (es: ElementSet): ElementSet => (round ? roundToTlePrecision(es) : es);
  // Start: the secularly shifted mean elements, corrected by the disturbance in osculating terms.
  let x = corrected(secularShift(source, trajectory.satrec, epoch), goal, osculatingEquinoctial(truth));
  if (opts.mode === 'secular') return finish(withElements(base, x));
  // Rounding to TLE digits moves the state by ~10 m anyway: then the contract is the goal.
  const goalKm = round ? RE_EPOCH_POSITION_TOLERANCE_KM : FINE_POSITION_KM;
  const goalKmS = round ? RE_EPOCH_VELOCITY_TOLERANCE_KMS : FINE_VELOCITY_KMS;
  const buf = new Float64Array(6);
  let best: { es: ElementSet; dr: number; dv: number } | null = null;
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    const es = withElements(base, x);
    const f = new Sgp4Trajectory(es).stateInto(epoch, buf, 0);
    if (f) throw new KeepclearError('INTERNAL', `re-epoch of ${source.objectId}: ${f} during the fit`);
    const dr = Math.hypot(buf[0]! - t6[0]!, buf[1]! - t6[1]!, buf[2]! - t6[2]!);
    const dv = Math.hypot(buf[3]! - t6[3]!, buf[4]! - t6[4]!, buf[5]! - t6[5]!);
    if (!best || dr < best.dr) best = { es, dr, dv };
    if (dr < goalKm && dv < goalKmS) break;
    x = corrected(x, goal, osculatingEquinoctial(buf));
  }
  if (!(best!.dr < RE_EPOCH_POSITION_TOLERANCE_KM && best!.dv < RE_EPOCH_VELOCITY_TOLERANCE_KMS))
    throw new KeepclearError('INTERNAL', `re-epoch of ${source.objectId} did not converge: ${(best!.dr * 1000).toFixed(3)} m, ${(best!.dv * 1e6).toFixed(3)} mm/s`);
  return finish(best!.es);
}
