import { jday, type SatRec } from 'satellite.js';
import { days2mdhms } from '../../node_modules/satellite.js/dist/ext.js';
import type { OrbitElements } from '../elements/elementSet.js';
import { sgp4Into } from './sgp4Kernel.js';
import { Sgp4Record, sgp4InitRecord } from './sgp4InitKernel.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import type { FailureReason, MeanElementSource, Trajectory } from './trajectory.js';
import { vec3, type StateVector, type Km, type KmS } from '../units.js';

const MS_PER_MIN = 60_000;

/** satellite.js SatRecError codes (Vallado et al. 2006) to named reasons. */
const REASONS: Record<number, FailureReason> = {
  1: 'bad-mean-eccentricity',
  2: 'negative-mean-motion',
  3: 'bad-perturbed-eccentricity',
  4: 'negative-semi-latus-rectum',
  5: 'suborbital-epoch',
  6: 'decayed',
};

export const reasonForSgp4Code = (code: number): FailureReason => REASONS[code] ?? 'bad-elements';

/** Julian date of 1949 Dec 31 0h UTC, SGP4's "jan 0, 1950" epoch origin. */
const JD_1950 = 2433281.5;
/** 1e-8 day, the TLE epoch resolution. */
const TLE_EPOCH_STEP_DAY = 1e-8;
/** Day: 0.86 µs. An epoch this close to the 1e-8-day grid is taken to be a TLE epoch. */
const TLE_GRID_SNAP_DAY = 1e-11;
/** satellite.js constants.xpdotp: rev/day to rad/min. */
const XPDOTP = 1440 / (2 * Math.PI);
const DEG = Math.PI / 180;

/**
 * Day of year (1-based, fractional) as the TLE text states it. Recovering it from the Instant
 * leaves ~1e-13 day of float noise (305.4999999899998 for "305.49999999"), which can move the
 * reference's Julian-date rounding by one step (~40 µs, up to 3 mm on set 23333). Epochs within
 * 0.86 µs of the 1e-8-day grid snap to it; others (OMM epochs) are kept as they are.
 */
function referenceDayOfYear(epoch: Instant, year: number): number {
  const doy = (epoch - Date.UTC(year, 0, 1)) / MS_PER_DAY + 1;
  const onGrid = Math.round(doy / TLE_EPOCH_STEP_DAY) * TLE_EPOCH_STEP_DAY;
  return Math.abs(doy - onGrid) < TLE_GRID_SNAP_DAY ? Number(onGrid.toFixed(8)) : doy;
}

/**
 * Builds the SGP4 record of an element set.
 *
 * Why not satellite.js's json2satrec: it reads EPOCH through a JS Date, rounded to the
 * millisecond, while TLE epochs carry 1e-8 day. tsince is measured from the exact epoch either
 * way (Sgp4Trajectory below), but deep-space (SDP4) initialisation evaluates lunar/solar terms
 * and the resonance phase at the epoch, and these are sensitive: with the millisecond epoch the
 * published verification vectors (Vallado et al. 2006) were missed by up to 35 mm (set 23333,
 * e = 0.97, 13.7-day period; 20413: 5 mm). Even the exact epoch misses 23333 by 4 mm, because
 * the reference code computes the epoch as a Julian date in one double (days2mdhms + jday,
 * ~40 µs resolution) and SDP4 is evaluated at that rounded value. So the epoch handed to
 * sgp4init is built the same way as the reference (satellite.js's own days2mdhms and jday,
 * as its twoline2satrec does); every verification set then matches within 0.2 mm
 * (test/sgp4-verification.test.ts). Physically the difference is tens of microseconds.
 * The initialisation itself is sgp4InitKernel.ts (a port of sgp4init; deep space: sgp4init).
 * days2mdhms is not in the package's export map, so it is reached by file
 * path; opsmode 'i' and WGS-72 are the mode of the reference output.
 */
