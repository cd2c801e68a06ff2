/**
 * A small database with one real screening run (SGP4, the app's own screen-and-store) for the
 * export tests: a primary with an element-set history (covariance from history) and a set hard-body
 * radius, crossing a secondary with a single set (default-table covariance, default radius) at
 * their common ascending node near T0. Invented objects in the Alpha-5 range (A0001, B0001).
 */
import { screenAndStore } from '../../app/screen.js';
import type { ElementSet } from '../../core/elements/elementSet.js';
import { parseIso, type Instant } from '../../core/time/instant.js';
import { openDatabase, setHardBodyRadius, storeElementSets, type KeepclearDb } from '../../db/index.js';
import type { ConjunctionEvent } from '../../core/events/index.js';
import type { RunRecord } from '../../db/index.js';
import { reEpochElementSet } from '../../core/synthetic/reEpoch.js';
import { elementSet, type Orbit } from './elements.js';

export const T0 = parseIso('2026-12-07T06:00:00Z')!;
const DAY = 86_400_000;
export const PRIMARY = '100001';
export const SECONDARY = '110001';

const primaryOrbit: Orbit = { aKm: 6928, e: 0.0005, iDeg: 97.6, raanDeg: 40, argpDeg: 0, uDeg: 0 };
const secondaryOrbit: Orbit = { aKm: 6930.19, e: 0.0005, iDeg: 53, raanDeg: 40, argpDeg: 0, uDeg: -0.025 };

/**
 * The newest primary set at T0, and three older ones re-issued from it at T0 − 3, 2, 1 days
 * with an orbit-determination error (a few hundred metres along track, a small velocity
 * error), so the history covariance has realistic size (hundreds of metres).
 */
function primarySets(): ElementSet[] {
  const newest = { ...elementSet(PRIMARY, T0, primaryOrbit, T0), name: 'KEEPCLEAR-1', intlDesignator: '2026-901A', elementSetNo: 20 };
  const older = [3, 2, 1].map((daysBefore, k) =>
    reEpochElementSet(newest, (T0 - daysBefore * DAY) as Instant, {
      perturb: (r, v) => {
        const sv = Math.hypot(v[0]!, v[1]!, v[2]!);
        const along = (k % 2 ? 1 : -1) * 0.15 * (k + 1); // km
        const dv = 1 + (k - 1) * 2e-7;
        return { r: r.map((x, i) => x + (along * v[i]!) / sv), v: v.map((x) => x * dv) };
      },
    }),
  );
  return [...older, newest];
}

export interface ExportFixture {
  readonly db: KeepclearDb;
  readonly run: RunRecord;
  readonly events: ConjunctionEvent[];
}

export async function exportFixture(path = ':memory:'): Promise<ExportFixture> {
  const db = openDatabase(path);
  storeElementSets(db, { path: 'primary.tle', sha256: 'p'.repeat(64), format: 'TLE' }, primarySets(), []);
  const sec = { ...elementSet(SECONDARY, T0, secondaryOrbit, T0), name: 'DEBRIS B0001', intlDesignator: '2019-950C' };
  storeElementSets(db, { path: 'secondary.tle', sha256: 's'.repeat(64), format: 'TLE' }, [sec], []);
  setHardBodyRadius(db, [PRIMARY], 2.5);
  const r = await screenAgain(db);
  return { db, run: r.run, events: r.events };
}

/** The fixture's screening (again): a later run finds the same conjunction, one series. */
export function screenAgain(db: KeepclearDb) {
  return screenAndStore(db, {
    settings: {
      start: (T0 - 600_000) as Instant,
      end: (T0 + 600_000) as Instant,
      volume: { kind: 'sphere', radiusKm: 20 },
      primaries: [PRIMARY],
    },
    workers: 0,
  });
}
