/**
 * The shipped command runs compiled JavaScript (DESIGN.md "Performance targets": no TypeScript
 * compilation or bundling at run time; issue 10 item 1). bin/keepclear.js starts dist/cli/main.js,
 * which test/support/buildDist.ts compiled from the current sources before the tests.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT } from './support/cli.js';

const dir = mkdtempSync(join(tmpdir(), 'keepclear-compiled-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('compiled start-up', () => {
  it('runs dist/ and loads neither the TypeScript loader nor the bundler', () => {
    const log = join(dir, 'loads.txt');
    const r = spawnSync(
      process.execPath,
      ['--import', join(ROOT, 'test/support/recordLoads.mjs'), join(ROOT, 'bin/keepclear.js'), '--help'],
      { cwd: ROOT, encoding: 'utf8', env: { ...process.env, KEEPCLEAR_LOAD_LOG: log } },
    );
    expect(r.status, r.stderr).toBe(0);
    const loaded = readFileSync(log, 'utf8');
    expect(loaded).toContain('/dist/cli/main.js');
    expect(loaded).not.toMatch(/\/cli\/main\.ts/);
    for (const tool of ['/tsx/', '/esbuild/', 'typescript']) expect(loaded, tool).not.toContain(tool);
  });

  it('says what to do when dist/ is missing', () => {
    // The same bin in a folder with no dist/ beside it.
    mkdirSync(join(dir, 'pkg', 'bin'), { recursive: true });
    copyFileSync(join(ROOT, 'bin', 'keepclear.js'), join(dir, 'pkg', 'bin', 'keepclear.js'));
    const r = spawnSync(process.execPath, [join(dir, 'pkg', 'bin', 'keepclear.js'), '--help'], { encoding: 'utf8' });
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/^keepclear: the compiled program is missing \(dist\/cli\/main\.js\); build it with `npm run build:cli`/);
  });
});
