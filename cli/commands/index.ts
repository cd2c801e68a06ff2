import { demoCommand } from './demo.js';
import { eventsCommand } from './events.js';
import { importCommand } from './import.js';
import { reportCommand } from './report.js';
import { screenCommand } from './screen.js';

/** A CLI command: takes the arguments after its name, returns the exit code. */
export type Command = (argv: readonly string[]) => Promise<number>;

/** Registry of commands; each lives in its own file in this folder. */
export const COMMANDS: Record<string, Command> = {
  import: importCommand,
  screen: screenCommand,
  events: eventsCommand,
  report: reportCommand,
  demo: demoCommand,
};
