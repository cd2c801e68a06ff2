/**
 * What planning one stored event needs from the database, gathered once: the element sets the
 * event was screened with (their SGP4 trajectories), the screening window and volume of its run,
 * the owner's spacecraft data, and the Pc of a moved encounter with the event's own covariances
 * and method.
 */
import type { ElementSet } from '../../core/elements/elementSet.js';
import { KeepclearError } from '../../core/errors.js';
import type { ConjunctionEvent, Encounter, Matrix3 } from '../../core/events/index.js';
import type { PcCallback } from '../../core/manoeuvre/index.js';
import { assessEncounter } from '../../core/risk/assess.js';
import type { ScreeningVolume } from '../../core/screening/types.js';
import { MS_PER_DAY, toIso, type Instant } from '../../core/time/instant.js';
import { EphemerisTrajectory } from '../../core/propagation/ephemeris.js';
import { Sgp4Trajectory } from '../../core/propagation/sgp4.js';
import type { Trajectory } from '../../core/propagation/trajectory.js';
import {
  EPOCH_MATCH_MS,
  elementSetHistory,
  getRun,
  getSpacecraft,
  loadEphemeris,
  runEphemerides,
  type KeepclearDb,
  type RunRecord,
} from '../../db/index.js';
import { RiskContext } from '../risk.js';

/** Without a screening run behind the event (a received CDM), the re-screen covers TCA + this. */
export const NO_RUN_WINDOW_AFTER_TCA_MS = MS_PER_DAY;
/** Without a screening run, the re-screen uses DESIGN.md's default threshold (5 km sphere). */
export const NO_RUN_VOLUME: ScreeningVolume = { kind: 'sphere', radiusKm: 5 };

/** The command that sets what planning needs, for error messages. */
export const spacecraftCommand = (id: string): string => `keepclear spacecraft --id ${id} --mass-kg KG --isp-s S`;

export interface PlanInputs {
  readonly event: ConjunctionEvent;
  readonly run: RunRecord | null;
  /** the primary's element set: period, grid step and drag (B*), and the trajectory unless an ephemeris was screened */
  readonly primarySet: ElementSet;
  readonly secondarySet: ElementSet;
  /** what the event was screened with: the owner ephemeris the run used for the primary, else SGP4 of its set */
  readonly primaryTrajectory: Trajectory;
  readonly secondaryTrajectory: Trajectory;
  readonly windowEnd: Instant;
  readonly volume: ScreeningVolume;
  readonly spacecraft: { readonly massKg: number; readonly ispS: number };
  readonly pcOf: PcCallback;
  /** how the Pc of a moved encounter is computed (for the output) */
  readonly pcMethod: string;
  readonly notes: string[];
}

/** The set screened (epoch within EPOCH_MATCH_MS), else the newest set at or before TCA, else the newest. */
function elementSetFor(db: KeepclearDb, objectId: string, epoch: Instant, tca: Instant, notes: string[] | null): ElementSet {
  const history = elementSetHistory(db, objectId);
  if (history.length === 0)
    throw new KeepclearError('NOT_FOUND', `no element set of object ${objectId} in the database; import one (keepclear import FILE) before planning`);
  const exact = history.find((s) => Math.abs(s.epoch - epoch) <= EPOCH_MATCH_MS);
  if (exact) return exact;
  const before = history.filter((s) => s.epoch <= tca);
  const chosen = before[before.length - 1] ?? history[history.length - 1]!;
  notes?.push(
    `object ${objectId}: the event's state epoch ${toIso(epoch)} matches no stored element set; ` +
      `planned with the set of epoch ${toIso(chosen.epoch)} (newest at or before TCA)`,
  );
  return chosen;
}

function requireSpacecraft(db: KeepclearDb, id: string): { massKg: number; ispS: number } {
  const sc = getSpacecraft(db, id);
  const missing = [sc?.massKg == null && 'mass (kg)', sc?.ispS == null && 'Isp (s)'].filter(Boolean);
  if (missing.length > 0)
    throw new KeepclearError(
      'SPACECRAFT_PARAMETER_MISSING',
      `spacecraft ${id}: ${missing.join(' and ')} not set — propellant needs both and Keepclear uses no default; ` +
        `set them with ${spacecraftCommand(id)}`,
    );
  return { massKg: sc!.massKg!, ispS: sc!.ispS! };
}

