import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { KeepclearError } from '../core/errors.js';
import type { ScreeningSettings } from '../core/screening/types.js';
import type { Encounter, RiskAssessment, StateArray } from '../core/events/index.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import {
  createRun,
  eventsOfRun,
  finishRun,
  getEvent,
  getEventExtra,
  getRun,
  latestRun,
  listRuns,
  mergeEventExtra,
  openDatabase,
  updateEventRisk,
  type KeepclearDb,
  type NewEvent,
} from '../db/index.js';

const T0 = parseIso('2026-12-03T00:00:00Z')!;
const SETTINGS: ScreeningSettings = {
  start: T0,
  end: instantFromMs(T0 + 7 * 86_400_000),
  volume: { kind: 'rtn-ellipsoid', rKm: 0.5, tKm: 5, nKm: 0.5 },
  primaries: ['25544', '100001'],
};

/** Values with full double precision, so a lossy column would show. */
function encounter(secondary: string, tcaOffsetMs: number, k = 1): Encounter {
  const p: StateArray = [6778.137123456789 * k, -1.0000000000001, 0.1 / 3, 7.612345678901234, 1e-13, -0.0001];
  const s: StateArray = [6778.2, -0.9, 0.3, -7.6, 0.25, 1 / 7];
  return {
    primary: '25544',
    secondary,
    tca: instantFromMs(T0 + tcaOffsetMs + 0.25),
    missKm: 0.123456789012345,
    relativeSpeedKmS: 14.9876543210123,
    rtnKm: [0.01, -0.1234567890123, 0.05],
    approachAngleDeg: 171.23456789,
    entry: instantFromMs(T0 + tcaOffsetMs - 1234.5),
    exit: null,
    primaryState: p,
    secondaryState: s,
    primaryEpoch: instantFromMs(T0 - 3_600_000.125),
    secondaryEpoch: instantFromMs(T0 - 7_200_000),
  };
}

const RISK: RiskAssessment = {
  pc: 3.2e-5,
  pcMethod: '2d-short-encounter',
  covarianceSource: 'cdm',
  hardBodyRadiusM: 12.5,
  tier: 'amber',
  warnings: ['relative speed is low; short-encounter assumption doubtful'],
};

let db: KeepclearDb;
beforeEach(() => {
  db = openDatabase(':memory:');
});
afterEach(() => db.close());

describe('runs', () => {
  it('creates a running run and finishes it with flagged objects and events in one go', () => {
    const id = createRun(db, SETTINGS, 'f'.repeat(64), 30_000);
    const running = getRun(db, id);
    expect(running).toMatchObject({ id, status: 'running', objectCount: 30_000, finishedAt: null, flagged: [] });
    expect(running?.settings).toEqual(SETTINGS);
    const events: NewEvent[] = [encounter('3', 5000), encounter('2', 1000), encounter('1', 5000)];
    const stored = finishRun(db, id, {
      status: 'done',
      wallMs: 1234.5,
      flagged: [{ id: '99', reason: 'decayed: perigee below 100 km' }, { id: '98', reason: 'sgp4 error 1' }],
      events,
    });
    // numbered in TCA order; the tie at 5000 ms broken by secondary id
    expect(stored.map((e) => [e.id, e.secondary])).toEqual([[`${id}-1`, '2'], [`${id}-2`, '1'], [`${id}-3`, '3']]);
    const done = getRun(db, id);
    expect(done).toMatchObject({ status: 'done', wallMs: 1234.5, eventCount: 3 });
    expect(done?.flagged).toEqual([
      { id: '99', reason: 'decayed: perigee below 100 km' },
      { id: '98', reason: 'sgp4 error 1' },
    ]);
    expect(done?.finishedAt).not.toBeNull();
  });

  it('stores "all" primaries and a sphere volume', () => {
    const settings: ScreeningSettings = { ...SETTINGS, volume: { kind: 'sphere', radiusKm: 5 }, primaries: 'all' };
    const id = createRun(db, settings, 'x', 3);
    expect(getRun(db, id)?.settings).toEqual(settings);
  });

  it('a run is finished once; an unknown run is NOT_FOUND', () => {
    const id = createRun(db, SETTINGS, 'x', 1);
    finishRun(db, id, { status: 'cancelled', wallMs: 5, flagged: [], events: [] });
    expect(() => finishRun(db, id, { status: 'done', wallMs: 5, flagged: [], events: [] })).toThrow(/already cancelled/);
    try {
      finishRun(db, 'R404', { status: 'done', wallMs: 5, flagged: [], events: [] });
      expect.unreachable();
    } catch (err) {
      expect((err as KeepclearError).code).toBe('NOT_FOUND');
    }
  });

  it('finishing is all-or-nothing: a bad event leaves the run running with no events', () => {
    const id = createRun(db, SETTINGS, 'x', 1);
    const broken = { ...encounter('2', 0), missKm: Number.NaN }; // NaN is stored as NULL: NOT NULL fails
    expect(() =>
      finishRun(db, id, { status: 'done', wallMs: 1, flagged: [{ id: '5', reason: 'r' }], events: [encounter('1', 0), broken] }),
    ).toThrow();
    expect(getRun(db, id)).toMatchObject({ status: 'running', flagged: [], eventCount: null });
    expect(eventsOfRun(db, id)).toEqual([]);
  });

  it('lists runs newest first; latestRun can filter by status', () => {
    const a = createRun(db, SETTINGS, 'x', 1);
    const b = createRun(db, SETTINGS, 'x', 1);
    finishRun(db, a, { status: 'done', wallMs: 1, flagged: [], events: [] });
    expect(listRuns(db).map((r) => r.id)).toEqual([b, a]);
    expect(latestRun(db)?.id).toBe(b);
    expect(latestRun(db, 'done')?.id).toBe(a);
    expect(latestRun(db, 'failed')).toBeNull();
    expect(a).not.toBe(b);
  });
});

