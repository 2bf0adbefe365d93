#!/usr/bin/python3
"""Peer for the bending rows of `npm run bench`: the lowest k modes of the same stiffness/mass
pencil Rodwave solves, exported by bench/bending-bench.ts, with scipy.sparse.linalg.eigsh in
shift-invert mode about 0 (ARPACK on a sparse LU of K), which='LM' -- the way an engineer would
otherwise script it.

Usage: peer_scipy_bending.py PENCIL.bin N_UNKNOWNS HALF_BANDWIDTH K LENGTH BETA_SCALE
  PENCIL.bin: float64, K then M, each as its diagonal and then its off-diagonals d = 1..b, each
  of length N (entries past the end unused); BETA_SCALE = sqrt(EI/(rho A)) of the beam.
Prints one JSON object: the seconds to build the sparse matrices, the seconds of eigsh, the
frequencies f1..fk and their relative errors against the closed form of the clamped-free
Euler-Bernoulli beam, f_n = (beta_n L)^2/(2 pi L^2) sqrt(EI/(rho A)), beta_n L the roots of
cos x cosh x = -1 (R. D. Blevins, Formulas for Natural Frequency and Mode Shape, table 8-1),
found here with scipy.optimize.brentq.
"""
import json
import math
import sys
import time

import numpy as np
from scipy.optimize import brentq
from scipy.sparse import diags
from scipy.sparse.linalg import eigsh

path = sys.argv[1]
n = int(sys.argv[2])
b = int(sys.argv[3])
k = int(sys.argv[4])
length = float(sys.argv[5])
beta_scale = float(sys.argv[6])

data = np.fromfile(path, dtype=np.float64)
assert data.size == 2 * (b + 1) * n, "pencil file size"


def matrix(block):
    bands = [block[0:n]] + [block[(d) * n:(d) * n + n - d] for d in range(1, b + 1)]
    offsets = [0] + list(range(1, b + 1))
    upper = [bands[d] for d in range(1, b + 1)]
    return diags(bands + upper, offsets + [-d for d in range(1, b + 1)], shape=(n, n), format="csc")


t = time.perf_counter()
K = matrix(data[: (b + 1) * n])
M = matrix(data[(b + 1) * n:])
build_s = time.perf_counter() - t


def root(i):
    # cos x cosh x + 1 = 0 scaled by 1/cosh x: cos x + 1/cosh x, one root in each ((i - 1)pi, i pi).
    g = lambda x: math.cos(x) + 1 / math.cosh(x)  # noqa: E731
    return brentq(g, (i - 1) * math.pi + 1e-9, i * math.pi, xtol=1e-15, rtol=1e-15)


closed = [root(i) ** 2 / (2 * math.pi * length**2) * beta_scale for i in range(1, k + 1)]
out = {"n": n, "k": k, "build_s": build_s}
t = time.perf_counter()
try:
    values = eigsh(K, k=k, M=M, sigma=0, which="LM", return_eigenvectors=True)[0]
    out["eigsh_s"] = time.perf_counter() - t
    freqs = sorted(math.sqrt(max(v, 0.0)) / (2 * math.pi) for v in values)
    out["frequencies_hz"] = freqs
    out["errors"] = [abs(f - c) / c for f, c in zip(freqs, closed)]
except Exception as error:  # ARPACK may fail to converge or run out of memory: say so
    out["eigsh_s"] = time.perf_counter() - t
    out["failure"] = f"{type(error).__name__}: {error}"
print(json.dumps(out))
