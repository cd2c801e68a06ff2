/**
 * The series TCA tolerance τ = clamp((K·√(σa²+σb²) + δage)/v_rel, 1 s, P/4) against values
 * computed by hand (the arithmetic is written beside each case; constants: K = 5, default-table
 * LEO along-track σ 500 m at epoch growing 1000 m/day — core/risk/defaultCovarianceTable.ts,
 * "common practice / from memory" — and the period of a circular orbit 2π√(r³/μ) with WGS-72
 * μ = 398600.8 km³/s², Vallado et al. 2006).
 */
import { describe, expect, it } from 'vitest';
import { sightingView, tcaTolerance, type SeriesMember } from '../core/events/index.js';
import { angleForRelativeSpeedDeg, PERIOD_LEO_S, sighting } from './support/sightings.js';

/** Hand values are given to 1e-9 s; the code computes the same closed forms in doubles. */
const S_TOL = 1e-6; // s

const view = (m: SeriesMember) => sightingView(m.event, m.source.createdAt);

/** Week-2 and week-3 sightings of one LEO pair (550 km, circular): TCA 8 Dec 00:00. */
function pair(vRelKmS: number, sigmaA?: number, sigmaB?: number): [SeriesMember, SeriesMember] {
  const angleDeg = angleForRelativeSpeedDeg(vRelKmS);
  const common = { primary: '100001', secondary: '330001', tca: '2026-12-08T00:00:00Z', angleDeg };
  // Element sets one day older than each run: prediction spans 9 d and 2 d, 7 days apart.
  const a = sighting({ ...common, id: 'a', source: 'R2', createdAt: '2026-11-30T00:00:00Z', ...(sigmaA !== undefined ? { sigmaAlongM: sigmaA } : {}) });
  const b = sighting({ ...common, id: 'b', source: 'R3', createdAt: '2026-12-07T00:00:00Z', ...(sigmaB !== undefined ? { sigmaAlongM: sigmaB } : {}) });
  return [a, b];
}

describe('series TCA tolerance (hand-computed)', () => {
  it('typical LEO crossing, 10 km/s, σ 300 m and 400 m from the risk detail', () => {
    // uncertainty: 5·√(300²+400²) m / 10 000 m/s = 5·500/10000 = 0.25 s
    // age: spans 9 d and 2 d for both objects: √((1000·7)² + (1000·7)²) = 9899.494937 m → 0.9899494937 s
    const [a, b] = pair(10, 300, 400);
    const t = tcaTolerance(view(a), view(b));
    expect(t.uncertaintyS).toBeCloseTo(0.25, 9);
    expect(t.ageS).toBeCloseTo(0.9899494937, 9);
    expect(Math.abs(t.seconds - 1.2399494937)).toBeLessThan(S_TOL);
    expect(t.limitedBy).toBe('uncertainty');
  });

  it('slow same-shell encounter, 30 m/s, σ 800 m and 300 m: minutes, not seconds', () => {
    // (5·√(800²+300²) + 9899.494937) / 30 = (5·854.400375 + 9899.494937)/30 = 472.383227 s
    const [a, b] = pair(0.03, 800, 300);
    const t = tcaTolerance(view(a), view(b));
    expect(Math.abs(t.seconds - 472.383226976)).toBeLessThan(S_TOL);
    expect(t.seconds).toBeLessThan(PERIOD_LEO_S / 4);
  });

  it('no covariance kept: σ falls back to the default table by prediction age, and the cap binds', () => {
    // σ(9 d) = √2·√(500² + 9000²) = 12747.548784 m; σ(2 d) = √2·√(500² + 2000²) = 2915.475947 m
    // raw = (5·√(12747.548784² + 2915.475947²) + 9899.494937) / 20 = 3764.148954 s
    // cap = ¼·2π√(6928³/398600.8) = 1434.705002 s
    const [a, b] = pair(0.02);
    const va = view(a), vb = view(b);
    expect(va.sigmaFromRisk).toBe(false);
    expect(va.sigmaAlongM).toBeCloseTo(12747.548784, 5);
    expect(vb.sigmaAlongM).toBeCloseTo(2915.475947, 5);
    const t = tcaTolerance(va, vb);
    expect(t.uncertaintyS + t.ageS).toBeCloseTo(3764.148954, 5);
    expect(Math.abs(t.capS - 1434.705002316)).toBeLessThan(S_TOL);
    expect(t.seconds).toBe(t.capS);
    expect(t.limitedBy).toBe('cap');
  });

  it('two sources from data of the same age with small σ: the 1 s floor', () => {
    // 5·√(100²+100²)/14 000 = 0.050508 s, no age term → floor 1 s
    const angleDeg = angleForRelativeSpeedDeg(14);
    const common = { primary: '100002', secondary: '330009', tca: '2026-12-09T12:00:00Z', angleDeg, createdAt: '2026-12-07T00:00:00Z' };
    const a = sighting({ ...common, id: 'a', source: 'R3', sigmaAlongM: 100 });
    const b = sighting({ ...common, id: 'b', source: 'M1', kind: 'cdm', sigmaAlongM: 100 });
    const t = tcaTolerance(view(a), view(b));
    expect(t.uncertaintyS).toBeCloseTo(0.0505076272, 9);
    expect(t.ageS).toBe(0);
    expect(t.seconds).toBe(1);
    expect(t.limitedBy).toBe('floor');
  });

  it('is symmetric, and does not depend on which object a source calls primary', () => {
    const [a, b] = pair(0.03, 800, 300);
    const swapped = sighting({
      id: 'c', source: 'M1', kind: 'cdm', createdAt: '2026-11-30T00:00:00Z', primary: '330001', secondary: '100001',
      tca: '2026-12-08T00:00:00Z', angleDeg: angleForRelativeSpeedDeg(0.03), sigmaAlongM: 800,
    });
    expect(tcaTolerance(view(a), view(b)).seconds).toBe(tcaTolerance(view(b), view(a)).seconds);
    expect(tcaTolerance(view(swapped), view(b)).seconds).toBeCloseTo(tcaTolerance(view(a), view(b)).seconds, 9);
  });
});
