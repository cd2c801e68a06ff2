/**
 * A received CDM as an encounter (core/events/fromCdm.ts): states converted from the message's
 * REF_FRAME to TEME by the typed entry point core/frames/toTeme.ts. The same physical state is
 * written into the message in each CDM frame (EME2000, GCRF, ITRF; the conversions are the ones
 * test/frames.test.ts checks against Skyfield 1.45); every version must give the same TEME state,
 * so a frame routed to the wrong conversion (ITRF and GCRF differ by Earth rotation: thousands of
 * km) fails here.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { encounterFromCdm } from '../core/events/fromCdm.js';
import { approachAngleDeg, relativeRtn } from '../core/events/geometry.js';
import * as screeningGeometry from '../core/screening/geometry.js';
import { parseCdmFile, type Cdm, type CdmObject, type CdmRefFrame } from '../core/formats/cdm/index.js';
import { gcrfToEme2000 } from '../core/frames/eme2000.js';
import { temeToGcrf, temeToItrf } from '../core/frames/teme.js';
import { stateIn } from '../core/frames/toTeme.js';
import type { StateVector } from '../core/units.js';

/** Rotations in doubles: |r| ≈ 7000 km, so the round trip agrees to ~1e-12 relative. */
const ROUND_TRIP_KM = 1e-8; // km
const ROUND_TRIP_KMS = 1e-11; // km/s

const cdm = parseCdmFile(readFileSync('test/fixtures/cdm/valid-6x6.kvn'), 'valid-6x6.kvn').cdm!;

function inFrame(base: Cdm, frame: CdmRefFrame, teme: StateVector<'TEME'>): Cdm {
  const t = base.relative.tca;
  const s: StateVector<CdmRefFrame> =
    frame === 'ITRF' ? temeToItrf(teme, t) : frame === 'GCRF' ? temeToGcrf(teme, t) : gcrfToEme2000(temeToGcrf(teme, t));
  const withState = (o: CdmObject): CdmObject => ({ ...o, metadata: { ...o.metadata, refFrame: frame }, state: { ...o.state, r: s.r, v: s.v } });
  return { ...base, object1: withState(base.object1) };
}

describe('encounterFromCdm', () => {
  const teme = stateIn('TEME', [-4200.5, 5100.2, 1800.7], [-3.1, -4.4, 5.2]);
  it.each(['EME2000', 'GCRF', 'ITRF'] as const)('a state given in %s comes back as the same TEME state', (frame) => {
    const p = encounterFromCdm(inFrame(cdm, frame, teme)).primaryState;
    for (let k = 0; k < 3; k++) {
      expect(Math.abs(p[k]! - teme.r[k]!), `r[${k}]`).toBeLessThan(ROUND_TRIP_KM);
      expect(Math.abs(p[k + 3]! - teme.v[k]!), `v[${k}]`).toBeLessThan(ROUND_TRIP_KMS);
    }
  });

  it('miss, relative speed and RTN follow from the two TEME states; ids are canonical', () => {
    const e = encounterFromCdm(cdm);
    const [p, s] = [e.primaryState, e.secondaryState];
    expect(e.missKm).toBeCloseTo(Math.hypot(s[0] - p[0], s[1] - p[1], s[2] - p[2]), 12);
    expect(Math.hypot(...e.rtnKm)).toBeCloseTo(e.missKm, 9);
    expect([e.primary, e.secondary]).toEqual(['12345', '30337']);
    // MISS_DISTANCE = 715 [m] in the message: the states give it to the metre it is written to
    expect(Math.abs(e.missKm - 0.715)).toBeLessThan(0.001);
  });

  it('relative geometry agrees with the copy screening still uses (to be merged into one)', () => {
    const e = encounterFromCdm(cdm);
    const ours = relativeRtn(e.primaryState, e.secondaryState);
    const theirs = screeningGeometry.relativeRtn(e.primaryState, e.secondaryState);
    for (let k = 0; k < 3; k++) expect(ours[k]).toBeCloseTo(theirs[k]!, 12);
    expect(approachAngleDeg(e.primaryState, e.secondaryState)).toBeCloseTo(screeningGeometry.approachAngleDeg(e.primaryState, e.secondaryState), 10);
  });
});
