/**
 * EphemerisTrajectory's rules: never outside the usable windows (no extrapolation), gaps named
 * for screening, overlapping and adjacent segments, the default interpolation, and the object's
 * covariance turned into RTN. Expected values come from the closed-form two-body orbit
 * (test/support/twoBody.ts) and from RTN/TNW axes built here from their definitions (Keepclear
 * design notes: R = r/|r|, N = r×v/|r×v|, T = N×R; CCSDS 502.0-B-2 annex A: TNW has T along
 * the velocity, W along r×v).
 */
import { describe, expect, it } from 'vitest';
import { formatOemKvn, fullCovariance, parseOemFile, sampleOem, type Oem, type OemCovariance } from '../core/formats/oem/index.js';
import { gcrfToEme2000 } from '../core/frames/eme2000.js';
import { temeToGcrf } from '../core/frames/teme.js';
import { coverageGap, describeCoverageGap, EphemerisTrajectory } from '../core/propagation/ephemeris.js';
import { DEFAULT_INTERPOLATION } from '../core/propagation/interpolation.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import { vec3, type Km, type KmS } from '../core/units.js';
import { TwoBody, TwoBodyTrajectory } from './support/twoBody.js';

const T0 = Date.UTC(2026, 6, 1);
const MIN = 60_000;
const at = (minutes: number): Instant => instantFromMs(T0 + minutes * MIN);
const orbit = (raanDeg: number): TwoBody =>
  new TwoBody({ aKm: 6900, e: 0.002, iDeg: 53, raanDeg, argpDeg: 10, m0Deg: 0, t0: T0, mu: 398600.4418 });
const A = orbit(0), B = orbit(1);

/** Segments [from, to] in minutes, each sampled every minute from its own orbit. */
function ephemeris(spans: readonly [number, number, TwoBody][]): Oem {
  return sampleOem(
    spans.map(([from, to, body]) => ({ trajectory: new TwoBodyTrajectory('90004', body), start: at(from), end: at(to), stepS: 60 })),
    { objectName: 'TARNWELL-4', objectId: '90004', originator: 'TARNWELL ORBITAL', creationDate: at(-60), frame: 'TEME', file: 'tw4.oem' },
  );
}
const dist = (a: ArrayLike<number>, b: readonly number[]): number => Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!);
/** LAGRANGE 9 on 60-s LEO nodes is good to micrometres (test/oem-interpolation.test.ts); 1 mm tells the segments apart. */
const SAME_ORBIT_KM = 1e-6; // km

describe('usable windows', () => {
  const traj = new EphemerisTrajectory(ephemeris([[0, 30, A], [60, 90, A]]));
  const out = new Float64Array(6);
  it('gives states inside, "outside-ephemeris" before, after and in the gap — never extrapolates', () => {
    expect(traj.span).toEqual({ start: at(0), end: at(90) });
    for (const m of [0, 12.5, 30, 60, 75.25, 90]) expect(traj.stateInto(at(m), out, 0), `${m} min`).toBeNull();
    for (const m of [-0.001, 30.001, 45, 59.999, 90.001]) expect(traj.stateInto(at(m), out, 0), `${m} min`).toBe('outside-ephemeris');
  });
  it('honours USEABLE_START/STOP_TIME narrower than the data', () => {
    const oem = ephemeris([[0, 30, A]]);
    const seg = oem.segments[0]!;
    const narrowed: Oem = { ...oem, segments: [{ ...seg, usable: { start: at(5), end: at(25) } }] };
    const t = new EphemerisTrajectory(narrowed);
    expect(t.stateInto(at(4.99), out, 0)).toBe('outside-ephemeris');
    expect(t.stateInto(at(5), out, 0)).toBeNull();
    expect(t.stateInto(at(25.01), out, 0)).toBe('outside-ephemeris');
  });
  it('coverageGap names the first stretch of a window the ephemeris does not cover', () => {
    expect(coverageGap(traj, at(0), at(30))).toBeNull();
    expect(coverageGap(traj, at(10), at(80))).toEqual({ from: at(30), to: at(60), file: 'tw4.oem' });
    expect(coverageGap(traj, at(-10), at(20))).toEqual({ from: at(-10), to: at(0), file: 'tw4.oem' });
    expect(coverageGap(traj, at(70), at(100))).toEqual({ from: at(90), to: at(100), file: 'tw4.oem' });
    expect(describeCoverageGap(coverageGap(traj, at(10), at(80))!)).toBe(
      'tw4.oem: ephemeris does not cover 2026-07-01T00:30:00.000Z to 2026-07-01T01:00:00.000Z');
    const adjacent = new EphemerisTrajectory(ephemeris([[0, 30, A], [30, 60, B]]));
    expect(coverageGap(adjacent, at(0), at(60))).toBeNull();
  });
});

