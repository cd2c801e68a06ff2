import type { ElementSet } from '../elements/elementSet.js';
import { KeepclearError } from '../errors.js';
import { Sgp4Trajectory } from '../propagation/sgp4.js';
import type { Instant } from '../time/instant.js';
import { fitElementSetToState } from './fit.js';
import { MU, semiMajorAxisKm } from './kepler.js';
import { RE } from './j2.js';

/**
 * Plants a genuine close approach: the primary's SGP4 state at the chosen TCA, a secondary
 * state there offset by the designed miss vector perpendicular to the relative velocity (so
 * the range is stationary exactly at TCA), and an element set fitted to that state at an
 * earlier epoch so that SGP4 from that epoch reproduces it.
 */
export type Geometry =
  /**
   * velocity turned by `angleDeg` about the primary's radial direction, at circular speed times
   * `speedFactor` (default 1: the same period as a circular primary, so the pair can meet again
   * on following revolutions; 1.01 puts the TCA at the secondary's perigee of a 2 % eccentric
   * orbit with a 3 % longer period, and it cannot)
   */
  | { kind: 'crossing'; angleDeg: number; speedFactor?: number }
  /** like crossing, on an eccentric path with a radial velocity: a breakup fragment */
  | { kind: 'fragment'; angleDeg: number; speedFactor: number; radialKmS: number }
  /** primary velocity plus a small difference in the primary's RTN frame, km/s */
  | { kind: 'overtaking'; deltaRtnKmS: [number, number, number] };

export interface PlantSpec {
  readonly primary: ElementSet;
  readonly secondaryId: string;
  readonly secondaryName: string;
  readonly tca: Instant;
  readonly missKm: number;
  /** direction of the miss in the encounter plane: 0° toward the primary's radial, 90° across */
  readonly missAngleDeg: number;
  readonly geometry: Geometry;
  readonly fitEpoch: Instant;
  readonly bstar: number;
}

export interface Planted {
  readonly secondary: ElementSet;
  readonly relativeSpeedKmS: number;
  readonly approachAngleDeg: number;
}

/** Secondaries must stay well clear of the atmosphere for a week of SGP4 (design choice). */
export const MIN_SECONDARY_PERIGEE_ALT_KM = 200;

const dot = (a: readonly number[], b: readonly number[]): number => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
const cross = (a: readonly number[], b: readonly number[]): number[] =>
  [a[1]! * b[2]! - a[2]! * b[1]!, a[2]! * b[0]! - a[0]! * b[2]!, a[0]! * b[1]! - a[1]! * b[0]!];
const unit = (a: readonly number[]): number[] => { const n = Math.hypot(a[0]!, a[1]!, a[2]!); return a.map((x) => x / n); };
const combo = (...terms: [number, readonly number[]][]): number[] =>
  [0, 1, 2].map((j) => terms.reduce((s, [c, v]) => s + c * v[j]!, 0));

const DEG = Math.PI / 180;

/** Where a planted approach puts the two objects at TCA (TEME km, km/s). */
export interface PlantedStates {
  readonly primary: { readonly r: number[]; readonly v: number[] };
  readonly secondary: { readonly r: number[]; readonly v: number[] };
  readonly relativeSpeedKmS: number;
  readonly approachAngleDeg: number;
}

/**
 * The states of a planted approach at TCA, before any fit: the primary's SGP4 state and the
 * secondary offset by the miss vector perpendicular to the relative velocity. Also what a
 * synthetic CDM reports.
 */
export function plantStates(spec: Pick<PlantSpec, 'primary' | 'tca' | 'missKm' | 'missAngleDeg' | 'geometry'>): PlantedStates {
  const buf = new Float64Array(6);
  const failure = new Sgp4Trajectory(spec.primary).stateInto(spec.tca, buf, 0);
  if (failure) throw new KeepclearError('INTERNAL', `planting near ${spec.primary.objectId}: ${failure}`);
  const r1 = [buf[0]!, buf[1]!, buf[2]!], v1 = [buf[3]!, buf[4]!, buf[5]!];
  const R = unit(r1), N = unit(cross(r1, v1)), T = cross(N, R);
  const vCirc = Math.sqrt(MU / Math.hypot(r1[0]!, r1[1]!, r1[2]!));

  const g = spec.geometry;
  let v2: number[];
  if (g.kind === 'overtaking') {
    v2 = combo([1, v1], [g.deltaRtnKmS[0], R], [g.deltaRtnKmS[1], T], [g.deltaRtnKmS[2], N]);
  } else {
    const c = Math.cos(g.angleDeg * DEG), s = Math.sin(g.angleDeg * DEG);
    const speed = vCirc * (g.speedFactor ?? 1);
    const radial = g.kind === 'fragment' ? g.radialKmS : 0;
    v2 = combo([speed * c, T], [speed * s, N], [radial, R]);
  }

  const vRel = combo([1, v2], [-1, v1]);
  const relSpeed = Math.hypot(vRel[0]!, vRel[1]!, vRel[2]!);
  const w = unit(vRel);
  // Encounter-plane basis: e1 the radial direction with its along-vRel part removed, e2 across.
  const e1 = unit(combo([1, R], [-dot(R, w), w]));
  const e2 = cross(w, e1);
  const phi = spec.missAngleDeg * DEG;
  const r2 = combo([1, r1], [spec.missKm * Math.cos(phi), e1], [spec.missKm * Math.sin(phi), e2]);
  const cosAngle = dot(v1, v2) / (Math.hypot(v1[0]!, v1[1]!, v1[2]!) * Math.hypot(v2[0]!, v2[1]!, v2[2]!));
  return {
    primary: { r: r1, v: v1 },
    secondary: { r: r2, v: v2 },
    relativeSpeedKmS: relSpeed,
    approachAngleDeg: Math.acos(Math.max(-1, Math.min(1, cosAngle))) / DEG,
  };
}

export function plantEncounter(spec: PlantSpec): Planted {
  const states = plantStates(spec);
  const secondary = fitElementSetToState(states.secondary, spec.tca, {
    objectId: spec.secondaryId,
    name: spec.secondaryName,
    epoch: spec.fitEpoch,
    bstar: spec.bstar,
  });
  const perigeeAlt = semiMajorAxisKm(secondary.meanMotionRevPerDay) * (1 - secondary.eccentricity) - RE;
  if (perigeeAlt < MIN_SECONDARY_PERIGEE_ALT_KM)
    throw new KeepclearError('INTERNAL', `planted secondary ${spec.secondaryId} has perigee at ${perigeeAlt.toFixed(0)} km`);
  return { secondary, relativeSpeedKmS: states.relativeSpeedKmS, approachAngleDeg: states.approachAngleDeg };
}
