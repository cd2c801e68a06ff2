/**
 * The commands of `keepclear`, in the order --help lists them. Adding a command: write
 * cli/commands/NAME.ts exporting `defineCommand({...})` as default, and add one line here.
 * Keep this file and the command files free of heavy imports (database, readers, plots):
 * commands import those inside `run`, so `keepclear --help` starts fast.
 */
import type { CommandSpec } from '../command.js';
import demo from './demo.js';
import events from './events.js';
import exportCommand from './export.js';
import importCommand from './import.js';
import plan from './plan.js';
import report from './report.js';
import merge from './merge.js';
import screen from './screen.js';
import serve from './serve.js';
import spacecraft from './spacecraft.js';

// Each spec is typed by its own options; the registry only needs to hand them to commander.
export const COMMANDS: readonly CommandSpec<never>[] = [
  importCommand, screen, merge, events, report, exportCommand, plan, spacecraft, demo, serve,
];
