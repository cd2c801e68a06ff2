/**
 * The example messages of CCSDS 508.0-B-1 (copies in test/authorities/ccsds-508, provenance in
 * its README). Every expected value below is typed from the text of the example file it checks.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseCdmFile, type Cdm, type CdmObject } from '../core/formats/cdm/index.js';
import { CDM_KEYWORDS, COV_TERMS } from '../core/formats/cdm/keywords.js';
import { parseIso } from '../core/time/instant.js';

const dir = new URL('./authorities/ccsds-508/', import.meta.url);
const read = (f: string) => readFileSync(new URL(f, dir));

/** Model value of a keyword, looked up through the keyword table. */
function valueOf(block: Record<string, unknown>, keyword: string): unknown {
  return block[CDM_KEYWORDS.get(keyword)!.prop];
}

/** Asserts keyword → expected (number, string, or ISO time written as in the example). */
function expectBlock(block: object, expected: Record<string, number | string>, times: string[] = []): void {
  for (const [kw, want] of Object.entries(expected)) {
    const got = valueOf(block as Record<string, unknown>, kw);
    if (times.includes(kw)) expect(got, kw).toBe(parseIso(want as string));
    else expect(got, kw).toBe(want);
  }
}

/** The 21 lower-triangle terms, in the example's order CR_R … CNDOT_NDOT. */
function expectCov(o: CdmObject, terms: number[]): void {
  COV_TERMS.slice(0, terms.length).forEach((t, k) => {
    expect(o.covariance.matrix[t.row]![t.col], t.keyword).toBe(terms[k]);
    expect(o.covariance.matrix[t.col]![t.row], `${t.keyword} mirrored`).toBe(terms[k]);
  });
}

const COV1 = [
  4.142e1, -8.579, 2.533e3, -2.313e1, 1.336e1, 7.098e1, 2.52e-3, -5.476, 8.626e-4, 5.744e-3, -1.006e-2,
  4.041e-3, -1.359e-3, -1.502e-5, 1.049e-5, 1.053e-3, -3.412e-3, 1.213e-2, -3.004e-6, -1.091e-6, 5.529e-5,
];
const COV2 = [
  1.337e3, -4.806e4, 2.492e6, -3.298e1, -7.5888e2, 7.105e1, 2.591e-3, -4.152e-2, -1.784e-6, 6.886e-5,
  -1.016e-2, -1.506e-4, 1.637e-3, -2.987e-6, 1.059e-5, 4.4e-3, 8.482e-3, 8.633e-5, -1.903e-6, -4.594e-6, 5.178e-5,
];

function expectStates(cdm: Cdm): void {
  expect([...cdm.object1.state.r]).toEqual([2570.097065, 2244.654904, 6281.497978]);
  expect([...cdm.object1.state.v]).toEqual([4.418769571, 4.833547743, -3.526774282]);
  expect([...cdm.object2.state.r]).toEqual([2569.5408, 2245.093614, 6281.599946]);
  expect([...cdm.object2.state.v]).toEqual([-2.8886125, -6.007247516, 3.328770172]);
  expectCov(cdm.object1, COV1);
  expectCov(cdm.object2, COV2);
}

describe('CCSDS 508.0-B-1 examples are refused by default: OBJECT1 covariance is not PSD', () => {
  for (const [file, line] of [['cdm-obligatory.kvn', 22], ['cdm-full.kvn', 79], ['cdm-example.xml', 97]] as const) {
    it(file, () => {
      const r = parseCdmFile(read(file), file);
      expect(r.cdm).toBeNull();
      expect(r.errors).toHaveLength(1);
      const e = r.errors[0]!;
      expect([e.code, e.file, e.line]).toEqual(['CDM_COVARIANCE', file, line]); // line of OBJECT1 CR_R
      // CRDOT_T / √(CT_T · CRDOT_RDOT) = −5.476 / √(2533 · 0.005744) = −1.436 (hand computation)
      expect(e.reason).toMatch(/OBJECT1 6×6 covariance is not positive semi-definite/);
      expect(e.reason).toMatch(/CRDOT_T = -5\.476 \[m\*\*2\/s\] implies correlation -1\.44 between T and RDOT/);
    });
  }
});

