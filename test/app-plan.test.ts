/**
 * The plan service (app/plan) on a stored event: the demo's closest approach (100001 × 330001,
 * 50 m, nearly head-on), imported and screened through the normal services with a 300-object
 * catalogue. Checked here (the planner's own numerics are checked in test/manoeuvre-*.test.ts):
 * - the covariances and Pc method are the event's: the planner's Pc of the encounter found again
 *   equals the stored Pc (the same function on the same inputs; TCA and miss agree to µs and mm);
 * - the verified miss meets the target, and the re-screen (the screening engine on the
 *   manoeuvred trajectory) finds the event's secondary at that same miss, marked as seen before;
 * - a third object planted on the manoeuvred path (fitted to its state 12 h after TCA,
 *   core/synthetic/fit.ts, within 1 m) is found by the re-screen and listed as new at its
 *   planted miss (5 m: fit 1 m + refinement 1 m, DESIGN.md, with margin);
 * - the plan is stored with the event; missing spacecraft data is an error naming the command;
 * - the OEM and OPM written for the plan parse back to the same numbers (CCSDS 502.0-B-2 KVN).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importFile } from '../app/import/index.js';
import { planForEvent, planOemText, planOpmText, type EventPlan } from '../app/plan/index.js';
import { screenAndStore } from '../app/screen.js';
import { KeepclearError } from '../core/errors.js';
import type { ConjunctionEvent } from '../core/events/index.js';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { parseOemFile, sampleOem } from '../core/formats/oem/index.js';
import { parseOpmKvn } from '../core/formats/opm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { opmStateTeme } from '../core/manoeuvre/index.js';
import { EphemerisTrajectory } from '../core/propagation/ephemeris.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { tleExactEpoch } from '../core/synthetic/draft.js';
import { fitElementSetToState } from '../core/synthetic/fit.js';
import { parseIso, type Instant } from '../core/time/instant.js';
import { getEphemeris, latestElementSets, latestPlanOfEvent, openDatabase, recordRunEphemeris, storeEphemeris, setSpacecraft, storeElementSets, type KeepclearDb } from '../db/index.js';

const START = parseIso('2026-12-07T00:00:00Z')!;
const END = (START + 2 * 86_400_000) as Instant;
const TARGET_KM = 1;
const THREAT_MISS_KM = 0.3;
const THREAT_TOL_KM = 5e-3;
/** Re-screen and planner locate the same minimum on the same trajectories: refinement to 1 µs / 1 m. */
const SAME_MISS_TOL_KM = 1e-3;
/** OEM/OPM numbers: 7 decimals of km written (0.05 mm) plus the EME2000 ↔ TEME round trip (~1e-9 km). */
const FILE_POS_TOL_KM = 1e-6;
const FILE_VEL_TOL_KM_S = 1e-9;
/** Fixed plan settings, so that planning twice gives the same burn. */
const REQUEST = { target: { kind: 'miss' as const, missKm: TARGET_KM }, now: START };

let dir: string;
let db: KeepclearDb;
let event: ConjunctionEvent;
let missingSpacecraft: unknown;
let first: EventPlan;
let second: EventPlan;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-app-plan-'));
  db = openDatabase(join(dir, 'plan.db'));
  const scenario = buildDemoScenario({ catalogSize: 300 });
  const files = { history: join(dir, 'history.tle'), fleet: join(dir, 'fleet.tle'), catalog: join(dir, 'catalog.json') };
  writeFileSync(files.history, formatTleFile(Object.values(scenario.history).flat()));
  writeFileSync(files.fleet, formatTleFile(scenario.fleet));
  writeFileSync(files.catalog, formatOmmJson(scenario.catalog));
  for (const f of Object.values(files)) expect(importFile(db, f).ok).toBe(true);
  const { events } = await screenAndStore(db, {
    settings: { start: START, end: END, volume: { kind: 'sphere', radiusKm: 5 }, primaries: ['100001'] },
    workers: 0,
  });
  event = events.find((e) => e.secondary === '330001')!;
  expect(event, 'the demo\'s closest approach').toBeDefined();
  missingSpacecraft = await planForEvent(db, event.id, REQUEST).catch((e: unknown) => e);
  setSpacecraft(db, '100001', { massKg: 100, ispS: 220 });
  first = await planForEvent(db, event.id, { ...REQUEST, store: false });

  // A threat on the manoeuvred path 12 h after TCA, crossing it at 100°, 0.3 km radially off.
  const moved = first.core.manoeuvredTrajectory!;
  const tThreat = (event.tca + 12 * 3_600_000) as Instant;
  const x = new Float64Array(6);
  moved.stateInto(tThreat, x, 0);
  const r = Math.hypot(x[0]!, x[1]!, x[2]!);
  const R = [0, 1, 2].map((i) => x[i]! / r);
  const hv = [x[1]! * x[5]! - x[2]! * x[4]!, x[2]! * x[3]! - x[0]! * x[5]!, x[0]! * x[4]! - x[1]! * x[3]!];
  const N = hv.map((c) => c / Math.hypot(...hv));
  const T = [N[1]! * R[2]! - N[2]! * R[1]!, N[2]! * R[0]! - N[0]! * R[2]!, N[0]! * R[1]! - N[1]! * R[0]!];
  const v = Math.hypot(x[3]!, x[4]!, x[5]!);
  const c = Math.cos((100 * Math.PI) / 180), s = Math.sin((100 * Math.PI) / 180);
  const threat = fitElementSetToState(
    { r: [0, 1, 2].map((i) => x[i]! + THREAT_MISS_KM * R[i]!), v: [0, 1, 2].map((i) => v * (c * T[i]! + s * N[i]!)) },
    tThreat,
    { objectId: '390001', name: 'PLANTED THREAT', epoch: tleExactEpoch(event.tca - 24 * 3_600_000), bstar: 3e-5 },
  );
  storeElementSets(db, { path: 'threat (test)', sha256: 'test', format: 'test' }, [threat], []);
  second = await planForEvent(db, event.id, REQUEST);
}, 180_000);

