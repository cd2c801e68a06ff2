/**
 * The benchmark's database: the demo fleet plus the seeded synthetic catalogue (30,000 objects
 * by default), stored once and cached under bench/cache/ (gitignored), named by size, seed and
 * schema version so a change of any of them builds a new one. Commands under test run on a copy
 * (`screen` stores a run, which must not grow the cache from one benchmark to the next).
 */
import { copyFileSync, existsSync, mkdirSync, renameSync, rmSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateCatalog } from '../core/synthetic/catalog.js';
import { buildFleet } from '../core/synthetic/demoFleet.js';
import type { ElementSet } from '../core/elements/elementSet.js';
import type { Instant } from '../core/time/instant.js';
import { catalogFingerprint, openDatabase, SCHEMA_VERSION, storeElementSets } from '../db/index.js';

export const BENCH_DIR = dirname(fileURLToPath(import.meta.url));
export const CACHE_DIR = join(BENCH_DIR, 'cache');
export const BENCH_START = Date.parse('2026-12-07T00:00:00.000Z') as Instant;
export const BENCH_SEED = 1;

/** Fleet and catalogue, in memory (the same sets the cached database holds). */
export function benchSets(size: number): { fleet: ElementSet[]; catalog: ElementSet[] } {
  return { fleet: buildFleet(BENCH_START), catalog: generateCatalog({ size, seed: BENCH_SEED, epoch: BENCH_START }) };
}

/** Path of the cached database of `size` generated objects (+ the fleet), built if missing. */
export function benchCatalogueDb(size: number): { path: string; built: boolean; buildMs: number } {
  const path = join(CACHE_DIR, `catalogue-${size}-seed${BENCH_SEED}-v${SCHEMA_VERSION}.db`);
  if (existsSync(path)) return { path, built: false, buildMs: 0 };
  const t0 = performance.now();
  mkdirSync(CACHE_DIR, { recursive: true });
  const tmp = `${path}.${process.pid}.tmp`;
  const { fleet, catalog } = benchSets(size);
  const db = openDatabase(tmp);
  try {
    storeElementSets(db, { path: 'bench:synthetic', sha256: `bench-${size}-${BENCH_SEED}`, format: 'SYNTHETIC' }, [...fleet, ...catalog], []);
    // As `keepclear import` leaves a catalogue (app/import/files.ts): its fingerprint kept.
    catalogFingerprint(db);
  } finally {
    db.close();
  }
  // Whole or nothing: a build that was interrupted never stands in for the cache.
  renameSync(tmp, path);
  return { path, built: true, buildMs: performance.now() - t0 };
}

/** A fresh copy of the cached database for one command. */
export function scratchCopy(path: string, tag: string): string {
  const dst = join(CACHE_DIR, `scratch-${process.pid}-${tag}.db`);
  copyFileSync(path, dst);
  process.once('exit', () => {
    for (const suffix of ['', '-wal', '-shm']) rmSync(dst + suffix, { force: true });
  });
  return dst;
}
