import type { Instant } from '../time/instant.js';
import type { ShardSpec } from './spatial/shard.js';

/** Screening volume around the primary. */
export type ScreeningVolume =
  | { readonly kind: 'sphere'; readonly radiusKm: number }
  /** Ellipsoid with semi-axes along the primary's R, T, N directions at each instant. */
  | { readonly kind: 'rtn-ellipsoid'; readonly rKm: number; readonly tKm: number; readonly nKm: number };

/** Immutable settings of one screening run. */
export interface ScreeningSettings {
  readonly start: Instant;
  readonly end: Instant;
  readonly volume: ScreeningVolume;
  /** Object ids screened as primaries; 'all' for all-vs-all. */
  readonly primaries: readonly string[] | 'all';
  /** All-vs-all only: screen the K-th of N parts of the pairs (spatial/shard.ts). */
  readonly shard?: ShardSpec;
}

/** An object left out of a run, with the reason (propagation failure, bad elements, …). */
export interface FlaggedObject {
  readonly id: string;
  readonly reason: string;
}
