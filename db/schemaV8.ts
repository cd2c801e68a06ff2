/**
 * Schema version 8: the catalogue's fingerprint kept between runs.
 *
 * Every screening run records the fingerprint of the catalogue it screened (db/fingerprint.ts),
 * SHA-256 over the latest set of each object: ~0.15 s of the main thread for 30,000 objects on
 * every run (measured), spent while the screening workers want both cores, although the sets
 * change only when a file is imported. The fingerprint is kept here with the generation of the
 * sets it was computed from; triggers move the generation on at every write to element_sets,
 * whoever makes it, so a kept fingerprint is used only while it still describes the sets.
 */
export const SCHEMA_V8_CATALOG_STATE = `
CREATE TABLE catalog_state (
  id                     INTEGER PRIMARY KEY CHECK (id = 1),
  generation             INTEGER NOT NULL,
  fingerprint            TEXT,
  fingerprint_generation INTEGER
) STRICT;
INSERT INTO catalog_state (id, generation) VALUES (1, 0);
CREATE TRIGGER element_sets_insert_generation AFTER INSERT ON element_sets
  BEGIN UPDATE catalog_state SET generation = generation + 1 WHERE id = 1; END;
CREATE TRIGGER element_sets_update_generation AFTER UPDATE ON element_sets
  BEGIN UPDATE catalog_state SET generation = generation + 1 WHERE id = 1; END;
CREATE TRIGGER element_sets_delete_generation AFTER DELETE ON element_sets
  BEGIN UPDATE catalog_state SET generation = generation + 1 WHERE id = 1; END;
`;
