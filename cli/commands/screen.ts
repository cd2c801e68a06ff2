import { KeepclearError } from '../../core/errors.js';
import { canonicalObjectId } from '../../core/elements/objectId.js';
import { parseIso, type Instant } from '../../core/time/instant.js';
import type { ScreeningSettings, ScreeningVolume } from '../../core/screening/types.js';
import type { ShardSpec } from '../../core/screening/spatial/shard.js';
import { defineCommand, type ValueParser } from '../command.js';
import { allEventsOption, dbOption, jsonOption, numberIn, parseShard, repeatable, workersOption } from '../options.js';

const DEFAULT_DAYS = 7;
const DEFAULT_THRESHOLD_KM = 5;
const MS_PER_DAY = 86_400_000;

interface ScreenOptions {
  catalog?: string[];
  primary?: string[];
  all?: boolean;
  shard?: ShardSpec;
  start?: Instant;
  days?: number;
  thresholdKm?: number;
  volumeRtnKm?: [number, number, number];
  db?: string;
  json?: string;
  workers?: number;
  allEvents?: boolean;
  attentionTier?: TierId;
  attentionExit?: number;
  attentionFile?: string;
}

/** Tier ids a user may name for --attention-tier (core/risk/tiers.ts). */
const TIER_IDS = ['plan', 'monitor', 'routine'] as const;
type TierId = (typeof TIER_IDS)[number];
/** Default attention tier: anything above the lowest tier, as the terminal's "Needing attention". */
const DEFAULT_ATTENTION_TIER: TierId = 'monitor';

const attentionTier: ValueParser<TierId> = (text, previous) => {
  once('attention-tier', previous);
  const t = text.trim().toLowerCase();
  if (!(TIER_IDS as readonly string[]).includes(t)) {
    throw new KeepclearError('BAD_ARGUMENT', `--attention-tier must be one of ${TIER_IDS.join(', ')}, got "${text}"`);
  }
  return t as TierId;
};

const once = (name: string, previous: unknown): void => {
  if (previous !== undefined) throw new KeepclearError('BAD_ARGUMENT', `option --${name} given twice`);
};

const primaryIds: ValueParser<string[]> = (text, previous) => {
  once('primary', previous);
  const ids = [...new Set(text.split(',').filter((x) => x.trim() !== '').map(canonicalObjectId))];
  if (ids.length === 0) throw new KeepclearError('BAD_ARGUMENT', '--primary needs at least one id');
  return ids;
};

const isoStart: ValueParser<Instant> = (text, previous) => {
  once('start', previous);
  const t = parseIso(text);
  if (t === null) throw new KeepclearError('BAD_ARGUMENT', `--start must be an ISO 8601 UTC time (2026-12-03T00:00:00Z), got "${text}"`);
  return t;
};

const shardOf: ValueParser<ShardSpec> = (text, previous) => {
  once('shard', previous);
  return parseShard(text);
};

const rtnSemiAxes: ValueParser<[number, number, number]> = (text, previous) => {
  once('volume-rtn-km', previous);
  const parts = text.split(',').map((x) => Number(x.trim()));
  if (parts.length !== 3 || parts.some((x) => !(x > 0 && x <= 1000))) {
    throw new KeepclearError('BAD_ARGUMENT', `--volume-rtn-km needs three positive semi-axes R,T,N in km, got "${text}"`);
  }
  return [parts[0]!, parts[1]!, parts[2]!];
};

/** Screening settings from the checked options (DESIGN.md CLI contract); `now` is the default start. */
export function settingsFrom(o: ScreenOptions, now: number): ScreeningSettings {
  if ((o.all === true) === (o.primary !== undefined)) {
    throw new KeepclearError('BAD_ARGUMENT', 'give exactly one of --primary ID[,ID...] or --all');
  }
  if (o.thresholdKm !== undefined && o.volumeRtnKm !== undefined) {
    throw new KeepclearError('BAD_ARGUMENT', 'give either --threshold-km or --volume-rtn-km, not both');
  }
  const start = o.start ?? (now as Instant);
  const volume: ScreeningVolume = o.volumeRtnKm
    ? { kind: 'rtn-ellipsoid', rKm: o.volumeRtnKm[0], tKm: o.volumeRtnKm[1], nKm: o.volumeRtnKm[2] }
    : { kind: 'sphere', radiusKm: o.thresholdKm ?? DEFAULT_THRESHOLD_KM };
  const end = (start + (o.days ?? DEFAULT_DAYS) * MS_PER_DAY) as Instant;
  if (o.shard) {
    if (!o.all) throw new KeepclearError('BAD_ARGUMENT', '--shard K/N splits an all-vs-all run: give it with --all');
    if (o.json === undefined) {
      throw new KeepclearError('BAD_ARGUMENT', "--shard K/N needs --json FILE: a shard's result is a file that keepclear merge joins with the others");
    }
    if (o.attentionExit !== undefined || o.attentionFile !== undefined || o.attentionTier !== undefined) {
      throw new KeepclearError('BAD_ARGUMENT', 'the --attention-* options judge a whole run; a shard is part of one (use them after keepclear merge)');
    }
    return { start, end, volume, primaries: 'all', shard: o.shard };
  }
  return { start, end, volume, primaries: o.all ? 'all' : o.primary! };
}

