import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { MS_PER_DAY, parseIso, type Instant } from '../time/instant.js';
import { generateCatalog } from './catalog.js';
import { DEMO_WEEK_STARTS_ISO, ENCOUNTER_DESIGNS, type EncounterDesign } from './demoDesigns.js';
import { buildFleet, DEMO_CATALOG_FIRST_ID, DEMO_DESIGNED_FIRST_ID, DEMO_MAX_CATALOG_SIZE } from './demoFleet.js';
import { tleExactEpoch } from './draft.js';
import { plantEncounter } from './plant.js';

/**
 * The demo's truth: the invented fleet, the generated catalogue and the designed secondaries as
 * week 3 (the newest data) holds them. Every earlier week is derived from this (demoWeeks.ts).
 */
export interface DesignedObject {
  readonly design: EncounterDesign;
  readonly secondaryId: string;
  readonly primaryId: string;
  readonly tca: Instant;
  /** the truth's set (week 3) */
  readonly set: ElementSet;
  readonly relativeSpeedKmS: number;
  readonly approachAngleDeg: number;
}

export interface DemoWorld {
  /** week 3's start: the single-week demo's start */
  readonly start: Instant;
  readonly fleet: ElementSet[];
  readonly generated: ElementSet[];
  readonly designed: DesignedObject[];
}

export interface DemoOptions {
  readonly seed?: number;
  /** generated catalogue objects besides the designed ones (default 30,000; small in tests) */
  readonly catalogSize?: number;
}

export function designedId(index: number): string {
  return String(DEMO_DESIGNED_FIRST_ID + index);
}

export function buildDemoWorld(opts: DemoOptions = {}): DemoWorld {
  const seed = opts.seed ?? 1;
  const size = opts.catalogSize ?? 30_000;
  if (!Number.isInteger(size) || size < 0 || size > DEMO_MAX_CATALOG_SIZE)
    throw new KeepclearError('BAD_ARGUMENT', `demo catalogue size must be a whole number in 0..${DEMO_MAX_CATALOG_SIZE}, got ${size}`);
  const start = parseIso(DEMO_WEEK_STARTS_ISO[2])!;
  const fleet = buildFleet(start);
  // Catalogue epochs, like the fleet's, fall in the 2 days before the week.
  const generated = generateCatalog({ size, seed, epoch: start, maxAgeDays: 2, idStart: DEMO_CATALOG_FIRST_ID });
  const designed = ENCOUNTER_DESIGNS.map((d, k): DesignedObject => {
    const primary = fleet[d.fleetIndex]!;
    const tca = parseIso(d.tcaIso)!;
    const p = plantEncounter({
      primary,
      secondaryId: designedId(k),
      secondaryName: d.name,
      tca,
      missKm: d.truth.missKm,
      missAngleDeg: d.truth.missAngleDeg,
      geometry: d.geometry,
      fitEpoch: tleExactEpoch(start - MS_PER_DAY + d.fitEpochHours * 3_600_000),
      bstar: d.bstar,
    });
    return {
      design: d,
      secondaryId: designedId(k),
      primaryId: primary.objectId,
      tca,
      set: { ...p.secondary, source: { file: 'synthetic-demo-planted', line: k + 1, format: 'SYNTHETIC' } },
      relativeSpeedKmS: p.relativeSpeedKmS,
      approachAngleDeg: p.approachAngleDeg,
    };
  });
  return { start, fleet, generated, designed };
}
