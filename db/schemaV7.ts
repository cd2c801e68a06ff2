/**
 * Schema version 7: an index of events by pair, in the order they are stored.
 *
 * Linking reads every stored sighting of each pair a run has events of (db/series.ts), in both
 * orders. With only events(primary_id, tca_ms) and events(secondary_id, tca_ms) one of the two
 * orders was found by scanning every event of every linked run — a cost that grew with the
 * database's history, week after week — and the other by reading all events of one object.
 * Measured on a 124,503-event all-vs-all run (SQLite 3.40 shell): the run's sightings in 2.6 s
 * without this index, 1.0 s with it.
 */
export const SCHEMA_V7_EVENT_PAIRS = `
CREATE INDEX events_pair ON events(primary_id, secondary_id);
`;
