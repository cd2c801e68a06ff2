import type { KeepclearDb } from './connection.js';

/**
 * User settings that live with the data (tier thresholds, default hard-body radius), as JSON
 * values under string keys. The caller owns the shape of each value and checks it on reading.
 */
export function getSetting(db: KeepclearDb, key: string): unknown {
  const json = db.stmt('SELECT value_json FROM settings WHERE key = ?').pluck().get(key) as string | undefined;
  return json === undefined ? undefined : (JSON.parse(json) as unknown);
}

export function putSetting(db: KeepclearDb, key: string, value: unknown): void {
  if (value === undefined) throw new TypeError(`setting "${key}": undefined cannot be stored; use deleteSetting`);
  db.stmt(
    'INSERT INTO settings (key, value_json) VALUES (?, ?) ON CONFLICT (key) DO UPDATE SET value_json = excluded.value_json',
  ).run(key, JSON.stringify(value));
}

export function deleteSetting(db: KeepclearDb, key: string): void {
  db.stmt('DELETE FROM settings WHERE key = ?').run(key);
}