describe('obligatory-keywords KVN example, kept with flagged covariance', () => {
  const r = parseCdmFile(read('cdm-obligatory.kvn'), 'cdm-obligatory.kvn', { badCovariance: 'flag' });
  const cdm = r.cdm!;
  it('parses without errors', () => {
    expect(r.errors).toEqual([]);
    expect(cdm).not.toBeNull();
  });
  it('header and relative data', () => {
    expectBlock(cdm.header, {
      CCSDS_CDM_VERS: '1.0', CREATION_DATE: '2010-03-12T22:31:12.000', ORIGINATOR: 'JSPOC', MESSAGE_ID: '201113719185',
    }, ['CREATION_DATE']);
    expect(cdm.header.messageFor).toBeUndefined();
    expectBlock(cdm.relative, { TCA: '2010-03-13T22:37:52.618', MISS_DISTANCE: 715 }, ['TCA']);
    expect(cdm.relative.lines).toEqual({ TCA: 5, MISS_DISTANCE: 6 });
  });
  it('object metadata', () => {
    expectBlock(cdm.object1.metadata, {
      OBJECT: 'OBJECT1', OBJECT_DESIGNATOR: '12345', CATALOG_NAME: 'SATCAT', OBJECT_NAME: 'SATELLITE A',
      INTERNATIONAL_DESIGNATOR: '1997\u2212030E', EPHEMERIS_NAME: 'EPHEMERIS SATELLITE A',
      COVARIANCE_METHOD: 'CALCULATED', MANEUVERABLE: 'YES', REF_FRAME: 'EME2000',
    });
    expectBlock(cdm.object2.metadata, {
      OBJECT: 'OBJECT2', OBJECT_DESIGNATOR: '30337', CATALOG_NAME: 'SATCAT', OBJECT_NAME: 'FENGYUN 1C DEB',
      INTERNATIONAL_DESIGNATOR: '1999-025AA', EPHEMERIS_NAME: 'NONE', COVARIANCE_METHOD: 'CALCULATED',
      MANEUVERABLE: 'NO', REF_FRAME: 'EME2000',
    });
    expect(cdm.object2.metadata.lines['OBJECT']).toBe(43);
  });
  it('states and 6×6 covariances; OBJECT1 flagged, OBJECT2 PSD', () => {
    expectStates(cdm);
    expect(cdm.object1.covariance).toMatchObject({ dimension: 6, status: 'not-psd', usable: null });
    expect(cdm.object2.covariance).toMatchObject({ dimension: 6, status: 'psd' });
    expect(cdm.object2.covariance.usable).toEqual(cdm.object2.covariance.matrix);
    expect(r.repairs).toHaveLength(1);
    expect(r.repairs[0]).toMatch(/^cdm-obligatory\.kvn:22: OBJECT1 6×6 covariance is not positive semi-definite/);
  });
});

/** Values shared by the full KVN example and the XML example (identical in both texts). */
const RELATIVE_FULL = {
  TCA: '2010-03-13T22:37:52.618', MISS_DISTANCE: 715, RELATIVE_SPEED: 14762, RELATIVE_POSITION_R: 27.4,
  RELATIVE_POSITION_T: -70.2, RELATIVE_POSITION_N: 711.8, RELATIVE_VELOCITY_R: -7.2, RELATIVE_VELOCITY_T: -14692.0,
  RELATIVE_VELOCITY_N: -1437.2, START_SCREEN_PERIOD: '2010-03-12T18:29:32.212', STOP_SCREEN_PERIOD: '2010-03-15T18:29:32.212',
  SCREEN_VOLUME_FRAME: 'RTN', SCREEN_VOLUME_SHAPE: 'ELLIPSOID', SCREEN_VOLUME_X: 200, SCREEN_VOLUME_Y: 1000,
  SCREEN_VOLUME_Z: 1000, COLLISION_PROBABILITY: 4.835e-5, COLLISION_PROBABILITY_METHOD: 'FOSTER-1992',
};
const TIMES = ['CREATION_DATE', 'TCA', 'START_SCREEN_PERIOD', 'STOP_SCREEN_PERIOD', 'SCREEN_ENTRY_TIME', 'SCREEN_EXIT_TIME', 'TIME_LASTOB_START', 'TIME_LASTOB_END'];
const META1 = {
  OBJECT: 'OBJECT1', OBJECT_DESIGNATOR: '12345', CATALOG_NAME: 'SATCAT', OBJECT_NAME: 'SATELLITE A',
  INTERNATIONAL_DESIGNATOR: '1997-030E', OBJECT_TYPE: 'PAYLOAD', OPERATOR_CONTACT_POSITION: 'OSA',
  OPERATOR_ORGANIZATION: 'EUMETSAT', OPERATOR_PHONE: '+49615130312', EPHEMERIS_NAME: 'EPHEMERIS SATELLITE A',
  COVARIANCE_METHOD: 'CALCULATED', MANEUVERABLE: 'YES', REF_FRAME: 'EME2000', GRAVITY_MODEL: 'EGM-96: 36D 36O',
  ATMOSPHERIC_MODEL: 'JACCHIA 70 DCA', SOLAR_RAD_PRESSURE: 'NO', EARTH_TIDES: 'NO', INTRACK_THRUST: 'NO',
};
const META2 = {
  OBJECT: 'OBJECT2', OBJECT_DESIGNATOR: '30337', CATALOG_NAME: 'SATCAT', OBJECT_NAME: 'FENGYUN 1C DEB',
  INTERNATIONAL_DESIGNATOR: '1999-025AA', OBJECT_TYPE: 'DEBRIS', EPHEMERIS_NAME: 'NONE', COVARIANCE_METHOD: 'CALCULATED',
  MANEUVERABLE: 'NO', REF_FRAME: 'EME2000', GRAVITY_MODEL: 'EGM-96: 36D 36O', ATMOSPHERIC_MODEL: 'JACCHIA 70 DCA',
  SOLAR_RAD_PRESSURE: 'YES', EARTH_TIDES: 'NO', INTRACK_THRUST: 'NO',
};
const OD2 = {
  TIME_LASTOB_START: '2010-03-12T01:14:12.746', TIME_LASTOB_END: '2010-03-12T03:14:12.746', RECOMMENDED_OD_SPAN: 2.63,
  ACTUAL_OD_SPAN: 2.63, OBS_AVAILABLE: 59, OBS_USED: 58, TRACKS_AVAILABLE: 15, TRACKS_USED: 15, RESIDUALS_ACCEPTED: 97.8,
  WEIGHTED_RMS: 0.864,
};
const ADD2 = { AREA_PC: 0.9, CD_AREA_OVER_MASS: 0.118668, CR_AREA_OVER_MASS: 0.075204, THRUST_ACCELERATION: 0.0, SEDR: 5.409e-3 };

