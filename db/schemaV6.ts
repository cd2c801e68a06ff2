/**
 * Schema version 6: the owner's spacecraft data that manoeuvre planning needs, and the plans.
 *
 * - `spacecraft`: mass (kg) and thruster Isp (s) per owner object, set by the operator
 *   (`keepclear spacecraft`). No defaults: propellant from the rocket equation is only as good
 *   as these, so planning refuses to run without them.
 * - `plans`: one row per `keepclear plan` of an event, kept with the event (deleted with it).
 *   The chosen burn's headline numbers are columns (what `events` and reports list); the whole
 *   plan — trade table, verification both ways, new approaches of the re-screen, notes — is the
 *   plan's JSON document (read whole, never queried inside), as `plan --json` writes it.
 *
 * Independent of versions 4 and 5 (series, ephemerides): only `objects` and `events` of v1 are
 * referenced.
 */
export const SCHEMA_V6_PLANS = `
CREATE TABLE spacecraft (
  object_id   TEXT PRIMARY KEY REFERENCES objects(id) ON DELETE CASCADE,
  mass_kg     REAL CHECK (mass_kg IS NULL OR mass_kg > 0),
  isp_s       REAL CHECK (isp_s IS NULL OR isp_s > 0),
  updated_at  REAL NOT NULL
) STRICT;

CREATE TABLE plans (
  id                INTEGER PRIMARY KEY,
  event_id          TEXT NOT NULL REFERENCES events(id) ON DELETE CASCADE,
  created_at        REAL NOT NULL,
  -- { "kind": "miss", "missKm": 2 } or { "kind": "pc", "pc": 1e-6 }
  target_json       TEXT NOT NULL,
  status            TEXT NOT NULL CHECK (status IN ('planned', 'no-burn-needed', 'no-proposal')),
  -- the chosen burn (NULL unless status = 'planned')
  burn_time_ms      REAL,
  lead_time_s       REAL,
  direction         TEXT,
  delta_v_m_s       REAL CHECK (delta_v_m_s IS NULL OR delta_v_m_s >= 0),
  achieved_miss_km  REAL,
  achieved_pc       REAL,
  propellant_kg     REAL,
  -- the spacecraft data the propellant was computed with
  mass_kg           REAL NOT NULL CHECK (mass_kg > 0),
  isp_s             REAL NOT NULL CHECK (isp_s > 0),
  new_approaches    INTEGER NOT NULL DEFAULT 0,
  document_json     TEXT NOT NULL,
  CHECK ((status = 'planned') = (burn_time_ms IS NOT NULL)
     AND (burn_time_ms IS NULL) = (delta_v_m_s IS NULL))
) STRICT;
CREATE INDEX plans_event ON plans(event_id, created_at);
`;
