#!/usr/bin/env python3
"""Writes pc-fixture.json: outside reference values for Keepclear's Pc tests.

Run by hand (python3 make_fixture.py); the tests only read the JSON it writes.
Every value comes from SciPy/NumPy, none from Keepclear code.
"""
import json
import math

import numpy as np
import scipy
from scipy import integrate, optimize, special, stats

out = {
    "generator": "test/authorities/pc/make_fixture.py",
    "scipy": scipy.__version__,
    "numpy": np.__version__,
}

# 1. erf / erfc (scipy.special, Cephes-based)
xs = [-3.5, -1.0, -0.2, 0.0, 1e-10, 0.1, 0.3, 0.46875, 0.5, 0.9, 1.0, 1.5, 2.0, 2.5, 3.0,
      3.99, 4.0, 4.01, 5.0, 6.0, 8.0, 10.0, 15.0, 20.0, 26.0]
out["erf"] = [{"x": x, "erf": float(special.erf(x)), "erfc": float(special.erfc(x))} for x in xs]

# 2. isotropic covariance sigma, miss d, radius R: noncentral chi-square CDF, 2 dof,
#    lambda = (d/sigma)^2, evaluated at (R/sigma)^2.
iso = []
for d, s, r in [(1000, 1000, 10), (0, 100, 10), (100, 100, 10), (500, 50, 20), (3000, 1000, 5),
                (200, 1000, 20), (50, 10, 15), (2000, 300, 10), (1, 1, 0.01), (10, 2, 8)]:
    iso.append({"missM": d, "sigmaM": s, "radiusM": r,
                "pc": float(stats.ncx2.cdf((r / s) ** 2, 2, (d / s) ** 2))})
out["isotropic"] = iso


def pc_dblquad(mx, my, cxx, cxy, cyy, r):
    """Bivariate normal N((mx,my), C) pdf integrated over the disk |p| <= r, in the plane's own
    axes (no rotation to principal axes, unlike the code under test)."""
    c = np.array([[cxx, cxy], [cxy, cyy]])
    ci = np.linalg.inv(c)
    norm = 1.0 / (2 * math.pi * math.sqrt(np.linalg.det(c)))

    def pdf(y, x):
        dx, dy = x - mx, y - my
        return norm * math.exp(-0.5 * (ci[0, 0] * dx * dx + 2 * ci[0, 1] * dx * dy + ci[1, 1] * dy * dy))

    val, err = integrate.dblquad(pdf, -r, r, lambda x: -math.sqrt(max(r * r - x * x, 0.0)),
                                 lambda x: math.sqrt(max(r * r - x * x, 0.0)),
                                 epsabs=1e-300, epsrel=1e-12)
    return val, err


# 3. anisotropic covariance, arbitrary orientation and offset
aniso = []
rng = np.random.default_rng(20240601)
cases = [
    (120.0, -45.0, 200.0, 30.0, 35.0, 10.0),
    (5.0, 3.0, 40.0, 12.0, 15.0, 20.0),
    (800.0, 300.0, 1500.0, 40.0, -25.0, 15.0),
    (0.0, 0.0, 50.0, 10.0, 60.0, 5.0),
    (30.0, 10.0, 12.0, 3.0, 135.0, 25.0),
]
for k in range(3):
    cases.append((float(rng.uniform(-500, 500)), float(rng.uniform(-500, 500)),
                  float(rng.uniform(50, 600)), float(rng.uniform(10, 300)),
                  float(rng.uniform(0, 180)), float(rng.uniform(5, 30))))
for mx, my, s1, s2, ang, r in cases:
    t = math.radians(ang)
    rot = np.array([[math.cos(t), -math.sin(t)], [math.sin(t), math.cos(t)]])
    c = rot @ np.diag([s1 * s1, s2 * s2]) @ rot.T
    val, err = pc_dblquad(mx, my, c[0, 0], c[0, 1], c[1, 1], r)
    aniso.append({"miss": [mx, my], "cov": [[c[0, 0], c[0, 1]], [c[1, 0], c[1, 1]]],
                  "radiusM": r, "pc": val, "dblquadAbsErr": err})
out["anisotropic"] = aniso

# 4. maximum Pc over the covariance scale.
#    (a) circular covariance, unknown sigma: maximise ncx2.cdf over log sigma.
pmax_iso = []
for d, r in [(1000, 10), (500, 5), (200, 20), (100, 1), (50, 10)]:
    f = lambda ls: -stats.ncx2.cdf((r / math.exp(ls)) ** 2, 2, (d / math.exp(ls)) ** 2)
    res = optimize.minimize_scalar(f, bracket=(math.log(d / 4), math.log(d / math.sqrt(2)), math.log(4 * d)),
                                   tol=1e-12)
    pmax_iso.append({"missM": d, "radiusM": r, "sigmaAtMaxM": math.exp(res.x), "pcMax": -res.fun})
out["maxIsotropic"] = pmax_iso

#    (b) fixed shape C0 scaled by s (covariance s*C0): maximise the dblquad Pc over log s.
pmax_shape = []
for mx, my, s1, s2, ang, r in [(400.0, 150.0, 3.0, 1.0, 20.0, 10.0), (50.0, -80.0, 1.0, 0.2, 100.0, 15.0)]:
    t = math.radians(ang)
    rot = np.array([[math.cos(t), -math.sin(t)], [math.sin(t), math.cos(t)]])
    c0 = rot @ np.diag([s1 * s1, s2 * s2]) @ rot.T
    m = np.array([mx, my])
    m2 = float(m @ np.linalg.inv(c0) @ m)
    f = lambda ls: -pc_dblquad(mx, my, *(math.exp(ls) * np.array([c0[0, 0], c0[0, 1], c0[1, 1]])), r)[0]
    s_guess = m2 / 2
    res = optimize.minimize_scalar(f, bracket=(math.log(s_guess / 3), math.log(s_guess), math.log(s_guess * 3)),
                                   tol=1e-10)
    pmax_shape.append({"miss": [mx, my], "covShape": [[c0[0, 0], c0[0, 1]], [c0[1, 0], c0[1, 1]]],
                       "radiusM": r, "scaleAtMax": math.exp(res.x), "pcMax": -res.fun})
out["maxShape"] = pmax_shape

with open("pc-fixture.json", "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote pc-fixture.json")
