/**
 * Schema version 1. Times are UTC milliseconds as REAL (the Instant type; sub-millisecond TLE
 * epochs survive). Distances follow the name suffix (_km, _m). JSON columns hold lists and
 * open-ended data that is read whole, never queried inside.
 */
export const SCHEMA_V1 = `
CREATE TABLE objects (
  id                 TEXT PRIMARY KEY,          -- catalogue number as text ("25544", Alpha-5 decoded)
  name               TEXT,
  intl_designator    TEXT,
  hard_body_radius_m REAL CHECK (hard_body_radius_m IS NULL OR hard_body_radius_m > 0),
  -- earliest and latest element-set epoch seen: when the object was observed, not imported
  first_seen_ms      REAL NOT NULL,
  last_seen_ms       REAL NOT NULL
) STRICT;

CREATE TABLE import_files (
  id          INTEGER PRIMARY KEY,
  path        TEXT NOT NULL,
  sha256      TEXT NOT NULL,
  format      TEXT NOT NULL,
  imported_at REAL NOT NULL,
  imported    INTEGER NOT NULL DEFAULT 0,
  updated     INTEGER NOT NULL DEFAULT 0,
  unchanged   INTEGER NOT NULL DEFAULT 0,
  rejected    INTEGER NOT NULL DEFAULT 0
) STRICT;
CREATE INDEX import_files_sha256 ON import_files(sha256);

CREATE TABLE import_rejections (
  id             INTEGER PRIMARY KEY,
  import_file_id INTEGER NOT NULL REFERENCES import_files(id) ON DELETE CASCADE,
  line           INTEGER NOT NULL,
  code           TEXT NOT NULL,
  reason         TEXT NOT NULL
) STRICT;
CREATE INDEX import_rejections_file ON import_rejections(import_file_id, line);

CREATE TABLE element_sets (
  id               INTEGER PRIMARY KEY,
  object_id        TEXT NOT NULL REFERENCES objects(id) ON DELETE CASCADE,
  epoch_ms         REAL NOT NULL,
  name             TEXT,
  intl_designator  TEXT,
  classification   TEXT NOT NULL,
  mean_motion      REAL NOT NULL CHECK (mean_motion > 0),
  eccentricity     REAL NOT NULL CHECK (eccentricity >= 0 AND eccentricity < 1),
  inclination_deg  REAL NOT NULL,
  raan_deg         REAL NOT NULL,
  arg_perigee_deg  REAL NOT NULL,
  mean_anomaly_deg REAL NOT NULL,
  bstar            REAL NOT NULL,
  mean_motion_dot  REAL NOT NULL,
  mean_motion_ddot REAL NOT NULL,
  element_set_no   INTEGER NOT NULL,
  rev_at_epoch     INTEGER NOT NULL,
  ephemeris_type   INTEGER NOT NULL,
  source_file      TEXT NOT NULL,
  source_line      INTEGER NOT NULL,
  source_format    TEXT NOT NULL,
  import_file_id   INTEGER REFERENCES import_files(id) ON DELETE SET NULL,
  imported_at      REAL NOT NULL,
  -- a correction (same object and epoch, different elements) marks the old row superseded and
  -- points back at it; history keeps both
  superseded       INTEGER NOT NULL DEFAULT 0 CHECK (superseded IN (0, 1)),
  corrects_id      INTEGER REFERENCES element_sets(id) ON DELETE SET NULL
) STRICT;
CREATE INDEX element_sets_object_epoch ON element_sets(object_id, epoch_ms);
-- at most one current set per object and exact epoch; also serves "latest per object"
CREATE UNIQUE INDEX element_sets_current ON element_sets(object_id, epoch_ms) WHERE superseded = 0;
CREATE INDEX element_sets_import ON element_sets(import_file_id);

CREATE TABLE runs (
  id                  TEXT PRIMARY KEY,
  seq                 INTEGER NOT NULL UNIQUE,
  created_at          REAL NOT NULL,
  start_ms            REAL NOT NULL,
  end_ms              REAL NOT NULL CHECK (end_ms >= start_ms),
  volume_json         TEXT NOT NULL,           -- ScreeningVolume
  primaries_json      TEXT NOT NULL,           -- string[] or "all"
  catalog_fingerprint TEXT NOT NULL,
  object_count        INTEGER NOT NULL,
  status              TEXT NOT NULL CHECK (status IN ('running', 'done', 'cancelled', 'failed')),
  finished_at         REAL,
  wall_ms             REAL,
  event_count         INTEGER,
  flagged_count       INTEGER
) STRICT;
CREATE INDEX runs_created ON runs(created_at);

CREATE TABLE run_flagged (
  id        INTEGER PRIMARY KEY,
  run_id    TEXT NOT NULL REFERENCES runs(id) ON DELETE CASCADE,
  object_id TEXT NOT NULL,
  reason    TEXT NOT NULL
) STRICT;
CREATE INDEX run_flagged_run ON run_flagged(run_id);

CREATE TABLE events (
  id                   TEXT PRIMARY KEY,
  run_id               TEXT NOT NULL REFERENCES runs(id) ON DELETE CASCADE,
  seq                  INTEGER NOT NULL,
  primary_id           TEXT NOT NULL,
  secondary_id         TEXT NOT NULL,
  tca_ms               REAL NOT NULL,
  miss_km              REAL NOT NULL,
  relative_speed_km_s  REAL NOT NULL,
  rtn_r_km             REAL NOT NULL,
  rtn_t_km             REAL NOT NULL,
  rtn_n_km             REAL NOT NULL,
  approach_angle_deg   REAL NOT NULL,
  entry_ms             REAL,
  exit_ms              REAL,
  -- TEME states at TCA: position km, velocity km/s
  p_x_km REAL NOT NULL, p_y_km REAL NOT NULL, p_z_km REAL NOT NULL,
  p_vx_km_s REAL NOT NULL, p_vy_km_s REAL NOT NULL, p_vz_km_s REAL NOT NULL,
  s_x_km REAL NOT NULL, s_y_km REAL NOT NULL, s_z_km REAL NOT NULL,
  s_vx_km_s REAL NOT NULL, s_vy_km_s REAL NOT NULL, s_vz_km_s REAL NOT NULL,
  primary_epoch_ms     REAL NOT NULL,
  secondary_epoch_ms   REAL NOT NULL,
  -- risk: all NULL until assessed; pc alone may stay NULL after assessment (no Pc computable)
  pc                   REAL,
  pc_method            TEXT,
  covariance_source    TEXT,
  hard_body_radius_m   REAL,
  tier                 TEXT,
  warnings_json        TEXT,
  extra_json           TEXT NOT NULL DEFAULT '{}',
  UNIQUE (run_id, seq),
  CHECK ((pc_method IS NULL) = (covariance_source IS NULL)
     AND (pc_method IS NULL) = (hard_body_radius_m IS NULL)
     AND (pc_method IS NULL) = (tier IS NULL)
     AND (pc_method IS NULL) = (warnings_json IS NULL)
     AND (pc_method IS NOT NULL OR pc IS NULL))
) STRICT;
CREATE INDEX events_run_tca ON events(run_id, tca_ms);
CREATE INDEX events_primary ON events(primary_id, tca_ms);
CREATE INDEX events_secondary ON events(secondary_id, tca_ms);

CREATE TABLE cdm_messages (
  id                    INTEGER PRIMARY KEY,
  import_file_id        INTEGER REFERENCES import_files(id) ON DELETE SET NULL,
  message_id            TEXT NOT NULL,
  creation_date_ms      REAL NOT NULL,
  originator            TEXT NOT NULL,
  tca_ms                REAL NOT NULL,
  miss_distance_m       REAL NOT NULL,
  object1_id            TEXT NOT NULL,
  object2_id            TEXT NOT NULL,
  collision_probability REAL,
  parsed_json           TEXT NOT NULL,
  event_id              TEXT REFERENCES events(id) ON DELETE SET NULL,
  stored_at             REAL NOT NULL,
  -- CCSDS 508.0-B-1: MESSAGE_ID is unique per originator, so a re-sent message is the same one
  UNIQUE (originator, message_id)
) STRICT;
CREATE INDEX cdm_messages_pair ON cdm_messages(object1_id, object2_id, tca_ms);
CREATE INDEX cdm_messages_event ON cdm_messages(event_id);

CREATE TABLE settings (
  key        TEXT PRIMARY KEY,
  value_json TEXT NOT NULL
) STRICT;
`;
