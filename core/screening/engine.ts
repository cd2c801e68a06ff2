import type { Instant } from '../time/instant.js';
import type { ElementSet } from '../elements/elementSet.js';
import type { FailureReason, Trajectory } from '../propagation/trajectory.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import { SampledTrajectory, type SampleTable } from '../propagation/sampledTrajectory.js';
import { buildSgp4Model, exactModel, type OrbitModel } from './orbitModel.js';
import { buildStateGrid, gridStepMs, type StateGrid } from './primaryGrid.js';
import { candidateRegions, type FilterStats, type Regions } from './pairFilter.js';
import { findEncounters, PropagationError } from './refine.js';
import { volumeBoundKm } from './geometry.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../units.js';
import type { FlaggedObject, ScreeningVolume } from './types.js';
import type { Encounter } from '../events/index.js';

/** Spacing of the sampled mean elements of the filter model (min): 12 h keeps ε honest (tested). */
const MODEL_NODE_SPACING_MIN = 720;
/** The filter model also covers this much outside the window, for the refinement margins (ms). */
export const MODEL_MARGIN_MS = 3_600_000;
/** Resolution of the decay time found by bisection (ms). */
const VALIDITY_RESOLUTION_MS = 1000;
/** Padding of the element-set radius band (see coarseRadiusBand). */
const COARSE_RADIUS_PAD_KM = 60;
const COARSE_RADIUS_PAD_FRACTION = 0.01;
/** Range-rate sampling step in refinement: ≤ 1/16 of the shorter period, at most 60 s. */
const REFINE_MAX_STEP_MS = 60_000;

/** One object taking part in a screening, whatever its trajectory source. */
export interface ScreeningObject {
  readonly id: string;
  readonly trajectory: Trajectory;
  /** epoch of the element set / ephemeris used */
  readonly epoch: Instant;
  /** orbital period (min), used to size refinement steps */
  readonly periodMin: number;
  /** step of the object's exact grid when it is a primary (ms); default from periodMin */
  readonly gridStepMs?: number;
  /** speed bound (km/s) for sources without a mean-element model */
  readonly vMaxKmS?: number;
  /** bounds of |r| (km) over the window for sources without mean elements (coarse radius filter) */
  readonly radiusBandKm?: readonly [number, number];
}

export function objectFromElements(es: ElementSet): ScreeningObject {
  return {
    id: es.objectId,
    trajectory: new Sgp4Trajectory(es),
    epoch: es.epoch,
    periodMin: 1440 / es.meanMotion,
    gridStepMs: gridStepMs(es.meanMotion, es.eccentricity),
  };
}

/**
 * A primary given as samples of any trajectory (sampledTrajectory.ts). Its period and grid
 * step come from the osculating orbit of its first sample; its radius band and speed bound
 * from the samples.
 */
export function objectFromSamples(table: SampleTable, epoch: Instant): ScreeningObject {
  const trajectory = new SampledTrajectory(table);
  const p = table.pieces[0];
  const first = p ? table.values.subarray(p.first * 6, p.first * 6 + 6) : null;
  const osc = first ? osculatingMeanMotion(first) : null;
  return {
    id: table.objectId,
    trajectory,
    epoch,
    periodMin: osc ? 1440 / osc.revPerDay : 90,
    gridStepMs: osc ? gridStepMs(osc.revPerDay, osc.e) : 5000,
    vMaxKmS: table.vMaxKmS,
    radiusBandKm: [table.rMinKm, table.rMaxKm],
  };
}

