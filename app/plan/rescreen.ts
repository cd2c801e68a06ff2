/**
 * Re-screen of the manoeuvred primary against the whole catalogue, from the burn to the end of
 * the screening window (DESIGN.md: "re-screen the manoeuvred trajectory against the whole
 * catalogue over the window"), with the screening engine itself (core/screening ScreeningSession
 * with any Trajectory as the primary), in this thread.
 *
 * The engine's cheap apogee/perigee test needs an element set, which the manoeuvred trajectory
 * does not have, so without help every catalogue object would get a filter model built. This
 * file applies the same test first, with the manoeuvred orbit's radius band taken from its own
 * exact grid (see radiusBandOfGrid) and each secondary's band padded exactly as the engine pads
 * it (coarse radius band: 60 km + 1 % of a; core/screening/engine.ts). Only objects that pass go
 * to the engine, which filters and refines them as in any screening.
 */
import type { ElementSet } from '../../core/elements/elementSet.js';
import { KeepclearError } from '../../core/errors.js';
import type { Encounter } from '../../core/events/index.js';
import type { Trajectory } from '../../core/propagation/trajectory.js';
import { objectFromElements, ScreeningSession, type ScreeningObject } from '../../core/screening/engine.js';
import { volumeBoundKm } from '../../core/screening/geometry.js';
import { gridStepMs, type StateGrid } from '../../core/screening/primaryGrid.js';
import type { FlaggedObject, ScreeningVolume } from '../../core/screening/types.js';
import type { Instant } from '../../core/time/instant.js';
import { MU_EARTH_WGS72 } from '../../core/units.js';

/** The engine's coarse radius pad (core/screening/engine.ts coarseRadiusBand): 60 km + 1 % of a. */
const COARSE_RADIUS_PAD_KM = 60;
const COARSE_RADIUS_PAD_FRACTION = 0.01;
/** Perturbing accelerations (J2 ~ 1e-5 km/s² in LEO, drag far less) add this share to μ/r² in the band's lower pad. */
const PERTURBATION_SHARE = 0.01;
/** Catalogue objects screened between two looks at the cancel signal and progress. */
const CHUNK = 1000;

export interface RescreenInput {
  /** the primary's element set (id, epoch, period, grid step) */
  readonly primarySet: ElementSet;
  /** the manoeuvred trajectory, valid from `start` to `end` + 2 h */
  readonly trajectory: Trajectory;
  readonly catalogue: readonly ElementSet[];
  readonly start: Instant;
  readonly end: Instant;
  readonly volume: ScreeningVolume;
  readonly onProgress?: (done: number, total: number) => void;
  readonly signal?: AbortSignal;
}

export interface RescreenOutcome {
  readonly encounters: Encounter[];
  readonly flagged: FlaggedObject[];
  /** catalogue objects (the primary left out) */
  readonly objects: number;
  /** of those, dismissed by the radius bands before the engine */
  readonly radiusPruned: number;
  readonly wallMs: number;
}

/**
 * Radius band [min, max] (km) of the trajectory over its grid, padded for what can happen
 * between grid points: along any orbit d²|r|/dt² = (v² − ṙ²)/|r| + r̂·a, which lies between
 * −(μ/r²)(1 + share) and v²/|r|; a function whose second derivative is bounded by M departs from
 * the chord between two nodes by at most M·h²/8.
 */
export function radiusBandOfGrid(grid: StateGrid): [number, number] {
  const x = grid.states;
  let rMin = Infinity, rMax = 0, v2Max = 0;
  for (let j = 0; j < grid.count; j++) {
    const o = j * 6;
    const r = Math.hypot(x[o]!, x[o + 1]!, x[o + 2]!);
    rMin = Math.min(rMin, r);
    rMax = Math.max(rMax, r);
    v2Max = Math.max(v2Max, x[o + 3]! ** 2 + x[o + 4]! ** 2 + x[o + 5]! ** 2);
  }
  const h = grid.stepMs / 1000;
  const up = (v2Max / rMin) * (h * h) / 8;
  const down = (MU_EARTH_WGS72 / (rMin * rMin)) * (1 + PERTURBATION_SHARE) * (h * h) / 8;
  return [rMin - down, rMax + up];
}

/** The engine's coarse band of an element set (same formula and pads; see the file comment). */
function coarseBand(es: ElementSet): [number, number] | null {
  if (!(es.meanMotion > 0 && es.eccentricity >= 0 && es.eccentricity < 1)) return null;
  const n = (es.meanMotion * 2 * Math.PI) / 86_400;
  const a = Math.cbrt(MU_EARTH_WGS72 / (n * n));
  const pad = COARSE_RADIUS_PAD_KM + COARSE_RADIUS_PAD_FRACTION * a;
  return [a * (1 - es.eccentricity) - pad, a * (1 + es.eccentricity) + pad];
}

const yieldToEventLoop = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

export async function rescreenTrajectory(input: RescreenInput): Promise<RescreenOutcome> {
  const t0 = performance.now();
  const ps = input.primarySet;
  const session = new ScreeningSession({ start: input.start, end: input.end, volume: input.volume });
  const primary: ScreeningObject = {
    id: ps.objectId,
    trajectory: input.trajectory,
    epoch: ps.epoch,
    periodMin: 1440 / ps.meanMotion,
    gridStepMs: gridStepMs(ps.meanMotion, ps.eccentricity),
  };
  const grid = session.grid(primary);
  if (!grid) {
    const why = session.flagged.get(ps.objectId) ?? 'no state in the window';
    throw new KeepclearError('PROPAGATION_FAILED', `the manoeuvred trajectory of ${ps.objectId} cannot be screened: ${why}`);
  }
  // The exact-trajectory filter model needs a speed bound: the grid's largest speed, plus what
  // the speed can gain between grid points (|a|·h ≤ 0.01 km/s/s · 60 s), generously.
  let v2 = 0;
  for (let j = 0; j < grid.count; j++) v2 = Math.max(v2, grid.states[j * 6 + 3]! ** 2 + grid.states[j * 6 + 4]! ** 2 + grid.states[j * 6 + 5]! ** 2);
  const withSpeed: ScreeningObject = { ...primary, vMaxKmS: Math.sqrt(v2) + 0.01 * (grid.stepMs / 1000) };
  const [lo, hi] = radiusBandOfGrid(grid);
  const d = volumeBoundKm(input.volume);
  const others = input.catalogue.filter((s) => s.objectId !== ps.objectId);
  const encounters: Encounter[] = [];
  let pruned = 0;
  for (let i = 0; i < others.length; i++) {
    if (i % CHUNK === 0) {
      input.onProgress?.(i, others.length);
      await yieldToEventLoop();
      if (input.signal?.aborted) throw new KeepclearError('CANCELLED', `re-screen cancelled after ${i} of ${others.length} objects`);
    }
    const es = others[i]!;
    const band = coarseBand(es);
    if (band && Math.max(lo, band[0]) - Math.min(hi, band[1]) > d) {
      pruned++;
      continue;
    }
    encounters.push(...session.screenPair(withSpeed, grid, objectFromElements(es)));
  }
  input.onProgress?.(others.length, others.length);
  encounters.sort((a, b) => a.tca - b.tca || (a.secondary < b.secondary ? -1 : 1));
  return { encounters, flagged: session.flaggedList(), objects: others.length, radiusPruned: pruned, wallMs: performance.now() - t0 };
}
