import type { Geometry } from './plant.js';

/**
 * The demo's calendar and its planted close approaches.
 *
 * Three weekly screenings, Mondays 00:00 UTC: 23 Nov, 30 Nov and 7 Dec 2026 (the last is the
 * single-week demo of buildDemoScenario). Each screens 10 days ahead, so consecutive windows
 * overlap by 3 days: a conjunction 7–10 days out in one week's run is 0–3 days out in the next
 * one's — seen twice, the second time in the days when decisions are made (common practice:
 * mitigation is usually decided one to three days before TCA). A 7-day window would meet the
 * next run's window edge to edge and no conjunction would ever be seen twice by screening.
 */
export const DEMO_WEEK_STARTS_ISO = ['2026-11-23T00:00:00.000Z', '2026-11-30T00:00:00.000Z', '2026-12-07T00:00:00.000Z'] as const;
export const DEMO_WEEK_WINDOW_DAYS = 10;
export const DEMO_WEEK_SCREEN_KM = 5;
export type DemoWeekNumber = 1 | 2 | 3;

/** What the newest data of one week believes of a designed pair at TCA. */
export interface PlantVariant {
  readonly missKm: number;
  /** direction of the miss in the encounter plane: 0° toward the primary's radial, 90° across */
  readonly missAngleDeg: number;
  /** this belief's TCA minus the design's, seconds */
  readonly tcaShiftS?: number;
}

/** Whether a week's run should report the designed approach. */
export type Sighting = 'seen' | 'missed' | 'outside';

/** What the approach is there to show. */
export type DesignRole = 'grows-riskier' | 'appears' | 'goes-away' | 'seen-then-past' | 'steady' | 'first-seen';

export interface EncounterDesign {
  readonly role: DesignRole;
  readonly fleetIndex: number;
  readonly tcaIso: string;
  /** the truth: what week 3's element sets (and buildDemoScenario) hold */
  readonly truth: PlantVariant;
  readonly geometry: Geometry;
  readonly name: string;
  readonly bstar: number;
  /** fit epoch of the truth set, hours relative to one day before week 3 starts */
  readonly fitEpochHours: number;
  /**
   * What earlier weeks' element sets of the secondary held at TCA, where the design fixes it: every
   * week that should see the approach (so the demo does not hang on random draws: re-issued sets
   * carry orbit-determination errors that grow to kilometres along-track ten days out), and
   * beliefs that the next update corrects (the object was poorly determined, or it manoeuvred).
   * Weeks without an entry hold the next week's set re-issued at their epoch, with an
   * orbit-determination error.
   */
  readonly believed?: Partial<Record<1 | 2, PlantVariant>>;
  /** a received message about this approach, created before week 3's run */
  readonly message?: { readonly createdIso: string } & PlantVariant;
  /** what weeks 1, 2, 3 should report (checked against the screening engine in the tests) */
  readonly expected: readonly [Sighting, Sighting, Sighting];
  /** the series' state after week 3 */
  readonly finalState: 'new' | 'updated' | 'no-longer-predicted' | 'past';
}

/**
 * A miss this far off radially keeps the pair apart on every revolution: a crossing secondary
 * placed 40 km above the primary with the primary's circular speed is at its perigee there, so
 * its radius never falls below the primary's radius at the crossing + 40 km, while the primary's
 * own radius varies by at most 2ae ≈ 18 km (e ≤ 0.0013): ≥ 22 km apart, far outside the 5-km volume.
 * "Goes away" and "appears" use it for the belief without the approach.
 */
const CLEAR_RADIAL: PlantVariant = { missKm: 40, missAngleDeg: 0 };

/**
 * The planted encounters. Ids: Z0001 (330001) onward in this order. Misses 50 m – 4 km, head-on,
 * crossing, slow overtaking and fragment geometries, over the three weeks.
 */
