import { KeepclearError } from '../../core/errors.js';
import { DECISION_AID_NOTE } from '../../core/risk/assess.js';
import { encounterPlane } from '../../core/risk/encounterPlane.js';
import { combinedHbr } from '../../core/risk/hardBody.js';
import { DEFAULT_TIER_THRESHOLDS, TIERS, type TierThresholds } from '../../core/risk/tiers.js';
import { tierOf } from '../../core/bridge/convert.js';
import type { ConjunctionEvent, RiskDetail } from '../../core/events/index.js';
import { toIso, type Instant } from '../../core/time/instant.js';
import {
  eventsOfRun,
  getEvent,
  getObject,
  getRun,
  getSetting,
  latestPlanOfEvent,
  listCdms,
  type KeepclearDb,
  type RunRecord,
} from '../../db/index.js';
import { RiskContext, TIER_SETTINGS_KEY } from '../risk.js';
import { tryEnsureLinked } from '../series.js';
import { runChangesModel, seriesModelOfEvent } from './seriesModel.js';
import { planModelOf } from './planModel.js';
import type {
  CatalogueNote,
  EncounterPlaneInput,
  EventReportModel,
  EventRowModel,
  FactModel,
  PlanModel,
  RunHeaderModel,
  RunReportModel,
  SeriesModel,
} from './model.js';

/**
 * Settings key that marks the database's catalogue as invented (the demo writes it):
 * `{ "text": "…" }`. Reports then say so in their header.
 */
export const SYNTHETIC_CATALOGUE_KEY = 'catalogue.synthetic';

/** The numbers behind the Pc (m, m²; plane axes x̂ along the miss, ŷ = ẑ × x̂, ẑ along the relative velocity). */
const detailOf = (e: ConjunctionEvent): RiskDetail | null => e.risk?.detail ?? null;

export interface ReportOptions {
  readonly title?: string;
  /** overrides what the database says about the catalogue; null: say nothing */
  readonly catalogue?: CatalogueNote | null;
  /** the report's own time stamp (tests fix it) */
  readonly generatedAt?: Instant;
}

export interface EventReportOptions extends ReportOptions {
  /** the event's series (trend and RTN plots); default: the event's own series; null: none */
  readonly series?: SeriesModel | null;
  /** a manoeuvre plan for the event; default: the event's newest stored plan (keepclear plan), null for none */
  readonly plan?: PlanModel | null;
}

function thresholdsOf(db: KeepclearDb): TierThresholds {
  const user = getSetting(db, TIER_SETTINGS_KEY) as Partial<TierThresholds> | undefined;
  return { ...DEFAULT_TIER_THRESHOLDS, ...(user ?? {}) };
}

function catalogueOf(db: KeepclearDb, opts: ReportOptions): CatalogueNote | null {
  if (opts.catalogue !== undefined) return opts.catalogue;
  const s = getSetting(db, SYNTHETIC_CATALOGUE_KEY) as { text?: unknown } | undefined;
  if (!s) return null;
  return {
    synthetic: true,
    text: typeof s.text === 'string' && s.text ? s.text : 'The catalogue in this database is synthetic: its objects are invented.',
  };
}

function volumeText(run: RunRecord): string {
  const v = run.settings.volume;
  return v.kind === 'sphere' ? `sphere, radius ${v.radiusKm} km` : `RTN ellipsoid, semi-axes ${v.rKm} × ${v.tKm} × ${v.nKm} km`;
}

function runHeader(run: RunRecord): RunHeaderModel {
  const p = run.settings.primaries;
  return {
    id: run.id,
    windowStart: toIso(run.settings.start),
    windowEnd: toIso(run.settings.end),
    volumeText: volumeText(run),
    screeningRadiusKm: run.settings.volume.kind === 'sphere' ? run.settings.volume.radiusKm : null,
    primariesText: p === 'all' ? 'all objects (all-vs-all)' : p.join(', '),
    catalogueSize: run.objectCount,
    catalogueFingerprint: run.catalogFingerprint,
    createdAt: toIso(run.createdAt),
    status: run.status,
    wallMs: run.wallMs,
  };
}

/** Object names, looked up once each. */
function namer(db: KeepclearDb): (id: string) => string | null {
  const cache = new Map<string, string | null>();
  return (id) => {
    if (!cache.has(id)) cache.set(id, getObject(db, id)?.name ?? null);
    return cache.get(id)!;
  };
}

function eventRow(e: ConjunctionEvent, name: (id: string) => string | null): EventRowModel {
  const pc = e.risk?.pc;
  return {
    id: e.id,
    tca: toIso(e.tca),
    primary: e.primary,
    primaryName: name(e.primary),
    secondary: e.secondary,
    secondaryName: name(e.secondary),
    missKm: e.missKm,
    relativeSpeedKmS: e.relativeSpeedKmS,
    rtnKm: [e.rtnKm[0], e.rtnKm[1], e.rtnKm[2]],
    pc: typeof pc === 'number' && Number.isFinite(pc) ? pc : null,
    pcMethod: e.risk?.pcMethod ?? null,
    covarianceSource: e.risk?.covarianceSource ?? null,
    tier: tierOf(e.risk?.tier),
  };
}

