#!/usr/bin/env node
// Compiles the program (core, db, app, cli) from TypeScript into a few bundled JavaScript files
// in dist/, so `keepclear` and its screening workers start without compiling anything and
// without resolving and loading a hundred small modules (npm ci / npm install run this as the
// `prepare` script).
//
// Layout of dist/ (esbuild, bundle + splitting, ES modules):
//   dist/cli/main.js                        the CLI entry (bin/keepclear.js starts it)
//   dist/core/screening/worker.js, …        every file started as a worker thread by path
//                                           (found from the `startWorkers('./x.ts', …)` calls)
//   dist/app/bridge/handlers.js, …          every module the Electron main process imports by
//                                           path (found from electron/*.ts)
//   dist/chunks/*-HASH.js                   code shared between those entries, and every lazy
//                                           `import()` as its own chunk, so `--help` still loads
//                                           only what it needs
// Our sources and satellite.js (three of core/propagation/sgp4.ts's imports reach into its
// files by path, for functions its export map does not expose) are bundled in; every other npm
// package (better-sqlite3 above all: a native module) and Node's built-ins stay imports.
//
// Why: measured on the 30,000-object screening (issue 10), the per-file build spent ~0.2 s of
// the main thread and ~0.07 s of each worker resolving, loading and compiling ~100 modules.
import { build } from 'esbuild';
import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, utimesSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..');
const OUT = join(ROOT, 'dist');
const FOLDERS = ['core', 'db', 'app', 'cli'];
/** Shared and lazily imported code; file names carry a content hash. */
const CHUNKS = 'chunks';
/** Chunks no current entry refers to are kept this long for programs started before a rebuild. */
const STALE_CHUNK_MS = 60 * 60 * 1000;
/** npm packages bundled in (everything else from node_modules stays external). */
const BUNDLED_PACKAGES = ['satellite.js'];

function sources(dir) {
  const out = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sources(p));
    else if (name.endsWith('.ts') && !name.endsWith('.d.ts')) out.push(p);
  }
  return out;
}

const all = FOLDERS.flatMap((f) => sources(join(ROOT, f)));

/** Files started as worker threads: `startWorkers('./worker.ts', import.meta.url, …)`. */
function workerEntries() {
  const out = [];
  for (const file of all) {
    for (const m of readFileSync(file, 'utf8').matchAll(/startWorkers\(\s*'([^']+\.ts)'/g)) {
      const w = resolve(dirname(file), m[1]);
      if (!existsSync(w)) throw new Error(`${relative(ROOT, file)}: starts a worker from ${m[1]}, which does not exist`);
      out.push(w);
    }
  }
  return out;
}

/** Modules the Electron main process imports from dist/ by path (electron/vite.config.ts keeps them external). */
function electronEntries() {
  const dir = join(ROOT, 'electron');
  if (!existsSync(dir)) return [];
  const out = [];
  for (const name of readdirSync(dir).filter((n) => n.endsWith('.ts') && !n.endsWith('.d.ts'))) {
    const text = readFileSync(join(dir, name), 'utf8');
    // Value imports only: `import type …` is erased by the Electron build.
    for (const m of text.matchAll(/^(?!import type)[^\n]*?(?:from|import\()\s*'(\.\.\/(?:core|db|app)\/[^']+)\.js'/gm)) {
      const ts = join(dir, `${m[1]}.ts`);
      if (!existsSync(ts)) throw new Error(`electron/${name}: imports ${m[1]}.js, which has no source ${relative(ROOT, ts)}`);
      out.push(ts);
    }
  }
  return out;
}

const entryPoints = [...new Set([join(ROOT, 'cli', 'main.ts'), ...workerEntries(), ...electronEntries()])];
const entrySet = new Set(entryPoints);

/**
 * Bundled code lands in a chunk (dist/chunks/, one level under dist/) or in an entry, so
 * `import.meta.url` no longer names the module's own file. The modules that use it (the callers
 * of startWorkers, which find their worker beside them) get the URL their file would have had
 * in a one-file-per-source layout — dist/core/screening/run.js — computed from the chunk's own
 * URL. Checked after the build: every such module must have landed one level under dist/.
 */
