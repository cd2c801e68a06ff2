/**
 * How a CLI command is declared. Each command lives in one file of cli/commands/ and exports a
 * `defineCommand({...})`: its name, synopsis, options (with their value checks), examples for
 * --help, and `run`, which imports what it needs (app/, db/, presenters) inside itself so that
 * `keepclear --help` loads none of it. cli/commands/index.ts lists the commands, one line each.
 *
 * Parsing and help are commander's; this file only keeps every command alike: values are checked
 * while parsing (a bad value is a BAD_ARGUMENT, exit 2, before any database is touched), stray
 * arguments are named, and every command's help ends with its examples.
 */
import { Command, Option, type CommanderError } from 'commander';
import { KeepclearError } from '../core/errors.js';

/** Checks and converts an option's text; throws a BAD_ARGUMENT KeepclearError when it is wrong. */
export type ValueParser<T> = (text: string, previous: T | undefined) => T;

export interface OptionSpec {
  /** commander flags: '--db <FILE>' (takes a value) or '--all' (a switch) */
  readonly flags: string;
  readonly description: string;
  /**
   * Value check (a ValueParser of the option's type); default: the text itself, given at most
   * once. Declared as a method so that parsers of any value type fit.
   */
  parse?(text: string, previous: unknown): unknown;
}

export interface CommandSpec<Options> {
  readonly name: string;
  /** one line for the command list */
  readonly summary: string;
  /** what follows "keepclear NAME" in the usage line, as DESIGN.md writes it */
  readonly synopsis: string;
  /** positional arguments: '[FILE...]' or none (then any positional argument is refused) */
  readonly arguments?: string;
  readonly options: readonly OptionSpec[];
  /** at least one full command line, shown by --help */
  readonly examples: readonly [string, ...string[]];
  /**
   * Does the work and returns the exit code (0 success, 1 failure). Options arrive checked,
   * under commander's camel-case names (--hbr-m → hbrM).
   */
  readonly run: (args: readonly string[], options: Options) => Promise<number>;
}

/** Declares a command (the identity, typed: `Options` is what the option parsers return). */
export const defineCommand = <Options>(spec: CommandSpec<Options>): CommandSpec<Options> => spec;

/** The option's long name without dashes: '--hbr-m <X>' → 'hbr-m'. */
export const longName = (flags: string): string => /--([a-z0-9-]+)/.exec(flags)?.[1] ?? flags;

/** Text options without their own check may still be given only once. */
const onlyOnce =
  (name: string): ValueParser<unknown> =>
  (text, previous) => {
    if (previous !== undefined) throw new KeepclearError('BAD_ARGUMENT', `option --${name} given twice`);
    return text;
  };

/** Commander's parse errors in our words (DESIGN.md: `keepclear: what is wrong`, exit 2). */
function argumentError(err: CommanderError, command: string): Error {
  const quoted = /'([^']+)'/.exec(err.message)?.[1] ?? '';
  const flag = quoted.split(/[ <[]/)[0] ?? quoted;
  const see = `see keepclear ${command} --help`.replace('keepclear keepclear', 'keepclear');
  switch (err.code) {
    case 'commander.unknownOption':
      return new KeepclearError('BAD_ARGUMENT', `unknown option ${flag}; ${see}`);
    case 'commander.optionMissingArgument':
      return new KeepclearError('BAD_ARGUMENT', `option ${flag} needs a value; ${see}`);
    case 'commander.unknownCommand':
      return new KeepclearError('BAD_ARGUMENT', `unknown command "${flag}"; run keepclear --help`);
    case 'commander.helpDisplayed':
    case 'commander.help':
    case 'commander.version':
      return err;
    default:
      return new KeepclearError('BAD_ARGUMENT', `${err.message.replace(/^error: /, '')}; ${see}`);
  }
}

/** Makes commander throw (never exit) and print nothing of its own errors: main() reports them. */
export function quietErrors(cmd: Command, name: string): Command {
  return cmd
    .exitOverride((err) => {
      throw argumentError(err, name);
    })
    .configureOutput({ outputError: () => {} });
}

/** The examples block that ends a command's help. */
export const examplesText = (spec: CommandSpec<never>): string =>
  `\nExample${spec.examples.length > 1 ? 's' : ''}:\n${spec.examples.map((e) => `  ${e}`).join('\n')}\n`;

/** Adds one declared command to the program; `exit` receives the exit code its run returns. */
export function addCommand(program: Command, spec: CommandSpec<never>, exit: (code: number) => void): Command {
  const cmd = new Command(spec.name).description(spec.summary).usage(spec.synopsis).allowExcessArguments(true);
  quietErrors(cmd, spec.name);
  if (spec.arguments) cmd.argument(spec.arguments);
  for (const o of spec.options) {
    const opt = new Option(o.flags, o.description);
    const takesValue = o.flags.includes('<');
    const name = longName(o.flags);
    const check = o.parse ? (t: string, p: unknown) => o.parse!(t, p) : onlyOnce(name);
    // commander would take the next option as the value ("--hbr-m --db x.db"): that is a
    // missing value; a lone "-" (stdout) and negative numbers ("-1") are values.
    const parse = (t: string, p: unknown) => {
      if (t.startsWith('--')) throw new KeepclearError('BAD_ARGUMENT', `option --${name} needs a value; see keepclear ${spec.name} --help`);
      return check(t, p);
    };
    if (takesValue) opt.argParser(parse);
    cmd.addOption(opt);
  }
  cmd.addHelpText('after', examplesText(spec));
  cmd.action(async (...received: unknown[]) => {
    // commander passes the declared arguments, then the options object, then the command
    const self = received[received.length - 1] as Command;
    const options = self.opts();
    if (!spec.arguments && self.args.length > 0) {
      throw new KeepclearError('BAD_ARGUMENT', `unexpected argument "${self.args[0]}"; see keepclear ${spec.name} --help`);
    }
    const args = spec.arguments ? (received.length > 2 ? toList(received[0]) : []) : [];
    exit(await spec.run(args, options as never));
  });
  program.addCommand(cmd);
  return cmd;
}

const toList = (x: unknown): string[] => (Array.isArray(x) ? x.map(String) : x === undefined ? [] : [String(x)]);
