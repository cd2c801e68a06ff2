import type { Instant } from '../../time/instant.js';
import type { Draft } from '../draft.js';
import type { Rng } from '../random.js';

/** What every population family receives: the reference time and the oldest element-set age. */
export interface FamilyContext {
  readonly epoch: Instant;
  readonly maxAgeDays: number;
}

export type Family = (rng: Rng, count: number, ctx: FamilyContext) => Draft[];

export const DEG = Math.PI / 180;
