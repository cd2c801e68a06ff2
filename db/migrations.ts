import { KeepclearError } from '../core/errors.js';
import type { KeepclearDb } from './connection.js';
import { SCHEMA_V1 } from './schemaV1.js';
import { SCHEMA_V3_RUNS } from './schemaV3.js';
import { SCHEMA_V4_SERIES } from './schemaV4.js';
import { SCHEMA_V5_EPHEMERIDES } from './schemaV5.js';
import { SCHEMA_V6_PLANS } from './schemaV6.js';
import { SCHEMA_V7_EVENT_PAIRS } from './schemaV7.js';
import { SCHEMA_V8_CATALOG_STATE } from './schemaV8.js';

/** One schema step. `version` is the PRAGMA user_version the database has after it. */
export interface Migration {
  readonly version: number;
  readonly name: string;
  readonly up: (db: KeepclearDb) => void;
  /**
   * The step drops and recreates a table that others reference (the only way to change a
   * CHECK constraint in SQLite). migrate() then turns foreign keys off around the step and
   * checks them before it commits; with them on, DROP TABLE would cascade-delete the rows
   * that reference the table.
   */
  readonly rebuildsTables?: boolean;
}

/** Ordered, append-only: never edit a released step; add a new one. */
export const MIGRATIONS: readonly Migration[] = [
  { version: 1, name: 'initial schema', up: (db) => db.sqlite.exec(SCHEMA_V1) },
  {
    version: 2,
    name: 'risk detail of events (covariances, encounter plane) as JSON',
    up: (db) => db.sqlite.exec('ALTER TABLE events ADD COLUMN risk_detail_json TEXT'),
  },
  {
    version: 3,
    name: 'kind of run as a column, owner process of a running run, status interrupted',
    up: (db) => db.sqlite.exec(SCHEMA_V3_RUNS),
    rebuildsTables: true,
  },
  {
    version: 4,
    name: 'series: data time of runs, series of events, series states',
    up: (db) => db.sqlite.exec(SCHEMA_V4_SERIES),
  },
  {
    version: 5,
    name: 'owner ephemerides (OEM): messages, segments with packed nodes, the ephemeris each run used',
    up: (db) => db.sqlite.exec(SCHEMA_V5_EPHEMERIDES),
  },
  {
    version: 6,
    name: 'spacecraft mass and Isp per owner object; manoeuvre plans kept with their event',
    up: (db) => db.sqlite.exec(SCHEMA_V6_PLANS),
  },
  {
    version: 7,
    name: 'index of events by pair (linking reads every sighting of a pair)',
    up: (db) => db.sqlite.exec(SCHEMA_V7_EVENT_PAIRS),
  },
  {
    version: 8,
    name: 'catalogue fingerprint kept with the generation of the element sets (moved on by triggers)',
    up: (db) => db.sqlite.exec(SCHEMA_V8_CATALOG_STATE),
  },
];

export const SCHEMA_VERSION = MIGRATIONS[MIGRATIONS.length - 1]?.version ?? 0;

export function schemaVersion(db: KeepclearDb): number {
  return db.sqlite.pragma('user_version', { simple: true }) as number;
}

function refuseNewer(db: KeepclearDb, current: number, last: number): never {
  throw new KeepclearError(
    'FILE_UNREADABLE',
    `database schema version ${current} is newer than this Keepclear knows (${last}); ` +
      'update Keepclear or pass another --db',
    { file: db.path, line: 1 },
  );
}

/** Rows that break a foreign key after a rebuild, named for the error message. */
function foreignKeyProblems(db: KeepclearDb): string[] {
  const rows = db.sqlite.pragma('foreign_key_check') as { table: string; rowid: number; parent: string }[];
  return rows.slice(0, 5).map((r) => `${r.table} row ${r.rowid} → ${r.parent}`);
}

/** Runs one step and its version bump in one IMMEDIATE transaction; false if another process already did. */
function applyStep(db: KeepclearDb, step: Migration): boolean {
  return db.sqlite
    .transaction(() => {
      // Read again under the write lock: two processes opening an old file at once both saw
      // the old version, and only the first may apply the step.
      if (schemaVersion(db) >= step.version) return false;
      step.up(db);
      if (step.rebuildsTables) {
        const broken = foreignKeyProblems(db);
        if (broken.length > 0) {
          throw new KeepclearError(
            'INTERNAL',
            `schema step ${step.version} (${step.name}) would break foreign keys (${broken.join('; ')}); nothing was changed`,
            { file: db.path, line: 1 },
          );
        }
      }
      // user_version is part of the database header and commits with the transaction.
      db.sqlite.pragma(`user_version = ${Math.trunc(step.version)}`);
      return true;
    })
    .immediate();
}

/**
 * Brings the database up to the last step. Each step and its version bump commit together, so a
 * step that fails leaves the database at the previous version, never between two.
 */
export function migrate(db: KeepclearDb, steps: readonly Migration[] = MIGRATIONS): void {
  const current = schemaVersion(db);
  const last = steps[steps.length - 1]?.version ?? 0;
  if (current > last) refuseNewer(db, current, last);
  for (const step of steps) {
    if (step.version <= current) continue;
    if (!step.rebuildsTables) {
      applyStep(db, step);
      continue;
    }
    // PRAGMA foreign_keys is a no-op inside a transaction: switch it outside, and back on
    // whatever happens, as the SQLite documentation's procedure for table rebuilds says.
    const fkWasOn = db.sqlite.pragma('foreign_keys', { simple: true }) === 1;
    db.sqlite.pragma('foreign_keys = OFF');
    try {
      applyStep(db, step);
    } finally {
      if (fkWasOn) db.sqlite.pragma('foreign_keys = ON');
    }
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
