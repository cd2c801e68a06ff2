import { basename } from 'node:path';
import type { ElementSet } from '../core/elements/elementSet.js';
import { EphemerisTrajectory } from '../core/propagation/ephemeris.js';
import type { Matrix } from '../core/math/linalg.js';
import { assessEncounter, type AssessInputs, type CovarianceInput } from '../core/risk/assess.js';
import { assessEach, type RiskJob } from '../core/risk/assessMany.js';
import { historySample, type HistorySample } from '../core/risk/covarianceHistory.js';
import type { TierThresholds } from '../core/risk/tiers.js';
import type { Encounter, RiskAssessment } from '../core/events/index.js';
import type { Instant } from '../core/time/instant.js';
import { elementSetHistory, getObject, getSetting, loadEphemeris, runEphemerides, type KeepclearDb } from '../db/index.js';

/** Settings key of user-set tier thresholds (JSON: { mitigatePc, attentionPc, ... }). */
export const TIER_SETTINGS_KEY = 'risk.tierThresholds';

/**
 * Risk of screened encounters with what the database knows: each object's element-set history
 * (covariance source 2) or its newest element set (default table, source 3), and its
 * hard-body radius. Received CDM covariances (source 1) come in through the `cdm` argument of
 * assess() (app/series.ts picks the message of the same series, app/cdmRisk.ts maps its covariances).
 */
export class RiskContext {
  private readonly history = new Map<string, ElementSet[]>();
  private readonly thresholds: Partial<TierThresholds> | undefined;

  /**
   * `ephemerides`: the owner ephemerides a run screened from, by object id; an ephemeris's
   * covariance block (the latest at or before TCA) is then that object's covariance, after a
   * received CDM and before the element-set history. `encounterModel`: see
   * AssessInputs.encounterModel ('auto' by default: 3-D Pc where the short-encounter assumption fails).
   */
  constructor(
    private readonly db: KeepclearDb,
    private readonly ephemerides: ReadonlyMap<string, EphemerisTrajectory> = new Map(),
    private readonly options: { readonly encounterModel?: 'auto' | '2d' } = {},
  ) {
    this.thresholds = (getSetting(db, TIER_SETTINGS_KEY) as Partial<TierThresholds> | undefined) ?? undefined;
  }

  private readonly fromRuns = new Map<string, EphemerisTrajectory | null>();

  /**
   * The ephemeris an object was screened from: the one given, else — for a stored event being
   * assessed again (e.g. when a message joins its series) — the one its run recorded.
   */
  private ephemerisOf(id: string, runId: string | undefined): EphemerisTrajectory | null {
    const given = this.ephemerides.get(id);
    if (given) return given;
    if (runId === undefined) return null;
    const key = `${runId}\u0000${id}`;
    if (!this.fromRuns.has(key)) {
      const rec = runEphemerides(this.db, runId).find((r) => r.objectId === id && r.ephemerisId !== null);
      const oem = rec ? loadEphemeris(this.db, rec.ephemerisId!) : null;
      this.fromRuns.set(key, oem ? new EphemerisTrajectory(oem, id) : null);
    }
    return this.fromRuns.get(key)!;
  }

  /** per object and screened epoch: the history up to that set and its statistics (computed once) */
  private readonly upTo = new Map<string, { sets: ElementSet[]; stats: HistorySample | null }>();
  /** hard-body radius per object (null: none stored) */
  private readonly hbr = new Map<string, number | null>();

  private historyUpTo(id: string, epoch: number): { sets: ElementSet[]; stats: HistorySample | null } {
    const key = `${id}\u0000${epoch}`;
    let h = this.upTo.get(key);
    if (!h) {
      // History up to the set used in the screening (later sets did not exist for it).
      const sets = this.historyOf(id).filter((s) => s.epoch <= epoch + 1);
      h = { sets, stats: historySample(sets) };
      this.upTo.set(key, h);
    }
    return h;
  }

  private hbrOf(id: string): number | null {
    if (!this.hbr.has(id)) this.hbr.set(id, getObject(this.db, id)?.hardBodyRadiusM ?? null);
    return this.hbr.get(id)!;
  }

  private historyOf(id: string): ElementSet[] {
    let h = this.history.get(id);
    if (!h) {
      h = elementSetHistory(this.db, id);
      this.history.set(id, h);
    }
    return h;
  }

