// vitest global setup: compiles the program into dist/ (scripts/build.mjs, ~1–2 s) before any
// test runs, so tests that start the real `keepclear` command (bin/keepclear.js runs dist/)
// exercise the sources as they are now, never a stale build.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { ROOT } from './cli.js';

export default function setup(): void {
  const r = spawnSync(process.execPath, [join(ROOT, 'scripts', 'build.mjs')], { cwd: ROOT, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`building dist/ failed:\n${r.stdout}\n${r.stderr}`);
}
