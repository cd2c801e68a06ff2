/** The built renderer's files, read-only, from one folder and nothing outside it. */
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, sep } from 'node:path';

const TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.json': 'application/json',
  '.map': 'application/json',
  '.woff2': 'font/woff2',
  '.txt': 'text/plain; charset=utf-8',
};

export interface StaticFile {
  readonly body: Buffer;
  readonly type: string;
}

/** The file for a URL path, or null (missing, a folder, outside the root, or an odd name). */
export async function staticFile(root: string, urlPath: string): Promise<StaticFile | null> {
  let path: string;
  try {
    path = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (path === '/' || path === '') path = '/index.html';
  if (path.includes('\0') || path.split('/').some((part) => part === '..')) return null;
  const full = normalize(join(root, path));
  if (!full.startsWith(root.endsWith(sep) ? root : root + sep)) return null;
  const type = TYPES[extname(full).toLowerCase()];
  if (!type) return null;
  try {
    if (!(await stat(full)).isFile()) return null;
    return { body: await readFile(full), type };
  } catch {
    return null;
  }
}
