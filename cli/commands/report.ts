import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { dbOption } from '../options.js';

interface ReportOptions {
  db?: string;
  run?: string;
  event?: string;
  out?: string;
}

/**
 * `keepclear report (--event ID | --run ID) --out FILE.html|FILE.pdf [--db FILE]`: the report of
 * one run or one event, as self-contained HTML or as PDF (through headless Chromium).
 */
export default defineCommand<ReportOptions>({
  name: 'report',
  summary: 'write the report of a run or an event as self-contained HTML or PDF',
  synopsis: '(--event ID | --run ID) --out FILE.html|FILE.pdf [--db FILE]',
  options: [
    { flags: '--run <ID>', description: 'report on this screening run (R12); "latest": the newest finished screening run (for scheduled jobs)' },
    { flags: '--event <ID>', description: 'report on this event (R12-3)' },
    { flags: '--out <FILE>', description: 'output file; .html, or .pdf (needs Chromium: apt-get install -y chromium)' },
    dbOption,
  ],
  examples: ['keepclear report --run R12 --out week.html', 'keepclear report --event R12-3 --out event.pdf', 'keepclear report --run latest --out this-week.pdf'],
  async run(_args, o) {
    if ((o.run === undefined) === (o.event === undefined)) {
      throw new KeepclearError('BAD_ARGUMENT', 'give exactly one of --run ID or --event ID; e.g. keepclear report --run R1 --out week.html');
    }
    if (o.out === undefined) throw new KeepclearError('BAD_ARGUMENT', 'give --out FILE.html or --out FILE.pdf');
    const { openDatabase, defaultDbPath, latestRun } = await import('../../db/index.js');
    // Loaded on demand, so other commands do not pay for the plotting library at start-up.
    const { writeReport } = await import('../../app/report/index.js');
    const db = openDatabase(o.db ?? defaultDbPath());
    try {
      let runId = o.run;
      if (runId === 'latest') {
        runId = latestRun(db, 'done', ['screening', 'merge'])?.id;
        if (runId === undefined) throw new KeepclearError('NOT_FOUND', 'no finished screening run in the database; run keepclear screen first');
      }
      const target = runId !== undefined ? { run: runId } : { event: o.event! };
      const r = await writeReport(db, target, o.out);
      process.stderr.write(
        `report: ${r.path} (${r.format.toUpperCase()}, ${(r.bytes / 1024).toFixed(0)} KiB; ` +
          `HTML ${r.htmlMs.toFixed(0)} ms${r.format === 'pdf' ? `, PDF ${r.pdfMs.toFixed(0)} ms` : ''})\n`,
      );
      return 0;
    } finally {
      db.close();
    }
  },
});
