/**
 * Brute-force screening reference for tests (independent of the engine's filters and solver).
 *
 * Every object is evaluated once per sample (1 s by default) over the whole window; the
 * primaries' samples are kept and reused for every secondary. For each pair, the exact distance
 * is formed at every sample, and every sampled local minimum below
 *     R + v_rel,max · (sample / 2)
 * is refined. Why that threshold: the true minimum lies within half a sample of some sample,
 * and the distance changes no faster than the relative speed, so a minimum ≤ R leaves a sampled
 * minimum ≤ R + v_rel,max·sample/2 next to it. v_rel,max is bounded by the sum of the two
 * objects' largest sampled speeds plus SPEED_PAD_KMS.
 *
 * Refinement uses positions only:
 *  1. golden-section search of the distance on [t_{k−1}, t_{k+1}] (unimodal there for any
 *     physical pair: minima of one pair are minutes apart);
 *  2. the TCA is the stationary point of a least-squares quartic fitted to F(t) = |Δr(t)|²
 *     sampled every FIT_STEP_MS over ±FIT_HALF_WIDTH_MS around that point (fitted twice,
 *     re-centred). Why a fit: SGP4 positions carry ~µm of non-smooth rounding noise (GEO), so
 *     near a slow minimum (1 m/s) the distance alone is flat over ±0.3 s and a central
 *     difference of it wanders by ~1 ms with the step; the fit averages 161 samples.
 *     Why not the range rate Δr·Δv: SGP4's velocity output is not the time derivative of its
 *     position (measured |v − dr/dt| up to 2e-5 km/s LEO, 6e-5 GEO, 2e-3 GTO); its root is
 *     not the minimum of the distance (seconds to minutes off in slow encounters).
 *  3. a second fit over a different span (±FIT_CHECK_HALF_WIDTH_MS) gives the reference's own
 *     TCA uncertainty, returned with each event (tests assert it is far below 1 ms).
 * A stationary point outside the window means the window's minimum is on its edge: the event
 * is reported at that edge, with atEdge. Kept when the distance at the TCA is ≤ R.
 */
import type { Trajectory } from '../../core/propagation/trajectory.js';
import type { Instant } from '../../core/time/instant.js';
import type { Encounter } from '../../core/events/index.js';

/** Pad on the sampled speeds (km/s): speed changes by ≤ |a|·1 s ≈ 0.01 km/s between samples. */
const SPEED_PAD_KMS = 0.05;
/** Golden-section stop (s): only centres the fit. */
const GOLDEN_TOL_S = 1e-3;
/** Quartic fit of |Δr|²: ±20 s sampled every 0.25 s. Over 20 s an orbit turns ≤ 0.03 rad, so
 *  the fifth-order remainder is ~(0.03)⁵ of F: negligible (tested by FIT_CHECK below). */
const FIT_HALF_WIDTH_MS = 20_000;
const FIT_STEP_MS = 250;
/** Second, independent fit span for the uncertainty estimate. */
const FIT_CHECK_HALF_WIDTH_MS = 10_000;

export interface ReferenceEvent {
  readonly primary: string;
  readonly secondary: string;
  readonly tcaMs: number;
  readonly missKm: number;
  readonly atEdge: boolean;
  /** |TCA of the ±20 s fit − TCA of the ±10 s fit| (ms): the reference's own TCA uncertainty */
  readonly tcaUncertaintyMs: number;
}

export interface ReferenceResult {
  readonly events: ReferenceEvent[];
  /** propagator evaluations spent */
  readonly evaluations: number;
  /** sampled minima that were refined */
  readonly candidates: number;
}

class Failed extends Error {}

function stateAt(tr: Trajectory, t: number, out: Float64Array, off: number): void {
  const f = tr.stateInto(t as Instant, out, off);
  if (f) throw new Failed(`${tr.objectId}: ${f} at ${new Date(t).toISOString()}`);
}

