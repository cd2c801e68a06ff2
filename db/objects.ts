import { KeepclearError } from '../core/errors.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import type { KeepclearDb } from './connection.js';

/** One catalogued object as stored. */
export interface StoredObject {
  readonly id: string;
  readonly name: string | null;
  readonly intlDesignator: string | null;
  /** user-set (or from a CDM); null means "use the documented default" */
  readonly hardBodyRadiusM: number | null;
  /** earliest and latest element-set epoch stored */
  readonly firstSeen: Instant;
  readonly lastSeen: Instant;
}

interface ObjectRow {
  id: string;
  name: string | null;
  intl_designator: string | null;
  hard_body_radius_m: number | null;
  first_seen_ms: number;
  last_seen_ms: number;
}

const fromRow = (r: ObjectRow): StoredObject => ({
  id: r.id,
  name: r.name,
  intlDesignator: r.intl_designator,
  hardBodyRadiusM: r.hard_body_radius_m,
  firstSeen: instantFromMs(r.first_seen_ms),
  lastSeen: instantFromMs(r.last_seen_ms),
});

export function getObject(db: KeepclearDb, id: string): StoredObject | null {
  const row = db.stmt('SELECT * FROM objects WHERE id = ?').get(id) as ObjectRow | undefined;
  return row ? fromRow(row) : null;
}

export function countObjects(db: KeepclearDb): number {
  return db.stmt('SELECT COUNT(*) FROM objects').pluck().get() as number;
}

/**
 * Records that an object was seen in an element set of the given epoch. The name and designator
 * of the newest set win (launch names like "TBA" are replaced later); a missing one never erases.
 */
export function touchObject(
  db: KeepclearDb,
  id: string,
  name: string | null,
  intlDesignator: string | null,
  epochMs: number,
): void {
  db.stmt(
    `INSERT INTO objects (id, name, intl_designator, first_seen_ms, last_seen_ms)
     VALUES (@id, @name, @intl, @epoch, @epoch)
     ON CONFLICT (id) DO UPDATE SET
       name = CASE WHEN excluded.last_seen_ms >= objects.last_seen_ms
                   THEN COALESCE(excluded.name, objects.name) ELSE COALESCE(objects.name, excluded.name) END,
       intl_designator = CASE WHEN excluded.last_seen_ms >= objects.last_seen_ms
                   THEN COALESCE(excluded.intl_designator, objects.intl_designator)
                   ELSE COALESCE(objects.intl_designator, excluded.intl_designator) END,
       first_seen_ms = MIN(objects.first_seen_ms, excluded.first_seen_ms),
       last_seen_ms = MAX(objects.last_seen_ms, excluded.last_seen_ms)`,
  ).run({ id, name, intl: intlDesignator, epoch: epochMs });
}

/**
 * Sets (or with null clears) the hard-body radius of the given objects. Returns how many exist and
 * were changed; ids not in the catalogue are ignored (the caller decides whether that is an error).
 */
export function setHardBodyRadius(db: KeepclearDb, ids: readonly string[], meters: number | null): number {
  if (meters !== null && !(Number.isFinite(meters) && meters > 0)) {
    throw new KeepclearError('BAD_ARGUMENT', `hard-body radius must be a positive number of metres, got ${meters}`);
  }
  const stmt = db.stmt('UPDATE objects SET hard_body_radius_m = ? WHERE id = ?');
  let changed = 0;
  db.sqlite.transaction(() => {
    for (const id of new Set(ids)) changed += stmt.run(meters, id).changes;
  })();
  return changed;
}

/** Objects whose stored designator is `designator` (OMM form, e.g. "2026-100A"), for OBJECT_ID matching. */
export function objectsWithDesignator(db: KeepclearDb, designator: string): { id: string; name: string | null }[] {
  return db
    .stmt('SELECT id, name FROM objects WHERE upper(intl_designator) = upper(?) ORDER BY id')
    .all(designator.trim()) as { id: string; name: string | null }[];
}
