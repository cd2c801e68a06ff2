/**
 * The layering of DEVELOPERS.md, read from the import graph of the sources themselves (issue 11:
 * "a read of the import graph shows none of the mixed concerns"): which folder may import which,
 * SQL only in db/, no terminal writes in the services, and CLI command files light enough for
 * `keepclear --help`. Static text reading, so a new file that breaks a rule fails here.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from './support/cli.js';

interface Import {
  readonly from: string; // file, relative to the root
  readonly target: string; // resolved file relative to the root, or the package name
  readonly typeOnly: boolean;
}

function sources(folder: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.(ts|mts)$/.test(name) && !name.endsWith('.d.ts')) out.push(p);
    }
  };
  walk(join(ROOT, folder));
  return out;
}

const IMPORT_RE = /^\s*(import|export)\s+(type\s+)?[^'";]*?from\s+'([^']+)'|^\s*import\s+'([^']+)'/gm;

function importsOf(file: string): Import[] {
  const text = readFileSync(file, 'utf8');
  const from = relative(ROOT, file);
  return [...text.matchAll(IMPORT_RE)].map((m) => {
    const spec = m[3] ?? m[4]!;
    const target = spec.startsWith('.') ? relative(ROOT, resolve(dirname(file), spec)) : spec;
    return { from, target, typeOnly: m[2] !== undefined };
  });
}

const all = ['core', 'db', 'app', 'cli'].flatMap(sources).flatMap(importsOf);
const top = (path: string): string => path.split(/[\\/]/)[0]!;
const isLocal = (i: Import): boolean => !i.target.includes(':') && /^(core|db|app|cli|electron|renderer|bench|test|bin)\//.test(i.target);
const broken = (rule: (i: Import) => boolean) => all.filter((i) => !rule(i)).map((i) => `${i.from} → ${i.target}`);

describe('layers (DEVELOPERS.md "Layout")', () => {
  it('core/ imports nothing outside core/, and no file system in its algorithms', () => {
    expect(broken((i) => top(i.from) !== 'core' || !isLocal(i) || top(i.target) === 'core')).toEqual([]);
    expect(broken((i) => top(i.from) !== 'core' || i.from.startsWith('core/workers/') || i.target !== 'node:fs')).toEqual([]);
  });

  it('db/ imports only core/ and db/', () => {
    expect(broken((i) => top(i.from) !== 'db' || !isLocal(i) || ['core', 'db'].includes(top(i.target)))).toEqual([]);
  });

  it('app/ imports only core/, db/ and app/ (services never reach back into the CLI)', () => {
    expect(broken((i) => top(i.from) !== 'app' || !isLocal(i) || ['core', 'db', 'app'].includes(top(i.target)))).toEqual([]);
  });

  it('cli/ never imports the desktop side', () => {
    expect(broken((i) => top(i.from) !== 'cli' || !isLocal(i) || !['electron', 'renderer'].includes(top(i.target)))).toEqual([]);
  });

  it('SQL (better-sqlite3) only in db/', () => {
    expect(broken((i) => i.target !== 'better-sqlite3' || top(i.from) === 'db')).toEqual([]);
  });

  it('the event types come from core/events, not from screening', () => {
    const offenders = ['core', 'db', 'app', 'cli']
      .flatMap(sources)
      .filter((f) => !relative(ROOT, f).startsWith('core/screening/'))
      .filter((f) => /import[^;]*\b(Encounter|ConjunctionEvent|RiskAssessment)\b[^;]*from '[^']*screening\//.test(readFileSync(f, 'utf8')))
      .map((f) => relative(ROOT, f));
    expect(offenders).toEqual([]);
  });
});

describe('services present nothing themselves', () => {
  it('no terminal writes in core/, db/ or app/ (the CLI, serve and the desktop app present outcomes)', () => {
    const offenders = ['core', 'db', 'app']
      .flatMap(sources)
      .filter((f) => /process\.(stdout|stderr)|console\.(log|error|warn|info)/.test(readFileSync(f, 'utf8')))
      .map((f) => relative(ROOT, f));
    expect(offenders).toEqual([]);
  });
});

describe('CLI command files stay light (keepclear --help loads them all)', () => {
  /** What a command file may import at its top; everything else inside `run`, with await import(). */
  const LIGHT = /^(commander|cli\/(command|options)\.ts|core\/(errors|elements\/objectId|time\/instant)\.ts)$/;
  it('value imports at the top of cli/main.ts, cli/command.ts, cli/options.ts and cli/commands/* are light', () => {
    const files = new Set(['cli/main.ts', 'cli/command.ts', 'cli/options.ts', ...sources('cli/commands').map((f) => relative(ROOT, f))]);
    const heavy = all
      .filter((i) => files.has(i.from) && !i.typeOnly)
      .map((i) => ({ ...i, target: i.target.replace(/\.js$/, '.ts') }))
      .filter((i) => !LIGHT.test(i.target) && !i.target.startsWith('cli/commands/') && i.target !== 'db/storageErrors.ts')
      .map((i) => `${i.from} → ${i.target}`);
    expect(heavy).toEqual([]);
  });
});
