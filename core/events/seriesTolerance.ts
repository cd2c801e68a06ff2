/**
 * How far apart in TCA two sightings of the same pair may be and still be the same conjunction.
 *
 *   τ(a, b) = clamp( (K · √(σa² + σb²) + δage) / v_rel ,  τ_min ,  ¼ · P_min )
 *
 * Why each term:
 * - A position error δ along the relative velocity moves the TCA by δ / v_rel: TCA is the instant
 *   when the relative position is perpendicular to the relative velocity, and sliding one object
 *   by δ along that velocity slides that instant by δ / v_rel (linear relative motion, exact to
 *   first order over the few seconds of a short encounter). So the TCA of one prediction is
 *   uncertain by σ / v_rel, with σ the combined position σ along the relative velocity.
 * - Two predictions a and b of one conjunction differ by both errors: σa and σb add in quadrature
 *   (root-sum-square: independent errors; if they are correlated it is conservative).
 *   σ of an event is risk.detail.sigmaAlongVelocityM (the combined covariance the Pc used). When
 *   it is absent (no covariance, events stored before it was kept) it falls back to the default
 *   covariance table of core/risk by orbit regime and prediction age (TCA minus the element
 *   set's epoch): √(σT,1² + σT,2²) with each object's along-track σ, its largest axis, so the
 *   fallback errs on the long side.
 * - δage: the along-track distance the TCA can move between two predictions of different age,
 *   beyond what their covariances say (covariances of element-set predictions are often too
 *   small — common practice). Per object: the default table's along-track growth (m/day) times
 *   the difference of the two predictions' spans (TCA minus data epoch, days); the two objects
 *   combined in quadrature. Two predictions from data of the same age add nothing.
 * - v_rel: the smaller relative speed of the two events (the longer tolerance).
 * - K = 5: with realistic σ, a 5σ window misses a true link with probability ~6e-7 (normal tail);
 *   3σ would leave 0.3 % of links (30 in 10,000 events) broken, and a broken link shows the
 *   operator a false "new" and a false "no longer predicted".
 * - τ_min = 1 s: below that, differences come from how a TCA is defined and rounded (CDMs give
 *   it to the millisecond; different propagators from the same data differ by ~1 km at epoch,
 *   from memory of SGP4 accuracy studies, i.e. < 0.1 s at 14 km/s): 1 s is a tenfold margin.
 * - ¼ of the shorter orbital period: two distinct close approaches of one pair are at least
 *   about half a revolution apart (the two crossings of the orbit planes' intersection line; the
 *   same crossing one revolution later). A quarter period lies safely between "the same
 *   conjunction, predicted differently" and "the next one": the same pair one orbit later is
 *   always another series, however slow the encounter.
 *
 * Slow encounters (same-shell neighbours, tens of m/s) get long tolerances, because a metre of
 * along-track error is seconds of TCA there; the cap is what keeps them apart from the next
 * revolution.
 */
import type { StateArray } from './encounter.js';
import type { ConjunctionEvent } from './event.js';
import { regimeOf } from '../risk/covarianceDefault.js';
import { DEFAULT_COVARIANCE_TABLE } from '../risk/defaultCovarianceTable.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import { MU_EARTH_WGS72 } from '../units.js';

/** K: number of σ of the TCA difference accepted as the same conjunction (see above). */
export const SERIES_SIGMA_COUNT = 5;
/** τ_min (s): TCA definition and rounding differences between sources (see above). */
export const SERIES_TCA_FLOOR_S = 1;
/** The cap as a fraction of the shorter orbital period of the two objects (see above). */
export const SERIES_PERIOD_FRACTION = 0.25;
/** Cap (s) when no period can be derived from a state (unbound or degenerate): a quarter of a
 * 90-minute orbit, the shortest there is. */
const FALLBACK_CAP_S = 0.25 * 90 * 60;

const SECONDS_PER_DAY = MS_PER_DAY / 1000;

/** One object's part of a sighting, as the tolerance needs it. */
export interface ObjectView {
  readonly id: string;
  /** prediction span: TCA minus the data epoch, days (≥ 0) */
  readonly spanDays: number;
  /** default-table along-track σ (m) at that span, and growth (m/day), by the object's regime */
  readonly fallbackSigmaM: number;
  readonly growthMPerDay: number;
  /** osculating period at TCA (s); NaN when unbound */
  readonly periodS: number;
}

/**
 * What tolerance and linking use of one event: derived once, so linking 10,000 events does no
 * orbit arithmetic in its inner loop. Objects are held in id order (lo, hi), so a pair seen as
 * primary/secondary in one source and the other way round in another lines up.
 */
export interface SightingView {
  readonly pairKey: string;
  readonly tcaMs: number;
  readonly relativeSpeedKmS: number;
  /** combined σ along the relative velocity (m): the risk detail's, else the fallback */
  readonly sigmaAlongM: number;
  readonly sigmaFromRisk: boolean;
  readonly lo: ObjectView;
  readonly hi: ObjectView;
}

