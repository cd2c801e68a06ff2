import type { ElementSet } from '../elements/elementSet.js';
import type { ScreeningSettings } from '../screening/types.js';
import { MS_PER_DAY, parseIso, type Instant } from '../time/instant.js';
import { reissueCatalog } from './catalogUpdate.js';
import { historyOf, WEEK3_HISTORY_STREAM } from './demo.js';
import { buildDemoCdm, DEMO_CDM_ORIGINATOR } from './demoCdm.js';
import {
  DEMO_WEEK_SCREEN_KM, DEMO_WEEK_STARTS_ISO, DEMO_WEEK_WINDOW_DAYS,
  type DemoWeekNumber, type EncounterDesign, type PlantVariant, type Sighting,
} from './demoDesigns.js';
import { DEMO_OPERATOR } from './demoFleet.js';
import { buildDemoWorld, type DemoOptions } from './demoWorld.js';
import { tleExactEpoch } from './draft.js';
import { withOrbitDeterminationError } from './odError.js';
import { plantEncounter } from './plant.js';
import { Rng } from './random.js';
import { reEpochElementSet } from './reEpoch.js';

/**
 * Three consecutive weekly screenings of the invented operator (23 Nov, 30 Nov, 7 Dec 2026; each
 * 10 days ahead, demoDesigns.ts), with the catalogue updated between them and a received CDM, so
 * series, states and trends have something to show:
 * - one approach grows riskier (Z0001 with A0001: 0.9 km in week 2, a message of 4 Dec says
 *   0.35 km, week 3 finds 50 m, with a tighter covariance as the TCA nears);
 * - one goes away (Z0009 with A0004: 0.6 km in week 2; week 3's update puts the secondary 40 km
 *   off and a run that covers the TCA no longer finds it);
 * - one appears only in the last week (Z0002 with A0003: week 2 covered its TCA, but its set then
 *   held the secondary 40 km off);
 * - one is seen in weeks 1 and 2 and is past by week 3 (Z0010 with A0005);
 * - the rest are seen twice (the overlap) or first in week 3.
 *
 * Week 3 is the truth (buildDemoScenario's world). Each earlier week holds every object's set
 * re-issued 7 days before the next week's, with a fresh orbit-determination error — consistent
 * with the same truth as real catalogue updates are — except where a design says that week
 * believed something else (then the secondary is planted against that week's fleet set).
 *
 * To replay: for each week in order, import `messages` (received since the previous run), then
 * `fleet`, `catalog` and `history`, then screen with `settings`, recording the run's time as
 * `runAt` — the time series and trends are ordered and dated by.
 */
export interface DemoMessage {
  readonly fileName: string;
  readonly text: string;
  readonly messageId: string;
  readonly creationDate: Instant;
  readonly object1: string;
  readonly object2: string;
  readonly tca: Instant;
}

export interface DemoWeek {
  readonly week: DemoWeekNumber;
  /** the run's time: its data time for series ordering and "time to TCA" */
  readonly runAt: Instant;
  readonly settings: ScreeningSettings;
  readonly fleet: ElementSet[];
  /** every other object's set this week: the generated catalogue, then the designed secondaries */
  readonly catalog: ElementSet[];
  /** four older sets (12–24 h apart) of each fleet member and designed secondary, oldest first */
  readonly history: Record<string, ElementSet[]>;
  /** CDMs received since the previous run (before runAt), oldest first */
  readonly messages: readonly DemoMessage[];
}

/** One designed approach and what each week should make of it. */
export interface DemoApproach {
  readonly role: EncounterDesign['role'];
  readonly primary: string;
  readonly secondary: string;
  /** the design's (truth's) TCA */
  readonly tca: Instant;
  /** what each week's sets hold at TCA: the design's belief or truth (null: re-issued with an OD error) */
  readonly believedMissKm: readonly [number | null, number | null, number];
  readonly expected: readonly [Sighting, Sighting, Sighting];
  readonly finalState: EncounterDesign['finalState'];
  readonly relativeSpeedKmS: number;
  readonly approachAngleDeg: number;
}

export interface DemoWeeks {
  readonly operator: { readonly name: string };
  readonly weeks: readonly [DemoWeek, DemoWeek, DemoWeek];
  readonly approaches: readonly DemoApproach[];
  /** how the earlier catalogues were re-issued (refitted vs. carried along secular rates) */
  readonly reissue: { readonly refitted: number; readonly secular: number };
}

const WEEK_MS = 7 * MS_PER_DAY;
/** RNG streams: orbit-determination errors of weeks 1 and 2, and their histories. */
const OD_STREAM = 8_000;
const HISTORY_STREAM = 7_100;

const tcaOf = (d: EncounterDesign, v: PlantVariant): Instant => (parseIso(d.tcaIso)! + (v.tcaShiftS ?? 0) * 1000) as Instant;