export const ENCOUNTER_DESIGNS: readonly EncounterDesign[] = [
  {
    role: 'grows-riskier', fleetIndex: 0, tcaIso: '2026-12-07T14:52:48.317Z', truth: { missKm: 0.05, missAngleDeg: 20 },
    geometry: { kind: 'crossing', angleDeg: 170, speedFactor: 1.01 }, name: 'OBJECT PAYLOAD 90411', bstar: 8e-5, fitEpochHours: -2,
    believed: { 2: { missKm: 0.9, missAngleDeg: 20, tcaShiftS: -0.25 } },
    message: { createdIso: '2026-12-04T09:15:00.000Z', missKm: 0.35, missAngleDeg: 20, tcaShiftS: 0.12 },
    expected: ['outside', 'seen', 'seen'], finalState: 'updated',
  },
  {
    role: 'appears', fleetIndex: 2, tcaIso: '2026-12-08T08:53:12.904Z', truth: { missKm: 0.8, missAngleDeg: 75 },
    geometry: { kind: 'crossing', angleDeg: 90 }, name: 'EO-SAT 9102', bstar: 1.1e-4, fitEpochHours: 3,
    believed: { 2: CLEAR_RADIAL },
    expected: ['outside', 'missed', 'seen'], finalState: 'new',
  },
  {
    role: 'steady', fleetIndex: 4, tcaIso: '2026-12-09T02:38:24.051Z', truth: { missKm: 0.3, missAngleDeg: 140 },
    geometry: { kind: 'fragment', angleDeg: 115, speedFactor: 1.012, radialKmS: 0.06 }, name: 'BREAKUP 3 DEB', bstar: 6e-4, fitEpochHours: -5,
    believed: { 2: { missKm: 0.45, missAngleDeg: 150, tcaShiftS: 0.4 } },
    expected: ['outside', 'seen', 'seen'], finalState: 'updated',
  },
  {
    role: 'steady', fleetIndex: 1, tcaIso: '2026-12-09T20:38:30.622Z', truth: { missKm: 2.0, missAngleDeg: 90 },
    geometry: { kind: 'overtaking', deltaRtnKmS: [0.012, 0.025, 0.01] }, name: 'OBJECT R/B 90477', bstar: 9e-5, fitEpochHours: 1,
    // Slow (29 m/s): an along-track difference of ~1 km between the weeks moves the TCA by 35 s.
    believed: { 2: { missKm: 2.6, missAngleDeg: 80, tcaShiftS: 35 } },
    expected: ['outside', 'seen', 'seen'], finalState: 'updated',
  },
  {
    role: 'first-seen', fleetIndex: 3, tcaIso: '2026-12-10T13:55:03.480Z', truth: { missKm: 4.0, missAngleDeg: 10 },
    geometry: { kind: 'crossing', angleDeg: 45 }, name: 'EO-SAT 9233', bstar: 5e-5, fitEpochHours: -8,
    expected: ['outside', 'outside', 'seen'], finalState: 'new',
  },
  {
    role: 'first-seen', fleetIndex: 0, tcaIso: '2026-12-11T07:55:12.199Z', truth: { missKm: 0.15, missAngleDeg: 260 },
    geometry: { kind: 'crossing', angleDeg: 100 }, name: 'OBJECT PAYLOAD 90512', bstar: 1.3e-4, fitEpochHours: 6,
    expected: ['outside', 'outside', 'seen'], finalState: 'new',
  },
  {
    role: 'first-seen', fleetIndex: 4, tcaIso: '2026-12-12T04:33:36.770Z', truth: { missKm: 1.2, missAngleDeg: 200 },
    geometry: { kind: 'crossing', angleDeg: 160 }, name: 'OBJECT R/B 90533', bstar: 3e-5, fitEpochHours: -1,
    expected: ['outside', 'outside', 'seen'], finalState: 'new',
  },
  {
    role: 'first-seen', fleetIndex: 2, tcaIso: '2026-12-13T01:12:00.437Z', truth: { missKm: 0.5, missAngleDeg: 320 },
    geometry: { kind: 'fragment', angleDeg: 125, speedFactor: 0.995, radialKmS: -0.03 }, name: 'BREAKUP 5 DEB', bstar: 4e-4, fitEpochHours: 4,
    expected: ['outside', 'outside', 'seen'], finalState: 'new',
  },
  {
    role: 'goes-away', fleetIndex: 3, tcaIso: '2026-12-08T19:27:41.733Z', truth: CLEAR_RADIAL,
    geometry: { kind: 'crossing', angleDeg: 120, speedFactor: 1.01 }, name: 'OBJECT PAYLOAD 90688', bstar: 7e-5, fitEpochHours: 2,
    believed: { 2: { missKm: 0.6, missAngleDeg: 300 } },
    expected: ['outside', 'seen', 'missed'], finalState: 'no-longer-predicted',
  },
  {
    role: 'seen-then-past', fleetIndex: 4, tcaIso: '2026-12-02T03:10:27.806Z', truth: { missKm: 1.5, missAngleDeg: 50 },
    geometry: { kind: 'crossing', angleDeg: 75 }, name: 'OBJECT R/B 90702', bstar: 4e-5, fitEpochHours: -3,
    believed: { 1: { missKm: 2.4, missAngleDeg: 60, tcaShiftS: 0.5 }, 2: { missKm: 1.1, missAngleDeg: 55, tcaShiftS: -0.2 } },
    expected: ['seen', 'seen', 'outside'], finalState: 'past',
  },
];

/** The truth holds a close approach (not the clear-radial belief). */
export const isApproach = (v: PlantVariant): boolean => v.missKm <= DEMO_WEEK_SCREEN_KM;
