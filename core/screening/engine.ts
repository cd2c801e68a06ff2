/**
 * The pair pipeline of one thread: for each primary–secondary pair, the element-set radius band,
 * the models' radius bands, the time filters (pairFilter.ts) and exact refinement (refine.ts).
 * What it needs per object lives beside it: screening objects (screeningObject.ts), the
 * propagation check (validity.ts), filter models (modelCache.ts); time regions in regions.ts.
 */
import type { Instant } from '../time/instant.js';
import type { OrbitModel } from './orbitModel.js';
import { buildStateGrid, buildStateGridUntil, gridEnd, gridStepMs, type StateGrid } from './primaryGrid.js';
import { candidateRegions, type FilterStats } from './pairFilter.js';
import { padClipMerge, type Regions } from './regions.js';
import { primaryBlockNormals, secondaryBlocks, type SecondaryBlocks } from './secondaryWindows.js';
import { findEncounters, PropagationError } from './refine.js';
import { volumeBoundKm } from './geometry.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../units.js';
import type { FlaggedObject } from './types.js';
import type { Encounter } from '../events/index.js';
import type { ScreeningObject, WindowSettings } from './screeningObject.js';
import { Flags, ValidityProbe } from './validity.js';
import { ModelCache } from './modelCache.js';

// What callers imported from here before the split.
export { objectFromElements, objectFromSamples, type ScreeningObject, type WindowSettings } from './screeningObject.js';
export { MODEL_MARGIN_MS } from './validity.js';

/**
 * Secondaries whose time-filter tables are kept (sharedTables): at least a claimed block of fleet
 * screening (chunk.ts). ~8 KB each for a week (8 MB in all), ~35 KB for 30 days.
 */
export const TABLES_KEPT = 1024;
/** Padding of the element-set radius band (see coarseRadiusBand). */
const COARSE_RADIUS_PAD_KM = 60;
const COARSE_RADIUS_PAD_FRACTION = 0.01;
/**
 * Period (min) from which an orbit gets the deep-space pad: SGP4 switches to its deep-space
 * theory at 225 min (Hoots & Roehrich 1980, Spacetrack Report No. 3; from memory), less 5 min
 * for the difference between the element set's (Kozai) mean motion and SGP4's recovered one.
 */
const DEEP_SPACE_PERIOD_MIN = 220;
/** The pad's drag allowance holds for windows up to this long (ms; a week plus a day of margin)… */
const COARSE_MAX_WINDOW_MS = 8 * 86_400_000;
/** …for |B*| up to this (1/earth radii)… */
const COARSE_MAX_BSTAR = 1e-3;
/**
 * …for near-Earth perigees at least this high (km): lower ones sink by more than the pad in a
 * week (a published verification set at 16.5 rev/day, B* 1.9e-4, falls 74 km below its element-set perigee in a week)…
 */
const COARSE_MIN_PERIGEE_HEIGHT_KM = 300;
/**
 * …and for deep-space orbits up to this eccentricity: the Moon and Sun move the apogee of very
 * eccentric orbits by thousands of km in a week (verification sets 23333, e 0.97, and 33333,
 * e 0.995, leave any band of a fixed fraction of a).
 */
const COARSE_MAX_DEEP_SPACE_E = 0.5;
/** Range-rate sampling step in refinement: ≤ 1/16 of the shorter period, at most 60 s. */
const REFINE_MAX_STEP_MS = 60_000;

/** Per-thread state of a run: the pair pipeline over the objects' validity, models and flags. */
export class ScreeningSession {
  private readonly flags = new Flags();
  /** flagged objects (id → reason), first reason kept */
  readonly flagged = this.flags.map;
  readonly stats: FilterStats & { pairs: number; radiusPruned: number; regions: number; sgp4Evaluations: number } = {
    pairs: 0,
    radiusPruned: 0,
    regions: 0,
    planeVisits: 0,
    distanceVisits: 0,
    sgp4Evaluations: 0,
  };

  private readonly validity: ValidityProbe;
  private readonly models: ModelCache;
  /**
   * Per-secondary tables of the time filter, kept for the last TABLES_KEPT secondaries (oldest
   * out first, its buffers reused): fleet screening takes a claimed block of secondaries against
   * each primary in turn (ScreeningChunk.screenShared), so they are computed once per secondary
   * instead of once per pair.
   */
  private readonly blocks = new Map<string, SecondaryBlocks | null>();
  /** Per-primary plane normals at the time filter's block boundaries. */
  private readonly normals = new Map<string, Float64Array>();

  constructor(readonly settings: WindowSettings) {
    this.validity = new ValidityProbe(settings, this.flags);
    this.models = new ModelCache(settings, this.validity, this.flags, this.stats);
  }

  /** See ValidityProbe.validUntil. */
  validUntil(o: ScreeningObject): number | null {
    return this.validity.validUntil(o);
  }

  /** The object's filter model, or null (flagged) when it cannot be built. */
  model(o: ScreeningObject): OrbitModel | null {
    return this.models.model(o);
  }

  flag(id: string, reason: string): void {
    this.flags.flag(id, reason);
  }

  flaggedList(): FlaggedObject[] {
    return this.flags.list();
  }

