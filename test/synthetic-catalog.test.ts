import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { ElementSet } from '../core/elements/elementSet.js';
import { makeSatrec, Sgp4Trajectory } from '../core/propagation/sgp4.js';
import { generateCatalog, POPULATION_SHARES } from '../core/synthetic/catalog.js';
import { MS_PER_DAY, parseIso, type Instant } from '../core/time/instant.js';
import { MU_EARTH_WGS72, R_EARTH_WGS72 } from '../core/units.js';

const EPOCH = parseIso('2026-12-07T00:00:00.000Z')!;
const J2 = 0.001082616; // WGS-72, Spacetrack Report #3 (the value SGP4 uses)
const RE = R_EARTH_WGS72 as number;

/** Semi-major axis (km) of a mean motion, Kepler's third law, written out here on purpose. */
const aOf = (es: ElementSet): number => {
  const n = (es.meanMotionRevPerDay * 2 * Math.PI) / 86_400;
  return Math.cbrt(MU_EARTH_WGS72 / (n * n));
};
const family = (cat: ElementSet[], prefix: string): ElementSet[] => cat.filter((e) => e.name?.startsWith(prefix));

describe('synthetic catalogue: determinism', () => {
  it('same seed gives the same catalogue byte for byte; another seed a different one', () => {
    const a = JSON.stringify(generateCatalog({ size: 2000, seed: 3, epoch: EPOCH }));
    const b = JSON.stringify(generateCatalog({ size: 2000, seed: 3, epoch: EPOCH }));
    const c = JSON.stringify(generateCatalog({ size: 2000, seed: 4, epoch: EPOCH }));
    expect(a).toBe(b);
    expect(c).not.toBe(a);
  });

  it('is frozen: the seed-1 catalogue keeps its fingerprint (benchmarks compare across runs)', () => {
    // If this changes on purpose, update the hash and say so in the commit: benchmark numbers
    // from before the change are then not comparable. (Changed once for the field rename
    // meanMotion → meanMotionRevPerDay: same values, the JSON key differs.)
    const text = JSON.stringify(generateCatalog({ size: 1000, seed: 1, epoch: EPOCH }));
    expect(createHash('sha256').update(text).digest('hex')).toBe(
      'a9c8e880c515972d8fb093adf4f928fa0017cce911c70c3bebf1abff068a418d',
    );
  });
});

