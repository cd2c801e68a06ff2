import { drawAgeDays, epochBefore, medianBstar, type Draft } from '../draft.js';
import { RE, sunSynchronousInclination } from '../j2.js';
import type { Rng } from '../random.js';
import { sunRightAscensionRad } from '../sky.js';
import { DEG, type FamilyContext } from './context.js';

/**
 * Sun-synchronous Earth observers and small satellites, 500–800 km. The inclination comes from
 * the J2 nodal-rate condition, not a table. Nodes cluster at popular local times (common
 * practice: 10:30 descending, i.e. 22:30 ascending, and dawn–dusk 06:00/18:00; shares from
 * memory), the rest spread evenly.
 */
const LOCAL_TIMES_H = [22.5, 18, 6, 13.5];
const LOCAL_TIME_WEIGHTS = [0.35, 0.15, 0.1, 0.1, 0.3]; // last: any local time

export function sunSync(rng: Rng, count: number, ctx: FamilyContext): Draft[] {
  const out: Draft[] = [];
  for (let k = 0; k < count; k++) {
    // Small satellites crowd the lower half of the band.
    const alt = rng.next() < 0.6 ? rng.uniform(500, 600) : rng.uniform(600, 800);
    const a = RE + alt;
    const e = Math.abs(rng.normal(1e-3, 5e-4));
    const epoch = epochBefore(ctx.epoch, drawAgeDays(rng, ctx.maxAgeDays));
    const which = rng.weighted(LOCAL_TIME_WEIGHTS);
    const localTimeH = LOCAL_TIMES_H[which] ?? rng.uniform(0, 24);
    // Ascending node at local time L lies (L − 12 h)·15°/h east of the sun's right ascension.
    const raan = sunRightAscensionRad(epoch) + (localTimeH - 12 + rng.normal(0, 0.25)) * 15 * DEG;
    out.push({
      name: `EO-SAT ${String(k + 1).padStart(4, '0')}`,
      epoch,
      a,
      e,
      i: sunSynchronousInclination(a, e),
      raan,
      argp: rng.uniform(0, 2 * Math.PI),
      meanAnomaly: rng.uniform(0, 2 * Math.PI),
      bstar: rng.logNormal(medianBstar(alt - a * e), 0.6),
    });
  }
  return out;
}
