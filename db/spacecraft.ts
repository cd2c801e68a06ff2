/**
 * The owner's spacecraft data for manoeuvre planning: mass (kg) and thruster Isp (s) per object.
 * Never defaulted: a plan without them is refused (app/plan says which command sets them).
 */
import { KeepclearError } from '../core/errors.js';
import { instantFromMs, type Instant } from '../core/time/instant.js';
import type { KeepclearDb } from './connection.js';

export interface StoredSpacecraft {
  readonly objectId: string;
  /** null: not set */
  readonly massKg: number | null;
  readonly ispS: number | null;
  readonly updatedAt: Instant;
}

interface SpacecraftRow {
  object_id: string;
  mass_kg: number | null;
  isp_s: number | null;
  updated_at: number;
}

export function getSpacecraft(db: KeepclearDb, objectId: string): StoredSpacecraft | null {
  const r = db.stmt('SELECT * FROM spacecraft WHERE object_id = ?').get(objectId) as SpacecraftRow | undefined;
  return r ? { objectId: r.object_id, massKg: r.mass_kg, ispS: r.isp_s, updatedAt: instantFromMs(r.updated_at) } : null;
}

const positive = (x: number | null | undefined): boolean => x === null || x === undefined || (Number.isFinite(x) && x > 0);

/**
 * Sets the mass and/or Isp of an object in the catalogue (a value left undefined keeps what is
 * stored; null clears it). The object must exist: a typo would otherwise store data nobody uses.
 */
export function setSpacecraft(
  db: KeepclearDb,
  objectId: string,
  values: { readonly massKg?: number | null; readonly ispS?: number | null },
  now: Instant = Date.now() as Instant,
): StoredSpacecraft {
  if (!positive(values.massKg)) throw new KeepclearError('BAD_ARGUMENT', `spacecraft mass must be a positive number of kg, got ${values.massKg}`);
  if (!positive(values.ispS)) throw new KeepclearError('BAD_ARGUMENT', `Isp must be a positive number of seconds, got ${values.ispS}`);
  return db.sqlite.transaction(() => {
    const exists = db.stmt('SELECT 1 FROM objects WHERE id = ?').pluck().get(objectId);
    if (!exists)
      throw new KeepclearError('NOT_FOUND', `no object "${objectId}" in the catalogue; import its element set first (keepclear import FILE)`);
    const old = getSpacecraft(db, objectId);
    const massKg = values.massKg === undefined ? (old?.massKg ?? null) : values.massKg;
    const ispS = values.ispS === undefined ? (old?.ispS ?? null) : values.ispS;
    db.stmt(
      `INSERT INTO spacecraft (object_id, mass_kg, isp_s, updated_at) VALUES (?, ?, ?, ?)
       ON CONFLICT (object_id) DO UPDATE SET mass_kg = excluded.mass_kg, isp_s = excluded.isp_s, updated_at = excluded.updated_at`,
    ).run(objectId, massKg, ispS, now);
    return getSpacecraft(db, objectId)!;
  })();
}

export function listSpacecraft(db: KeepclearDb): StoredSpacecraft[] {
  const rows = db.stmt('SELECT * FROM spacecraft ORDER BY object_id').all() as SpacecraftRow[];
  return rows.map((r) => ({ objectId: r.object_id, massKg: r.mass_kg, ispS: r.isp_s, updatedAt: instantFromMs(r.updated_at) }));
}
