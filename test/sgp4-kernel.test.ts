/**
 * The non-allocating SGP4 kernel (core/propagation/sgp4Kernel.ts) against the code it was
 * ported from.
 *
 * Reference: satellite.js 7.1.0's own `sgp4` (a general-purpose reference library; itself a
 * translation of the reference code of Vallado, Crawford, Hujsak, Kelso, "Revisiting Spacetrack
 * Report #3", AIAA 2006-6753). Both are given records made by the same satellite.js `sgp4init`
 * (through makeSatrec), one record each, and called with the same instants in the same
 * scrambled order (forward and backward jumps, far instants where orbits decay, repeats):
 * positions, velocities, mean elements, error codes and every record field satellite.js writes
 * must agree after every call. (The kernel also keeps the deep-space resonance integrator
 * between calls, as the C++ reference does and satellite.js does not; the scrambled order is
 * what would expose any difference that makes.)
 *
 * Inputs: every element set of the synthetic catalogue generateCatalog({size: 3000, seed: 5})
 * (near-Earth LEO and debris, and deep-space MEO, GEO, GTO and HEO, with both resonance kinds),
 * and the 33 published verification sets SGP4-VER.TLE (Vallado et al. 2006, copied verbatim in
 * test/authorities/sgp4-verification/), at their own reference steps plus their error instants.
 * That the kernel path still meets Vallado's published vectors within 1 mm is
 * test/sgp4-verification.test.ts, which runs through Sgp4Trajectory and so through the kernel.
 */
import { sgp4, type SatRec } from 'satellite.js';
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { makeSatrec } from '../core/propagation/sgp4.js';
import { MEAN_ELEMENT_COUNT, sgp4Into } from '../core/propagation/sgp4Kernel.js';
import { generateCatalog } from '../core/synthetic/catalog.js';
import { Rng } from '../core/synthetic/random.js';
import type { Instant } from '../core/time/instant.js';
import { referenceTimes, verificationRecords, verificationSet } from './support/verificationSets.js';

/** km: required by the brief; a port of the same arithmetic should agree to the last bit. */
const POS_TOL_KM = 1e-9;
/** km/s: as above. */
const VEL_TOL_KMS = 1e-12;
/** Relative (to max(1, |value|)) for the mean elements. */
const MEAN_REL_TOL = 1e-12;

const EPOCH = Date.UTC(2026, 2, 1, 0, 0, 0) as Instant;
const MIN_PER_DAY = 1440;

/**
 * Record fields satellite.js's sgp4 writes. Not atime, xli, xni: the kernel keeps the resonance
 * integrator's last step there as the C++ reference does, satellite.js does not (see the
 * kernel's header); that it changes no output is what the scrambled order below tests.
 */
const STATE_FIELDS = ['t', 'error', 'tempa', 'aycof', 'xlcof', 'con41', 'x1mth2', 'x7thm1'] as const;

interface Tally {
  calls: number;
  failures: number;
  codes: Map<number, number>;
  worstPos: number;
  worstVel: number;
  worstMean: number;
  bitIdentical: number;
  /** Calls that continued the kernel's stored resonance integration instead of restarting. */
  continued: number;
  mismatches: string[];
}

const newTally = (): Tally => ({
  calls: 0, failures: 0, codes: new Map(), worstPos: 0, worstVel: 0, worstMean: 0, bitIdentical: 0, continued: 0, mismatches: [],
});

/** |a − b|, with two NaNs counting as equal (satellite.js can return NaN states). */
function diff(a: number, b: number): number {
  if (Number.isNaN(a) && Number.isNaN(b)) return 0;
  return Math.abs(a - b);
}

/** Runs both propagators over `times` in the given order, one record each, and tallies. */
function compare(label: string, es: ElementSet, times: readonly number[], tally: Tally): void {
  const refRec = makeSatrec(es);
  const kerRec = makeSatrec(es);
  const out = new Float64Array(6);
  const mean = new Float64Array(MEAN_ELEMENT_COUNT);
  for (const t of times) {
    const ref = sgp4(refRec, t);
    out.fill(Number.NaN);
    // The restart test of dspace (sgp4fix "streamline check"): otherwise the kernel continues.
    const a = kerRec.atime;
    if (kerRec.irez !== 0 && !(a === 0 || t * a <= 0 || Math.abs(t) < Math.abs(a))) tally.continued++;
    const code = sgp4Into(kerRec, t, out, 0, mean);
    tally.calls++;
    const where = `${label} at ${t} min`;
    if (code !== refRec.error || kerRec.error !== refRec.error || (ref === null) !== (code !== 0)) {
      tally.mismatches.push(`${where}: code ${code} (record ${kerRec.error}), satellite.js ${refRec.error} (${ref ? 'state' : 'null'})`);
      continue;
    }
    for (const f of STATE_FIELDS) {
      const a = (kerRec as unknown as Record<string, unknown>)[f], b = (refRec as unknown as Record<string, unknown>)[f];
      if (!Object.is(a, b)) tally.mismatches.push(`${where}: record field ${f} ${String(a)} vs ${String(b)}`);
    }
    if (!ref) {
      tally.failures++;
      tally.codes.set(code, (tally.codes.get(code) ?? 0) + 1);
      continue;
    }
    const p = ref.position, v = ref.velocity, me = ref.meanElements;
    const dp = Math.max(diff(out[0]!, p.x), diff(out[1]!, p.y), diff(out[2]!, p.z));
    const dv = Math.max(diff(out[3]!, v.x), diff(out[4]!, v.y), diff(out[5]!, v.z));
    const refMean = [me.am, me.em, me.im, me.Om, me.om, me.mm, me.nm];
    let dm = 0;
    let identical = Object.is(out[0], p.x) && Object.is(out[1], p.y) && Object.is(out[2], p.z) &&
      Object.is(out[3], v.x) && Object.is(out[4], v.y) && Object.is(out[5], v.z);
    for (let j = 0; j < MEAN_ELEMENT_COUNT; j++) {
      dm = Math.max(dm, diff(mean[j]!, refMean[j]!) / Math.max(1, Math.abs(refMean[j]!)));
      identical &&= Object.is(mean[j], refMean[j]);
    }
    if (identical) tally.bitIdentical++;
    tally.worstPos = Math.max(tally.worstPos, dp);
    tally.worstVel = Math.max(tally.worstVel, dv);
    tally.worstMean = Math.max(tally.worstMean, dm);
    if (!(dp <= POS_TOL_KM && dv <= VEL_TOL_KMS && dm <= MEAN_REL_TOL)) {
      tally.mismatches.push(`${where}: |dr| ${dp} km, |dv| ${dv} km/s, mean ${dm}`);
    }
  }
}

