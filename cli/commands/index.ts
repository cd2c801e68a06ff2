import { importCommand } from './import.js';

/** A CLI command: takes the arguments after its name, returns the exit code. */
export type Command = (argv: readonly string[]) => Promise<number>;

/** Registry of commands; each lives in its own file in this folder. */
export const COMMANDS: Record<string, Command> = {
  import: importCommand,
};
