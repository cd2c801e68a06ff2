import { drawAgeDays, epochBefore, type Draft } from '../draft.js';
import { RE } from '../j2.js';
import type { Rng } from '../random.js';
import { DEG, type FamilyContext } from './context.js';

/**
 * Navigation constellations in MEO: a few invented systems of several planes at the altitudes
 * such systems use (common practice: ~19,100, ~20,200 and ~23,200 km, 55–65°), plus disposal
 * orbits and upper stages scattered a few hundred km around them.
 */
interface NavSystem { altKm: number; incDeg: number; planes: number; share: number }
export const NAV_SYSTEMS: readonly NavSystem[] = [
  { altKm: 20_200, incDeg: 55, planes: 6, share: 0.45 },
  { altKm: 19_100, incDeg: 64.8, planes: 3, share: 0.2 },
  { altKm: 23_222, incDeg: 56, planes: 3, share: 0.2 },
];
const DISPOSAL_SHARE = 0.15;

export function meo(rng: Rng, count: number, ctx: FamilyContext): Draft[] {
  const out: Draft[] = [];
  const weights = [...NAV_SYSTEMS.map((s) => s.share), DISPOSAL_SHARE];
  const planeRaan0 = NAV_SYSTEMS.map(() => rng.uniform(0, 2 * Math.PI));
  for (let k = 0; k < count; k++) {
    const which = rng.weighted(weights);
    const sys = NAV_SYSTEMS[which] ?? rng.pick(NAV_SYSTEMS);
    const disposal = which >= NAV_SYSTEMS.length;
    const plane = rng.int(sys.planes);
    out.push({
      name: disposal ? `NAV R/B ${String(k + 1)}` : `NAVSET ${String(which + 1)}-${String(k + 1)}`,
      epoch: epochBefore(ctx.epoch, drawAgeDays(rng, ctx.maxAgeDays)),
      a: RE + sys.altKm + (disposal ? rng.normal(0, 400) : rng.normal(0, 2)),
      e: disposal ? rng.uniform(0, 0.02) : Math.abs(rng.normal(0.005, 0.004)),
      i: (sys.incDeg + rng.normal(0, disposal ? 2 : 0.5)) * DEG,
      raan: (planeRaan0[which] ?? rng.uniform(0, 2 * Math.PI)) + (2 * Math.PI * plane) / sys.planes +
        rng.normal(0, disposal ? 10 * DEG : 0.3 * DEG),
      argp: rng.uniform(0, 2 * Math.PI),
      meanAnomaly: rng.uniform(0, 2 * Math.PI),
      bstar: rng.normal(0, 1e-5),
    });
  }
  return out;
}
