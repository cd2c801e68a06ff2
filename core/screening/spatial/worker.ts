import { expose, transfer } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { parentPort } from 'node:worker_threads';
import { unpackSets, type PackedSets } from '../packedSets.js';
import type { ChunkResult } from '../chunk.js';
import type { WindowSettings } from '../engine.js';
import { AllVsAllChunk, type BroadResult } from './chunk.js';
import type { PairRegions } from './candidates.js';
import type { ShardSpec } from './shard.js';

/** The all-vs-all worker's API, called through comlink from runAllVsAll.ts. */
export interface AllVsAllWorkerApi {
  /** returns each object's role (AllVsAllChunk.role) */
  init(packed: PackedSets, settings: WindowSettings, control: SharedArrayBuffer, shard: ShardSpec | null): Uint8Array;
  broad(blocks: number[], units: number[]): BroadResult;
  refine(pairs: PairRegions, units: number): ChunkResult;
  screenPairwise(objects: number[], all: number[]): ChunkResult;
}

let chunk: AllVsAllChunk | null = null;
const need = (): AllVsAllChunk => {
  if (!chunk) throw new Error('all-vs-all worker used before init');
  return chunk;
};

const api: AllVsAllWorkerApi = {
  init(packed, settings, control, shard) {
    chunk = new AllVsAllChunk(unpackSets(packed), settings, new Int32Array(control), shard ?? undefined);
    return chunk.role;
  },
  broad(blocks, units) {
    const r = need().broad(blocks, units);
    // The candidate arrays move to the main thread instead of being copied.
    return transfer(r, [r.candidates.i.buffer, r.candidates.j.buffer, r.candidates.k.buffer]);
  },
  refine: (pairs, units) => need().refine(pairs, units),
  screenPairwise: (objects, all) => need().screenPairwise(objects, all),
};

expose(api, nodeEndpoint(parentPort!));
