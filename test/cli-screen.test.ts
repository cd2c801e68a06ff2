/**
 * `keepclear screen` as a user runs it (DESIGN.md, "CLI contract" and "JSON of screen and
 * events"): a spawned process on a small demo scenario, its exit codes, its stderr and the JSON
 * names outside checks read.
 *
 * Accuracy is checked two ways:
 * - against a dense evaluation of the same trajectories (the element sets the run read from
 *   the database): TCA within 1 ms, miss within 1 m — the screening requirement as written;
 * - against the scenario's designed encounters: the planted TCA and designed miss are the
 *   targets the fitter matched to within FIT_POSITION_TOLERANCE_KM (core/synthetic/fit.ts), so
 *   the budget is the screening requirement plus that fit tolerance (in time: the fit's
 *   position error divided by the relative speed).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { buildDemoScenario, type DemoScenario, type PlantedEncounter } from '../core/synthetic/demo.js';
import { FIT_POSITION_TOLERANCE_KM } from '../core/synthetic/fit.js';
import { parseIso, type Instant } from '../core/time/instant.js';
import { latestElementSets, listRuns, openDatabase } from '../db/index.js';
import { ROOT, runKeepclear, type EventJson, type Run } from './support/cli.js';


/** DESIGN.md "Screening requirements": TCA within 1 ms, miss within 1 m of a dense evaluation. */
const SCREEN_TCA_TOL_MS = 1;
const SCREEN_MISS_TOL_KM = 1e-3;
/** Against the designed encounter: the screening budget plus the fitter's contract. */
const DESIGN_MISS_TOL_KM = SCREEN_MISS_TOL_KM + FIT_POSITION_TOLERANCE_KM;
const designTcaTolMs = (p: PlantedEncounter): number =>
  SCREEN_TCA_TOL_MS + (FIT_POSITION_TOLERANCE_KM / p.relativeSpeedKmS) * 1000;

const ISO_MS_Z = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;
const START = '2026-12-07T00:00:00Z';
const DAYS = 2;

const keepclear = (args: string[]): Run => runKeepclear(args, dir);

/** The same, without blocking: several cheap invocations can then share the two cores. */
function keepclearAsync(args: string[]): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [join(ROOT, 'bin', 'keepclear.js'), ...args], {
      cwd: ROOT,
      env: { ...process.env, KEEPCLEAR_DB: join(dir, 'never-default.db') },
    });
    let stdout = '', stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (stdout += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code: code ?? -1, stdout, stderr }));
  });
}

/** Runs jobs at most `limit` at a time, results in order. */
async function pooled<T>(jobs: (() => Promise<T>)[], limit: number): Promise<T[]> {
  const results: T[] = new Array(jobs.length);
  let next = 0;
  const lane = async () => {
    while (next < jobs.length) {
      const k = next++;
      results[k] = await jobs[k]!();
    }
  };
  await Promise.all(Array.from({ length: Math.min(limit, jobs.length) }, lane));
  return results;
}

interface ScreenJson {
  run: {
    id: string;
    start: string;
    days: number;
    thresholdKm: number | null;
    volumeRtnKm?: number[];
    objects: number;
    primaries: string[];
    flagged: { id: string; reason: string }[];
  };
  events: EventJson[];
}

// ---- dense evaluation of the same trajectories -------------------------------------------

type Sample = Float64Array;
function stateOf(tr: Sgp4Trajectory, t: number): Sample {
  const out = new Float64Array(6);
  const failure = tr.stateInto(t as Instant, out, 0);
  if (failure) throw new Error(`propagation of ${tr.objectId} failed: ${failure}`);
  return out;
}
const rel = (a: Sample, b: Sample): number[] => [0, 1, 2, 3, 4, 5].map((k) => b[k]! - a[k]!);
const range = (p: Sgp4Trajectory, s: Sgp4Trajectory, t: number): number => {
  const d = rel(stateOf(p, t), stateOf(s, t));
  return Math.hypot(d[0]!, d[1]!, d[2]!);
};
const rangeRate = (p: Sgp4Trajectory, s: Sgp4Trajectory, t: number): number => {
  const d = rel(stateOf(p, t), stateOf(s, t));
  return d[0]! * d[3]! + d[1]! * d[4]! + d[2]! * d[5]!;
};