describe('full KVN example (optional keywords, 8×8 covariance), kept with flagged covariance', () => {
  const r = parseCdmFile(read('cdm-full.kvn'), 'cdm-full.kvn', { badCovariance: 'flag' });
  const cdm = r.cdm!;
  it('header, relative data and comments', () => {
    expect(r.errors).toEqual([]);
    expectBlock(cdm.header, {
      CCSDS_CDM_VERS: '1.0', CREATION_DATE: '2010-03-12T22:31:12.000', ORIGINATOR: 'JSPOC', MESSAGE_FOR: 'SATELLITE A',
      MESSAGE_ID: '201113719185',
    }, TIMES);
    expectBlock(cdm.relative, { ...RELATIVE_FULL, SCREEN_ENTRY_TIME: '2010-03-13T22:37:52.222', SCREEN_EXIT_TIME: '2010-03-13T22:37:52.824' }, TIMES);
    expect(cdm.relative.comments).toEqual(['Relative Metadata/Data']);
    expect(cdm.object1.metadata.comments).toEqual(['Object1 Metadata']);
    expect(cdm.object1.od.comments).toEqual(['Object1 Data', 'Object1 OD Parameters']);
    expect(cdm.object2.additional.comments).toEqual(['Object2 Additional Parameters', 'Apogee Altitude=786 km', 'Perigee Altitude=414 km', 'Inclination=98.9 deg']);
    expect(cdm.object1.state.comments).toEqual(['Object1 State Vector']);
  });
  it('object metadata, OD and additional parameters', () => {
    expectBlock(cdm.object1.metadata, { ...META1, OPERATOR_EMAIL: 'JOHN.DOE@SOMEWHERE.NET', N_BODY_PERTURBATIONS: 'MOON, SUN' });
    expectBlock(cdm.object2.metadata, { ...META2, N_BODY_PERTURBATIONS: 'MOON, SUN' });
    expectBlock(cdm.object1.od, {
      TIME_LASTOB_START: '2010-03-12T02:14:12.746', TIME_LASTOB_END: '2010-03-12T02:14:12.746', RECOMMENDED_OD_SPAN: 7.88,
      ACTUAL_OD_SPAN: 5.5, OBS_AVAILABLE: 592, OBS_USED: 579, TRACKS_AVAILABLE: 123, TRACKS_USED: 119,
      RESIDUALS_ACCEPTED: 97.8, WEIGHTED_RMS: 0.864,
    }, TIMES);
    expectBlock(cdm.object2.od, OD2, TIMES);
    expectBlock(cdm.object1.additional, {
      AREA_PC: 5.2, MASS: 251.6, CD_AREA_OVER_MASS: 0.045663, CR_AREA_OVER_MASS: 0, THRUST_ACCELERATION: 0, SEDR: 4.5457e-5,
    });
    expectBlock(cdm.object2.additional, ADD2);
    expect(cdm.object2.additional.mass).toBeUndefined();
  });
  it('states, 8×8 covariances with drag and SRP rows', () => {
    expectStates(cdm);
    const drgSrp1 = [-1.862, 3.53, -0.31, -1.214e-4, 2.58e-4, -6.467e-5, 3.483e-6, -1.492e2, 2.044e2, -2.331e1, -1.254e-3, 2.013e-2, -4.7e-3, 2.21e-4, 1.593e-2];
    const drgSrp2 = [-0.5117, 1.319, -9.034e-2, -7.708e-5, 7.402e-5, -1.903e-5, 1.053e-6, -3.297e1, 8.164e1, -5.651, -4.636e-3, 4.738e-3, -1.198e-3, 6.407e-5, 4.108e-3];
    expectCov(cdm.object1, [...COV1, ...drgSrp1]);
    expectCov(cdm.object2, [...COV2, ...drgSrp2]);
    expect(cdm.object1.covariance.dimension).toBe(8);
    expect(cdm.object1.covariance.status).toBe('not-psd');
    // OBJECT2: the SRP row implies |correlation| 22.7 (CSRP_TDOT), the 6×6 block is PSD.
    expect(cdm.object2.covariance.status).toBe('extension-dropped');
    expect(cdm.object2.covariance.usable).toEqual(cdm.object2.covariance.matrix.slice(0, 6).map((row) => row.slice(0, 6)));
    expect(r.repairs[1]).toMatch(/^cdm-full\.kvn:161: OBJECT2 8×8 covariance is not positive semi-definite.*its 6×6 position-velocity block is PSD and is used alone/);
  });
});

