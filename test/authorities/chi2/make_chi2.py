#!/usr/bin/python3
"""Quantiles of the chi-squared distribution with 3 degrees of freedom, for
test/risk-covariance-realism.test.ts. Run by hand with Debian's interpreter and python3-scipy:
    /usr/bin/python3 make_chi2.py > chi2-3dof.json
The tests only read the JSON; they never run Python."""
import json
import sys

import scipy
from scipy.stats import chi2

PROBABILITIES = [0.01, 0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95, 0.99, 0.999]

json.dump(
    {
        "generator": "scipy.stats.chi2.ppf(p, 3) and chi2.cdf(x, 3)",
        "package": "Debian python3-scipy",
        "scipy": scipy.__version__,
        "python": sys.version.split()[0],
        "dof": 3,
        "quantiles": [{"p": p, "x": float(chi2.ppf(p, 3))} for p in PROBABILITIES],
        # CDF at a few points, to check the test's own use of the table
        "cdf": [{"x": x, "p": float(chi2.cdf(x, 3))} for x in [0.5, 1.0, 2.0, 3.0, 5.0, 7.8147, 11.345, 20.0]],
    },
    sys.stdout,
    indent=1,
)
sys.stdout.write("\n")
