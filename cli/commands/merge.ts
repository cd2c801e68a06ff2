import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { allEventsOption, dbOption, jsonOption } from '../options.js';

interface MergeOptions {
  db?: string;
  json?: string;
  allEvents?: boolean;
}

/**
 * `keepclear merge SHARD.json... [--db FILE] [--json FILE|-]`: joins the shards of an all-vs-all
 * run (`screen --all --shard K/N --json FILE`, each on its own machine) into one run stored in
 * the database, with risk and series like any screening run (DESIGN.md "--shard K/N and merge").
 */
export default defineCommand<MergeOptions>({
  name: 'merge',
  summary: 'join the shards of an all-vs-all run (screen --all --shard K/N) into one run',
  synopsis: 'SHARD.json... [--db FILE] [--json FILE|-] [--all-events]',
  arguments: '[SHARD.json...]',
  options: [dbOption, jsonOption, allEventsOption],
  examples: [
    'keepclear merge shard-1.json shard-2.json shard-3.json --db keepclear.db --json run.json',
    'keepclear merge shards/*.json --json -',
  ],
  async run(args, o) {
    if (args.length === 0) throw new KeepclearError('BAD_ARGUMENT', 'give the JSON files of the shards: keepclear merge SHARD.json...');
    const { readInputFile } = await import('../../app/import/readInput.js');
    const { mergeShards } = await import('../../app/shards.js');
    const { openDatabase, defaultDbPath } = await import('../../db/index.js');
    const { eventToJson, runToJson } = await import('../../app/eventJson.js');
    const { seriesStatesOf } = await import('../../app/seriesJson.js');
    const { eventSummary, SCREEN_SUMMARY_ROWS } = await import('../present/events.js');
    const { writeJsonWithCaution } = await import('../present/json.js');
    // Every file is read and checked before the database is opened: a bad shard changes nothing.
    const files = args.map((file) => {
      const r = readInputFile(file);
      if ('error' in r) throw r.error;
      return { file, text: new TextDecoder().decode(r.bytes) };
    });
    const db = openDatabase(o.db ?? defaultDbPath());
    try {
      const { run, events, shards } = mergeShards(db, files);
      const states = seriesStatesOf(db, events);
      if (o.json !== undefined) {
        writeJsonWithCaution(o.json, { run: { ...runToJson(run), shards }, events: events.map((e) => eventToJson(e, states)) });
      }
      if (o.json !== '-') {
        process.stdout.write(`run ${run.id}: ${shards} shard(s) merged, ${events.length} event(s), ${run.objectCount} objects\n`);
        process.stdout.write(eventSummary(events, o.allEvents === true, [], undefined, SCREEN_SUMMARY_ROWS));
      }
      return 0;
    } finally {
      db.close();
    }
  },
});
