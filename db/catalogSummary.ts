import type { KeepclearDb } from './connection.js';

/** Newest epoch (UTC ms) among current element sets, or null for an empty catalogue (the desktop header). */
export function newestElementEpochMs(db: KeepclearDb): number | null {
  const row = db.stmt('SELECT MAX(epoch_ms) AS t FROM element_sets WHERE superseded = 0').get() as { t: number | null } | undefined;
  return row?.t ?? null;
}
