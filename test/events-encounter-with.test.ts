/**
 * encounterWith is `{ ...e, ...more }` written out field by field (V8 is slow at keys added to a
 * spread copy). It must give exactly what the spread gives: every field of the encounter, the
 * optional one only when present, and `more` winning over the encounter's own keys.
 */
import { describe, expect, it } from 'vitest';
import { encounterWith, type Encounter } from '../core/events/index.js';
import type { Instant } from '../core/time/instant.js';

const t = (ms: number) => ms as Instant;
const base: Encounter = {
  primary: '100001',
  secondary: '110001',
  tca: t(1_797_000_000_123.25),
  missKm: 0.4,
  relativeSpeedKmS: 11.2,
  rtnKm: [0.1, -0.3, 0.2],
  approachAngleDeg: 151,
  entry: t(1_797_000_000_000),
  exit: null,
  primaryState: [7000, 1, 2, 0.1, 7.5, 0.2],
  secondaryState: [7000.1, 1.2, 2.3, -0.1, -7.4, 1.1],
  primaryEpoch: t(1_796_900_000_000),
  secondaryEpoch: t(1_796_800_000_000),
};

describe('encounterWith', () => {
  it('equals the spread, key for key, with and without the optional edge flag', () => {
    for (const e of [base, { ...base, atWindowEdge: true }]) {
      const more = { id: 'R7-3', runId: 'R7', risk: null, seriesId: 'S-R1-1' };
      const got = encounterWith(e, more);
      expect(got).toStrictEqual({ ...e, ...more });
      expect(Object.keys(got)).toEqual(Object.keys({ ...e, ...more }));
    }
  });

  it('lets `more` override an encounter field, and copies rather than aliases the object', () => {
    const got = encounterWith(base, { missKm: 9 });
    expect(got.missKm).toBe(9);
    expect(base.missKm).toBe(0.4);
    expect(got).not.toBe(base);
  });
});
