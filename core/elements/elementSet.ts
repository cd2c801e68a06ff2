import type { Instant } from '../time/instant.js';

/** Where a record came from: the file and the 1-based line where the record starts. */
export interface SourceRef {
  readonly file: string;
  readonly line: number;
  readonly format: 'TLE' | 'OMM-KVN' | 'OMM-XML' | 'OMM-JSON' | 'OMM-CSV' | 'SYNTHETIC';
}

/**
 * One mean element set for SGP4/SDP4 (TLE or CCSDS OMM with MEAN_ELEMENT_THEORY = SGP4).
 * Field units follow the TLE/OMM conventions so a record round-trips without conversion loss.
 */
export interface ElementSet {
  /** Canonical object id: the catalogue number in decimal without leading zeros ("5", "100001"). */
  readonly objectId: string;
  readonly name: string | null;
  /** International designator as in OMM OBJECT_ID ("1958-002B"), when known. */
  readonly intlDesignator: string | null;
  readonly classification: string;
  readonly epoch: Instant;
  /** rev/day */
  readonly meanMotionRevPerDay: number;
  readonly eccentricity: number;
  readonly inclinationDeg: number;
  readonly raanDeg: number;
  readonly argPerigeeDeg: number;
  readonly meanAnomalyDeg: number;
  /** 1/earth radii */
  readonly bstar: number;
  /** first derivative of mean motion / 2, rev/day² (TLE line 1 field) */
  readonly meanMotionDot: number;
  /** second derivative of mean motion / 6, rev/day³ */
  readonly meanMotionDdot: number;
  readonly elementSetNo: number;
  readonly revAtEpoch: number;
  readonly ephemerisType: number;
  readonly source: SourceRef;
}

/**
 * What propagation and screening read of an element set: the object, its orbit and epoch. A
 * catalogue read for screening (db latestOrbits) leaves out the name, designator and source:
 * for 30,000 objects their strings were half the read's time (measured).
 */
export type OrbitElements = Omit<ElementSet, 'name' | 'intlDesignator' | 'source'>;

