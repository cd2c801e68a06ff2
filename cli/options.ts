/**
 * Options several commands share, and the value checks behind them. Everything here is light
 * (no database, no readers): it is loaded for `keepclear --help`.
 */
import { KeepclearError } from '../core/errors.js';
import type { OptionSpec, ValueParser } from './command.js';
import type { ShardSpec } from '../core/screening/spatial/shard.js';

const bad = (message: string): KeepclearError => new KeepclearError('BAD_ARGUMENT', message);

/** A number option that must pass `check`; `what` completes "--NAME must be …". Given once. */
export function numberIn(name: string, check: (x: number) => boolean, what: string): ValueParser<number> {
  return (text, previous) => {
    if (previous !== undefined) throw bad(`option --${name} given twice`);
    const x = Number(text);
    if (text.trim() === '' || !Number.isFinite(x) || !check(x)) throw bad(`--${name} must be ${what}, got "${text}"`);
    return x;
  };
}

/** An option that may be given several times; its values are collected in order. */
export const repeatable: ValueParser<string[]> = (text, previous) => [...(previous ?? []), text];

export const dbOption: OptionSpec = {
  flags: '--db <FILE>',
  description: 'database file (default: $KEEPCLEAR_DB, else keepclear.db in the per-user data folder)',
};

export const jsonOption: OptionSpec = {
  flags: '--json <FILE|->',
  description: 'also write the result as JSON to FILE; "-" writes only JSON to stdout',
};

export const workersOption: OptionSpec = {
  flags: '--workers <N>',
  description: 'screening worker threads, 0 = screen in the main thread (default: one per core)',
  parse: numberIn('workers', (x) => Number.isInteger(x) && x >= 0 && x <= 64, 'a whole number 0..64'),
};

export const allEventsOption: OptionSpec = {
  flags: '--all-events',
  description: 'list every event in the terminal, not only the (at most 100) highest-Pc ones above the lowest tier',
};

/** Largest N of --shard K/N: far beyond any batch engine's array size of practical use. */
export const MAX_SHARDS = 10_000;

/** --shard K/N (1 ≤ K ≤ N ≤ MAX_SHARDS): which part of an all-vs-all run's pairs to screen. */
export function parseShard(text: string): ShardSpec {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const k = m ? Number(m[1]) : NaN, n = m ? Number(m[2]) : NaN;
  if (!m || !(n >= 1 && n <= MAX_SHARDS) || !(k >= 1 && k <= n)) {
    throw bad(`--shard must be K/N with 1 ≤ K ≤ N ≤ ${MAX_SHARDS} (e.g. 2/7), got "${text}"`);
  }
  return { index: k, count: n };
}