/** Fisher–Yates with the project's seeded generator. */
function shuffled<T>(xs: readonly T[], rng: Rng): T[] {
  const a = xs.slice();
  for (let i = a.length - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    [a[i], a[j]] = [a[j]!, a[i]!];
  }
  return a;
}

function report(name: string, tally: Tally): void {
  const codes = [...tally.codes].sort((a, b) => a[0] - b[0]).map(([c, n]) => `${c}×${n}`).join(' ');
  console.info(
    `${name}: ${tally.calls} calls, ${tally.calls - tally.failures} states (${tally.bitIdentical} bit-identical), ` +
      `failures ${codes || 'none'}; ${tally.continued} continued the stored integrator; worst |dr| ${tally.worstPos} km, |dv| ${tally.worstVel} km/s, mean ${tally.worstMean}`,
  );
}

describe('SGP4 kernel against satellite.js sgp4', () => {
  it('synthetic catalogue (3000 sets, every population) at scrambled instants', () => {
    const sets = generateCatalog({ size: 3000, seed: 5, epoch: EPOCH });
    expect(sets).toHaveLength(3000);
    const rng = new Rng(11);
    // Instants relative to the catalogue's reference time: the screening span (−3 d .. +10 d)
    // densely, plus far ones where drag brings low orbits down (decay and eccentricity codes).
    const span: number[] = [];
    for (let k = 0; k < 40; k++) span.push(rng.uniform(-3, 10) * MIN_PER_DAY);
    for (const d of [-60, -30, 25, 45, 90, 180, 365]) span.push(d * MIN_PER_DAY + rng.uniform(0, 100));
    const tally = newTally();
    const regimes = { nearEarth: 0, deepNoResonance: 0, oneDay: 0, halfDay: 0 };
    for (const es of sets) {
      const rec: SatRec = makeSatrec(es);
      if (rec.method === 'n') regimes.nearEarth++;
      else if (rec.irez === 0) regimes.deepNoResonance++;
      else if (rec.irez === 1) regimes.oneDay++;
      else regimes.halfDay++;
      const offset = (EPOCH - es.epoch) / 60_000; // minutes from the set's epoch to EPOCH
      // Each set gets its own order: two scrambled passes (the second repeats instants after
      // others), and a jump back through epoch.
      const times = [...shuffled(span, rng), 0, ...shuffled(span, rng).slice(0, 15)].map((m) => m + offset);
      compare(es.objectId, es, times, tally);
    }
    report('catalogue', tally);
    console.info(`catalogue regimes: ${JSON.stringify(regimes)}`);
    // The catalogue does exercise every branch of the kernel: near-Earth, deep space with
    // no resonance, 1-day (GEO) and half-day (12-h MEO, GTO/HEO) resonance.
    expect(regimes.nearEarth).toBeGreaterThan(1000);
    expect(regimes.deepNoResonance).toBeGreaterThan(0);
    expect(regimes.oneDay).toBeGreaterThan(0);
    expect(regimes.halfDay).toBeGreaterThan(0);
    expect(tally.mismatches.slice(0, 10)).toEqual([]);
    expect(tally.calls - tally.failures).toBeGreaterThan(100_000);
    // Resonant orbits did continue from a stored integrator step (the path that differs in
    // plumbing from satellite.js), many times.
    expect(tally.continued).toBeGreaterThan(1000);
    // The far instants must bring some orbits down, so error codes are compared too.
    expect(tally.failures).toBeGreaterThan(0);
  });

  it('the 33 verification sets (SGP4-VER.TLE) at their reference steps, scrambled, and their error instants', () => {
    const rng = new Rng(23);
    const tally = newTally();
    let sets = 0;
    for (const rec of verificationRecords()) {
      const { stop, step } = rec;
      // Three sets carry deliberately wrong checksums: only that digit is repaired (withChecksum).
      const es = verificationSet(rec);
      expect(es, rec.line1).toBeDefined();
      const times = referenceTimes(rec);
      // Beyond the stop time too, so sets that fail later are caught failing at the same instant.
      times.push(stop + step, stop * 2 + 7, -stop - 13);
      compare(es!.objectId, es!, [...shuffled(times, rng), ...shuffled(times, rng)], tally);
      sets++;
    }
    report('verification sets', tally);
    expect(sets).toBe(33);
    expect(tally.mismatches.slice(0, 10)).toEqual([]);
    // The published sets include orbits that stop with codes 1, 3, 4 and 6 (error_codes.json).
    for (const code of [1, 3, 4, 6]) expect(tally.codes.get(code) ?? 0, `code ${code}`).toBeGreaterThan(0);
  });
});