/** Osculating mean motion (rev/day) and eccentricity of a TEME state. */
function osculatingMeanMotion(s: ArrayLike<number>): { revPerDay: number; e: number } | null {
  const r = Math.hypot(s[0]!, s[1]!, s[2]!);
  const v2 = s[3]! ** 2 + s[4]! ** 2 + s[5]! ** 2;
  const energy = v2 / 2 - MU_EARTH_WGS72 / r;
  if (!(energy < 0)) return null;
  const a = -MU_EARTH_WGS72 / (2 * energy);
  const hx = s[1]! * s[5]! - s[2]! * s[4]!, hy = s[2]! * s[3]! - s[0]! * s[5]!, hz = s[0]! * s[4]! - s[1]! * s[3]!;
  const h2 = hx * hx + hy * hy + hz * hz;
  const e = Math.sqrt(Math.max(0, 1 - h2 / (MU_EARTH_WGS72 * a)));
  const n = Math.sqrt(MU_EARTH_WGS72 / (a * a * a)); // rad/s
  return { revPerDay: (n * 86_400) / (2 * Math.PI), e };
}

export interface WindowSettings {
  readonly start: Instant;
  readonly end: Instant;
  readonly volume: ScreeningVolume;
}

/** Per-worker state: filter models are built lazily and kept for the run. */
export class ScreeningSession {
  private readonly models = new Map<string, OrbitModel | FailureReason>();
  readonly flagged = new Map<string, string>();
  readonly stats: FilterStats & { pairs: number; radiusPruned: number; regions: number; sgp4Evaluations: number } = {
    pairs: 0,
    radiusPruned: 0,
    regions: 0,
    planeVisits: 0,
    distanceVisits: 0,
    sgp4Evaluations: 0,
  };

  private readonly validity = new Map<string, number | null>();
  private readonly probe = new Float64Array(6);

  constructor(readonly settings: WindowSettings) {}

  /**
   * The last instant (≤ end + model margin) up to which the object propagates, found by
   * bisection to VALIDITY_RESOLUTION_MS when it fails inside; null when it fails at the window
   * start. An object that decays inside the window is flagged and screened until then.
   */
  validUntil(o: ScreeningObject): number | null {
    const cached = this.validity.get(o.id);
    if (cached !== undefined) return cached;
    const { start, end } = this.settings;
    const tr = o.trajectory, buf = this.probe;
    const hi = end + MODEL_MARGIN_MS;
    if (cannotFailInWindow(o, hi - start)) {
      this.validity.set(o.id, hi);
      return hi;
    }
    let until: number | null;
    const atStart = tr.stateInto(start, buf, 0);
    if (atStart) {
      this.flag(o.id, `propagation failed: ${atStart} at the window start ${new Date(start).toISOString()}`);
      until = null;
    } else if (!tr.stateInto(hi as Instant, buf, 0)) {
      until = hi;
    } else {
      let lo = start as number, up = hi;
      while (up - lo > VALIDITY_RESOLUTION_MS) {
        const mid = (lo + up) / 2;
        if (tr.stateInto(mid as Instant, buf, 0)) up = mid;
        else lo = mid;
      }
      until = lo;
      const reason = tr.stateInto(up as Instant, buf, 0);
      if (lo < end) {
        this.flag(o.id, `propagation fails (${reason}) after ${new Date(lo).toISOString()}; screened until then`);
      }
    }
    this.validity.set(o.id, until);
    return until;
  }

  model(o: ScreeningObject): OrbitModel | null {
    let m = this.models.get(o.id);
    if (m === undefined) {
      const src = o.trajectory.meanElementSource;
      const until = this.validUntil(o);
      if (until === null) m = 'bad-elements';
      else if (src) {
        m = src.initFailure ?? buildSgp4Model(
          src.satrec,
          src.elements.epoch,
          (this.settings.start - MODEL_MARGIN_MS) as Instant,
          until as Instant,
          MODEL_NODE_SPACING_MIN,
        );
        this.stats.sgp4Evaluations += 2 * Math.ceil((this.settings.end - this.settings.start) / 60_000 / MODEL_NODE_SPACING_MIN) + 3;
      } else {
        m = exactModel(o.trajectory, o.vMaxKmS ?? 15, o.radiusBandKm);
      }
      this.models.set(o.id, m);
    }
    if (typeof m === 'string') {
      this.flag(o.id, `propagation failed: ${m}`);
      return null;
    }
    return m;
  }