describe('events', () => {
  it('round-trips every Encounter field exactly, with and without risk', () => {
    const id = createRun(db, SETTINGS, 'x', 2);
    const withRisk: NewEvent = { ...encounter('7', 2000, 1.5), risk: RISK };
    const withoutRisk = encounter('8', 1000);
    const stored = finishRun(db, id, { status: 'done', wallMs: 1, flagged: [], events: [withRisk, withoutRisk] });
    const read = eventsOfRun(db, id);
    expect(read).toEqual(stored);
    expect(read[0]).toEqual({ ...withoutRisk, id: `${id}-1`, runId: id, risk: null });
    expect(read[1]).toEqual({ ...withRisk, id: `${id}-2`, runId: id });
    expect(getEvent(db, `${id}-2`)).toEqual(read[1]);
    expect(getEvent(db, 'nope')).toBeNull();
  });

  it('updates the risk; a null Pc is kept as null, not as "not assessed"', () => {
    const id = createRun(db, SETTINGS, 'x', 2);
    const [e] = finishRun(db, id, { status: 'done', wallMs: 1, flagged: [], events: [encounter('7', 0)] });
    const noPc: RiskAssessment = { ...RISK, pc: null, pcMethod: 'none', covarianceSource: 'missing', warnings: [] };
    updateEventRisk(db, e!.id, noPc);
    expect(getEvent(db, e!.id)?.risk).toEqual(noPc);
    updateEventRisk(db, e!.id, RISK);
    expect(getEvent(db, e!.id)?.risk).toEqual(RISK);
    // The numbers behind the Pc (schema v2) round-trip with the risk, and go when it is replaced.
    const withDetail: RiskAssessment = {
      ...RISK,
      detail: {
        primaryCovRtnM2: [[1, 0.5, 0], [0.5, 4, 0], [0, 0, 9]],
        secondaryCovRtnM2: null,
        planeMissM: [812.5, 0],
        planeCovM2: [[16, -2], [-2, 25]],
        sigmaAlongVelocityM: 7.25,
      },
    };
    updateEventRisk(db, e!.id, withDetail);
    expect(getEvent(db, e!.id)?.risk).toEqual(withDetail);
    updateEventRisk(db, e!.id, RISK);
    expect(getEvent(db, e!.id)?.risk).toEqual(RISK);
    expect(() => updateEventRisk(db, 'R9-9', RISK)).toThrow(/no event "R9-9"/);
  });

  it('keeps later fields in the extra JSON, merged by key', () => {
    const id = createRun(db, SETTINGS, 'x', 2);
    const [e] = finishRun(db, id, { status: 'done', wallMs: 1, flagged: [], events: [encounter('7', 0)] });
    expect(getEventExtra(db, e!.id)).toEqual({});
    mergeEventExtra(db, e!.id, { trendId: 'T1', note: null });
    mergeEventExtra(db, e!.id, { plan: { deltaVMs: 0.12 } });
    expect(getEventExtra(db, e!.id)).toEqual({ trendId: 'T1', note: null, plan: { deltaVMs: 0.12 } });
  });
});
