/**
 * Propellant for a burn by the rocket equation (Tsiolkovsky): m_p = m₀·(1 − e^(−Δv/(Isp·g₀))),
 * g₀ = 9.80665 m/s² (standard gravity, core/units.ts G0). Mass and Isp are the operator's own
 * spacecraft data; there is no default, a missing value is an error.
 */
import { KeepclearError } from '../errors.js';
import { G0 } from '../units.js';

export interface SpacecraftPropulsion {
  /** wet mass before the burn, kg */
  readonly massKg: number | null | undefined;
  /** specific impulse of the thruster, s */
  readonly ispS: number | null | undefined;
}

/** Throws SPACECRAFT_PARAMETER_MISSING naming what is missing or unusable. */
export function checkPropulsion(sc: SpacecraftPropulsion, objectId: string): { massKg: number; ispS: number } {
  const missing: string[] = [];
  if (!(typeof sc.massKg === 'number' && sc.massKg > 0 && Number.isFinite(sc.massKg))) missing.push(`mass (${sc.massKg ?? 'not set'})`);
  if (!(typeof sc.ispS === 'number' && sc.ispS > 0 && Number.isFinite(sc.ispS))) missing.push(`Isp (${sc.ispS ?? 'not set'})`);
  if (missing.length > 0)
    throw new KeepclearError(
      'SPACECRAFT_PARAMETER_MISSING',
      `spacecraft ${objectId}: ${missing.join(' and ')} missing or not positive — set the spacecraft's ` +
        'mass (kg) and thruster Isp (s) before planning; Keepclear uses no default for propellant',
    );
  return { massKg: sc.massKg as number, ispS: sc.ispS as number };
}

/** Propellant mass (kg) for Δv (m/s). */
export function propellantKg(deltaVMs: number, sc: SpacecraftPropulsion, objectId = 'primary'): number {
  const { massKg, ispS } = checkPropulsion(sc, objectId);
  if (!(deltaVMs >= 0)) throw new KeepclearError('BAD_ARGUMENT', `Δv must be ≥ 0 m/s, got ${deltaVMs}`);
  return massKg * -Math.expm1(-deltaVMs / (ispS * G0));
}