/**
 * Reference events of each primary against every other object (each unordered pair once).
 * Window edges must be a whole number of samples apart.
 */
export function bruteForceEvents(
  primaries: readonly Trajectory[],
  objects: readonly Trajectory[],
  startMs: number,
  endMs: number,
  radiusKm: number,
  sampleMs = 1000,
): ReferenceResult {
  const n = (endMs - startMs) / sampleMs + 1;
  if (!Number.isInteger(n)) throw new Error('window must be a whole number of samples');
  const timeAt = (k: number): number => startMs + k * sampleMs;
  let evaluations = 0;
  let candidates = 0;

  // Primary samples: positions, kept; largest speed.
  const buf = new Float64Array(6);
  const prim = primaries.map((tr) => {
    const pos = new Float64Array(n * 3);
    let vMax = 0;
    for (let k = 0; k < n; k++) {
      stateAt(tr, timeAt(k), buf, 0);
      pos[k * 3] = buf[0]!;
      pos[k * 3 + 1] = buf[1]!;
      pos[k * 3 + 2] = buf[2]!;
      vMax = Math.max(vMax, Math.hypot(buf[3]!, buf[4]!, buf[5]!));
    }
    evaluations += n;
    return { tr, pos, vMax };
  });

  const primaryIndex = new Map(primaries.map((p, i) => [p.objectId, i]));
  const dist = prim.map(() => new Float64Array(n));
  const events: ReferenceEvent[] = [];
  const pair = new Float64Array(12);

  for (const s of objects) {
    // Secondaries for primary i: every object except primary i and primaries listed before it.
    const sIdx = primaryIndex.get(s.objectId);
    const active = prim.map((_, i) => sIdx === undefined || sIdx > i);
    if (!active.some(Boolean)) continue;
    let vMaxS = 0;
    for (let k = 0; k < n; k++) {
      stateAt(s, timeAt(k), buf, 0);
      vMaxS = Math.max(vMaxS, Math.hypot(buf[3]!, buf[4]!, buf[5]!));
      for (let i = 0; i < prim.length; i++) {
        if (!active[i]) continue;
        const p = prim[i]!.pos;
        dist[i]![k] = Math.hypot(buf[0]! - p[k * 3]!, buf[1]! - p[k * 3 + 1]!, buf[2]! - p[k * 3 + 2]!);
      }
    }
    evaluations += n;
    for (let i = 0; i < prim.length; i++) {
      if (!active[i]) continue;
      const P = prim[i]!;
      const d = dist[i]!;
      const threshold = radiusKm + (P.vMax + vMaxS + SPEED_PAD_KMS) * (sampleMs / 2000);
      for (let k = 0; k < n; k++) {
        const left = k > 0 ? d[k - 1]! : Infinity;
        const right = k < n - 1 ? d[k + 1]! : Infinity;
        if (!(d[k]! <= left && d[k]! < right && d[k]! < threshold)) continue;
        candidates++;
        const e = refine(P.tr, s, timeAt(Math.max(0, k - 1)), timeAt(Math.min(n - 1, k + 1)));
        if (e.missKm > radiusKm) continue;
        const dup = events.some(
          (x) => x.primary === e.primary && x.secondary === e.secondary && Math.abs(x.tcaMs - e.tcaMs) < 1,
        );
        if (!dup) events.push(e);
      }
    }
  }
  return { events, evaluations, candidates };

  function distance(p: Trajectory, s: Trajectory, t: number): number {
    evaluations += 2;
    stateAt(p, t, pair, 0);
    stateAt(s, t, pair, 6);
    return Math.hypot(pair[6]! - pair[0]!, pair[7]! - pair[1]!, pair[8]! - pair[2]!);
  }

  function refine(p: Trajectory, s: Trajectory, lo: number, hi: number): ReferenceEvent {
    const base = { primary: p.objectId, secondary: s.objectId };
    // 1. Golden section on the distance (times in seconds from lo).
    const f = (x: number): number => distance(p, s, lo + x * 1000);
    const g = (Math.sqrt(5) - 1) / 2;
    let a = 0, b = (hi - lo) / 1000;
    let c = b - g * (b - a), dd = a + g * (b - a);
    let fc = f(c), fd = f(dd);
    while (b - a > GOLDEN_TOL_S) {
      if (fc < fd) {
        b = dd; dd = c; fd = fc; c = b - g * (b - a); fc = f(c);
      } else {
        a = c; c = dd; fc = fd; dd = a + g * (b - a); fd = f(dd);
      }
    }
    const xGolden = lo + 0.5 * (a + b) * 1000;
    const F = (t: number): number => distance(p, s, t) ** 2;
    // A minimum on a window edge: |Δr|² opening at the start, closing at the end (slope of the
    // fitted quartic at the edge itself).
    const nearEdge = 2 * GOLDEN_TOL_S * 1000;
    if (lo === startMs && xGolden - lo < nearEdge && fitPolynomial(F, lo, FIT_HALF_WIDTH_MS, FIT_STEP_MS)[1]! > 0) {
      return { ...base, tcaMs: lo, missKm: distance(p, s, lo), atEdge: true, tcaUncertaintyMs: 0 };
    }
    if (hi === endMs && hi - xGolden < nearEdge && fitPolynomial(F, hi, FIT_HALF_WIDTH_MS, FIT_STEP_MS)[1]! < 0) {
      return { ...base, tcaMs: hi, missKm: distance(p, s, hi), atEdge: true, tcaUncertaintyMs: 0 };
    }
    // 2. Stationary point of a quartic fitted to |Δr|², twice (re-centred).
    const t1 = fitStationaryPoint(F, xGolden, FIT_HALF_WIDTH_MS, FIT_STEP_MS);
    const tca = fitStationaryPoint(F, t1, FIT_HALF_WIDTH_MS, FIT_STEP_MS);
    // 3. Own uncertainty from a different span.
    const tcaCheck = fitStationaryPoint(F, tca, FIT_CHECK_HALF_WIDTH_MS, FIT_STEP_MS);
    const tcaUncertaintyMs = Math.abs(tca - tcaCheck);
    if (tca < startMs) return { ...base, tcaMs: startMs, missKm: distance(p, s, startMs), atEdge: true, tcaUncertaintyMs };
    if (tca > endMs) return { ...base, tcaMs: endMs, missKm: distance(p, s, endMs), atEdge: true, tcaUncertaintyMs };
    return { ...base, tcaMs: tca, missKm: distance(p, s, tca), atEdge: false, tcaUncertaintyMs };
  }
}

