"""The comparison for bench/batch.ts: the exact Durbin-Watson p-value of every series in a CSV file
by an ordinary per-series numpy/scipy loop, the way an analyst would script it.

For each group of rows (column --by): build X = [1, regressors], a complete QR of X with numpy,
Z = the last n - k columns of Q, the eigenvalues nu of Z'AZ (A = D'D for lag 1, pairs only between
times exactly one apart), the residuals and d, then P(D <= d) by Imhof's (1961) integral
    P = 1/2 - (1/pi) int_0^inf sin(theta(u)) / (u rho(u)) du,
    theta(u) = 1/2 sum atan((nu_i - d) u),  rho(u) = prod (1 + (nu_i - d)^2 u^2)^(1/4),
with scipy.integrate.quad (absolute tolerance 1e-11).

Usage: python3 bench/ref_numpy_batch.py DATA.csv --by COL --y COL --x A,B --time COL [--out P.json]
Prints one JSON line: {"series": ..., "seconds": loop time, "loadSeconds": reading and grouping,
"cpuSeconds", "loadCpuSeconds": the same as CPU time of the process}; with --out, the p-values by
group. The loop is timed after the file is read and grouped.
"""
import argparse
import csv
import json
import math
import sys
import time

import numpy as np
from scipy import integrate


def imhof_lower(lams):
    def f(u):
        if u == 0.0:
            return 0.5 * lams.sum()
        theta = 0.5 * np.arctan(lams * u).sum()
        rho = np.exp(0.25 * np.log1p((lams * u) ** 2).sum())
        return math.sin(theta) / (u * rho)

    val, _ = integrate.quad(f, 0.0, np.inf, limit=500, epsabs=1e-11, epsrel=1e-10)
    return 0.5 - val / math.pi


def one_series(y, X, times):
    n, k = X.shape
    A = np.zeros((n, n))
    for t in range(1, n):
        if times[t] - times[t - 1] == 1:
            A[t, t] += 1.0
            A[t - 1, t - 1] += 1.0
            A[t, t - 1] -= 1.0
            A[t - 1, t] -= 1.0
    Q, R = np.linalg.qr(X, mode="complete")
    Z = Q[:, k:]
    nu = np.linalg.eigvalsh(Z.T @ A @ Z)
    e = y - Q[:, :k] @ (Q[:, :k].T @ y)
    d = float(e @ A @ e) / float(e @ e)
    return d, imhof_lower(nu - d)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("data")
    ap.add_argument("--by", required=True)
    ap.add_argument("--y", required=True)
    ap.add_argument("--x", default="")
    ap.add_argument("--time", required=True)
    ap.add_argument("--out")
    a = ap.parse_args()
    t0 = time.perf_counter()
    c0 = time.process_time()
    groups = {}
    with open(a.data, newline="") as f:
        for row in csv.DictReader(f):
            groups.setdefault(row[a.by], []).append(row)
    xs = [c for c in a.x.split(",") if c]
    series = []
    for label, rows in groups.items():
        y = np.array([float(r[a.y]) for r in rows])
        X = np.column_stack([np.ones(len(rows))] + [np.array([float(r[c]) for r in rows]) for c in xs])
        t = [int(r[a.time]) for r in rows]
        series.append((label, y, X, t))
    t1 = time.perf_counter()
    c1 = time.process_time()
    out = {}
    for label, y, X, t in series:
        out[label] = one_series(y, X, t)
    t2 = time.perf_counter()
    c2 = time.process_time()
    if a.out:
        with open(a.out, "w") as f:
            json.dump({k: {"d": v[0], "pPositive": v[1]} for k, v in out.items()}, f)
    print(json.dumps({"series": len(series), "seconds": t2 - t1, "loadSeconds": t1 - t0,
                      "cpuSeconds": c2 - c1, "loadCpuSeconds": c1 - c0}))


if __name__ == "__main__":
    sys.exit(main())
