import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { MS_PER_DAY, parseIso, type Instant } from '../time/instant.js';
import { generateCatalog } from './catalog.js';
import { buildFleet, DEMO_DAYS, DEMO_OPERATOR, DEMO_START_ISO } from './demoFleet.js';
import { tleExactEpoch } from './draft.js';
import { buildHistory } from './history.js';
import { plantEncounter, type Geometry } from './plant.js';
import { Rng } from './random.js';

/**
 * The demo world: an invented operator's five spacecraft, a synthetic catalogue, and planted
 * close approaches spread over a fixed week, each with a designed miss distance and geometry.
 *
 * `catalog` EXCLUDES the fleet and INCLUDES the planted secondaries (appended after the
 * generated objects, ids following on). Import both `fleet` and `catalog` to screen.
 * `history` holds, for every fleet member and planted secondary, four older element sets
 * (oldest first, 12–24 h apart) consistent with the newest one.
 */
export interface PlantedEncounter {
  readonly primary: string;
  readonly secondary: string;
  readonly tca: Instant;
  readonly designedMissKm: number;
  readonly geometry: Geometry['kind'];
  readonly approachAngleDeg: number;
  readonly relativeSpeedKmS: number;
}

export interface DemoScenario {
  readonly operator: { readonly name: string };
  readonly fleet: ElementSet[];
  readonly catalog: ElementSet[];
  readonly planted: PlantedEncounter[];
  readonly history: Record<string, ElementSet[]>;
  readonly start: Instant;
  readonly end: Instant;
}

export interface DemoOptions {
  readonly seed?: number;
  /** generated catalogue objects before the planted ones (default 30,000; small in tests) */
  readonly catalogSize?: number;
}

interface EncounterDesign {
  fleetIndex: number;
  tcaIso: string;
  missKm: number;
  missAngleDeg: number;
  geometry: Geometry;
  name: string;
  bstar: number;
  /** fit epoch, hours relative to one day before the demo start */
  fitEpochHours: number;
}

/** The planted encounters: varied primaries, times, misses (50 m – 4 km) and geometries. */
export const ENCOUNTER_DESIGNS: readonly EncounterDesign[] = [
  { fleetIndex: 0, tcaIso: '2026-12-07T14:52:48.317Z', missKm: 0.05, missAngleDeg: 20, geometry: { kind: 'crossing', angleDeg: 170 }, name: 'OBJECT PAYLOAD 90411', bstar: 8e-5, fitEpochHours: -2 },
  { fleetIndex: 2, tcaIso: '2026-12-08T08:53:12.904Z', missKm: 0.8, missAngleDeg: 75, geometry: { kind: 'crossing', angleDeg: 90 }, name: 'EO-SAT 9102', bstar: 1.1e-4, fitEpochHours: 3 },
  { fleetIndex: 4, tcaIso: '2026-12-09T02:38:24.051Z', missKm: 0.3, missAngleDeg: 140, geometry: { kind: 'fragment', angleDeg: 115, speedFactor: 1.012, radialKmS: 0.06 }, name: 'BREAKUP 3 DEB', bstar: 6e-4, fitEpochHours: -5 },
  { fleetIndex: 1, tcaIso: '2026-12-09T20:38:30.622Z', missKm: 2.0, missAngleDeg: 90, geometry: { kind: 'overtaking', deltaRtnKmS: [0.012, 0.025, 0.01] }, name: 'OBJECT R/B 90477', bstar: 9e-5, fitEpochHours: 1 },
  { fleetIndex: 3, tcaIso: '2026-12-10T13:55:03.480Z', missKm: 4.0, missAngleDeg: 10, geometry: { kind: 'crossing', angleDeg: 45 }, name: 'EO-SAT 9233', bstar: 5e-5, fitEpochHours: -8 },
  { fleetIndex: 0, tcaIso: '2026-12-11T07:55:12.199Z', missKm: 0.15, missAngleDeg: 260, geometry: { kind: 'crossing', angleDeg: 100 }, name: 'OBJECT PAYLOAD 90512', bstar: 1.3e-4, fitEpochHours: 6 },
  { fleetIndex: 4, tcaIso: '2026-12-12T04:33:36.770Z', missKm: 1.2, missAngleDeg: 200, geometry: { kind: 'crossing', angleDeg: 160 }, name: 'OBJECT R/B 90533', bstar: 3e-5, fitEpochHours: -1 },
  { fleetIndex: 2, tcaIso: '2026-12-13T01:12:00.437Z', missKm: 0.5, missAngleDeg: 320, geometry: { kind: 'fragment', angleDeg: 125, speedFactor: 0.995, radialKmS: -0.03 }, name: 'BREAKUP 5 DEB', bstar: 4e-4, fitEpochHours: 4 },
];

/** Largest generated catalogue that leaves room below the fleet's numbers. */
const MAX_CATALOG_SIZE = 79_000;

export function buildDemoScenario(opts: DemoOptions = {}): DemoScenario {
  const seed = opts.seed ?? 1;
  const size = opts.catalogSize ?? 30_000;
  if (!Number.isInteger(size) || size < 0 || size > MAX_CATALOG_SIZE)
    throw new KeepclearError('BAD_ARGUMENT', `demo catalogue size must be a whole number in 0..${MAX_CATALOG_SIZE}, got ${size}`);
  const start = parseIso(DEMO_START_ISO)!;
  const end = (start + DEMO_DAYS * MS_PER_DAY) as Instant;

  const fleet = buildFleet(start);
  // Catalogue epochs, like the fleet's, fall in the 2 days before the demo week.
  const generated = generateCatalog({ size, seed, epoch: start, maxAgeDays: 2 });
  const planted: PlantedEncounter[] = [];
  const secondaries: ElementSet[] = [];
  ENCOUNTER_DESIGNS.forEach((d, k) => {
    const primary = fleet[d.fleetIndex]!;
    const tca = parseIso(d.tcaIso)!;
    const p = plantEncounter({
      primary,
      secondaryId: String(size + 1 + k),
      secondaryName: d.name,
      tca,
      missKm: d.missKm,
      missAngleDeg: d.missAngleDeg,
      geometry: d.geometry,
      fitEpoch: tleExactEpoch(start - MS_PER_DAY + d.fitEpochHours * 3_600_000),
      bstar: d.bstar,
    });
    secondaries.push({ ...p.secondary, source: { file: 'synthetic-demo-planted', line: k + 1, format: 'SYNTHETIC' } });
    planted.push({
      primary: primary.objectId,
      secondary: p.secondary.objectId,
      tca,
      designedMissKm: d.missKm,
      geometry: d.geometry.kind,
      approachAngleDeg: p.approachAngleDeg,
      relativeSpeedKmS: p.relativeSpeedKmS,
    });
  });

  const historyRng = new Rng(seed).fork(7_000);
  const history: Record<string, ElementSet[]> = {};
  for (const es of [...fleet, ...secondaries]) history[es.objectId] = buildHistory(es, historyRng);

  return { operator: { name: DEMO_OPERATOR.name }, fleet, catalog: [...generated, ...secondaries], planted, history, start, end };
}
