"""Writes kepler.json: reference values for core/elements/kepler.ts.

1. SGP4's recovered ("un-Kozai'd") mean motion and semi-major axis, perigee and apogee, as
   python-sgp4 2.15 computes them (Debian python3-sgp4 2.15-0.1; Satrec attributes no_kozai
   [rad/min], a [Earth radii], altp / alta [Earth radii above the surface], radiusearthkm; WGS-72)
   for a few sets of SGP4-VER.TLE (LEO, Molniya, GEO, highly eccentric).
2. Kepler's third law a = (mu / n^2)^(1/3) evaluated in plain Python floats with
   mu = 398600.4418 km^3/s^2 (WGS-84, NIMA TR8350.2) for periods of one and one half sidereal
   day (86164.0905 s: IERS Conventions / Astronomical Almanac value) and 5400 s: an independent
   evaluation of the formula, outside the TypeScript under test.

Run by hand: /usr/bin/python3 make_kepler_fixture.py > kepler.json  (not run by the tests).
"""
import json
import math

from sgp4.api import Satrec

WANTED = {'06251', '28057', '08195', '28626', '23333', '11801'}

with open('SGP4-VER.TLE') as f:
    lines = [l.rstrip('\n') for l in f if l.strip() and not l.startswith('#')]

sgp4_sets = []
for line1, line2 in zip(lines[0::2], lines[1::2]):
    if line1[2:7] not in WANTED or any(s['satnum'] == line1[2:7] for s in sgp4_sets):
        continue
    sat = Satrec.twoline2rv(line1, line2[:69])
    sgp4_sets.append({
        'satnum': line1[2:7], 'line1': line1, 'line2': line2[:69],
        'noKozaiRadPerMin': sat.no_kozai, 'noUnkozaiRadPerMin': sat.no_unkozai,
        'aEarthRadii': sat.a, 'altpEarthRadii': sat.altp, 'altaEarthRadii': sat.alta,
        'radiusEarthKm': sat.radiusearthkm, 'muKm3s2': sat.mu,
    })

MU = 398600.4418
SIDEREAL_DAY_S = 86164.0905
kepler = []
for name, period in [('one sidereal day', SIDEREAL_DAY_S), ('half a sidereal day', SIDEREAL_DAY_S / 2),
                     ('90 minutes', 5400.0)]:
    n = 2 * math.pi / period
    kepler.append({'name': name, 'periodS': period, 'muKm3s2': MU, 'aKm': (MU / n ** 2) ** (1 / 3)})

print(json.dumps({'generator': 'python-sgp4 2.15 (Debian python3-sgp4 2.15-0.1) and Python '
                  'float arithmetic', 'sgp4': sgp4_sets, 'kepler': kepler}, indent=1))
