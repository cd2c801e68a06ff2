/**
 * Screening of straight-line trajectories against encounters computed by hand.
 *
 * Reference (uniform relative motion, DESIGN.md "Screening requirements"; the closed form is the
 * one stated in core/propagation/straightLine.ts): with Δr, Δv the relative position and
 * velocity (secondary minus primary) at a reference time t_ref,
 *   TCA = t_ref − (Δr·Δv)/|Δv|²,   miss = |Δr + Δv·(TCA − t_ref)|,
 * and the sphere of radius R is entered and left at TCA ∓ √(R² − miss²)/|Δv|.
 * RTN of the primary (DESIGN.md "Time, frames, units"): R = r/|r|, N = (r×v)/|r×v|, T = N×R;
 * every primary here is at [7000, 0, 0] km moving along +y at TCA, so R = x̂, T = ŷ, N = ẑ there.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { StraightLineTrajectory } from '../core/propagation/straightLine.js';
import { ScreeningSession, type ScreeningObject } from '../core/screening/engine.js';
import type { ScreeningVolume } from '../core/screening/types.js';
import type { Encounter } from '../core/events/index.js';
import type { Instant } from '../core/time/instant.js';

type Vec = [number, number, number];

/** Requirement (DESIGN.md "Screening requirements"): TCA within 1 ms. */
const TCA_TOL_MS = 1;
/** Requirement (DESIGN.md): miss within 1 m; also used for each RTN component (same distance). */
const MISS_TOL_KM = 1e-3;
/** Entry/exit: the engine solves volume crossings to 1 ms (refine.ts ENTRY_TOL_S); hand value exact. */
const ENTRY_EXIT_TOL_MS = 1;
/** Relative speed is |v_s − v_p| of constant velocities: only rounding (km/s). */
const SPEED_TOL_KMS = 1e-9;
/** Angle between constant velocities: only rounding (deg). */
const ANGLE_TOL_DEG = 1e-6;
/** Orbit-like period handed to the engine: sizes its grid (13.5 s) and refinement step (60 s). */
const PERIOD_MIN = 90;

const START = Date.UTC(2026, 11, 3, 4, 5, 6, 789) as Instant;
const HOUR_MS = 3_600_000;

const add = (a: Vec, b: Vec): Vec => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
const sub = (a: Vec, b: Vec): Vec => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const scale = (a: Vec, k: number): Vec => [a[0] * k, a[1] * k, a[2] * k];
const dot = (a: Vec, b: Vec): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const norm = (a: Vec): number => Math.sqrt(dot(a, a));

/** Primary at TCA: realistic orbit radius so the RTN frame is defined. */
const P_AT_TCA: Vec = [7000, 0, 0];
const V_P: Vec = [0, 7.5, 0];

interface Pass {
  primary: ScreeningObject;
  secondary: ScreeningObject;
  /** hand values from the states at the window start */
  tcaMs: number;
  missKm: number;
  relSpeedKmS: number;
}

function lineObject(id: string, r0: Vec, v: Vec): ScreeningObject {
  return {
    id,
    trajectory: new StraightLineTrajectory(id, START, r0, v),
    epoch: START,
    periodMin: PERIOD_MIN,
    vMaxKmS: norm(v),
  };
}

/**
 * A pass designed by its geometry at the designed TCA (primary at P_AT_TCA moving V_P, the
 * secondary offset by `miss` (⟂ to Δv) moving vS), then written as straight lines from the
 * window start. The expected values are recomputed by hand from the start states.
 */
