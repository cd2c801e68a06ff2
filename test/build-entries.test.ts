/**
 * dist/ is bundled (scripts/build.mjs): only entry points keep a file at their source path. The
 * files other code loads by path must be among them — the Electron main process imports modules
 * of core/, db/ and app/ from dist/ as written in electron/*.ts, and startWorkers() starts worker
 * threads from dist/<caller's folder>/<worker>.js — and each must load in plain Node.
 * test/support/buildDist.ts built dist/ from the current sources before the tests.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { ROOT } from './support/cli.js';

function tsFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? tsFiles(p) : n.endsWith('.ts') && !n.endsWith('.d.ts') ? [p] : [];
  });
}

/** dist/ paths of the value imports electron/*.ts makes of core/, db/ and app/. */
const electronImports = [
  ...new Set(
    tsFiles(join(ROOT, 'electron')).flatMap((f) =>
      readFileSync(f, 'utf8')
        .split('\n')
        .filter((line) => !/^\s*import type\b/.test(line))
        .flatMap((line) => [...line.matchAll(/'\.\.\/((?:core|db|app)\/[^']+\.js)'/g)].map((m) => m[1]!)),
    ),
  ),
];

/** dist/ paths of the worker files startWorkers() is asked to start. */
const workers = ['core', 'db', 'app', 'cli'].flatMap((top) =>
  tsFiles(join(ROOT, top)).flatMap((f) =>
    [...readFileSync(f, 'utf8').matchAll(/startWorkers\(\s*'([^']+)\.ts'/g)].map((m) => relative(ROOT, resolve(dirname(f), `${m[1]}.js`))),
  ),
);

describe('bundled dist/ keeps the files loaded by path', () => {
  it('finds the paths to check (the scan itself works)', () => {
    expect(electronImports).toContain('app/bridge/handlers.js');
    expect(workers).toContain('core/screening/worker.js');
  });

  it('has every Electron import and worker file at its dist/ path, loadable in Node', () => {
    for (const p of [...electronImports, ...workers]) expect(existsSync(join(ROOT, 'dist', p)), p).toBe(true);
    // Worker files expect a parent port: only their presence is checked here; the CLI tests start them.
    const code = `for (const u of ${JSON.stringify(electronImports.map((p) => pathToFileURL(join(ROOT, 'dist', p)).href))}) await import(u);`;
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', code], { cwd: ROOT, encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
  });

  it('bundles the sources: no dist/ file per source module', () => {
    // core/units.ts is imported everywhere but started by no one: it lives in a chunk.
    expect(existsSync(join(ROOT, 'dist', 'core', 'units.js'))).toBe(false);
    expect(readdirSync(join(ROOT, 'dist', 'chunks')).some((n) => n.endsWith('.js'))).toBe(true);
  });
});
