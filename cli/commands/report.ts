import { KeepclearError } from '../../core/errors.js';
import { defaultDbPath, openDatabase } from '../../db/index.js';
import type { ReportTarget } from '../../app/report/index.js';
import { optString, parseArgs } from '../args.js';

/**
 * `keepclear report (--event ID | --run ID) --out FILE.html|FILE.pdf [--db FILE]`: the report of
 * one run or one event, as self-contained HTML or as PDF (through headless Chromium).
 */
export async function reportCommand(argv: readonly string[]): Promise<number> {
  const args = parseArgs(argv, { valued: ['db', 'run', 'event', 'out'] });
  if (args.positional.length > 0) throw new KeepclearError('BAD_ARGUMENT', `unexpected argument "${args.positional[0]}"`);
  const run = optString(args, 'run');
  const event = optString(args, 'event');
  const out = optString(args, 'out');
  if ((run === undefined) === (event === undefined)) {
    throw new KeepclearError('BAD_ARGUMENT', 'give exactly one of --run ID or --event ID; e.g. keepclear report --run R1 --out week.html');
  }
  if (out === undefined) throw new KeepclearError('BAD_ARGUMENT', 'give --out FILE.html or --out FILE.pdf');
  const target: ReportTarget = run !== undefined ? { run } : { event: event! };
  // Loaded on demand, so other commands do not pay for the plotting library at start-up.
  const { writeReport } = await import('../../app/report/index.js');
  const db = openDatabase(optString(args, 'db') ?? defaultDbPath());
  try {
    const r = await writeReport(db, target, out);
    process.stderr.write(
      `report: ${r.path} (${r.format.toUpperCase()}, ${(r.bytes / 1024).toFixed(0)} KiB; ` +
        `HTML ${r.htmlMs.toFixed(0)} ms${r.format === 'pdf' ? `, PDF ${r.pdfMs.toFixed(0)} ms` : ''})\n`,
    );
    return 0;
  } finally {
    db.close();
  }
}
