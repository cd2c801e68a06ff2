import type { Instant } from '../time/instant.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../units.js';
import type { ScreeningObject, WindowSettings } from './screeningObject.js';
import type { FlaggedObject } from './types.js';

/** The filter model and the validity probe cover this much past the window's end (ms). */
export const MODEL_MARGIN_MS = 3_600_000;
/** Resolution of the decay time found by bisection (ms). */
const VALIDITY_RESOLUTION_MS = 1000;

/** Objects left out of a run (or screened only part of it), first reason kept. */
export class Flags {
  readonly map = new Map<string, string>();
  flag(id: string, reason: string): void {
    if (!this.map.has(id)) this.map.set(id, reason);
  }
  list(): FlaggedObject[] {
    return [...this.map].map(([id, reason]) => ({ id, reason }));
  }
}

/**
 * Up to when each object propagates: most element sets are known safe from their elements
 * (cannotFailInWindow); the others are probed at the window start and every PROBE_STEP_MS to
 * the end; the first failing probe is narrowed to the first failure (firstFailure). Results are
 * kept per object for the run.
 */
export class ValidityProbe {
  private readonly validity = new Map<string, number | null>();
  private readonly probe = new Float64Array(6);

  constructor(private readonly settings: WindowSettings, private readonly flags: Flags) {}

  /**
   * The last instant (≤ end + model margin) up to which the object propagates without a break,
   * to VALIDITY_RESOLUTION_MS when it fails inside; null when it fails at the window start. An
   * object that decays inside the window is flagged and screened until then.
   */
  validUntil(o: ScreeningObject): number | null {
    const cached = this.validity.get(o.id);
    if (cached !== undefined) return cached;
    const { start, end } = this.settings;
    const tr = o.trajectory, buf = this.probe;
    const hi = end + MODEL_MARGIN_MS;
    if (cannotFailInWindow(o, hi - start)) {
      this.validity.set(o.id, hi);
      return hi;
    }
    let until: number | null = hi;
    const atStart = tr.stateInto(start, buf, 0);
    if (atStart) {
      this.flags.flag(o.id, `propagation failed: ${atStart} at the window start ${new Date(start).toISOString()}`);
      until = null;
    } else {
      for (let t = start + PROBE_STEP_MS; ; t += PROBE_STEP_MS) {
        const at = Math.min(t, hi);
        if (tr.stateInto(at as Instant, buf, 0)) {
          until = this.narrowTo(o, this.firstFailure(o, start, at));
          break;
        }
        if (at === hi) break;
      }
    }
    this.validity.set(o.id, until);
    return until;
  }

  /**
   * A failure found where the object is used, inside the span the probes passed (between two
   * probes; `at` is where it was seen, or the end of the span checked when not known): the span
   * is scanned from the window start for the first failure, and the object is screened up to
   * it from then on. Returns the (possibly shortened) valid span's end.
   */
  failureSeen(o: ScreeningObject, at?: number): number | null {
    const until = this.validUntil(o);
    if (until === null) return null;
    const first = this.firstFailure(o, this.settings.start, Math.min(at ?? until, until));
    if (!first) return until;
    const shorter = this.narrowTo(o, first);
    this.validity.set(o.id, shorter);
    return shorter;
  }

  private narrowTo(o: ScreeningObject, first: { lastValid: number; reason: string } | null): number {
    const hi = this.settings.end + MODEL_MARGIN_MS;
    if (!first) return hi;
    if (first.lastValid < this.settings.end) {
      this.flags.flag(o.id, `propagation fails (${first.reason}) after ${new Date(first.lastValid).toISOString()}; screened until then`);
    }
    return first.lastValid;
  }

  /**
   * The last valid instant before the first failure in (lo, last], or null if none is seen:
   * SGP4's failure is not monotonic in time (a decayed set can propagate again for an hour after
   * its first failure), so the span is scanned every SCAN_STEP_MS (and at `last`) for its first
   * failing instant, and only that last step is bisected. Runs only for objects seen to fail
   * inside the window (a few per catalogue).
   */
  private firstFailure(o: ScreeningObject, lo: number, last: number): { lastValid: number; reason: string } | null {
    const tr = o.trajectory, buf = this.probe;
    let up = NaN;
    for (let t = lo + SCAN_STEP_MS; ; t += SCAN_STEP_MS) {
      const at = Math.min(t, last);
      if (tr.stateInto(at as Instant, buf, 0)) {
        up = at;
        break;
      }
      if (at === last) return null;
      lo = at;
    }
    let reason = tr.stateInto(up as Instant, buf, 0) ?? 'failed';
    while (up - lo > VALIDITY_RESOLUTION_MS) {
      const mid = (lo + up) / 2;
      const f = tr.stateInto(mid as Instant, buf, 0);
      if (f) {
        up = mid;
        reason = f;
      } else lo = mid;
    }
    return { lastValid: lo, reason };
  }
}

/**
 * Spacing of the probes of an object that could fail (ms). A failure between two probes that
 * pass is not seen here; it surfaces where the object is used (the grid ends before it, a
 * refinement that meets it flags the object and keeps what it found), so the probes only need
 * to be cheap: 25 SGP4 calls per probed object and day (~200 of 30,000 objects are probed).
 */
const PROBE_STEP_MS = 3_600_000;
/**
 * Scan step to the first failure (ms): after decay SGP4 alternates between failing and valid
 * states (measured: 90101 of test/spatial-recall-decay.test.ts fails at 12.229 h, is valid again
 * from 12.275 h to 13.360 h); 10 s finds the first failing stretch of any such pattern seen,
 * at ≤ 9,000 SGP4 calls per decaying object.
 */
const SCAN_STEP_MS = 10_000;

/**
 * True for element sets that SGP4 propagates without error for this long: well-formed, perigee
 * high above the atmosphere, moderate drag and eccentricity. Their propagation is not probed up
 * front (saving an SGP4 initialisation for most of the catalogue); any failure still surfaces
 * where the object is used. Decay needs the perigee near the ground: at ≥ 300 km with
 * B* ≤ 0.01 the perigee falls far less than that within a few weeks (common practice: orbital
 * lifetimes at 300 km are weeks to months).
 */
function cannotFailInWindow(o: ScreeningObject, spanMs: number): boolean {
  const es = o.trajectory.meanElementSource?.elements;
  if (!es || spanMs > SAFE_SPAN_MS) return false;
  if (!(es.meanMotionRevPerDay > 0 && es.eccentricity >= 0 && es.eccentricity < SAFE_MAX_ECCENTRICITY)) return false;
  if (!(Math.abs(es.bstar) <= SAFE_MAX_BSTAR)) return false;
  // Written out, not as an array: this runs for every object of every run (no allocation).
  const fin = Number.isFinite;
  if (!(fin(es.inclinationDeg) && fin(es.raanDeg) && fin(es.argPerigeeDeg) && fin(es.meanAnomalyDeg) && fin(es.meanMotionDot))) return false;
  const nRadS = (es.meanMotionRevPerDay * 2 * Math.PI) / 86_400;
  const a = Math.cbrt(MU_EARTH_WGS72 / (nRadS * nRadS));
  return a * (1 - es.eccentricity) - R_EARTH_WGS72 >= SAFE_PERIGEE_ALT_KM;
}

const SAFE_PERIGEE_ALT_KM = 300;
const SAFE_MAX_BSTAR = 0.01;
const SAFE_MAX_ECCENTRICITY = 0.9;
const SAFE_SPAN_MS = 31 * 86_400_000;

