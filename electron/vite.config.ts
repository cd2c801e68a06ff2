/**
 * Builds the Electron side into dist/electron (two passes, because the sandboxed preload must be
 * one CommonJS file while the main process is an ES module):
 *
 *   npx vite build -c electron/vite.config.ts --mode main      → dist/electron/main.js (from entry.ts)
 *   npx vite build -c electron/vite.config.ts --mode preload   → dist/electron/preload.cjs
 *
 * The main process is not bundled with core/, db/ and app/: its imports of them stay as written
 * ('../app/bridge/handlers.js' from dist/electron/main.js), so they load the compiled program
 * that `npm run build:cli` (scripts/build.mjs, also run at install) puts in dist/core, dist/db and
 * dist/app — the same code the CLI runs (scripts/build.mjs makes every such import from electron/
 * a bundled entry point at that path; shared code lives in dist/chunks). npm dependencies and Node built-ins stay external too. The sandboxed preload is
 * bundled whole (it cannot load other files).
 */
import { builtinModules } from 'node:module';
import { fileURLToPath } from 'node:url';
import { defineConfig, type UserConfig } from 'vite';

const at = (p: string): string => fileURLToPath(new URL(p, import.meta.url));
const outDir = at('../dist/electron');

const mainConfig: UserConfig = {
  build: {
    ssr: at('./entry.ts'),
    outDir,
    emptyOutDir: false,
    target: 'node22',
    sourcemap: true,
    rolldownOptions: {
      external: (id: string) => /^(\.\.\/)+(core|db|app)\//.test(id),
      output: { format: 'es', entryFileNames: 'main.js' },
    },
  },
};

const preloadConfig: UserConfig = {
  build: {
    outDir,
    emptyOutDir: false,
    target: 'chrome130',
    minify: false,
    sourcemap: true,
    lib: { entry: at('./preload.ts'), formats: ['cjs'], fileName: () => 'preload.cjs' },
    rolldownOptions: { external: ['electron', ...builtinModules, ...builtinModules.map((m) => `node:${m}`)] },
  },
};

export default defineConfig(({ mode }) => {
  if (mode === 'main') return mainConfig;
  if (mode === 'preload') return preloadConfig;
  throw new Error(`electron/vite.config.ts: use --mode main or --mode preload (got "${mode}")`);
});
