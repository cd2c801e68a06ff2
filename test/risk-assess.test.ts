import { describe, expect, it } from 'vitest';
import { assessEncounter } from '../core/risk/assess.js';
import { cdmRtnFromLowerTriangle } from '../core/risk/covarianceCdm.js';
import { DEFAULT_HBR_PER_OBJECT_M, hbrFromAreaM, combinedHbr } from '../core/risk/hardBody.js';
import { pcMax } from '../core/risk/pcMax.js';
import { TIERS, tierFor } from '../core/risk/tiers.js';
import type { Encounter } from '../core/events/index.js';
import { parseIso } from '../core/time/instant.js';

const tca = parseIso('2026-03-02T12:00:00Z')!;
// Head-on-ish LEO geometry: primary +y, secondary +z, 200 m apart along x (miss 200 m).
const encounter: Encounter = {
  primary: '1', secondary: '2', tca, missKm: 0.2, relativeSpeedKmS: 10.6, rtnKm: [0.2, 0, 0], approachAngleDeg: 90,
  entry: null, exit: null,
  primaryState: [7000, 0, 0, 0, 7.5, 0],
  secondaryState: [7000.2, 0, 0, 0, 0, 7.5],
  primaryEpoch: parseIso('2026-03-01T12:00:00Z')!,
  secondaryEpoch: parseIso('2026-03-01T12:00:00Z')!,
};
const diagCdm = (r: number, t: number, n: number) =>
  cdmRtnFromLowerTriangle([r * r, 0, t * t, 0, 0, n * n, ...new Array<number>(15).fill(0)]);

describe('hard-body radius', () => {
  it('AREA_PC → √(A/π), sum of both, documented default', () => {
    expect(hbrFromAreaM(Math.PI * 4)).toBeCloseTo(2, 12);
    expect(combinedHbr(3, 4).radiusM).toBe(7);
    expect(combinedHbr(undefined, 4).radiusM).toBe(DEFAULT_HBR_PER_OBJECT_M + 4);
  });
});

describe('tiers (defaults: Pc 1e-4 / 1e-7, common practice per NASA/SP-20205011318, 2020)', () => {
  it('grades by Pc, and by miss distance when Pc is null', () => {
    expect(tierFor(2e-4, 10)).toBe('plan');
    expect(tierFor(1e-5, 0.01)).toBe('monitor');
    expect(tierFor(1e-9, 0.01)).toBe('routine');
    expect(tierFor(null, 0.5)).toBe('plan');
    expect(tierFor(null, 3)).toBe('monitor');
    expect(tierFor(null, 50)).toBe('routine');
    expect(tierFor(1e-5, 1, { pcPlan: 1e-5, pcMonitor: 1e-8, missPlanKm: 1, missMonitorKm: 5 })).toBe('plan');
    expect(new Set(Object.values(TIERS).map((t) => t.colour)).size).toBe(3);
  });
});

