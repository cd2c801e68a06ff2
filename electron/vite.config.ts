/**
 * Builds the Electron side into dist/electron (two passes, because the sandboxed preload must be
 * one CommonJS file while the main process is an ES module):
 *
 *   npx vite build -c electron/vite.config.ts --mode main      → dist/electron/main.js
 *   npx vite build -c electron/vite.config.ts --mode preload   → dist/electron/preload.cjs
 *
 * core/ is bundled in; npm dependencies (better-sqlite3, …) and Node built-ins stay external.
 */
import { builtinModules } from 'node:module';
import { fileURLToPath } from 'node:url';
import { defineConfig, type UserConfig } from 'vite';

const at = (p: string): string => fileURLToPath(new URL(p, import.meta.url));
const outDir = at('../dist/electron');

const mainConfig: UserConfig = {
  build: {
    ssr: at('./main.ts'),
    outDir,
    emptyOutDir: false,
    target: 'node22',
    sourcemap: true,
    rolldownOptions: { output: { format: 'es', entryFileNames: 'main.js' } },
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
