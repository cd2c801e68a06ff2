import { defineCommand } from '../command.js';
import { allEventsOption, numberIn, workersOption } from '../options.js';

const DEFAULT_DIR = 'keepclear-demo';
const DEMO_DB = 'keepclear-demo.db';
const REPORT_DIR = 'report';
/** The summary lists this many events needing attention; the report lists them all. */
const DEMO_SUMMARY_ROWS = 10;

interface DemoOptions {
  out?: string;
  size?: number;
  workers?: number;
  allEvents?: boolean;
}

/**
 * `keepclear demo [--out DIR]`: the invented operator's three weeks (core/synthetic/demoWeeks.ts)
 * replayed as a weekly job would run them — each week's received messages, fleet, catalogue and
 * history written as files and imported, the fleet screened, the events linked into series —
 * then a report folder (the last run's report with its plots and what changed, one report per
 * event in the most urgent tier present, and one per event above the lowest tier whose series was
 * seen before — each with its series' trend) and a short summary.
 */
export default defineCommand<DemoOptions>({
  name: 'demo',
  summary: 'replay three weeks of the demo scenario (invented fleet, synthetic catalogue), write reports',
  synopsis: '[--out DIR] [--size N] [--workers N] [--all-events]',
  options: [
    { flags: '--out <DIR>', description: `folder for the files, database and reports (default: ./${DEFAULT_DIR})` },
    {
      flags: '--size <N>',
      description: 'objects in the synthetic catalogue (default: 30,000)',
      parse: numberIn('size', (x) => Number.isInteger(x) && x >= 100 && x <= 200_000, 'a whole number of objects 100..200000'),
    },
    workersOption,
    allEventsOption,
  ],
  examples: ['keepclear demo --out /tmp/demo', 'keepclear demo --out /tmp/small-demo --size 2000 --workers 1'],
  async run(_args, o) {
    const { mkdirSync, rmSync, writeFileSync } = await import('node:fs');
    const { join, resolve, relative } = await import('node:path');
    const { buildDemoWeeks } = await import('../../core/synthetic/demoWeeks.js');
    const { TIERS, TIER_ORDER } = await import('../../core/risk/tiers.js');
    const { toIso } = await import('../../core/time/instant.js');
    const { openDatabase, eventsOfRun, eventsOfSeries, listSeries, putSetting } = await import('../../db/index.js');
    const { replayDemoWeeks } = await import('../../app/demo.js');
    const { countByState } = await import('../../app/series.js');
    // Loaded here only: the plotting library costs start-up time other commands should not pay.
    const { writeReport, SYNTHETIC_CATALOGUE_KEY } = await import('../../app/report/index.js');
    const { eventSummary } = await import('../present/events.js');
    const { seriesCounts } = await import('../present/series.js');
    const { progress } = await import('../present/progress.js');

    const t0 = performance.now();
    const dir = resolve(o.out ?? DEFAULT_DIR);
    mkdirSync(dir, { recursive: true });
    process.stderr.write('demo: building the synthetic world (three weekly catalogues)…\n');
    const demo = buildDemoWeeks(o.size === undefined ? {} : { catalogSize: o.size });
    const catalogSize = demo.weeks[2].catalog.length;

    const dbPath = join(dir, DEMO_DB);
    const reportDir = join(dir, REPORT_DIR);
    // A fresh database and report folder each time, so the demo always shows the same weeks.
    for (const suffix of ['', '-wal', '-shm']) rmSync(dbPath + suffix, { force: true });
    rmSync(reportDir, { recursive: true, force: true });
    mkdirSync(reportDir, { recursive: true });
    const db = openDatabase(dbPath);
    let bar = progress('demo: screening week 1');
    try {
      putSetting(db, SYNTHETIC_CATALOGUE_KEY, {
        text: `Synthetic catalogue: the ${catalogSize} objects screened are invented for the demo (operator ${demo.operator.name}); none is a real object.`,
      });
      let barWeek = 1;
      const weeks = await replayDemoWeeks(db, dir, demo, {
        ...(o.workers !== undefined ? { workers: o.workers } : {}),
        onFile: (week, f) => {
          if (f.ok) process.stderr.write(`demo: week ${week}: imported ${relative(dir, f.file)}: ${f.counts.imported} new, ${f.counts.updated} updated, ${f.counts.rejected} rejected\n`);
        },
        onProgress: (week, done, total) => {
          if (week !== barWeek) {
            bar.stop();
            bar = progress(`demo: screening week ${week}`);
            barWeek = week;
          }
          bar.update(done, total);
        },
      });
      bar.stop();

      // The designed approaches against what the series say (core/synthetic/demoDesigns.ts).
      const pairOf = (a: string, b: string) => [a, b].sort().join('/');
      let asDesigned = 0;
      for (const a of demo.approaches) {
        const s = listSeries(db, { objectId: a.secondary }).filter(
          (x) => pairOf(x.primary, x.secondary) === pairOf(a.primary, a.secondary) && Math.abs(x.tca - a.tca) < 1_400_000,
        );
        const seenBy = s.length === 1 ? eventsOfSeries(db, s[0]!.id).filter((m) => m.source.kind === 'screening').map((m) => m.source.id) : [];
        const expected = a.expected.flatMap((x, k) => (x === 'seen' ? [weeks[k]!.run.id] : []));
        if (s.length === 1 && s[0]!.state === a.finalState && seenBy.join() === expected.join()) asDesigned++;
      }

      const last = weeks[2]!.run;
      const events = eventsOfRun(db, last.id);
      const runReport = join(reportDir, `run-${last.id}.html`);
      const title = `${demo.operator.name} — conjunction screening, week of ${toIso(last.dataAt).slice(0, 10)}`;
      await writeReport(db, { run: last.id }, runReport, { title });
      // One report per event in the most urgent tier present (above the lowest: a routine week
      // gets no event reports).
      const urgent = TIER_ORDER.slice(0, -1).find((t) => events.some((e) => e.risk?.tier === t)) ?? null;
      const eventReports: string[] = [];
      for (const e of urgent ? events.filter((x) => x.risk?.tier === urgent) : []) {
        const path = join(reportDir, `event-${e.id}.html`);
        await writeReport(db, { event: e.id }, path);
        eventReports.push(path);
      }
      // Also the events above the lowest tier whose series was seen before: their trend has a story.
      const lowest = TIER_ORDER[TIER_ORDER.length - 1];
      const trendReports: string[] = [];
      for (const e of events) {
        if (!e.seriesId || !e.risk || e.risk.tier === lowest || e.risk.tier === urgent) continue;
        if (eventsOfSeries(db, e.seriesId).length < 2) continue;
        const path = join(reportDir, `event-${e.id}.html`);
        await writeReport(db, { event: e.id }, path);
        trendReports.push(path);
      }
      const ids = new Set(events.flatMap((e) => (e.seriesId ? [e.seriesId] : [])));
      for (const s of listSeries(db, { states: ['no-longer-predicted'] })) ids.add(s.id);

      const weekLines = weeks.map(
        (w) => `  week ${w.week.week} (${toIso(w.run.dataAt).slice(0, 10)}): run ${w.run.id}, ${w.run.eventCount ?? 0} event(s), ` +
          `${((w.run.wallMs ?? 0) / 1000).toFixed(1)} s screening${w.week.messages.length ? `; ${w.week.messages.length} received CDM(s) imported first` : ''}`,
      );
      const summary = [
        `${demo.operator.name}: ${demo.weeks[2].fleet.length} spacecraft screened weekly against ${catalogSize} objects (synthetic catalogue), ` +
          `${(last.settings.end - last.settings.start) / 86_400_000} days ahead, ${last.settings.volume.kind === 'sphere' ? `${last.settings.volume.radiusKm} km sphere` : 'RTN ellipsoid'}`,
        ...weekLines,
        `${asDesigned} of ${demo.approaches.length} designed approaches behave as designed (one grows riskier, one goes away, one appears, one is past)`,
        '',
        `Week ${weeks[2]!.week.week}, run ${last.id}:`,
      ].join('\n');
      process.stdout.write(`${summary}\n`);
      process.stdout.write(
        eventSummary(events, o.allEvents === true, [
          `${seriesCounts(countByState(db, ids))} (keepclear events --db ${dbPath} --series ID shows one)`,
          `Reports:  ${reportDir}`,
          `  run report (plots, what changed): ${runReport}`,
          ...(urgent
            ? [`  ${eventReports.length} event report(s), tier ${TIERS[urgent].label}: ${eventReports.map((p) => relative(reportDir, p)).join(', ')}`]
            : ['  no event above the lowest tier: no event reports']),
          ...(trendReports.length
            ? [`  ${trendReports.length} more event report(s), seen before (their series' trend): ${trendReports.map((p) => relative(reportDir, p)).join(', ')}`]
            : []),
          `Database: ${dbPath}`,
          `Inputs:   ${join(dir, 'week-*')} (catalogues, fleet, history, received CDMs)`,
          `Done in ${((performance.now() - t0) / 1000).toFixed(1)} s.`,
        ], undefined, DEMO_SUMMARY_ROWS),
      );
      writeFileSync(join(reportDir, 'README.txt'), `Keepclear demo reports for ${demo.operator.name} (synthetic catalogue; invented operator).\nrun-${last.id}.html: the week's run report. event-*.html: the events of tier ${urgent ? TIERS[urgent].label : '—'}, and those above ${TIERS[lowest!].label} seen before (with their series' trend).\n`);
      return 0;
    } finally {
      bar.stop();
      db.close();
    }
  },
});
