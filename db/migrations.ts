import { KeepclearError } from '../core/errors.js';
import type { KeepclearDb } from './connection.js';
import { SCHEMA_V1 } from './schemaV1.js';

/** One schema step. `version` is the PRAGMA user_version the database has after it. */
export interface Migration {
  readonly version: number;
  readonly name: string;
  readonly up: (db: KeepclearDb) => void;
}

/** Ordered, append-only: never edit a released step; add a new one. */
export const MIGRATIONS: readonly Migration[] = [
  { version: 1, name: 'initial schema', up: (db) => db.sqlite.exec(SCHEMA_V1) },
  {
    version: 2,
    name: 'risk detail of events (covariances, encounter plane) as JSON',
    up: (db) => db.sqlite.exec('ALTER TABLE events ADD COLUMN risk_detail_json TEXT'),
  },
];

export const SCHEMA_VERSION = MIGRATIONS[MIGRATIONS.length - 1]?.version ?? 0;

export function schemaVersion(db: KeepclearDb): number {
  return db.sqlite.pragma('user_version', { simple: true }) as number;
}

/**
 * Brings the database up to the last step. Each step and its version bump commit together, so a
 * step that fails leaves the database at the previous version, never between two.
 */
export function migrate(db: KeepclearDb, steps: readonly Migration[] = MIGRATIONS): void {
  const current = schemaVersion(db);
  const last = steps[steps.length - 1]?.version ?? 0;
  if (current > last) {
    throw new KeepclearError(
      'FILE_UNREADABLE',
      `database schema version ${current} is newer than this Keepclear knows (${last}); ` +
        'update Keepclear or pass another --db',
      { file: db.path, line: 1 },
    );
  }
  for (const step of steps) {
    if (step.version <= current) continue;
    db.sqlite
      .transaction(() => {
        step.up(db);
        // user_version is part of the database header and commits with the transaction.
        db.sqlite.pragma(`user_version = ${Math.trunc(step.version)}`);
      })
      .immediate();
  }
}

/** What a database is set up as: for diagnostics (`--version` style output) and tests. */
export function describeDatabase(db: KeepclearDb): {
  version: number;
  journalMode: string;
  foreignKeys: boolean;
  tables: string[];
} {
  return {
    version: schemaVersion(db),
    journalMode: String(db.sqlite.pragma('journal_mode', { simple: true })),
    foreignKeys: db.sqlite.pragma('foreign_keys', { simple: true }) === 1,
    tables: db
      .stmt("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name")
      .pluck()
      .all() as string[],
  };
}
