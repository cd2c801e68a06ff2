/**
 * Schema version 3: runs say what kind they are and which process owns them while running.
 *
 * - `kind` replaces the "cdm:" prefix that v2 put in front of the fingerprint of runs made
 *   from a received message; `merge` and `plan` are allowed already, so the features that add
 *   them need no new table rebuild.
 * - `owner_pid` and `owner_host` name the process that created the run; a run still `running`
 *   whose owner is gone from this host is marked `interrupted` on the next open.
 *
 * SQLite cannot change a CHECK constraint in place, so `runs` is rebuilt the documented way
 * (https://www.sqlite.org/lang_altertable.html §7: new table, copy, drop, rename, recreate the
 * indexes); `migrate()` turns foreign keys off around such a step, because dropping `runs` with
 * them on would delete every event and flagged object of every run through ON DELETE CASCADE.
 */
export const RUN_KINDS = ['screening', 'cdm', 'merge', 'plan'] as const;

export const SCHEMA_V3_RUNS = `
CREATE TABLE runs_v3 (
  id                  TEXT PRIMARY KEY,
  seq                 INTEGER NOT NULL UNIQUE,
  kind                TEXT NOT NULL DEFAULT 'screening'
                        CHECK (kind IN ('screening', 'cdm', 'merge', 'plan')),
  created_at          REAL NOT NULL,
  start_ms            REAL NOT NULL,
  end_ms              REAL NOT NULL CHECK (end_ms >= start_ms),
  volume_json         TEXT NOT NULL,           -- ScreeningVolume
  primaries_json      TEXT NOT NULL,           -- string[] or "all"
  -- screening: catalogFingerprint() of the sets screened; cdm: SHA-256 of the message file
  catalog_fingerprint TEXT NOT NULL,
  object_count        INTEGER NOT NULL,
  status              TEXT NOT NULL
                        CHECK (status IN ('running', 'done', 'cancelled', 'failed', 'interrupted')),
  owner_pid           INTEGER,                 -- NULL for runs stored before v3
  owner_host          TEXT,
  finished_at         REAL,
  wall_ms             REAL,
  event_count         INTEGER,
  flagged_count       INTEGER
) STRICT;

INSERT INTO runs_v3 (id, seq, kind, created_at, start_ms, end_ms, volume_json, primaries_json,
    catalog_fingerprint, object_count, status, owner_pid, owner_host, finished_at, wall_ms,
    event_count, flagged_count)
  SELECT id, seq,
         CASE WHEN catalog_fingerprint LIKE 'cdm:%' THEN 'cdm' ELSE 'screening' END,
         created_at, start_ms, end_ms, volume_json, primaries_json,
         CASE WHEN catalog_fingerprint LIKE 'cdm:%' THEN substr(catalog_fingerprint, 5) ELSE catalog_fingerprint END,
         object_count,
         -- v2 recorded no owner: a run still running when a newer Keepclear upgrades the file
         -- is taken as left behind by a process that was killed
         CASE WHEN status = 'running' THEN 'interrupted' ELSE status END,
         NULL, NULL,
         CASE WHEN status = 'running' THEN created_at ELSE finished_at END,
         wall_ms, event_count, flagged_count
    FROM runs;

DROP TABLE runs;
ALTER TABLE runs_v3 RENAME TO runs;
CREATE INDEX runs_created ON runs(created_at);
CREATE INDEX runs_kind_seq ON runs(kind, seq);
`;
