import type { Instant } from '../time/instant.js';
import type { OrbitElements } from '../elements/elementSet.js';
import type { Trajectory } from '../propagation/trajectory.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import { SampledTrajectory, type SampleTable } from '../propagation/sampledTrajectory.js';
import { gridStepMs } from './primaryGrid.js';
import { MU_EARTH_WGS72 } from '../units.js';
import type { ScreeningVolume } from './types.js';
import { norm3 } from '../math/norm.js';

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

export function objectFromElements(es: OrbitElements): ScreeningObject {
  return {
    id: es.objectId,
    trajectory: new Sgp4Trajectory(es),
    epoch: es.epoch,
    periodMin: 1440 / es.meanMotionRevPerDay,
    gridStepMs: gridStepMs(es.meanMotionRevPerDay, es.eccentricity),
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
  const r = norm3(s[0]!, s[1]!, s[2]!);
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