/** Minimum of the range near `guess`: 10 ms scan over ±10 s, then range-rate bisection to 1 µs. */
function denseMinimum(p: Sgp4Trajectory, s: Sgp4Trajectory, guess: number): { tcaMs: number; missKm: number } {
  let best = Infinity, bestT = guess;
  for (let t = guess - 10_000; t <= guess + 10_000; t += 10) {
    const d = range(p, s, t);
    if (d < best) { best = d; bestT = t; }
  }
  let lo = bestT - 10, hi = bestT + 10;
  if (!(rangeRate(p, s, lo) < 0 && rangeRate(p, s, hi) > 0)) throw new Error('no range-rate sign change near the scanned minimum');
  while (hi - lo > 1e-3) {
    const mid = (lo + hi) / 2;
    if (rangeRate(p, s, mid) < 0) lo = mid; else hi = mid;
  }
  const t = (lo + hi) / 2;
  return { tcaMs: t, missKm: range(p, s, t) };
}

/** Secondary minus primary in the primary's RTN frame (DESIGN.md "Time, frames, units"). */
function rtnOf(p: Sample, s: Sample): number[] {
  const r = [p[0]!, p[1]!, p[2]!], v = [p[3]!, p[4]!, p[5]!];
  const cross = (a: number[], b: number[]) => [a[1]! * b[2]! - a[2]! * b[1]!, a[2]! * b[0]! - a[0]! * b[2]!, a[0]! * b[1]! - a[1]! * b[0]!];
  const unit = (a: number[]) => { const n = Math.hypot(a[0]!, a[1]!, a[2]!); return a.map((x) => x / n); };
  const R = unit(r), N = unit(cross(r, v)), T = cross(N, R);
  const d = [s[0]! - p[0]!, s[1]! - p[1]!, s[2]! - p[2]!];
  const dot = (a: number[], b: number[]) => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
  return [dot(d, R), dot(d, T), dot(d, N)];
}

// ---- the scenario ---------------------------------------------------------------------------

let dir: string;
let scenario: DemoScenario;
let fleetFile: string;
let catalogFile: string;
let windowStart: number;
let windowEnd: number;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-cli-screen-'));
  scenario = buildDemoScenario({ catalogSize: 300 });
  fleetFile = join(dir, 'fleet.tle');
  catalogFile = join(dir, 'catalog.json');
  writeFileSync(fleetFile, formatTleFile(scenario.fleet));
  writeFileSync(catalogFile, formatOmmJson(scenario.catalog));
  windowStart = parseIso(START)!;
  windowEnd = windowStart + DAYS * 86_400_000;
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const plantedIn = (primaries: readonly string[]): PlantedEncounter[] =>
  scenario.planted.filter((p) => primaries.includes(p.primary) && p.tca >= windowStart && p.tca < windowEnd);

function trajectoriesOf(dbPath: string): Map<string, Sgp4Trajectory> {
  const db = openDatabase(dbPath);
  try {
    return new Map(latestElementSets(db).map((es: ElementSet) => [es.objectId, new Sgp4Trajectory(es)]));
  } finally {
    db.close();
  }
}

function screen(db: string, extra: string[], catalogs = true): Run {
  return keepclear([
    'screen', '--db', db,
    ...(catalogs ? ['--catalog', fleetFile, '--catalog', catalogFile] : []),
    '--start', START, '--days', String(DAYS), '--workers', '0', ...extra,
  ]);
}

function expectContractShape(out: ScreenJson): void {
  expect(typeof out.run.id).toBe('string');
  expect(out.run.start).toMatch(ISO_MS_Z);
  expect(parseIso(out.run.start)).toBe(windowStart);
  expect(out.run.days).toBe(DAYS);
  expect(Array.isArray(out.run.flagged)).toBe(true);
  for (const f of out.run.flagged) expect([typeof f.id, typeof f.reason]).toEqual(['string', 'string']);
  expect(out.run.objects).toBe(scenario.fleet.length + scenario.catalog.length);
  for (const e of out.events) {
    expect(typeof e.id).toBe('string');
    expect(typeof e.primary).toBe('string');
    expect(typeof e.secondary).toBe('string');
    expect(e.tca, e.id).toMatch(ISO_MS_Z);
    expect(Number.isFinite(e.missKm)).toBe(true);
    expect(e.relativeSpeedKmS).toBeGreaterThan(0);
    expect(e.rtnKm).toHaveLength(3);
    for (const x of e.rtnKm) expect(Number.isFinite(x)).toBe(true);
    // the RTN components are the miss vector: same length
    expect(Math.hypot(...e.rtnKm)).toBeCloseTo(e.missKm, 9);
    expect(e.approachAngleDeg).toBeGreaterThanOrEqual(0);
    expect(e.approachAngleDeg).toBeLessThanOrEqual(180);
    expect(e.pc === null || (typeof e.pc === 'number' && e.pc >= 0 && e.pc <= 1), `${e.id} pc ${e.pc}`).toBe(true);
    expect(typeof e.pcMethod).toBe('string');
    expect(typeof e.covarianceSource).toBe('string');
    expect(new Set(out.events.map((x) => x.id)).size).toBe(out.events.length);
  }
}