export function runReportModelFromDb(db: KeepclearDb, runId: string, opts: ReportOptions = {}): RunReportModel {
  const run = getRun(db, runId);
  if (!run) throw new KeepclearError('NOT_FOUND', `no run "${runId}"; see the run ids in keepclear events --json -`);
  const name = namer(db);
  const t = thresholdsOf(db);
  return {
    kind: 'run',
    title: opts.title ?? `Conjunction screening run ${run.id}`,
    generatedAt: toIso(opts.generatedAt ?? (Date.now() as Instant)),
    run: runHeader(run),
    catalogue: catalogueOf(db, opts),
    events: eventsOfRun(db, run.id).map((e) => eventRow(e, name)),
    flagged: run.flagged.map((f) => ({ id: f.id, reason: f.reason })),
    changes: run.kind === 'screening' || run.kind === 'merge' ? runChangesModel(db, run.id) : null,
    thresholds: { pcPlan: t.pcPlan, pcMonitor: t.pcMonitor },
    caution: DECISION_AID_NOTE,
  };
}

const fixed = (x: number, d: number): string => x.toFixed(d);
const days = (ms: number): string => (ms / 86_400_000).toFixed(2);

/**
 * The encounter plane for the plot: from the risk's detail when recorded (with the combined
 * covariance), else the geometry from the stored TEME states at TCA and no covariance.
 */
function planeOf(db: KeepclearDb, e: ConjunctionEvent, hbrM: number): { plane: EncounterPlaneInput | null; note: string | null } {
  let d = detailOf(e);
  let note: string | null = null;
  if (!d && e.risk) {
    // An event stored without the details: assess it again from the same database. Its plane is
    // used only when the covariance came from the same sources as the stored Pc (a CDM's
    // covariance, for one, is not at hand here).
    const again = new RiskContext(db).assess(e);
    const d2 = detailOf({ ...e, risk: again });
    if (d2 && again.covarianceSource === e.risk.covarianceSource) {
      d = d2;
      note = 'Covariance recomputed from the database (same sources as the stored Pc).';
    }
  }
  if (d) {
    return {
      plane: {
        eventId: e.id,
        missM: [d.planeMissM[0], d.planeMissM[1]],
        covM2: d.planeCovM2,
        hardBodyRadiusM: hbrM,
        note: d.planeCovM2 ? note : 'The assessment had no usable covariance (maximum Pc).',
      },
      note: null,
    };
  }
  const zero = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  try {
    const p = encounterPlane(e.primaryState, e.secondaryState, zero, zero);
    return {
      plane: {
        eventId: e.id,
        missM: [p.missM[0], p.missM[1]],
        covM2: null,
        hardBodyRadiusM: hbrM,
        note: e.risk
          ? `Geometry from the stored TEME states; covariance ${e.risk.covarianceSource} not recorded with the event.`
          : 'Geometry from the stored TEME states; the event has no risk assessment.',
      },
      note: null,
    };
  } catch (err) {
    if (!(err instanceof KeepclearError)) throw err;
    return { plane: null, note: `No encounter plane: ${err.message}.` };
  }
}