  flag(id: string, reason: string): void {
    if (!this.flagged.has(id)) this.flagged.set(id, reason);
  }

  flaggedList(): FlaggedObject[] {
    return [...this.flagged].map(([id, reason]) => ({ id, reason }));
  }

  /** Exact grid of a primary (up to its decay, if any), or null if it cannot be propagated. */
  grid(o: ScreeningObject, buffer?: Float64Array): StateGrid | null {
    const until = this.validUntil(o);
    if (until === null) return null;
    const end = Math.min(this.settings.end, until) as Instant;
    if (end <= this.settings.start) return null;
    const g = buildStateGrid(o.trajectory, this.settings.start, end, o.gridStepMs ?? gridStepMs(1440 / o.periodMin), buffer);
    if ('failure' in g) {
      this.flag(o.id, `propagation failed: ${g.failure} at ${new Date(g.at).toISOString()}`);
      return null;
    }
    this.stats.sgp4Evaluations += g.count;
    return g;
  }

  /** All encounters of one primary (with its grid) and one secondary. */
  screenPair(p: ScreeningObject, grid: StateGrid, s: ScreeningObject): Encounter[] {
    if (p.id === s.id) return [];
    this.stats.pairs++;
    const d = volumeBoundKm(this.settings.volume);
    // Cheap apogee/perigee test on the element sets before any model is built.
    const bp = coarseRadiusBand(p), bs = coarseRadiusBand(s);
    if (bp && bs && Math.max(bp[0], bs[0]) - Math.min(bp[1], bs[1]) > d) {
      this.stats.radiusPruned++;
      return [];
    }
    const ms = this.model(s);
    if (!ms) return [];
    const mp = this.model(p);
    if (!mp) return [];
    // Apogee/perigee filter (Hoots et al. 1984): the radius bands, padded by each model's
    // error, must come within D of each other.
    if (Math.max(mp.rMinKm, ms.rMinKm) - Math.min(mp.rMaxKm, ms.rMaxKm) > d) {
      this.stats.radiusPruned++;
      return [];
    }
    const start = this.settings.start;
    // An object that decays inside the window is screened up to that instant.
    const end = Math.min(this.settings.end, this.validUntil(p) ?? 0, this.validUntil(s) ?? 0) as Instant;
    if (end <= start) return [];
    const regions = candidateRegions(grid, ms, d, start, end, this.stats, mp);
    if (regions.length === 0) return [];
    const minPeriodMs = Math.min(p.periodMin, s.periodMin) * 60_000;
    const step = Math.min(REFINE_MAX_STEP_MS, minPeriodMs / 16);
    const merged = expandAndMerge(regions, step, start, end);
    this.stats.regions += merged.length / 2;
    const ctx = {
      p: p.trajectory,
      s: s.trajectory,
      primaryEpoch: p.epoch,
      secondaryEpoch: s.epoch,
      volume: this.settings.volume,
      start,
      end,
      minPeriodMin: Math.min(p.periodMin, s.periodMin),
    };
    const out: Encounter[] = [];
    try {
      for (let r = 0; r < merged.length; r += 2) {
        const a = merged[r]!, b = merged[r + 1]!;
        const found = findEncounters(ctx, a, b, step);
        this.stats.sgp4Evaluations += 2 * (Math.ceil((b - a) / step) + 30 * found.length);
        for (const e of found) {
          // Neighbouring regions can meet at one minimum; keep it once.
          if (!out.some((x) => Math.abs(x.tca - e.tca) < 1)) out.push(e);
        }
      }
    } catch (err) {
      if (err instanceof PropagationError) {
        this.flag(err.objectId, `propagation failed: ${err.reason} at ${new Date(err.at).toISOString()}`);
        return out;
      }
      throw err;
    }
    return out;
  }
}