describe('keepclear screen --json -', () => {
  let db: string;
  let r: Run;
  let out: ScreenJson;
  beforeAll(() => {
    db = join(dir, 'sphere.db');
    r = screen(db, ['--primary', '100001', '--json', '-']);
  });

  it('exits 0 and writes only JSON to stdout', () => {
    expect(r.code, r.stderr).toBe(0);
    expect(() => (out = JSON.parse(r.stdout) as ScreenJson)).not.toThrow();
    expect(r.stdout.trim().startsWith('{')).toBe(true);
    // the catalogue import's counts went to stderr, not stdout
    expect(r.stdout).not.toMatch(/imported \d+/);
    expect(r.stderr).toMatch(/imported \d+/);
  });

  it('reports progress on stderr', () => {
    expect(r.stderr).toMatch(/screening: \d+% \(\d+\/\d+\)/);
    expect(r.stderr).toMatch(/screening: 100% \(\d+\/\d+\)/);
  });

  it('has the run and events of the contract', () => {
    out = JSON.parse(r.stdout) as ScreenJson;
    expectContractShape(out);
    expect(out.run.thresholdKm).toBe(5); // the documented default
    expect(out.run.primaries).toEqual(['100001']);
    expect(out.events.length).toBeGreaterThan(0);
    for (const e of out.events) {
      expect(e.primary).toBe('100001');
      expect(e.missKm).toBeLessThanOrEqual(5 + SCREEN_MISS_TOL_KM);
      const t = parseIso(e.tca)!;
      expect(t).toBeGreaterThanOrEqual(windowStart);
      expect(t).toBeLessThanOrEqual(windowEnd);
    }
  });

  it('finds every planted encounter of the primary in the window at the designed TCA and miss', () => {
    out = JSON.parse(r.stdout) as ScreenJson;
    const planted = plantedIn(['100001']);
    expect(planted.length).toBeGreaterThan(0);
    for (const p of planted) {
      const e = out.events.find((x) => x.primary === p.primary && x.secondary === p.secondary && Math.abs(parseIso(x.tca)! - p.tca) < 1000);
      expect(e, `planted ${p.primary}/${p.secondary} at ${new Date(p.tca).toISOString()}`).toBeDefined();
      expect(Math.abs(parseIso(e!.tca)! - p.tca)).toBeLessThanOrEqual(designTcaTolMs(p));
      expect(Math.abs(e!.missKm - p.designedMissKm)).toBeLessThanOrEqual(DESIGN_MISS_TOL_KM);
      expect(e!.approachAngleDeg).toBeCloseTo(p.approachAngleDeg, 1);
      expect(e!.relativeSpeedKmS).toBeCloseTo(p.relativeSpeedKmS, 3);
    }
  });

  it('every event matches a dense evaluation of the same trajectories (1 ms, 1 m) and its RTN', () => {
    out = JSON.parse(r.stdout) as ScreenJson;
    const tr = trajectoriesOf(db);
    for (const e of out.events) {
      const p = tr.get(e.primary)!, s = tr.get(e.secondary)!;
      const ref = denseMinimum(p, s, parseIso(e.tca)!);
      // the ISO string as written (ms precision) is what outside checks compare
      expect(Math.abs(parseIso(e.tca)! - ref.tcaMs), `${e.id} TCA`).toBeLessThanOrEqual(SCREEN_TCA_TOL_MS);
      expect(Math.abs(e.missKm - ref.missKm), `${e.id} miss`).toBeLessThanOrEqual(SCREEN_MISS_TOL_KM);
      const rtn = rtnOf(stateOf(p, ref.tcaMs), stateOf(s, ref.tcaMs));
      for (let k = 0; k < 3; k++) expect(Math.abs(e.rtnKm[k]! - rtn[k]!), `${e.id} rtn[${k}]`).toBeLessThanOrEqual(SCREEN_MISS_TOL_KM);
    }
  });

  it('stores the run in the database', () => {
    out = JSON.parse(r.stdout) as ScreenJson;
    const d = openDatabase(db);
    try {
      expect(listRuns(d).map((x) => x.id)).toContain(out.run.id);
    } finally {
      d.close();
    }
  });
});