/**
 * Least-squares polynomial (degree 4, in x = (t − c)/W ∈ [−1, 1]) through F(c + j·step) − F(c),
 * |j·step| ≤ W; coefficients from x⁰ up. Normal equations in the scaled variable are well
 * conditioned (~1e3) at degree 4.
 */
export function fitPolynomial(F: (t: number) => number, c: number, halfWidthMs: number, stepMs: number): number[] {
  const DEGREE = 4;
  const m = Math.round(halfWidthMs / stepMs);
  const n = DEGREE + 1;
  const A = Array.from({ length: n }, () => new Array<number>(n + 1).fill(0));
  const f0 = F(c);
  const pw = new Array<number>(n);
  for (let j = -m; j <= m; j++) {
    const x = j / m;
    const y = F(c + j * stepMs) - f0;
    pw[0] = 1;
    for (let i = 1; i < n; i++) pw[i] = pw[i - 1]! * x;
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < n; k++) A[i]![k]! += pw[i]! * pw[k]!;
      A[i]![n]! += pw[i]! * y;
    }
  }
  // Gauss–Jordan elimination with partial pivoting.
  for (let i = 0; i < n; i++) {
    let piv = i;
    for (let r = i + 1; r < n; r++) if (Math.abs(A[r]![i]!) > Math.abs(A[piv]![i]!)) piv = r;
    [A[i], A[piv]] = [A[piv]!, A[i]!];
    for (let r = 0; r < n; r++) {
      if (r === i) continue;
      const q = A[r]![i]! / A[i]![i]!;
      for (let k = i; k <= n; k++) A[r]![k]! -= q * A[i]![k]!;
    }
  }
  return A.map((row, i) => row[n]! / row[i]!);
}

