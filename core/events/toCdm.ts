/**
 * A stored conjunction event as a CCSDS Conjunction Data Message (508.0-B-1), the mirror of
 * fromCdm.ts: both states go from TEME to EME2000 (IAU-76/FK5 reduction of core/frames, then the
 * frame bias), the covariance of each object is given in its own RTN frame, and every unit is the
 * standard's (m, m/s for relative values and covariance; km, km/s for states; m² for AREA_PC).
 *
 * What Keepclear knows of an object's uncertainty is often only a position covariance (element-set
 * history, default table). A CDM's 6×6 covariance is mandatory, so the velocity rows are then
 * written as zeros and a COMMENT says so; a reader must not take them as "no velocity error".
 */
import type { Cdm, CdmBlockInfo, CdmCovariance, CdmObject } from '../formats/cdm/index.js';
import type { Matrix } from '../math/linalg.js';
import { gcrfToEme2000 } from '../frames/eme2000.js';
import { temeToGcrf } from '../frames/teme.js';
import { stateIn } from '../frames/toTeme.js';
import type { Instant } from '../time/instant.js';
import type { CdmRefFrame } from '../formats/cdm/index.js';
import { vec3, type Km, type KmS, type M, type MS } from '../units.js';
import type { ConjunctionEvent } from './event.js';
import type { StateArray } from './encounter.js';

/** What the message says of one object beyond the event's numbers. */
export interface CdmObjectFacts {
  /** Keepclear's object id (canonical catalogue number, Alpha-5 decoded) */
  readonly id: string;
  readonly name: string | null;
  readonly intlDesignator: string | null;
  /** the object's own hard-body radius (m) used in the Pc; AREA_PC = π R² */
  readonly hardBodyRadiusM: number;
  /** true when that radius is Keepclear's default, not one set for the object */
  readonly hardBodyRadiusDefault: boolean;
  /**
   * RTN covariance at TCA, m² (3×3 position only, or 6×6 with velocity, m²/s, m²/s²); null when
   * no usable covariance was known
   */
  readonly covRtn: Matrix | null;
  /** where the covariance came from, in words (the event's covarianceSource part) */
  readonly covarianceSource: string;
  /** 'DEFAULT' when the covariance came from Keepclear's default table (508.0-B-1 COVARIANCE_METHOD) */
  readonly covarianceMethod: 'CALCULATED' | 'DEFAULT';
  /** the owner ephemeris used (OEM file), or null for an element set propagated with SGP4 */
  readonly ephemerisName: string | null;
  /** what the state was propagated from, for a COMMENT */
  readonly stateSource: string;
}

export interface CdmExportInput {
  readonly event: ConjunctionEvent;
  readonly primary: CdmObjectFacts;
  readonly secondary: CdmObjectFacts;
  readonly creationDate: Instant;
  readonly originator: string;
  readonly messageId: string;
  /** the screening window and volume, when the event came from a screening run */
  readonly screening: {
    readonly start: Instant;
    readonly stop: Instant;
    /** semi-axes R, T, N in km (a sphere gives three equal ones) */
    readonly volumeRtnKm: readonly [number, number, number];
  } | null;
  /** header COMMENT lines (the decision-aid note, where the message comes from) */
  readonly headerComments: readonly string[];
}

/** Value written for a designator or name Keepclear does not know (our choice; 508.0-B-1 gives no "unknown" value for these). */
export const CDM_UNKNOWN_TEXT = 'UNKNOWN';
/** EPHEMERIS_NAME when no ephemeris was used (508.0-B-1 metadata table: "NONE" when not applicable). */
export const CDM_NO_EPHEMERIS = 'NONE';

const info = (comments: readonly string[] = []): CdmBlockInfo => ({ comments: [...comments], lines: {}, extras: {} });

type V = [number, number, number];
const sub = (a: V, b: V): V => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const dot = (a: V, b: V): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: V, b: V): V => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: V): V => {
  const n = Math.hypot(...a);
  return [a[0] / n, a[1] / n, a[2] / n];
};

/** TEME state at TCA → EME2000 (km, km/s). */
export function temeToEme2000State(s: StateArray, t: Instant): { r: V; v: V } {
  const e = gcrfToEme2000(temeToGcrf(stateIn('TEME', [s[0], s[1], s[2]], [s[3], s[4], s[5]]), t));
  return { r: [e.r[0], e.r[1], e.r[2]], v: [e.v[0], e.v[1], e.v[2]] };
}

/**
 * Relative position and velocity (secondary minus primary) in the primary's RTN frame, m and m/s.
 * The components are those of the difference vectors projected on the R, T, N axes, as
 * 508.0-B-1 defines RELATIVE_POSITION_R/T/N and RELATIVE_VELOCITY_R/T/N.
 */
function relativeRtnMetres(p: StateArray, s: StateArray): { pos: V; vel: V } {
  const r: V = [p[0], p[1], p[2]];
  const v: V = [p[3], p[4], p[5]];
  const R = unit(r);
  const N = unit(cross(r, v));
  const T = cross(N, R);
  const dr = sub([s[0], s[1], s[2]], r);
  const dv = sub([s[3], s[4], s[5]], v);
  const km = (d: V): V => [dot(d, R) * 1000, dot(d, T) * 1000, dot(d, N) * 1000];
  return { pos: km(dr), vel: km(dv) };
}

