/**
 * What a process recorded by recordLoads.mjs loaded, as source files: dist/ is bundled
 * (scripts/build.mjs), so one loaded file there holds many modules; its source map names them.
 * Returns one line per loaded URL, followed by the absolute path of every source in its map.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export function loadedSources(logFile: string): string {
  const lines: string[] = [];
  for (const url of new Set(readFileSync(logFile, 'utf8').split('\n').filter(Boolean))) {
    lines.push(url);
    if (!url.startsWith('file:')) continue;
    const file = fileURLToPath(url);
    if (!existsSync(`${file}.map`)) continue;
    const map = JSON.parse(readFileSync(`${file}.map`, 'utf8')) as { sources: string[]; sourceRoot?: string };
    for (const s of map.sources) lines.push(resolve(dirname(file), map.sourceRoot ?? '', s));
  }
  return lines.join('\n');
}