describe('segments', () => {
  const out = new Float64Array(6);
  it('where usable windows overlap, the later segment is used; the load says so', () => {
    const oem = ephemeris([[0, 60, A], [20, 40, B]]);
    const traj = new EphemerisTrajectory(oem);
    expect(dist((traj.stateInto(at(10.5), out, 0), out), A.state(T0 + 10.5 * MIN).r)).toBeLessThan(SAME_ORBIT_KM);
    expect(dist((traj.stateInto(at(30.5), out, 0), out), B.state(T0 + 30.5 * MIN).r)).toBeLessThan(SAME_ORBIT_KM);
    expect(dist((traj.stateInto(at(50.5), out, 0), out), A.state(T0 + 50.5 * MIN).r)).toBeLessThan(SAME_ORBIT_KM);
    // The orbits differ by 1° of node: ~120 km apart, so the checks above tell them apart.
    expect(dist(A.state(T0 + 30.5 * MIN).r, B.state(T0 + 30.5 * MIN).r)).toBeGreaterThan(50);
    const p = parseOemFile(formatOemKvn(oem), 'tw4.oem');
    expect(p.notes.some((n) => /overlaps the segment at line 5; where they overlap, the later segment in the file is used/.test(n.note))).toBe(true);
  });
  it('segments sharing an epoch (a manoeuvre) switch to the later one at that epoch', () => {
    const traj = new EphemerisTrajectory(ephemeris([[0, 30, A], [30, 60, B]]));
    traj.stateInto(at(30), out, 0);
    expect(dist(out, B.state(T0 + 30 * MIN).r)).toBeLessThan(SAME_ORBIT_KM);
    expect(dist(out.subarray(3), B.state(T0 + 30 * MIN).v)).toBeLessThan(1e-9);
    traj.stateInto(at(29.999), out, 0);
    expect(dist(out, A.state(T0 + 29.999 * MIN).r)).toBeLessThan(SAME_ORBIT_KM);
  });
  it('queries in any order give the same states as in time order (the search hints are only hints)', () => {
    const traj = new EphemerisTrajectory(ephemeris([[0, 30, A], [60, 90, B]]));
    const times = Array.from({ length: 200 }, (_, k) => (k * 37.3) % 90);
    const ordered = new EphemerisTrajectory(ephemeris([[0, 30, A], [60, 90, B]]));
    const a = new Float64Array(6), b = new Float64Array(6);
    for (const m of times) {
      const ra = traj.stateInto(at(m), a, 0);
      expect(ra).toBe(ordered.stateInto(at(m), b, 0));
      if (ra === null) expect([...a]).toEqual([...b]);
      ordered.stateInto(at(0), b, 0); // move the other one's hints away
    }
  });
});

