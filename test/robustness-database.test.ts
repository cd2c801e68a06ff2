/**
 * The CLI and the desktop app share one database file (issue 11 item 8). Real processes, real
 * files: two writers at once, a writer that holds the lock too long, SIGKILL in the middle of an
 * import and of a screening, a read-only file or folder. "Intact" is SQLite's own verdict
 * (PRAGMA integrity_check = 'ok', foreign_key_check empty) plus: no half of a file stored.
 */
import { chmodSync, existsSync, mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { formatOmmJson } from '../core/formats/omm/index.js';
import { formatTleFile } from '../core/formats/tle/index.js';
import { buildDemoScenario } from '../core/synthetic/demo.js';
import { instantFromMs, parseIso } from '../core/time/instant.js';
import { countObjects, eventsOfRun, getRun, listImportFiles, listRuns, openDatabase } from '../db/index.js';
import { spawnKeepclear, waitFor } from './support/cli.js';

const T0 = parseIso('2026-03-01T00:00:00Z')!;

/** Object i of a LEO-like synthetic catalogue (as in cli-import.test.ts). */
function synthetic(i: number): ElementSet {
  return {
    objectId: String(i), name: `TESTSAT ${i}`, intlDesignator: '2025-001A', classification: 'U',
    epoch: instantFromMs(T0 + (i % 1000) * 60_000), meanMotionRevPerDay: 14 + (i % 200) / 100,
    eccentricity: ((i * 7) % 5000) / 1e6, inclinationDeg: (i * 0.37) % 180, raanDeg: (i * 1.13) % 360,
    argPerigeeDeg: (i * 2.71) % 360, meanAnomalyDeg: (i * 3.14) % 360, bstar: 1e-4, meanMotionDot: 1e-5,
    meanMotionDdot: 0, elementSetNo: 999, revAtEpoch: i % 100_000, ephemerisType: 0,
    source: { file: 'synthetic', line: 1, format: 'SYNTHETIC' },
  };
}
const range = (from: number, n: number): ElementSet[] => Array.from({ length: n }, (_, k) => synthetic(from + k));

/** SQLite's verdict on a database file, read without Keepclear (nothing is repaired on the way). */
function sqliteVerdict(path: string): { integrity: string; foreignKeys: unknown[] } {
  const db = new Database(path);
  try {
    return {
      integrity: db.pragma('integrity_check', { simple: true }) as string,
      foreignKeys: db.pragma('foreign_key_check') as unknown[],
    };
  } finally {
    db.close();
  }
}

const noStackTrace = (stderr: string): void => {
  expect(stderr).not.toMatch(/^\s+at /m);
  expect(stderr).not.toMatch(/internal error/);
};

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'keepclear-robust-db-'));
  chmodSync(dir, 0o755); // the read-only cases run a child as another user
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('two writers at once', () => {
  it('two imports into one file both succeed: the second waits for the first', async () => {
    const N = 30_000; // each file's store holds the write lock for about a second
    const a = join(dir, 'writers-a.tle');
    const b = join(dir, 'writers-b.tle');
    writeFileSync(a, formatTleFile(range(1, N)));
    writeFileSync(b, formatTleFile(range(N + 1, N)));
    const db = join(dir, 'writers.db');
    openDatabase(db).close(); // created first, so neither process runs the schema steps
    const first = spawnKeepclear(['import', a, '--db', db], dir);
    const second = spawnKeepclear(['import', b, '--db', db], dir);
    const [ra, rb] = await Promise.all([first.done, second.done]);
    expect(ra.code, ra.stderr).toBe(0);
    expect(rb.code, rb.stderr).toBe(0);
    expect(ra.stdout).toContain(`imported ${N}, updated 0, unchanged 0, rejected 0`);
    expect(rb.stdout).toContain(`imported ${N}, updated 0, unchanged 0, rejected 0`);
    const d = openDatabase(db);
    try {
      expect(countObjects(d)).toBe(2 * N);
      expect(listImportFiles(d)).toHaveLength(2);
    } finally {
      d.close();
    }
  });

  it('a writer that holds the lock past the busy timeout: a clear message, nothing stored', async () => {
    const db = join(dir, 'held.db');
    const file = join(dir, 'held.tle');
    writeFileSync(file, formatTleFile(range(1, 10)));
    const holder = openDatabase(db);
    holder.sqlite.exec('BEGIN IMMEDIATE'); // another process writing (the desktop app, say)
    try {
      const r = await spawnKeepclear(['import', file, '--db', db], dir, { env: { KEEPCLEAR_BUSY_TIMEOUT_MS: '300' } }).done;
      expect(r.code).toBe(1);
      noStackTrace(r.stderr);
      const [line, ...more] = r.stderr.trim().split('\n');
      expect(more).toEqual([]);
      expect(line).toBe(
        `keepclear: ${file}:1: not stored, nothing of this file was kept: the database is in use by another Keepclear ` +
          'process (the desktop app, or another command writing to it) for 0.3 s; let it finish and run the command ' +
          'again, or set KEEPCLEAR_BUSY_TIMEOUT_MS to wait longer',
      );
      // a screening waiting for the same lock says the same, naming the database
      const s = await spawnKeepclear(['screen', '--db', db, '--primary', '1', '--workers', '0'], dir, {
        env: { KEEPCLEAR_BUSY_TIMEOUT_MS: '300' },
      }).done;
      expect(s.code).toBe(1);
      noStackTrace(s.stderr);
      expect(s.stderr).toMatch(/^keepclear: .*(in use by another Keepclear process|import a catalogue first)/m);
    } finally {
      holder.sqlite.exec('ROLLBACK');
      holder.close();
    }
    const d = openDatabase(db);
    try {
      expect(countObjects(d)).toBe(0);
      expect(listImportFiles(d)).toEqual([]);
    } finally {
      d.close();
    }
  });
});

