#!/usr/bin/env python3
"""Reference NNLS solutions for NnlsReferenceTest, produced by scipy.optimize.nnls.

Run from this directory:  python3 nnls_reference.py > nnls_reference.json
The JSON records the Python, NumPy and SciPy versions that produced it. Each problem holds the
matrix (row-major), right-hand side, scipy's solution x, residual norm, numerical rank, and
whether x itself is unique (full column rank and well-conditioned support); for rank-deficient
problems only the fitted vector A·x and the residual norm are unique, so only those are checked.
"""
import json
import platform
import sys

import numpy as np
import scipy
from scipy.optimize import nnls

rng = np.random.default_rng(20261201)
problems = []


def add(name, a, y):
    x, rnorm = nnls(a, y)
    rank = int(np.linalg.matrix_rank(a))
    support = np.flatnonzero(x > 0)
    cond = float(np.linalg.cond(a[:, support])) if support.size else 1.0
    unique = rank == a.shape[1] and cond < 1e6
    problems.append({
        "name": name, "m": int(a.shape[0]), "n": int(a.shape[1]), "rank": rank,
        "unique_x": bool(unique),
        "a": [[float(v) for v in row] for row in a],
        "y": [float(v) for v in y],
        "x": [float(v) for v in x],
        "fitted": [float(v) for v in a @ x],
        "rnorm": float(rnorm),
    })


# 1. Full-rank, over-determined Gaussian problems (mixed active sets).
for k in range(8):
    m = int(rng.integers(10, 41))
    n = int(rng.integers(4, min(m, 20) + 1))
    add(f"gaussian_{k}", rng.standard_normal((m, n)), rng.standard_normal(m))

# 2. Rank-deficient: A = U·V with inner dimension r < n.
for k in range(5):
    m = int(rng.integers(12, 31))
    n = int(rng.integers(6, 16))
    r = int(rng.integers(2, n))
    a = rng.standard_normal((m, r)) @ rng.standard_normal((r, n))
    add(f"rank_deficient_{k}_r{r}", a, rng.standard_normal(m))

# 3. Under-determined: fewer rows than columns.
for k in range(3):
    m = int(rng.integers(5, 12))
    n = m + int(rng.integers(3, 10))
    add(f"underdetermined_{k}", rng.standard_normal((m, n)), rng.standard_normal(m))

# 4. Exactly repeated columns (rank-deficient by construction).
for k in range(3):
    m, n = 20, 10
    a = rng.standard_normal((m, n))
    a[:, 7] = a[:, 2]
    a[:, 9] = 2.0 * a[:, 4] - a[:, 1]
    add(f"repeated_columns_{k}", a, np.abs(rng.standard_normal(m)) + a @ np.abs(rng.standard_normal(n)))

# 5. Exponential decay bases (32 echoes, 10 ms spacing, log-spaced T2) with positive mixtures + noise.
t = 10.0 * np.arange(1, 33)
for k, bins in enumerate((6, 10, 14)):
    t2 = 10.0 * (200.0 ** (np.arange(bins) / (bins - 1)))
    a = np.exp(-t[:, None] / t2[None, :])
    s = np.zeros(bins)
    s[int(rng.integers(0, bins // 2))] = 0.2
    s[int(rng.integers(bins // 2, bins))] = 0.8
    add(f"exponential_{k}_bins{bins}", a, a @ s + 0.005 * rng.standard_normal(32))

# 6. Edge cases: solution zero (y in the polar cone), interior solution (all x > 0).
a = np.abs(rng.standard_normal((15, 6)))
add("zero_solution", a, -np.abs(rng.standard_normal(15)))
a = rng.standard_normal((25, 6))
add("interior_solution", a, a @ (1.0 + np.abs(rng.standard_normal(6))) + 0.01 * rng.standard_normal(25))

json.dump({
    "generator": "nnls_reference.py (scipy.optimize.nnls)",
    "python": platform.python_version(),
    "numpy": np.__version__,
    "scipy": scipy.__version__,
    "problems": problems,
}, sys.stdout, indent=1)
sys.stdout.write("\n")
