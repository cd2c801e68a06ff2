import { KeepclearError } from '../core/errors.js';

/**
 * SQLite's answers about the file itself (locked, read-only, full, damaged), in words a user can
 * act on. Everything else (a constraint a caller broke, a bug) is not translated: it is not the
 * user's to fix. Matches on the error's `code` only, so this file loads without better-sqlite3
 * (the CLI uses it as its last safety net before any database is opened).
 */
export function storageError(err: unknown, dbPath: string, busyTimeoutMs?: number): KeepclearError | null {
  if (err instanceof KeepclearError) return null;
  const code = (err as { code?: unknown } | null)?.code;
  if (typeof code !== 'string' || !code.startsWith('SQLITE_')) return null;
  const where = { file: dbPath, line: 1 };
  const waited = busyTimeoutMs === undefined ? '' : ` for ${Math.round(busyTimeoutMs / 100) / 10} s`;
  const make = (c: ConstructorParameters<typeof KeepclearError>[0], message: string) => {
    const e = new KeepclearError(c, message, where);
    (e as { cause?: unknown }).cause = err;
    return e;
  };
  if (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED')) {
    return make(
      'DATABASE_BUSY',
      `the database is in use by another Keepclear process (the desktop app, or another command writing to it)${waited}; ` +
        'let it finish and run the command again, or set KEEPCLEAR_BUSY_TIMEOUT_MS to wait longer',
    );
  }
  if (code.startsWith('SQLITE_READONLY')) {
    return make(
      'DATABASE_READONLY',
      'the database cannot be written: the file or its folder is read-only (SQLite also writes -wal and -shm files ' +
        'beside it); check the permissions, or pass another --db',
    );
  }
  if (code === 'SQLITE_FULL') {
    return make(
      'DATABASE_FULL',
      'the disk holding the database is full (or the database reached its size limit); nothing of the interrupted ' +
        'write was kept; free some space and run the command again',
    );
  }
  if (code.startsWith('SQLITE_IOERR')) {
    return make(
      'DATABASE_IO',
      `the database file could not be written or read (${code}: ${(err as Error).message}); the disk may be full, ` +
        'removed or failing; nothing of the interrupted write was kept; check the disk and run the command again',
    );
  }
  if (code === 'SQLITE_CORRUPT' || code === 'SQLITE_NOTADB') {
    return make(
      'DATABASE_DAMAGED',
      `the file is damaged or not a Keepclear database (${code}); pass another --db, or restore the file from a backup`,
    );
  }
  if (code.startsWith('SQLITE_CANTOPEN')) {
    return make(
      'FILE_UNREADABLE',
      'cannot open the database: the file or its folder does not exist or cannot be written (SQLite writes -wal and ' +
        '-shm files beside it); check the path and permissions, or pass another --db',
    );
  }
  return null;
}
