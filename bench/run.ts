/**
 * `npm run bench`: speed at catalogue scale (DESIGN.md "Performance targets", issue 10). Whole
 * commands are timed as a user runs them — `node bin/keepclear.js …` on the compiled program
 * (build it first: npm ci / npm run build:cli), on a copy of a cached database of the seeded
 * synthetic catalogue (bench/catalogueDb.ts, built once under bench/cache/) — and printed beside
 * the naive 60-s grid (measured on a sample in this run, scaled) and the raw SGP4 rate measured
 * in this run. Peak RSS is the command process's (worker threads included).
 *
 *   npm run bench                       all cases
 *   npm run bench -- one fleet          only the named cases (start, load, prepare, one, fleet,
 *                                       all, memory, series, world, ui3d)
 *   npm run bench -- all100k            all vs all on 100,000 objects (named only: it takes minutes)
 *   BENCH_SIZE=10000 npm run bench -- one
 *
 * On a shared machine wall times move with the load: the load average is printed with them.
 */
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import type { Instant } from '../core/time/instant.js';
import { runScreening } from '../core/screening/run.js';
import { packSets, unpackSets } from '../core/screening/packedSets.js';
import { newControl, ScreeningChunk } from '../core/screening/chunk.js';
import { openDatabase, readCatalogue } from '../db/index.js';
import { benchCatalogueDb, BENCH_START, benchSets, CACHE_DIR, scratchCopy } from './catalogueDb.js';
import { timeCommand } from './command.js';
import { naiveGridSeconds, sgp4Rate } from './naive.js';
import { benchDemoWorld } from './demoWorld.js';
import { benchSeries, benchSeriesService } from './series.js';
import { benchUi3d } from './ui3d.js';
import { benchAllVsAll, measureNaiveGrid } from './allVsAll.js';
import { generateCatalog } from '../core/synthetic/catalog.js';

const SIZE = Number(process.env.BENCH_SIZE ?? 30_000);
const DAY = 86_400_000;
const START_ISO = new Date(BENCH_START).toISOString();
const cases = process.argv.slice(2);
const want = (name: string) => cases.length === 0 || cases.includes(name);

/** One line of the closing table. */
interface Row {
  name: string;
  wallS: number;
  cpuS: number | null;
  targetS: number | null;
  peakRssMiB: number | null;
  events: number | null;
  naiveS: number | null;
  note?: string;
}
const rows: Row[] = [];
const load = () => loadavg().map((x) => x.toFixed(1)).join(' ');

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

