import { MS_PER_DAY } from '../../time/instant.js';
import { drawAgeDays, epochBefore, medianBstar, type Draft } from '../draft.js';
import { apsidalRate, meanAnomalyRate, nodalRate, RE } from '../j2.js';
import { keplerianFromState, stateFromKeplerian } from '../kepler.js';
import type { Rng } from '../random.js';
import { DEG, type FamilyContext } from './context.js';

/**
 * Fragmentation debris clouds. Each invented breakup gives its fragments a Δv of tens of m/s
 * from one point of the parent orbit, so young clouds share that point (and the node), spread
 * in a, e and M; J2 then spreads old clouds around the Earth in node and perigee. Fragments
 * have larger area-to-mass, hence larger B* (common practice: several times an intact body's).
 */
interface Breakup {
  altKm: number;
  incDeg: number;
  ageDays: number;
  share: number;
  /** median fragment Δv, m/s (tens of m/s is typical of explosions and collisions, from memory) */
  dvMedianMs: number;
}

export const BREAKUPS: readonly Breakup[] = [
  { altKm: 850, incDeg: 98.8, ageDays: 6200, share: 0.3, dvMedianMs: 25 },
  { altKm: 775, incDeg: 84.0, ageDays: 5400, share: 0.22, dvMedianMs: 20 },
  { altKm: 820, incDeg: 74.0, ageDays: 2100, share: 0.18, dvMedianMs: 15 },
  { altKm: 480, incDeg: 82.5, ageDays: 420, share: 0.15, dvMedianMs: 30 },
  { altKm: 660, incDeg: 97.9, ageDays: 25, share: 0.15, dvMedianMs: 20 },
];

/** Fragments whose perigee fell below this would have re-entered already (rough, from memory). */
const MIN_PERIGEE_ALT_KM = 280;
const MAX_ECCENTRICITY = 0.15;

export function debris(rng: Rng, count: number, ctx: FamilyContext): Draft[] {
  const out: Draft[] = [];
  let left = count;
  BREAKUPS.forEach((b, index) => {
    const n = index === BREAKUPS.length - 1 ? left : Math.round(count * b.share);
    left -= n;
    const parent = {
      a: RE + b.altKm, e: 0.001, i: b.incDeg * DEG,
      raan: rng.uniform(0, 2 * Math.PI), argp: rng.uniform(0, 2 * Math.PI), meanAnomaly: 0,
    };
    // One breakup point for the whole cloud.
    const point = stateFromKeplerian({ ...parent, meanAnomaly: rng.uniform(0, 2 * Math.PI) });
    for (let k = 0; k < n; k++) {
      const epoch = epochBefore(ctx.epoch, drawAgeDays(rng, ctx.maxAgeDays));
      const sinceBreakupS = (b.ageDays * MS_PER_DAY - (ctx.epoch - epoch)) / 1000;
      for (let attempt = 0; ; attempt++) {
        const dv = rng.logNormal(b.dvMedianMs, 0.7) / 1000;
        const [dx, dy, dz] = rng.direction();
        const v = point.v.map((c, j) => c + dv * [dx, dy, dz][j]!);
        const el = keplerianFromState(point.r, v);
        const perigeeAlt = el.a * (1 - el.e) - RE;
        if ((perigeeAlt < MIN_PERIGEE_ALT_KM || el.e > MAX_ECCENTRICITY) && attempt < 50) continue;
        out.push({
          name: `BREAKUP ${String(index + 1)} DEB`,
          epoch,
          a: el.a,
          e: el.e,
          i: el.i,
          raan: el.raan + nodalRate(el.a, el.e, el.i) * sinceBreakupS,
          argp: el.argp + apsidalRate(el.a, el.e, el.i) * sinceBreakupS,
          meanAnomaly: el.meanAnomaly + meanAnomalyRate(el.a, el.e, el.i) * sinceBreakupS,
          bstar: rng.logNormal(5 * medianBstar(perigeeAlt), 0.7),
        });
        break;
      }
    }
  });
  return out;
}
