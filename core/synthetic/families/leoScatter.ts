import { drawAgeDays, epochBefore, medianBstar, type Draft } from '../draft.js';
import { RE } from '../j2.js';
import type { Rng } from '../random.js';
import { DEG, type FamilyContext } from './context.js';

/**
 * Everything else in LEO, 300–2000 km: old payloads, rocket bodies, mission-related objects and
 * debris not tied to a modelled breakup. Perigee bands and popular inclinations are rough
 * figures from memory (the 700–1000 km band is the most crowded).
 */
const PERIGEE_BANDS: readonly [number, number][] = [[300, 700], [700, 1000], [1000, 1500], [1500, 2000]];
const PERIGEE_WEIGHTS = [0.25, 0.4, 0.25, 0.1];
const COMMON_INCLINATIONS_DEG = [28.5, 35, 51.6, 56, 65, 71, 74, 81.2, 82.5, 83, 86.4, 90, 98.5, 99];
const KINDS = ['PAYLOAD', 'R/B', 'DEB'];

export function leoScatter(rng: Rng, count: number, ctx: FamilyContext): Draft[] {
  const out: Draft[] = [];
  for (let k = 0; k < count; k++) {
    const [lo, hi] = PERIGEE_BANDS[rng.weighted(PERIGEE_WEIGHTS)]!;
    const perigeeAlt = rng.uniform(lo, hi);
    // Mostly near-circular; a minority of rocket bodies and debris on eccentric paths.
    const span = rng.next() < 0.85 ? rng.exponential(30) : rng.exponential(400);
    const apogeeAlt = Math.min(2000, perigeeAlt + span);
    const rp = RE + perigeeAlt, ra = RE + Math.max(apogeeAlt, perigeeAlt);
    const inc = rng.next() < 0.75 ? rng.pick(COMMON_INCLINATIONS_DEG) + rng.normal(0, 0.3) : rng.uniform(0, 105);
    const kind = rng.pick(KINDS);
    out.push({
      name: `OBJECT ${kind} ${String(k + 1).padStart(5, '0')}`,
      epoch: epochBefore(ctx.epoch, drawAgeDays(rng, ctx.maxAgeDays)),
      a: (rp + ra) / 2,
      e: (ra - rp) / (ra + rp),
      i: Math.abs(inc) * DEG,
      raan: rng.uniform(0, 2 * Math.PI),
      argp: rng.uniform(0, 2 * Math.PI),
      meanAnomaly: rng.uniform(0, 2 * Math.PI),
      bstar: rng.logNormal(medianBstar(perigeeAlt) * (kind === 'DEB' ? 3 : 1), 0.7),
    });
  }
  return out;
}
