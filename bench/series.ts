/**
 * Series linking speed: 10,000 events of a year of weekly runs and received messages, linked at
 * once and incrementally (run by run), then states and trends of every series. Goal (issue 7):
 * linking 10,000 events well under a second. Run alone: `npm run bench -- series`.
 */
import {
  linkSeries, newestDataTime, SeriesLinker, seriesStatus, seriesTrend,
  type ConjunctionEvent, type ScreeningCoverage, type SeriesMember, type StateArray,
} from '../core/events/index.js';
import { Rng } from '../core/synthetic/random.js';
import type { Instant } from '../core/time/instant.js';

const MU = 398600.8; // km³/s², WGS-72
const DAY = 86_400_000;
const START = Date.parse('2026-01-05T00:00:00.000Z');

/** A year of weekly runs (10-day windows) over 2,500 pairs; some sightings come as messages. */
export function syntheticYear(target = 10_000, seed = 7): { members: SeriesMember[]; runs: ScreeningCoverage[] } {
  const rng = new Rng(seed);
  const weeks = 52;
  const runs: ScreeningCoverage[] = Array.from({ length: weeks }, (_, w) => ({
    id: `R${w + 1}`, createdAt: (START + w * 7 * DAY) as Instant, start: (START + w * 7 * DAY) as Instant,
    end: (START + (w * 7 + 10) * DAY) as Instant, primaries: ['100001', '100002', '100003', '100004', '100005'],
  }));
  const members: SeriesMember[] = [];
  let n = 0, msg = 0;
  while (members.length < target) {
    const primary = `10000${1 + rng.int(5)}`;
    const secondary = String(110_001 + rng.int(30_000));
    const r = 6700 + rng.uniform(0, 800);
    const v = Math.sqrt(MU / r);
    const angle = rng.next() < 0.15 ? rng.uniform(0.05, 0.5) * (Math.PI / 180) : rng.uniform(10, 175) * (Math.PI / 180);
    const tca = START + rng.uniform(1, 360) * DAY;
    const missKm = rng.uniform(0.01, 5);
    const p: StateArray = [r, 0, 0, 0, v, 0];
    const s: StateArray = [r + missKm, 0, 0, 0, v * Math.cos(angle), v * Math.sin(angle)];
    // Seen by the runs whose window covers the TCA (1 or 2), sometimes by a message too.
    const sightings: { source: string; kind: 'screening' | 'cdm'; created: number }[] = [];
    for (const run of runs) if (run.start <= tca && tca <= run.end && rng.next() < 0.9) sightings.push({ source: run.id, kind: 'screening', created: run.createdAt });
    if (rng.next() < 0.2) sightings.push({ source: `M${++msg}`, kind: 'cdm', created: tca - rng.uniform(1, 5) * DAY });
    for (const sg of sightings) {
      const sigma = rng.next() < 0.7 ? rng.uniform(50, 3000) : null;
      const event: ConjunctionEvent = {
        id: `E${++n}`, runId: sg.source, primary, secondary, tca: (tca + rng.normal(0, 200)) as Instant, missKm,
        relativeSpeedKmS: 2 * v * Math.sin(angle / 2), rtnKm: [missKm, 0, 0], approachAngleDeg: (angle * 180) / Math.PI,
        entry: null, exit: null, primaryState: p, secondaryState: s,
        primaryEpoch: (sg.created - DAY) as Instant, secondaryEpoch: (sg.created - DAY) as Instant,
        risk: { pc: rng.next() * 1e-4, pcMethod: 'bench', covarianceSource: 'bench', hardBodyRadiusM: 10, tier: 'bench', warnings: [],
          ...(sigma !== null ? { detail: { primaryCovRtnM2: null, secondaryCovRtnM2: null, planeMissM: [missKm * 1000, 0], planeCovM2: null, sigmaAlongVelocityM: sigma } } : {}) },
      };
      members.push({ event, source: { id: sg.source, kind: sg.kind, createdAt: sg.created as Instant } });
    }
  }
  return { members: members.slice(0, target), runs };
}