async function main(): Promise<void> {
  if (want('series')) {
    benchSeries();
    await benchSeriesService();
  }
  if (want('world')) benchDemoWorld();
  if (want('ui3d')) await benchUi3d();
  if (cases.length > 0 && cases.every((c) => c === 'series' || c === 'world' || c === 'ui3d')) return;
  console.log(`Keepclear bench: synthetic catalogue of ${SIZE} objects (seed 1) + the demo fleet; ${availableParallelism()} core(s); node ${process.version}; load average ${load()}`);

  if (want('start')) {
    const runs = [];
    for (let k = 0; k < 5; k++) runs.push(await timeCommand(['--help'], `help${k}`));
    const w = median(runs.map((r) => r.wallS));
    console.log(`keepclear --help: median ${w.toFixed(3)} s wall of 5 (target ≤ 0.3 s; load ${load()})`);
    rows.push({ name: 'keepclear --help', wallS: w, cpuS: median(runs.map((r) => r.cpuS)), targetS: 0.3, peakRssMiB: median(runs.map((r) => r.peakRssMiB)), events: null, naiveS: null });
  }

  const db = benchCatalogueDb(SIZE);
  if (db.built) console.log(`built the benchmark database ${db.path} in ${(db.buildMs / 1000).toFixed(1)} s (cached from now on)`);
  const { fleet, catalog } = benchSets(SIZE);
  const sets = [...fleet, ...catalog];
  const rate = sgp4Rate(sets, BENCH_START);
  console.log(`raw SGP4 rate: ${(rate / 1e6).toFixed(2)} million evaluations/s on one core (this run)`);

  if (want('load') || want('prepare')) {
    const conn = openDatabase(db.path);
    const walls: number[] = [], cpus: number[] = [];
    // What `screen` reads (app/screen.ts): the latest orbits and their generation, one snapshot.
    let loaded = readCatalogue(conn).sets;
    for (let k = 0; k < 5; k++) {
      const c0 = process.cpuUsage(), t0 = performance.now();
      loaded = readCatalogue(conn).sets;
      walls.push((performance.now() - t0) / 1000);
      const c = process.cpuUsage(c0);
      cpus.push((c.user + c.system) / 1e6);
    }
    conn.close();
    if (want('load')) {
      console.log(`load ${loaded.length} element sets (readCatalogue): median ${median(walls).toFixed(3)} s wall, ${median(cpus).toFixed(3)} s CPU of 5 (target ≤ 0.3 s; load ${load()})`);
      rows.push({ name: `load ${loaded.length} element sets`, wallS: median(walls), cpuS: median(cpus), targetS: 0.3, peakRssMiB: null, events: null, naiveS: null });
    }
    if (want('prepare')) {
      // What a worker does before pair work: the sets' trip (pack, structured clone, unpack),
      // screening objects, and the propagation check of every object.
      const settings = { start: BENCH_START, end: (BENCH_START + 7 * DAY) as Instant, volume: { kind: 'sphere' as const, radiusKm: 5 } };
      const times: number[] = [], cpu: number[] = [];
      for (let k = 0; k < 3; k++) {
        const c0 = process.cpuUsage(), t0 = performance.now();
        const chunk = new ScreeningChunk(unpackSets(structuredClone(packSets(loaded))), settings, newControl());
        chunk.checkPropagation();
        times.push((performance.now() - t0) / 1000);
        const c = process.cpuUsage(c0);
        cpu.push((c.user + c.system) / 1e6);
      }
      console.log(`prepare ${loaded.length} sets for screening (pack, clone, unpack, objects, propagation check): median ${median(times).toFixed(3)} s wall, ${median(cpu).toFixed(3)} s CPU of 3 (target ≤ 0.3 s; load ${load()})`);
      rows.push({ name: `prepare ${loaded.length} sets`, wallS: median(times), cpuS: median(cpu), targetS: 0.3, peakRssMiB: null, events: null, naiveS: null });
    }
  }

  const screenCase = async (name: string, primaries: string[], days: number, target: number) => {
    const copy = scratchCopy(db.path, name.replace(/\W+/g, '-'));
    const out = join(CACHE_DIR, `out-${process.pid}.json`);
    const r = await timeCommand(
      ['screen', '--db', copy, '--primary', primaries.join(','), '--start', START_ISO, '--days', String(days), '--threshold-km', '5', '--json', out],
      name.replace(/\W+/g, '-'),
    );
    if (r.code !== 0) throw new Error(`${name}: exit ${r.code}\n${r.stderr}`);
    const naive = naiveGridSeconds(sets, primaries, BENCH_START, days);
    const verdict = r.wallS <= target ? 'meets' : `misses by ${(r.wallS / target).toFixed(1)}×`;
    console.log(
      `${name}: ${r.wallS.toFixed(2)} s wall, ${r.cpuS.toFixed(2)} s CPU (all threads) (target ≤ ${target} s, ${verdict}); ${r.events} events; peak RSS ${r.peakRssMiB.toFixed(0)} MiB; ` +
        `naive 60-s grid ≈ ${naive.toFixed(0)} s on one core (${(naive / r.wallS).toFixed(0)}× the command); load ${load()}`,
    );
    rows.push({ name, wallS: r.wallS, cpuS: r.cpuS, targetS: target, peakRssMiB: r.peakRssMiB, events: r.events, naiveS: naive });
  };
  const twenty = [...fleet.map((f) => f.objectId), ...catalog.filter((_, i) => i % 997 === 0).slice(0, 15).map((c) => c.objectId)];
  if (want('one')) await screenCase('screen 1 primary × 7 d, 5 km', [fleet[0]!.objectId], 7, 2);
  if (want('fleet')) await screenCase(`screen ${twenty.length} primaries × 7 d, 5 km`, twenty, 7, 8);

  if (want('all') || cases.includes('all100k')) {
    // The whole catalogue, all vs all over one day (bench/allVsAll.ts); 'all100k' (named only,
    // it takes minutes) does the same on a 100,000-object catalogue of the same generator.
    const workers = availableParallelism();
    const naive = measureNaiveGrid(sets, BENCH_START);
    if (want('all')) rows.push(...(await benchAllVsAll(`all vs all, ${sets.length} objects, 1 day, 5 km`, sets, BENCH_START, rate, workers, naive)));
    if (cases.includes('all100k')) {
      const big = [...fleet, ...generateCatalog({ size: 100_000, seed: 1, epoch: BENCH_START })];
      rows.push(...(await benchAllVsAll(`all vs all, ${big.length} objects, 1 day, 5 km`, big, BENCH_START, rate, workers, naive)));
    }
  }
  if (want('memory')) console.log(`bench process peak RSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MiB (target for a command ≤ 1536 MiB: see the table)`);

  if (rows.length > 0) {
    console.log(`\nSummary (raw SGP4 ${(rate / 1e6).toFixed(2)} M evaluations/s on one core; load average ${load()}):`);
    console.log('| case | wall (s) | CPU (s, all threads) | target wall (s) | peak RSS (MiB) | events | naive 60-s grid (s, 1 core) | naive ÷ wall |');
    console.log('|---|---|---|---|---|---|---|---|');
    for (const r of rows) {
      const f = (x: number | null, d = 2) => (x === null || Number.isNaN(x) ? '–' : x.toFixed(d));
      console.log(
        `| ${r.name}${r.note ? ` (${r.note})` : ''} | ${f(r.wallS, 3)} | ${f(r.cpuS, 3)} | ${f(r.targetS, 1)} | ${f(r.peakRssMiB, 0)} | ${r.events ?? '–'} | ${f(r.naiveS, 0)} | ${r.naiveS ? (r.naiveS / r.wallS).toFixed(0) : '–'} |`,
      );
    }
  }
}

await main();
