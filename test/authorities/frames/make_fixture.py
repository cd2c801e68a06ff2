"""Writes fixture.json: reference values for test/frames.test.ts.

Libraries (Debian bookworm packages; run by hand, not by the tests):
  - Skyfield 1.45 (python3-skyfield 1.45+ds-2), built-in data only:
    load.timescale(builtin=True) — its bundled leap-second and UT1/Delta-T tables. No downloads.
    Skyfield's GCRS uses IAU 2000A nutation with frame bias; its TEME frame is
    R3(GMST1982 - GAST) * (N P B) per AIAA 2006-6753 App. C; ITRS here has no polar motion.
  - python-sgp4 2.15 (python3-sgp4 2.15-0.1), through Skyfield's EarthSatellite, for TEME states.
  - pyerfa 2.0.0.1 (python3-erfa; ERFA = the IAU SOFA routines): IAU-1980 nutation (nut80),
    IAU-1980 mean obliquity (obl80), IAU-1976 precession matrix (pmat76), GMST 1982 (gmst82),
    frame bias (bi00 / bp00), TAI-UTC (dat).

    /usr/bin/python3 make_fixture.py > fixture.json
"""
import json

import erfa
import numpy as np
from skyfield.api import EarthSatellite, load
from skyfield.framelib import itrs
from skyfield.positionlib import ICRF
from skyfield.sgp4lib import TEME
from skyfield.constants import AU_KM, DAY_S

ts = load.timescale(builtin=True)

# Sets of the SGP4 verification file (Vallado et al. 2006): LEO, GPS-like MEO, GEO, Molniya.
WANTED = {'06251': 'LEO', '28129': 'MEO', '28626': 'GEO', '08195': 'HEO'}
with open('../sgp4-verification/SGP4-VER.TLE') as f:
    lines = [l.rstrip('\n') for l in f if l.strip() and not l.startswith('#')]


def utc_fields(t):
    """UTC of a Skyfield time as Unix milliseconds (float, sub-ms kept) and ISO text."""
    y, mo, d, h, mi, s = t.utc
    whole = int(np.floor(s))
    import calendar
    ms = calendar.timegm((int(y), int(mo), int(d), int(h), int(mi), whole)) * 1000.0 + (s - whole) * 1000.0
    return ms, t.utc_iso(places=6)


def time_block(t):
    ms, iso = utc_fields(t)
    return {'utcMs': ms, 'utcIso': iso, 'ut1MinusUtcS': float(t.dut1),
            'taiMinusUtcS': float(t._leap_seconds()), 'jdTT': float(t.tt)}


def frames_of_gcrs(r_gcrs_km, v_gcrs_kms, t):
    """ITRS (no polar motion) of a GCRS state through Skyfield's frame machinery."""
    pos = ICRF(np.array(r_gcrs_km) / AU_KM, np.array(v_gcrs_kms) / AU_KM * DAY_S, t, center=399)
    r, v = pos.frame_xyz_and_velocity(itrs)
    return list(r.km), list(v.km_per_s)


cases = []
for line1, line2 in zip(lines[0::2], lines[1::2]):
    num = line1[2:7]
    if num not in WANTED or any(c['satnum'] == num for c in cases):
        continue
    sat = EarthSatellite(line1, line2[:69], num, ts)
    for dt_days in (0.0, 0.37, 1.0):
        t = sat.epoch + dt_days
        r_teme, v_teme, err = sat._position_and_velocity_TEME_km(t)
        geo = sat.at(t)
        r_itrs, v_itrs = geo.frame_xyz_and_velocity(itrs)
        cases.append({'satnum': num, 'regime': WANTED[num], 'daysFromEpoch': dt_days,
                      'time': time_block(t),
                      'teme': {'r': list(r_teme), 'v': list(v_teme)},
                      'gcrs': {'r': list(geo.position.km), 'v': list(geo.velocity.km_per_s)},
                      'itrs': {'r': list(r_itrs.km), 'v': list(v_itrs.km_per_s)}})

# The same TEME state (Vallado's worked example vector) at dates far apart, to exercise
# precession over decades. GCRS = R^T r with R = Skyfield's TEME.rotation_at(t).
r0 = np.array([5094.18016210, 6127.64465950, 6380.34453270])
v0 = np.array([-4.746131487, 0.785818041, 5.531931288])
for (y, mo, d, h) in [(1990, 3, 1, 0), (2004, 4, 6, 7.857885), (2015, 7, 1, 12), (2023, 11, 20, 18)]:
    t = ts.utc(y, mo, d, h)
    R = TEME.rotation_at(t)
    r_g, v_g = R.T.dot(r0), R.T.dot(v0)
    r_i, v_i = frames_of_gcrs(r_g, v_g, t)
    cases.append({'satnum': 'vector', 'regime': 'LEO', 'daysFromEpoch': None, 'time': time_block(t),
                  'teme': {'r': list(r0), 'v': list(v0)},
                  'gcrs': {'r': list(r_g), 'v': list(v_g)},
                  'itrs': {'r': r_i, 'v': v_i}})

# ERFA pieces at the same instants (TT and UT1 as two-part Julian dates, from Skyfield's times).
erfa_rows = []
for c in cases:
    tb = c['time']
    jd_utc = tb['utcMs'] / 86400000.0 + 2440587.5
    tt1, tt2 = 2451545.0, (tb['utcMs'] + (tb['taiMinusUtcS'] + 32.184) * 1000.0
                           - 946728000000.0) / 86400000.0
    ut1, ut2 = 2451545.0, (tb['utcMs'] + tb['ut1MinusUtcS'] * 1000.0 - 946728000000.0) / 86400000.0
    dpsi, deps = erfa.nut80(tt1, tt2)
    erfa_rows.append({'utcMs': tb['utcMs'], 'ut1MinusUtcS': tb['ut1MinusUtcS'],
                      'dPsi': float(dpsi), 'dEps': float(deps), 'obl80': float(erfa.obl80(tt1, tt2)),
                      'pmat76': erfa.pmat76(tt1, tt2).tolist(), 'gmst82': float(erfa.gmst82(ut1, ut2)),
                      'eqeq94': float(erfa.eqeq94(tt1, tt2))})
rb, rp, rbp = erfa.bp00(2451545.0, 0.0)
leap = [{'utcMs': float(np.datetime64(f'{y:04d}-{m:02d}-{d:02d}', 'ms').astype('int64')),
         'taiMinusUtcS': float(erfa.dat(y, m, d, 0.0))}
        for (y, m, d) in [(1972, 1, 1), (1972, 6, 30), (1972, 7, 1), (1980, 1, 1), (1999, 1, 1),
                          (2005, 12, 31), (2006, 1, 1), (2012, 7, 1), (2016, 12, 31), (2017, 1, 1),
                          (2024, 6, 1)]]

print(json.dumps({'generator': 'Skyfield 1.45 (builtin timescale), python-sgp4 2.15, pyerfa 2.0.0.1',
                  'cases': cases, 'erfa': erfa_rows, 'frameBias': rb.tolist(), 'taiMinusUtc': leap},
                 indent=1))
