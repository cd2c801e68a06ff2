#!/usr/bin/env python3
"""Reference eigen-decompositions for the 3-D view's covariance ellipsoids.

Run by hand (python3 make_fixture.py); the tests only read fixture.json.
Covariances are random symmetric positive-definite 3x3 matrices in m^2 with RTN-like sizes
(seeded NumPy generator), decomposed by numpy.linalg.eigh (LAPACK syevd).
"""
import json

import numpy as np

rng = np.random.default_rng(20261207)
cases = []
for scale in ([50.0, 800.0, 20.0], [200.0, 5000.0, 150.0], [10.0, 10.5, 9.5], [1.0, 3000.0, 2.0]):
    # random rotation from the QR decomposition of a Gaussian matrix
    q, r = np.linalg.qr(rng.standard_normal((3, 3)))
    q = q @ np.diag(np.sign(np.diag(r)))
    c = q @ np.diag(np.square(scale)) @ q.T
    c = 0.5 * (c + c.T)
    w, v = np.linalg.eigh(c)
    order = np.argsort(w)[::-1]
    cases.append({
        "covM2": c.tolist(),
        "eigenvaluesDescendingM2": w[order].tolist(),
        # eigenvectors as rows, same order (sign is arbitrary)
        "eigenvectorsRows": v[:, order].T.tolist(),
    })

json.dump({
    "generator": "make_fixture.py",
    "numpy": np.__version__,
    "method": "numpy.linalg.eigh",
    "cases": cases,
}, open("fixture.json", "w"), indent=1)
