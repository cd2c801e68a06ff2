import { KeepclearError } from '../core/errors.js';

/** Parsed command line: positional arguments and `--name value` / `--flag` options. */
export interface ParsedArgs {
  readonly positional: string[];
  readonly options: Map<string, string | true>;
}

export interface OptionSpec {
  /** Options that take a value (`--db FILE`). */
  readonly valued: readonly string[];
  /** Options that are switches (`--all`). */
  readonly flags?: readonly string[];
  /** Options that may be given more than once; their values are joined with "\u0000". */
  readonly repeatable?: readonly string[];
}

/** Parses argv strictly: an unknown option or a missing value is a BAD_ARGUMENT (exit code 2). */
export function parseArgs(argv: readonly string[], spec: OptionSpec): ParsedArgs {
  const positional: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === '--') {
      positional.push(...argv.slice(i + 1));
      break;
    }
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
      if (spec.flags?.includes(name)) {
        options.set(name, true);
        continue;
      }
      if (!spec.valued.includes(name)) {
        throw new KeepclearError('BAD_ARGUMENT', `unknown option --${name}; see --help`);
      }
      const value = eq > 0 ? a.slice(eq + 1) : argv[++i];
      if (value === undefined || (eq < 0 && value.startsWith('--') && value !== '-')) {
        throw new KeepclearError('BAD_ARGUMENT', `option --${name} needs a value`);
      }
      const prev = options.get(name);
      if (prev !== undefined && spec.repeatable?.includes(name)) {
        options.set(name, `${prev}\u0000${value}`);
      } else if (prev !== undefined) {
        throw new KeepclearError('BAD_ARGUMENT', `option --${name} given twice`);
      } else {
        options.set(name, value);
      }
      continue;
    }
    positional.push(a);
  }
  return { positional, options };
}

export function optString(args: ParsedArgs, name: string): string | undefined {
  const v = args.options.get(name);
  return typeof v === 'string' ? v : undefined;
}

export function optList(args: ParsedArgs, name: string): string[] {
  const v = optString(args, name);
  return v === undefined ? [] : v.split('\u0000');
}

export function optNumber(
  args: ParsedArgs,
  name: string,
  check: (x: number) => boolean = Number.isFinite,
  what = 'a finite number',
): number | undefined {
  const v = optString(args, name);
  if (v === undefined) return undefined;
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x) || !check(x)) {
    throw new KeepclearError('BAD_ARGUMENT', `--${name} must be ${what}, got "${v}"`);
  }
  return x;
}

export const optFlag = (args: ParsedArgs, name: string): boolean => args.options.get(name) === true;