describe('SIGKILL in the middle of the work leaves the database intact', () => {
  it('during an import: integrity ok, nothing of the killed file stored, earlier files kept', async () => {
    const db = join(dir, 'killed-import.db');
    const small = join(dir, 'kept.tle');
    const big = join(dir, 'killed.tle');
    writeFileSync(small, formatTleFile(range(300_001, 5)));
    writeFileSync(big, formatTleFile(range(1, 60_000)));
    const wal = `${db}-wal`;
    const { child, done } = spawnKeepclear(['import', small, big, '--db', db], dir);
    // The big file's transaction spills pages into the WAL before it commits (the page cache
    // holds ~2 MB): a WAL past 4 MB means its store is under way and far from done (~18 MB).
    await waitFor(() => existsSync(wal) && statSync(wal).size > 4 * 1024 * 1024, 'the import to be writing');
    child.kill('SIGKILL');
    const r = await done;
    expect(r.signal).toBe('SIGKILL');
    expect(sqliteVerdict(db)).toEqual({ integrity: 'ok', foreignKeys: [] });
    const d = openDatabase(db);
    try {
      expect(listImportFiles(d).map((f) => f.path)).toEqual([small]);
      expect(countObjects(d)).toBe(5);
    } finally {
      d.close();
    }
  });

  it('during a screening: integrity ok, and the run is marked interrupted on the next open', async () => {
    const scenario = buildDemoScenario({ catalogSize: 3000 });
    const fleet = join(dir, 'fleet.tle');
    const catalog = join(dir, 'catalog.json');
    writeFileSync(fleet, formatTleFile(scenario.fleet));
    writeFileSync(catalog, formatOmmJson(scenario.catalog));
    const db = join(dir, 'killed-screen.db');
    const imp = await spawnKeepclear(['import', fleet, catalog, '--db', db], dir).done;
    expect(imp.code, imp.stderr).toBe(0);
    const ids = scenario.fleet.map((f) => f.objectId).join(',');
    const { child, done } = spawnKeepclear(
      ['screen', '--db', db, '--primary', ids, '--start', '2026-12-07T00:00:00Z', '--days', '30', '--workers', '1'],
      dir,
    );
    const watcher = new Database(db, { readonly: true });
    const running = () => watcher.prepare("SELECT id FROM runs WHERE status = 'running'").pluck().get() as string | undefined;
    let runId: string | undefined;
    try {
      await waitFor(() => (runId = running()) !== undefined, 'the screening run to start');
    } finally {
      watcher.close();
    }
    child.kill('SIGKILL');
    const r = await done;
    expect(r.signal).toBe('SIGKILL');
    expect(sqliteVerdict(db)).toEqual({ integrity: 'ok', foreignKeys: [] });
    const d = openDatabase(db); // the owner (the killed child) is gone from this host
    try {
      expect(getRun(d, runId!)).toMatchObject({ status: 'interrupted', owner: { pid: child.pid } });
      expect(eventsOfRun(d, runId!)).toEqual([]);
      expect(listRuns(d).filter((x) => x.status === 'running')).toEqual([]);
    } finally {
      d.close();
    }
    // and the CLI shows it as such
    const ev = await spawnKeepclear(['events', '--db', db, '--run', runId!], dir).done;
    expect(ev.code, ev.stderr).toBe(0);
    expect(ev.stdout).toContain(`run ${runId} (screening, interrupted)`);
  });
});

