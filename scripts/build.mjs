#!/usr/bin/env node
// Compiles the program (core, db, app, cli) from TypeScript to JavaScript in dist/, one output
// file per source file, so `keepclear` and its screening workers start without compiling or
// bundling anything (npm ci / npm install run this as the `prepare` script).
//
// Why esbuild and not tsc: it compiles the ~200 files in well under a second on this machine
// (tsc takes tens of seconds and would type-check again; `npm run typecheck` does that), and it
// lets the build rewrite the three imports core/propagation/sgp4.ts makes by file path into
// satellite.js (functions its export map does not expose), which must reach one folder further
// up from dist/. Each file is "bundled" with every import kept external: that is a plain
// per-file compile with control over import paths. The module layout stays the same as the
// sources, so lazy imports stay lazy and `--help` loads only what it loads from source.
import { build } from 'esbuild';
import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const OUT = join(ROOT, 'dist');
const FOLDERS = ['core', 'db', 'app', 'cli'];

function sources(dir) {
  const out = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sources(p));
    else if (name.endsWith('.ts') && !name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

/** Every import stays an import; paths into node_modules gain the one level dist/ adds. */
const keepImports = {
  name: 'keep-imports',
  setup(b) {
    b.onResolve({ filter: /.*/ }, (args) => {
      if (args.kind === 'entry-point') return undefined;
      const path = args.path.includes('/node_modules/') && args.path.startsWith('.') ? `../${args.path}` : args.path;
      return { path, external: true };
    });
  },
};

const t0 = performance.now();
// Built beside dist/ and swapped in folder by folder, so a `keepclear` started while another
// build runs (two test runs at once) never finds a half-written or missing program.
const STAGE = join(ROOT, `dist.build-${process.pid}`);
rmSync(STAGE, { recursive: true, force: true });
const entryPoints = FOLDERS.flatMap((f) => sources(join(ROOT, f)));
try {
  await build({
    entryPoints,
    outdir: STAGE,
    outbase: ROOT,
    bundle: true,
    plugins: [keepImports],
    platform: 'node',
    format: 'esm',
    target: 'node20',
    sourcemap: 'linked',
    logLevel: 'warning',
  });
  mkdirSync(OUT, { recursive: true });
  // Only the compiled program's folders are replaced; the Electron build keeps its own.
  for (const f of FOLDERS) {
    const old = join(OUT, `${f}.old-${process.pid}`);
    if (existsSync(join(OUT, f))) renameSync(join(OUT, f), old);
    renameSync(join(STAGE, f), join(OUT, f));
    rmSync(old, { recursive: true, force: true });
  }
} finally {
  rmSync(STAGE, { recursive: true, force: true });
}
const ms = performance.now() - t0;
console.log(`keepclear: compiled ${entryPoints.length} files to ${relative(process.cwd(), OUT) || '.'}/ in ${ms.toFixed(0)} ms`);