/** Time of the stationary point of the fitted quartic nearest c (Newton from x = 0). */
export function fitStationaryPoint(F: (t: number) => number, c: number, halfWidthMs: number, stepMs: number): number {
  const coef = fitPolynomial(F, c, halfWidthMs, stepMs);
  const n = coef.length;
  const m = Math.round(halfWidthMs / stepMs);
  let x = 0;
  for (let it = 0; it < 60; it++) {
    let d1 = 0, d2 = 0;
    for (let i = 1; i < n; i++) d1 += i * coef[i]! * x ** (i - 1);
    for (let i = 2; i < n; i++) d2 += i * (i - 1) * coef[i]! * x ** (i - 2);
    const dx = d1 / d2;
    x -= dx;
    if (Math.abs(dx) < 1e-13) break;
  }
  return c + x * m * stepMs;
}

export interface Comparison {
  /** reference events with no engine encounter of the same pair within MATCH_WINDOW_MS */
  readonly missing: ReferenceEvent[];
  /** engine encounters matching no reference event */
  readonly extra: Encounter[];
  readonly matched: { ref: ReferenceEvent; found: Encounter }[];
  readonly worstTcaErrorMs: number;
  readonly worstMissErrorKm: number;
}

/** A reference event and an engine encounter are the same approach if within 1 s (then checked to 1 ms). */
export const MATCH_WINDOW_MS = 1000;

const samePair = (e: Encounter, r: ReferenceEvent): boolean =>
  (e.primary === r.primary && e.secondary === r.secondary) || (e.primary === r.secondary && e.secondary === r.primary);

export function compareToReference(found: readonly Encounter[], ref: readonly ReferenceEvent[]): Comparison {
  const used = new Set<number>();
  const missing: ReferenceEvent[] = [];
  const matched: { ref: ReferenceEvent; found: Encounter }[] = [];
  let worstTcaErrorMs = 0, worstMissErrorKm = 0;
  for (const r of ref) {
    let best = -1, bestDt = Infinity;
    found.forEach((e, j) => {
      if (used.has(j) || !samePair(e, r)) return;
      const dt = Math.abs(e.tca - r.tcaMs);
      if (dt < MATCH_WINDOW_MS && dt < bestDt) {
        best = j;
        bestDt = dt;
      }
    });
    if (best < 0) {
      missing.push(r);
      continue;
    }
    used.add(best);
    const e = found[best]!;
    matched.push({ ref: r, found: e });
    worstTcaErrorMs = Math.max(worstTcaErrorMs, bestDt);
    worstMissErrorKm = Math.max(worstMissErrorKm, Math.abs(e.missKm - r.missKm));
  }
  const extra = found.filter((_, j) => !used.has(j));
  return { missing, extra, matched, worstTcaErrorMs, worstMissErrorKm };
}

/** Short text of an event for failure messages. */
export const describeRef = (r: ReferenceEvent): string =>
  `${r.primary}–${r.secondary} at ${new Date(r.tcaMs).toISOString()} miss ${r.missKm.toFixed(4)} km${r.atEdge ? ' (edge)' : ''}`;
export const describeFound = (e: Encounter): string =>
  `${e.primary}–${e.secondary} at ${new Date(e.tca).toISOString()} miss ${e.missKm.toFixed(4)} km${e.atWindowEdge ? ' (edge)' : ''}`;
