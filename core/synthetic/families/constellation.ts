import { makeSatrec } from '../../propagation/sgp4.js';
import type { Instant } from '../../time/instant.js';
import { drawAgeDays, epochBefore, type Draft } from '../draft.js';
import { RE } from '../j2.js';
import { meanMotionRevPerDay } from '../kepler.js';
import type { Rng } from '../random.js';
import { DEG, type FamilyContext } from './context.js';

/**
 * A large broadband constellation near 550 km: Walker-delta shells (evenly spaced planes,
 * evenly phased satellites). Same-plane neighbours share altitude and plane, which is the
 * nearly-coplanar case screening must handle. Shell figures are invented but typical of such
 * systems (common practice: 53° and 40–70° shells at 530–570 km).
 */
interface Shell {
  altKm: number;
  incDeg: number;
  planes: number;
  /** Walker phasing factor F: plane p is phased 360°·F·p/(S·P) ahead. */
  phasing: number;
  share: number;
}

export const SHELLS: readonly Shell[] = [
  { altKm: 550, incDeg: 53.0, planes: 72, phasing: 17, share: 0.45 },
  { altKm: 540, incDeg: 53.2, planes: 72, phasing: 11, share: 0.35 },
  { altKm: 565, incDeg: 70.0, planes: 36, phasing: 5, share: 0.2 },
];

/** SGP4's own secular rates (rad/min) of a nominal shell member, so phasing survives epoch shifts. */
function sgp4Rates(a: number, i: number, epoch: Instant): { mdot: number; nodedot: number; argpdot: number } {
  const rec = makeSatrec({
    objectId: '0', classification: 'U', epoch,
    meanMotionRevPerDay: meanMotionRevPerDay(a), eccentricity: 1e-4, inclinationDeg: i / DEG,
    raanDeg: 0, argPerigeeDeg: 0, meanAnomalyDeg: 0, bstar: 0, meanMotionDot: 0,
    meanMotionDdot: 0, elementSetNo: 1, revAtEpoch: 0, ephemerisType: 0,
  });
  return { mdot: rec.mdot, nodedot: rec.nodedot, argpdot: rec.argpdot };
}

export function constellation(rng: Rng, count: number, ctx: FamilyContext): Draft[] {
  const out: Draft[] = [];
  let left = count;
  SHELLS.forEach((shell, s) => {
    const n = s === SHELLS.length - 1 ? left : Math.round(count * shell.share);
    left -= n;
    if (n <= 0) return;
    const a = RE + shell.altKm;
    const i = shell.incDeg * DEG;
    const rates = sgp4Rates(a, i, ctx.epoch);
    const planes = Math.min(shell.planes, n);
    const perPlane = Math.ceil(n / planes);
    const raan0 = rng.uniform(0, 2 * Math.PI);
    for (let k = 0; k < n; k++) {
      const p = k % planes, j = Math.floor(k / planes);
      // Pattern at the reference time; station keeping leaves small offsets in every element.
      const raanRef = raan0 + (2 * Math.PI * p) / planes + rng.normal(0, 0.01 * DEG);
      const uRef =
        (2 * Math.PI * j) / perPlane + (2 * Math.PI * shell.phasing * p) / (perPlane * planes) +
        rng.normal(0, 0.05 * DEG);
      const argp = rng.uniform(0, 2 * Math.PI);
      const ageDays = drawAgeDays(rng, ctx.maxAgeDays);
      const epoch = epochBefore(ctx.epoch, ageDays);
      const minutesBack = (ctx.epoch - epoch) / 60_000;
      out.push({
        name: `SKEIN-${String(s + 1)}${String(p).padStart(2, '0')}${String(j).padStart(3, '0')}`,
        epoch,
        a: a + rng.normal(0, 0.1),
        e: Math.abs(rng.normal(1.2e-4, 4e-5)),
        i: i + rng.normal(0, 0.005 * DEG),
        raan: raanRef - rates.nodedot * minutesBack,
        argp: argp,
        // The satellite's phase is its argument of latitude: M = u − ω, both moved back to the epoch.
        meanAnomaly: uRef - argp - (rates.mdot + rates.argpdot) * minutesBack,
        bstar: rng.logNormal(3e-4, 0.5),
      });
    }
  });
  return out;
}