/** Osculating semi-major axis, eccentricity and period of a TEME state (km, km/s). */
export function orbitOfState(s: StateArray): { aKm: number; e: number; periodS: number } {
  const [x, y, z, vx, vy, vz] = s;
  const r = Math.hypot(x, y, z);
  const v2 = vx * vx + vy * vy + vz * vz;
  const a = 1 / (2 / r - v2 / MU_EARTH_WGS72);
  const rv = x * vx + y * vy + z * vz;
  const k = v2 - MU_EARTH_WGS72 / r;
  const e = Math.hypot(k * x - rv * vx, k * y - rv * vy, k * z - rv * vz) / MU_EARTH_WGS72;
  const periodS = a > 0 ? 2 * Math.PI * Math.sqrt((a * a * a) / MU_EARTH_WGS72) : Number.NaN;
  return { aKm: a, e, periodS };
}

function objectView(id: string, state: StateArray, epoch: Instant, dataTime: Instant, tca: Instant): ObjectView {
  const orbit = orbitOfState(state);
  // The data cannot be newer than its creation: a message without an OD epoch dates from its
  // CREATION_DATE, not from its TCA.
  const spanDays = Math.max(0, (tca - Math.min(epoch, dataTime)) / MS_PER_DAY);
  const meanMotionRevPerDay = orbit.periodS > 0 ? SECONDS_PER_DAY / orbit.periodS : 15; // rev/day
  const row = DEFAULT_COVARIANCE_TABLE[regimeOf({ meanMotionRevPerDay, eccentricity: Math.min(orbit.e, 0.99) })];
  return {
    id,
    spanDays,
    // defaultCovariance's along-track σ, √(σ₀² + (g·age)²), without building its matrix
    fallbackSigmaM: Math.hypot(row.atEpochM[1], row.growthMPerDay[1] * spanDays),
    growthMPerDay: row.growthMPerDay[1],
    periodS: orbit.periodS,
  };
}

/** The unordered pair as one key. */
export const pairKeyOf = (a: string, b: string): string => (a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`);

/** Builds the view of one event whose data was created at `dataTime`. */
export function sightingView(e: ConjunctionEvent, dataTime: Instant): SightingView {
  const p = objectView(e.primary, e.primaryState, e.primaryEpoch, dataTime, e.tca);
  const s = objectView(e.secondary, e.secondaryState, e.secondaryEpoch, dataTime, e.tca);
  const [lo, hi] = e.primary < e.secondary ? [p, s] : [s, p];
  const fromRisk = e.risk?.detail?.sigmaAlongVelocityM;
  const usable = typeof fromRisk === 'number' && Number.isFinite(fromRisk) && fromRisk >= 0;
  return {
    pairKey: pairKeyOf(e.primary, e.secondary),
    tcaMs: e.tca,
    relativeSpeedKmS: e.relativeSpeedKmS,
    sigmaAlongM: usable ? fromRisk : Math.hypot(p.fallbackSigmaM, s.fallbackSigmaM),
    sigmaFromRisk: usable,
    lo,
    hi,
  };
}

/** The tolerance and its parts, for tests and for the record of why two events were linked. */
export interface TcaTolerance {
  readonly seconds: number;
  /** K·√(σa²+σb²)/v_rel, s */
  readonly uncertaintyS: number;
  /** δage/v_rel, s */
  readonly ageS: number;
  readonly floorS: number;
  readonly capS: number;
  readonly limitedBy: 'uncertainty' | 'floor' | 'cap';
}

function quarterPeriodCap(a: SightingView, b: SightingView): number {
  const p = Math.min(a.lo.periodS, a.hi.periodS, b.lo.periodS, b.hi.periodS);
  return p > 0 ? SERIES_PERIOD_FRACTION * p : FALLBACK_CAP_S;
}

/** τ(a, b) in seconds, with its parts. Symmetric in a and b. Both must be of the same pair. */
export function tcaTolerance(a: SightingView, b: SightingView): TcaTolerance {
  const vMps = Math.min(a.relativeSpeedKmS, b.relativeSpeedKmS) * 1000;
  const sigmaM = Math.hypot(a.sigmaAlongM, b.sigmaAlongM);
  const ageM = Math.hypot(
    Math.max(a.lo.growthMPerDay, b.lo.growthMPerDay) * Math.abs(a.lo.spanDays - b.lo.spanDays),
    Math.max(a.hi.growthMPerDay, b.hi.growthMPerDay) * Math.abs(a.hi.spanDays - b.hi.spanDays),
  );
  // v_rel = 0 (a pair at rest relative to each other) makes the raw tolerance infinite: the cap decides.
  const uncertaintyS = vMps > 0 ? (SERIES_SIGMA_COUNT * sigmaM) / vMps : Infinity;
  const ageS = vMps > 0 ? ageM / vMps : Infinity;
  const capS = quarterPeriodCap(a, b);
  const raw = uncertaintyS + ageS;
  const seconds = Math.min(Math.max(raw, SERIES_TCA_FLOOR_S), capS);
  const limitedBy = raw >= capS ? 'cap' : raw <= SERIES_TCA_FLOOR_S ? 'floor' : 'uncertainty';
  return { seconds, uncertaintyS, ageS, floorS: SERIES_TCA_FLOOR_S, capS, limitedBy };
}

/** The largest τ any sighting of this set can have with any other: the linking sweep's reach. */
export function largestCap(views: readonly SightingView[]): number {
  let most = 0;
  for (const v of views) {
    const p = Math.min(v.lo.periodS, v.hi.periodS);
    most = Math.max(most, p > 0 ? SERIES_PERIOD_FRACTION * p : FALLBACK_CAP_S);
  }
  return most;
}