describe('synthetic catalogue: shape', () => {
  const cat = generateCatalog({ size: 30_000, seed: 1, epoch: EPOCH });

  it('has the asked size, unique consecutive numeric ids, epochs in the 3 days before', () => {
    expect(cat).toHaveLength(30_000);
    expect(new Set(cat.map((e) => e.objectId)).size).toBe(30_000);
    expect(cat[0]!.objectId).toBe('1');
    expect(cat[29_999]!.objectId).toBe('30000');
    // 108 ms slack: epochs are floored to whole 108 ms steps (TLE-exact), never past the reference.
    const outside = cat.filter((e) => e.epoch > EPOCH || e.epoch < EPOCH - 3 * MS_PER_DAY - 108);
    expect(outside.map((e) => e.objectId)).toEqual([]);
    const numeric = ['meanMotionRevPerDay', 'eccentricity', 'inclinationDeg', 'raanDeg', 'argPerigeeDeg', 'meanAnomalyDeg', 'bstar', 'meanMotionDot'] as const;
    const notFinite = cat.filter((e) => numeric.some((k) => !Number.isFinite(e[k])));
    expect(notFinite.map((e) => e.objectId)).toEqual([]);
    // Element-set ages spread over the window rather than sitting at one instant.
    const ages = cat.map((e) => (EPOCH - e.epoch) / MS_PER_DAY);
    expect(ages.filter((x) => x < 1).length / ages.length).toBeGreaterThan(0.5);
    expect(ages.filter((x) => x > 2).length).toBeGreaterThan(300);
  });

  it('every set initialises in SGP4 at its epoch, and decays within the week are rare', () => {
    const out = new Float64Array(6);
    let decayed = 0;
    const weekLater = (EPOCH + 7 * MS_PER_DAY) as Instant;
    const failures: string[] = [];
    for (const es of cat) {
      const tr = new Sgp4Trajectory(es);
      const failure = tr.initFailure ?? tr.stateInto(es.epoch, out, 0);
      if (failure) failures.push(`${es.objectId} ${es.name}: ${failure}`);
      else if (tr.stateInto(weekLater, out, 0) !== null) decayed++;
    }
    expect(failures).toEqual([]);
    // Rare: under 0.5 % (design choice; a few very low fragments may re-enter in a real week).
    expect(decayed).toBeLessThan(150);
  });

  it('families appear in the documented shares (±1 percentage point)', () => {
    const counts = {
      constellation: family(cat, 'SKEIN-').length,
      sunSync: family(cat, 'EO-SAT').length,
      debris: family(cat, 'BREAKUP').length,
      leoScatter: family(cat, 'OBJECT').length,
      meo: family(cat, 'NAV').length,
      geo: family(cat, 'GEO').length,
      eccentric: family(cat, 'GTO').length + family(cat, 'HEO').length,
    };
    for (const [name, share] of Object.entries(POPULATION_SHARES))
      expect(Math.abs(counts[name as keyof typeof counts] / cat.length - share), name).toBeLessThan(0.01);
  });

  it('constellation shell: 530–575 km, near-circular, mostly at 53°', () => {
    const shell = family(cat, 'SKEIN-');
    for (const e of shell) {
      const a = aOf(e);
      expect(a * (1 - e.eccentricity) - RE).toBeGreaterThan(530);
      expect(a * (1 + e.eccentricity) - RE).toBeLessThan(575);
    }
    const at53 = shell.filter((e) => Math.abs(e.inclinationDeg - 53.1) < 0.3).length;
    expect(at53 / shell.length).toBeGreaterThan(0.75);
  });

  it('constellation planes stay evenly phased at the reference time despite different epochs', () => {
    // Plane 00 of shell 1: 41 satellites 8.8° (≈ 1060 km) apart when phased correctly. A phasing
    // error from moving epochs would bring neighbours together.
    const plane = family(cat, 'SKEIN-100');
    expect(plane.length).toBeGreaterThan(30);
    const out = new Float64Array(6);
    const pos = plane.map((e) => {
      expect(new Sgp4Trajectory(e).stateInto(EPOCH, out, 0)).toBeNull();
      return [out[0]!, out[1]!, out[2]!];
    });
    let closest = Infinity;
    for (let i = 0; i < pos.length; i++)
      for (let j = 0; j < i; j++)
        closest = Math.min(closest, Math.hypot(pos[i]![0]! - pos[j]![0]!, pos[i]![1]! - pos[j]![1]!, pos[i]![2]! - pos[j]![2]!));
    // Station-keeping noise (0.05° ≈ 6 km) and a week's drift are far smaller than the spacing.
    expect(closest).toBeGreaterThan(800);
  });

  it('sun-synchronous sets: J2 nodal rate equals the sun’s 360°/365.2422 d (independently of the generator)', () => {
    const sso = family(cat, 'EO-SAT');
    const sunRate = (2 * Math.PI) / (365.2422 * 86_400); // rad/s, tropical year
    for (const e of sso) {
      const a = aOf(e);
      expect(a - RE).toBeGreaterThan(495);
      expect(a - RE).toBeLessThan(805);
      const p = a * (1 - e.eccentricity ** 2);
      const n = Math.sqrt(MU_EARTH_WGS72 / a ** 3);
      // Standard first-order J2 nodal regression (Vallado, Fundamentals of Astrodynamics §9.6).
      const nodal = -1.5 * n * J2 * (RE / p) ** 2 * Math.cos((e.inclinationDeg * Math.PI) / 180);
      // 1e-4 relative: the inclination is stored to 1e-4°, worth ~2e-5 of the rate near 98°.
      expect(Math.abs(nodal / sunRate - 1)).toBeLessThan(1e-4);
      // SGP4's own secular node rate (rad/min; adds J4 and its own mean-motion recovery) agrees
      // to well under 1 %: the orbits really are sun-synchronous in the propagator used.
      expect(Math.abs(makeSatrec(e).nodedot / 60 / sunRate - 1)).toBeLessThan(0.005);
    }
  });

  it('GEO: controlled satellites sit at a ≈ 42,164 km (one sidereal day by Kepler III)', () => {
    const geo = family(cat, 'GEOCOM');
    expect(geo.length).toBeGreaterThan(500);
    // Outside fact: the geostationary radius, 42,164 km (e.g. Vallado, Fundamentals of
    // Astrodynamics). ±3 km allows the drawn 1 km (1σ) station-keeping spread.
    for (const e of geo) {
      expect(Math.abs(aOf(e) - 42_164)).toBeLessThan(5);
      expect(e.inclinationDeg).toBeLessThan(0.2);
      expect(e.meanMotionRevPerDay).toBeCloseTo(1.0027, 3); // rev/day: one sidereal day
    }
    const median = geo.map(aOf).sort((x, y) => x - y)[geo.length >> 1]!;
    expect(Math.abs(median - 42_164)).toBeLessThan(0.5);
  });

  it('MEO navigation: the main system at ~20,200 km altitude and 55°; all MEO in 18,000–24,500 km', () => {
    const nav = family(cat, 'NAVSET 1-');
    expect(nav.length).toBeGreaterThan(100);
    for (const e of nav) {
      expect(Math.abs(aOf(e) - RE - 20_200)).toBeLessThan(20); // common-practice altitude
      expect(Math.abs(e.inclinationDeg - 55)).toBeLessThan(3);
    }
    for (const e of family(cat, 'NAV')) {
      expect(aOf(e) - RE).toBeGreaterThan(17_500);
      expect(aOf(e) - RE).toBeLessThan(24_500);
    }
  });

  it('GTO and Molniya-like HEO: low perigee, high apogee, 63.4° and 12 h for HEO', () => {
    for (const e of family(cat, 'GTO')) {
      const a = aOf(e);
      expect(a * (1 - e.eccentricity) - RE).toBeGreaterThan(195);
      expect(a * (1 - e.eccentricity) - RE).toBeLessThan(605);
      expect(Math.abs(a * (1 + e.eccentricity) - RE - 35_786)).toBeLessThan(600);
    }
    for (const e of family(cat, 'HEO')) {
      expect(Math.abs(e.inclinationDeg - 63.4)).toBeLessThan(1.5);
      expect(Math.abs(e.meanMotionRevPerDay - 2.0055)).toBeLessThan(0.001); // two revolutions per sidereal day
    }
  });

  it('debris clouds: fragments of one breakup share an inclination band, spread in a and e, higher B*', () => {
    const cloud = family(cat, 'BREAKUP 5 ');
    expect(cloud.length).toBeGreaterThan(500);
    const incs = cloud.map((e) => e.inclinationDeg);
    // Δv of tens of m/s tilts the plane by ≲ 1°.
    expect(Math.max(...incs) - Math.min(...incs)).toBeLessThan(3);
    const alts = cloud.map((e) => aOf(e) - RE);
    expect(Math.max(...alts) - Math.min(...alts)).toBeGreaterThan(50);
    const median = (xs: number[]): number => xs.sort((x, y) => x - y)[xs.length >> 1]!;
    const intactNear = family(cat, 'EO-SAT').filter((e) => Math.abs(aOf(e) - RE - 660) < 60);
    expect(median(cloud.map((e) => e.bstar))).toBeGreaterThan(2 * median(intactNear.map((e) => e.bstar)));
  });
});

describe('synthetic catalogue: scale', () => {
  it('generates 100,000 objects quickly, with catalogue numbers beyond 99,999', () => {
    const t0 = performance.now();
    const cat = generateCatalog({ size: 100_000, seed: 2, epoch: EPOCH });
    const seconds = (performance.now() - t0) / 1000;
    expect(cat).toHaveLength(100_000);
    expect(cat[99_999]!.objectId).toBe('100000');
    // Budget: "a few seconds" on a 2-core machine; 15 s leaves room for a loaded test runner.
    expect(seconds).toBeLessThan(15);
  });

  it('rejects nonsense sizes', () => {
    expect(() => generateCatalog({ size: -1, epoch: EPOCH })).toThrow(/size/);
    expect(() => generateCatalog({ size: 1.5, epoch: EPOCH })).toThrow(/size/);
    expect(generateCatalog({ size: 0, epoch: EPOCH })).toEqual([]);
    expect(generateCatalog({ size: 5, epoch: EPOCH })).toHaveLength(5);
  });
});