function settingsFor(start: Instant, fleet: readonly ElementSet[]): ScreeningSettings {
  return {
    start,
    end: (start + DEMO_WEEK_WINDOW_DAYS * MS_PER_DAY) as Instant,
    volume: { kind: 'sphere', radiusKm: DEMO_WEEK_SCREEN_KM },
    primaries: fleet.map((f) => f.objectId),
  };
}

export function buildDemoWeeks(opts: DemoOptions = {}): DemoWeeks {
  const seed = opts.seed ?? 1;
  const world = buildDemoWorld(opts);
  const starts = DEMO_WEEK_STARTS_ISO.map((iso) => parseIso(iso)!);

  // Newest first: week 3 is the truth, each earlier week derives from the week after it.
  const fleets: ElementSet[][] = [[], [], world.fleet];
  const generated: ElementSet[][] = [[], [], world.generated];
  const designed: ElementSet[][] = [[], [], world.designed.map((d) => d.set)];
  let refitted = 0, secular = 0;
  for (const k of [1, 0]) {
    const rng = new Rng(seed).fork(OD_STREAM + k);
    const perturb = (r: readonly number[], v: readonly number[]) => withOrbitDeterminationError(r, v, rng);
    const week = (k + 1) as 1 | 2;
    fleets[k] = fleets[k + 1]!.map((es) => reEpochElementSet(es, tleExactEpoch(es.epoch - WEEK_MS), { perturb }));
    designed[k] = world.designed.map((d, i) => {
      const next = designed[k + 1]![i]!;
      const epoch = tleExactEpoch(next.epoch - WEEK_MS);
      const belief = d.design.believed?.[week];
      if (!belief) return reEpochElementSet(next, epoch, { perturb });
      const p = plantEncounter({
        primary: fleets[k]![d.design.fleetIndex]!,
        secondaryId: d.secondaryId,
        secondaryName: d.design.name,
        tca: tcaOf(d.design, belief),
        missKm: belief.missKm,
        missAngleDeg: belief.missAngleDeg,
        geometry: d.design.geometry,
        fitEpoch: epoch,
        bstar: d.design.bstar,
      });
      return { ...p.secondary, source: next.source };
    });
    const update = reissueCatalog(generated[k + 1]!, WEEK_MS, rng);
    generated[k] = update.sets;
    refitted += update.refitted;
    secular += update.secular;
  }

  const messagesBefore = (week: number): DemoMessage[] =>
    world.designed
      .filter((d) => d.design.message !== undefined)
      .flatMap((d) => {
        const m = d.design.message!;
        const created = parseIso(m.createdIso)!;
        if (!(created < starts[week]! && (week === 0 || created >= starts[week - 1]!))) return [];
        const stamp = m.createdIso.slice(0, 10).replaceAll('-', '');
        const messageId = `${DEMO_CDM_ORIGINATOR}-${stamp}-${d.secondaryId}`;
        const cdm = buildDemoCdm({
          primary: world.fleet[d.design.fleetIndex]!,
          secondaryId: d.secondaryId,
          secondaryName: d.design.name,
          secondaryType: d.design.name.includes('DEB') ? 'DEBRIS' : 'PAYLOAD',
          secondaryManeuverable: false,
          tca: tcaOf(d.design, m),
          missKm: m.missKm,
          missAngleDeg: m.missAngleDeg,
          geometry: d.design.geometry,
          created,
          messageId,
          messageFor: DEMO_OPERATOR.name.toUpperCase(),
        });
        return [{
          fileName: `${messageId.toLowerCase()}.cdm`, text: cdm.text, messageId, creationDate: created,
          object1: cdm.object1, object2: cdm.object2, tca: cdm.tca,
        }];
      })
      .sort((a, b) => a.creationDate - b.creationDate);

  const weeks = [0, 1, 2].map((k): DemoWeek => ({
    week: (k + 1) as DemoWeekNumber,
    runAt: starts[k]!,
    settings: settingsFor(starts[k]!, fleets[k]!),
    fleet: fleets[k]!,
    catalog: [...generated[k]!, ...designed[k]!],
    history: historyOf([...fleets[k]!, ...designed[k]!], seed, k === 2 ? WEEK3_HISTORY_STREAM : HISTORY_STREAM + k),
    messages: messagesBefore(k),
  })) as unknown as [DemoWeek, DemoWeek, DemoWeek];

  const approaches = world.designed.map((d): DemoApproach => ({
    role: d.design.role,
    primary: d.primaryId,
    secondary: d.secondaryId,
    tca: d.tca,
    believedMissKm: [d.design.believed?.[1]?.missKm ?? null, d.design.believed?.[2]?.missKm ?? null, d.design.truth.missKm],
    expected: d.design.expected,
    finalState: d.design.finalState,
    relativeSpeedKmS: d.relativeSpeedKmS,
    approachAngleDeg: d.approachAngleDeg,
  }));
  return { operator: { name: DEMO_OPERATOR.name }, weeks, approaches, reissue: { refitted, secular } };
}