  private input(
    id: string,
    epoch: number,
    tca: Instant,
    runId: string | undefined,
    cdmRtnM2: Matrix | null | undefined,
    doubtful?: string | null,
  ): CovarianceInput {
    const { sets: h, stats } = this.historyUpTo(id, epoch);
    const cov = this.ephemerisOf(id, runId)?.covarianceRtnAt(tca) ?? null;
    const ephemeris = cov ? { rtnM2: cov.rtnM2, source: `oem(${basename(cov.file)})`, note: cov.note } : null;
    return { cdmRtnM2: cdmRtnM2 ?? null, cdmDoubtfulNote: doubtful ?? null, ephemeris, history: h, historyStats: stats, elements: h[h.length - 1] ?? null };
  }

  assess(e: Encounter, cdm?: CdmRiskInputs): RiskAssessment {
    return assessEncounter(e, this.inputsOf(e, cdm));
  }

  /**
   * Risks of many fresh encounters (a run's), in their order: the same assessments as assess(),
   * shared among worker threads when there are many (core/risk/assessMany.ts). `workers`: as
   * the screening's (default one per core).
   */
  async assessMany(encounters: readonly Encounter[], workers?: number): Promise<RiskAssessment[]> {
    // A job is copied to a thread field by field: only what the assessment reads. Objects are
    // written out key by key (a spread copy given more keys is slow in V8: core/events/encounter.ts).
    const slim = (c: CovarianceInput): CovarianceInput => ({
      cdmRtnM2: c.cdmRtnM2 ?? null,
      cdmDoubtfulNote: c.cdmDoubtfulNote ?? null,
      ephemeris: c.ephemeris ?? null,
      history: null,
      historyStats: c.historyStats ?? null,
      elements: c.elements ? { epoch: c.elements.epoch, meanMotionRevPerDay: c.elements.meanMotionRevPerDay, eccentricity: c.elements.eccentricity } : null,
      ...(c.regime !== undefined ? { regime: c.regime } : {}),
    });
    const job = (i: number): RiskJob => {
      const e = encounters[i]!;
      const inputs = this.inputsOf(e);
      return {
        encounter: {
          tca: e.tca, missKm: e.missKm, primaryState: e.primaryState, secondaryState: e.secondaryState,
          primaryEpoch: e.primaryEpoch, secondaryEpoch: e.secondaryEpoch,
        },
        inputs: Object.assign({ primary: slim(inputs.primary), secondary: slim(inputs.secondary) }, {
          hbrPrimaryM: inputs.hbrPrimaryM,
          hbrSecondaryM: inputs.hbrSecondaryM,
          ...(inputs.thresholds ? { thresholds: inputs.thresholds } : {}),
          ...(inputs.encounterModel ? { encounterModel: inputs.encounterModel } : {}),
        }),
      };
    };
    return assessEach(encounters.length, job, workers);
  }

  private inputsOf(e: Encounter, cdm?: CdmRiskInputs): AssessInputs {
    // A stored event (ConjunctionEvent) names its run; a fresh encounter does not.
    const runId = 'runId' in e && typeof e.runId === 'string' ? e.runId : undefined;
    return {
      primary: this.input(e.primary, e.primaryEpoch, e.tca, runId, cdm?.primaryRtnM2, cdm?.primaryDoubtful),
      secondary: this.input(e.secondary, e.secondaryEpoch, e.tca, runId, cdm?.secondaryRtnM2, cdm?.secondaryDoubtful),
      hbrPrimaryM: cdm?.hbrPrimaryM ?? this.hbrOf(e.primary),
      hbrSecondaryM: cdm?.hbrSecondaryM ?? this.hbrOf(e.secondary),
      ...(this.thresholds ? { thresholds: this.thresholds } : {}),
      ...(this.options.encounterModel ? { encounterModel: this.options.encounterModel } : {}),
    };
  }
}

/** What a received CDM gives an assessment (app/cdmRisk.ts maps a message to it). */
export interface CdmRiskInputs {
  primaryRtnM2?: Matrix | null;
  secondaryRtnM2?: Matrix | null;
  /** notes of CDM covariances judged unusable (then maximum Pc) */
  primaryDoubtful?: string | null;
  secondaryDoubtful?: string | null;
  hbrPrimaryM?: number | null;
  hbrSecondaryM?: number | null;
}