export function makeSatrec(es: OrbitElements): SatRec {
  const year = new Date(Math.floor(es.epoch)).getUTCFullYear();
  const epochdays = referenceDayOfYear(es.epoch, year);
  const { mon, day, hr, minute, sec } = days2mdhms(year, epochdays);
  const jdsatepoch = jday(year, mon, day, hr, minute, sec);
  // The record is filled as satellite.js's SatRecInit was; sgp4InitRecord then initialises it
  // (near-Earth: the fixed-shape port; deep space: satellite.js's sgp4init, see that file).
  const rec = new Sgp4Record();
  rec.satnum = String(Number.parseInt(es.objectId, 10) || 0);
  rec.epochyr = year % 100;
  rec.epochdays = epochdays;
  rec.ndot = es.meanMotionDot / (XPDOTP * 1440);
  rec.nddot = es.meanMotionDdot / (XPDOTP * 1440 * 1440);
  rec.bstar = es.bstar;
  rec.inclo = es.inclinationDeg * DEG;
  rec.nodeo = es.raanDeg * DEG;
  rec.ecco = es.eccentricity;
  rec.argpo = es.argPerigeeDeg * DEG;
  rec.mo = es.meanAnomalyDeg * DEG;
  rec.no = es.meanMotionRevPerDay / XPDOTP;
  rec.jdsatepoch = jdsatepoch;
  return sgp4InitRecord(rec, 'i', jdsatepoch - JD_1950);
}

/**
 * Elements outside SGP4's domain, named by the code SGP4 itself gives them. Checked before
 * trusting sgp4init because satellite.js returns NaN states with error 0 for eccentricity
 * exactly 1 or a negative mean motion (measured with satellite.js 7.1), while the reference
 * code (python-sgp4 2.15) refuses them outright.
 */
function domainFailure(es: OrbitElements): FailureReason | null {
  if (!(es.eccentricity >= 0 && es.eccentricity < 1)) return 'bad-mean-eccentricity';
  if (!(es.meanMotionRevPerDay > 0)) return 'negative-mean-motion';
  const fin = Number.isFinite; // written out: runs once per object of a run (no array)
  return fin(es.inclinationDeg) && fin(es.raanDeg) && fin(es.argPerigeeDeg) && fin(es.meanAnomalyDeg) && fin(es.bstar) && fin(es.epoch)
    ? null
    : 'bad-elements';
}

/** SGP4/SDP4 trajectory of one element set. Never throws: failures come back as reasons. */
export class Sgp4Trajectory implements Trajectory, MeanElementSource {
  readonly objectId: string;
  readonly span = null;
  readonly epoch: Instant;
  private rec: SatRec | null = null;
  private failure: FailureReason | null | undefined = undefined;

  constructor(readonly elements: OrbitElements) {
    this.objectId = elements.objectId;
    this.epoch = elements.epoch;
  }

  /** Its states are SGP4 of its element set: screening's mean-element filters apply. */
  get meanElementSource(): MeanElementSource {
    return this;
  }

  /** The SGP4 record, initialised on first use (most catalogue objects of a run never need it). */
  get satrec(): SatRec {
    if (!this.rec) {
      this.rec = makeSatrec(this.elements);
      this.failure ??= domainFailure(this.elements) ?? (this.rec.error ? reasonForSgp4Code(this.rec.error) : null);
    }
    return this.rec;
  }

  /** Set when the element set cannot even be initialised (e.g. eccentricity ≥ 1). */
  get initFailure(): FailureReason | null {
    if (this.failure === undefined) void this.satrec;
    return this.failure ?? null;
  }

  /** State at minutes from epoch, the propagator's native time argument. */
  stateAtMinutesInto(tsince: number, out: Float64Array, offset: number): FailureReason | null {
    const rec = this.rec ?? this.satrec;
    if (this.failure) return this.failure;
    // The non-allocating port of satellite.js's sgp4 (same doubles; see sgp4Kernel.ts).
    const code = sgp4Into(rec, tsince, out, offset);
    if (code !== 0) return reasonForSgp4Code(code);
    // NaN never compares equal to itself; a NaN state must not reach screening as a position.
    if (out[offset] !== out[offset] || out[offset + 3] !== out[offset + 3]) return 'bad-elements';
    return null;
  }

  stateInto(t: Instant, out: Float64Array, offset: number): FailureReason | null {
    return this.stateAtMinutesInto((t - this.epoch) / MS_PER_MIN, out, offset);
  }

  /** Convenience (allocating) form for non-hot paths. */
  stateAt(t: Instant): StateVector<'TEME'> | FailureReason {
    const buf = new Float64Array(6);
    const failure = this.stateInto(t, buf, 0);
    if (failure) return failure;
    return {
      r: vec3<'TEME', Km>(buf[0]!, buf[1]!, buf[2]!),
      v: vec3<'TEME', KmS>(buf[3]!, buf[4]!, buf[5]!),
    };
  }
}
