import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { zeros, type Matrix } from '../math/linalg.js';
import type { Encounter, Matrix2, Matrix3, RiskAssessment, RiskDetail, StateArray } from '../events/index.js';
import { MS_PER_DAY, type Instant } from '../time/instant.js';
import { defaultCovariance, regimeOf } from './covarianceDefault.js';
import { growHistorySample, historySample, type HistorySample } from './covarianceHistory.js';
import { judgeCovariance } from './covariancePsd.js';
import type { Regime } from './defaultCovarianceTable.js';
import { encounterPlane, type EncounterPlane } from './encounterPlane.js';
import { rtnToInertialCov6, type Vec3n } from './frames.js';
import { combinedHbr } from './hardBody.js';
import { pc2dFast } from './pc2dFast.js';
import { pc2dReference } from './pc2dReference.js';
import { pc3d } from './pc3d.js';
import { pcMax } from './pcMax.js';
import { checkShortEncounter } from './shortEncounter.js';
import type { State6 } from './twoBody.js';
import { DEFAULT_TIER_THRESHOLDS, tierFor, type TierThresholds } from './tiers.js';

/** Shown wherever a Pc or tier could inform a manoeuvre decision (own file, so the renderer can import it alone). */
export { DECISION_AID_NOTE } from './decisionAid.js';

/** What is known about one object's position uncertainty at TCA; used in this order. */
export interface CovarianceInput {
  /** covariance from a received CDM at TCA, RTN (CDM order R, T, N, …), 6×6 or 3×3, m² */
  readonly cdmRtnM2?: Matrix | null;
  /**
   * the owner's covariance from an OEM covariance block (3×3 position, RTN, m²), after a
   * received CDM and before the element-set history; `source` names the file, `note` says which
   * block was taken and that it was not propagated
   */
  readonly ephemeris?: { readonly rtnM2: Matrix; readonly source: string; readonly note: string } | null;
  /** the object's element sets, ascending epochs, newest last */
  readonly history?: readonly ElementSet[] | null;
  /**
   * historySample(history), when the caller already has it (it depends on the object only, so a
   * caller assessing many encounters of one object computes it once); given (even null), it is
   * used instead of `history`
   */
  readonly historyStats?: HistorySample | null;
  /** the element set used for the encounter (gives regime and age for the default table) */
  readonly elements?: Pick<ElementSet, 'epoch' | 'meanMotionRevPerDay' | 'eccentricity'> | null;
  /** regime when no element set is at hand (e.g. an ephemeris object) */
  readonly regime?: Regime | null;
  /**
   * Set when a received CDM covariance was judged unusable (not PSD beyond rounding): the
   * message's covariance takes precedence but is doubtful, so maximum Pc is used.
   */
  readonly cdmDoubtfulNote?: string | null;
}

export interface AssessInputs {
  readonly primary: CovarianceInput;
  readonly secondary: CovarianceInput;
  readonly hbrPrimaryM?: number | null;
  readonly hbrSecondaryM?: number | null;
  readonly thresholds?: Partial<TierThresholds>;
  /** '2d-reference' (default) or '2d-fast' */
  readonly method?: 'reference' | 'fast';
  /**
   * 'auto' (default): the 3-D method (Coppola 2012, pc3d.ts) wherever the short-encounter check
   * fails, the 2-D method elsewhere. '2d': always the 2-D method (with the check's warnings),
   * for callers that must stay fast and compare like with like (the manoeuvre solver's loop).
   */
  readonly encounterModel?: 'auto' | '2d';
}

/** What an assessment reads of an encounter. */
export type EncounterAtTca = Pick<Encounter, 'tca' | 'missKm' | 'primaryState' | 'secondaryState' | 'primaryEpoch' | 'secondaryEpoch'>;

/** pcMethod names (JSON contract field `pcMethod`). */
export const PC_METHOD_3D = '3d-coppola';

interface Resolved {
  /** 3×3 inertial position covariance (m²), for the 2-D method */
  readonly inertialM2: Matrix | null;
  /** 6×6 inertial position-velocity covariance (m², m²/s, m²/s²), for the 3-D method */
  readonly inertial6: Matrix | null;
  /** the same covariance's 3×3 position block in the object's RTN frame (m²), when usable */
  readonly rtnM2: Matrix | null;
  readonly source: string;
  readonly doubtful: boolean;
  readonly notes: readonly string[];
}

const vec = (a: number, b: number, c: number): Vec3n => [a, b, c];

