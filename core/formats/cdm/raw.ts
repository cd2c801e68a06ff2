/**
 * The shape both readers (KVN and XML) produce before any value is checked: keyword, value text,
 * unit text and line, already split into the message's sections. Keeping this step separate
 * means validation is written once and both syntaxes get the same checks and messages.
 */
import type { CdmBlock } from './keywords.js';

export interface RawEntry {
  readonly keyword: string;
  readonly value: string;
  /** Unit as written ([m] in KVN, units="m" in XML); undefined when none was given. */
  readonly unit: string | undefined;
  readonly line: number;
  /** Block the syntax put it in (XML containers); KVN leaves it to the keyword table. */
  readonly place?: CdmBlock;
}

/** Where a COMMENT belongs: a block, or (XML `<data>`) the object's data section as a whole. */
export type RawCommentPlace = CdmBlock | 'data';

export interface RawComment {
  readonly text: string;
  readonly place: RawCommentPlace;
  readonly line: number;
}

export interface RawSection {
  /** Line where the section starts (reported when a mandatory keyword is missing). */
  readonly startLine: number;
  readonly entries: RawEntry[];
  readonly comments: RawComment[];
}

export interface RawCdm {
  readonly header: RawSection;
  readonly relative: RawSection;
  /** In file order; a valid message has exactly OBJECT1 then OBJECT2. */
  readonly objects: RawSection[];
}

export const emptySection = (startLine: number): RawSection => ({ startLine, entries: [], comments: [] });
