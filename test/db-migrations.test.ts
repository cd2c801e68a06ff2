import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  MIGRATIONS,
  SCHEMA_VERSION,
  chooseDbPath,
  defaultDbPath,
  describeDatabase,
  migrate,
  openDatabase,
  putSetting,
  getSetting,
  schemaVersion,
  type Migration,
} from '../db/index.js';
import { KeepclearError } from '../core/errors.js';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-db-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('migrations by PRAGMA user_version', () => {
  it('brings a fresh file to the last version with WAL and foreign keys on', () => {
    const db = openDatabase(join(dir, 'fresh.db'));
    const info = describeDatabase(db);
    expect(info.version).toBe(SCHEMA_VERSION);
    // Steps are numbered in order and the last one is the schema version (numbers are assigned
    // per feature, so a branch may carry a step whose predecessor lands later).
    expect(MIGRATIONS.map((m) => m.version)).toEqual([...MIGRATIONS.map((m) => m.version)].sort((a, b) => a - b));
    expect(SCHEMA_VERSION).toBe(MIGRATIONS.at(-1)!.version);
    expect(info.journalMode).toBe('wal');
    expect(info.foreignKeys).toBe(true);
    for (const t of ['objects', 'element_sets', 'import_files', 'import_rejections', 'runs', 'run_flagged',
      'events', 'cdm_messages', 'settings']) {
      expect(info.tables).toContain(t);
    }
    db.close();
  });

  it('opens an already-migrated file without re-running steps and keeps its data', () => {
    const path = join(dir, 'again.db');
    const first = openDatabase(path);
    putSetting(first, 'tiers', { red: 1e-4 });
    first.close();
    const again = openDatabase(path); // would throw "table already exists" if step 1 re-ran
    expect(schemaVersion(again)).toBe(SCHEMA_VERSION);
    expect(getSetting(again, 'tiers')).toEqual({ red: 1e-4 });
    again.close();
  });

  it('applies only the missing steps, each in its own transaction', () => {
    const db = openDatabase(join(dir, 'steps.db'));
    const ran: number[] = [];
    const extra: Migration[] = [
      ...MIGRATIONS,
      { version: SCHEMA_VERSION + 1, name: 'ok', up: (d) => { ran.push(1); putSetting(d, 'step1', true); } },
      {
        version: SCHEMA_VERSION + 2,
        name: 'fails half way',
        up: (d) => {
          ran.push(2);
          putSetting(d, 'step2', true);
          throw new Error('boom');
        },
      },
    ];
    expect(() => migrate(db, extra)).toThrow('boom');
    expect(ran).toEqual([1, 2]);
    // step 1 committed; step 2 rolled back entirely (its write and its version bump)
    expect(schemaVersion(db)).toBe(SCHEMA_VERSION + 1);
    expect(getSetting(db, 'step1')).toBe(true);
    expect(getSetting(db, 'step2')).toBeUndefined();
    // a second pass runs only the missing step
    ran.length = 0;
    expect(() => migrate(db, extra)).toThrow('boom');
    expect(ran).toEqual([2]);
    db.close();
  });

  it('refuses a file written by a newer schema, naming the file', () => {
    const path = join(dir, 'newer.db');
    const db = openDatabase(path);
    migrate(db, [...MIGRATIONS, { version: SCHEMA_VERSION + 5, name: 'from the future', up: () => {} }]);
    db.close();
    try {
      openDatabase(path);
      expect.unreachable('a newer schema must be refused');
    } catch (err) {
      expect(err).toBeInstanceOf(KeepclearError);
      expect((err as KeepclearError).toLine()).toMatch(/newer\.db:1: database schema version \d+ is newer/);
    }
  });

  it('refuses a file that is not a database', async () => {
    const path = join(dir, 'not.db');
    const { writeFileSync } = await import('node:fs');
    writeFileSync(path, 'this is plain text, not SQLite '.repeat(200));
    expect(() => openDatabase(path)).toThrow(KeepclearError);
  });
});

describe('default database path', () => {
  const home = '/home/ann';
  it('KEEPCLEAR_DB overrides everything', () => {
    expect(chooseDbPath({ KEEPCLEAR_DB: '/x/y.db', XDG_DATA_HOME: '/xdg' }, 'linux', home)).toBe('/x/y.db');
  });
  it('follows XDG on Linux, ignoring a relative XDG_DATA_HOME', () => {
    expect(chooseDbPath({ XDG_DATA_HOME: '/xdg' }, 'linux', home)).toBe('/xdg/keepclear/keepclear.db');
    expect(chooseDbPath({ XDG_DATA_HOME: 'rel' }, 'linux', home)).toBe('/home/ann/.local/share/keepclear/keepclear.db');
    expect(chooseDbPath({}, 'linux', home)).toBe('/home/ann/.local/share/keepclear/keepclear.db');
  });
  it('uses Application Support on macOS and APPDATA on Windows', () => {
    expect(chooseDbPath({}, 'darwin', '/Users/ann')).toBe(
      '/Users/ann/Library/Application Support/Keepclear/keepclear.db',
    );
    expect(chooseDbPath({ APPDATA: 'C:\\Users\\ann\\AppData\\Roaming' }, 'win32', 'C:\\Users\\ann')).toBe(
      'C:\\Users\\ann\\AppData\\Roaming\\Keepclear\\keepclear.db',
    );
  });
  it('creates the folder', async () => {
    const { existsSync } = await import('node:fs');
    const path = defaultDbPath({ XDG_DATA_HOME: join(dir, 'data') }, 'linux', dir);
    expect(path).toBe(join(dir, 'data', 'keepclear', 'keepclear.db'));
    expect(existsSync(join(dir, 'data', 'keepclear'))).toBe(true);
  });
});
