/**
 * `keepclear`: commander parses the arguments and writes the help; each command is declared in
 * its own file (cli/commands/). This file maps what went wrong to the exit codes of DESIGN.md:
 * 0 success, 2 bad arguments, 1 bad input files or failures, with `keepclear: …` lines on stderr.
 * It imports nothing heavy: `keepclear --help` loads no database, reader or plotting code.
 */
import { Command, CommanderError } from 'commander';
import { KeepclearError } from '../core/errors.js';
import { storageError } from '../db/storageErrors.js';
import { addCommand, quietErrors } from './command.js';
import { COMMANDS } from './commands/index.js';

const VERSION = '0.1.0';

const GENERAL_HELP = `
Files: TLE (2- or 3-line), CCSDS OMM (KVN, XML, JSON, CSV), CCSDS CDM (KVN, XML).
Times are UTC, ISO 8601. Distances in km unless the option name says otherwise.
Exit codes: 0 success, 1 bad input or failure, 2 bad arguments.
Environment: KEEPCLEAR_DB (database file when --db is not given), KEEPCLEAR_BUSY_TIMEOUT_MS (how long
to wait for another process writing to the database; default 60000).

Keepclear is a decision aid. Defer to your screening provider's messages, your licensed
practice and local rules before acting on any result.
`;

const HELP_WIDTH = 100;

/** "keepclear screen [--a X] (--b | --c) …" broken between groups, continued under the first. */
function wrapSynopsis(head: string, synopsis: string): string[] {
  const groups: string[] = [];
  let depth = 0;
  let cur = '';
  for (const ch of synopsis) {
    if (ch === ' ' && depth === 0) {
      if (cur) groups.push(cur);
      cur = '';
      continue;
    }
    if (ch === '[' || ch === '(') depth++;
    if (ch === ']' || ch === ')') depth--;
    cur += ch;
  }
  if (cur) groups.push(cur);
  const indent = ' '.repeat(head.length + 1);
  const lines = [head];
  for (const g of groups) {
    const last = lines[lines.length - 1]!;
    if (last.length + 1 + g.length > HELP_WIDTH && last.trim() !== '') lines.push(`${indent}${g}`);
    else lines[lines.length - 1] = `${last} ${g}`;
  }
  return lines;
}

/** Every command with its synopsis, every option and an example: the whole CLI on one page. */
function commandsHelp(): string {
  const blocks = COMMANDS.map((c) => {
    const width = Math.max(...c.options.map((o) => o.flags.length));
    const options = c.options.map((o) => `      ${o.flags.padEnd(width)}  ${o.description}`);
    return [...wrapSynopsis(`  keepclear ${c.name}`, c.synopsis), `    ${c.summary}`, ...options, `    example: ${c.examples[0]}`].join('\n');
  });
  return `\nCommands (keepclear COMMAND --help shows one command):\n\n${blocks.join('\n\n')}\n${GENERAL_HELP}`;
}

function buildProgram(exit: (code: number) => void): Command {
  const program = new Command('keepclear')
    .description('keepclear — conjunction screening for satellite operators')
    .usage('COMMAND [options]')
    .version(`keepclear ${VERSION}`, '--version', 'print the version')
    .helpOption('-h, --help', 'show this help')
    .configureHelp({ visibleCommands: () => [] })
    .addHelpText('after', commandsHelp());
  quietErrors(program, 'keepclear');
  for (const spec of COMMANDS) addCommand(program, spec, exit);
  return program;
}

/** The one line a failure prints, and its exit code. */
function failure(err: unknown): { line: string; code: number } {
  if (err instanceof KeepclearError) return { line: err.toLine(), code: err.code === 'BAD_ARGUMENT' ? 2 : 1 };
  const storage = storageError(err, 'database');
  if (storage) return { line: storage.toLine(), code: 1 };
  return { line: `internal error (please report it): ${(err as Error).stack ?? String(err)}`, code: 1 };
}

/** Runs one CLI invocation and returns its exit code. Never throws. */
export async function main(argv: readonly string[]): Promise<number> {
  let code = 0;
  const program = buildProgram((c) => (code = c));
  try {
    if (argv.length === 0) {
      program.outputHelp();
      return 0;
    }
    await program.parseAsync([...argv], { from: 'user' });
    return code;
  } catch (err) {
    if (err instanceof CommanderError) return err.exitCode; // help or version, already written
    const f = failure(err);
    process.stderr.write(`keepclear: ${f.line}\n`);
    return f.code;
  }
}

