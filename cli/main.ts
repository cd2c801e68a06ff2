import { KeepclearError } from '../core/errors.js';
import { COMMANDS } from './commands/index.js';

export const USAGE = `keepclear — conjunction screening for satellite operators

Usage:
  keepclear import FILE... [--db FILE] [--hbr-m X]
  keepclear screen [--catalog FILE]... (--primary ID[,ID...] | --all)
                   [--start ISO8601] [--days N] [--threshold-km X | --volume-rtn-km R,T,N]
                   [--db FILE] [--json FILE|-]
  keepclear events [--db FILE] [--run ID] [--json FILE|-]
  keepclear report (--event ID | --run ID) --out FILE.html|FILE.pdf [--db FILE]
  keepclear demo   [--out DIR]
  keepclear help

Files: TLE (2- or 3-line), CCSDS OMM (KVN, XML, JSON, CSV), CCSDS CDM (KVN, XML).
Times are UTC, ISO 8601. Distances in km unless the option name says otherwise.
Exit codes: 0 success, 1 bad input or failure, 2 bad arguments.

Keepclear is a decision aid. Defer to your screening provider's messages, your licensed
practice and local rules before acting on any result.
`;

/** Runs one CLI invocation and returns its exit code. Never throws. */
export async function main(argv: readonly string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === 'help' || name === '--help' || name === '-h') {
    process.stdout.write(USAGE);
    return 0;
  }
  if (name === '--version') {
    process.stdout.write('keepclear 0.1.0\n');
    return 0;
  }
  const command = COMMANDS[name];
  if (!command) {
    process.stderr.write(`keepclear: unknown command "${name}"; run keepclear --help\n`);
    return 2;
  }
  try {
    return await command(rest);
  } catch (err) {
    if (err instanceof KeepclearError) {
      process.stderr.write(`keepclear: ${err.toLine()}\n`);
      return err.code === 'BAD_ARGUMENT' ? 2 : 1;
    }
    process.stderr.write(`keepclear: internal error: ${(err as Error).stack ?? String(err)}\n`);
    return 1;
  }
}
