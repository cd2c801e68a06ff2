/**
 * All-vs-all benchmark (DESIGN.md "Performance targets"; issue 10 items 2 and 5): the whole
 * catalogue, never a subset scaled by N². Prints, from the same run:
 *  - the engine (runScreening in this process): wall time, events, peak memory (process RSS,
 *    worker threads included: they live in this process), index statistics;
 *  - the whole command as a user times it: `keepclear screen --all` on a database holding the
 *    catalogue (bin/keepclear.js, the compiled program), wall time and peak memory of that
 *    process (GNU time), events in its JSON;
 *  - the naive 60-s grid on the same inputs: every object propagated every minute and every pair's
 *    distance formed, measured on a sample of objects over one hour in this run and scaled
 *    (propagation ∝ N·steps, pair distances ∝ N²·steps);
 *  - the raw SGP4 rate (measured by the caller).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { runScreening } from '../core/screening/run.js';
import { quietParent } from './command.js';
import type { ElementSet } from '../core/elements/elementSet.js';
import type { Instant } from '../core/time/instant.js';

const ROOT = join(fileURLToPath(new URL('.', import.meta.url)), '..');
const DAY = 86_400_000;
const NAIVE_STEP_MS = 60_000;
/** Naive-grid sample: this many objects over one hour, then scaled. */
const NAIVE_SAMPLE_OBJECTS = 1500;
const NAIVE_SAMPLE_STEPS = 60;
const TARGET_S = 60;
const MEMORY_TARGET_MIB = 1536;

export interface NaiveGrid {
  /** seconds per object-step (SGP4) and per pair-step (distance), measured */
  readonly propagationS: number;
  readonly pairS: number;
}

/** Times the naive 60-s grid on a sample of the catalogue. */
export function measureNaiveGrid(sets: readonly ElementSet[], start: Instant): NaiveGrid {
  const n = Math.min(NAIVE_SAMPLE_OBJECTS, sets.length);
  const stride = Math.max(1, Math.floor(sets.length / n));
  const trs = Array.from({ length: n }, (_, k) => new Sgp4Trajectory(sets[k * stride]!));
  const pos = new Float64Array(n * 6);
  for (const tr of trs) tr.stateInto(start, pos, 0); // initialisation is not part of the grid
  let propMs = 0, pairMs = 0, close = 0;
  for (let k = 0; k < NAIVE_SAMPLE_STEPS; k++) {
    const t = (start + k * NAIVE_STEP_MS) as Instant;
    const a = performance.now();
    for (let i = 0; i < n; i++) trs[i]!.stateInto(t, pos, i * 6);
    const b = performance.now();
    for (let i = 0; i < n; i++) {
      const xi = pos[i * 6]!, yi = pos[i * 6 + 1]!, zi = pos[i * 6 + 2]!;
      for (let j = i + 1; j < n; j++) {
        const dx = pos[j * 6]! - xi, dy = pos[j * 6 + 1]! - yi, dz = pos[j * 6 + 2]! - zi;
        if (dx * dx + dy * dy + dz * dz < 2500) close++;
      }
    }
    pairMs += performance.now() - b;
    propMs += b - a;
  }
  if (close < 0) console.log(close);
  return {
    propagationS: propMs / 1000 / (n * NAIVE_SAMPLE_STEPS),
    pairS: pairMs / 1000 / (((n * (n - 1)) / 2) * NAIVE_SAMPLE_STEPS),
  };
}

/** Naive grid time (s, one core) for N objects over `days`. */
export const naiveSeconds = (g: NaiveGrid, objects: number, days: number): number => {
  const steps = (days * DAY) / NAIVE_STEP_MS;
  return g.propagationS * objects * steps + g.pairS * ((objects * (objects - 1)) / 2) * steps;
};

const mib = (bytes: number): string => `${(bytes / 2 ** 20).toFixed(0)} MiB`;

/** The engine in this process, with peak RSS sampled every 50 ms. */
async function engine(sets: readonly ElementSet[], start: Instant, days: number, workers: number) {
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 50);
  const t0 = performance.now();
  try {
    const r = await runScreening(sets, {
      start, end: (start + days * DAY) as Instant, volume: { kind: 'sphere', radiusKm: 5 }, primaries: 'all',
    }, { workers });
    return { r, wallS: (performance.now() - t0) / 1000, peak: Math.max(peak, process.memoryUsage().rss) };
  } finally {
    clearInterval(timer);
  }
}

