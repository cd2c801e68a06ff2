/**
 * Schema version 4: series — the same conjunction across screening runs and received messages.
 *
 * - `runs.data_at`: when the run's data was created. A screening run's time (its created_at,
 *   or the time a replay says, e.g. the demo's weekly runs); a received CDM's CREATION_DATE.
 *   Series order their events by it and date their trend ("time to TCA") from it; created_at
 *   stays the time the row was written. Filled for existing rows: created_at, and for runs made
 *   from a received message the CREATION_DATE of that message.
 * - `events.series_id`: the series an event belongs to (`S-<event id of its oldest sighting>`,
 *   core/events/seriesLink.ts). NULL until linked (events stored before v4 are linked the next
 *   time the linking service runs; plan runs are never linked: they are hypothetical).
 * - `series`: one row per series with its state as of the newest data, so listing and
 *   counting by state needs no relinking. Written only by the linking service (app/series.ts),
 *   in the same transaction as the events it links. No foreign key to events: a series is
 *   rewritten whole when its pair is relinked.
 *
 * Only ADD COLUMN and new tables: no table rebuild, and the step depends on no later schema.
 */
export const SERIES_STATES = ['new', 'updated', 'no-longer-predicted', 'past'] as const;

export const SCHEMA_V4_SERIES = `
ALTER TABLE runs ADD COLUMN data_at REAL;
UPDATE runs SET data_at = created_at;
UPDATE runs
   SET data_at = (SELECT MIN(c.creation_date_ms) FROM cdm_messages c JOIN events e ON e.id = c.event_id
                   WHERE e.run_id = runs.id)
 WHERE kind = 'cdm'
   AND EXISTS (SELECT 1 FROM cdm_messages c JOIN events e ON e.id = c.event_id WHERE e.run_id = runs.id);
CREATE INDEX runs_data_at ON runs(data_at);

ALTER TABLE events ADD COLUMN series_id TEXT;
CREATE INDEX events_series ON events(series_id);

CREATE TABLE series (
  id               TEXT PRIMARY KEY,        -- "S-" + founder_event_id
  primary_id       TEXT NOT NULL,           -- as the first screening sighting names the pair
  secondary_id     TEXT NOT NULL,
  founder_event_id TEXT NOT NULL,           -- the sighting whose data is oldest
  state            TEXT NOT NULL CHECK (state IN ('new', 'updated', 'no-longer-predicted', 'past')),
  tca_ms           REAL NOT NULL,           -- TCA of the newest sighting
  sightings        INTEGER NOT NULL CHECK (sightings >= 1),
  last_event_id    TEXT NOT NULL,           -- the newest sighting (by data time)
  last_data_at     REAL NOT NULL,
  missed_by_run    TEXT,                    -- the run that no longer found it (state no-longer-predicted)
  as_of            REAL NOT NULL,           -- the newest data time the state was judged at
  updated_at       REAL NOT NULL            -- wall time of the last write
) STRICT;
CREATE INDEX series_pair ON series(primary_id, secondary_id);
CREATE INDEX series_state_tca ON series(state, tca_ms);
`;
