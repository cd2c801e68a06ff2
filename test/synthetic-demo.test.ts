import { beforeAll, describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { buildDemoScenario, type DemoScenario } from '../core/synthetic/demo.js';
import { MS_PER_DAY, parseIso, type Instant } from '../core/time/instant.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../core/units.js';

/** Brief's acceptance: dense search finds the designed miss within 5 m and 1 s. */
const MISS_TOL_KM = 0.005;
const TCA_TOL_S = 1;
const SEARCH_HALF_WIDTH_S = 600;

/** Range between two trajectories at t, km. */
function rangeFn(a: Sgp4Trajectory, b: Sgp4Trajectory): (t: number) => number {
  const sa = new Float64Array(6), sb = new Float64Array(6);
  return (t) => {
    const fa = a.stateInto(t as Instant, sa, 0), fb = b.stateInto(t as Instant, sb, 0);
    if (fa || fb) throw new Error(`propagation failed: ${fa ?? fb}`);
    return Math.hypot(sa[0]! - sb[0]!, sa[1]! - sb[1]!, sa[2]! - sb[2]!);
  };
}

/** Brute force at 1 s steps, then golden-section search on the bracketing 2 s. */
function closestApproach(range: (t: number) => number, centre: number): { t: number; km: number } {
  let best = Infinity, bestT = centre;
  for (let s = -SEARCH_HALF_WIDTH_S; s <= SEARCH_HALF_WIDTH_S; s++) {
    const d = range(centre + s * 1000);
    if (d < best) { best = d; bestT = centre + s * 1000; }
  }
  let lo = bestT - 1000, hi = bestT + 1000;
  const g = (Math.sqrt(5) - 1) / 2;
  while (hi - lo > 1e-3) { // to a microsecond
    const m1 = hi - g * (hi - lo), m2 = lo + g * (hi - lo);
    if (range(m1) < range(m2)) hi = m2; else lo = m1;
  }
  const t = (lo + hi) / 2;
  return { t, km: range(t) };
}

const semiMajorAxisKm = (es: ElementSet): number => {
  const n = (es.meanMotionRevPerDay * 2 * Math.PI) / 86_400; // Kepler III with SGP4's WGS-72 μ
  return Math.cbrt(MU_EARTH_WGS72 / (n * n));
};
const perigeeAltKm = (es: ElementSet): number => semiMajorAxisKm(es) * (1 - es.eccentricity) - R_EARTH_WGS72;

describe('demo scenario', () => {
  let demo: DemoScenario;
  let byId: Map<string, ElementSet>;
  beforeAll(() => {
    demo = buildDemoScenario({ catalogSize: 300 });
    byId = new Map([...demo.fleet, ...demo.catalog].map((e) => [e.objectId, e]));
  });

  it('is the fixed demo week with an invented operator and five named spacecraft', () => {
    expect(demo.start).toBe(parseIso('2026-12-07T00:00:00.000Z'));
    expect(demo.end - demo.start).toBe(7 * MS_PER_DAY);
    expect(demo.operator.name.length).toBeGreaterThan(0);
    expect(demo.fleet).toHaveLength(5);
    for (const f of demo.fleet) {
      expect(f.name).toMatch(/\S/);
      expect(f.epoch).toBeLessThan(demo.start);
      expect(f.epoch).toBeGreaterThanOrEqual(demo.start - 2 * MS_PER_DAY);
    }
    const alts = demo.fleet.map((f) => semiMajorAxisKm(f) - R_EARTH_WGS72);
    expect(alts.filter((h) => h > 530 && h < 570)).toHaveLength(2); // the 550 km shell region
    expect(alts.filter((h) => h > 780 && h < 820)).toHaveLength(1);
  });

  it('catalogue excludes the fleet, includes the planted secondaries, epochs in the 2 days before', () => {
    const fleetIds = new Set(demo.fleet.map((f) => f.objectId));
    expect(demo.catalog.filter((e) => fleetIds.has(e.objectId))).toEqual([]);
    expect(new Set(demo.catalog.map((e) => e.objectId)).size).toBe(demo.catalog.length);
    for (const p of demo.planted) expect(demo.catalog.some((e) => e.objectId === p.secondary)).toBe(true);
    const stale = demo.catalog.filter((e) => e.epoch > demo.start || e.epoch < demo.start - 2 * MS_PER_DAY - 108);
    expect(stale.map((e) => e.objectId)).toEqual([]);
  });

  it('plants 6–10 encounters over the week with varied primaries, misses and geometry', () => {
    const p = demo.planted;
    expect(p.length).toBeGreaterThanOrEqual(6);
    expect(p.length).toBeLessThanOrEqual(10);
    expect(new Set(p.map((x) => x.primary)).size).toBe(5);
    const misses = p.map((x) => x.designedMissKm);
    expect(Math.min(...misses)).toBeLessThanOrEqual(0.05);
    expect(Math.max(...misses)).toBeGreaterThanOrEqual(4);
    const days = p.map((x) => Math.floor((x.tca - demo.start) / MS_PER_DAY));
    expect(new Set(days).size).toBeGreaterThanOrEqual(6); // spread over the week
    for (const x of p) {
      expect(x.tca).toBeGreaterThan(demo.start);
      expect(x.tca).toBeLessThan(demo.end);
    }
    expect(p.some((x) => x.approachAngleDeg > 160)).toBe(true); // head-on-ish
    expect(p.some((x) => Math.abs(x.approachAngleDeg - 90) < 5)).toBe(true); // crossing
    expect(p.some((x) => x.relativeSpeedKmS > 0.01 && x.relativeSpeedKmS < 0.1)).toBe(true); // slow overtaking
    expect(p.some((x) => x.geometry === 'fragment' && byId.get(x.secondary)!.bstar > 2e-4)).toBe(true);
  });

  it('each planted encounter is genuine: dense search finds the designed miss at the planted time', () => {
    for (const p of demo.planted) {
      const range = rangeFn(new Sgp4Trajectory(byId.get(p.primary)!), new Sgp4Trajectory(byId.get(p.secondary)!));
      const found = closestApproach(range, p.tca);
      expect(Math.abs(found.km - p.designedMissKm), `${p.secondary} miss`).toBeLessThan(MISS_TOL_KM);
      expect(Math.abs(found.t - p.tca) / 1000, `${p.secondary} time`).toBeLessThan(TCA_TOL_S);
    }
  });

  it('planted secondaries are physical orbits (perigee above 200 km) fitted about a day before the week', () => {
    for (const p of demo.planted) {
      const s = byId.get(p.secondary)!;
      expect(perigeeAltKm(s)).toBeGreaterThan(200);
      const ageDays = (demo.start - s.epoch) / MS_PER_DAY;
      expect(ageDays).toBeGreaterThan(0.5);
      expect(ageDays).toBeLessThan(1.5);
    }
  });

  it('fleet and planted secondaries propagate through the whole week', () => {
    const out = new Float64Array(6);
    for (const es of [...demo.fleet, ...demo.planted.map((p) => byId.get(p.secondary)!)]) {
      const tr = new Sgp4Trajectory(es);
      for (let t: number = demo.start; t <= demo.end; t += 3_600_000) expect(tr.stateInto(t as Instant, out, 0)).toBeNull();
    }
  });

  it('history: four older sets, 12–24 h apart, consistent with the newest to within OD-like errors', () => {
    // every fleet member and every designed secondary (Z0001 = 330001 on), planted this week or not
    const designed = demo.catalog.filter((e) => Number(e.objectId) >= 330_001).map((e) => e.objectId);
    expect(designed.length).toBeGreaterThanOrEqual(demo.planted.length);
    const ids = [...demo.fleet.map((f) => f.objectId), ...designed];
    expect(Object.keys(demo.history).sort()).toEqual([...ids].sort());
    const a = new Float64Array(6), b = new Float64Array(6);
    for (const id of ids) {
      const newest = byId.get(id)!;
      const older = demo.history[id]!;
      expect(older).toHaveLength(4);
      const epochs = [...older.map((e) => e.epoch), newest.epoch];
      for (let k = 1; k < epochs.length; k++) {
        const gapH = (epochs[k]! - epochs[k - 1]!) / 3_600_000;
        expect(gapH).toBeGreaterThan(12 - 1e-4);
        expect(gapH).toBeLessThan(24 + 1e-4);
      }
      const now = new Sgp4Trajectory(newest);
      for (const o of older) {
        expect(o.objectId).toBe(id);
        // At its own epoch an older set differs from the newest by the drawn OD error
        // (1σ 30/150/40 m R/T/N): nonzero, and under 1 km (≈ 6σ along-track).
        now.stateInto(o.epoch, b, 0);
        new Sgp4Trajectory(o).stateInto(o.epoch, a, 0);
        const atEpoch = Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!);
        expect(atEpoch).toBeGreaterThan(1e-4);
        expect(atEpoch).toBeLessThan(1);
        // Propagated to the newest epoch (≤ 4 days): grows, but stays at public-catalogue sizes.
        new Sgp4Trajectory(o).stateInto(newest.epoch, a, 0);
        now.stateInto(newest.epoch, b, 0);
        expect(Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!)).toBeLessThan(15);
      }
    }
  });

  it('is deterministic; the seed changes the catalogue but not the designed encounters', () => {
    const again = buildDemoScenario({ catalogSize: 300 });
    expect(JSON.stringify(again)).toBe(JSON.stringify(demo));
    const other = buildDemoScenario({ catalogSize: 300, seed: 2 });
    expect(JSON.stringify(other.catalog.slice(0, 300))).not.toBe(JSON.stringify(demo.catalog.slice(0, 300)));
    expect(other.planted.map((p) => [p.primary, p.tca, p.designedMissKm])).toEqual(
      demo.planted.map((p) => [p.primary, p.tca, p.designedMissKm]),
    );
  });

  it('refuses a catalogue whose numbers would reach the designed secondaries (Z0001 = 330001)', () => {
    // generated ids run from 110001: 200,000 objects end at 310000, 220,000 would pass 330000
    expect(() => buildDemoScenario({ catalogSize: 220_000 })).toThrow(/size/);
  });

  it('numbers every object in the Alpha-5 range, above any real catalogue number (≥ 100000)', () => {
    const ids = [...demo.fleet, ...demo.catalog].map((e) => Number(e.objectId));
    expect(Math.min(...ids)).toBeGreaterThanOrEqual(100_000);
    expect(Math.max(...ids)).toBeLessThanOrEqual(339_999); // Z9999, the last Alpha-5 number
    expect(demo.fleet.map((f) => f.objectId)).toEqual(['100001', '100002', '100003', '100004', '100005']);
  });
});