function pass(designTcaMs: number, missVec: Vec, vS: Vec): Pass {
  const dvDesign = sub(vS, V_P);
  // The design must put the miss vector perpendicular to the relative velocity.
  expect(Math.abs(dot(missVec, dvDesign))).toBeLessThan(1e-12);
  const dtS = (designTcaMs - START) / 1000;
  const rP0 = sub(P_AT_TCA, scale(V_P, dtS));
  const rS0 = sub(add(P_AT_TCA, missVec), scale(vS, dtS));
  const dr = sub(rS0, rP0), dv = sub(vS, V_P);
  const tcaS = -dot(dr, dv) / dot(dv, dv);
  const missKm = norm(add(dr, scale(dv, tcaS)));
  return {
    primary: lineObject('P', rP0, V_P),
    secondary: lineObject('S', rS0, vS),
    tcaMs: START + tcaS * 1000,
    missKm,
    relSpeedKmS: norm(dv),
  };
}

function screen(p: Pass, volume: ScreeningVolume, end: number = START + 2 * HOUR_MS): Encounter[] {
  const session = new ScreeningSession({ start: START, end: end as Instant, volume });
  const grid = session.grid(p.primary);
  expect(grid).not.toBeNull();
  const out = session.screenPair(p.primary, grid!, p.secondary);
  expect(session.flaggedList()).toEqual([]);
  return out;
}

const sphere = (radiusKm: number): ScreeningVolume => ({ kind: 'sphere', radiusKm });

/** Designed TCA off any grid or step boundary. */
const TCA_MID = START + 3600_123.4;

/** Worst differences from the hand values seen in this file (printed for the record). */
const worst = { tcaMs: 0, missKm: 0, entryExitMs: 0 };
afterAll(() => {
  console.log(
    `screening-straight-line worst vs hand: |ΔTCA| ${worst.tcaMs.toExponential(2)} ms, ` +
      `|Δmiss| ${(worst.missKm * 1e6).toExponential(2)} mm, |Δentry/exit| ${worst.entryExitMs.toExponential(2)} ms`,
  );
});
const noteEntryExit = (found: number, hand: number): void => {
  worst.entryExitMs = Math.max(worst.entryExitMs, Math.abs(found - hand));
};

function expectMatchesHand(e: Encounter, p: Pass): void {
  worst.tcaMs = Math.max(worst.tcaMs, Math.abs(e.tca - p.tcaMs));
  worst.missKm = Math.max(worst.missKm, Math.abs(e.missKm - p.missKm));
  expect(Math.abs(e.tca - p.tcaMs)).toBeLessThan(TCA_TOL_MS);
  expect(Math.abs(e.missKm - p.missKm)).toBeLessThan(MISS_TOL_KM);
  expect(Math.abs(e.relativeSpeedKmS - p.relSpeedKmS)).toBeLessThan(SPEED_TOL_KMS);
  expect(e.primary).toBe('P');
  expect(e.secondary).toBe('S');
  expect(e.atWindowEdge).toBeFalsy();
}

function expectRtn(e: Encounter, rtn: Vec): void {
  for (let c = 0; c < 3; c++) expect(Math.abs(e.rtnKm[c]! - rtn[c]!)).toBeLessThan(MISS_TOL_KM);
}

/** Sphere entry/exit by hand: TCA ∓ √(R² − miss²)/|Δv|. */
function expectSphereEntryExit(e: Encounter, p: Pass, radiusKm: number): void {
  const halfS = Math.sqrt(radiusKm ** 2 - p.missKm ** 2) / p.relSpeedKmS;
  expect(e.entry).not.toBeNull();
  expect(e.exit).not.toBeNull();
  noteEntryExit(e.entry!, p.tcaMs - halfS * 1000);
  noteEntryExit(e.exit!, p.tcaMs + halfS * 1000);
  expect(Math.abs(e.entry! - (p.tcaMs - halfS * 1000))).toBeLessThan(ENTRY_EXIT_TOL_MS);
  expect(Math.abs(e.exit! - (p.tcaMs + halfS * 1000))).toBeLessThan(ENTRY_EXIT_TOL_MS);
}

