"""Writes error_codes.json: where each verification element set stops and with which SGP4 code.

Reference library: python-sgp4 2.15 (Debian package python3-sgp4 2.15-0.1, which wraps
Vallado's C++ SGP4 of the 2006 paper). Run by hand with Debian's interpreter:

    /usr/bin/python3 make_error_codes.py > error_codes.json

The time loop copies the verification driver (python-sgp4's own tests.py,
generate_satellite_output): t = 0, then start..stop by step (skipping a repeated 0), then
`stop` itself when the loop did not land on it. The first nonzero error ends a set.
Not run by the tests; its output is committed next to it.
"""
import json
import math

from sgp4.api import WGS72, Satrec

sets = []
with open('SGP4-VER.TLE') as f:
    lines = [l.rstrip('\n') for l in f if l.strip() and not l.startswith('#')]

for line1, line2 in zip(lines[0::2], lines[1::2]):
    sat = Satrec.twoline2rv(line1, line2)
    start, stop, step = (float(x) for x in line2[69:].split())
    entry = {'satnum': sat.satnum, 'start': start, 'stop': stop, 'step': step,
             'stopsAt': None, 'error': 0, 'lastGood': None}

    def run(t):
        e, r, v = sat.sgp4_tsince(t)
        if e != 0 or math.isnan(r[0]):
            entry['stopsAt'] = t
            entry['error'] = e
            return False
        entry['lastGood'] = t
        return True

    times = [0.0]
    t = start
    while t <= stop:
        if not (t == start == 0.0):
            times.append(t)
        t += step
    if t - stop < step - 1e-6:
        times.append(stop)
    for t in times:
        if not run(t):
            break
    sets.append(entry)

# Invented element sets that SGP4 must refuse at initialisation. Debian's build is the
# pure-Python one (sgp4.api.accelerated is False): it returns code 1 for a negative mean
# eccentricity but raises a Python exception (no code) for e >= 1 or a negative mean motion,
# so only the first gets an expected code here.
init_cases = []
for name, ecco, no_kozai in [('negative-eccentricity', -0.1, 0.06)]:
    sat = Satrec()
    # sgp4init(whichconst, opsmode, satnum, epoch(days from 1949-12-31), bstar, ndot, nddot,
    #          ecco, argpo, inclo, mo, no_kozai(rad/min), nodeo)
    sat.sgp4init(WGS72, 'i', 1, 20000.0, 1e-4, 0.0, 0.0, ecco, 0.5, 0.3, 0.2, no_kozai, 0.1)
    e, r, v = sat.sgp4_tsince(0.0)
    init_cases.append({'name': name, 'epochDays1950': 20000.0, 'bstar': 1e-4, 'ecco': ecco,
                       'argpoRad': 0.5, 'incloRad': 0.3, 'moRad': 0.2,
                       'noRadPerMin': no_kozai, 'nodeoRad': 0.1, 'error': e})

print(json.dumps({'generator': 'python-sgp4 2.15 (Debian python3-sgp4 2.15-0.1, pure-Python '
                  'build), Satrec.sgp4_tsince', 'sets': sets, 'initCases': init_cases}, indent=1))
