/**
 * Sampling a source with a bounded span (an owner ephemeris) for screening: nothing is sampled
 * before its start or after its end — the end is treated like a break (nodes stop at or before
 * it, the last window serves the rest of the last step) — so an OEM that starts at the window
 * start is screened, and nothing past the OEM is invented. Reference: the OEM itself (its own
 * interpolation, test/oem-interpolation.test.ts), within the sampler's stated bound
 * SAMPLED_POSITION_TOL_KM (core/propagation/sampledTrajectory.ts).
 */
import { describe, expect, it } from 'vitest';
import { sampleOem } from '../core/formats/oem/index.js';
import { EphemerisTrajectory } from '../core/propagation/ephemeris.js';
import { SAMPLED_POSITION_TOL_KM, SampledTrajectory, sampleTrajectory } from '../core/propagation/sampledTrajectory.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { parseIso, type Instant } from '../core/time/instant.js';
import { elementSet } from './support/elements.js';

const T0 = parseIso('2026-12-07T00:00:00Z')!;
const T1 = (T0 + 6 * 3_600_000 + 12_345) as Instant;

describe('a bounded source', () => {
  const set = elementSet('100001', T0, { aKm: 6928, e: 0.001, iDeg: 97.6, raanDeg: 10, argpDeg: 30, uDeg: 0 });
  const oem = sampleOem([{ trajectory: new Sgp4Trajectory(set), start: T0, end: T1, stepS: 60 }], {
    objectName: 'X', objectId: '100001', originator: 'T', creationDate: T0,
  });
  const source = new EphemerisTrajectory(oem, '100001');
  const table = sampleTrajectory(source, (T0 - 3_600_000) as Instant, (T1 + 3_600_000) as Instant);
  const sampled = new SampledTrajectory(table);

  it('is sampled from its start to its end, no further', () => {
    expect(table.pieces[0]!.from).toBe(T0);
    expect(table.pieces.at(-1)!.until).toBe(T1);
    expect(table.failure).toBeNull();
  });

  it('agrees with the source within the stated bound up to its end, and fails outside', () => {
    const a = new Float64Array(6), b = new Float64Array(6);
    for (const t of [T0, T0 + 1, T0 + 4321.5, (T0 + T1) / 2, T1 - 30_000, T1 - 1, T1]) {
      expect(sampled.stateInto(t as Instant, a, 0), String(t - T0)).toBeNull();
      expect(source.stateInto(t as Instant, b, 0)).toBeNull();
      expect(Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!), `${t - T0} ms`).toBeLessThan(SAMPLED_POSITION_TOL_KM);
    }
    expect(sampled.stateInto((T0 - 1) as Instant, a, 0)).toBe('outside-ephemeris');
    expect(sampled.stateInto((T1 + 1) as Instant, a, 0)).toBe('outside-ephemeris');
  });
});
