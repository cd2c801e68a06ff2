/**
 * View models of the reports: everything a report shows, as plain values (numbers with their
 * unit in the name, ISO 8601 UTC strings), filled from the database by fromDb.ts or by any other
 * caller (the desktop app, tests). Rendering (html/) reads only these.
 */
import type { EncounterPlaneInput, SeriesPoint } from '../../core/plots/inputs.js';
import type { TierId } from '../../core/risk/tiers.js';
import type { PlanProposalJson } from '../../core/events/planProposal.js';

export type { EncounterPlaneInput, SeriesPoint };

/** One row of an event table. */
export interface EventRowModel {
  readonly id: string;
  readonly tca: string;
  readonly primary: string;
  readonly primaryName: string | null;
  readonly secondary: string;
  readonly secondaryName: string | null;
  readonly missKm: number;
  readonly relativeSpeedKmS: number;
  readonly rtnKm: readonly [number, number, number];
  readonly pc: number | null;
  readonly pcMethod: string | null;
  readonly covarianceSource: string | null;
  /** null: not assessed */
  readonly tier: TierId | null;
}

export interface RunHeaderModel {
  readonly id: string;
  readonly windowStart: string;
  readonly windowEnd: string;
  /** e.g. "sphere, radius 5 km" */
  readonly volumeText: string;
  /** radius of a spherical volume (km), null for an RTN ellipsoid */
  readonly screeningRadiusKm: number | null;
  /** "all objects" or the primaries' ids */
  readonly primariesText: string;
  /** objects in the catalogue screened */
  readonly catalogueSize: number;
  readonly catalogueFingerprint: string;
  readonly createdAt: string;
  readonly status: string;
  readonly wallMs: number | null;
}

export interface FlaggedModel {
  readonly id: string;
  readonly reason: string;
}

/** Set when the catalogue is invented (demo, tests): the report says so where it cannot be missed. */
export interface CatalogueNote {
  readonly synthetic: boolean;
  readonly text: string;
}

export interface RunReportModel {
  readonly kind: 'run';
  readonly title: string;
  readonly generatedAt: string;
  readonly run: RunHeaderModel;
  readonly catalogue: CatalogueNote | null;
  /** every event of the run, by TCA */
  readonly events: readonly EventRowModel[];
  readonly flagged: readonly FlaggedModel[];
  /** by series, against the data before the run; null: not a screening run (or not linked) */
  readonly changes?: readonly RunChangeModel[] | null;
  /** Pc thresholds of the tiers in force (for the legend text) */
  readonly thresholds: { readonly pcPlan: number; readonly pcMonitor: number };
  readonly caution: string;
}

/** One quantity of the event report: the value, its unit and where it came from. */
export interface FactModel {
  readonly label: string;
  readonly value: string;
  readonly unit: string;
  readonly source: string;
}

/** A received conjunction data message about this event. */
export interface MessageModel {
  readonly originator: string;
  readonly messageId: string;
  readonly creationDate: string;
  readonly tca: string;
  readonly missDistanceM: number;
  /** COLLISION_PROBABILITY as the originator reported it (Keepclear computes its own) */
  readonly reportedPc: number | null;
}

export interface SeriesModel {
  readonly id: string;
  /** the series' state in our words (new, updated, no longer predicted, …) */
  readonly state: string;
  /** what the state means, in a sentence */
  readonly stateMeaning?: string;
  /** in the order the data was created */
  readonly points: readonly SeriesPoint[];
  /** the series' events in the order their data was created (the table under the trend) */
  readonly events?: readonly SeriesEventModel[];
  /** the change since the first sighting in words ("miss −0.850 km (closing), Pc ×1.2e+3 (rising)") */
  readonly changeText?: string | null;
}

/** One event of a series, as the event report lists it. */
export interface SeriesEventModel {
  readonly id: string;
  readonly source: 'run' | 'cdm';
  /** the run id, or the message's originator and MESSAGE_ID */
  readonly sourceText: string;
  /** when its data was created (run time, CREATION_DATE), ISO */
  readonly dataAt: string;
  readonly hoursToTca: number;
  readonly tca: string;
  readonly missKm: number;
  readonly pc: number | null;
  readonly tier: TierId | null;
  /** the event the report is about */
  readonly current: boolean;
}

/** What a screening run changed, by series (the run report's "what changed" section). */
export interface RunChangeModel {
  readonly change: 'new' | 'updated' | 'no-longer-predicted';
  readonly seriesId: string;
  readonly primary: string;
  readonly secondary: string;
  /** the run's event; for "no longer predicted", the last sighting before the run */
  readonly eventId: string;
  readonly tca: string;
  readonly missKm: number;
  readonly previousMissKm: number | null;
  readonly pc: number | null;
  readonly previousPc: number | null;
  readonly tier: TierId | null;
  /** the series' state now, in our words */
  readonly stateNow: string | null;
}

/**
 * A manoeuvre plan for the event (the plan feature lands later; DESIGN.md "JSON of plan"):
 * the trade over lead times, the chosen burn, its verification and the new approaches it makes.
 */
export interface PlanModel {
  readonly target: { readonly missKm?: number; readonly pc?: number };
  readonly proposal: PlanProposalJson;
  readonly trade: readonly { readonly leadTimeS: number; readonly deltaVMs: number; readonly achievedMissKm: number; readonly achievedPc?: number | null; readonly direction?: string }[];
  /** every row of the sweep (each lead time × direction; Δv null where the target was not met), for the Δv-against-lead-time plot */
  readonly tradeByDirection?: readonly { readonly leadTimeS: number; readonly direction: string; readonly deltaVMs: number | null }[];
  /** the primary's orbital period (s): lead times in orbits */
  readonly periodS?: number;
  /** how the proposal was checked (e.g. "numerical propagation, two-body + J2..J4 + drag") */
  readonly verification?: {
    readonly method: string;
    readonly missKm: number;
    readonly pc: number | null;
    readonly notes?: readonly string[];
    /** the integrated manoeuvred primary itself against the secondary, for comparison */
    readonly fullyNumerical?: { readonly missKm: number; readonly pc: number | null } | null;
  } | null;
  /** when the plan was made, and the encounter without a burn */
  readonly createdAt?: string;
  readonly original?: { readonly tca: string; readonly missKm: number; readonly pc: number | null };
  /** re-screen of the manoeuvred trajectory: objects screened and approaches found (new or not) */
  readonly rescreen?: { readonly objects: number; readonly approaches: number; readonly start: string; readonly end: string } | null;
  readonly newApproaches: readonly { readonly secondary: string; readonly tca: string; readonly missKm: number; readonly pc?: number | null }[];
}

export interface EventReportModel {
  readonly kind: 'event';
  readonly title: string;
  readonly generatedAt: string;
  readonly event: EventRowModel;
  /** null for an event made from a received message (no screening run behind it) */
  readonly run: RunHeaderModel | null;
  readonly catalogue: CatalogueNote | null;
  /** every number with its unit and source */
  readonly facts: readonly FactModel[];
  readonly warnings: readonly string[];
  /** null when no encounter plane is defined (co-moving objects); then planeNote says why */
  readonly plane: EncounterPlaneInput | null;
  readonly planeNote: string | null;
  readonly messages: readonly MessageModel[];
  readonly series?: SeriesModel | null;
  readonly plan?: PlanModel | null;
  readonly thresholds: { readonly pcPlan: number; readonly pcMonitor: number };
  readonly caution: string;
}

export type ReportModel = RunReportModel | EventReportModel;
