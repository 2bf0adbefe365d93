#!/usr/bin/python3
"""Peer timings for `npm run bench`: the lowest k axial modes of the benchmark bar (uniform,
fixed-free, steel E = 200 GPa, rho = 7850 kg/m3, A = 1e-4 m2, L = 1 m) on n 2-node elements,
solved the way an engineer would otherwise script it with SciPy:

  consistent  scipy.sparse.linalg.eigsh, shift-invert about 0 (ARPACK on a sparse LU), on the
              consistent-mass pencil (K, M);
  lumped      scipy.linalg.eigh_tridiagonal on M^-1/2 K M^-1/2 (LAPACK ?stebz bisection and
              ?stein inverse iteration for the selected lowest k), the lumped-mass problem.

Usage: peer_scipy.py N K [consistent|lumped|both]. Prints one JSON object: the seconds spent
importing NumPy and SciPy, the seconds of each solve (assembly included), and f1 of each.
"""
import json
import math
import sys
import time

t0 = time.perf_counter()
import numpy as np  # noqa: E402
from scipy.linalg import eigh_tridiagonal  # noqa: E402
from scipy.sparse import diags  # noqa: E402
from scipy.sparse.linalg import eigsh  # noqa: E402

import_s = time.perf_counter() - t0

n = int(sys.argv[1])
k = int(sys.argv[2])
which = sys.argv[3] if len(sys.argv) > 3 else "both"
E, RHO, AREA, LENGTH = 200e9, 7850.0, 1e-4, 1.0
h = LENGTH / n
ke = E * AREA / h
me = RHO * AREA * h
out = {"n": n, "k": k, "import_s": import_s}

# Unknowns: nodes 1..n (node 0 is fixed); the free end's node has half an element on each matrix.
k_diag = np.full(n, 2 * ke)
k_diag[-1] = ke
k_off = np.full(n - 1, -ke)

if which in ("consistent", "both"):
    t = time.perf_counter()
    m_diag = np.full(n, 4 * me / 6)
    m_diag[-1] = 2 * me / 6
    m_off = np.full(n - 1, me / 6)
    K = diags([k_off, k_diag, k_off], [-1, 0, 1], format="csc")
    M = diags([m_off, m_diag, m_off], [-1, 0, 1], format="csc")
    values = eigsh(K, k=k, M=M, sigma=0, which="LM", return_eigenvectors=True)[0]
    out["eigsh_consistent_s"] = time.perf_counter() - t
    out["f1_consistent"] = math.sqrt(min(values)) / (2 * math.pi)

if which in ("lumped", "both"):
    t = time.perf_counter()
    m_lumped = np.full(n, me)
    m_lumped[-1] = me / 2
    s = 1 / np.sqrt(m_lumped)
    d = k_diag * s * s
    e = k_off * s[:-1] * s[1:]
    values, vectors = eigh_tridiagonal(d, e, select="i", select_range=(0, k - 1))
    out["eigh_tridiagonal_lumped_s"] = time.perf_counter() - t
    out["f1_lumped"] = math.sqrt(values[0]) / (2 * math.pi)

print(json.dumps(out))
