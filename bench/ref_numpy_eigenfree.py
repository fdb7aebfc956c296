#!/usr/bin/env python3
"""Plain numpy/scipy eigen-free reference for the bench (bench/large-n.ts): P(d <= c) for a design
read from a CSV file (header, one column per regressor; the intercept is added), lag 1.

Imhof's integral (Imhof 1961) with the characteristic function from log-determinants, no
eigenvalues: L(u) = log det(B) + log det(Q' B^-1 Q), B = I - i u (A - c I) tridiagonal, Q from
numpy's thin QR. B is factored per node by LAPACK's tridiagonal LU (zgttrf) and Q' B^-1 Q solved by
zgttrs; the argument is unwrapped along the sorted nodes. The integral is a fixed rule: 24-point
Gauss-Legendre on the panels [0, s], [s, 2s], [2s, 4s], [4s, 8s], [8s, 16s] with
s = (sum (nu - c)^2)^(-1/2) from traces. Prints one JSON line: p, seconds (integration and setup,
not the CSV read), nodes.

    python3 bench/ref_numpy_eigenfree.py design.csv c
"""
import json
import sys
import time

import numpy as np
from scipy.linalg import lapack


def main():
    path, c = sys.argv[1], float(sys.argv[2])
    X = np.loadtxt(path, delimiter=',', skiprows=1, ndmin=2)
    t0 = time.perf_counter()
    n = X.shape[0]
    X = np.column_stack([np.ones(n), X])
    Q, _ = np.linalg.qr(X)
    k = Q.shape[1]
    diag = np.full(n, 2.0)
    diag[0] = diag[-1] = 1.0
    off = -np.ones(n - 1)
    # traces: sum nu = tr A - tr Q'AQ, sum nu^2 = ||A||^2 - 2 ||AQ||^2 + ||Q'AQ||^2
    AQ = diag[:, None] * Q
    AQ[:-1] += off[:, None] * Q[1:]
    AQ[1:] += off[:, None] * Q[:-1]
    QAQ = Q.T @ AQ
    s1 = diag.sum() - np.trace(QAQ)
    s2 = (diag ** 2).sum() + 2 * (off ** 2).sum() - 2 * (AQ ** 2).sum() + (QAQ ** 2).sum()
    m = n - k
    sig = 1 / np.sqrt(s2 - 2 * c * s1 + m * c * c)
    x, w = np.polynomial.legendre.leggauss(24)
    nodes, weights = [], []
    edges = [0, 1, 2, 4, 8, 16]
    for a, b in zip(edges[:-1], edges[1:]):
        a, b = a * sig, b * sig
        nodes.append((b - a) / 2 * x + (a + b) / 2)
        weights.append((b - a) / 2 * w)
    nodes = np.concatenate(nodes)
    weights = np.concatenate(weights)
    logmod = np.empty(len(nodes))
    arg1 = np.empty(len(nodes))
    arg2 = np.empty(len(nodes))
    Qc = Q.astype(complex)
    for i, u in enumerate(nodes):
        dl = (-1j * u) * off
        d = 1 - 1j * u * (diag - c)
        du = dl.copy()
        dl2, d2, du2, du3, ipiv, info = lapack.zgttrf(dl.copy(), d, du)
        Y, info2 = lapack.zgttrs(dl2, d2, du2, du3, ipiv, Qc)[:2]
        # det(B) = prod diag(U) times the sign of the row interchanges
        swaps = np.count_nonzero(ipiv != np.arange(1, n + 1))
        ld = np.sum(np.log(d2.astype(complex)))
        if swaps % 2:
            ld += 1j * np.pi
        sgn, lg = np.linalg.slogdet(Q.T @ Y)
        logmod[i] = ld.real + lg
        arg1[i] = ld.imag
        arg2[i] = np.angle(sgn)
    arg = np.unwrap(np.concatenate([[0.0], arg1]))[1:] + np.unwrap(np.concatenate([[0.0], arg2]))[1:]
    theta = -0.5 * arg
    rho = np.exp(0.5 * logmod)
    integral = np.sum(weights * np.sin(theta) / (nodes * rho))
    p = 0.5 - integral / np.pi
    print(json.dumps({'p': float(p), 'seconds': time.perf_counter() - t0, 'nodes': int(len(nodes))}))


if __name__ == '__main__':
    main()
