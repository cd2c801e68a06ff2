/**
 * The renderer as a static page (dist/renderer), loaded from file:// by the desktop app and
 * served by `keepclear serve` for a plain browser:
 *
 *   npx vite build -c renderer/vite.config.ts          → dist/renderer/index.html + assets
 *   npx vite -c renderer/vite.config.ts                → dev server on 127.0.0.1:5173
 */
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const at = (p: string): string => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  root: at('.'),
  // relative asset URLs, so the page works from file:// as well as over HTTP
  base: './',
  build: {
    outDir: at('../dist/renderer'),
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: true,
    // three.js (~700 kB) is one chunk, loaded only when an event's 3-D view opens.
    chunkSizeWarningLimit: 1024,
  },
  server: { host: '127.0.0.1', port: 5173, strictPort: true },
});
