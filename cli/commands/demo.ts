import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { KeepclearError } from '../../core/errors.js';
import { formatTleFile } from '../../core/formats/tle.js';
import { formatOmmJson } from '../../core/formats/omm-write.js';
import { buildDemoScenario } from '../../core/synthetic/demo.js';
import { toIso } from '../../core/time/instant.js';
import { openDatabase, eventsOfRun, putSetting } from '../../db/index.js';
import { screenAndStore } from '../../app/screen.js';
import { optNumber, optString, parseArgs } from '../args.js';
import { eventTable, progressReporter } from '../output.js';
import { importOneFile } from './import.js';

const DEFAULT_DIR = 'keepclear-demo';
const DEMO_DB = 'keepclear-demo.db';

/**
 * `keepclear demo [--out DIR]`: writes the invented operator's fleet and a 30,000-object
 * synthetic catalogue as TLE and OMM files, imports them through the normal import path into
 * DIR/keepclear-demo.db, screens the fleet for the demo week and writes the run's report.
 */
export async function demoCommand(argv: readonly string[]): Promise<number> {
  const args = parseArgs(argv, { valued: ['out', 'size', 'workers'] });
  if (args.positional.length > 0) throw new KeepclearError('BAD_ARGUMENT', `unexpected argument "${args.positional[0]}"`);
  const dir = resolve(optString(args, 'out') ?? DEFAULT_DIR);
  const workers = optNumber(args, 'workers', (x) => Number.isInteger(x) && x >= 0 && x <= 64, 'a whole number 0..64');
  const sizeText = optString(args, 'size');
  const size = sizeText === undefined ? undefined : Number(sizeText);
  if (size !== undefined && !(Number.isInteger(size) && size >= 100 && size <= 200_000)) {
    throw new KeepclearError('BAD_ARGUMENT', `--size must be a whole number of objects 100..200000, got "${sizeText}"`);
  }
  mkdirSync(dir, { recursive: true });
  process.stderr.write('demo: building the synthetic world…\n');
  const scenario = buildDemoScenario(size === undefined ? {} : { catalogSize: size });
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
  try {
    for (const f of [files.history, files.fleet, files.catalog]) {
      const outcome = importOneFile(db, f, undefined);
      if (!outcome.ok) throw outcome.error;
      const c = outcome.counts;
      process.stderr.write(`demo: imported ${f}: ${c.imported} new, ${c.updated} updated, ${c.rejected} rejected\n`);
    }
    // Loaded on demand, so other commands do not pay for the plotting library at start-up.
    const { renderRunReportHtml, runReportModelFromDb, SYNTHETIC_CATALOGUE_KEY } = await import('../../app/report/index.js');
    putSetting(db, SYNTHETIC_CATALOGUE_KEY, {
      text: `Synthetic catalogue: the ${scenario.catalog.length} objects screened are invented for the demo (operator ${scenario.operator.name}); none is a real object.`,
    });
    const fleetIds = scenario.fleet.map((f) => f.objectId);
    const { run } = await screenAndStore(db, {
      settings: { start: scenario.start, end: scenario.end, volume: { kind: 'sphere', radiusKm: 5 }, primaries: fleetIds },
      ...(workers !== undefined ? { workers } : {}),
      onProgress: progressReporter('demo: screening'),
    });
    const events = eventsOfRun(db, run.id);
    const reportPath = join(dir, `report-${run.id}.html`);
    const title = `${scenario.operator.name} — conjunction screening, week of ${toIso(scenario.start).slice(0, 10)}`;
    writeFileSync(reportPath, await renderRunReportHtml(runReportModelFromDb(db, run.id, { title })));
    const found = scenario.planted.filter((p) =>
      events.some((e) => e.primary === p.primary && e.secondary === p.secondary && Math.abs(e.tca - p.tca) < 1000),
    ).length;
    process.stdout.write(
      `${scenario.operator.name}: ${scenario.fleet.length} spacecraft screened against ${scenario.catalog.length} objects, ` +
        `${toIso(scenario.start)} + 7 days, 5 km sphere\n` +
        `${events.length} event(s) in run ${run.id} (${((run.wallMs ?? 0) / 1000).toFixed(1)} s); ` +
        `${found} of ${scenario.planted.length} planted encounters found\n` +
        `database: ${dbPath}\nreport:   ${reportPath}\n\n`,
    );
    process.stdout.write(eventTable(events));
    return 0;
  } finally {
    db.close();
  }
}