export function benchSeries(): void {
  const { members, runs } = syntheticYear();
  // First call: what a one-shot command pays (JIT compilation included); then the median of 5.
  // CPU time too: on a shared machine it is the steadier figure.
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const series = linkSeries(members);
  const tCold = performance.now() - t0;
  const cpu = process.cpuUsage(c0);
  const cpuCold = (cpu.user + cpu.system) / 1000;
  const warm: number[] = [];
  for (let k = 0; k < 5; k++) {
    const t = performance.now();
    linkSeries(members);
    warm.push(performance.now() - t);
  }
  const tLink = warm.sort((a, b) => a - b)[2]!;

  const byRun = new Map<string, SeriesMember[]>();
  for (const m of [...members].sort((a, b) => a.source.createdAt - b.source.createdAt)) {
    const list = byRun.get(m.source.id) ?? [];
    list.push(m);
    byRun.set(m.source.id, list);
  }
  const t1 = performance.now();
  const linker = new SeriesLinker();
  for (const batch of byRun.values()) linker.add(batch);
  const tIncr = performance.now() - t1;

  const asOf = newestDataTime([...runs, ...members.map((m) => m.source)])!;
  const t2 = performance.now();
  const states = new Map<string, number>();
  for (const s of series) {
    const st = seriesStatus(s, runs, asOf).state;
    states.set(st, (states.get(st) ?? 0) + 1);
    seriesTrend(s);
  }
  const tState = performance.now() - t2;
  console.log(
    `series: ${members.length} events → ${series.length} series; linked at once in ${tCold.toFixed(0)} ms wall, ${cpuCold.toFixed(0)} ms CPU (first call; median of 5 more ${tLink.toFixed(0)} ms wall), ` +
      `run by run (${byRun.size} batches) in ${tIncr.toFixed(0)} ms (goal: well under 1 s); ` +
      `states and trends of all series in ${tState.toFixed(0)} ms (${[...states].map(([k, v]) => `${k} ${v}`).join(', ')})`,
  );
}

/**
 * The linking service (app/series.ts) on the same year, through SQLite: each run and message
 * stored as a run of its own (in data order, as they would arrive) and linked in its transaction;
 * then the whole year relinked at once (what a database from before schema v4 costs on first use).
 */
export async function benchSeriesService(): Promise<void> {
  const { openDatabase, createRun, finishRun, setRunDataAt, inTransaction } = await import('../db/index.js');
  const { linkRun, ensureLinked } = await import('../app/series.js');
  const { members, runs } = syntheticYear();
  const db = openDatabase(':memory:');
  const coverage = new Map(runs.map((r) => [r.id, r]));
  const bySource = new Map<string, SeriesMember[]>();
  for (const m of [...members].sort((a, b) => a.source.createdAt - b.source.createdAt)) {
    const list = bySource.get(m.source.id) ?? [];
    list.push(m);
    bySource.set(m.source.id, list);
  }
  let linkMs = 0;
  let linkCpuMs = 0;
  for (const [source, list] of bySource) {
    const run = coverage.get(source);
    const first = list[0]!;
    const settings = run
      ? { start: run.start, end: run.end, volume: { kind: 'sphere' as const, radiusKm: 5 }, primaries: [...(run.primaries as string[])] }
      : { start: first.event.tca, end: (first.event.tca + 1) as Instant, volume: { kind: 'sphere' as const, radiusKm: 5 }, primaries: [first.event.primary] };
    const id = createRun(db, settings, 'bench', 2, first.source.kind === 'cdm' ? 'cdm' : 'screening');
    setRunDataAt(db, id, first.source.createdAt);
    finishRun(db, id, { status: 'done', wallMs: 0, flagged: [], events: list.map((m) => m.event) });
    const c = process.cpuUsage();
    const t = performance.now();
    inTransaction(db, () => linkRun(db, id));
    linkMs += performance.now() - t;
    const u = process.cpuUsage(c);
    linkCpuMs += (u.user + u.system) / 1000;
  }
  db.sqlite.exec('UPDATE events SET series_id = NULL; DELETE FROM series;');
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const all = ensureLinked(db);
  const allMs = performance.now() - t0;
  const cpu = process.cpuUsage(c0);
  console.log(
    `series service (SQLite, in memory): ${members.length} events from ${bySource.size} runs and messages linked as they arrive in ` +
      `${linkMs.toFixed(0)} ms wall, ${linkCpuMs.toFixed(0)} ms CPU in all (${(linkMs / bySource.size).toFixed(2)} ms wall per run or message); ` +
      `relinked at once in ${allMs.toFixed(0)} ms wall, ${((cpu.user + cpu.system) / 1000).toFixed(0)} ms CPU (${all?.series.length ?? 0} series)`,
  );
  db.close();
}

if (import.meta.url === `file://${process.argv[1]}`) {
  benchSeries();
  await benchSeriesService();
}
