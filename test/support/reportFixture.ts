/**
 * A database with one screening run of invented events for the report tests: geometry made up
 * so that each event's stored states agree with its miss distance (primary on a circular LEO
 * orbit, secondary offset perpendicular to the relative velocity), tiers from the Pc values.
 */
import { DEFAULT_TIER_THRESHOLDS, tierFor } from '../../core/risk/tiers.js';
import type { ScreeningSettings } from '../../core/screening/types.js';
import type { StateArray } from '../../core/events/index.js';
import { instantFromMs, parseIso } from '../../core/time/instant.js';
import { createRun, finishRun, openDatabase, putSetting, type KeepclearDb, type NewEvent } from '../../db/index.js';
import { SYNTHETIC_CATALOGUE_KEY } from '../../app/report/index.js';

export const WEEK_START = parseIso('2026-12-07T00:00:00Z')!;
export const SETTINGS: ScreeningSettings = {
  start: WEEK_START,
  end: instantFromMs(WEEK_START + 7 * 86_400_000),
  volume: { kind: 'sphere', radiusKm: 5 },
  primaries: ['80001', '80002'],
};

/** Seeded, so the report looks the same on every run of the tests (Park–Miller minimal standard). */
function rng(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

/** Pc values that give a few Plan and Monitor events and a bulk of Routine ones. */
function pcFor(missKm: number): number {
  return Math.exp(-((missKm / 0.12) ** 2) / 2) * 2e-3;
}

export function fixtureEvents(n: number, seed = 42): NewEvent[] {
  const r = rng(seed);
  const events: NewEvent[] = [];
  for (let i = 0; i < n; i++) {
    const missKm = i < 3 ? [0.05, 0.12, 0.2][i]! : 0.3 + 4.6 * r();
    const tca = instantFromMs(WEEK_START + r() * 7 * 86_400_000);
    const primaryState: StateArray = [7000, 0, 0, 0, 7.5, 0];
    // relative velocity along -y+z (crossing), miss along x (radial): x ⟂ v_rel
    const secondaryState: StateArray = [7000 + missKm, 0, 0, 0, -2.5, 10];
    const pc = pcFor(missKm);
    events.push({
      primary: i % 2 ? '80002' : '80001',
      secondary: String(20000 + i),
      tca,
      missKm,
      relativeSpeedKmS: Math.hypot(10, 10),
      rtnKm: [missKm, 0, 0],
      approachAngleDeg: 110,
      entry: instantFromMs(tca - 300),
      exit: instantFromMs(tca + 300),
      primaryState,
      secondaryState,
      primaryEpoch: instantFromMs(WEEK_START - 86_400_000),
      secondaryEpoch: instantFromMs(WEEK_START - 2 * 86_400_000),
      risk: {
        pc,
        pcMethod: '2d-reference',
        covarianceSource: 'history(n=4) / default(LEO, age 2.0 d)',
        hardBodyRadiusM: 10,
        tier: tierFor(pc, missKm, DEFAULT_TIER_THRESHOLDS),
        warnings: i === 0 ? ['hard-body radius default 5 m used for primary and secondary'] : [],
        // what the assessment keeps with every event (core/events/risk.ts); the first event is
        // one stored before the detail was kept, so reports and exports meet both kinds
        ...(i === 0 ? {} : { detail: {
          primaryCovRtnM2: [[400, 0, 0], [0, 10_000, 0], [0, 0, 900]],
          secondaryCovRtnM2: [[2_500, 0, 0], [0, 90_000, 0], [0, 0, 1_600]],
          planeMissM: [missKm * 1000, 0],
          planeCovM2: [[2_900, 0], [0, 2_500]],
          sigmaAlongVelocityM: 316,
        } }),
      },
    });
  }
  return events;
}

export interface Fixture {
  readonly db: KeepclearDb;
  readonly runId: string;
  readonly events: NewEvent[];
}

export function reportFixture(n: number, path = ':memory:'): Fixture {
  const db = openDatabase(path);
  putSetting(db, SYNTHETIC_CATALOGUE_KEY, { text: 'Synthetic catalogue: invented objects for the report tests.' });
  const runId = createRun(db, SETTINGS, 'f'.repeat(64), 30_000);
  const events = fixtureEvents(n);
  finishRun(db, runId, { status: 'done', wallMs: 1500, flagged: [{ id: '29999', reason: 'decayed: perigee below 100 km' }], events });
  return { db, runId, events };
}
