/**
 * An OEM as Keepclear uses it: only the segments it can use, times in UTC, states converted once
 * at load to TEME (the frame of screening), covariances kept as received with their frame (they
 * are turned into RTN on request, covariance.ts). The names the message used are kept so the
 * writer and the reports can say what was received.
 */
import type { Matrix } from '../../math/linalg.js';
import type { Instant } from '../../time/instant.js';
import type { OemCovarianceFrame, OemInterpolationMethod, OemStateFrame, OemTimeSystem } from './keywords.js';
import type { OemHeader } from './message.js';

export type { OemHeader };

declare const nodesBrand: unique symbol;
/** Packed TEME states, 6 per node: x y z (km), x_dot y_dot z_dot (km/s). */
export type TemeNodeStates = Float64Array & { readonly [nodesBrand]: 'TEME km, km/s' };

export interface OemInterpolation {
  readonly method: OemInterpolationMethod;
  /** Polynomial degree used (INTERPOLATION_DEGREE, or the default, capped: see core/propagation/interpolation.ts). */
  readonly degree: number;
  /** False when the message named no method or no degree and Keepclear's default filled it in. */
  readonly stated: boolean;
}

export interface OemMetadata {
  readonly objectName: string;
  /** OBJECT_ID as written (catalogue number or international designator: objectId.ts classifies it). */
  readonly objectId: string;
  /** Always EARTH: other centres are refused at load. */
  readonly centerName: 'EARTH';
  /** REF_FRAME as written, e.g. "ITRF2014"; the writer writes it back. */
  readonly refFrame: string;
  /** The frame core/frames converts from ("ICRF" → GCRF, "ITRF2014" → ITRF). */
  readonly stateFrame: OemStateFrame;
  readonly refFrameEpoch?: Instant;
  /** TIME_SYSTEM as received; every time in this model is already UTC. */
  readonly timeSystem: OemTimeSystem;
  readonly startTime: Instant;
  readonly stopTime: Instant;
  readonly useableStartTime?: Instant;
  readonly useableStopTime?: Instant;
  readonly interpolation: OemInterpolation;
  readonly comments: readonly string[];
}

export interface OemCovariance {
  readonly epoch: Instant;
  /** COV_REF_FRAME as written, or the segment's REF_FRAME when the block names none. */
  readonly frameName: string;
  readonly frame: OemCovarianceFrame;
  /** Full symmetric 6×6 in frameName: km² (position), km²/s (position × velocity), km²/s² (velocity). */
  readonly matrix: Matrix;
  readonly comments: readonly string[];
  readonly line: number;
}

export interface OemSegment {
  readonly metadata: OemMetadata;
  readonly dataComments: readonly string[];
  /** Node epochs, UTC ms, strictly increasing. */
  readonly epochs: Float64Array;
  readonly teme: TemeNodeStates;
  /** Source line of each node (for messages that name a line). */
  readonly nodeLines: Int32Array;
  /**
   * Where interpolation may be used: USEABLE_START/STOP_TIME (default START/STOP_TIME),
   * narrowed to the span of the data lines actually present.
   */
  readonly usable: { readonly start: Instant; readonly end: Instant };
  readonly covariances: readonly OemCovariance[];
  readonly line: number;
}

export interface Oem {
  /** The file name the message was read from (or will be written to), for error lines. */
  readonly file: string;
  readonly header: OemHeader;
  readonly segments: readonly OemSegment[];
}

/** A conversion or choice made while loading, said to the user as FILE:LINE: note. */
export interface OemNote {
  readonly file: string;
  readonly line: number;
  readonly note: string;
}