/**
 * File permissions mean nothing to root, so when the suite runs as root the child runs as the
 * unprivileged user "nobody" (uid/gid 65534), as an operator's account would.
 */
const asUser = process.getuid?.() === 0 ? { uid: 65534, gid: 65534 } : {};

describe('a database that cannot be written', () => {
  it('a read-only database file: a clear error, exit 1, the file unchanged', async () => {
    const folder = join(dir, 'ro-file');
    mkdirSync(folder);
    chmodSync(folder, 0o777);
    const db = join(folder, 'ro.db');
    const first = join(dir, 'ro-first.tle');
    writeFileSync(first, formatTleFile(range(1, 3)));
    const seeded = await spawnKeepclear(['import', first, '--db', db], dir).done;
    expect(seeded.code, seeded.stderr).toBe(0);
    chmodSync(db, 0o444);
    const more = join(dir, 'ro-more.tle');
    writeFileSync(more, formatTleFile(range(10, 3)));
    chmodSync(more, 0o644);
    const r = await spawnKeepclear(['import', more, '--db', db], dir, asUser).done;
    expect(r.code).toBe(1);
    noStackTrace(r.stderr);
    expect(r.stderr).toMatch(/^keepclear: .*read-only.*check the permissions, or pass another --db/m);
    chmodSync(db, 0o644);
    const d = openDatabase(db);
    try {
      expect(countObjects(d)).toBe(3);
    } finally {
      d.close();
    }
  });

  it('a read-only folder (SQLite writes -wal and -shm beside the file): a clear error, exit 1', async () => {
    const folder = join(dir, 'ro-folder');
    mkdirSync(folder);
    const db = join(folder, 'in-ro-folder.db');
    openDatabase(db).close(); // the last connection to close removes -wal and -shm
    chmodSync(db, 0o666);
    chmodSync(folder, 0o555);
    const file = join(dir, 'ro-folder.tle');
    writeFileSync(file, formatTleFile(range(1, 3)));
    try {
      const r = await spawnKeepclear(['import', file, '--db', db], dir, asUser).done;
      expect(r.code).toBe(1);
      noStackTrace(r.stderr);
      expect(r.stderr).toMatch(/^keepclear: .*in-ro-folder\.db:1: .*(read-only|cannot be written|permissions)/m);
      expect(r.stderr).toMatch(/pass another --db/);
    } finally {
      chmodSync(folder, 0o755);
    }
  });
});
