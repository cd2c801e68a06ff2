import { createHash } from 'node:crypto';
import type { OrbitElements } from '../core/elements/elementSet.js';
import type { KeepclearDb } from './connection.js';
import { latestElementSets, latestOrbits } from './elementSets.js';
import { elementsKey } from './sameElements.js';
import { storageError } from './storageErrors.js';

/**
 * SHA-256 (hex) over the latest set of each object: id, exact epoch and the compared elements,
 * one line per object in id order. Equal fingerprints mean a run would screen the same orbits;
 * names and source files do not enter, so re-importing the same data elsewhere keeps it.
 *
 * The whole catalogue's fingerprint is kept in catalog_state (schema v8) with the generation of
 * the element sets it describes; triggers move the generation on at every write to element_sets.
 */
export function catalogFingerprint(db: KeepclearDb, ids?: readonly string[]): string {
  if (ids !== undefined) return fingerprintOfSets(latestElementSets(db, ids));
  return keptFingerprint(db) ?? fingerprintOfCatalogue(db, readCatalogue(db));
}

/** The latest set of every object (latestOrbits), and the generation of element_sets they were read at. */
export interface CatalogueSnapshot {
  readonly sets: OrbitElements[];
  readonly generation: number;
}

/** latestOrbits(db) and its generation, read in one transaction (one snapshot of the file). */
export function readCatalogue(db: KeepclearDb): CatalogueSnapshot {
  try {
    return db.sqlite.transaction(() => ({ generation: generationOf(db), sets: latestOrbits(db) })).deferred();
  } catch (err) {
    throw storageError(err, db.path, db.busyTimeoutMs) ?? err;
  }
}

/**
 * The fingerprint of a snapshot: the kept one if it was computed at the snapshot's generation;
 * else computed from the snapshot's sets and kept, unless the sets have changed since the
 * snapshot was read (another process imported meanwhile): then it is only returned.
 */
export function fingerprintOfCatalogue(db: KeepclearDb, snapshot: CatalogueSnapshot): string {
  const row = stateRow(db);
  if (row?.fingerprint != null && row.fingerprint_generation === snapshot.generation) return row.fingerprint;
  const fingerprint = fingerprintOfSets(snapshot.sets);
  try {
    db.stmt('UPDATE catalog_state SET fingerprint = ?, fingerprint_generation = ? WHERE id = 1 AND generation = ?').run(
      fingerprint,
      snapshot.generation,
      snapshot.generation,
    );
  } catch (err) {
    // Not kept (a read-only or busy database): the next caller computes it again. Still right.
    if (!storageError(err, db.path, db.busyTimeoutMs)) throw err;
  }
  return fingerprint;
}

/**
 * The same fingerprint of sets already loaded (latestElementSets, latestOrbits), so a caller holding them
 * does not read the catalogue twice. Sorts a copy.
 */
export function fingerprintOfSets(latest: readonly OrbitElements[]): string {
  const sets = [...latest];
  // Sort here, not in SQL: JS code-unit order is the same on every machine, collations may not be.
  sets.sort((a, b) => (a.objectId < b.objectId ? -1 : a.objectId > b.objectId ? 1 : 0));
  const h = createHash('sha256');
  for (const s of sets) h.update(`${s.objectId}|${s.epoch}|${elementsKey(s)}\n`);
  return h.digest('hex');
}

interface StateRow {
  generation: number;
  fingerprint: string | null;
  fingerprint_generation: number | null;
}

const stateRow = (db: KeepclearDb): StateRow | undefined =>
  db.stmt('SELECT generation, fingerprint, fingerprint_generation FROM catalog_state WHERE id = 1').get() as StateRow | undefined;

/** Generation of the element sets: moved on by every insert, update and delete (schema v8 triggers). */
function generationOf(db: KeepclearDb): number {
  return stateRow(db)?.generation ?? 0;
}

/** The kept fingerprint when it describes the current sets, else null. */
function keptFingerprint(db: KeepclearDb): string | null {
  const row = stateRow(db);
  return row?.fingerprint != null && row.fingerprint_generation === row.generation ? row.fingerprint : null;
}