/**
 * True for element sets that SGP4 propagates without error for this long: well-formed, perigee
 * high above the atmosphere, moderate drag and eccentricity. Their propagation is not probed up
 * front (saving an SGP4 initialisation for most of the catalogue); any failure still surfaces
 * where the object is used. Decay needs the perigee near the ground: at ≥ 300 km with
 * B* ≤ 0.01 the perigee falls far less than that within a few weeks (common practice: orbital
 * lifetimes at 300 km are weeks to months).
 */
function cannotFailInWindow(o: ScreeningObject, spanMs: number): boolean {
  const es = o.trajectory.meanElementSource?.elements;
  if (!es || spanMs > SAFE_SPAN_MS) return false;
  if (!(es.meanMotion > 0 && es.eccentricity >= 0 && es.eccentricity < SAFE_MAX_ECCENTRICITY)) return false;
  if (!(Math.abs(es.bstar) <= SAFE_MAX_BSTAR)) return false;
  if (![es.inclinationDeg, es.raanDeg, es.argPerigeeDeg, es.meanAnomalyDeg, es.meanMotionDot].every(Number.isFinite)) return false;
  const nRadS = (es.meanMotion * 2 * Math.PI) / 86_400;
  const a = Math.cbrt(MU_EARTH_WGS72 / (nRadS * nRadS));
  return a * (1 - es.eccentricity) - R_EARTH_WGS72 >= SAFE_PERIGEE_ALT_KM;
}

const SAFE_PERIGEE_ALT_KM = 300;
const SAFE_MAX_BSTAR = 0.01;
const SAFE_MAX_ECCENTRICITY = 0.9;
const SAFE_SPAN_MS = 31 * 86_400_000;

/**
 * Radius band of an object before any model is built. Sources without mean elements give their
 * own (a sampled primary: from its samples, padded). For SGP4, from the element set, padded so that no
 * osculating radius during a screening week can fall outside: 60 km covers SGP4's short-period
 * J2 terms (≤ ~20 km measured in LEO, see orbitModel) plus a week of drag decay at B* ≤ 0.01;
 * 1 % of a covers lunar–solar changes of e for deep-space orbits (≤ ~1e-3 per week).
 * Null for sources with neither.
 */
function coarseRadiusBand(o: ScreeningObject): [number, number] | null {
  const es = o.trajectory.meanElementSource?.elements;
  if (!es) return o.radiusBandKm ? [o.radiusBandKm[0], o.radiusBandKm[1]] : null;
  if (!(es.meanMotion > 0 && es.eccentricity >= 0 && es.eccentricity < 1)) return null;
  // Kepler's third law on the (Kozai) mean motion: differs from SGP4's recovered a by
  // O(J2) ≈ 1e-3·a, inside the pad; no SGP4 initialisation is needed for this test.
  const nRadS = (es.meanMotion * 2 * Math.PI) / 86_400;
  const a = Math.cbrt(MU_EARTH_WGS72 / (nRadS * nRadS));
  const e = es.eccentricity;
  const pad = COARSE_RADIUS_PAD_KM + COARSE_RADIUS_PAD_FRACTION * a;
  return [a * (1 - e) - pad, a * (1 + e) + pad];
}

/** Pads each region by one refinement step on both sides (so a minimum at a region edge is
 *  bracketed), clips to the window and merges overlaps. */
export function expandAndMerge(regions: Regions, pad: number, start: number, end: number): Regions {
  // Input regions are sorted and disjoint, so padding keeps them sorted: merge in one pass.
  const out: Regions = [];
  for (let r = 0; r < regions.length; r += 2) {
    const a = Math.max(start, regions[r]! - pad), b = Math.min(end, regions[r + 1]! + pad);
    const n = out.length;
    if (n > 0 && a <= out[n - 1]!) {
      if (b > out[n - 1]!) out[n - 1] = b;
    } else out.push(a, b);
  }
  return out;
}