describe('interpolation settled at load', () => {
  const kvn = (meta: string, states: number): string => [
    'CCSDS_OEM_VERS = 2.0', 'CREATION_DATE = 2026-07-01T00:00:00', 'ORIGINATOR = TARNWELL ORBITAL', 'META_START',
    'OBJECT_NAME = TARNWELL-4', 'OBJECT_ID = 90004', 'CENTER_NAME = EARTH', 'REF_FRAME = TEME', 'TIME_SYSTEM = UTC',
    'START_TIME = 2026-07-01T00:00:00', `STOP_TIME = 2026-07-01T00:${String(states - 1).padStart(2, '0')}:00`, meta, 'META_STOP',
    ...Array.from({ length: states }, (_, k) => {
      const s = A.state(T0 + k * MIN);
      return `2026-07-01T00:${String(k).padStart(2, '0')}:00 ${[...s.r, ...s.v].join(' ')}`;
    }),
  ].join('\n');

  it(`no INTERPOLATION: the default ${DEFAULT_INTERPOLATION.method} ${DEFAULT_INTERPOLATION.degree}, said in a note`, () => {
    expect(DEFAULT_INTERPOLATION).toEqual({ method: 'HERMITE', degree: 7 });
    const r = parseOemFile(kvn('COMMENT no interpolation named', 20), 'x.oem');
    expect(r.oem!.segments[0]!.metadata.interpolation).toEqual({ method: 'HERMITE', degree: 7, stated: false });
    expect(r.notes.map((n) => n.note)).toEqual(['no INTERPOLATION given: HERMITE of degree 7 is used (Keepclear\'s default method)']);
  });
  it('too few states for the degree: the degree is lowered, said in a note', () => {
    const r = parseOemFile(kvn('INTERPOLATION = LAGRANGE\nINTERPOLATION_DEGREE = 7', 4), 'x.oem');
    expect(r.oem!.segments[0]!.metadata.interpolation).toEqual({ method: 'LAGRANGE', degree: 3, stated: true });
    expect(r.notes[0]!.note).toBe('only 4 data lines: LAGRANGE degree 7 needs 8, so degree 3 is used');
  });
  it('a method Keepclear does not have is refused with the ones it has', () => {
    const r = parseOemFile(kvn('INTERPOLATION = SPLINE\nINTERPOLATION_DEGREE = 3', 10), 'x.oem');
    expect(r.oem).toBeNull();
    expect(r.rejections[1]).toMatchObject({ line: 12, code: 'OEM_UNSUPPORTED' });
    expect(r.rejections[1]!.reason).toMatch(/^INTERPOLATION = SPLINE is not supported: Keepclear interpolates HERMITE, LAGRANGE, LINEAR/);
  });
});