describe('XML example, kept with flagged covariance', () => {
  const r = parseCdmFile(read('cdm-example.xml'), 'cdm-example.xml', { badCovariance: 'flag' });
  const cdm = r.cdm!;
  it('every field', () => {
    expect(r.errors).toEqual([]);
    expectBlock(cdm.header, {
      CCSDS_CDM_VERS: '1.0', CREATION_DATE: '2010-03-12T22:31:12.000', ORIGINATOR: 'JSPOC', MESSAGE_FOR: 'SATELLITE A',
      MESSAGE_ID: '20111371985',
    }, TIMES);
    expect(cdm.header.comments).toEqual(['Sample CDM - XML version']);
    expectBlock(cdm.relative, { ...RELATIVE_FULL, SCREEN_ENTRY_TIME: '2010-03-13T20:25:43.222', SCREEN_EXIT_TIME: '2010-03-13T23:44:29.324' }, TIMES);
    expectBlock(cdm.object1.metadata, { ...META1, OPERATOR_EMAIL: 'JOHN.DOE@SOMEWHERE>NET', N_BODY_PERTURBATIONS: 'MOON,SUN' });
    expectBlock(cdm.object2.metadata, { ...META2, N_BODY_PERTURBATIONS: 'MOON,SUN' });
    expectBlock(cdm.object1.od, {
      TIME_LASTOB_START: '2010-03-12T02:14:12.746', TIME_LASTOB_END: '2010-03-12T02:14:12.746', RECOMMENDED_OD_SPAN: 7.88,
      ACTUAL_OD_SPAN: 5.5, OBS_AVAILABLE: 592, OBS_USED: 59, TRACKS_AVAILABLE: 123, TRACKS_USED: 119,
      RESIDUALS_ACCEPTED: 97.8, WEIGHTED_RMS: 0.864,
    }, TIMES);
    expectBlock(cdm.object2.od, OD2, TIMES);
    expectBlock(cdm.object1.additional, {
      AREA_PC: 5.2, MASS: 2516, CD_AREA_OVER_MASS: 0.045663, CR_AREA_OVER_MASS: 0, THRUST_ACCELERATION: 0, SEDR: 4.5457e-5,
    });
    expectBlock(cdm.object2.additional, ADD2);
    expectStates(cdm);
    expect(cdm.object1.covariance.status).toBe('not-psd');
    expect(cdm.object2.covariance).toMatchObject({ dimension: 6, status: 'psd' });
  });
  it('comments by element, and source lines of elements', () => {
    expect(cdm.object1.dataComments).toEqual(['Object1 Data']);
    expect(cdm.object1.od.comments).toEqual(['Object1 OD Parameters']);
    expect(cdm.object1.covariance.comments).toEqual(['Object1 Covariance in the RTN Coordinate Frame']);
    expect(cdm.object2.additional.comments).toEqual(['Object2 Additional Parameters', 'Apogee Altitude=768 km', 'Perigee Altitude=414 km', 'Inclination=98.8 deg']);
    expect(cdm.header.lines).toEqual({ CCSDS_CDM_VERS: 2, CREATION_DATE: 7, ORIGINATOR: 8, MESSAGE_FOR: 9, MESSAGE_ID: 10 });
    expect(cdm.relative.lines['RELATIVE_POSITION_N']).toBe(21);
    expect(cdm.object2.covariance.lines['CNDOT_NDOT']).toBe(198);
  });
});
