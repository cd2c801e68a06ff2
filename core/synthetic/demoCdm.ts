import type { Cdm, CdmBlockInfo, CdmObject } from '../formats/cdm/index.js';
import { formatCdmKvn } from '../formats/cdm/index.js';
import type { ElementSet } from '../elements/elementSet.js';
import type { StateArray } from '../events/encounter.js';
import { gcrfToEme2000 } from '../frames/eme2000.js';
import { temeToGcrf } from '../frames/teme.js';
import { assessEncounter } from '../risk/assess.js';
import { approachAngleDeg, relativeRtn, rtnBasis } from '../screening/geometry.js';
import type { Instant } from '../time/instant.js';
import { vec3, type Km, type KmS, type M, type MS } from '../units.js';
import { plantStates, type Geometry } from './plant.js';

/**
 * A received conjunction message for the demo, as an invented screening provider would send it
 * (CCSDS 508.0-B-1 KVN, written by core/formats' own writer). ORIGINATOR and MESSAGE_ID are ours;
 * a header comment says the message is synthetic. States in EME2000 (TEME → GCRF → EME2000 with
 * core/frames), covariance in each object's RTN frame. The reported Pc is computed with
 * Keepclear's own 2-D reference integral from these covariances, so the message is consistent
 * with itself.
 */
export const DEMO_CDM_ORIGINATOR = 'CAIRNWATCH';
export const DEMO_CDM_PROVIDER_NOTE = 'Synthetic message for the Keepclear demo from an invented provider; not a real conjunction.';

/**
 * 1-σ RTN uncertainty the invented provider reports at TCA, three days ahead: position (m) and
 * velocity (m/s). Rough figures from memory for special-perturbations solutions of a tracked
 * payload (primary, with owner data) and a sparsely tracked secondary; our choice, not a standard.
 */
export const DEMO_CDM_SIGMA = {
  primary: { posM: [25, 200, 15], velMps: [0.2, 0.025, 0.015] },
  secondary: { posM: [150, 900, 120], velMps: [0.9, 0.12, 0.1] },
} as const;
/** Areas for Pc (m²): AREA_PC gives each hard-body radius as √(A/π) (design notes). */
const AREA_PC_M2 = { primary: 3.0, secondary: 1.2 } as const;

export interface DemoCdmSpec {
  readonly primary: ElementSet;
  readonly secondaryId: string;
  readonly secondaryName: string;
  readonly secondaryType: 'PAYLOAD' | 'DEBRIS';
  readonly secondaryManeuverable: boolean;
  readonly tca: Instant;
  readonly missKm: number;
  readonly missAngleDeg: number;
  readonly geometry: Geometry;
  readonly created: Instant;
  readonly messageId: string;
  readonly messageFor: string;
}

export interface DemoCdm {
  readonly text: string;
  readonly messageId: string;
  readonly creationDate: Instant;
  readonly tca: Instant;
  readonly object1: string;
  readonly object2: string;
}

const info = (comments: string[] = []): CdmBlockInfo => ({ comments, lines: {}, extras: {} });
/** Received messages carry mm and µm/s (CCSDS 508.0-B-1 examples: 6 and 9 decimals of km, km/s). */
const roundTo = (x: number, decimals: number): number => Number(x.toFixed(decimals));
const fourDigits = (x: number): number => Number(x.toPrecision(4));

function diagonalRtn(posM: readonly number[], velMps: readonly number[]): number[][] {
  const d = [...posM, ...velMps].map((s) => fourDigits(s * s));
  return d.map((v, i) => d.map((_, j) => (i === j ? v : 0)));
}

function eme2000(s: StateArray, t: Instant): { r: [number, number, number]; v: [number, number, number] } {
  const g = gcrfToEme2000(temeToGcrf({ r: vec3<'TEME', Km>(s[0], s[1], s[2]), v: vec3<'TEME', KmS>(s[3], s[4], s[5]) }, t));
  return {
    r: [roundTo(g.r[0], 6), roundTo(g.r[1], 6), roundTo(g.r[2], 6)],
    v: [roundTo(g.v[0], 9), roundTo(g.v[1], 9), roundTo(g.v[2], 9)],
  };
}

