import type { ElementSet } from '../elements/elementSet.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import { tleExactEpoch, draftToElementSet } from './draft.js';
import { RE, sunSynchronousInclination } from './j2.js';
import { Rng } from './random.js';
import { sunRightAscensionRad } from './sky.js';

/**
 * The demo's invented operator and its five spacecraft. Fixed numbers (not seeded) so the demo
 * week is the same for everyone; names are invented for Keepclear.
 */
export const DEMO_OPERATOR = { name: 'Tarnwell Orbital' } as const;
export const DEMO_START_ISO = '2026-12-07T00:00:00.000Z';
export const DEMO_DAYS = 7;
/**
 * Demo catalogue numbers lie in the Alpha-5 range (≥ 100000, written A0000…Z9999 in a TLE), above
 * every number the public catalogue has issued (below 100000 as of 2026, from memory), so no demo
 * object can be mistaken for a real one. Fleet A0001–A0005; generated catalogue from B0001
 * (110001) on; designed secondaries from Z0001 (330001), whatever the catalogue's size.
 */
export const FLEET_IDS = ['100001', '100002', '100003', '100004', '100005'] as const;
export const DEMO_CATALOG_FIRST_ID = 110_001;
export const DEMO_DESIGNED_FIRST_ID = 330_001;
/** Largest generated catalogue: its numbers stay below the designed secondaries'. */
export const DEMO_MAX_CATALOG_SIZE = DEMO_DESIGNED_FIRST_ID - DEMO_CATALOG_FIRST_ID - 20_000;

interface FleetMember {
  id: string;
  name: string;
  altKm: number;
  /** null → sun-synchronous inclination for this altitude */
  incDeg: number | null;
  /** ascending-node local time (h) for sun-synchronous members, else the node itself (deg) */
  node: { localTimeH: number } | { raanDeg: number };
  e: number;
  argpDeg: number;
  meanAnomalyDeg: number;
  bstar: number;
  /** element-set age at the demo start, days (all within the 2 days before) */
  ageDays: number;
}

const DEG = Math.PI / 180;

export const FLEET: readonly FleetMember[] = [
  { id: FLEET_IDS[0], name: 'TARNWELL BRISK-1', altKm: 535, incDeg: 53.05, node: { raanDeg: 40 }, e: 0.0011, argpDeg: 90, meanAnomalyDeg: 10, bstar: 1.2e-4, ageDays: 0.6 },
  { id: FLEET_IDS[1], name: 'TARNWELL BRISK-2', altKm: 565, incDeg: 45.0, node: { raanDeg: 160 }, e: 0.0009, argpDeg: 200, meanAnomalyDeg: 130, bstar: 1.0e-4, ageDays: 1.1 },
  { id: FLEET_IDS[2], name: 'TARNWELL SOLACE-1', altKm: 520, incDeg: null, node: { localTimeH: 22.5 }, e: 0.0012, argpDeg: 75, meanAnomalyDeg: 250, bstar: 1.5e-4, ageDays: 0.4 },
  { id: FLEET_IDS[3], name: 'TARNWELL SOLACE-2', altKm: 680, incDeg: null, node: { localTimeH: 18 }, e: 0.0010, argpDeg: 300, meanAnomalyDeg: 45, bstar: 4.0e-5, ageDays: 1.5 },
  { id: FLEET_IDS[4], name: 'TARNWELL VANTAGE', altKm: 800, incDeg: null, node: { localTimeH: 21 }, e: 0.0013, argpDeg: 15, meanAnomalyDeg: 190, bstar: 2.5e-5, ageDays: 0.9 },
];

export function buildFleet(start: Instant): ElementSet[] {
  // The generator only fills cosmetic fields (element-set number, revolution count) here.
  const cosmetic = new Rng(80_000);
  return FLEET.map((f, k) => {
    const a = RE + f.altKm;
    const epoch = tleExactEpoch(start - f.ageDays * MS_PER_DAY);
    const raan = 'raanDeg' in f.node
      ? f.node.raanDeg * DEG
      : sunRightAscensionRad(epoch) + (f.node.localTimeH - 12) * 15 * DEG;
    const es = draftToElementSet(
      {
        name: f.name, epoch, a, e: f.e,
        i: f.incDeg === null ? sunSynchronousInclination(a, f.e) : f.incDeg * DEG,
        raan, argp: f.argpDeg * DEG, meanAnomaly: f.meanAnomalyDeg * DEG, bstar: f.bstar,
      },
      f.id, k + 1, cosmetic,
    );
    return { ...es, source: { ...es.source, file: 'synthetic-demo-fleet' } };
  });
}
