/**
 * Propellant by the rocket equation m_p = m₀(1 − e^(−Δv/(Isp·g₀))), g₀ = 9.80665 m/s² (standard
 * gravity, 3rd CGPM 1901). Hand value: m₀ = 100 kg, Isp = 220 s, Δv = 1 m/s:
 * Δv/(Isp·g₀) = 1/2157.463 = 4.635075e-4; 1 − e^(−x) = x − x²/2 + x³/6 = 4.635075e-4 − 1.0742e-7
 * + 1.7e-11 = 4.634000e-4; m_p = 0.04634000 kg.
 */
import { describe, expect, it } from 'vitest';
import { KeepclearError } from '../core/errors.js';
import { propellantKg } from '../core/manoeuvre/propellant.js';

/** The hand value carries 7 significant digits: 1e-8 kg. */
const HAND_TOL_KG = 1e-8;

describe('rocket equation', () => {
  it('100 kg, 220 s, 1 m/s → 0.0463 kg (hand value 0.04634000 kg)', () => {
    expect(Math.abs(propellantKg(1, { massKg: 100, ispS: 220 }) - 0.04634)).toBeLessThan(HAND_TOL_KG);
  });
  it('zero Δv costs nothing', () => {
    expect(propellantKg(0, { massKg: 100, ispS: 220 })).toBe(0);
  });
  it('missing or unusable mass or Isp is a typed error naming what is missing, with no default', () => {
    for (const sc of [{ massKg: null, ispS: 220 }, { massKg: 100, ispS: undefined }, { massKg: 0, ispS: 220 }, { massKg: 100, ispS: -5 }]) {
      let caught: unknown;
      try {
        propellantKg(1, sc, '80001');
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(KeepclearError);
      expect((caught as KeepclearError).code).toBe('SPACECRAFT_PARAMETER_MISSING');
      expect((caught as KeepclearError).message).toMatch(/80001/);
      expect((caught as KeepclearError).message).toMatch(sc.massKg === 100 ? /Isp/ : /mass/);
    }
  });
});
