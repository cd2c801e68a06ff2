/**
 * What the 3-D view draws, as plain data (JSON- and structured-clone-safe): the Earth, both
 * orbits around TCA and the catalogue in an Earth-centred frame (TEME, km), and the encounter in
 * the primary's RTN frame (relative track km, covariance ellipsoids and hard-body radius m).
 * Built here in core so the renderer only draws, and the numbers can be tested without a DOM.
 */
import { KeepclearError } from '../errors.js';
import type { Encounter, Matrix3, RiskAssessment } from '../events/index.js';
import { relativeRtn } from '../events/geometry.js';
import { earthRotationRate, gmst1982 } from '../frames/fk5.js';
import type { Trajectory } from '../propagation/trajectory.js';
import { DEFAULT_HBR_PER_OBJECT_M } from '../risk/hardBody.js';
import { TIER_ORDER, type TierId } from '../risk/tiers.js';
import { ut1DaysSinceJ2000 } from '../time/leapSeconds.js';
import { addSeconds, toIso, type Instant } from '../time/instant.js';
import { MU_EARTH_WGS84, R_EARTH_WGS84 } from '../units.js';
import {
  addCovariances,
  covarianceEllipsoid,
  reframeCovariance,
  rtnAxes,
  type CovarianceEllipsoid,
  type Vec3n,
} from './ellipsoid.js';

/** WGS-84 flattening 1/298.257223563 (NIMA TR8350.2), for the drawn Earth. */
export const WGS84_FLATTENING = 1 / 298.257223563;

/**
 * Default half-span of the relative track and of the time scrubber: 5 min either side of TCA.
 * Our choice: at LEO crossing speeds (~10 km/s) that is ±3,000 km of relative motion, far beyond
 * any covariance ellipsoid, and the orbit markers visibly move on the Earth view.
 */
export const DEFAULT_RELATIVE_SPAN_S = 300;
/** Samples of the relative track; denser near TCA (cubic spacing), so a straight chord between
 * neighbours near the ellipsoids is metres long even at 15 km/s. */
export const DEFAULT_RELATIVE_SAMPLES = 241;
/** Samples per drawn orbit (one revolution centred on TCA): ~1° apart, chord sag < 1 km at LEO. */
export const DEFAULT_ORBIT_SAMPLES = 361;
/** Used when a state gives no closed orbit (hyperbolic or failing): draw ±45 min. */
const FALLBACK_ORBIT_SPAN_S = 5400;

export interface SceneObject {
  readonly id: string;
  /** seconds from TCA of each sample, ascending (samples where propagation failed are left out) */
  readonly timesS: readonly number[];
  /** TEME positions at those times, flat x y z, km */
  readonly positionsTemeKm: readonly number[];
  /** position and velocity at TCA, TEME km and km/s */
  readonly stateAtTcaTeme: readonly [number, number, number, number, number, number];
}

export interface EncounterScene {
  readonly eventId: string | null;
  readonly tca: string;
  readonly frame: 'TEME';
  readonly earth: {
    readonly equatorialRadiusKm: number;
    readonly flattening: number;
    /** Greenwich sidereal angle (GMST 1982) at TCA: the prime meridian's angle from TEME x̂, rad */
    readonly gmstAtTcaRad: number;
    /** Earth rotation rate, rad/s, to turn the graticule while the scrubber moves */
    readonly rotationRateRadS: number;
  };
  readonly primary: SceneObject;
  readonly secondary: SceneObject;
  /** catalogue positions at TCA, flat x y z, TEME km rounded to the metre (objects whose propagation failed are left out) */
  readonly catalogue: { readonly count: number; readonly positionsTemeKm: readonly number[]; readonly failed: number };
  /** the scrubber's range, seconds from TCA */
  readonly timeRangeS: readonly [number, number];
  /** the encounter in the primary's RTN frame (co-moving: the frame of the primary at each instant) */
  readonly relative: {
    readonly timesS: readonly number[];
    /** secondary minus primary, in the primary's RTN frame at each time, flat R T N, km */
    readonly rtnKm: readonly number[];
    readonly tcaRtnKm: Vec3n;
    /** secondary minus primary velocity at TCA in the primary's RTN axes (not rotating-frame), km/s */
    readonly relativeVelocityRtnKmS: Vec3n;
    readonly missKm: number;
    readonly relativeSpeedKmS: number;
  };
  /** covariance ellipsoids at TCA in the primary's RTN frame; null where no covariance was usable */
  readonly covariance: {
    /** centred on the primary (the origin) */
    readonly primary: CovarianceEllipsoid | null;
    /** centred on the secondary (relative.tcaRtnKm) */
    readonly secondary: CovarianceEllipsoid | null;
    /** primary + secondary, centred on the secondary: the uncertainty of the relative position */
    readonly combined: CovarianceEllipsoid | null;
    readonly source: string | null;
  };
  /** combined hard-body radius (m), a sphere around the primary */
  readonly hardBodyRadiusM: number;
  readonly hardBodyRadiusIsDefault: boolean;
  readonly tier: TierId | null;
  readonly pc: number | null;
}

