#!/usr/bin/python3
"""Writes sgp4-fields.json: the fields python-sgp4 reads from each of the 33 verification sets.

Run by hand (the tests never run it):  /usr/bin/python3 make_fixture.py  (the system
Python, where Debian installs python3-sgp4)
Needs Debian's python3-sgp4. Input: SGP4-VER.TLE next to this script (a verbatim copy of the
AIAA 2006-6753 verification file). Each line 2 carries start/stop/step after column 69; those
are cut off, as the reference program does, before handing the lines to Satrec.twoline2rv.
"""
import importlib.metadata
import json
import os

import sgp4
from sgp4.api import Satrec, accelerated

HERE = os.path.dirname(os.path.abspath(__file__))
FIELDS = ["satnum", "epochyr", "epochdays", "jdsatepoch", "jdsatepochF", "ndot", "nddot",
          "bstar", "inclo", "nodeo", "ecco", "argpo", "mo", "no_kozai"]

with open(os.path.join(HERE, "SGP4-VER.TLE")) as f:
    lines = [l.rstrip("\n") for l in f if not l.startswith("#") and l.strip()]

records = []
for i in range(0, len(lines), 2):
    l1, l2 = lines[i], lines[i + 1][:69]
    sat = Satrec.twoline2rv(l1, l2)
    rec = {"line1": l1, "line2": l2}
    for name in FIELDS:
        rec[name] = getattr(sat, name)
    records.append(rec)

out = {
    "source": "python-sgp4 Satrec.twoline2rv on SGP4-VER.TLE (Vallado et al., AIAA 2006-6753)",
    # sgp4 2.15 has no __version__; the installed distribution's metadata carries it.
    "sgp4_version": getattr(sgp4, "__version__", None) or importlib.metadata.version("sgp4"),
    "sgp4_accelerated": accelerated,
    "units": {
        "satnum": "catalogue number (int)",
        "epochyr": "two-digit year", "epochdays": "day of year with fraction (1.0 = Jan 1 0h)",
        "jdsatepoch": "Julian date, whole part (UTC)", "jdsatepochF": "Julian date, fraction",
        "ndot": "rad/min^2 (TLE field / (1440^2/(2*pi)))",
        "nddot": "rad/min^3 (TLE field / (1440^3/(2*pi)))",
        "bstar": "1/earth radii", "inclo": "rad", "nodeo": "rad", "ecco": "1",
        "argpo": "rad", "mo": "rad", "no_kozai": "rad/min",
    },
    "records": records,
}
with open(os.path.join(HERE, "sgp4-fields.json"), "w") as f:
    json.dump(out, f, indent=1)
print(f"wrote {len(records)} records, sgp4 {out['sgp4_version']}")
