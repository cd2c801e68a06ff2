import Database from 'better-sqlite3';
import { KeepclearError } from '../core/errors.js';
import { migrate } from './migrations.js';
import { currentOwner, processAlive } from './owner.js';
import { markInterruptedRuns } from './runs.js';
import { storageError } from './storageErrors.js';

type Statement = Database.Statement<unknown[], unknown>;

/**
 * An open Keepclear database. One owner thread: better-sqlite3 is synchronous, so every
 * repository call runs to completion before the next; other threads get their data through it.
 */
export class KeepclearDb {
  readonly path: string;
  readonly sqlite: Database.Database;
  /** how long a write waits for another process's write to finish before giving up */
  readonly busyTimeoutMs: number;
  // Preparing a statement costs about as much as running a simple one; repositories are called
  // in hot loops (100,000 element sets per import), so statements are prepared once per SQL text.
  private readonly cache = new Map<string, Statement>();

  constructor(path: string, sqlite: Database.Database, busyTimeoutMs: number = DEFAULT_BUSY_TIMEOUT_MS) {
    this.path = path;
    this.sqlite = sqlite;
    this.busyTimeoutMs = busyTimeoutMs;
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
 * How long a writer waits for another process's write (SQLite busy timeout). The longest write
 * is one file's import: 100,000 element sets take about 3.4 s to import on the 2-core reference
 * machine, start-up included (test/cli-import.test.ts prints it); a minute covers that many
 * times over for slower disks and larger files, and a process that really hangs is still
 * reported instead of waited on forever.
 * KEEPCLEAR_BUSY_TIMEOUT_MS overrides it (scripts that would rather wait longer, tests).
 */
export const DEFAULT_BUSY_TIMEOUT_MS = 60_000;

export function busyTimeoutFromEnv(env: NodeJS.ProcessEnv = process.env): number {
  const text = env['KEEPCLEAR_BUSY_TIMEOUT_MS'];
  const ms = text === undefined || text.trim() === '' ? Number.NaN : Number(text);
  return Number.isInteger(ms) && ms >= 0 ? ms : DEFAULT_BUSY_TIMEOUT_MS;
}

export interface OpenOptions {
  /** default: KEEPCLEAR_BUSY_TIMEOUT_MS, else DEFAULT_BUSY_TIMEOUT_MS */
  readonly busyTimeoutMs?: number;
  /**
   * Path of a better_sqlite3.node built for another runtime's ABI (the desktop app passes the
   * Electron build, electron/nativeBinding.ts); default: the one in node_modules, built for Node.
   */
  readonly nativeBinding?: string;
}

/** SQLite page cache per connection, KiB (used as pages are touched, not reserved). */
const PAGE_CACHE_KIB = 65_536;

/**
 * Opens (creating if needed) and migrates the database at `path`, then marks `interrupted` the
 * runs whose owner process died on this host. ":memory:" is accepted for tests.
 * Throws FILE_UNREADABLE (at line 1, the convention for whole-file problems) when the file is not
 * a usable database, and the DATABASE_* codes when it is locked, read-only or full.
 */
export function openDatabase(path: string, options: OpenOptions = {}): KeepclearDb {
  const busyTimeoutMs = options.busyTimeoutMs ?? busyTimeoutFromEnv();
  let sqlite: Database.Database;
  try {
    sqlite = options.nativeBinding ? new Database(path, { nativeBinding: options.nativeBinding }) : new Database(path);
    // A second process (CLI while the desktop app is open) waits instead of failing at once.
    // Set first: switching to WAL below may itself have to wait for another process.
    sqlite.pragma(`busy_timeout = ${Math.trunc(busyTimeoutMs)}`);
    // WAL lets a reader (renderer, report) read while a screening run writes; NORMAL sync is
    // safe under WAL (a power cut can lose the last commit, never corrupt the file).
    sqlite.pragma('journal_mode = WAL');
    sqlite.pragma('synchronous = NORMAL');
    sqlite.pragma('foreign_keys = ON');
    // Page cache of PAGE_CACHE_KIB (SQLite's default is 2 MiB): storing and linking an
    // all-vs-all run's 10⁵ events in one transaction touches ~150 MB of pages, and with the
    // default cache they spilled and were read again (linking 124,503 events: 9–10 s → 7.9 s).
    sqlite.pragma(`cache_size = -${PAGE_CACHE_KIB}`);
  } catch (err) {
    const storage = storageError(err, path, busyTimeoutMs);
    if (storage && storage.code !== 'FILE_UNREADABLE') throw storage;
    throw new KeepclearError(
      'FILE_UNREADABLE',
      `cannot open database: ${(err as Error).message}; check the path and permissions (SQLite writes -wal and -shm ` +
        'files beside the database, so its folder must be writable too), or pass another --db',
      { file: path, line: 1 },
    );
  }
  const db = new KeepclearDb(path, sqlite, busyTimeoutMs);
  try {
    migrate(db);
  } catch (err) {
    db.close();
    if (err instanceof KeepclearError) throw err;
    const storage = storageError(err, path, busyTimeoutMs);
    if (storage) throw storage;
    throw new KeepclearError(
      'FILE_UNREADABLE',
      `cannot prepare database: ${(err as Error).message}; is this a Keepclear database? pass another --db`,
      { file: path, line: 1 },
    );
  }
  recoverInterruptedRuns(db);
  return db;
}

/**
 * Runs left "running" by a process that died are marked interrupted. A database that cannot be
 * written now (read-only, busy) is left as it is: the next writer that opens it does this.
 */
function recoverInterruptedRuns(db: KeepclearDb): void {
  try {
    markInterruptedRuns(db, currentOwner().host, processAlive);
  } catch (err) {
    if (err instanceof KeepclearError && err.code.startsWith('DATABASE_')) return;
    if (storageError(err, db.path)) return;
    db.close();
    throw err;
  }
}

/**
 * Runs `fn` in one transaction: all of it is stored, or (when it throws) none of it.
 * Nested calls become savepoints of the outer transaction. IMMEDIATE takes the write lock at the
 * start, so two processes cannot both read and then deadlock when upgrading to write.
 */
export function inTransaction<T>(db: KeepclearDb, fn: () => T): T {
  try {
    return db.sqlite.transaction(fn).immediate();
  } catch (err) {
    throw storageError(err, db.path, db.busyTimeoutMs) ?? err;
  }
}
