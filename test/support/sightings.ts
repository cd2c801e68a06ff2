/**
 * Conjunction events built by hand for series tests: two circular orbits of the same radius
 * crossing at a chosen angle, the secondary offset by the miss along the radial direction.
 * Circular speed from WGS-72 μ (the constant SGP4 uses), so the osculating period of each state
 * is 2π√(r³/μ) exactly — the tests compute the period cap from that closed form.
 */
import type { ConjunctionEvent, RiskAssessment, SeriesMember, SeriesSourceKind, StateArray } from '../../core/events/index.js';
import { parseIso, type Instant } from '../../core/time/instant.js';

export const MU_WGS72 = 398600.8; // km³/s², Vallado et al. 2006 (WGS-72)
/** 550 km altitude on the WGS-72 radius 6378.135 km (rounded): a LEO shell. */
export const R_LEO_KM = 6928;
export const V_CIRC_KMS = Math.sqrt(MU_WGS72 / R_LEO_KM);
/** Period of that circular orbit (s): 2π√(r³/μ). */
export const PERIOD_LEO_S = 2 * Math.PI * Math.sqrt(R_LEO_KM ** 3 / MU_WGS72);

export const at = (iso: string): Instant => {
  const t = parseIso(iso);
  if (t === null) throw new Error(`bad time ${iso}`);
  return t;
};

export interface SightingSpec {
  id: string;
  source: string;
  kind?: SeriesSourceKind;
  createdAt: string;
  primary: string;
  secondary: string;
  tca: string | Instant;
  /** angle between the velocities, degrees (default 90) */
  angleDeg?: number;
  missKm?: number;
  pc?: number | null;
  /** risk.detail.sigmaAlongVelocityM; undefined → no risk detail kept (fallback σ) */
  sigmaAlongM?: number;
  /** element-set epochs (default: 1 day before creation) */
  primaryEpoch?: string;
  secondaryEpoch?: string;
}

export function sighting(s: SightingSpec): SeriesMember {
  const angle = ((s.angleDeg ?? 90) * Math.PI) / 180;
  const miss = s.missKm ?? 1;
  const v = V_CIRC_KMS;
  const p: StateArray = [R_LEO_KM, 0, 0, 0, v, 0];
  const q: StateArray = [R_LEO_KM + miss, 0, 0, 0, v * Math.cos(angle), v * Math.sin(angle)];
  const tca = typeof s.tca === 'string' ? at(s.tca) : s.tca;
  const created = at(s.createdAt);
  const dayBefore = (created - 86_400_000) as Instant;
  const risk: RiskAssessment | null =
    s.pc === undefined && s.sigmaAlongM === undefined
      ? null
      : {
          pc: s.pc ?? null,
          pcMethod: '2d-reference',
          covarianceSource: 'test',
          hardBodyRadiusM: 10,
          tier: 'test',
          warnings: [],
          ...(s.sigmaAlongM !== undefined
            ? { detail: { primaryCovRtnM2: null, secondaryCovRtnM2: null, planeMissM: [miss * 1000, 0] as const, planeCovM2: null, sigmaAlongVelocityM: s.sigmaAlongM } }
            : {}),
        };
  const event: ConjunctionEvent = {
    id: s.id,
    runId: s.source,
    primary: s.primary,
    secondary: s.secondary,
    tca,
    missKm: miss,
    relativeSpeedKmS: 2 * v * Math.sin(angle / 2),
    rtnKm: [miss, 0, 0],
    approachAngleDeg: s.angleDeg ?? 90,
    entry: null,
    exit: null,
    primaryState: p,
    secondaryState: q,
    primaryEpoch: s.primaryEpoch ? at(s.primaryEpoch) : dayBefore,
    secondaryEpoch: s.secondaryEpoch ? at(s.secondaryEpoch) : dayBefore,
    risk,
  };
  return { event, source: { id: s.source, kind: s.kind ?? 'screening', createdAt: created } };
}

/** A pure velocity angle giving a chosen relative speed between two equal circular speeds. */
export const angleForRelativeSpeedDeg = (vRelKmS: number): number => (2 * Math.asin(vRelKmS / (2 * V_CIRC_KMS)) * 180) / Math.PI;

/** Deterministic shuffle (mulberry32; public domain) so permutation tests are reproducible. */
export function shuffled<T>(items: readonly T[], seed: number): T[] {
  let state = seed >>> 0;
  const next = (): number => {
    state = (state + 0x6d2b79f5) | 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const out = [...items];
  for (let k = out.length - 1; k > 0; k--) {
    const j = Math.floor(next() * (k + 1));
    [out[k], out[j]] = [out[j]!, out[k]!];
  }
  return out;
}