describe('assessEncounter: covariance precedence and Pc method', () => {
  it('CDM for the primary, default table for the secondary', () => {
    const a = assessEncounter(encounter, {
      primary: { cdmRtnM2: diagCdm(50, 200, 80), regime: 'LEO' },
      secondary: { regime: 'LEO' },
      hbrPrimaryM: 5, hbrSecondaryM: 5,
    });
    expect(a.pcMethod).toBe('2d-reference');
    expect(a.covarianceSource).toBe('cdm / default(LEO, age 1.0 d)');
    expect(a.hardBodyRadiusM).toBe(10);
    expect(a.pc).toBeGreaterThan(0);
    expect(a.pc).toBeLessThan(1);
    expect(a.warnings).toHaveLength(0);
  });
  it('fast method on request gives the same Pc within its bound', () => {
    const inputs = { primary: { cdmRtnM2: diagCdm(50, 200, 80) }, secondary: { cdmRtnM2: diagCdm(60, 300, 90) }, hbrPrimaryM: 5, hbrSecondaryM: 5 };
    const ref = assessEncounter(encounter, inputs);
    const fast = assessEncounter(encounter, { ...inputs, method: 'fast' });
    expect(fast.pcMethod).toBe('2d-fast');
    expect(Math.abs(fast.pc! / ref.pc! - 1)).toBeLessThan(1e-8);
  });
  it('no covariance at all: maximum Pc, isotropic, flagged as an upper bound', () => {
    const a = assessEncounter(encounter, { primary: {}, secondary: { regime: 'LEO' }, hbrPrimaryM: 5, hbrSecondaryM: 5 });
    expect(a.pcMethod).toBe('max-pc (no covariance)');
    // R²/(e·d²) for R = 10 m, d = 200 m (Alfano 2005, small R/d) to leading order
    expect(Math.abs(a.pc! / (100 / (Math.E * 40000)) - 1)).toBeLessThan(1e-2);
    expect(a.pc).toBeCloseTo(pcMax([200, 0], null, 10).pc, 12);
    expect(a.warnings.join(' ')).toMatch(/upper bound/);
  });
  it('doubtful CDM covariance (clearly indefinite) falls back to maximum Pc', () => {
    const bad = cdmRtnFromLowerTriangle([100, 500, 100, 0, 0, 100, ...new Array<number>(15).fill(0)]);
    const a = assessEncounter(encounter, { primary: { cdmRtnM2: bad }, secondary: { regime: 'LEO' } });
    expect(a.pcMethod).toBe('max-pc (doubtful covariance)');
    expect(a.warnings.join(' ')).toMatch(/covariance is not positive semi-definite/);
    expect(a.warnings.join(' ')).toMatch(/hard-body radius default/);
  });
});

describe('assessEncounter keeps the numbers behind the Pc (risk.detail)', () => {
  // Closed form (rotation invariance): an isotropic covariance σ²I stays σ²I in any axes, so two
  // isotropic objects give a plane covariance (σp² + σs²)·I₂ and σ along the relative velocity
  // √(σp² + σs²), whatever the geometry. Tolerance: rounding of the 3-D rotations, 1e-9 relative.
  const REL = 1e-9;
  it('isotropic covariances: plane covariance and σ along the relative velocity in closed form', () => {
    const a = assessEncounter(encounter, {
      primary: { cdmRtnM2: diagCdm(30, 30, 30) },
      secondary: { cdmRtnM2: diagCdm(40, 40, 40) },
      hbrPrimaryM: 5, hbrSecondaryM: 5,
    });
    const d = a.detail!;
    expect(Math.abs(d.planeCovM2![0][0] / 2500 - 1)).toBeLessThan(REL);
    expect(Math.abs(d.planeCovM2![1][1] / 2500 - 1)).toBeLessThan(REL);
    expect(Math.abs(d.planeCovM2![0][1]) / 2500).toBeLessThan(REL);
    expect(Math.abs(d.sigmaAlongVelocityM! / 50 - 1)).toBeLessThan(REL);
    // The states sit at TCA (relative position ⟂ relative velocity): the whole 200 m miss lies
    // along the plane's x axis.
    expect(Math.abs(d.planeMissM[0] - 200)).toBeLessThan(1e-9 * 200);
    expect(d.planeMissM[1]).toBe(0);
    expect(d.primaryCovRtnM2![1]![1]).toBeCloseTo(900, 9);
    expect(d.secondaryCovRtnM2![2]![2]).toBeCloseTo(1600, 9);
  });
  it('without a covariance for one object: no plane covariance, the other one kept', () => {
    const a = assessEncounter(encounter, { primary: { cdmRtnM2: diagCdm(30, 30, 30) }, secondary: {} });
    expect(a.detail!.planeCovM2).toBeNull();
    expect(a.detail!.sigmaAlongVelocityM).toBeNull();
    expect(a.detail!.secondaryCovRtnM2).toBeNull();
    expect(a.detail!.primaryCovRtnM2![0]![0]).toBeCloseTo(900, 9);
  });
});
