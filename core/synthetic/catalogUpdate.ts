import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import { tleExactEpoch } from './draft.js';
import { RE } from './j2.js';
import { semiMajorAxisKm } from './kepler.js';
import { withOrbitDeterminationError } from './odError.js';
import type { Rng } from './random.js';
import { reEpochElementSet } from './reEpoch.js';

/**
 * Perigee altitude (km) above which an object cannot come near a LEO spacecraft (the demo fleet
 * flies at 520–800 km; LEO apogees end near 2,000 km by definition). Such objects — MEO, GEO —
 * are re-issued along SGP4's secular rates only: consistent with the truth to about 0.2 km (MEO)
 * and a few tens of km (GEO, where SDP4's resonance terms are left out), which cannot change a
 * screening of LEO spacecraft, and it spares a fixed-point fit that does not converge for
 * near-equatorial deep-space orbits (measured: 26 of 165 GEO objects of a 3,000-object sample;
 * GTO and HEO objects, which do reach LEO, all converge).
 */
export const FAR_PERIGEE_ALT_KM = 2000;

export interface CatalogUpdate {
  readonly sets: ElementSet[];
  /** sets refitted to the truth within 1 m (before TLE rounding) */
  readonly refitted: number;
  /** far objects carried along secular rates, and any whose refit failed */
  readonly secular: number;
}

const perigeeAltKm = (es: ElementSet): number => semiMajorAxisKm(es.meanMotionRevPerDay) * (1 - es.eccentricity) - RE;

/**
 * Every set re-issued `shiftMs` earlier (positive: an older catalogue) or later, each with a
 * fresh orbit-determination error (odError.ts), so consecutive catalogues are consistent with
 * one truth the way real updates are.
 */
export function reissueCatalog(sets: readonly ElementSet[], shiftMs: number, rng: Rng): CatalogUpdate {
  const perturb = (r: readonly number[], v: readonly number[]) => withOrbitDeterminationError(r, v, rng);
  let refitted = 0, secular = 0;
  const out = sets.map((es) => {
    const epoch = tleExactEpoch(es.epoch - shiftMs);
    const trajectory = new Sgp4Trajectory(es);
    if (perigeeAltKm(es) <= FAR_PERIGEE_ALT_KM) {
      try {
        const next = reEpochElementSet(es, epoch, { trajectory, perturb });
        refitted++;
        return next;
      } catch (e) {
        if (!(e instanceof KeepclearError)) throw e;
      }
    }
    secular++;
    return reEpochElementSet(es, epoch, { trajectory, perturb, mode: 'secular' });
  });
  return { sets: out, refitted, secular };
}
