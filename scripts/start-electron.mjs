#!/usr/bin/env node
// `npm start`: runs the desktop app where Electron's runtime is installed. Electron is an
// optional dependency (its runtime is a separate download that some machines refuse), so on a
// machine without it this says so and what to do, instead of failing with a stack trace.
// Builds what is missing first: the renderer and the Electron bundles (dist/), and
// better-sqlite3 for Electron's ABI (build/electron-native/, scripts/electron-native.mjs).
//
//   node scripts/start-electron.mjs           start the app
//   node scripts/start-electron.mjs --check   only say whether it could start (exit 0 or 1)
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const require = createRequire(import.meta.url);
const check = process.argv.includes('--check');

/** The Electron executable, or null with the reason. */
function electronBinary() {
  let pkg;
  try {
    pkg = require.resolve('electron/package.json', { paths: [ROOT] });
  } catch {
    return { path: null, why: 'the electron package is not installed (it is optional: npm ci may have skipped it)' };
  }
  try {
    // The package's index.js returns the runtime's path, or throws when the download did not happen.
    const path = require(dirname(pkg));
    if (typeof path === 'string' && existsSync(path)) return { path, why: null };
    return { path: null, why: `Electron's runtime is missing at ${path}` };
  } catch {
    return { path: null, why: "the electron package is installed but its runtime was not downloaded" };
  }
}

const { path: electron, why } = electronBinary();
if (!electron) {
  const version = require(join(ROOT, 'package.json')).optionalDependencies?.electron ?? '';
  console.error(
    `keepclear: cannot start the desktop app here: ${why}.\n` +
      `  On a machine with internet access, install it: npm install --no-save electron@${version}\n` +
      '  (or run "npm ci" there). Without Electron, everything else works: "npx keepclear --help" for\n' +
      '  the command line, and "npx keepclear serve" opens the same app in your browser.',
  );
  process.exit(1);
}
if (check) {
  console.log(`keepclear: Electron found at ${electron}`);
  process.exit(0);
}

const run = (cmd, args) => {
  const r = spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit', shell: process.platform === 'win32' });
  if (r.status !== 0) process.exit(r.status ?? 1);
};
if (!existsSync(join(ROOT, 'dist', 'renderer', 'index.html'))) run('npm', ['run', 'build:renderer']);
if (!existsSync(join(ROOT, 'dist', 'electron', 'main.js'))) run('npm', ['run', 'build:electron']);
if (!existsSync(join(ROOT, 'build', 'electron-native', 'better_sqlite3.node'))) run(process.execPath, [join(ROOT, 'scripts', 'electron-native.mjs')]);
const r = spawnSync(electron, [join(ROOT, 'dist', 'electron', 'main.js')], { cwd: ROOT, stdio: 'inherit' });
process.exit(r.status ?? 0);
