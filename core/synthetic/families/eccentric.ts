import { drawAgeDays, epochBefore, type Draft } from '../draft.js';
import { RE, SIDEREAL_DAY_S, semiMajorAxisForPeriod } from '../j2.js';
import type { Rng } from '../random.js';
import { DEG, type FamilyContext } from './context.js';

/**
 * Highly eccentric orbits: geostationary transfer orbits (perigee 200–600 km, apogee near GEO
 * altitude; inclination set by the launch site) and Molniya-like 12-hour orbits at the critical
 * inclination 63.4° (where J2 apsidal drift vanishes) with apogee over the north (ω ≈ 270°).
 */
const GTO_INCLINATIONS_DEG = [6, 7, 20, 27, 28.5, 51.6];
const MOLNIYA_A_KM = semiMajorAxisForPeriod(SIDEREAL_DAY_S / 2);

export function eccentric(rng: Rng, count: number, ctx: FamilyContext): Draft[] {
  const out: Draft[] = [];
  for (let k = 0; k < count; k++) {
    const epoch = epochBefore(ctx.epoch, drawAgeDays(rng, ctx.maxAgeDays));
    const common = {
      epoch,
      raan: rng.uniform(0, 2 * Math.PI),
      meanAnomaly: rng.uniform(0, 2 * Math.PI),
      bstar: rng.logNormal(3e-5, 0.8),
    };
    if (rng.next() < 0.7) {
      const rp = RE + rng.uniform(200, 600), ra = RE + rng.uniform(35_300, 36_200);
      out.push({
        ...common,
        name: `GTO R/B ${String(k + 1)}`,
        a: (rp + ra) / 2,
        e: (ra - rp) / (ra + rp),
        i: (rng.pick(GTO_INCLINATIONS_DEG) + rng.normal(0, 0.3)) * DEG,
        argp: rng.uniform(0, 2 * Math.PI),
      });
    } else {
      const rp = RE + rng.uniform(500, 1200);
      out.push({
        ...common,
        name: `HEO ${String(k + 1)}`,
        a: MOLNIYA_A_KM,
        e: 1 - rp / MOLNIYA_A_KM,
        i: (63.4 + rng.normal(0, 0.2)) * DEG,
        argp: (270 + rng.normal(0, 5)) * DEG,
      });
    }
  }
  return out;
}