/**
 * The Pc of a moved encounter with the event's assessment held fixed: the same two RTN
 * covariances (turned into each new encounter's RTN frames), the same combined hard-body radius
 * and the same method. Resolved once: the covariance's change over the seconds TCA moves is far
 * below its own uncertainty. An event stored without its covariances is assessed once again.
 */
function pcCallbackFor(db: KeepclearDb, e: ConjunctionEvent, notes: string[]): { pcOf: PcCallback; pcMethod: string } {
  let risk = e.risk;
  if (!risk || !risk.detail) {
    risk = new RiskContext(db).assess(e);
    notes.push(`the event's covariances were not stored with it: assessed again (${risk.covarianceSource}, ${risk.pcMethod})`);
  }
  const d = risk.detail;
  const method = /fast/.test(risk.pcMethod) ? ('fast' as const) : ('reference' as const);
  const maxPc = /^max-pc/.test(risk.pcMethod) || !d?.primaryCovRtnM2 || !d?.secondaryCovRtnM2;
  const cov = (m: Matrix3 | null | undefined) => (maxPc || !m ? null : m.map((row) => [...row]));
  const p = cov(d?.primaryCovRtnM2), s = cov(d?.secondaryCovRtnM2);
  // assessEncounter sums two radii: halves of the combined one sum to it exactly.
  const half = Number.isFinite(risk.hardBodyRadiusM) ? risk.hardBodyRadiusM / 2 : null;
  const pcOf: PcCallback = (enc: Encounter) =>
    // encounterModel '2d': the solver compares hundreds of moved encounters by one method (named below).
    assessEncounter(enc, { primary: { cdmRtnM2: p }, secondary: { cdmRtnM2: s }, hbrPrimaryM: half, hbrSecondaryM: half, method, encounterModel: '2d' }).pc;
  const pcMethod = maxPc
    ? `maximum Pc (no usable covariance, as in the event's assessment), hard-body radius ${risk.hardBodyRadiusM} m`
    : `2-D ${method} Pc with the event's covariances (${risk.covarianceSource}) held fixed in RTN, hard-body radius ${risk.hardBodyRadiusM} m`;
  return { pcOf, pcMethod };
}

export function planInputs(db: KeepclearDb, e: ConjunctionEvent): PlanInputs {
  const notes: string[] = [];
  const spacecraft = requireSpacecraft(db, e.primary);
  const run = getRun(db, e.runId);
  const screened = run && run.kind !== 'cdm' ? run : null;
  // A run that screened the primary from an owner ephemeris (OEM) recorded it: plan on it too.
  const used = screened ? runEphemerides(db, screened.id).find((r) => r.objectId === e.primary && r.ephemerisId !== null) : undefined;
  const oem = used ? loadEphemeris(db, used.ephemerisId!) : null;
  const primarySet = elementSetFor(db, e.primary, e.primaryEpoch, e.tca, oem ? null : notes);
  const secondarySet = elementSetFor(db, e.secondary, e.secondaryEpoch, e.tca, notes);
  let primaryTrajectory: Trajectory = new Sgp4Trajectory(primarySet);
  if (oem && used) {
    primaryTrajectory = new EphemerisTrajectory(oem, e.primary);
    notes.push(
      `primary ${e.primary} from the owner ephemeris ${used.fileName} (as the run screened it); its element set gives only the ` +
        'period and drag; burns and the re-screen reach only as far as the ephemeris does',
    );
  }
  let windowEnd: Instant, volume: ScreeningVolume;
  if (screened) {
    windowEnd = screened.settings.end;
    volume = screened.settings.volume;
  } else {
    windowEnd = (e.tca + NO_RUN_WINDOW_AFTER_TCA_MS) as Instant;
    volume = NO_RUN_VOLUME;
    notes.push('no screening run behind this event: the re-screen covers TCA + 1 day with a 5 km sphere');
  }
  if (!(windowEnd > e.tca)) windowEnd = (e.tca + NO_RUN_WINDOW_AFTER_TCA_MS) as Instant;
  const secondaryTrajectory = new Sgp4Trajectory(secondarySet);
  return { event: e, run, primarySet, secondarySet, primaryTrajectory, secondaryTrajectory, windowEnd, volume, spacecraft, ...pcCallbackFor(db, e, notes), notes };
}