/**
 * A position-only (3×3) RTN covariance becomes 6×6 with a zero velocity block in the rotating
 * frame: the position error is taken to keep pace with the frame (an object displaced along its
 * own orbit), which through the ω×r term of the Jacobian is a velocity error of ω×δr in inertial
 * axes. Our modelling choice for sources that give no velocity statistics (default table).
 */
function asRtn6(rtn: Matrix): Matrix {
  if (rtn.length >= 6) return rtn.slice(0, 6).map((row) => row.slice(0, 6));
  // Loops, not nested Array.from with callbacks (~3 % of the risk phase of 10⁵ encounters, profiled).
  const out = zeros(6);
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) out[i]![j] = rtn[i]![j]!;
  return out;
}

function resolve(input: CovarianceInput, state: StateArray, tca: Instant, epoch: Instant, label: string): Resolved {
  const r = vec(state[0], state[1], state[2]), v = vec(state[3], state[4], state[5]);
  // One PSD policy for every source (covariancePsd.ts); a CDM matrix judged on reading is judged
  // again here by the same rule, which leaves it as it was.
  const graded = (rtn: Matrix, source: string): Resolved => {
    const verdict = judgeCovariance(rtn, `${label} ${source}`);
    const notes = verdict.note ? [verdict.note] : [];
    if (!verdict.usable) return { inertialM2: null, inertial6: null, rtnM2: null, source, doubtful: true, notes };
    const inertial6 = rtnToInertialCov6(asRtn6(verdict.usable), r, v);
    return {
      inertialM2: inertial6.slice(0, 3).map((row) => row.slice(0, 3)),
      inertial6,
      rtnM2: verdict.usable.slice(0, 3).map((row) => row.slice(0, 3)),
      source,
      doubtful: false,
      notes,
    };
  };
  if (input.cdmDoubtfulNote) {
    return { inertialM2: null, inertial6: null, rtnM2: null, source: 'cdm (unusable)', doubtful: true, notes: [input.cdmDoubtfulNote] };
  }
  if (input.cdmRtnM2) return graded(input.cdmRtnM2, 'cdm');
  if (input.ephemeris) {
    const g = graded(input.ephemeris.rtnM2, input.ephemeris.source);
    return { ...g, notes: [...g.notes, `${label}: ${input.ephemeris.note}`] };
  }
  const stats = input.historyStats !== undefined ? input.historyStats : input.history ? historySample(input.history) : null;
  if (stats) {
    const h = growHistorySample(stats, tca);
    return graded(h.rtn6, h.source);
  }
  const regime = input.regime ?? (input.elements ? regimeOf(input.elements) : null);
  if (regime) {
    const d = defaultCovariance(regime, (tca - (input.elements?.epoch ?? epoch)) / MS_PER_DAY);
    return graded(d.rtnM2, d.source);
  }
  return { inertialM2: null, inertial6: null, rtnM2: null, source: 'none', doubtful: false, notes: [`${label}: no covariance available`] };
}

/**
 * Risk of one encounter. Covariance per object: CDM → owner ephemeris (OEM) → element-set history → default table, each
 * judged by the one PSD policy (covariancePsd.ts). With both covariances usable: the short-
 * encounter 2-D Pc, or — where the short-encounter check (shortEncounter.ts) fails and
 * encounterModel is 'auto' — the 3-D Pc (pc3d.ts, Coppola 2012), named in pcMethod with the 2-D
 * value in the warnings. When a covariance is missing or refused (not PSD beyond rounding, all
 * zero, non-finite, asymmetric; or the projected 2×2 is singular): maximum Pc over an isotropic
 * covariance of unknown size (Alfano 2005), which is an upper bound and says so in pcMethod.
 */
