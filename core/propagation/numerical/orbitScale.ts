/**
 * Two-body quantities of a state that size grids and windows: period, and the fastest angular
 * rate along the orbit (at perigee), so that eccentric orbits get a grid fine enough where they
 * move fastest.
 */
import { KeepclearError } from '../../errors.js';

export interface OrbitScale {
  readonly semiMajorAxisKm: number;
  readonly eccentricity: number;
  readonly periodS: number;
  /** angular rate at perigee, rad/s */
  readonly maxAngularRateRadS: number;
}

export function orbitScale(state: ArrayLike<number>, mu: number): OrbitScale {
  const x = state[0]!, y = state[1]!, z = state[2]!, vx = state[3]!, vy = state[4]!, vz = state[5]!;
  const r = Math.hypot(x, y, z);
  const v2 = vx * vx + vy * vy + vz * vz;
  const inv = 2 / r - v2 / mu;
  if (!(inv > 0))
    throw new KeepclearError('PROPAGATION_FAILED', `state is not on a closed orbit (r = ${r.toFixed(3)} km, v = ${Math.sqrt(v2).toFixed(6)} km/s)`);
  const a = 1 / inv;
  const hx = y * vz - z * vy, hy = z * vx - x * vz, hz = x * vy - y * vx;
  const h = Math.hypot(hx, hy, hz);
  const e = Math.sqrt(Math.max(0, 1 - (h * h) / (mu * a)));
  const rp = a * (1 - e);
  return {
    semiMajorAxisKm: a,
    eccentricity: e,
    periodS: 2 * Math.PI * Math.sqrt((a * a * a) / mu),
    maxAngularRateRadS: h / (rp * rp),
  };
}

/** Node spacing (s): `nodesPerRevolution` nodes per 2π of the fastest (perigee) angular motion. */
export const nodeSpacingS = (scale: OrbitScale, nodesPerRevolution: number): number =>
  (2 * Math.PI) / nodesPerRevolution / scale.maxAngularRateRadS;
