import type { KeepclearDb } from './connection.js';

/**
 * For tests only: makes the next inserts of element sets for `objectId` fail inside SQLite, as a
 * constraint violation or a full disk would, to prove a file's store is all-or-nothing.
 * TEMP: the trigger lives in this connection only and never reaches the file.
 */
export function failElementSetInsertsFor(db: KeepclearDb, objectId: string): void {
  const quoted = `'${objectId.replaceAll("'", "''")}'`;
  db.sqlite.exec(
    `CREATE TEMP TRIGGER IF NOT EXISTS test_fail_element_set BEFORE INSERT ON element_sets
       WHEN NEW.object_id = ${quoted}
       BEGIN SELECT RAISE(ABORT, 'injected failure for object ${objectId.replaceAll("'", "''")}'); END`,
  );
}

export function clearInjectedFailures(db: KeepclearDb): void {
  db.sqlite.exec('DROP TRIGGER IF EXISTS temp.test_fail_element_set');
}
