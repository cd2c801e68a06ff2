/**
 * An OEM as the message states it (CCSDS 502.0-B-2 §5), after the standard's checks and before
 * Keepclear converts anything: frames and time systems are the names written, times are readings
 * on the segment's TIME_SYSTEM, states are in REF_FRAME. load.ts turns this into the `Oem` model
 * (UTC, TEME) or says why a segment cannot be used. Kept apart so a message Keepclear cannot use
 * (e.g. the standard's own Mars-centred example) can still be read and checked field by field.
 */
import type { Instant } from '../../time/instant.js';

declare const scaleBrand: unique symbol;
/**
 * A calendar time as written, counted in ms like an Instant but on the segment's own time scale
 * (UTC, TAI, TT, GPS …): not an Instant until converted (timeSystems.ts).
 */
export type ScaleTime = number & { readonly [scaleBrand]: 'ms on the message time scale' };

export interface OemHeader {
  /** CCSDS_OEM_VERS as written: 1.0, 2.0 or 3.0. */
  readonly version: string;
  /** CREATION_DATE (UTC by the standard). */
  readonly creationDate: Instant;
  readonly originator: string;
  readonly messageId?: string;
  readonly comments: readonly string[];
  /** Line of CCSDS_OEM_VERS (KVN) or <oem> (XML). */
  readonly line: number;
}

export interface OemMessageMetadata {
  readonly objectName: string;
  readonly objectId: string;
  readonly centerName: string;
  readonly refFrame: string;
  readonly refFrameEpoch?: ScaleTime;
  readonly timeSystem: string;
  readonly startTime: ScaleTime;
  readonly useableStartTime?: ScaleTime;
  readonly useableStopTime?: ScaleTime;
  readonly stopTime: ScaleTime;
  readonly interpolation?: string;
  readonly interpolationDegree?: number;
  readonly comments: readonly string[];
  /** Keyword → 1-based source line. */
  readonly lines: Readonly<Record<string, number>>;
}

/** One data line: km, km/s, and km/s² when the line has accelerations. */
export interface OemMessageState {
  readonly epoch: ScaleTime;
  readonly r: readonly [number, number, number];
  readonly v: readonly [number, number, number];
  readonly a?: readonly [number, number, number];
  readonly line: number;
}

export interface OemMessageCovariance {
  readonly epoch: ScaleTime;
  /** COV_REF_FRAME as written; undefined means the segment's REF_FRAME (502.0-B-2). */
  readonly covRefFrame?: string;
  /** The 21 lower-triangle terms row by row: km², km²/s, km²/s². */
  readonly lowerTriangle: readonly number[];
  readonly comments: readonly string[];
  readonly line: number;
}

export interface OemMessageSegment {
  readonly metadata: OemMessageMetadata;
  readonly dataComments: readonly string[];
  /** Epochs strictly increasing (lines that broke the order were rejected). */
  readonly states: readonly OemMessageState[];
  readonly covariances: readonly OemMessageCovariance[];
  readonly line: number;
}

export interface OemMessage {
  readonly header: OemHeader;
  readonly segments: readonly OemMessageSegment[];
}
