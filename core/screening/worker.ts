import { expose } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { parentPort } from 'node:worker_threads';
import { unpackSets, type PackedSets } from './packedSets.js';
import { ScreeningChunk, type ChunkResult, type GridLayout, type SampledPrimary } from './chunk.js';
import type { WindowSettings } from './engine.js';

/** The screening worker's API, called through comlink from run.ts. */
export interface ScreeningWorkerApi {
  init(packed: PackedSets, settings: WindowSettings, control: SharedArrayBuffer, sampled: SampledPrimary[]): void;
  buildGrids(layout: { id: string; offset: number; count: number; stepMs: number }[], grids: SharedArrayBuffer): GridLayout[];
  attachGrids(layout: GridLayout[], grids: SharedArrayBuffer): void;
  screenShared(primaryIds: string[]): ChunkResult;
  screenAllPairs(part: number, parts: number): ChunkResult;
}

let chunk: ScreeningChunk | null = null;
const need = (): ScreeningChunk => {
  if (!chunk) throw new Error('screening worker used before init');
  return chunk;
};

const api: ScreeningWorkerApi = {
  init(packed, settings, control, sampled) {
    chunk = new ScreeningChunk(unpackSets(packed), settings, new Int32Array(control), sampled);
  },
  buildGrids: (layout, grids) => need().buildGrids(layout, new Float64Array(grids)),
  attachGrids: (layout, grids) => need().attachGrids(layout, new Float64Array(grids)),
  screenShared: (ids) => need().screenShared(ids),
  screenAllPairs: (part, parts) => need().screenAllPairs(part, parts),
};

expose(api, nodeEndpoint(parentPort!));