export interface EncounterSceneInput {
  /** the encounter (TCA, objects) with its risk when assessed; `id` is carried into the scene */
  readonly event: Encounter & { readonly id?: string; readonly risk?: RiskAssessment | null };
  readonly primary: Trajectory;
  readonly secondary: Trajectory;
  /** catalogue objects to show as points at TCA */
  readonly catalogue?: readonly Trajectory[];
  /** per-object position covariances at TCA, each in its own RTN frame (m²); default: event.risk.detail */
  readonly covariances?: { readonly primaryRtnM2?: Matrix3 | null; readonly secondaryRtnM2?: Matrix3 | null };
  /** default: the event's risk, else twice DEFAULT_HBR_PER_OBJECT_M */
  readonly hardBodyRadiusM?: number;
  readonly relativeSpanS?: number;
  readonly relativeSamples?: number;
  readonly orbitSamples?: number;
}

const state6 = (tr: Trajectory, t: Instant, out: Float64Array): boolean => tr.stateInto(t, out, 0) === null;

function stateAtTca(tr: Trajectory, tca: Instant, role: string): Float64Array {
  const s = new Float64Array(6);
  const why = tr.stateInto(tca, s, 0);
  if (why !== null) {
    throw new KeepclearError('PROPAGATION_FAILED', `encounter scene: the ${role} ${tr.objectId} has no state at TCA ${toIso(tca)} (${why})`);
  }
  return s;
}

/** Orbital period from a state by vis-viva (s), or null when the state is not on a closed orbit. */
function periodS(s: Float64Array): number | null {
  const r = Math.hypot(s[0]!, s[1]!, s[2]!);
  const v2 = s[3]! ** 2 + s[4]! ** 2 + s[5]! ** 2;
  const inv = 2 / r - v2 / MU_EARTH_WGS84;
  if (!(inv > 0)) return null;
  const a = 1 / inv;
  return 2 * Math.PI * Math.sqrt((a * a * a) / MU_EARTH_WGS84);
}

function sampleOrbit(tr: Trajectory, tca: Instant, atTca: Float64Array, n: number): SceneObject {
  const span = periodS(atTca) ?? FALLBACK_ORBIT_SPAN_S;
  const half = Math.floor(n / 2);
  const timesS: number[] = [];
  const pos: number[] = [];
  const buf = new Float64Array(6);
  for (let i = -half; i <= half; i++) {
    const t = (i / half) * (span / 2);
    if (!state6(tr, addSeconds(tca, t), buf)) continue;
    timesS.push(t);
    pos.push(buf[0]!, buf[1]!, buf[2]!);
  }
  return {
    id: tr.objectId,
    timesS,
    positionsTemeKm: pos,
    stateAtTcaTeme: [atTca[0]!, atTca[1]!, atTca[2]!, atTca[3]!, atTca[4]!, atTca[5]!],
  };
}

/** Sample times on [−span, span], cubic spacing t = span·u³ (u uniform): fine near TCA, coarse far out. */
export function relativeSampleTimes(spanS: number, n: number): number[] {
  const half = Math.max(1, Math.floor(n / 2));
  const out: number[] = [];
  for (let i = -half; i <= half; i++) {
    const u = i / half;
    out.push(spanS * u * u * u);
  }
  return out;
}

function ellipsoidOrNull(cov: Matrix3 | null | undefined): CovarianceEllipsoid | null {
  if (!cov) return null;
  try {
    return covarianceEllipsoid(cov);
  } catch (e) {
    if (e instanceof KeepclearError) return null;
    throw e;
  }
}

const toMetre = (km: number): number => Math.round(km * 1000) / 1000;

const isTier = (t: unknown): t is TierId => typeof t === 'string' && (TIER_ORDER as readonly string[]).includes(t);