describe('the object\'s covariance from the OEM, in RTN (m²)', () => {
  const epoch = T0 + 10 * MIN;
  const truth = A.state(epoch);
  const unit = (a: readonly number[]): number[] => { const n = Math.hypot(a[0]!, a[1]!, a[2]!); return a.map((x) => x / n); };
  const cross = (a: readonly number[], b: readonly number[]): number[] =>
    [a[1]! * b[2]! - a[2]! * b[1]!, a[2]! * b[0]! - a[0]! * b[2]!, a[0]! * b[1]! - a[1]! * b[0]!];
  const R = unit(truth.r), N = unit(cross(truth.r, truth.v)), T = cross(N, R);
  /** σ (km) along R, T, N: 10 m, 100 m, 5 m. */
  const D = [1e-4, 1e-2, 2.5e-5];
  /** C = Σ_k D_k · e_k e_kᵀ for axes e_k given in the covariance's frame, as a 6×6 with a velocity block. */
  const covOf = (axes: number[][], d: number[], frameName: string, frame: OemCovariance['frame'], at: number): OemCovariance => {
    const c = fullCovariance(new Array(21).fill(0));
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) c[i]![j] = axes.reduce((s, e, k) => s + d[k]! * e[i]! * e[j]!, 0);
    for (let i = 3; i < 6; i++) c[i]![i] = 1e-8;
    return { epoch: instantFromMs(at), frameName, frame, matrix: c, comments: [], line: 7 };
  };
  const withCovariances = (covs: OemCovariance[]): EphemerisTrajectory => {
    const oem = ephemeris([[0, 60, A]]);
    return new EphemerisTrajectory({ ...oem, segments: [{ ...oem.segments[0]!, covariances: covs }] });
  };
  /** Rotations here are exact to double rounding: 1e-9 relative to the largest variance. */
  const close = (got: number[][], want: number[][]): void => {
    const scale = Math.max(...want.flat().map(Math.abs));
    got.forEach((row, i) => row.forEach((x, j) => expect(Math.abs(x - want[i]![j]!), `${i},${j}`).toBeLessThan(1e-9 * scale)));
  };
  const diagM2 = D.map((x, i) => D.map((_, j) => (i === j ? x * 1e6 : 0)));

  it('RTN as received, converted to m²', () => {
    const traj = withCovariances([covOf([[1, 0, 0], [0, 1, 0], [0, 0, 1]], D, 'RTN', 'RTN', epoch)]);
    close(traj.covarianceRtnAt(instantFromMs(epoch + 5 * MIN))!.rtnM2, diagM2);
  });
  it('TEME (the ephemeris frame): rotated with the state at the covariance epoch', () => {
    const traj = withCovariances([covOf([R, T, N], D, 'TEME', 'TEME', epoch)]);
    close(traj.covarianceRtnAt(instantFromMs(epoch))!.rtnM2, diagM2);
  });
  it('EME2000: rotated to TEME with core/frames, then to RTN', () => {
    const t = instantFromMs(epoch);
    const toEme = (v: number[]): number[] =>
      [...gcrfToEme2000(temeToGcrf({ r: vec3<'TEME', Km>(v[0]!, v[1]!, v[2]!), v: vec3<'TEME', KmS>(0, 0, 0) }, t)).r];
    const traj = withCovariances([covOf([toEme(R), toEme(T), toEme(N)], D, 'EME2000', 'EME2000', epoch)]);
    close(traj.covarianceRtnAt(t)!.rtnM2, diagM2);
  });
  it('TNW: turned by the flight-path angle γ about N', () => {
    // In RTN coordinates T_tnw = (sin γ, cos γ, 0), N_tnw = W × T_tnw = (−cos γ, sin γ, 0), W = N.
    const v = Math.hypot(...truth.v), r = Math.hypot(...truth.r);
    const sinG = (truth.r[0] * truth.v[0] + truth.r[1] * truth.v[1] + truth.r[2] * truth.v[2]) / (r * v);
    const cosG = Math.sqrt(1 - sinG * sinG);
    expect(Math.abs(sinG)).toBeGreaterThan(1e-4); // e = 0.002: a small but non-zero angle to get right
    const Dtnw = [1e-2, 1e-4, 2.5e-5]; // σ along T, N, W
    const cols = [[sinG, cosG, 0], [-cosG, sinG, 0], [0, 0, 1]];
    const want = [0, 1, 2].map((i) => [0, 1, 2].map((j) => 1e6 * cols.reduce((s, e, k) => s + Dtnw[k]! * e[i]! * e[j]!, 0)));
    const traj = withCovariances([covOf([[1, 0, 0], [0, 1, 0], [0, 0, 1]], Dtnw, 'TNW', 'TNW', epoch)]);
    close(traj.covarianceRtnAt(instantFromMs(epoch))!.rtnM2, want);
  });
  it('takes the latest covariance at or before t, and says it is not propagated', () => {
    const id = [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
    const traj = withCovariances([covOf(id, D, 'RTN', 'RTN', epoch), covOf(id, D.map((x) => 4 * x), 'RTN', 'RTN', epoch + 30 * MIN)]);
    expect(traj.covarianceRtnAt(instantFromMs(epoch - 1))).toBeNull();
    const first = traj.covarianceRtnAt(instantFromMs(epoch + 29 * MIN))!;
    expect(first.epoch).toBe(epoch);
    expect(first.note).toBe(
      'covariance of EPOCH 2026-07-01T00:10:00.000Z (0.48 h before 2026-07-01T00:39:00.000Z) from tw4.oem:7, received in RTN; ' +
      'used as it is, not propagated to the requested time');
    expect(traj.covarianceRtnAt(instantFromMs(epoch + 30 * MIN))!.rtnM2[1]![1]).toBeCloseTo(4 * D[1]! * 1e6, 6);
  });
});
