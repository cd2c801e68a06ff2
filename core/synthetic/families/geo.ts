import { drawAgeDays, epochBefore, type Draft } from '../draft.js';
import { SIDEREAL_DAY_S, semiMajorAxisForPeriod } from '../j2.js';
import type { Rng } from '../random.js';
import { gmstRad } from '../sky.js';
import { DEG, type FamilyContext } from './context.js';

/**
 * The geostationary belt. a from one sidereal day by Kepler's third law (≈ 42,164 km).
 * Controlled satellites sit within ~0.1° in inclination; retired ones drift with inclination up
 * to ~15° (the natural precession cycle, from memory) and a few are reboosted ~300 km above the
 * belt (common practice for disposal). Shares from memory.
 */
export const GEO_A_KM = semiMajorAxisForPeriod(SIDEREAL_DAY_S);

export function geo(rng: Rng, count: number, ctx: FamilyContext): Draft[] {
  const out: Draft[] = [];
  for (let k = 0; k < count; k++) {
    const epoch = epochBefore(ctx.epoch, drawAgeDays(rng, ctx.maxAgeDays));
    const kind = rng.weighted([0.55, 0.35, 0.1]);
    const controlled = kind === 0;
    const a = controlled ? GEO_A_KM + rng.normal(0, 1) : kind === 1 ? GEO_A_KM + rng.normal(0, 120) : GEO_A_KM + rng.uniform(250, 400);
    const e = controlled ? rng.uniform(0, 4e-4) : rng.uniform(0, 4e-3);
    const i = (controlled ? rng.uniform(0, 0.1) : rng.uniform(0, 15)) * DEG;
    const raan = rng.uniform(0, 2 * Math.PI);
    const argp = rng.uniform(0, 2 * Math.PI);
    // East longitude ≈ Ω + ω + M − GMST, so place the drawn longitude through M.
    const longitude = rng.uniform(0, 2 * Math.PI);
    out.push({
      name: controlled ? `GEOCOM ${String(k + 1)}` : `GEO OBJECT ${String(k + 1)}`,
      epoch,
      a, e, i, raan, argp,
      meanAnomaly: longitude + gmstRad(epoch) - raan - argp,
      bstar: rng.normal(0, 1e-5),
    });
  }
  return out;
}