const rewritten = new Set();
const sourceUrls = {
  name: 'source-urls',
  setup(b) {
    b.onLoad({ filter: /\.ts$/ }, (args) => {
      const rel = relative(ROOT, args.path);
      if (entrySet.has(args.path) || rel.startsWith('..') || !FOLDERS.includes(rel.split(sep)[0])) return undefined;
      const text = readFileSync(args.path, 'utf8');
      if (!/\bimport\.meta\.url\b/.test(text)) return undefined;
      rewritten.add(rel);
      const asJs = `../${rel.split(sep).join('/').replace(/\.ts$/, '.js')}`;
      return { contents: text.replace(/\bimport\.meta\.url\b/g, `new URL(${JSON.stringify(asJs)}, import.meta.url).href`), loader: 'ts' };
    });
  },
};

/** Our sources and BUNDLED_PACKAGES are bundled; other packages and Node built-ins stay imports. */
const externals = {
  name: 'externals',
  setup(b) {
    b.onResolve({ filter: /.*/ }, (args) => {
      if (args.kind === 'entry-point' || args.path.startsWith('.') || args.path.startsWith('/')) return undefined;
      if (BUNDLED_PACKAGES.some((p) => args.path === p || args.path.startsWith(`${p}/`))) return undefined;
      return { path: args.path, external: true };
    });
  },
};

const t0 = performance.now();
// Built beside dist/ and swapped in, so a `keepclear` started while another build runs (two
// test runs at once) never finds a half-written or missing program: new chunks (content-hashed
// names) are added first, then the entry folders are swapped, then old chunks are pruned.
const STAGE = join(ROOT, `dist.build-${process.pid}`);
rmSync(STAGE, { recursive: true, force: true });
let outputs = 0;
try {
  const result = await build({
    entryPoints,
    outdir: STAGE,
    outbase: ROOT,
    absWorkingDir: ROOT, // metafile paths relative to ROOT
    entryNames: '[dir]/[name]',
    chunkNames: `${CHUNKS}/[name]-[hash]`,
    bundle: true,
    splitting: true,
    plugins: [externals, sourceUrls],
    platform: 'node',
    format: 'esm',
    target: 'node20',
    sourcemap: 'linked',
    metafile: true,
    logLevel: 'warning',
  });
  const outs = Object.entries(result.metafile.outputs).filter(([p]) => p.endsWith('.js'));
  outputs = outs.length;
  for (const [out, meta] of outs) {
    const depth = relative(STAGE, resolve(ROOT, out)).split(sep).length - 1;
    for (const input of Object.keys(meta.inputs)) {
      if (rewritten.has(input.split('/').join(sep)) && depth !== 1) {
        throw new Error(`build: ${input} uses import.meta.url but was bundled into ${relative(STAGE, resolve(ROOT, out))}, not one level under dist/; make it a chunk (import it lazily) or adjust scripts/build.mjs`);
      }
    }
  }
  mkdirSync(join(OUT, CHUNKS), { recursive: true });
  const fresh = new Set(readdirSync(join(STAGE, CHUNKS)));
  for (const name of fresh) {
    // Same name, same content (the hash): a chunk already in place stays, marked as in use now.
    const at = join(OUT, CHUNKS, name);
    if (existsSync(at)) utimesSync(at, new Date(), new Date());
    else renameSync(join(STAGE, CHUNKS, name), at);
  }
  // Only the compiled program's folders are replaced; the Electron build keeps its own.
  for (const f of FOLDERS) {
    const old = join(OUT, `${f}.old-${process.pid}`);
    if (existsSync(join(OUT, f))) renameSync(join(OUT, f), old);
    if (existsSync(join(STAGE, f))) renameSync(join(STAGE, f), join(OUT, f));
    rmSync(old, { recursive: true, force: true });
  }
  const now = Date.now();
  for (const name of readdirSync(join(OUT, CHUNKS))) {
    const p = join(OUT, CHUNKS, name);
    if (!fresh.has(name) && now - statSync(p).mtimeMs > STALE_CHUNK_MS) rmSync(p, { force: true });
  }
} finally {
  rmSync(STAGE, { recursive: true, force: true });
}
const ms = performance.now() - t0;
console.log(
  `keepclear: bundled ${all.length} files into ${entryPoints.length} entries + ${outputs - entryPoints.length} chunks in ` +
    `${relative(process.cwd(), OUT) || '.'}/ in ${ms.toFixed(0)} ms`,
);
