import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { dbOption } from '../options.js';

interface ExportOptions {
  db?: string;
  run?: string;
  event?: string;
  series?: string;
  format?: 'cdm' | 'csv' | 'json';
  out?: string;
}

const FORMATS = ['cdm', 'csv', 'json'] as const;

/**
 * `keepclear export (--event ID | --run ID | --series ID) --format cdm|csv|json --out FILE [--db FILE]`:
 * stored events as CCSDS CDMs (KVN, one per event), or as a CSV or JSON list.
 */
export default defineCommand<ExportOptions>({
  name: 'export',
  summary: 'write events as CCSDS CDM messages (KVN) or as a CSV or JSON list',
  synopsis: '(--event ID | --run ID | --series ID) --format cdm|csv|json --out FILE [--db FILE]',
  options: [
    { flags: '--event <ID>', description: 'export this event (R12-3)' },
    { flags: '--run <ID>', description: 'export every event of this run (R12)' },
    { flags: '--series <ID>', description: 'export every event of this series (S-R12-3), oldest data first' },
    {
      flags: '--format <FORMAT>',
      description: 'cdm (one CCSDS 508.0-B-1 KVN message per event), csv or json (a list, JSON with the caution)',
      parse: (text, previous) => {
        if (previous !== undefined) throw new KeepclearError('BAD_ARGUMENT', 'option --format given twice');
        const f = text.trim().toLowerCase();
        if (!(FORMATS as readonly string[]).includes(f))
          throw new KeepclearError('BAD_ARGUMENT', `--format must be cdm, csv or json, got "${text}"`);
        return f;
      },
    },
    {
      flags: '--out <FILE>',
      description: 'output file; for --format cdm of a run or series, a folder that receives one EVENT.cdm per event',
    },
    dbOption,
  ],
  examples: [
    'keepclear export --event R12-3 --format cdm --out R12-3.cdm',
    'keepclear export --run R12 --format cdm --out messages/',
    'keepclear export --run R12 --format csv --out week.csv',
    'keepclear export --series S-R12-3 --format json --out series.json',
  ],
  async run(_args, o) {
    const given = [o.event, o.run, o.series].filter((x) => x !== undefined).length;
    if (given !== 1)
      throw new KeepclearError('BAD_ARGUMENT', 'give exactly one of --event ID, --run ID or --series ID; e.g. keepclear export --run R1 --format csv --out week.csv');
    if (o.format === undefined) throw new KeepclearError('BAD_ARGUMENT', 'give --format cdm, csv or json');
    if (o.out === undefined) throw new KeepclearError('BAD_ARGUMENT', 'give --out FILE (a folder for the CDMs of a run or series)');
    const { openDatabase, defaultDbPath } = await import('../../db/index.js');
    const { exportEvents } = await import('../../app/export/index.js');
    const { DECISION_AID_NOTE } = await import('../../core/risk/assess.js');
    const target = o.run !== undefined ? { run: o.run } : o.series !== undefined ? { series: o.series } : { event: o.event! };
    const db = openDatabase(o.db ?? defaultDbPath());
    try {
      const r = exportEvents(db, target, o.format, o.out);
      const where = r.folder !== null ? `${r.files.length} file(s) in ${r.folder}` : r.files.join(', ');
      process.stderr.write(`export: ${r.events} event(s) of ${r.kind} ${r.id} as ${r.format.toUpperCase()}: ${where}\n`);
      // CSV cannot carry the note inside without breaking strict readers; the terminal says it.
      if (r.format === 'csv') process.stderr.write(`caution: ${DECISION_AID_NOTE}\n`);
      return 0;
    } finally {
      db.close();
    }
  },
});
