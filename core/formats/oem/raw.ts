/**
 * What both OEM syntaxes (KVN and XML) produce before any value is checked: keywords, value
 * texts, units and lines, already split into header and segments. Validation (read.ts) is written
 * once against this shape, so both syntaxes get the same checks and the same messages.
 */

export interface RawEntry {
  readonly keyword: string;
  readonly value: string;
  readonly line: number;
}

/** One number (or the epoch) of a data or covariance line, with the unit written beside it. */
export interface RawValue {
  readonly text: string;
  /** As written ([km] in KVN, units="km" in XML); undefined when none. */
  readonly unit: string | undefined;
}

/** One ephemeris data line: the epoch then 6 (or 9, with accelerations) numbers. */
export interface RawState {
  readonly line: number;
  readonly epoch: string;
  readonly values: readonly RawValue[];
}

/** One covariance matrix: its keywords and the 21 lower-triangle terms, complete (the lexers check the count). */
export interface RawCovariance {
  readonly line: number;
  readonly entries: readonly RawEntry[];
  readonly terms: readonly RawValue[];
  readonly comments: readonly string[];
}

export interface RawSegment {
  /** Line of META_START (KVN) or <segment> (XML). */
  readonly line: number;
  readonly metadata: RawEntry[];
  readonly metadataComments: string[];
  readonly dataComments: string[];
  readonly states: RawState[];
  readonly covariances: RawCovariance[];
}

export interface RawOem {
  headerLine: number;
  readonly header: RawEntry[];
  readonly headerComments: string[];
  readonly segments: RawSegment[];
}

export const emptySegment = (line: number): RawSegment => ({
  line, metadata: [], metadataComments: [], dataComments: [], states: [], covariances: [],
});