describe('straight-line passes in a sphere, against the closed form', () => {
  it('head-on: 15 km/s, miss 0.5 km, RTN (0.4, 0, 0.3) by construction', () => {
    const p = pass(TCA_MID, [0.4, 0, 0.3], [0, -7.5, 0]);
    expect(Math.abs(p.missKm - 0.5)).toBeLessThan(1e-9); // design check of the hand formula
    const found = screen(p, sphere(5));
    expect(found).toHaveLength(1);
    const e = found[0]!;
    expectMatchesHand(e, p);
    expectRtn(e, [0.4, 0, 0.3]);
    expect(Math.abs(e.approachAngleDeg - 180)).toBeLessThan(ANGLE_TOL_DEG);
    expectSphereEntryExit(e, p, 5);
  });

  it('head-on dead centre (miss 0): range-rate root still exact', () => {
    const p = pass(TCA_MID, [0, 0, 0], [0, -7.5, 0]);
    const found = screen(p, sphere(5));
    expect(found).toHaveLength(1);
    expectMatchesHand(found[0]!, p);
    expectSphereEntryExit(found[0]!, p, 5);
  });

  it('crossing at 90°: secondary along N, miss (1.2, 0.5, 0.5) ⟂ Δv', () => {
    const p = pass(TCA_MID, [1.2, 0.5, 0.5], [0, 0, 7.5]);
    const found = screen(p, sphere(5));
    expect(found).toHaveLength(1);
    const e = found[0]!;
    expectMatchesHand(e, p);
    expectRtn(e, [1.2, 0.5, 0.5]);
    expect(Math.abs(e.approachAngleDeg - 90)).toBeLessThan(ANGLE_TOL_DEG);
    expectSphereEntryExit(e, p, 5);
  });

  it('slow overtaking: 3 m/s along T, miss (2, 0, 0.5), inside the 5-km sphere for ~50 min', () => {
    const tca = START + 5400_123.4;
    const p = pass(tca, [2, 0, 0.5], [0, 7.503, 0]);
    expect(Math.abs(p.relSpeedKmS - 0.003)).toBeLessThan(1e-12);
    const found = screen(p, sphere(5), START + 3 * HOUR_MS);
    expect(found).toHaveLength(1);
    const e = found[0]!;
    expectMatchesHand(e, p);
    expectRtn(e, [2, 0, 0.5]);
    expect(e.approachAngleDeg).toBeLessThan(0.03); // atan(0.003/7.5) ≈ 0.023°
    // entry/exit ≈ TCA ∓ 1518.6 s
    expectSphereEntryExit(e, p, 5);
  });

  describe('grazing exactly at the boundary (R = 5 km)', () => {
    const R = 5;
    const MM = 1e-6; // 1 mm in km
    // Unit miss directions ⟂ to each geometry's Δv.
    const h = 0.8 / Math.SQRT2;
    for (const [name, vS, unit] of [
      ['fast crossing, 10.6 km/s', [0, 0, 7.5], [0.6, h, h]],
      ['slow overtaking, 3 m/s', [0, 7.503, 0], [0.6, 0, 0.8]],
    ] as [string, Vec, Vec][]) {
      it(`${name}: miss R − 1 mm is found`, () => {
        const p = pass(TCA_MID, scale(unit, R - MM), vS);
        expect(Math.abs(p.missKm - (R - MM))).toBeLessThan(1e-9);
        const found = screen(p, sphere(R));
        expect(found).toHaveLength(1);
        expectMatchesHand(found[0]!, p);
        expect(found[0]!.missKm).toBeLessThanOrEqual(R);
      });
      it(`${name}: miss R + 1 mm is not`, () => {
        const p = pass(TCA_MID, scale(unit, R + MM), vS);
        expect(Math.abs(p.missKm - (R + MM))).toBeLessThan(1e-9);
        expect(screen(p, sphere(R))).toEqual([]);
      });
    }
  });
});

