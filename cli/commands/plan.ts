import { KeepclearError } from '../../core/errors.js';
import { defineCommand } from '../command.js';
import { dbOption, jsonOption, numberIn } from '../options.js';

interface PlanOptions {
  event?: string;
  targetMissKm?: number;
  targetPc?: number;
  db?: string;
  json?: string;
  oem?: string;
  opm?: string;
}

/**
 * `keepclear plan --event ID (--target-miss-km X | --target-pc P) [--db FILE] [--json FILE|-]
 * [--oem FILE] [--opm FILE]`: an avoidance burn for one stored event — trade over lead times, the
 * chosen burn, its verification, the re-screen of the manoeuvred trajectory — stored with the
 * event; OEM and OPM files to send the plan. Ctrl-C cancels (nothing is stored then).
 */
export default defineCommand<PlanOptions>({
  name: 'plan',
  summary: 'plan an avoidance burn for an event: Δv against lead time, verified and re-screened',
  synopsis: '--event ID (--target-miss-km X | --target-pc P) [--db FILE] [--json FILE|-] [--oem FILE] [--opm FILE]',
  options: [
    { flags: '--event <ID>', description: 'the event to plan for (R12-3; see keepclear events)' },
    {
      flags: '--target-miss-km <X>',
      description: 'smallest acceptable new miss distance, km',
      parse: numberIn('target-miss-km', (x) => x > 0 && x <= 1000, 'a distance in km in (0, 1000]'),
    },
    {
      flags: '--target-pc <P>',
      description: "largest acceptable Pc (the event's covariances and Pc method)",
      parse: numberIn('target-pc', (x) => x > 0 && x < 1, 'a probability in (0, 1)'),
    },
    dbOption,
    jsonOption,
    { flags: '--oem <FILE>', description: 'write the manoeuvred trajectory from the burn to the window end as a CCSDS OEM (KVN)' },
    { flags: '--opm <FILE>', description: 'write the burn as a CCSDS OPM with its manoeuvre block (KVN)' },
  ],
  examples: [
    'keepclear plan --event R1-19 --target-miss-km 1',
    'keepclear plan --event R1-19 --target-pc 1e-6 --json plan.json --oem plan.oem --opm burn.opm',
  ],
  async run(_args, o) {
    if (o.event === undefined) throw new KeepclearError('BAD_ARGUMENT', 'give --event ID; list events with keepclear events');
    if ((o.targetMissKm === undefined) === (o.targetPc === undefined))
      throw new KeepclearError('BAD_ARGUMENT', 'give exactly one of --target-miss-km X or --target-pc P');
    const target = o.targetMissKm !== undefined ? { kind: 'miss' as const, missKm: o.targetMissKm } : { kind: 'pc' as const, pc: o.targetPc! };
    const { writeFileSync } = await import('node:fs');
    const { openDatabase, defaultDbPath } = await import('../../db/index.js');
    const { planForEvent, planOemText, planOpmText } = await import('../../app/plan/index.js');
    const { planText } = await import('../present/plan.js');
    const { writeJsonWithCaution } = await import('../present/json.js');
    const { progress } = await import('../present/progress.js');

    const db = openDatabase(o.db ?? defaultDbPath());
    const controller = new AbortController();
    const onSigint = () => controller.abort();
    process.once('SIGINT', onSigint);
    const bars = { trade: progress('plan: lead times'), rescreen: progress('plan: re-screen') };
    try {
      const plan = await planForEvent(db, o.event, {
        target,
        signal: controller.signal,
        onProgress: (p) => bars[p.phase].update(p.done, p.total),
      });
      bars.trade.stop();
      bars.rescreen.stop();
      // The plan is shown (and stored) first: a file that cannot be written loses nothing else.
      if (o.json !== undefined) writeJsonWithCaution(o.json, { ...plan.document });
      if (o.json !== '-') process.stdout.write(planText(plan));
      const written: string[] = [];
      if (o.oem !== undefined) {
        writeFileSync(o.oem, planOemText(plan));
        written.push(`OEM ${o.oem}`);
      }
      if (o.opm !== undefined) {
        writeFileSync(o.opm, planOpmText(plan));
        written.push(`OPM ${o.opm}`);
      }
      if (written.length > 0) process.stderr.write(`plan: wrote ${written.join(', ')}\n`);
      return 0;
    } finally {
      bars.trade.stop();
      bars.rescreen.stop();
      process.off('SIGINT', onSigint);
      db.close();
    }
  },
});
