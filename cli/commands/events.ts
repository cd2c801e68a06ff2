import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { allEventsOption, dbOption, jsonOption } from '../options.js';

interface EventsOptions {
  db?: string;
  run?: string;
  json?: string;
  allEvents?: boolean;
}

/**
 * `keepclear events [--db FILE] [--run ID] [--json FILE|-]`: the events of one run, or by
 * default those of the newest screening run plus every event made from a received CDM.
 */
export default defineCommand<EventsOptions>({
  name: 'events',
  summary: 'show stored events: the newest screening run and received CDMs, or one run',
  synopsis: '[--db FILE] [--run ID] [--json FILE|-] [--all-events]',
  options: [
    dbOption,
    { flags: '--run <ID>', description: 'the events of this run (R12); default: the newest screening run and every received CDM' },
    jsonOption,
    allEventsOption,
  ],
  examples: ['keepclear events', 'keepclear events --run R12 --json -'],
  async run(_args, o) {
    const { openDatabase, defaultDbPath, eventsOfRun, getEventExtra, getRun, latestRun, listRuns, latestPlanSummaries } = await import('../../db/index.js');
    const { planCell, planSummaryToJson } = await import('../../app/plan/summary.js');
    const { eventToJson, runToJson } = await import('../../app/eventJson.js');
    const { eventSummary } = await import('../present/events.js');
    const { writeJsonWithCaution } = await import('../present/json.js');
    const db = openDatabase(o.db ?? defaultDbPath());
    try {
      let run;
      let events;
      if (o.run !== undefined) {
        run = getRun(db, o.run);
        if (!run) throw new KeepclearError('NOT_FOUND', `no run "${o.run}"; see the run ids in keepclear events --json -`);
        events = eventsOfRun(db, run.id);
      } else {
        run = latestRun(db, 'done', ['screening', 'merge']);
        const fromCdm = listRuns(db, 10_000, ['cdm']).filter((r) => r.status === 'done').flatMap((r) => eventsOfRun(db, r.id));
        events = [...(run ? eventsOfRun(db, run.id) : []), ...fromCdm].sort((a, b) => a.tca - b.tca);
      }
      const plans = latestPlanSummaries(db, events.map((e) => e.id));
      if (o.json !== undefined) {
        writeJsonWithCaution(o.json, {
          run: run ? runToJson(run) : null,
          // Extras (e.g. a message's reported Pc, kept apart from Keepclear's own) ride along.
          // plan: the event's newest manoeuvre plan (keepclear plan), null when none.
          events: events.map((e) => {
            const p = plans.get(e.id);
            return { ...eventToJson(e), extra: getEventExtra(db, e.id) ?? {}, plan: p ? planSummaryToJson(p) : null };
          }),
        });
      }
      if (o.json !== '-') {
        if (run) process.stdout.write(`run ${run.id} (${run.kind}, ${run.status}): ${run.eventCount ?? 0} event(s)\n`);
        const cells = new Map([...plans].map(([id, p]) => [id, planCell(p)]));
        process.stdout.write(eventSummary(events, o.allEvents === true, cells));
        if (plans.size > 0) process.stdout.write(`${plans.size} event(s) with a manoeuvre plan; keepclear report --event ID shows it.\n`);
      }
      return 0;
    } finally {
      db.close();
    }
  },
});