  /**
   * Exact grid of a primary, or null if it cannot be propagated. An object that decays inside
   * the window has a grid ending exactly at its decay (validity.ts); a failure the validity
   * probes did not see shortens its valid span to the first failure (ValidityProbe.failureSeen)
   * and the grid ends there; should a grid point fail all the same, the grid ends at its last
   * point before it. screenPair screens the object up to its grid's end.
   */
  grid(o: ScreeningObject, buffer?: Float64Array): StateGrid | null {
    const until = this.validUntil(o);
    if (until === null) return null;
    const { start, end } = this.settings;
    const step = o.gridStepMs ?? gridStepMs(1440 / o.periodMin);
    let stop = until;
    if (until >= end) {
      const g = buildStateGrid(o.trajectory, start, end, step, buffer);
      if (!('failure' in g)) {
        this.stats.sgp4Evaluations += g.count;
        return g;
      }
      // A failure between the validity probes: the object is screened up to its first failure.
      const first = this.validity.failureSeen(o, g.at);
      if (first === null) return null;
      stop = Math.min(first, g.at);
    }
    const r = buildStateGridUntil(o.trajectory, start, Math.min(stop, end), step, buffer);
    if (r?.failure) this.flag(o.id, `propagation failed: ${r.failure} at ${new Date(r.failedAt).toISOString()}`);
    if (!r) return null;
    this.stats.sgp4Evaluations += r.grid.count;
    return r.grid;
  }

  private sharedTables(p: ScreeningObject, mp: OrbitModel, s: ScreeningObject, ms: OrbitModel) {
    const { start, end } = this.settings;
    let tables = this.blocks.get(s.id);
    if (tables === undefined) {
      let reuse: SecondaryBlocks | undefined;
      if (this.blocks.size >= TABLES_KEPT) {
        const [oldest, old] = this.blocks.entries().next().value as [string, SecondaryBlocks | null];
        this.blocks.delete(oldest);
        reuse = old ?? undefined;
      }
      tables = secondaryBlocks(ms, start, end, reuse);
      this.blocks.set(s.id, tables);
    }
    let normals = this.normals.get(p.id);
    if (!normals) {
      normals = primaryBlockNormals(mp, start, end);
      this.normals.set(p.id, normals);
    }
    return { blocks: tables, normals };
  }

  /** All encounters of one primary (with its grid) and one secondary. */
  screenPair(p: ScreeningObject, grid: StateGrid, s: ScreeningObject): Encounter[] {
    if (p.id === s.id) return [];
    this.stats.pairs++;
    const d = volumeBoundKm(this.settings.volume);
    // Cheap apogee/perigee test on the element sets before any model is built.
    const windowMs = this.settings.end - this.settings.start;
    const bp = coarseRadiusBand(p, windowMs), bs = coarseRadiusBand(s, windowMs);
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
    // An object that decays inside the window is screened up to that instant; a primary whose
    // grid stops short (a failure the validity probe did not see) up to its grid's end.
    const end = Math.min(this.settings.end, this.validUntil(p) ?? 0, this.validUntil(s) ?? 0, gridEnd(grid)) as Instant;
    if (end <= start) return [];
    // The shared tables cover the whole window; a pair cut short by a decay computes its own.
    const shared = end === this.settings.end && mp.hasPlane ? this.sharedTables(p, mp, s, ms) : null;
    const regions = candidateRegions(grid, ms, d, start, end, this.stats, mp, shared);
    if (regions.length === 0) return [];
    const minPeriodMs = Math.min(p.periodMin, s.periodMin) * 60_000;
    const step = Math.min(REFINE_MAX_STEP_MS, minPeriodMs / 16);
    // Pad by one refinement step so a minimum at a region edge is bracketed.
    const merged = padClipMerge(regions, step, start, end);
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
 * Radius band of an object before any model is built. Sources without mean elements give their
 * own (a sampled primary: from its samples, padded). For SGP4, from the element set, padded so that no
 * osculating radius during the window can fall outside: 60 km covers SGP4's short-period
 * J2 terms (≤ ~20 km measured in LEO, see orbitModel), its long-period J3 terms (≤ ~8 km:
 * ½·|J3/J2|·sin i / p in e, times a) and a week of drag decay at |B*| ≤ 1e-3 from a perigee at 300 km or higher. Deep-space orbits
 * (period ≥ 225 min, where SGP4 adds lunar–solar terms) also get 1 % of a: lunar–solar changes
 * of e are ≤ ~1e-3 per week. Outside what the pad was sized for (a window over
 * COARSE_MAX_WINDOW_MS, |B*| over COARSE_MAX_BSTAR) there is no band: the models decide.
 * Null for sources with neither.
 */
export function coarseRadiusBand(o: ScreeningObject, windowMs: number): [number, number] | null {
  const es = o.trajectory.meanElementSource?.elements;
  if (!es) return o.radiusBandKm ? [o.radiusBandKm[0], o.radiusBandKm[1]] : null;
  if (!(es.meanMotionRevPerDay > 0 && es.eccentricity >= 0 && es.eccentricity < 1)) return null;
  if (windowMs > COARSE_MAX_WINDOW_MS || !(Math.abs(es.bstar) <= COARSE_MAX_BSTAR)) return null;
  // Kepler's third law on the (Kozai) mean motion: differs from SGP4's recovered a by
  // O(J2) ≈ 1e-3·a, inside the pad; no SGP4 initialisation is needed for this test.
  const nRadS = (es.meanMotionRevPerDay * 2 * Math.PI) / 86_400;
  const a = Math.cbrt(MU_EARTH_WGS72 / (nRadS * nRadS));
  const e = es.eccentricity;
  const deepSpace = 1440 / es.meanMotionRevPerDay >= DEEP_SPACE_PERIOD_MIN;
  if (deepSpace ? e > COARSE_MAX_DEEP_SPACE_E : a * (1 - e) - R_EARTH_WGS72 < COARSE_MIN_PERIGEE_HEIGHT_KM) return null;
  const pad = COARSE_RADIUS_PAD_KM + (deepSpace ? COARSE_RADIUS_PAD_FRACTION * a : 0);
  return [a * (1 - e) - pad, a * (1 + e) + pad];
}