function object(
  which: 'OBJECT1' | 'OBJECT2', id: string, name: string, type: 'PAYLOAD' | 'DEBRIS', maneuverable: boolean,
  state: StateArray, tca: Instant, cov: number[][], areaPc: number, lastObEnd: Instant,
): CdmObject {
  const e = eme2000(state, tca);
  return {
    metadata: {
      ...info(), object: which, objectDesignator: id, catalogName: 'KEEPCLEAR DEMO CATALOGUE', objectName: name,
      internationalDesignator: 'UNKNOWN', objectType: type, ephemerisName: 'NONE', covarianceMethod: 'CALCULATED',
      maneuverable: maneuverable ? 'YES' : 'NO', refFrame: 'EME2000',
    },
    dataComments: [],
    od: { ...info(), timeLastobEnd: lastObEnd },
    additional: { ...info(), areaPc },
    state: { ...info(), r: vec3<'EME2000', Km>(...e.r), v: vec3<'EME2000', KmS>(...e.v) },
    covariance: { ...info(), dimension: 6, matrix: cov, status: 'psd', usable: cov },
  };
}

export function buildDemoCdm(spec: DemoCdmSpec): DemoCdm {
  const st = plantStates(spec);
  const p: StateArray = [...st.primary.r, ...st.primary.v] as unknown as StateArray;
  const s: StateArray = [...st.secondary.r, ...st.secondary.v] as unknown as StateArray;
  const covP = diagonalRtn(DEMO_CDM_SIGMA.primary.posM, DEMO_CDM_SIGMA.primary.velMps);
  const covS = diagonalRtn(DEMO_CDM_SIGMA.secondary.posM, DEMO_CDM_SIGMA.secondary.velMps);
  const missKm = Math.hypot(s[0] - p[0], s[1] - p[1], s[2] - p[2]);
  const risk = assessEncounter(
    {
      primary: spec.primary.objectId, secondary: spec.secondaryId, tca: spec.tca, missKm,
      relativeSpeedKmS: st.relativeSpeedKmS, rtnKm: relativeRtn(p, s), approachAngleDeg: approachAngleDeg(p, s),
      entry: null, exit: null, primaryState: p, secondaryState: s, primaryEpoch: spec.created, secondaryEpoch: spec.created,
    },
    {
      primary: { cdmRtnM2: covP },
      secondary: { cdmRtnM2: covS },
      hbrPrimaryM: Math.sqrt(AREA_PC_M2.primary / Math.PI),
      hbrSecondaryM: Math.sqrt(AREA_PC_M2.secondary / Math.PI),
    },
  );
  const [R, T, N] = rtnBasis(p);
  const dv = [s[3] - p[3], s[4] - p[4], s[5] - p[5]];
  const along = (u: number[]) => (u[0]! * dv[0]! + u[1]! * dv[1]! + u[2]! * dv[2]!) * 1000;
  const rtnM = relativeRtn(p, s).map((x) => roundTo(x * 1000, 3));
  const lastObEnd = (spec.created - 6 * 3_600_000) as Instant;
  const cdm: Cdm = {
    header: {
      ...info([DEMO_CDM_PROVIDER_NOTE]), ccsdsCdmVers: '1.0', creationDate: spec.created, originator: DEMO_CDM_ORIGINATOR,
      messageFor: spec.messageFor, messageId: spec.messageId,
    },
    relative: {
      ...info(),
      tca: spec.tca,
      missDistance: roundTo(missKm * 1000, 3) as M,
      relativeSpeed: roundTo(st.relativeSpeedKmS * 1000, 3) as MS,
      relativePositionR: rtnM[0] as M, relativePositionT: rtnM[1] as M, relativePositionN: rtnM[2] as M,
      relativeVelocityR: roundTo(along(R), 4) as MS, relativeVelocityT: roundTo(along(T), 4) as MS,
      relativeVelocityN: roundTo(along(N), 4) as MS,
      startScreenPeriod: spec.created,
      stopScreenPeriod: (spec.created + 7 * 86_400_000) as Instant,
      screenVolumeFrame: 'RTN', screenVolumeShape: 'ELLIPSOID',
      screenVolumeX: 1000 as M, screenVolumeY: 25_000 as M, screenVolumeZ: 1000 as M,
      ...(risk.pc !== null ? { collisionProbability: fourDigits(risk.pc), collisionProbabilityMethod: 'FOSTER-1992' } : {}),
    },
    object1: object('OBJECT1', spec.primary.objectId, spec.primary.name ?? spec.primary.objectId, 'PAYLOAD', true, p, spec.tca, covP, AREA_PC_M2.primary, lastObEnd),
    object2: object('OBJECT2', spec.secondaryId, spec.secondaryName, spec.secondaryType, spec.secondaryManeuverable, s, spec.tca, covS, AREA_PC_M2.secondary, lastObEnd),
  };
  return { text: formatCdmKvn(cdm), messageId: spec.messageId, creationDate: spec.created, tca: spec.tca, object1: spec.primary.objectId, object2: spec.secondaryId };
}