/**
 * `keepclear screen`: imports --catalog files first, screens, stores the run with each event's
 * risk, and shows what needs attention. Ctrl-C cancels; the partial run is stored as cancelled.
 */
export default defineCommand<ScreenOptions>({
  name: 'screen',
  summary: 'screen primaries (or all objects) against the catalogue for close approaches',
  synopsis:
    '[--catalog FILE]... (--primary ID[,ID...] | --all) [--shard K/N] [--start ISO8601] [--days N] ' +
    '[--threshold-km X | --volume-rtn-km R,T,N] [--db FILE] [--json FILE|-] [--workers N] [--all-events]',
  options: [
    { flags: '--catalog <FILE>', description: 'import this catalogue file first (repeatable)', parse: repeatable },
    { flags: '--primary <ID[,ID...]>', description: 'catalogue numbers of the primaries (Alpha-5 allowed)', parse: primaryIds },
    { flags: '--all', description: 'every object is a primary (all-vs-all)' },
    {
      flags: '--shard <K/N>',
      description: 'with --all: screen only the K-th of N parts of the pairs and write it to --json; keepclear merge joins the N parts (docs/sharding.md)',
      parse: shardOf,
    },
    { flags: '--start <ISO8601>', description: 'window start, UTC (default: now)', parse: isoStart },
    {
      flags: '--days <N>',
      description: `window length in days (default: ${DEFAULT_DAYS})`,
      parse: numberIn('days', (x) => x > 0 && x <= 60, 'a number of days in (0, 60]'),
    },
    {
      flags: '--threshold-km <X>',
      description: `screening sphere radius in km (default: ${DEFAULT_THRESHOLD_KM})`,
      parse: numberIn('threshold-km', (x) => x > 0 && x <= 1000, 'a distance in km in (0, 1000]'),
    },
    { flags: '--volume-rtn-km <R,T,N>', description: "screening ellipsoid semi-axes in the primary's RTN frame, km", parse: rtnSemiAxes },
    dbOption,
    jsonOption,
    workersOption,
    allEventsOption,
    {
      flags: '--attention-tier <TIER>',
      description: `for scheduled jobs: the tier (plan, monitor, routine) at or above which an event needs attention (default: ${DEFAULT_ATTENTION_TIER})`,
      parse: attentionTier,
    },
    {
      flags: '--attention-exit <CODE>',
      description: 'exit with CODE (3..125) when the run holds an event at or above --attention-tier (opt-in; failures still exit 1)',
      // 0, 1 and 2 mean success, failure and bad arguments (DESIGN.md); above 125 the shell reserves
      parse: numberIn('attention-exit', (x) => Number.isInteger(x) && x >= 3 && x <= 125, 'a whole number 3..125'),
    },
    {
      flags: '--attention-file <PATH>',
      description: 'write a small JSON flag file when the run needs attention (events, series, tier); remove it when it does not',
    },
  ],
  examples: [
    'keepclear screen --catalog catalog.json --primary 80001,80003 --start 2026-12-07T00:00:00Z --days 7',
    'keepclear screen --all --days 1 --threshold-km 5 --json run.json',
    'keepclear screen --all --days 1 --shard 2/7 --start 2026-12-07T00:00:00Z --json shard-2.json',
    'keepclear screen --catalog week.json --primary 100001,100002 --attention-tier plan --attention-exit 10 --attention-file /var/lib/keepclear/ATTENTION.json',
  ],
  async run(_args, o) {
    const settings = settingsFrom(o, Date.now());
    if (!settings.shard && settings.primaries !== 'all' && o.workers !== 0) {
      // The workers load their modules while this thread loads its own and reads the catalogue.
      const { prestartScreeningWorkers } = await import('../../core/screening/run.js');
      prestartScreeningWorkers(o.workers);
    }
    // Loaded together: the module loader reads and compiles them concurrently.
    const [
      { openDatabase, defaultDbPath },
      { screenAndStore },
      { eventToJson, runToJson },
      { seriesStatesOf },
      { countOfStates },
      { attentionJson, attentionOf, updateAttentionFile },
      { seriesCounts },
      { presentFileOutcome, presentImportTotal },
      { eventSummary, SCREEN_SUMMARY_ROWS },
      { writeJsonWithCaution, writeJsonListWithCaution },
      { progress },
      { describeEphemeris },
    ] = await Promise.all([
      import('../../db/index.js'),
      import('../../app/screen.js'),
      import('../../app/eventJson.js'),
      import('../../app/seriesJson.js'),
      import('../../app/series.js'),
      import('../../app/attention.js'),
      import('../present/series.js'),
      import('../present/imports.js'),
      import('../present/events.js'),
      import('../present/json.js'),
      import('../present/progress.js'),
      import('../../app/ephemerisText.js'),
    ]);

    const jsonOnly = o.json === '-';
    const db = openDatabase(o.db ?? defaultDbPath());
    const controller = new AbortController();
    const onSigint = () => controller.abort();
    process.once('SIGINT', onSigint);
    const bar = progress('screening');
    try {
      let exit = 0;
      if (o.catalog && o.catalog.length > 0) {
        // With --json - the counts go to stderr: stdout carries only JSON.
        const out = jsonOnly ? process.stderr : process.stdout;
        // Loaded only when there is something to import: the readers (XML parser included) cost ~0.1 s.
        const { importFiles } = await import('../../app/import/index.js');
        // The screening below computes the catalogue's fingerprint while its workers start.
        const summary = importFiles(db, { files: o.catalog, onFile: (f) => presentFileOutcome(f, out), keepFingerprint: false });
        presentImportTotal(summary, out);
        if (!summary.clean) exit = 1;
      }
      if (settings.shard) {
        const { screenShard } = await import('../../app/shards.js');
        const r = await screenShard(db, {
          settings: { ...settings, shard: settings.shard },
          ...(o.workers !== undefined ? { workers: o.workers } : {}),
          onProgress: bar.update,
          signal: controller.signal,
        });
        bar.stop();
        for (const f of r.flagged) process.stderr.write(`keepclear: flagged ${f.id}: ${f.reason}\n`);
        writeJsonWithCaution(o.json!, r.doc);
        if (r.cancelled) process.stderr.write('keepclear: screening cancelled; the shard is marked cancelled and merge will refuse it\n');
        if (!jsonOnly) {
          process.stdout.write(
            `shard ${settings.shard.index}/${settings.shard.count}: ${r.eventCount} event(s), ${r.objects} objects, ` +
              `${(r.wallMs / 1000).toFixed(2)} s; written to ${o.json}. Join all ${settings.shard.count} shards with keepclear merge.\n`,
          );
        }
        return r.cancelled ? 1 : exit;
      }
      // KEEPCLEAR_PHASES=1: each phase's wall time and the process's peak memory on stderr (bench/).
      const phases = process.env['KEEPCLEAR_PHASES'] === '1';
      let mark = performance.now();
      const phase = (name: string, ms = performance.now() - mark): void => {
        if (phases) process.stderr.write(`keepclear phase ${name}: ${(ms / 1000).toFixed(2)} s, peak rss ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MiB\n`);
        mark = performance.now();
      };
      const { run, events, ephemerides, notes } = await screenAndStore(db, {
        settings,
        ...(o.workers !== undefined ? { workers: o.workers } : {}),
        onProgress: bar.update,
        signal: controller.signal,
        ...(phases ? { onPhase: (name: string, ms: number) => phase(name, ms) } : {}),
      });
      bar.stop();
      // Which source each primary was screened from, on stderr (stdout may carry only JSON).
      for (const e of ephemerides) process.stderr.write(`primary ${e.objectId}: ephemeris: ${describeEphemeris(e)}\n`);
      for (const n of notes) process.stderr.write(`keepclear: ${n}\n`);
      for (const f of run.flagged) process.stderr.write(`keepclear: flagged ${f.id}: ${f.reason}\n`);
      if (run.status === 'cancelled') process.stderr.write('keepclear: screening cancelled; partial results stored\n');
      const states = seriesStatesOf(db, events);
      phase('series states');
      if (o.json !== undefined) writeJsonListWithCaution(o.json, { run: runToJson(run, run.flagged, ephemerides) }, 'events', events, (e) => eventToJson(e, states));
      phase('json');
      const attention = attentionOf(events, o.attentionTier ?? DEFAULT_ATTENTION_TIER);
      if (o.attentionFile !== undefined) {
        // A cancelled run saw only part of the window: it can raise the flag, never clear it.
        const doc = attentionJson(run, attention, states, Date.now() as Instant);
        if (attention.needed || run.status === 'done') updateAttentionFile(o.attentionFile, doc);
      }
      if (!jsonOnly) {
        const seconds = ((run.wallMs ?? 0) / 1000).toFixed(2);
        process.stdout.write(`run ${run.id}: ${events.length} event(s), ${run.objectCount} objects, ${seconds} s\n`);
        // the run's series, counted from the states already read (not from every stored series)
        const more = states.size > 0 ? [`${seriesCounts(countOfStates(states))} (keepclear events --series ID shows one)`] : [];
        if (o.attentionExit !== undefined || o.attentionFile !== undefined) {
          more.push(
            attention.needed
              ? `Attention: ${attention.events.length} event(s) at or above ${attention.tier}${o.attentionFile ? ` (flag file ${o.attentionFile})` : ''}.`
              : `Attention: no event at or above ${attention.tier}.`,
          );
        }
        process.stdout.write(eventSummary(events, o.allEvents === true, more, undefined, SCREEN_SUMMARY_ROWS));
      }
      phase('summary');
      if (run.status === 'cancelled') return 1;
      // Opt-in: the attention code wins over exit 1 for rejected catalogue records (reported on
      // stderr), so that a few bad records in a weekly file cannot hide an approach.
      if (o.attentionExit !== undefined && attention.needed) return o.attentionExit;
      return exit;
    } finally {
      bar.stop();
      process.off('SIGINT', onSigint);
      db.close();
    }
  },
});