afterAll(() => {
  db?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('plan service on a stored event', () => {
  it('refuses to plan without the spacecraft\'s mass and Isp, naming the object and the command', () => {
    expect(missingSpacecraft).toBeInstanceOf(KeepclearError);
    const e = missingSpacecraft as KeepclearError;
    expect(e.code).toBe('SPACECRAFT_PARAMETER_MISSING');
    expect(e.message).toMatch(/spacecraft 100001: mass \(kg\) and Isp \(s\) not set/);
    expect(e.message).toContain('keepclear spacecraft --id 100001 --mass-kg KG --isp-s S');
  });

  it('computes Pc with the event\'s own covariances and method', () => {
    expect(first.core.original.pc).not.toBeNull();
    expect(event.risk!.pc).not.toBeNull();
    expect(Math.abs(first.core.original.pc! / event.risk!.pc! - 1)).toBeLessThan(1e-4);
    expect(first.pcMethod).toContain(event.risk!.covarianceSource);
  });

  it('proposes a burn whose verified miss meets the target', () => {
    const d = second.document;
    expect(d.status).toBe('planned');
    expect(d.proposal!.achievedMissKm!).toBeGreaterThanOrEqual(TARGET_KM);
    expect(d.proposal!.propellantKg).toBeGreaterThan(0);
    expect(d.trade).toHaveLength(20);
    for (const k of ['event', 'proposal', 'trade', 'newApproaches', 'caution'] as const) expect(d).toHaveProperty(k);
    for (const k of ['burnTime', 'leadTimeS', 'direction', 'deltaVMs', 'deltaVRtnMs', 'achievedMissKm', 'achievedPc', 'propellantKg'])
      expect(d.proposal).toHaveProperty(k);
    // Planning twice on the same inputs gives the same burn (the threat changes only the catalogue).
    expect(second.core.proposal!.deltaVRtnMs).toEqual(first.core.proposal!.deltaVRtnMs);
  });

  it('the re-screen finds the event\'s secondary again at the verified miss, as seen before', () => {
    const v = second.core.verification!.sgp4PlusDifference!;
    const again = second.rescreen!.approaches.filter((a) => a.secondary === '330001' && Math.abs(a.tca - v.tca) < 60_000);
    expect(again).toHaveLength(1);
    expect(Math.abs(again[0]!.missKm - v.missKm)).toBeLessThan(SAME_MISS_TOL_KM);
    expect(again[0]!.isNew).toBe(false);
    expect(again[0]!.before!.eventId).toBe(event.id);
    expect(second.newApproaches.some((a) => a.secondary === '330001')).toBe(false);
  });

  it('a threat planted on the manoeuvred path is a new approach at its planted miss', () => {
    expect(first.newApproaches.some((a) => a.secondary === '390001')).toBe(false);
    const found = second.newApproaches.filter((a) => a.secondary === '390001');
    expect(found).toHaveLength(1);
    expect(Math.abs(found[0]!.missKm - THREAT_MISS_KM)).toBeLessThan(THREAT_TOL_KM);
    expect(second.document.newApproaches.map((a) => a.secondary)).toContain('390001');
  });

  it('is stored with the event, with the numbers of the document', () => {
    const p = latestPlanOfEvent(db, event.id)!;
    expect(p.id).toBe(second.planId);
    expect(p.deltaVMs).toBe(second.document.proposal!.deltaVMs);
    expect(p.achievedMissKm).toBe(second.document.proposal!.achievedMissKm);
    expect(p.newApproaches).toBe(second.newApproaches.length);
    expect((p.document.proposal as { burnTime: string }).burnTime).toBe(second.document.proposal!.burnTime);
  });

  it('an aborted signal stops the plan with CANCELLED and stores nothing', async () => {
    const before = latestPlanOfEvent(db, event.id)!.id;
    const ac = new AbortController();
    ac.abort();
    await expect(planForEvent(db, event.id, { ...REQUEST, signal: ac.signal })).rejects.toMatchObject({ code: 'CANCELLED' });
    expect(latestPlanOfEvent(db, event.id)!.id).toBe(before);
  });
});

describe('files of the plan parse back to the same numbers', () => {
  it('OEM: the manoeuvred trajectory from the burn to the window end', () => {
    const text = planOemText(second);
    const parsed = parseOemFile(text, 'plan.oem');
    expect(parsed.fatal).toBeNull();
    expect(parsed.rejections).toEqual([]);
    const seg = parsed.oem!.segments;
    expect(seg).toHaveLength(1);
    const { epochs, teme } = seg[0]!;
    const burn = second.core.proposal!.burnTime;
    expect(epochs[0]! - burn).toBeGreaterThanOrEqual(0);
    expect(epochs[0]! - burn).toBeLessThan(1);
    expect(epochs[epochs.length - 1]).toBe(END);
    const traj = second.core.manoeuvredTrajectory!;
    const x = new Float64Array(6);
    for (const i of [0, 1, 2, Math.floor(epochs.length / 2), epochs.length - 1]) {
      traj.stateInto(epochs[i]! as Instant, x, 0);
      for (let k = 0; k < 3; k++) expect(Math.abs(teme[6 * i + k]! - x[k]!)).toBeLessThan(FILE_POS_TOL_KM);
      for (let k = 3; k < 6; k++) expect(Math.abs(teme[6 * i + k]! - x[k]!)).toBeLessThan(FILE_VEL_TOL_KM_S);
    }
  });

  it('OPM: the state at the burn and the manoeuvre block', () => {
    const m = parseOpmKvn(planOpmText(second), 'burn.opm');
    const q = second.core.proposal!;
    const t = Math.round(q.burnTime) as Instant;
    expect(m.epoch).toBe(t);
    expect(m.manoeuvres).toHaveLength(1);
    const man = m.manoeuvres[0]!;
    expect(man.epochIgnition).toBe(t);
    expect(man.durationS).toBe(0);
    expect(man.refFrame).toBe('RTN');
    expect(man.deltaMassKg).toBe(-q.propellantKg);
    expect(man.dvKmS).toEqual(q.deltaVRtnMs!.map((x) => x / 1000));
    expect(m.spacecraft?.massKg).toBe(100);
    const sgp4 = new Float64Array(6);
    // The primary's screened element set, propagated here on its own (the burn is after this instant's state).
    const set = latestElementSets(db, ['100001'])[0]!;
    expect(Math.abs(set.epoch - event.primaryEpoch)).toBeLessThan(1);
    expect(new Sgp4Trajectory(set).stateInto(t, sgp4, 0)).toBeNull();
    const s = opmStateTeme(m);
    for (let k = 0; k < 3; k++) expect(Math.abs(s[k]! - sgp4[k]!)).toBeLessThan(FILE_POS_TOL_KM);
    for (let k = 3; k < 6; k++) expect(Math.abs(s[k]! - sgp4[k]!)).toBeLessThan(FILE_VEL_TOL_KM_S);
  });
});

describe('a primary screened from an owner ephemeris', () => {
  // An OEM of the primary's own SGP4 trajectory (60-s LAGRANGE 9 nodes: interpolation error of
  // micrometres, core/formats/oem/sample.ts), recorded as what the run screened the primary with.
  // Planning on it must give the plan made on SGP4 itself, to the solver's own precision.
  let onOem: EventPlan;
  beforeAll(async () => {
    const set = latestElementSets(db, ['100001'])[0]!;
    const oem = sampleOem(
      [{ trajectory: new Sgp4Trajectory(set), start: (START - 86_400_000) as Instant, end: (END + 6 * 3_600_000) as Instant, stepS: 60 }],
      { objectName: 'ALPHA-1', objectId: '100001', originator: 'TEST', creationDate: START, file: 'owner.oem' },
    );
    const { id } = storeEphemeris(db, { objectId: '100001', fileName: 'owner.oem', sha256: 'test-oem', header: oem.header, segments: oem.segments });
    recordRunEphemeris(db, event.runId, getEphemeris(db, id)!);
    onOem = await planForEvent(db, event.id, { ...REQUEST, store: false });
  }, 120_000);

  it('plans on the ephemeris and says so, with the same burn as on SGP4', () => {
    expect(onOem.core.manoeuvredTrajectory!.base).toBeInstanceOf(EphemerisTrajectory);
    expect(onOem.notes.some((n) => n.includes('owner ephemeris owner.oem'))).toBe(true);
    const a = onOem.core.proposal!, b = second.core.proposal!;
    // Lead times are fractions of the period from the state at TCA; the ephemeris' velocity is
    // the derivative of its positions, SGP4's differs from that by up to 2.4 cm/s in LEO
    // (test/oem-frames.test.ts): periods differ by ~1e-5, lead times by < 1 s.
    expect(Math.abs(a.leadTimeS - b.leadTimeS)).toBeLessThan(1);
    expect(a.direction).toBe(b.direction);
    // Bracketing tolerances of the solver (core/manoeuvre/solveAlong.ts) on inputs equal to µm.
    expect(Math.abs(a.deltaVMs! / b.deltaVMs! - 1)).toBeLessThan(1e-3);
    expect(onOem.document.proposal!.achievedMissKm!).toBeGreaterThanOrEqual(TARGET_KM);
  });
});
