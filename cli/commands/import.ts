import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { dbOption, numberIn } from '../options.js';

interface ImportOptions {
  db?: string;
  hbrM?: number;
}

/**
 * `keepclear import FILE... [--db FILE] [--hbr-m X]`: each file in its own transaction (a bad
 * record is rejected alone; a file that cannot be read or recognised changes nothing). Exit 1
 * when a file was not imported or a record was rejected.
 */
export default defineCommand<ImportOptions>({
  name: 'import',
  summary: 'import TLE, OMM (KVN, XML, JSON, CSV) and CDM (KVN, XML) files into the database',
  synopsis: 'FILE... [--db FILE] [--hbr-m X]',
  arguments: '[FILE...]',
  options: [
    dbOption,
    {
      flags: '--hbr-m <X>',
      description: 'hard-body radius in metres for every object in the files (default: a CDM AREA_PC, else the documented default)',
      parse: numberIn('hbr-m', (x) => x > 0, 'a positive number of metres'),
    },
  ],
  examples: ['keepclear import catalog.json fleet.tle --hbr-m 2.5', 'keepclear import messages/*.cdm --db ops.db'],
  async run(files, o) {
    if (files.length === 0) {
      throw new KeepclearError('BAD_ARGUMENT', 'import needs at least one FILE: keepclear import FILE... [--db FILE] [--hbr-m X]');
    }
    const { openDatabase, defaultDbPath } = await import('../../db/index.js');
    const { importFiles } = await import('../../app/import/index.js');
    const { presentFileOutcome, presentImportTotal } = await import('../present/imports.js');
    const db = openDatabase(o.db ?? defaultDbPath());
    try {
      const summary = importFiles(db, {
        files,
        ...(o.hbrM !== undefined ? { hbrM: o.hbrM } : {}),
        onFile: (outcome) => presentFileOutcome(outcome, process.stdout),
      });
      presentImportTotal(summary, process.stdout);
      return summary.clean ? 0 : 1;
    } finally {
      db.close();
    }
  },
});
