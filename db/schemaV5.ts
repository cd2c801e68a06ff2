/**
 * Schema version 5: owner ephemerides (CCSDS OEM, 502.0-B-2).
 *
 * One `ephemerides` row per imported message and object, with what choosing one needs in
 * columns (the object, the message's CREATION_DATE, the overall usable span); each usable segment
 * is one `ephemeris_segments` row with its own usable window and its nodes stored compactly:
 * epochs (UTC ms) and TEME states (km, km/s; converted once at import) as little-endian float64
 * BLOBs, source lines as int32 — about 56 bytes a node instead of ~150 of text. Metadata and
 * covariance blocks (as received, with their frame) are JSON, read whole.
 *
 * `run_ephemerides` records which ephemeris a screening run used for which primary, so the run
 * can say so later. It references only tables of v1 (runs, import_files) and its own, so it does
 * not depend on the order of other steps.
 */
export const SCHEMA_V5_EPHEMERIDES = `
CREATE TABLE ephemerides (
  id               INTEGER PRIMARY KEY,
  object_id        TEXT NOT NULL,              -- the catalogue object OBJECT_ID was matched to
  object_ref       TEXT NOT NULL,              -- OBJECT_ID as written
  object_name      TEXT,
  file_name        TEXT NOT NULL,
  sha256           TEXT NOT NULL,
  import_file_id   INTEGER REFERENCES import_files(id) ON DELETE SET NULL,
  originator       TEXT NOT NULL,
  message_id       TEXT,
  creation_date_ms REAL NOT NULL,
  usable_start_ms  REAL NOT NULL,              -- earliest usable start of its segments
  usable_stop_ms   REAL NOT NULL CHECK (usable_stop_ms > usable_start_ms),
  header_json      TEXT NOT NULL,
  segment_count    INTEGER NOT NULL CHECK (segment_count > 0),
  covariance_count INTEGER NOT NULL,
  stored_at        REAL NOT NULL,
  -- the same file imported again is the same ephemeris
  UNIQUE (object_id, sha256)
) STRICT;
CREATE INDEX ephemerides_object ON ephemerides(object_id, creation_date_ms);

CREATE TABLE ephemeris_segments (
  id               INTEGER PRIMARY KEY,
  ephemeris_id     INTEGER NOT NULL REFERENCES ephemerides(id) ON DELETE CASCADE,
  seq              INTEGER NOT NULL,           -- order in the file (a later segment wins overlaps)
  usable_start_ms  REAL NOT NULL,
  usable_stop_ms   REAL NOT NULL CHECK (usable_stop_ms > usable_start_ms),
  line             INTEGER NOT NULL,
  node_count       INTEGER NOT NULL CHECK (node_count >= 2),
  epochs_f64       BLOB NOT NULL CHECK (length(epochs_f64) = 8 * node_count),
  teme_f64         BLOB NOT NULL CHECK (length(teme_f64) = 48 * node_count),
  lines_i32        BLOB NOT NULL CHECK (length(lines_i32) = 4 * node_count),
  metadata_json    TEXT NOT NULL,
  data_comments_json TEXT NOT NULL,
  covariances_json TEXT NOT NULL,
  UNIQUE (ephemeris_id, seq)
) STRICT;

CREATE TABLE run_ephemerides (
  run_id           TEXT NOT NULL REFERENCES runs(id) ON DELETE CASCADE,
  object_id        TEXT NOT NULL,
  ephemeris_id     INTEGER REFERENCES ephemerides(id) ON DELETE SET NULL,
  -- kept here too, so the run still says what it used if the ephemeris is deleted
  file_name        TEXT NOT NULL,
  creation_date_ms REAL NOT NULL,
  PRIMARY KEY (run_id, object_id)
) STRICT;
`;
