/**
 * An owner ephemeris (OEM) as a Trajectory: TEME states interpolated as each segment's metadata
 * asks (interpolation.ts), inside the segments' usable windows only. Outside them `stateInto`
 * returns 'outside-ephemeris': an ephemeris is never extrapolated.
 *
 * Segments: where usable windows overlap, the segment later in the file is used (an owner
 * appends corrected or post-manoeuvre segments); two segments that share a boundary epoch (the
 * usual split at a manoeuvre) switch to the later one at that epoch.
 */
import type { OemCovariance, Oem, OemSegment } from '../formats/oem/model.js';
import { needsState, positionCovarianceRtnM2 } from '../formats/oem/covariance.js';
import type { Matrix } from '../math/linalg.js';
import { toIso, type Instant } from '../time/instant.js';
import { vec3, type Km, type KmS, type StateVector } from '../units.js';
import { MAX_WINDOW_NODES, nodesFor, WindowInterpolator } from './interpolation.js';
import type { FailureReason, Trajectory } from './trajectory.js';

/** One segment prepared for evaluation: node times in seconds from its first node. */
interface Prepared {
  readonly seg: OemSegment;
  readonly t0: number;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly n: number;
  /** Nodes per window. */
  readonly m: number;
  /** Last interval found: queries come in runs close in time. */
  hint: number;
}

/** A stretch of time served by one segment (closed; a later piece wins at a shared instant). */
interface Piece {
  readonly from: number;
  readonly to: number;
  readonly seg: number;
}

/** Covariance taken for the object's covariance at some time: which block, turned into RTN. */
export interface EphemerisCovariance {
  readonly epoch: Instant;
  /** 3×3 position covariance in the object's RTN frame at `epoch`, m². */
  readonly rtnM2: Matrix;
  /** COV_REF_FRAME as received. */
  readonly frameName: string;
  readonly file: string;
  readonly line: number;
  /** Says which block was used and that it was not propagated to the requested time. */
  readonly note: string;
}

/** The first stretch a screening window needs that the ephemeris does not cover. */
export interface CoverageGap {
  readonly from: Instant;
  readonly to: Instant;
  readonly file: string;
}

/** The error line for a gap: "FILE: ephemeris does not cover … to …". */
export const describeCoverageGap = (g: CoverageGap): string =>
  `${g.file}: ephemeris does not cover ${toIso(g.from)} to ${toIso(g.to)}`;

function prepare(seg: OemSegment): Prepared {
  const n = seg.epochs.length;
  const t0 = seg.epochs[0]!;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = (seg.epochs[i]! - t0) / 1000;
  const { method, degree } = seg.metadata.interpolation;
  return { seg, t0, x, y: seg.teme, n, m: Math.min(nodesFor(method, degree), n), hint: 0 };
}

/** Later segments overwrite earlier ones where their usable windows overlap. */
function piecesOf(segments: readonly OemSegment[]): Piece[] {
  let pieces: Piece[] = [];
  segments.forEach((s, k) => {
    const a = s.usable.start as number, b = s.usable.end as number;
    const kept: Piece[] = [];
    for (const p of pieces) {
      if (p.to <= a || p.from >= b) kept.push(p);
      else {
        if (p.from < a) kept.push({ from: p.from, to: a, seg: p.seg });
        if (p.to > b) kept.push({ from: b, to: p.to, seg: p.seg });
      }
    }
    kept.push({ from: a, to: b, seg: k });
    pieces = kept.sort((p, q) => p.from - q.from || p.seg - q.seg);
  });
  return pieces;
}

export class EphemerisTrajectory implements Trajectory {
  readonly objectId: string;
  readonly span: { readonly start: Instant; readonly end: Instant };
  readonly file: string;
  private readonly prepared: Prepared[];
  private readonly pieces: Piece[];
  private readonly interp = new WindowInterpolator(MAX_WINDOW_NODES);
  private pieceHint = 0;
  private readonly covariances: { readonly cov: OemCovariance; readonly seg: number }[];
  private readonly rtnCache = new Map<OemCovariance, Matrix>();

  /** `objectId` is the catalogue id the OEM was matched to (default: its OBJECT_ID). */
  constructor(readonly oem: Oem, objectId: string = oem.segments[0]!.metadata.objectId) {
    if (oem.segments.length === 0) throw new RangeError(`${oem.file}: an ephemeris needs at least one segment`);
    this.objectId = objectId;
    this.file = oem.file;
    this.prepared = oem.segments.map(prepare);
    this.pieces = piecesOf(oem.segments);
    this.span = { start: this.pieces[0]!.from as Instant, end: this.pieces.at(-1)!.to as Instant };
    this.covariances = oem.segments
      .flatMap((s, seg) => s.covariances.map((cov) => ({ cov, seg })))
      .sort((a, b) => a.cov.epoch - b.cov.epoch);
  }

  /** Usable stretches in time order, as served (overlaps resolved). */
  get windows(): readonly { readonly start: Instant; readonly end: Instant }[] {
    return this.pieces.map((p) => ({ start: p.from as Instant, end: p.to as Instant }));
  }

  /** Where one segment hands over to another (a manoeuvre split): the state need not be smooth there. */
  get breaks(): readonly Instant[] {
    return this.pieces.slice(1).map((p) => p.from as Instant);
  }