describe('keepclear screen --volume-rtn-km', () => {
  const primaries = ['100001', '100003'];
  const [A_R, A_T, A_N] = [1, 10, 2];
  /**
   * Entry and exit are written to the ms. The metric Σ(x/a)² changes at most 2·|x|·v/a² per
   * second on an axis: ≤ 2·2·15/2² = 15 /s on N (the steepest here, v ≤ 15 km/s), so half a
   * ms of rounding moves it by < 0.01.
   */
  const SURFACE_TOL = 1e-2;
  let db: string;
  let r: Run;
  beforeAll(() => {
    db = join(dir, 'rtn.db');
    r = screen(db, ['--primary', primaries.join(','), '--volume-rtn-km', `${A_R},${A_T},${A_N}`, '--json', '-']);
  });

  it('exits 0, thresholdKm is null and the volume is stated', () => {
    expect(r.code, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as ScreenJson;
    expectContractShape(out);
    expect(out.run.thresholdKm).toBeNull();
    expect(out.run.volumeRtnKm).toEqual([A_R, A_T, A_N]);
    expect([...out.run.primaries].sort()).toEqual(primaries);
  });

  it('finds the planted encounters of both primaries (all well inside the ellipsoid)', () => {
    const out = JSON.parse(r.stdout) as ScreenJson;
    const planted = plantedIn(primaries);
    expect(new Set(planted.map((p) => p.primary))).toEqual(new Set(primaries));
    for (const p of planted) {
      expect(p.designedMissKm).toBeLessThan(A_R); // inside whatever the miss direction
      const e = out.events.find((x) => x.primary === p.primary && x.secondary === p.secondary && Math.abs(parseIso(x.tca)! - p.tca) < 1000);
      expect(e, `planted ${p.primary}/${p.secondary}`).toBeDefined();
      expect(Math.abs(parseIso(e!.tca)! - p.tca)).toBeLessThanOrEqual(designTcaTolMs(p));
      expect(Math.abs(e!.missKm - p.designedMissKm)).toBeLessThanOrEqual(DESIGN_MISS_TOL_KM);
    }
  });

  it('each event does enter the ellipsoid, and its entry/exit lie on its surface', () => {
    const out = JSON.parse(r.stdout) as ScreenJson;
    const tr = trajectoriesOf(db);
    const metric = (p: Sgp4Trajectory, s: Sgp4Trajectory, t: number): number => {
      const [x, y, z] = rtnOf(stateOf(p, t), stateOf(s, t));
      return (x! / A_R) ** 2 + (y! / A_T) ** 2 + (z! / A_N) ** 2;
    };
    expect(out.events.length).toBeGreaterThan(0);
    for (const e of out.events) {
      const p = tr.get(e.primary)!, s = tr.get(e.secondary)!;
      expect(e.entry, e.id).toMatch(ISO_MS_Z);
      expect(e.exit, e.id).toMatch(ISO_MS_Z);
      const t0: number = parseIso(e.entry!)!, t1: number = parseIso(e.exit!)!;
      let deepest = Infinity;
      for (let t = t0; t <= t1; t += Math.max(1, (t1 - t0) / 200)) deepest = Math.min(deepest, metric(p, s, t));
      expect(deepest, `${e.id} deepest point`).toBeLessThanOrEqual(1);
      // a millisecond either side of entry and exit straddles the surface (to SURFACE_TOL)
      expect(metric(p, s, t0 - 1), `${e.id} before entry`).toBeGreaterThan(1 - SURFACE_TOL);
      expect(metric(p, s, t0 + 1), `${e.id} after entry`).toBeLessThan(1 + SURFACE_TOL);
      expect(metric(p, s, t1 - 1), `${e.id} before exit`).toBeLessThan(1 + SURFACE_TOL);
      expect(metric(p, s, t1 + 1), `${e.id} after exit`).toBeGreaterThan(1 - SURFACE_TOL);
    }
  });
});

describe('keepclear screen --all', () => {
  let r: Run;
  beforeAll(() => {
    r = keepclear([
      'screen', '--db', join(dir, 'all.db'), '--catalog', fleetFile, '--catalog', catalogFile, '--all',
      '--start', START, '--days', '1', '--workers', '0', '--json', '-',
    ]);
  });

  it('exits 0 and finds the planted encounter of the first day, in either order of the pair', () => {
    expect(r.code, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as ScreenJson;
    const end = windowStart + 86_400_000;
    const planted = scenario.planted.filter((p) => p.tca >= windowStart && p.tca < end);
    expect(planted.length).toBeGreaterThan(0);
    for (const p of planted) {
      const e = out.events.find(
        (x) =>
          ((x.primary === p.primary && x.secondary === p.secondary) || (x.primary === p.secondary && x.secondary === p.primary)) &&
          Math.abs(parseIso(x.tca)! - p.tca) <= designTcaTolMs(p),
      );
      expect(e, `planted ${p.primary}/${p.secondary}`).toBeDefined();
      expect(Math.abs(e!.missKm - p.designedMissKm)).toBeLessThanOrEqual(DESIGN_MISS_TOL_KM);
    }
    // each conjunction once, not once per direction
    const key = (e: EventJson) => `${[e.primary, e.secondary].sort().join('/')} ${e.tca}`;
    expect(new Set(out.events.map(key)).size).toBe(out.events.length);
  });

  it('run.primaries keeps the contract type (an array of ids)', () => {
    // DESIGN.md shows "primaries": ["…"]; with --all the JSON gives the string "all" instead
    const out = JSON.parse(r.stdout) as ScreenJson;
    expect(Array.isArray(out.run.primaries), `primaries = ${JSON.stringify(out.run.primaries)}`).toBe(true);
  });
});

describe('keepclear screen: bad arguments exit 2 and touch no database', () => {
  const cases: [string, string[], RegExp][] = [
    ['both --primary and --all', ['--primary', '100001', '--all'], /exactly one of --primary/],
    ['neither --primary nor --all', [], /exactly one of --primary/],
    ['--days -1', ['--primary', '100001', '--days', '-1'], /--days must be/],
    ['--threshold-km abc', ['--primary', '100001', '--threshold-km', 'abc'], /--threshold-km must be/],
    ['unknown option', ['--primary', '100001', '--bogus', 'x'], /unknown option --bogus/],
    ['--volume-rtn-km 1,2', ['--primary', '100001', '--volume-rtn-km', '1,2'], /--volume-rtn-km needs three/],
    ['both volumes', ['--primary', '100001', '--threshold-km', '5', '--volume-rtn-km', '1,2,3'], /either --threshold-km or --volume-rtn-km/],
    ['--start tomorrow', ['--primary', '100001', '--start', 'tomorrow'], /--start must be an ISO 8601/],
    ['--start 07/12/2026', ['--primary', '100001', '--start', '07/12/2026'], /--start must be an ISO 8601/],
    ['--start 2026-02-30T00:00:00Z', ['--primary', '100001', '--start', '2026-02-30T00:00:00Z'], /--start must be an ISO 8601/],
    ['--workers -1', ['--primary', '100001', '--workers', '-1'], /--workers must be/],
    ['a stray argument', ['--primary', '100001', 'extra'], /unexpected argument "extra"/],
  ];
  const dbs = cases.map((_, k) => `never-${k}.db`);
  let results: Run[];
  beforeAll(async () => {
    results = await pooled(
      cases.map(([, args], k) => () => keepclearAsync(['screen', '--db', join(dir, dbs[k]!), ...args])),
      3,
    );
  });
  it.each(cases.map((c, k) => [...c, k] as const))('%s', (_name, _args, message, k) => {
    const res = results[k]!;
    expect(res.code, res.stderr).toBe(2);
    expect(res.stdout).toBe('');
    const lines = res.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^keepclear: /);
    expect(lines[0]).toMatch(message);
    expect(existsSync(join(dir, dbs[k]!))).toBe(false);
  });
});

describe('keepclear screen: failures exit 1', () => {
  it('an unknown primary is named, and no run is stored', () => {
    const db = join(dir, 'unknown-primary.db');
    const imp = keepclear(['import', fleetFile, catalogFile, '--db', db]);
    expect(imp.code, imp.stderr).toBe(0);
    const res = screen(db, ['--primary', '99999', '--json', '-'], false);
    expect(res.code).toBe(1);
    expect(res.stdout).toBe('');
    expect(res.stderr).toMatch(/^keepclear: .*primary 99999.*(import|check)/m);
    const d = openDatabase(db);
    try {
      expect(listRuns(d)).toEqual([]);
    } finally {
      d.close();
    }
  });

  it('an empty database says to import a catalogue first', () => {
    const res = screen(join(dir, 'empty.db'), ['--primary', '100001'], false);
    expect(res.code).toBe(1);
    expect(res.stderr).toMatch(/^keepclear: .*import/m);
  });
});
