/**
 * Shards of an all-vs-all run (`keepclear screen --all --shard K/N`): a deterministic partition
 * of the unordered pairs of objects, so every pair is screened in exactly one shard and the
 * union of the N shards is the unsharded run. A pair's shard depends only on the two object ids
 * (FNV-1a of each id, combined symmetrically and mixed), not on catalogue order or machine.
 */
export interface ShardSpec {
  /** 1-based shard number K */
  readonly index: number;
  /** number of shards N */
  readonly count: number;
}

export const shardText = (s: ShardSpec): string => `${s.index}/${s.count}`;

/** 32-bit FNV-1a of a string's UTF-16 code units. */
export function idHash(id: string): number {
  let h = 0x811c9dc5;
  for (let c = 0; c < id.length; c++) {
    h ^= id.charCodeAt(c);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** Shard (0-based) of the unordered pair with these id hashes, among `count` shards. */
export function pairShard(ha: number, hb: number, count: number): number {
  const lo = ha < hb ? ha : hb, hi = ha < hb ? hb : ha;
  // murmur3-style finaliser over the ordered pair: neighbouring ids spread over all shards.
  let h = Math.imul(lo ^ 0x9e3779b9, 0x85ebca6b) ^ hi;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  h ^= h >>> 16;
  return (h >>> 0) % count;
}

/** Pair filter over object indices for one shard (always true without sharding). */
export function pairFilter(ids: readonly string[], shard: ShardSpec | undefined): (i: number, j: number) => boolean {
  if (!shard || shard.count === 1) return () => true;
  const hashes = Uint32Array.from(ids, idHash);
  const want = shard.index - 1, n = shard.count;
  return (i, j) => pairShard(hashes[i]!, hashes[j]!, n) === want;
}