describe('approaches at the window edges (TCA outside the window)', () => {
  // 50 m/s along T, miss 1 km along R; inside the 5-km sphere for ±√24/0.05 = ±97.98 s.
  const R = 5;
  const vS: Vec = [0, 7.55, 0];
  const missVec: Vec = [1, 0, 0];
  const END = START + 2 * HOUR_MS;

  it('TCA 60 s before the start, inside at the start: reported at the start edge', () => {
    const p = pass(START - 60_000, missVec, vS);
    const found = screen(p, sphere(R), END);
    expect(found).toHaveLength(1);
    const e = found[0]!;
    expect(e.atWindowEdge).toBe(true);
    expect(Math.abs(e.tca - START)).toBeLessThan(TCA_TOL_MS);
    // Distance at the start by hand: √(miss² + (|Δv|·60 s)²) = √(1 + 9) km.
    const atStart = Math.hypot(p.missKm, p.relSpeedKmS * (START - p.tcaMs) / 1000);
    expect(Math.abs(atStart - Math.sqrt(10))).toBeLessThan(1e-9);
    expect(Math.abs(e.missKm - atStart)).toBeLessThan(MISS_TOL_KM);
    expect(e.entry).toBeNull(); // already inside at the start
    const exit = p.tcaMs + (Math.sqrt(R * R - p.missKm ** 2) / p.relSpeedKmS) * 1000;
    expect(Math.abs(e.exit! - exit)).toBeLessThan(ENTRY_EXIT_TOL_MS);
  });

  it('TCA 60 s after the end, inside at the end: reported at the end edge', () => {
    const p = pass(END + 60_000, missVec, vS);
    const found = screen(p, sphere(R), END);
    expect(found).toHaveLength(1);
    const e = found[0]!;
    expect(e.atWindowEdge).toBe(true);
    expect(Math.abs(e.tca - END)).toBeLessThan(TCA_TOL_MS);
    const atEnd = Math.hypot(p.missKm, p.relSpeedKmS * (p.tcaMs - END) / 1000);
    expect(Math.abs(e.missKm - atEnd)).toBeLessThan(MISS_TOL_KM);
    expect(e.exit).toBeNull(); // still inside at the end
    const entry = p.tcaMs - (Math.sqrt(R * R - p.missKm ** 2) / p.relSpeedKmS) * 1000;
    expect(Math.abs(e.entry! - entry)).toBeLessThan(ENTRY_EXIT_TOL_MS);
  });

  it('TCA 0.3 s after the start / before the end: ordinary interior events, not edge events', () => {
    for (const tca of [START + 300, END - 300]) {
      const p = pass(tca, missVec, vS);
      const found = screen(p, sphere(R), END);
      expect(found).toHaveLength(1);
      expectMatchesHand(found[0]!, p);
    }
  });

  it('TCA 200 s before the start, already outside at the start (√101 km): nothing', () => {
    const p = pass(START - 200_000, missVec, vS);
    expect(screen(p, sphere(R), END)).toEqual([]);
  });

  it('TCA 200 s after the end, still outside at the end: nothing', () => {
    const p = pass(END + 200_000, missVec, vS);
    expect(screen(p, sphere(R), END)).toEqual([]);
  });
});

