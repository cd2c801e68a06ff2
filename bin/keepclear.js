#!/usr/bin/env node
// Entry of the `keepclear` command: starts the compiled program in dist/ (built from the
// TypeScript sources by `npm ci` / `npm install` through the `prepare` script, or by
// `npm run build:cli`). Nothing is compiled while the user waits.
import { existsSync } from 'node:fs';

const entry = new URL('../dist/cli/main.js', import.meta.url);
if (!existsSync(entry)) {
  process.stderr.write(
    'keepclear: the compiled program is missing (dist/cli/main.js); build it with `npm run build:cli` ' +
      '(npm ci and npm install build it too)\n',
  );
  process.exit(1);
}
const { main } = await import(entry.href);
process.exitCode = await main(process.argv.slice(2));
