/**
 * The demo's three weeks replayed as an operator lives them (core/synthetic/demoWeeks.ts): for
 * each week, the messages received since the previous run are imported, then the week's fleet,
 * catalogue and history files (written out as TLE and OMM, imported through the normal import
 * service), then the fleet is screened with the week's settings and dated at the week's run time,
 * and the linking service joins each run's events to their series. After the last week the
 * series carry states (new, updated, no longer predicted, past) and trends.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { KeepclearError } from '../core/errors.js';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import type { DemoWeek, DemoWeeks } from '../core/synthetic/demoWeeks.js';
import { toIso } from '../core/time/instant.js';
import type { KeepclearDb, RunRecord } from '../db/index.js';
import { importFile } from './import/index.js';
import type { FileOutcome } from './import/outcome.js';
import { screenAndStore } from './screen.js';

export interface DemoWeekFiles {
  readonly fleet: string;
  readonly catalog: string;
  readonly history: string;
  readonly messages: readonly string[];
}

/** Writes one week's files into DIR/week-N/ (the files a weekly job would download). */
export function writeDemoWeekFiles(dir: string, week: DemoWeek): DemoWeekFiles {
  const folder = join(dir, `week-${week.week}-${toIso(week.runAt).slice(0, 10)}`);
  mkdirSync(folder, { recursive: true });
  const files = {
    fleet: join(folder, 'fleet.tle'),
    catalog: join(folder, 'catalog.json'),
    history: join(folder, 'fleet-history.tle'),
    messages: week.messages.map((m) => join(folder, m.fileName)),
  };
  writeFileSync(files.fleet, formatTleFile(week.fleet));
  writeFileSync(files.catalog, formatOmmJson(week.catalog));
  writeFileSync(files.history, formatTleFile(Object.values(week.history).flat()));
  week.messages.forEach((m, i) => writeFileSync(files.messages[i]!, m.text));
  return files;
}

export interface ReplayOptions {
  readonly workers?: number;
  readonly onFile?: (week: number, outcome: FileOutcome) => void;
  readonly onProgress?: (week: number, done: number, total: number) => void;
}

export interface ReplayedWeek {
  readonly week: DemoWeek;
  readonly files: DemoWeekFiles;
  readonly run: RunRecord;
}

function importOrThrow(db: KeepclearDb, file: string, week: number, opts: ReplayOptions): void {
  const outcome = importFile(db, file);
  opts.onFile?.(week, outcome);
  if (!outcome.ok) throw outcome.error;
}

/** Imports, screens and links one week. */
export async function replayDemoWeek(db: KeepclearDb, dir: string, week: DemoWeek, opts: ReplayOptions = {}): Promise<ReplayedWeek> {
  const files = writeDemoWeekFiles(dir, week);
  for (const m of files.messages) importOrThrow(db, m, week.week, opts);
  for (const f of [files.history, files.fleet, files.catalog]) importOrThrow(db, f, week.week, opts);
  const { run } = await screenAndStore(db, {
    settings: week.settings,
    dataAt: week.runAt,
    ...(opts.workers !== undefined ? { workers: opts.workers } : {}),
    ...(opts.onProgress ? { onProgress: (d: number, t: number) => opts.onProgress!(week.week, d, t) } : {}),
  });
  if (run.status !== 'done') throw new KeepclearError('INTERNAL', `the demo screening of week ${week.week} ended ${run.status}`);
  return { week, files, run };
}

/** The three weeks in order. */
export async function replayDemoWeeks(db: KeepclearDb, dir: string, demo: DemoWeeks, opts: ReplayOptions = {}): Promise<ReplayedWeek[]> {
  const out: ReplayedWeek[] = [];
  for (const week of demo.weeks) out.push(await replayDemoWeek(db, dir, week, opts));
  return out;
}
