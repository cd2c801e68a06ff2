import { KeepclearError } from '../../core/errors.js';
import type { ConjunctionEvent } from '../../core/events/index.js';
import { defaultDbPath, eventsOfRun, getEventExtra, getRun, listRuns, openDatabase, type RunRecord } from '../../db/index.js';
import { CDM_RUN_PREFIX } from '../../app/cdmImport.js';
import { eventToJson, runToJson } from '../../app/eventJson.js';
import { optString, parseArgs } from '../args.js';
import { eventTable, writeJson } from '../output.js';

/**
 * `keepclear events [--db FILE] [--run ID] [--json FILE|-]`: the events of one run, or by
 * default those of the newest screening run plus every event made from a received CDM.
 */
export async function eventsCommand(argv: readonly string[]): Promise<number> {
  const args = parseArgs(argv, { valued: ['db', 'run', 'json'] });
  if (args.positional.length > 0) throw new KeepclearError('BAD_ARGUMENT', `unexpected argument "${args.positional[0]}"`);
  const db = openDatabase(optString(args, 'db') ?? defaultDbPath());
  try {
    const runId = optString(args, 'run');
    let run: RunRecord | null;
    let events: ConjunctionEvent[];
    if (runId !== undefined) {
      run = getRun(db, runId);
      if (!run) throw new KeepclearError('NOT_FOUND', `no run "${runId}"; see the run ids in keepclear events --json -`);
      events = eventsOfRun(db, run.id);
    } else {
      const runs = listRuns(db, 10_000).filter((r) => r.status !== 'running');
      const screening = runs.filter((r) => !r.catalogFingerprint.startsWith(CDM_RUN_PREFIX));
      run = screening.sort((a, b) => b.createdAt - a.createdAt)[0] ?? null;
      const fromCdm = runs.filter((r) => r.catalogFingerprint.startsWith(CDM_RUN_PREFIX)).flatMap((r) => eventsOfRun(db, r.id));
      events = [...(run ? eventsOfRun(db, run.id) : []), ...fromCdm].sort((a, b) => a.tca - b.tca);
    }
    const json = optString(args, 'json');
    if (json !== undefined) {
      writeJson(json, {
        run: run ? runToJson(run) : null,
        // Extras (e.g. a message's reported Pc, kept apart from Keepclear's own) ride along.
        events: events.map((e) => ({ ...eventToJson(e), extra: getEventExtra(db, e.id) ?? {} })),
      });
    }
    if (json !== '-') process.stdout.write(eventTable(events));
    return 0;
  } finally {
    db.close();
  }
}
