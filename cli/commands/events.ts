import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { allEventsOption, dbOption, jsonOption } from '../options.js';

interface EventsOptions {
  db?: string;
  run?: string;
  series?: string;
  json?: string;
  allEvents?: boolean;
}

/**
 * `keepclear events [--db FILE] [--run ID | --series ID] [--json FILE|-]`: the events of one run,
 * of one series (in the order their data was created), or by default those of the newest
 * screening run plus every event made from a received CDM.
 */
export default defineCommand<EventsOptions>({
  name: 'events',
  summary: 'show stored events: the newest screening run and received CDMs, one run, or one series',
  synopsis: '[--db FILE] [--run ID | --series ID] [--json FILE|-] [--all-events]',
  options: [
    dbOption,
    { flags: '--run <ID>', description: 'the events of this run (R12); default: the newest screening run and every received CDM' },
    {
      flags: '--series <ID>',
      description: 'the events of this series (S-R12-3: the same conjunction across runs and messages), oldest data first, with its state and trend',
    },
    jsonOption,
    allEventsOption,
  ],
  examples: ['keepclear events', 'keepclear events --run R12 --json -', 'keepclear events --series S-R12-3'],
  async run(_args, o) {
    if (o.run !== undefined && o.series !== undefined) {
      throw new KeepclearError('BAD_ARGUMENT', 'give either --run or --series, not both');
    }
    const { openDatabase, defaultDbPath, eventsOfRun, getEventExtra, getRun, latestRun, listRuns, latestPlanSummaries, runEphemerides } = await import('../../db/index.js');
    const { planCell, planSummaryToJson } = await import('../../app/plan/summary.js');
    const { eventToJson, runToJson } = await import('../../app/eventJson.js');
    const { tryEnsureLinked, seriesView, countByState } = await import('../../app/series.js');
    const { seriesStatesOf, seriesToJson } = await import('../../app/seriesJson.js');
    const { eventSummary } = await import('../present/events.js');
    const { seriesCounts, seriesSummary } = await import('../present/series.js');
    const { writeJsonWithCaution } = await import('../present/json.js');
    const db = openDatabase(o.db ?? defaultDbPath());
    try {
      // Events stored before series existed are linked on first read.
      tryEnsureLinked(db);
      if (o.series !== undefined) {
        const view = seriesView(db, o.series);
        if (!view) throw new KeepclearError('NOT_FOUND', `no series "${o.series}"; every event's seriesId is in keepclear events --json -`);
        if (o.json !== undefined) writeJsonWithCaution(o.json, seriesToJson(db, view));
        if (o.json !== '-') process.stdout.write(seriesSummary(view));
        return 0;
      }
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
      const states = seriesStatesOf(db, events);
      const plans = latestPlanSummaries(db, events.map((e) => e.id));
      if (o.json !== undefined) {
        writeJsonWithCaution(o.json, {
          run: run ? runToJson(run, run.flagged, runEphemerides(db, run.id)) : null,
          // Extras (e.g. a message's reported Pc, kept apart from Keepclear's own) ride along.
          // plan: the event's newest manoeuvre plan (keepclear plan), null when none.
          events: events.map((e) => {
            const p = plans.get(e.id);
            // added to eventToJson's object, not spread into a new one (slow in V8 for 10⁵ events)
            return Object.assign(eventToJson(e, states), { extra: getEventExtra(db, e.id) ?? {}, plan: p ? planSummaryToJson(p) : null });
          }),
        });
      }
      if (o.json !== '-') {
        if (run) process.stdout.write(`run ${run.id} (${run.kind}, ${run.status}): ${run.eventCount ?? 0} event(s)\n`);
        if (run) {
          const { describeEphemeris } = await import('../../app/ephemerisText.js');
          for (const e of runEphemerides(db, run.id)) process.stdout.write(`primary ${e.objectId}: ephemeris: ${describeEphemeris(e)}\n`);
        }
        const ids = new Set(events.flatMap((e) => (e.seriesId ? [e.seriesId] : [])));
        const more = ids.size > 0 ? [`${seriesCounts(countByState(db, ids))} (keepclear events --series ID shows one)`] : [];
        const cells = new Map([...plans].map(([id, p]) => [id, planCell(p)]));
        process.stdout.write(eventSummary(events, o.allEvents === true, more, cells));
        if (plans.size > 0) process.stdout.write(`${plans.size} event(s) with a manoeuvre plan; keepclear report --event ID shows it.\n`);
      }
      return 0;
    } finally {
      db.close();
    }
  },
});