/** A 6×6 from a 3×3 position covariance (velocity rows zero) or a 6×6 as it is. */
function sixBySix(c: Matrix | null): Matrix {
  const out = Array.from({ length: 6 }, () => new Array<number>(6).fill(0));
  if (c) for (let i = 0; i < c.length && i < 6; i++) for (let j = 0; j < c.length && j < 6; j++) out[i]![j] = c[i]![j]!;
  return out;
}

function objectOf(label: 'OBJECT1' | 'OBJECT2', f: CdmObjectFacts, state: StateArray, tca: Instant): CdmObject {
  const e = temeToEme2000State(state, tca);
  const stateComments = [
    `state at TCA from ${f.stateSource}; converted TEME -> EME2000 (IAU-76/FK5 reduction and frame bias)`,
  ];
  const covComments: string[] = [`covariance source: ${f.covarianceSource}`];
  if (f.covRtn === null)
    covComments.push('no usable covariance was known for this object: every term is written as 0 and must not be used for Pc');
  else if (f.covRtn.length < 6)
    covComments.push('only a position covariance is known: the velocity rows (CRDOT_R ... CNDOT_NDOT) are written as 0, meaning unknown, not exact');
  const additionalComments = f.hardBodyRadiusDefault
    ? [`AREA_PC from Keepclear's default hard-body radius ${f.hardBodyRadiusM} m (pi R^2), not from the object`]
    : [`AREA_PC = pi R^2 with the object's hard-body radius ${f.hardBodyRadiusM} m`];
  const matrix = sixBySix(f.covRtn);
  const covariance: CdmCovariance = {
    ...info(covComments),
    dimension: 6,
    matrix,
    status: 'psd',
    usable: f.covRtn === null ? null : matrix,
  };
  return {
    metadata: {
      ...info(),
      object: label,
      objectDesignator: f.id,
      catalogName: 'SATCAT',
      objectName: f.name?.trim() || CDM_UNKNOWN_TEXT,
      internationalDesignator: f.intlDesignator?.trim() || CDM_UNKNOWN_TEXT,
      ephemerisName: f.ephemerisName ?? CDM_NO_EPHEMERIS,
      covarianceMethod: f.covarianceMethod,
      // Keepclear does not know whether an object can manoeuvre: 508.0-B-1 allows N/A.
      maneuverable: 'N/A',
      refFrame: 'EME2000' satisfies CdmRefFrame,
    },
    dataComments: [],
    od: info(),
    additional: { ...info(additionalComments), areaPc: Math.PI * f.hardBodyRadiusM ** 2 },
    state: {
      ...info(stateComments),
      r: vec3<CdmRefFrame, Km>(e.r[0], e.r[1], e.r[2]),
      v: vec3<CdmRefFrame, KmS>(e.v[0], e.v[1], e.v[2]),
    },
    covariance,
  };
}

/** Builds the message; `formatCdmKvn` writes it. */
export function eventToCdm(x: CdmExportInput): Cdm {
  const e = x.event;
  const rel = relativeRtnMetres(e.primaryState, e.secondaryState);
  const relComments: string[] = [];
  const risk = e.risk;
  const pcIsEstimate = risk !== null && risk.pc !== null && !risk.pcMethod.startsWith('max-pc');
  if (risk && risk.pc !== null && !pcIsEstimate)
    relComments.push(
      `Keepclear computed only a maximum Pc of ${risk.pc} (${risk.pcMethod}), an upper bound; it is not given as COLLISION_PROBABILITY`,
    );
  if (risk && risk.pc === null) relComments.push(`no Pc could be computed (${risk.pcMethod})`);
  if (risk) relComments.push(`hard-body radius ${risk.hardBodyRadiusM} m (sum of both objects); tier ${risk.tier}`);
  const s = x.screening;
  return {
    header: {
      ...info(x.headerComments),
      ccsdsCdmVers: '1.0',
      creationDate: x.creationDate,
      originator: x.originator,
      messageId: x.messageId,
    },
    relative: {
      ...info(relComments),
      tca: e.tca,
      missDistance: (e.missKm * 1000) as M,
      relativeSpeed: (e.relativeSpeedKmS * 1000) as MS,
      relativePositionR: rel.pos[0] as M,
      relativePositionT: rel.pos[1] as M,
      relativePositionN: rel.pos[2] as M,
      relativeVelocityR: rel.vel[0] as MS,
      relativeVelocityT: rel.vel[1] as MS,
      relativeVelocityN: rel.vel[2] as MS,
      ...(s
        ? {
            startScreenPeriod: s.start,
            stopScreenPeriod: s.stop,
            screenVolumeFrame: 'RTN' as const,
            screenVolumeShape: 'ELLIPSOID' as const,
            screenVolumeX: (s.volumeRtnKm[0] * 1000) as M,
            screenVolumeY: (s.volumeRtnKm[1] * 1000) as M,
            screenVolumeZ: (s.volumeRtnKm[2] * 1000) as M,
          }
        : {}),
      ...(e.entry !== null ? { screenEntryTime: e.entry } : {}),
      ...(e.exit !== null ? { screenExitTime: e.exit } : {}),
      ...(pcIsEstimate ? { collisionProbability: risk.pc!, collisionProbabilityMethod: risk.pcMethod } : {}),
    },
    object1: objectOf('OBJECT1', x.primary, e.primaryState, e.tca),
    object2: objectOf('OBJECT2', x.secondary, e.secondaryState, e.tca),
  };
}