/** `keepclear import` then `keepclear screen --all` as spawned processes, timed by GNU time. */
async function wholeCommand(sets: readonly ElementSet[], start: Instant, days: number) {
  const bin = join(ROOT, 'bin', 'keepclear.js');
  if (!existsSync(join(ROOT, 'dist', 'cli', 'main.js'))) return { skipped: 'dist/ is not built (npm run build:cli)' } as const;
  const dir = mkdtempSync(join(tmpdir(), 'keepclear-bench-all-'));
  try {
    const db = join(dir, 'bench.db'), cat = join(dir, 'catalogue.json'), out = join(dir, 'run.json');
    writeFileSync(cat, formatOmmJson(sets));
    const timed = (args: string[]) => {
      const r = spawnSync('/usr/bin/time', ['-f', '%e %M %U %S', process.execPath, bin, ...args], {
        encoding: 'utf8',
        maxBuffer: 1 << 26,
        // the command's phase timings (app/screen.ts onPhase) on stderr
        env: { ...process.env, KEEPCLEAR_PHASES: '1' },
      });
      const lines = r.stderr.trim().split('\n');
      const [wall, kb, user, sys] = (lines.pop() ?? '').split(' ').map(Number);
      if (r.status !== 0) throw new Error(`keepclear ${args[0]} failed (${r.status}): ${r.stderr.slice(-2000)}`);
      const phases = lines.filter((l) => l.startsWith('keepclear phase ')).map((l) => l.slice('keepclear phase '.length));
      return { wallS: wall!, peakBytes: kb! * 1024, cpuS: user! + sys!, phases };
    };
    await quietParent();
    const imp = timed(['import', cat, '--db', db]);
    await quietParent();
    const scr = timed(['screen', '--all', '--db', db, '--start', new Date(start).toISOString(), '--days', String(days), '--threshold-km', '5', '--json', out]);
    const events = (JSON.parse(readFileSync(out, 'utf8')) as { events: unknown[] }).events.length;
    return { imp, scr, events } as const;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** One all-vs-all case: engine, whole command, naive grid, printed. */
/** A row of the bench summary table. */
export interface AllVsAllRow {
  name: string;
  wallS: number;
  cpuS: number | null;
  targetS: number;
  peakRssMiB: number | null;
  events: number | null;
  naiveS: number | null;
}

export async function benchAllVsAll(label: string, sets: readonly ElementSet[], start: Instant, rate: number, workers: number, naive: NaiveGrid): Promise<AllVsAllRow[]> {
  const days = 1;
  const e = await engine(sets, start, days, workers);
  const naiveS = naiveSeconds(naive, sets.length, days);
  const s = e.r.stats;
  console.log(
    `${label}: engine ${e.wallS.toFixed(1)} s wall (target ≤ ${TARGET_S} s: ${e.wallS <= TARGET_S ? 'meets' : `misses by ${(e.wallS / TARGET_S).toFixed(1)}×`}), ` +
      `${e.r.encounters.length} events, ${e.r.flagged.length} flagged, peak rss ${mib(e.peak)} (target ≤ ${MEMORY_TARGET_MIB} MiB); ` +
      `index: ${s.steps} steps, ${(s.objectSteps! / 1e6).toFixed(1)} M object-steps, ${(s.pairTests! / 1e6).toFixed(1)} M pair tests, ` +
      `${s.candidates} candidates → ${s.refinedPairs} pairs refined; SGP4 samples ${(s.sgp4Evaluations! / 1e6).toFixed(1)} M`,
  );
  console.log(
    `  naive 60-s grid on the same inputs ≈ ${naiveS.toFixed(0)} s on one core (${(naiveS / workers).toFixed(0)} s on ${workers}; ` +
      `measured ${(naive.propagationS * 1e6).toFixed(2)} µs per SGP4 step, ${(naive.pairS * 1e9).toFixed(2)} ns per pair-step), ` +
      `${(naiveS / workers / e.wallS).toFixed(0)}× the engine; raw SGP4 ${(rate / 1e6).toFixed(2)} M/s on one core`,
  );
  const rows: AllVsAllRow[] = [
    { name: `${label}: engine`, wallS: e.wallS, cpuS: null, targetS: TARGET_S, peakRssMiB: e.peak / 2 ** 20, events: e.r.encounters.length, naiveS },
  ];
  // The engine's encounters go before the command is timed (this process should be idle then).
  e.r.encounters.length = 0;
  // BENCH_ENGINE_ONLY=1 skips the whole command (for 100,000 objects it stores ~1.5 M events).
  const w = process.env['BENCH_ENGINE_ONLY'] === '1' ? ({ skipped: 'BENCH_ENGINE_ONLY=1' } as const) : await wholeCommand(sets, start, days);
  if ('skipped' in w) console.log(`  whole command: skipped (${w.skipped})`);
  else {
    rows.push({ name: `${label}: keepclear screen --all`, wallS: w.scr.wallS, cpuS: w.scr.cpuS, targetS: TARGET_S, peakRssMiB: w.scr.peakBytes / 2 ** 20, events: w.events, naiveS });
    console.log(
      `  whole command: keepclear screen --all --days 1 ${w.scr.wallS.toFixed(1)} s wall, ${w.scr.cpuS.toFixed(1)} s CPU (all threads), peak ${mib(w.scr.peakBytes)}, ${w.events} events ` +
        `(import of the catalogue before it, not counted: ${w.imp.wallS.toFixed(1)} s, peak ${mib(w.imp.peakBytes)})`,
    );
    // Where the command's time goes (wall per phase; peak memory so far, worker threads included).
    for (const p of w.scr.phases) console.log(`    ${p}`);
  }
  return rows;
}
