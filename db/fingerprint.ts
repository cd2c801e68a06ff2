import { createHash } from 'node:crypto';
import type { ElementSet } from '../core/elements/elementSet.js';
import type { KeepclearDb } from './connection.js';
import { latestElementSets } from './elementSets.js';
import { elementsKey } from './sameElements.js';

/**
 * SHA-256 (hex) over the latest set of each object: id, exact epoch and the compared elements,
 * one line per object in id order. Equal fingerprints mean a run would screen the same orbits;
 * names and source files do not enter, so re-importing the same data elsewhere keeps it.
 */
export function catalogFingerprint(db: KeepclearDb, ids?: readonly string[]): string {
  return fingerprintOfSets(latestElementSets(db, ids));
}

/**
 * The same fingerprint of sets already loaded (latestElementSets), so a caller holding them
 * does not read the catalogue twice. Sorts a copy.
 */
export function fingerprintOfSets(latest: readonly ElementSet[]): string {
  const sets = [...latest];
  // Sort here, not in SQL: JS code-unit order is the same on every machine, collations may not be.
  sets.sort((a, b) => (a.objectId < b.objectId ? -1 : a.objectId > b.objectId ? 1 : 0));
  const h = createHash('sha256');
  for (const s of sets) h.update(`${s.objectId}|${s.epoch}|${elementsKey(s)}\n`);
  return h.digest('hex');
}