  /** Index of the piece serving t, or −1. */
  private pieceAt(t: number): number {
    const ps = this.pieces;
    let k = this.pieceHint;
    const p = ps[k]!;
    const next = ps[k + 1];
    if (!(p.from <= t && t <= p.to && (next === undefined || t < next.from))) {
      // Last piece with from ≤ t.
      let lo = 0, hi = ps.length - 1;
      if (t < ps[0]!.from) return -1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (ps[mid]!.from <= t) lo = mid;
        else hi = mid - 1;
      }
      k = lo;
      if (t > ps[k]!.to) return -1;
      this.pieceHint = k;
    }
    return k;
  }

  stateInto(t: Instant, out: Float64Array, offset: number): FailureReason | null {
    const k = this.pieceAt(t);
    if (k < 0) return 'outside-ephemeris';
    this.evaluate(this.prepared[this.pieces[k]!.seg]!, t, out, offset);
    return null;
  }

  /** Interpolates one segment at t (the caller has checked t lies within its nodes). */
  private evaluate(p: Prepared, t: number, out: Float64Array, off: number): void {
    const s = (t - p.t0) / 1000;
    const x = p.x;
    // Interval i with x[i] ≤ s < x[i+1] (the last interval includes the last node).
    let i = p.hint;
    if (!(x[i]! <= s && (s < x[i + 1]! || i === p.n - 2))) {
      let lo = 0, hi = p.n - 2;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (x[mid]! <= s) lo = mid;
        else hi = mid - 1;
      }
      i = lo;
      p.hint = i;
    }
    const method = p.seg.metadata.interpolation.method;
    if (method === 'LINEAR') {
      this.interp.linear(x, p.y, i, s, out, off);
      return;
    }
    const m = p.m;
    // Centred window: m/2 nodes each side for even m; for odd m the extra node on the nearer side
    // (so odd windows change at mid-interval, a step the size of the interpolation error).
    let first = m % 2 === 0 ? i + 1 - m / 2 : i - (m - 1) / 2 + (s - x[i]! > x[i + 1]! - s ? 1 : 0);
    if (first < 0) first = 0;
    if (first > p.n - m) first = p.n - m;
    if (method === 'LAGRANGE') this.interp.lagrange(x, p.y, first, m, s, out, off);
    else this.interp.hermite(x, p.y, first, m, s, out, off);
  }

  /** Convenience (allocating) form for non-hot paths. */
  stateAt(t: Instant): StateVector<'TEME'> | FailureReason {
    const buf = new Float64Array(6);
    const failure = this.stateInto(t, buf, 0);
    if (failure) return failure;
    return { r: vec3<'TEME', Km>(buf[0]!, buf[1]!, buf[2]!), v: vec3<'TEME', KmS>(buf[3]!, buf[4]!, buf[5]!) };
  }

  /**
   * The object's covariance for time t: the covariance block with the latest EPOCH at or before
   * t (in any segment), its position part turned into RTN with the object's state at that EPOCH.
   * It is not propagated to t; the note says so and how old it is. Null when no block precedes t.
   */
  covarianceRtnAt(t: Instant): EphemerisCovariance | null {
    let found: { readonly cov: OemCovariance; readonly seg: number } | undefined;
    for (const c of this.covariances) {
      if (c.cov.epoch > t) break;
      found = c;
    }
    if (!found) return null;
    const { cov, seg } = found;
    let rtnM2 = this.rtnCache.get(cov);
    if (!rtnM2) {
      let state: StateVector<'TEME'> | null = null;
      if (needsState(cov)) {
        const buf = new Float64Array(6);
        // load.ts keeps only blocks whose epoch lies within their segment's nodes.
        this.evaluate(this.prepared[seg]!, cov.epoch, buf, 0);
        state = { r: vec3<'TEME', Km>(buf[0]!, buf[1]!, buf[2]!), v: vec3<'TEME', KmS>(buf[3]!, buf[4]!, buf[5]!) };
      }
      rtnM2 = positionCovarianceRtnM2(cov, state);
      this.rtnCache.set(cov, rtnM2);
    }
    const ageH = (t - cov.epoch) / 3_600_000;
    return {
      epoch: cov.epoch, rtnM2, frameName: cov.frameName, file: this.file, line: cov.line,
      note:
        `covariance of EPOCH ${toIso(cov.epoch)} (${ageH.toFixed(2)} h before ${toIso(t)}) from ${this.file}:${cov.line}, ` +
        `received in ${cov.frameName}${cov.frame === 'RTN' ? '' : ' and rotated to RTN with the ephemeris state at that epoch'}; ` +
        'used as it is, not propagated to the requested time',
    };
  }
}

/**
 * The first part of [start, end] the ephemeris does not cover, or null when it covers all of it,
 * so screening can refuse with "FILE: ephemeris does not cover … to …" instead of extrapolating.
 */
export function coverageGap(traj: EphemerisTrajectory, start: Instant, end: Instant): CoverageGap | null {
  let cursor: number = start;
  for (const w of traj.windows) {
    if (w.end < cursor) continue;
    if (w.start > cursor) return { from: cursor as Instant, to: (Math.min(w.start, end) as Instant), file: traj.file };
    cursor = Math.max(cursor, w.end);
    if (cursor >= end) return null;
  }
  return cursor >= end ? null : { from: cursor as Instant, to: end, file: traj.file };
}
