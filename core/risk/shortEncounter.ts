import { MU_EARTH_WGS84 } from '../units.js';
import type { Matrix } from '../math/linalg.js';
import type { StateArray } from '../events/index.js';
import type { Vec3n } from './frames.js';

/**
 * Validity checks of the short-encounter (2-D) assumption: straight-line relative motion and a
 * constant covariance while the objects cross the combined uncertainty region. The assumptions
 * are those of Foster & Estes 1992 and Chan 2008 (ch. on the 2-D formulation); the numeric
 * thresholds below are our choice, in line with common practice, not taken from a standard.
 */

/** Relative speed below which the encounter is treated as slow (m/s). Our choice / common practice. */
export const SLOW_ENCOUNTER_MPS = 500;
/** The encounter region spans ±this many σ of the combined covariance along the relative velocity. */
export const ENCOUNTER_SIGMA_EXTENT = 3;
/**
 * Largest fraction of the shorter orbital period the crossing of that region may take: in that
 * time each orbit turns by 2π·fraction (here 18°), past which curvature of the relative path
 * makes the straight-line model doubtful. Our choice.
 */
export const MAX_CROSSING_FRACTION_OF_PERIOD = 0.05;

function periodS(s: StateArray): number {
  const r = Math.hypot(s[0], s[1], s[2]);
  const v2 = s[3] * s[3] + s[4] * s[4] + s[5] * s[5];
  const inv = 2 / r - v2 / MU_EARTH_WGS84; // 1/a (vis-viva), km⁻¹
  return inv > 0 ? 2 * Math.PI * Math.sqrt(1 / (inv * inv * inv) / MU_EARTH_WGS84) : Infinity;
}

export interface ShortEncounterCheck {
  readonly crossingTimeS: number;
  readonly periodS: number;
  readonly warnings: readonly string[];
}

export function checkShortEncounter(
  primary: StateArray,
  secondary: StateArray,
  relVelMps: Vec3n,
  combinedCovM2: Matrix,
  hardBodyRadiusM: number,
): ShortEncounterCheck {
  const speed = Math.hypot(...relVelMps);
  const z = relVelMps.map((x) => x / speed);
  let along = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) along += z[i]! * combinedCovM2[i]![j]! * z[j]!;
  const extent = 2 * (ENCOUNTER_SIGMA_EXTENT * Math.sqrt(Math.max(along, 0)) + hardBodyRadiusM);
  const crossing = extent / speed;
  const period = Math.min(periodS(primary), periodS(secondary));
  const warnings: string[] = [];
  if (speed < SLOW_ENCOUNTER_MPS)
    warnings.push(
      `slow encounter (${speed.toFixed(1)} m/s < ${SLOW_ENCOUNTER_MPS} m/s): the short-encounter 2-D Pc may not hold`,
    );
  if (crossing > MAX_CROSSING_FRACTION_OF_PERIOD * period)
    warnings.push(
      `long encounter: crossing the ±${ENCOUNTER_SIGMA_EXTENT}σ region takes ${crossing.toFixed(0)} s, more than ` +
        `${MAX_CROSSING_FRACTION_OF_PERIOD} of the orbital period (${period.toFixed(0)} s); the 2-D Pc may not hold`,
    );
  return { crossingTimeS: crossing, periodS: period, warnings };
}
