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
export const FLEET_IDS = ['80001', '80002', '80003', '80004', '80005'] as const;

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
  { id: '80001', name: 'TARNWELL BRISK-1', altKm: 535, incDeg: 53.05, node: { raanDeg: 40 }, e: 0.0011, argpDeg: 90, meanAnomalyDeg: 10, bstar: 1.2e-4, ageDays: 0.6 },
  { id: '80002', name: 'TARNWELL BRISK-2', altKm: 565, incDeg: 45.0, node: { raanDeg: 160 }, e: 0.0009, argpDeg: 200, meanAnomalyDeg: 130, bstar: 1.0e-4, ageDays: 1.1 },
  { id: '80003', name: 'TARNWELL SOLACE-1', altKm: 520, incDeg: null, node: { localTimeH: 22.5 }, e: 0.0012, argpDeg: 75, meanAnomalyDeg: 250, bstar: 1.5e-4, ageDays: 0.4 },
  { id: '80004', name: 'TARNWELL SOLACE-2', altKm: 680, incDeg: null, node: { localTimeH: 18 }, e: 0.0010, argpDeg: 300, meanAnomalyDeg: 45, bstar: 4.0e-5, ageDays: 1.5 },
  { id: '80005', name: 'TARNWELL VANTAGE', altKm: 800, incDeg: null, node: { localTimeH: 21 }, e: 0.0013, argpDeg: 15, meanAnomalyDeg: 190, bstar: 2.5e-5, ageDays: 0.9 },
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