export function assessEncounter<E extends EncounterAtTca>(encounter: E, inputs: AssessInputs): RiskAssessment {
  const thresholds = { ...DEFAULT_TIER_THRESHOLDS, ...inputs.thresholds };
  const hbr = combinedHbr(inputs.hbrPrimaryM, inputs.hbrSecondaryM);
  const p = resolve(inputs.primary, encounter.primaryState, encounter.tca, encounter.primaryEpoch, 'primary');
  const s = resolve(inputs.secondary, encounter.secondaryState, encounter.tca, encounter.secondaryEpoch, 'secondary');
  const warnings: string[] = [...p.notes, ...s.notes];
  if (hbr.note) warnings.push(hbr.note);
  const covarianceSource = `${p.source} / ${s.source}`;
  let detail: RiskDetail | undefined;
  const done = (pc: number | null, pcMethod: string): RiskAssessment => ({
    pc,
    pcMethod,
    covarianceSource,
    hardBodyRadiusM: hbr.radiusM,
    tier: tierFor(pc, encounter.missKm, thresholds),
    warnings,
    ...(detail ? { detail } : {}),
  });
  const zero: Matrix = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  let plane;
  try {
    plane = encounterPlane(encounter.primaryState, encounter.secondaryState, p.inertialM2 ?? zero, s.inertialM2 ?? zero);
  } catch (e) {
    if (!(e instanceof KeepclearError)) throw e;
    warnings.push(`no Pc: ${e.message}`);
    return done(null, 'none');
  }
  detail = riskDetail(plane, p.inertialM2 !== null && s.inertialM2 !== null, p.rtnM2, s.rtnM2);
  const maxPc = (why: string): RiskAssessment => {
    warnings.push(`maximum Pc used (${why}): an upper bound over all covariance sizes, not an estimate`);
    return done(pcMax(plane.missM, null, hbr.radiusM).pc, `max-pc (${why})`);
  };
  if (!p.inertialM2 || !s.inertialM2) return maxPc(p.doubtful || s.doubtful ? 'doubtful covariance' : 'no covariance');
  const shortCheck = checkShortEncounter(
    encounter.primaryState, encounter.secondaryState, plane.relVelMps, plane.combinedCovM2, hbr.radiusM,
  );
  warnings.push(...shortCheck.warnings);
  let pc2: number;
  try {
    pc2 = inputs.method === 'fast' ? pc2dFast(plane.missM, plane.covM2, hbr.radiusM) : pc2dReference(plane.missM, plane.covM2, hbr.radiusM);
  } catch (e) {
    if (!(e instanceof KeepclearError)) throw e;
    warnings.push(e.message);
    return maxPc('doubtful covariance');
  }
  const method2d = inputs.method === 'fast' ? '2d-fast' : '2d-reference';
  if (shortCheck.warnings.length === 0 || inputs.encounterModel === '2d' || !p.inertial6 || !s.inertial6) return done(pc2, method2d);
  try {
    const r3 = pc3d({
      primary: toMetres(encounter.primaryState),
      secondary: toMetres(encounter.secondaryState),
      primaryCov: p.inertial6,
      secondaryCov: s.inertial6,
      radiusM: hbr.radiusM,
    });
    warnings.push(
      `Pc by the 3-D method (Coppola 2012: inflow into the hard-body sphere over ±${r3.halfWindowS.toFixed(0)} s around TCA, ` +
        `two-body relative motion) because the short-encounter assumption does not hold; the 2-D Pc would be ${pc2.toExponential(2)}`,
    );
    if (r3.windowCapped)
      warnings.push(`3-D Pc window cut at ±${r3.halfWindowS.toFixed(0)} s (a quarter orbit): the uncertainty region is crossed more slowly than that`);
    if (!r3.converged) warnings.push('3-D Pc time integration did not reach its tolerance; the value is approximate');
    return done(r3.pc, PC_METHOD_3D);
  } catch (e) {
    if (!(e instanceof KeepclearError)) throw e;
    warnings.push(`3-D Pc not possible (${e.message}); the 2-D Pc is given although its assumption does not hold`);
    return done(pc2, method2d);
  }
}

const toMetres = (s: StateArray): State6 => [s[0] * 1000, s[1] * 1000, s[2] * 1000, s[3] * 1000, s[4] * 1000, s[5] * 1000];

const matrix3 = (m: Matrix | null): Matrix3 | null =>
  m ? (m.slice(0, 3).map((row) => [row[0]!, row[1]!, row[2]!] as const) as unknown as Matrix3) : null;

/**
 * What the Pc was computed from, kept with the event. The plane covariance and the σ along the
 * relative velocity are given only when both covariances were usable (then they are those of
 * the combined covariance the Pc used).
 */
function riskDetail(plane: EncounterPlane, both: boolean, primaryRtn: Matrix | null, secondaryRtn: Matrix | null): RiskDetail {
  const z = plane.axes.z, c = plane.combinedCovM2;
  let along = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) along += z[i]! * c[i]![j]! * z[j]!;
  const cov2: Matrix2 = [[plane.covM2[0][0], plane.covM2[0][1]], [plane.covM2[1][0], plane.covM2[1][1]]];
  return {
    primaryCovRtnM2: matrix3(primaryRtn),
    secondaryCovRtnM2: matrix3(secondaryRtn),
    planeMissM: [plane.missM[0], plane.missM[1]],
    planeCovM2: both ? cov2 : null,
    sigmaAlongVelocityM: both ? Math.sqrt(Math.max(along, 0)) : null,
  };
}
