/**
 * The screening filters prune with the filter model's error bound ε (core/screening/orbitModel.ts):
 * it must bound |model − SGP4| everywhere in the window, not only where it was measured; so must
 * its velocity bound (velocityErrKmS, used by the distance scan's closing-speed step).
 * Reference: SGP4 itself (satellite.js, verified against Vallado et al. 2006 in
 * sgp4-verification.test.ts), evaluated at random instants the model never saw.
 */
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { buildSgp4Model } from '../core/screening/orbitModel.js';
import { MODEL_NODE_SPACING_MIN, modelNodeSpacingMin } from '../core/screening/modelCache.js';
import { generateCatalog } from '../core/synthetic/catalog.js';
import type { Instant } from '../core/time/instant.js';

const START = Date.parse('2026-12-07T00:00:00.000Z');
const WEEK_MS = 7 * 86_400_000;
const MARGIN_MS = 3_600_000;
/** The engine's window, a week plus an hour each side, in intervals of the engine's node spacing. */
const intervalMin = (spacingMin: number): number =>
  (WEEK_MS + 2 * MARGIN_MS) / 60_000 / Math.ceil((WEEK_MS + 2 * MARGIN_MS) / 60_000 / spacingMin);

let rng = 12345;
const random = () => ((rng = (rng * 1103515245 + 12345) % 2147483648) / 2147483648);

function violations(sets: readonly ElementSet[], samples: number): { checked: number; bad: string[] } {
  const bad: string[] = [];
  const sgp4 = new Float64Array(6), model = new Float64Array(6);
  let checked = 0;
  for (const es of sets) {
    const tr = new Sgp4Trajectory(es);
    const m = buildSgp4Model(tr.satrec, es.epoch, (START - MARGIN_MS) as Instant, (START + WEEK_MS + MARGIN_MS) as Instant, modelNodeSpacingMin(tr.satrec));
    if (typeof m === 'string') continue;
    for (let k = 0; k < samples; k++) {
      const t = (START + random() * WEEK_MS) as Instant;
      if (tr.stateInto(t, sgp4, 0)) continue;
      m.stateInto!(t, model, 0);
      const err = Math.hypot(sgp4[0]! - model[0]!, sgp4[1]! - model[1]!, sgp4[2]! - model[2]!);
      // The velocity bound covers SGP4's velocity (its gap to dr/dt is in the bound's floor).
      const verr = Math.hypot(sgp4[3]! - model[3]!, sgp4[4]! - model[4]!, sgp4[5]! - model[5]!);
      checked++;
      if (err > m.epsKm) bad.push(`${es.objectId} (${es.name}) at ${new Date(t).toISOString()}: |Δ| ${err.toFixed(2)} km > ε ${m.epsKm.toFixed(2)} km`);
      if (!(verr <= m.velocityErrKmS!)) bad.push(`${es.objectId} (${es.name}) at ${new Date(t).toISOString()}: |Δv| ${verr.toFixed(4)} km/s > ${m.velocityErrKmS!.toFixed(4)} km/s`);
    }
  }
  return { checked, bad };
}

describe('filter model error bound (ε) against SGP4', () => {
  it('holds at random instants for every population of the synthetic catalogue', () => {
    // 3,000 objects: every population (LEO shells, debris, MEO, GEO, GTO, HEO) is present.
    const { checked, bad } = violations(generateCatalog({ size: 3000, seed: 7, epoch: START as Instant }), 120);
    expect(checked).toBeGreaterThan(3000 * 120 * 0.95);
    expect(bad.slice(0, 10)).toEqual([]);
  });

  it('holds for orbits whose period divides the sample spacing (phase-locked samples)', () => {
    // Deep space (12-h nodes, 15 intervals of 680 min): periods of a half interval / k, where
    // every node and mid-node sees the same orbital phase. Such an orbit once hid an error of
    // 16.6 km behind ε = 9.3 km (near-polar, 113 min, when every orbit had 12-h nodes).
    // Near-Earth (24-h nodes, 8 intervals of 1275 min, one sample pair per interval): periods
    // of an interval / k below 225 min (the 170- and 113-min orbits above are
    // near-Earth too, so they now test the 24-h layout).
    const periods = [
      ...[1, 2, 3].map((k) => intervalMin(MODEL_NODE_SPACING_MIN.deepSpace) / 2 / k),
      ...[6, 7, 8, 10, 12, 14].map((k) => intervalMin(MODEL_NODE_SPACING_MIN.nearEarth) / k),
    ];
    const sets: ElementSet[] = [];
    let id = 1;
    for (const periodMin of periods) {
      for (let inc = 0; inc <= 180; inc += 15) {
        for (const e of [0.001, 0.02]) {
          sets.push({
            objectId: String(id++), name: `LOCKED P${periodMin.toFixed(1)} i${inc} e${e}`, intlDesignator: null, classification: 'U',
            epoch: (START - 86_400_000) as Instant, meanMotionRevPerDay: 1440 / periodMin, eccentricity: e, inclinationDeg: inc,
            raanDeg: 40, argPerigeeDeg: 80, meanAnomalyDeg: 10, bstar: 1e-5, meanMotionDot: 0, meanMotionDdot: 0,
            elementSetNo: 1, revAtEpoch: 1, ephemerisType: 0, source: { file: 'test', line: id, format: 'SYNTHETIC' },
          });
        }
      }
    }
    const { checked, bad } = violations(sets, 400);
    expect(checked).toBeGreaterThan(sets.length * 400 * 0.95);
    expect(bad.slice(0, 10)).toEqual([]);
  });
});