export function buildEncounterScene(input: EncounterSceneInput): EncounterScene {
  const { event } = input;
  const tca = event.tca;
  const relSpan = input.relativeSpanS ?? DEFAULT_RELATIVE_SPAN_S;
  if (!(relSpan > 0)) throw new KeepclearError('BAD_ARGUMENT', `encounter scene: relative span must be > 0 s, got ${relSpan}`);
  const p0 = stateAtTca(input.primary, tca, 'primary');
  const s0 = stateAtTca(input.secondary, tca, 'secondary');

  const orbitN = input.orbitSamples ?? DEFAULT_ORBIT_SAMPLES;
  const primary = sampleOrbit(input.primary, tca, p0, orbitN);
  const secondary = sampleOrbit(input.secondary, tca, s0, orbitN);

  // The relative track in the primary's co-moving RTN frame.
  const relTimes: number[] = [];
  const relRtn: number[] = [];
  const pb = new Float64Array(6), sb = new Float64Array(6);
  for (const t of relativeSampleTimes(relSpan, input.relativeSamples ?? DEFAULT_RELATIVE_SAMPLES)) {
    const at = addSeconds(tca, t);
    if (!state6(input.primary, at, pb) || !state6(input.secondary, at, sb)) continue;
    relTimes.push(t);
    relRtn.push(...relativeRtn(pb, sb));
  }

  const pAxes = rtnAxes(p0);
  const sAxes = rtnAxes(s0);
  const dv: Vec3n = [s0[3]! - p0[3]!, s0[4]! - p0[4]!, s0[5]! - p0[5]!];
  const proj = (v: Vec3n): Vec3n => pAxes.map((e) => e[0] * v[0] + e[1] * v[1] + e[2] * v[2]) as unknown as Vec3n;
  const tcaRtn = relativeRtn(p0, s0);

  const detail = event.risk?.detail;
  const covP = input.covariances?.primaryRtnM2 !== undefined ? input.covariances.primaryRtnM2 : (detail?.primaryCovRtnM2 ?? null);
  const covSown = input.covariances?.secondaryRtnM2 !== undefined ? input.covariances.secondaryRtnM2 : (detail?.secondaryCovRtnM2 ?? null);
  // The secondary's covariance is given in its own RTN frame; the view is the primary's.
  const covS = covSown ? reframeCovariance(covSown, sAxes, pAxes) : null;

  const cat: number[] = [];
  let failed = 0;
  const cb = new Float64Array(6);
  for (const tr of input.catalogue ?? []) {
    // Rounded to the metre: points on an Earth-sized view need no more, and the scene crosses
    // the bridge as JSON (30,000 × 3 numbers; full doubles would double its size).
    if (state6(tr, tca, cb)) cat.push(toMetre(cb[0]!), toMetre(cb[1]!), toMetre(cb[2]!));
    else failed++;
  }

  const hbrFromRisk = event.risk?.hardBodyRadiusM;
  const hbr = input.hardBodyRadiusM ?? hbrFromRisk ?? 2 * DEFAULT_HBR_PER_OBJECT_M;

  return {
    eventId: event.id ?? null,
    tca: toIso(tca),
    frame: 'TEME',
    earth: {
      equatorialRadiusKm: R_EARTH_WGS84,
      flattening: WGS84_FLATTENING,
      gmstAtTcaRad: gmst1982(ut1DaysSinceJ2000(tca)),
      rotationRateRadS: earthRotationRate(),
    },
    primary,
    secondary,
    catalogue: { count: cat.length / 3, positionsTemeKm: cat, failed },
    timeRangeS: [-relSpan, relSpan],
    relative: {
      timesS: relTimes,
      rtnKm: relRtn,
      tcaRtnKm: tcaRtn,
      relativeVelocityRtnKmS: proj(dv),
      missKm: Math.hypot(s0[0]! - p0[0]!, s0[1]! - p0[1]!, s0[2]! - p0[2]!),
      relativeSpeedKmS: Math.hypot(...dv),
    },
    covariance: {
      primary: ellipsoidOrNull(covP),
      secondary: ellipsoidOrNull(covS),
      combined: covP && covS ? ellipsoidOrNull(addCovariances(covP, covS)) : null,
      source: event.risk?.covarianceSource ?? (covP || covS ? 'given' : null),
    },
    hardBodyRadiusM: hbr,
    hardBodyRadiusIsDefault: input.hardBodyRadiusM === undefined && hbrFromRisk === undefined,
    tier: isTier(event.risk?.tier) ? event.risk.tier : null,
    pc: event.risk?.pc ?? null,
  };
}

export { trackPointAt } from './track.js';
