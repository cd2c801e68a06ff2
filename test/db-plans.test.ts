/**
 * Schema v6: spacecraft mass/Isp per owner object and manoeuvre plans kept with their event
 * (db/spacecraft.ts, db/plans.ts). Values are stored as given (REAL, full double precision).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { KeepclearError } from '../core/errors.js';
import type { Encounter, StateArray } from '../core/events/index.js';
import { instantFromMs, parseIso, type Instant } from '../core/time/instant.js';
import {
  createRun, describeDatabase, finishRun, getPlan, getSpacecraft, latestPlanOfEvent, latestPlanSummaries, openDatabase,
  plansOfEvent, setSpacecraft, storePlan, type KeepclearDb, type NewPlan,
} from '../db/index.js';
import { touchObject } from '../db/objects.js';

const T0 = parseIso('2026-12-07T00:00:00Z')!;
const state: StateArray = [7000, 0, 0, 0, 7.5, 0];
const encounter = (secondary: string): Encounter => ({
  primary: '100001', secondary, tca: instantFromMs(T0 + 3_600_000), missKm: 0.05, relativeSpeedKmS: 15, rtnKm: [0.01, 0, 0.05],
  approachAngleDeg: 170, entry: null, exit: null, primaryState: state, secondaryState: state,
  primaryEpoch: instantFromMs(T0 - 86_400_000), secondaryEpoch: instantFromMs(T0 - 86_400_000),
});

let dir: string;
let db: KeepclearDb;
let eventIds: string[];
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'kc-plans-'));
  db = openDatabase(join(dir, 'p.db'));
  touchObject(db, '100001', 'ALPHA-1', null, T0);
  const run = createRun(db, { start: T0, end: instantFromMs(T0 + 86_400_000), volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['100001'] }, 'fp', 2);
  eventIds = finishRun(db, run, { status: 'done', wallMs: 1, flagged: [], events: [encounter('330001'), encounter('330002')] }).map((e) => e.id);
});
afterEach(() => {
  db.close();
  rmSync(dir, { recursive: true, force: true });
});

const plan = (eventId: string, createdAt: number, dv: number | null): NewPlan => ({
  eventId,
  createdAt: createdAt as Instant,
  target: { kind: 'miss', missKm: 1 },
  status: dv === null ? 'no-proposal' : 'planned',
  burn: dv === null ? null : { time: (T0 + 1000.5) as Instant, leadTimeS: 2800.25, direction: 'T', deltaVMs: dv, achievedMissKm: 1.0001234567, achievedPc: 3e-41, propellantKg: 0.0463400012345 },
  massKg: 100,
  ispS: 220,
  newApproaches: 2,
  document: { trade: [{ leadTimeS: 1400, deltaVMs: 0.3 }], note: 'ü' },
});

describe('schema v6', () => {
  it('adds the spacecraft and plans tables', () => {
    expect(describeDatabase(db).tables).toEqual(expect.arrayContaining(['spacecraft', 'plans']));
  });
});

describe('spacecraft mass and Isp', () => {
  it('stores, updates one value at a time and clears', () => {
    expect(getSpacecraft(db, '100001')).toBeNull();
    setSpacecraft(db, '100001', { massKg: 100.125 });
    expect(getSpacecraft(db, '100001')).toMatchObject({ massKg: 100.125, ispS: null });
    setSpacecraft(db, '100001', { ispS: 220 });
    expect(getSpacecraft(db, '100001')).toMatchObject({ massKg: 100.125, ispS: 220 });
    setSpacecraft(db, '100001', { massKg: null });
    expect(getSpacecraft(db, '100001')).toMatchObject({ massKg: null, ispS: 220 });
  });
  it('refuses non-positive values and unknown objects, changing nothing', () => {
    expect(() => setSpacecraft(db, '100001', { massKg: 0 })).toThrow(/mass must be a positive number of kg, got 0/);
    expect(() => setSpacecraft(db, '100001', { ispS: Number.NaN })).toThrow(KeepclearError);
    expect(() => setSpacecraft(db, '999999', { massKg: 10 })).toThrow(/no object "999999"/);
    expect(getSpacecraft(db, '100001')).toBeNull();
  });
});

describe('plans', () => {
  it('round-trips a plan with its document and lists the newest per event', () => {
    const a = storePlan(db, plan(eventIds[0]!, T0 + 1, 0.2));
    const b = storePlan(db, plan(eventIds[0]!, T0 + 2, 0.1298765432109876));
    storePlan(db, plan(eventIds[1]!, T0 + 3, null));
    const got = getPlan(db, b)!;
    expect(got.deltaVMs).toBe(0.1298765432109876);
    expect(got.propellantKg).toBe(0.0463400012345);
    expect(got.burnTime).toBe(T0 + 1000.5);
    expect(got.document).toEqual(plan(eventIds[0]!, 0, 0).document);
    expect(latestPlanOfEvent(db, eventIds[0]!)!.id).toBe(b);
    expect(plansOfEvent(db, eventIds[0]!).map((p) => p.id)).toEqual([b, a]);
    const m = latestPlanSummaries(db, eventIds);
    expect(m.get(eventIds[0]!)!.id).toBe(b);
    expect(m.get(eventIds[1]!)).toMatchObject({ status: 'no-proposal', deltaVMs: null, burnTime: null });
  });
  it('refuses a plan of an unknown event, and a planned status without a burn', () => {
    expect(() => storePlan(db, plan('R9-9', T0, 0.1))).toThrow(/no event "R9-9"/);
    expect(() => storePlan(db, { ...plan(eventIds[0]!, T0, 0.1), burn: null })).toThrow(KeepclearError);
    expect(latestPlanOfEvent(db, eventIds[0]!)).toBeNull();
  });
  it('is deleted with its event', () => {
    storePlan(db, plan(eventIds[0]!, T0, 0.1));
    db.sqlite.prepare('DELETE FROM runs').run();
    expect(db.sqlite.prepare('SELECT COUNT(*) FROM plans').pluck().get()).toBe(0);
  });
});
