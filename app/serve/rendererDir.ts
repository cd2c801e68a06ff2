/**
 * Where the built renderer (renderer/vite.config.ts → dist/renderer) lives: KEEPCLEAR_RENDERER_DIR,
 * else dist/renderer in the package this file belongs to (found upwards from here, so it works
 * from the sources and from a compiled copy alike).
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { KeepclearError } from '../../core/errors.js';

function packageRoot(from: string): string | null {
  let dir = from;
  for (;;) {
    const pkg = join(dir, 'package.json');
    if (existsSync(pkg)) {
      try {
        if ((JSON.parse(readFileSync(pkg, 'utf8')) as { name?: unknown }).name === 'keepclear') return dir;
      } catch {
        // not ours; keep looking upwards
      }
    }
    const up = dirname(dir);
    if (up === dir) return null;
    dir = up;
  }
}

export function rendererDir(env: NodeJS.ProcessEnv = process.env): string {
  const explicit = env['KEEPCLEAR_RENDERER_DIR'];
  const root = packageRoot(dirname(fileURLToPath(import.meta.url)));
  const dir = explicit ? resolve(explicit) : root ? join(root, 'dist', 'renderer') : null;
  if (dir === null || !existsSync(join(dir, 'index.html'))) {
    throw new KeepclearError(
      'NOT_FOUND',
      `the user interface is not built${dir ? ` (no ${join(dir, 'index.html')})` : ''}: run \`npm run build:renderer\` in the Keepclear folder ` +
        '(npm ci and npm install run it for you), or set KEEPCLEAR_RENDERER_DIR to a built renderer',
    );
  }
  return dir;
}
