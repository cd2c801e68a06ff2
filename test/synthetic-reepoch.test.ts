/**
 * Re-issuing an element set at another epoch (core/synthetic/reEpoch.ts) and whole catalogues
 * (catalogUpdate.ts). The reference is SGP4 itself — satellite.js, checked against the
 * verification vectors of Vallado et al. 2006 (AIAA 2006-6753) in sgp4-verification.test.ts: the
 * re-issued set must reproduce the source's own SGP4 state at the new epoch.
 */
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { generateCatalog } from '../core/synthetic/catalog.js';
import { FAR_PERIGEE_ALT_KM, reissueCatalog } from '../core/synthetic/catalogUpdate.js';
import { tleExactEpoch } from '../core/synthetic/draft.js';
import { Rng } from '../core/synthetic/random.js';
import { RE_EPOCH_POSITION_TOLERANCE_KM, RE_EPOCH_VELOCITY_TOLERANCE_KMS, reEpochElementSet } from '../core/synthetic/reEpoch.js';
import { MS_PER_DAY, type Instant } from '../core/time/instant.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../core/units.js';

const EPOCH = Date.parse('2026-12-07T00:00:00Z') as Instant;
const WEEK = 7 * MS_PER_DAY;
/**
 * TLE digits move a LEO state by up to ~20 m: 1e-4° of angle is 12 m at 6,900 km, 1e-8 rev/day of
 * mean motion nothing at epoch, 1e-7 of eccentricity 0.7 m (arithmetic on the field widths).
 */
const TLE_ROUNDING_KM = 0.05;

const catalog = generateCatalog({ size: 600, seed: 9, epoch: EPOCH, maxAgeDays: 2 });
const perigeeAltKm = (es: ElementSet): number => {
  const n = (es.meanMotionRevPerDay * 2 * Math.PI) / 86_400;
  return Math.cbrt(MU_EARTH_WGS72 / (n * n)) * (1 - es.eccentricity) - R_EARTH_WGS72;
};

function stateAt(es: ElementSet, t: Instant): Float64Array {
  const out = new Float64Array(6);
  const failure = new Sgp4Trajectory(es).stateInto(t, out, 0);
  if (failure) throw new Error(`${es.objectId}: ${failure}`);
  return out;
}
const posKm = (a: Float64Array, b: Float64Array) => Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!);
const velKmS = (a: Float64Array, b: Float64Array) => Math.hypot(a[3]! - b[3]!, a[4]! - b[4]!, a[5]! - b[5]!);

describe('reEpochElementSet', () => {
  const reachLeo = catalog.filter((es) => perigeeAltKm(es) <= FAR_PERIGEE_ALT_KM);

  it('reproduces the source\'s SGP4 state at the new epoch within 1 m and 1 mm/s (LEO, GTO, HEO)', () => {
    expect(reachLeo.some((es) => es.eccentricity > 0.5)).toBe(true); // eccentric orbits are in the sample
    for (const es of reachLeo) {
      const epoch = tleExactEpoch(es.epoch - WEEK);
      const next = reEpochElementSet(es, epoch, { roundToTle: false });
      expect(next.epoch).toBe(epoch);
      const want = stateAt(es, epoch), got = stateAt(next, epoch);
      expect(posKm(got, want), es.objectId).toBeLessThan(RE_EPOCH_POSITION_TOLERANCE_KM);
      expect(velKmS(got, want), es.objectId).toBeLessThan(RE_EPOCH_VELOCITY_TOLERANCE_KMS);
    }
  });

  it('rounded to TLE digits, stays within what those digits can hold', () => {
    for (const es of reachLeo.slice(0, 100)) {
      const epoch = tleExactEpoch(es.epoch - WEEK);
      const next = reEpochElementSet(es, epoch);
      expect(next.meanMotionRevPerDay).toBe(Number(next.meanMotionRevPerDay.toFixed(8)));
      expect(next.inclinationDeg).toBe(Number(next.inclinationDeg.toFixed(4)));
      expect(posKm(stateAt(next, epoch), stateAt(es, epoch))).toBeLessThan(TLE_ROUNDING_KM);
    }
  });

  it('applies the disturbance it is given, at the new epoch', () => {
    const es = reachLeo[0]!;
    const epoch = tleExactEpoch(es.epoch - WEEK);
    const shiftKm = 0.3;
    const next = reEpochElementSet(es, epoch, {
      roundToTle: false,
      perturb: (r, v) => ({ r: [r[0]! + shiftKm, r[1]!, r[2]!], v }),
    });
    const want = stateAt(es, epoch);
    want[0]! += shiftKm;
    expect(posKm(stateAt(next, epoch), want)).toBeLessThan(RE_EPOCH_POSITION_TOLERANCE_KM);
  });
});

describe('reissueCatalog', () => {
  it('refits every object that can reach LEO and carries MEO/GEO along secular rates within the stated bounds', () => {
    const update = reissueCatalog(catalog, WEEK, new Rng(3));
    expect(update.sets).toHaveLength(catalog.length);
    const far = catalog.filter((es) => perigeeAltKm(es) > FAR_PERIGEE_ALT_KM);
    expect(update.secular).toBe(far.length);
    expect(update.refitted).toBe(catalog.length - far.length);
    // The stated consistency of the secular path (catalogUpdate.ts): ~0.2 km MEO, tens of km GEO.
    // Bounds: OD error (≤ ~1 km at epoch, 6σ of 150 m) plus 1 km MEO / 60 km GEO.
    catalog.forEach((es, k) => {
      if (perigeeAltKm(es) <= FAR_PERIGEE_ALT_KM) return;
      const next = update.sets[k]!;
      const d = posKm(stateAt(next, next.epoch), stateAt(es, next.epoch));
      const geo = es.meanMotionRevPerDay > 0.9 && es.meanMotionRevPerDay < 1.1;
      expect(d, `${es.objectId} ${es.name}`).toBeLessThan(geo ? 61 : 2);
    });
  });

  it('keeps ids, names and B*, moves every epoch by the shift and follows on the set numbers', () => {
    const update = reissueCatalog(catalog.slice(0, 50), WEEK, new Rng(4));
    update.sets.forEach((next, k) => {
      const es = catalog[k]!;
      expect([next.objectId, next.name, next.bstar]).toEqual([es.objectId, es.name, es.bstar]);
      expect(next.epoch).toBe(tleExactEpoch(es.epoch - WEEK));
    });
  });
});
