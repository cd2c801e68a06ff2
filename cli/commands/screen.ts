import { KeepclearError } from '../../core/errors.js';
import { parseIso, type Instant } from '../../core/time/instant.js';
import type { ScreeningSettings, ScreeningVolume } from '../../core/screening/types.js';
import { defaultDbPath, openDatabase } from '../../db/index.js';
import { daysAfter, screenAndStore } from '../../app/screen.js';
import { eventToJson, runToJson } from '../../app/eventJson.js';
import { optFlag, optList, optNumber, optString, parseArgs } from '../args.js';
import { canonicalObjectId } from '../ids.js';
import { eventTable, progressReporter, writeJson } from '../output.js';
import { importCatalogFiles } from './import.js';

const DEFAULT_DAYS = 7;
const DEFAULT_THRESHOLD_KM = 5;

/** Screening settings from the command line (DESIGN.md CLI contract). */
export function settingsFromArgs(args: ReturnType<typeof parseArgs>, now: number): ScreeningSettings {
  const all = optFlag(args, 'all');
  const primaryText = optString(args, 'primary');
  if (all === (primaryText !== undefined)) {
    throw new KeepclearError('BAD_ARGUMENT', 'give exactly one of --primary ID[,ID...] or --all');
  }
  const startText = optString(args, 'start');
  let start = now as Instant;
  if (startText !== undefined) {
    const t = parseIso(startText);
    if (t === null) throw new KeepclearError('BAD_ARGUMENT', `--start must be an ISO 8601 UTC time (2026-12-03T00:00:00Z), got "${startText}"`);
    start = t;
  }
  const days = optNumber(args, 'days', (x) => x > 0 && x <= 60, 'a number of days in (0, 60]') ?? DEFAULT_DAYS;
  const threshold = optNumber(args, 'threshold-km', (x) => x > 0 && x <= 1000, 'a distance in km in (0, 1000]');
  const rtnText = optString(args, 'volume-rtn-km');
  if (threshold !== undefined && rtnText !== undefined) {
    throw new KeepclearError('BAD_ARGUMENT', 'give either --threshold-km or --volume-rtn-km, not both');
  }
  let volume: ScreeningVolume = { kind: 'sphere', radiusKm: threshold ?? DEFAULT_THRESHOLD_KM };
  if (rtnText !== undefined) {
    const parts = rtnText.split(',').map((x) => Number(x.trim()));
    if (parts.length !== 3 || parts.some((x) => !(x > 0 && x <= 1000))) {
      throw new KeepclearError('BAD_ARGUMENT', `--volume-rtn-km needs three positive semi-axes R,T,N in km, got "${rtnText}"`);
    }
    volume = { kind: 'rtn-ellipsoid', rKm: parts[0]!, tKm: parts[1]!, nKm: parts[2]! };
  }
  const primaries = all ? 'all' : [...new Set(primaryText!.split(',').filter((x) => x.trim() !== '').map(canonicalObjectId))];
  if (primaries !== 'all' && primaries.length === 0) throw new KeepclearError('BAD_ARGUMENT', '--primary needs at least one id');
  return { start, end: daysAfter(start, days), volume, primaries };
}

export async function screenCommand(argv: readonly string[]): Promise<number> {
  const args = parseArgs(argv, {
    valued: ['catalog', 'primary', 'start', 'days', 'threshold-km', 'volume-rtn-km', 'db', 'json', 'workers'],
    flags: ['all'],
    repeatable: ['catalog'],
  });
  if (args.positional.length > 0) throw new KeepclearError('BAD_ARGUMENT', `unexpected argument "${args.positional[0]}"`);
  const settings = settingsFromArgs(args, Date.now());
  const workers = optNumber(args, 'workers', (x) => Number.isInteger(x) && x >= 0 && x <= 64, 'a whole number 0..64');
  const json = optString(args, 'json');
  const db = openDatabase(optString(args, 'db') ?? defaultDbPath());
  let exit = 0;
  const controller = new AbortController();
  const onSigint = () => controller.abort();
  process.once('SIGINT', onSigint);
  try {
    const catalogs = optList(args, 'catalog');
    if (catalogs.length > 0 && !importCatalogFiles(db, catalogs, undefined, json === '-')) exit = 1;
    const { run, events } = await screenAndStore(db, {
      settings,
      ...(workers !== undefined ? { workers } : {}),
      onProgress: progressReporter('screening'),
      signal: controller.signal,
    });
    for (const f of run.flagged) process.stderr.write(`keepclear: flagged ${f.id}: ${f.reason}\n`);
    if (run.status === 'cancelled') process.stderr.write('keepclear: screening cancelled; partial results stored\n');
    if (json !== undefined) writeJson(json, { run: runToJson(run), events: events.map(eventToJson) });
    if (json !== '-') {
      process.stdout.write(`run ${run.id}: ${events.length} event(s), ${run.objectCount} objects, ${((run.wallMs ?? 0) / 1000).toFixed(2)} s\n`);
      process.stdout.write(eventTable(events));
    }
    return run.status === 'cancelled' ? 1 : exit;
  } finally {
    process.off('SIGINT', onSigint);
    db.close();
  }
}
