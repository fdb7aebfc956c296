#!/usr/bin/env python3
"""Reference values at the edges of the exact null distribution of d (mpmath, 50 digits).

Writes test/ref/edge-reference.json. Run from the repository root:

    nice python3 test/ref/edge_reference.py

Designs (intercept and trend t = 1..n, lag 1): n = 3 (intercept only) and n = 4 give m = 2, whose
distribution is the arcsine law on [nu_1, nu_2]:
    P(d <= c) = (2/pi) asin(sqrt((c - nu_1) / (nu_2 - nu_1)));
n = 5 gives m = 3, computed by Imhof's integral (Imhof 1961) with mpmath's tanh-sinh quadrature and
checked by Gauss-Legendre quadrature on the same panels (the script stops if they differ by more
than 1e-25). The spectrum is that of M A M (M = I - X (X'X)^-1 X') at 50 digits. Every point c is
a double (given exactly by its 17-digit repr); probabilities are rounded to doubles.
"""
import json
import math
import os
import sys

import mpmath
from mpmath import mp, mpf

mp.dps = 50
HERE = os.path.dirname(os.path.abspath(__file__))


def spectrum(n, trend):
    A = mp.zeros(n, n)
    for t in range(n - 1):
        A[t, t] += 1
        A[t + 1, t + 1] += 1
        A[t, t + 1] -= 1
        A[t + 1, t] -= 1
    cols = [[mpf(1)] * n] + ([[mpf(t + 1) for t in range(n)]] if trend else [])
    X = mp.matrix(n, len(cols))
    for j, c in enumerate(cols):
        for i in range(n):
            X[i, j] = c[i]
    M = mp.eye(n) - X * mp.inverse(X.T * X) * X.T
    E = mp.eigsy(M * A * M)[0]
    vals = sorted([E[i] for i in range(n)])
    k = len(cols)
    return vals[k:]  # the k zero eigenvalues belong to col(X) (A's eigenvalues are >= 0)


def arcsine_lower(nu, c):
    if c <= nu[0]:
        return mpf(0)
    if c >= nu[1]:
        return mpf(1)
    return 2 / mp.pi * mp.asin(mp.sqrt((c - nu[0]) / (nu[1] - nu[0])))


def imhof_lower(nu, c, method):
    lam = [v - c for v in nu]
    if all(l >= 0 for l in lam):
        return mpf(0)
    if all(l <= 0 for l in lam):
        return mpf(1)

    def f(u):
        th = sum(mp.atan(l * u) for l in lam) / 2
        rho = mp.exp(sum(mp.log1p((l * u) ** 2) for l in lam) / 4)
        return mp.sin(th) / (u * rho)
    pts = [mpf(0)] + [mpf(10) ** e for e in range(-3, 25)] + [mp.inf]
    return mpf(1) / 2 - mp.quad(f, pts, method=method) / mp.pi


def imhof_upper(nu, c):
    # P(d >= c) = P(sum (c - nu) z^2 <= 0): the mirror form, so a small upper tail keeps its digits
    return imhof_lower([-v for v in nu], -c, 'tanh-sinh')


def ulps(x, k):
    for _ in range(abs(k)):
        x = math.nextafter(x, math.inf if k > 0 else -math.inf)
    return x


def main():
    cases = []
    for n, trend in [(3, False), (4, True)]:
        nu = spectrum(n, trend)
        pts = []
        for end in nu:
            e = float(end)
            for k in [-4, -2, -1, 0, 1, 2, 4]:
                c = ulps(e, k)
                p = arcsine_lower(nu, mpf(c))
                pts.append({'c': repr(c), 'lower': repr(float(p)), 'upper': repr(float(1 - p))})
        q = mpf('0.05')
        crit = nu[0] + (nu[1] - nu[0]) * mp.sin(mp.pi * q / 2) ** 2
        # the first double above nu_1: the CDF jumps from 0 to this there, so levels below it are unreachable
        above = ulps(float(nu[0]), 1) if float(nu[0]) > nu[0] else ulps(float(nu[0]), 2)
        jump = arcsine_lower(nu, mpf(above))
        cases.append({'id': f'm2-n{n}', 'n': n, 'trend': trend, 'nu': [repr(float(v)) for v in nu], 'points': pts,
                      'quantile05': repr(float(crit)), 'jumpAboveNu1': repr(float(jump))})
        print(f'm = 2, n = {n}: nu = {[mpmath.nstr(v, 20) for v in nu]}', file=sys.stderr)
    nu = spectrum(5, True)
    pts = []
    mid = float(nu[1])
    lo, hi = float(nu[0]), float(nu[2])
    # next to the middle eigenvalue, and next to the two ends (there one weight is tiny and all the
    # others have one sign: sin(theta) tends to 1, not 0, beyond 1/|tiny weight|)
    near = [ulps(mid, k) for k in [-2, -1, 0, 1, 2]] + [mid * (1 + s) for s in [-1e-9, 1e-9, -1e-12, 1e-12]]
    near += [ulps(lo, k) for k in [1, 2, 8]] + [lo * (1 + 1e-12), lo * (1 + 1e-10)]
    near += [ulps(hi, -k) for k in [1, 2, 8]] + [hi * (1 - 1e-12), hi * (1 - 1e-10)]
    for c in near:
        a = imhof_lower(nu, mpf(c), 'tanh-sinh')
        b = imhof_lower(nu, mpf(c), 'gauss-legendre')
        if abs(a - b) > mpf(10) ** -25:
            print(f'disagreement at c = {c}: {a} vs {b}', file=sys.stderr)
            sys.exit(1)
        up = 1 - a if a < mpf('0.5') else imhof_upper(nu, mpf(c))
        pts.append({'c': repr(c), 'lower': repr(float(a)), 'upper': repr(float(up))})
    q = mpf('0.05')
    crit = mp.findroot(lambda c: imhof_lower(nu, c, 'tanh-sinh') - q, (nu[0] + mpf('0.01'), nu[1]), solver='anderson')
    cases.append({'id': 'm3-n5', 'n': 5, 'trend': True, 'nu': [repr(float(v)) for v in nu], 'points': pts, 'quantile05': repr(float(crit))})
    out = {'generator': 'test/ref/edge_reference.py', 'mpmathVersion': mpmath.__version__, 'digits': mp.dps, 'cases': cases}
    with open(os.path.join(HERE, 'edge-reference.json'), 'w') as fh:
        json.dump(out, fh, indent=1)
        fh.write('\n')


if __name__ == '__main__':
    main()