describe('RTN ellipsoid volume (semi-axes in the primary RTN frame)', () => {
  /*
   * Frame rotation: a straight-line primary at 7000 km moving 7.5 km/s turns its RTN frame by
   * θ ≈ 7.5·τ/7000 rad in τ seconds from TCA. Passes below last < 1 s, so θ < 1.1e-3 rad; the
   * R component picked up from an along-track offset ≤ 8 km is ≤ 9e-3 km, entering the metric
   * squared as ≤ 8e-5 — a timing shift ≤ 1e-5 s on the crossings, far below 1 ms.
   */
  it('inside the ellipsoid (R 1, T 10, N 2 km) but outside a sphere of the smallest semi-axis', () => {
    const vol: ScreeningVolume = { kind: 'rtn-ellipsoid', rKm: 1, tKm: 10, nKm: 2 };
    // Miss 6 km along T, relative motion 10 km/s along N: metric at TCA 6/10 = 0.6.
    const p = pass(TCA_MID, [0, 6, 0], [0, 7.5, 10]);
    const found = screen(p, vol);
    expect(found).toHaveLength(1);
    const e = found[0]!;
    expectMatchesHand(e, p);
    expectRtn(e, [0, 6, 0]);
    // Crossings: (6/10)² + (10τ/2)² = 1 → τ = ∓0.16 s.
    expect(Math.abs(e.entry! - (p.tcaMs - 160))).toBeLessThan(ENTRY_EXIT_TOL_MS);
    expect(Math.abs(e.exit! - (p.tcaMs + 160))).toBeLessThan(ENTRY_EXIT_TOL_MS);
    // The same pass is outside a sphere of the smallest semi-axis (1 km).
    expect(screen(p, sphere(1))).toEqual([]);
  });

  it('outside the ellipsoid though within its largest semi-axis: miss 3 km along R (rKm 1)', () => {
    const vol: ScreeningVolume = { kind: 'rtn-ellipsoid', rKm: 1, tKm: 10, nKm: 2 };
    const p = pass(TCA_MID, [3, 0, 0], [0, 7.5, 10]);
    expect(screen(p, vol)).toEqual([]);
    // The pass is real: a sphere of the largest semi-axis (10 km) reports it.
    const inSphere = screen(p, sphere(10));
    expect(inSphere).toHaveLength(1);
    expectMatchesHand(inSphere[0]!, p);
  });

  it('outside the ellipsoid along N: miss 3 km along N (nKm 2), relative motion along T', () => {
    const vol: ScreeningVolume = { kind: 'rtn-ellipsoid', rKm: 1, tKm: 10, nKm: 2 };
    const p = pass(TCA_MID, [0, 0, 3], [0, -2.5, 0]);
    expect(screen(p, vol)).toEqual([]);
    expect(screen(p, sphere(10))).toHaveLength(1);
  });

  it('the volume is crossed away from TCA: TCA point outside, reported with crossings by hand', () => {
    // R 1, T 10, N 1 km. Relative track in the T–N plane: (t, n) = (8 − u, u) km, u along the
    // track direction (0, −1, 1)/√2 times √2; closest to the primary at u = 4 → RTN (0, 4, 4),
    // miss 4√2 km, metric there √(0.16 + 16) > 1. But (8 − u)²/100 + u² = 1 ⇔ 101u² − 16u − 36 = 0
    // has roots u = (16 ± √14800)/202: the secondary enters and leaves the volume before TCA.
    const vol: ScreeningVolume = { kind: 'rtn-ellipsoid', rKm: 1, tKm: 10, nKm: 1 };
    const speed = 10;
    const dv: Vec = [0, -speed / Math.SQRT2, speed / Math.SQRT2];
    const p = pass(TCA_MID, [0, 4, 4], add(V_P, dv));
    expect(Math.abs(p.missKm - 4 * Math.SQRT2)).toBeLessThan(1e-9);
    const found = screen(p, vol);
    expect(found).toHaveLength(1);
    const e = found[0]!;
    expectMatchesHand(e, p);
    expectRtn(e, [0, 4, 4]);
    // Track parameter u advances by speed/√2 km per second: τ(u) = (u − 4)·√2/speed.
    const tau = (u: number): number => ((u - 4) * Math.SQRT2) / speed;
    const uIn = (16 - Math.sqrt(14800)) / 202, uOut = (16 + Math.sqrt(14800)) / 202;
    expect(Math.abs(e.entry! - (p.tcaMs + tau(uIn) * 1000))).toBeLessThan(ENTRY_EXIT_TOL_MS);
    expect(Math.abs(e.exit! - (p.tcaMs + tau(uOut) * 1000))).toBeLessThan(ENTRY_EXIT_TOL_MS);
    expect(e.exit!).toBeLessThan(e.tca);
  });
});
