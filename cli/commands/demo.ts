import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { allEventsOption, numberIn, workersOption } from '../options.js';

const DEFAULT_DIR = 'keepclear-demo';
const DEMO_DB = 'keepclear-demo.db';
const DEMO_THRESHOLD_KM = 5;

interface DemoOptions {
  out?: string;
  size?: number;
  workers?: number;
  allEvents?: boolean;
}

/**
 * `keepclear demo [--out DIR]`: writes the invented operator's fleet and a synthetic catalogue
 * as TLE and OMM files, imports them through the normal import service into
 * DIR/keepclear-demo.db, screens the fleet for the demo week and writes the run's report.
 */
export default defineCommand<DemoOptions>({
  name: 'demo',
  summary: 'build the demo scenario (invented fleet, synthetic catalogue), screen its week, write a report',
  synopsis: '[--out DIR] [--size N] [--workers N] [--all-events]',
  options: [
    { flags: '--out <DIR>', description: `folder for the files, database and report (default: ./${DEFAULT_DIR})` },
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
    const { join, resolve } = await import('node:path');
    const { formatTleFile } = await import('../../core/formats/tle/index.js');
    const { formatOmmJson } = await import('../../core/formats/omm/index.js');
    const { buildDemoScenario } = await import('../../core/synthetic/demo.js');
    const { toIso } = await import('../../core/time/instant.js');
    const { openDatabase, eventsOfRun } = await import('../../db/index.js');
    const { importFile } = await import('../../app/import/index.js');
    const { screenAndStore } = await import('../../app/screen.js');
    const { putSetting } = await import('../../db/index.js');
    // Loaded here only: the plotting library costs start-up time other commands should not pay.
    const { renderRunReportHtml, runReportModelFromDb, SYNTHETIC_CATALOGUE_KEY } = await import('../../app/report/index.js');
    const { eventSummary } = await import('../present/events.js');
    const { progress } = await import('../present/progress.js');

    const dir = resolve(o.out ?? DEFAULT_DIR);
    mkdirSync(dir, { recursive: true });
    process.stderr.write('demo: building the synthetic world…\n');
    const scenario = buildDemoScenario(o.size === undefined ? {} : { catalogSize: o.size });
    const files = {
      history: join(dir, 'fleet-history.tle'),
      fleet: join(dir, 'fleet.tle'),
      catalog: join(dir, 'catalog.json'),
    };
    writeFileSync(files.history, formatTleFile(Object.values(scenario.history).flat()));
    writeFileSync(files.fleet, formatTleFile(scenario.fleet));
    writeFileSync(files.catalog, formatOmmJson(scenario.catalog));

    const dbPath = join(dir, DEMO_DB);
    // A fresh database each time, so the demo always shows the same week.
    for (const suffix of ['', '-wal', '-shm']) rmSync(dbPath + suffix, { force: true });
    const db = openDatabase(dbPath);
    const bar = progress('demo: screening');
    try {
      for (const f of [files.history, files.fleet, files.catalog]) {
        const outcome = importFile(db, f);
        if (!outcome.ok) throw outcome.error;
        const c = outcome.counts;
        process.stderr.write(`demo: imported ${f}: ${c.imported} new, ${c.updated} updated, ${c.rejected} rejected\n`);
      }
      putSetting(db, SYNTHETIC_CATALOGUE_KEY, {
        text: `Synthetic catalogue: the ${scenario.catalog.length} objects screened are invented for the demo (operator ${scenario.operator.name}); none is a real object.`,
      });
      const fleetIds = scenario.fleet.map((f) => f.objectId);
      const { run } = await screenAndStore(db, {
        settings: { start: scenario.start, end: scenario.end, volume: { kind: 'sphere', radiusKm: DEMO_THRESHOLD_KM }, primaries: fleetIds },
        ...(o.workers !== undefined ? { workers: o.workers } : {}),
        onProgress: bar.update,
      });
      bar.stop();
      if (run.status !== 'done') throw new KeepclearError('INTERNAL', `the demo screening ended ${run.status}`);
      const events = eventsOfRun(db, run.id);
      const reportPath = join(dir, `report-${run.id}.html`);
      const title = `${scenario.operator.name} — conjunction screening, week of ${toIso(scenario.start).slice(0, 10)}`;
      writeFileSync(reportPath, await renderRunReportHtml(runReportModelFromDb(db, run.id, { title })));
      const found = scenario.planted.filter((p) =>
        events.some((e) => e.primary === p.primary && e.secondary === p.secondary && Math.abs(e.tca - p.tca) < 1000),
      ).length;
      const days = (scenario.end - scenario.start) / 86_400_000;
      process.stdout.write(
        `${scenario.operator.name}: ${scenario.fleet.length} spacecraft screened against ${scenario.catalog.length} objects ` +
          `(synthetic catalogue), ${toIso(scenario.start)} + ${days} days, ${DEMO_THRESHOLD_KM} km sphere\n` +
          `${events.length} event(s) in run ${run.id} (${((run.wallMs ?? 0) / 1000).toFixed(1)} s); ` +
          `${found} of ${scenario.planted.length} planted encounters found\n` +
          `database: ${dbPath}\nreport:   ${reportPath}\n\n`,
      );
      process.stdout.write(eventSummary(events, o.allEvents === true));
      return 0;
    } finally {
      bar.stop();
      db.close();
    }
  },
});
