import type { ElementSet } from '../elements/elementSet.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import { isApproach, type EncounterDesign } from './demoDesigns.js';
import { DEMO_DAYS, DEMO_OPERATOR } from './demoFleet.js';
import { buildDemoWorld, type DemoOptions } from './demoWorld.js';
import { buildHistory } from './history.js';
import type { Geometry } from './plant.js';
import { Rng } from './random.js';

export type { DemoOptions } from './demoWorld.js';
export { ENCOUNTER_DESIGNS } from './demoDesigns.js';

/**
 * The single-week demo: an invented operator's five spacecraft, a synthetic catalogue, and
 * planted close approaches spread over a fixed week (7 Dec 2026 + 7 days), each with a designed
 * miss distance and geometry. It is week 3 of the three-week demo (demoWeeks.ts): the same truth.
 *
 * `catalog` EXCLUDES the fleet and INCLUDES every designed secondary (catalogue numbers from
 * Z0001 = 330001; also those whose approach lies outside this week or was only ever believed).
 * Import both `fleet` and `catalog` to screen. `planted` lists the genuine approaches of the week.
 * `history` holds, for every fleet member and designed secondary, four older element sets
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
  readonly role: EncounterDesign['role'];
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

/** RNG stream of week 3's history (the three-week demo uses the same, so week 3 is this week). */
export const WEEK3_HISTORY_STREAM = 7_000;

export function historyOf(sets: readonly ElementSet[], seed: number, stream: number): Record<string, ElementSet[]> {
  const rng = new Rng(seed).fork(stream);
  const history: Record<string, ElementSet[]> = {};
  for (const es of sets) history[es.objectId] = buildHistory(es, rng);
  return history;
}

export function buildDemoScenario(opts: DemoOptions = {}): DemoScenario {
  const world = buildDemoWorld(opts);
  const start = world.start;
  const end = (start + DEMO_DAYS * MS_PER_DAY) as Instant;
  const secondaries = world.designed.map((d) => d.set);
  const planted = world.designed
    .filter((d) => isApproach(d.design.truth) && d.tca >= start && d.tca < end)
    .map((d): PlantedEncounter => ({
      primary: d.primaryId,
      secondary: d.secondaryId,
      tca: d.tca,
      designedMissKm: d.design.truth.missKm,
      geometry: d.design.geometry.kind,
      approachAngleDeg: d.approachAngleDeg,
      relativeSpeedKmS: d.relativeSpeedKmS,
      role: d.design.role,
    }));
  const history = historyOf([...world.fleet, ...secondaries], opts.seed ?? 1, WEEK3_HISTORY_STREAM);
  return { operator: { name: DEMO_OPERATOR.name }, fleet: world.fleet, catalog: [...world.generated, ...secondaries], planted, history, start, end };
}
