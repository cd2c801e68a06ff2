/**
 * One block (1 h) of the all-vs-all spatial index on the seeded catalogue, in this thread:
 * sampling (SGP4 + Hermite tracks) and the broad phase timed apart, with the index counts.
 * For working on the index's inner loops (`node --import tsx bench/broadBlock.ts [SIZE] [BLOCKS]`).
 */
import { AllVsAllChunk, BLOCK_STEPS, INDEX_STEP_MS } from '../core/screening/spatial/chunk.js';
import type { Instant } from '../core/time/instant.js';
import { BENCH_START, benchSets } from './catalogueDb.js';

const size = Number(process.argv[2] ?? 30_000);
const blocks = Number(process.argv[3] ?? 2);
const { fleet, catalog } = benchSets(size);
const sets = [...fleet, ...catalog];
const win = { start: BENCH_START, end: (BENCH_START + 86_400_000) as Instant, volume: { kind: 'sphere' as const, radiusKm: 5 } };
const chunk = new AllVsAllChunk(sets, win, new Int32Array(new SharedArrayBuffer(8)));
for (let b = 0; b < blocks; b++) {
  const c0 = process.cpuUsage();
  const r = chunk.broad([b], [0]);
  const c = process.cpuUsage(c0);
  const s = r.stats;
  console.log(
    `block ${b}: ${((c.user + c.system) / 1e6).toFixed(2)} s CPU; ${s.steps} steps of ${INDEX_STEP_MS / 1000} s (${BLOCK_STEPS} per block), ` +
      `${(s.objectSteps / 1e6).toFixed(2)} M object-steps, ${(s.pairTests / 1e6).toFixed(1)} M pair tests, ${s.candidates} candidates, ` +
      `${(s.sgp4Evaluations / 1e6).toFixed(2)} M SGP4 samples`,
  );
}