function eventFacts(e: ConjunctionEvent, fromCdm: boolean, run: RunRecord | null, t: TierThresholds, plane: EncounterPlaneInput | null): FactModel[] {
  const screening = fromCdm ? 'received CDM (states as the message gives them, converted to TEME)' : `screening run ${run?.id ?? e.runId}, SGP4 from the element sets below`;
  const r = e.risk;
  const facts: FactModel[] = [
    { label: 'TCA', value: toIso(e.tca), unit: 'UTC', source: fromCdm ? screening : `${screening}; range-rate root to 1 µs` },
    { label: 'Miss distance', value: fixed(e.missKm, 4), unit: 'km', source: `|r₂ − r₁| at TCA, ${fromCdm ? 'received CDM' : 'screening'}` },
    { label: 'Relative speed', value: fixed(e.relativeSpeedKmS, 4), unit: 'km/s', source: '|v₂ − v₁| at TCA' },
    { label: 'Miss in RTN (R, T, N)', value: e.rtnKm.map((x) => fixed(x, 4)).join(', '), unit: 'km', source: "secondary minus primary, in the primary's RTN frame at TCA" },
    { label: 'Approach angle', value: fixed(e.approachAngleDeg, 1), unit: 'deg', source: 'angle between the velocities (0 overtaking, 180 head-on)' },
  ];
  if (plane) {
    facts.push({ label: 'Miss in the encounter plane (x, y)', value: plane.missM.map((x) => fixed(x, 1)).join(', '), unit: 'm', source: 'projection perpendicular to the relative velocity' });
  }
  facts.push(
    { label: 'Screening volume entry', value: e.entry === null ? 'at window edge' : toIso(e.entry), unit: 'UTC', source: screening },
    { label: 'Screening volume exit', value: e.exit === null ? 'at window edge' : toIso(e.exit), unit: 'UTC', source: screening },
    { label: `Primary ${fromCdm ? 'state' : 'element set'} epoch`, value: toIso(e.primaryEpoch), unit: 'UTC', source: `age at TCA ${days(e.tca - e.primaryEpoch)} d` },
    { label: `Secondary ${fromCdm ? 'state' : 'element set'} epoch`, value: toIso(e.secondaryEpoch), unit: 'UTC', source: `age at TCA ${days(e.tca - e.secondaryEpoch)} d` },
  );
  if (r) {
    facts.push(
      { label: 'Hard-body radius (combined)', value: fixed(r.hardBodyRadiusM, 2), unit: 'm', source: 'sum of both objects\' radii (set per object, from a CDM, or the documented default)' },
      { label: 'Pc', value: r.pc === null ? 'none' : r.pc < 1e-10 ? `< 1e-10 (${r.pc.toExponential(2)})` : r.pc.toExponential(3), unit: '—', source: `method ${r.pcMethod}` },
      { label: 'Covariance (primary / secondary)', value: r.covarianceSource, unit: '—', source: 'order of precedence: received CDM, element-set history, default table' },
      {
        label: 'Tier',
        value: tierOf(r.tier) ? `${TIERS[tierOf(r.tier)!].glyph} ${TIERS[tierOf(r.tier)!].label}` : r.tier,
        unit: '—',
        source: `Plan from Pc ${t.pcPlan.toExponential(0)}, Monitor from ${t.pcMonitor.toExponential(0)}; without Pc by miss (${t.missPlanKm} / ${t.missMonitorKm} km)`,
      },
    );
    const d = detailOf(e);
    if (d?.sigmaAlongVelocityM != null) facts.push({ label: 'σ along the relative velocity', value: fixed(d.sigmaAlongVelocityM, 1), unit: 'm', source: 'combined covariance' });
    for (const [who, c] of [['primary', d?.primaryCovRtnM2], ['secondary', d?.secondaryCovRtnM2]] as const) {
      if (c) facts.push({ label: `σ R, T, N (${who})`, value: [0, 1, 2].map((i) => fixed(Math.sqrt(Math.max(0, c[i]?.[i] ?? 0)), 1)).join(', '), unit: 'm', source: `${who} covariance at TCA, RTN` });
    }
  } else {
    facts.push({ label: 'Risk', value: 'not assessed', unit: '—', source: 'no Pc stored for this event' });
  }
  return facts;
}

function storedPlan(db: KeepclearDb, eventId: string): PlanModel | null {
  const p = latestPlanOfEvent(db, eventId);
  return p ? planModelOf(p) : null;
}

export function eventReportModelFromDb(db: KeepclearDb, eventId: string, opts: EventReportOptions = {}): EventReportModel {
  if (opts.series === undefined) tryEnsureLinked(db);
  const e = getEvent(db, eventId);
  if (!e) throw new KeepclearError('NOT_FOUND', `no event "${eventId}"; list events with keepclear events`);
  const run = getRun(db, e.runId);
  const fromCdm = run?.kind === 'cdm';
  const t = thresholdsOf(db);
  const name = namer(db);
  const hbrM = e.risk && Number.isFinite(e.risk.hardBodyRadiusM) ? e.risk.hardBodyRadiusM : combinedHbr(getObject(db, e.primary)?.hardBodyRadiusM, getObject(db, e.secondary)?.hardBodyRadiusM).radiusM;
  const { plane, note } = planeOf(db, e, hbrM);
  return {
    kind: 'event',
    title: opts.title ?? `Conjunction ${e.id}: ${e.primary} and ${e.secondary}`,
    generatedAt: toIso(opts.generatedAt ?? (Date.now() as Instant)),
    event: eventRow(e, name),
    run: run && !fromCdm ? runHeader(run) : null,
    catalogue: catalogueOf(db, opts),
    facts: eventFacts(e, fromCdm, run, t, plane),
    warnings: [...(e.risk?.warnings ?? [])],
    plane,
    planeNote: note,
    messages: listCdms(db, { eventId: e.id }).map((m) => ({
      originator: m.originator,
      messageId: m.messageId,
      creationDate: toIso(m.creationDate),
      tca: toIso(m.tca),
      missDistanceM: m.missDistanceM,
      reportedPc: m.reportedPc,
    })),
    // the caller's series when given (null: none), else the event's own from the linking service
    series: opts.series !== undefined ? opts.series : seriesModelOfEvent(db, e.id, e.seriesId),
    plan: opts.plan !== undefined ? opts.plan : storedPlan(db, e.id),
    thresholds: { pcPlan: t.pcPlan, pcMonitor: t.pcMonitor },
    caution: DECISION_AID_NOTE,
  };
}
