import Database from 'better-sqlite3';
import { KeepclearError } from '../core/errors.js';
import { migrate } from './migrations.js';

type Statement = Database.Statement<unknown[], unknown>;

/**
 * An open Keepclear database. One owner thread: better-sqlite3 is synchronous, so every
 * repository call runs to completion before the next; other threads get their data through it.
 */
export class KeepclearDb {
  readonly path: string;
  readonly sqlite: Database.Database;
  // Preparing a statement costs about as much as running a simple one; repositories are called
  // in hot loops (100,000 element sets per import), so statements are prepared once per SQL text.
  private readonly cache = new Map<string, Statement>();

  constructor(path: string, sqlite: Database.Database) {
    this.path = path;
    this.sqlite = sqlite;
  }

  stmt(sql: string): Statement {
    let s = this.cache.get(sql);
    if (!s) {
      s = this.sqlite.prepare(sql);
      this.cache.set(sql, s);
    }
    return s;
  }

  close(): void {
    this.cache.clear();
    if (this.sqlite.open) this.sqlite.close();
  }
}

/**
 * Opens (creating if needed) and migrates the database at `path`. ":memory:" is accepted for tests.
 * Throws FILE_UNREADABLE (at line 1, the convention for whole-file problems) when the file is not a usable database.
 */
export function openDatabase(path: string): KeepclearDb {
  let sqlite: Database.Database;
  try {
    sqlite = new Database(path);
    // WAL lets a reader (renderer, report) read while a screening run writes; NORMAL sync is
    // safe under WAL (a power cut can lose the last commit, never corrupt the file).
    sqlite.pragma('journal_mode = WAL');
    sqlite.pragma('synchronous = NORMAL');
    sqlite.pragma('foreign_keys = ON');
    // A second process (CLI while the desktop app is open) waits instead of failing at once.
    sqlite.pragma('busy_timeout = 5000');
  } catch (err) {
    throw new KeepclearError(
      'FILE_UNREADABLE',
      `cannot open database: ${(err as Error).message}; check the path and permissions, or pass another --db`,
      { file: path, line: 1 },
    );
  }
  const db = new KeepclearDb(path, sqlite);
  try {
    migrate(db);
  } catch (err) {
    db.close();
    if (err instanceof KeepclearError) throw err;
    throw new KeepclearError(
      'FILE_UNREADABLE',
      `cannot prepare database: ${(err as Error).message}; is this a Keepclear database? pass another --db`,
      { file: path, line: 1 },
    );
  }
  return db;
}

/**
 * Runs `fn` in one transaction: all of it is stored, or (when it throws) none of it.
 * Nested calls become savepoints of the outer transaction. IMMEDIATE takes the write lock at the
 * start, so two processes cannot both read and then deadlock when upgrading to write.
 */
export function inTransaction<T>(db: KeepclearDb, fn: () => T): T {
  return db.sqlite.transaction(fn).immediate();
}
