"""Reference values for the pooled panel Durbin-Watson test (exact-dw test/panel.test.ts).

An independent dense computation, written without the TypeScript code: for an invented panel
(entities with different numbers of periods, one with a gap in time, rows given out of order),

  * the pairs of d: rows of the same entity whose times differ by exactly 1,
  * A = D'D (dense n x n), X for the pooled model (intercept + regressors) and for the
    fixed-effects model (one indicator per entity instead of the intercept),
  * M = I - X (X'X)^{-1} X' and the spectrum of M A M with numpy (its k zero eigenvalues are the
    columns of X; the other m = n - k are nu), checked against eig(Z'AZ) for an orthonormal basis
    Z of the complement of col(X) from a full QR,
  * d from the least-squares residuals, and P(D <= d), P(D >= d) by Imhof's (1961) integral in
    mpmath at 30 digits, cross-checked by scipy.integrate.quad in double precision.

Run from the repository root:  nice python3 test/ref/panel_reference.py
It writes test/ref/panel-reference.json (numpy, scipy and mpmath versions recorded there).
"""
import json
import math
import os
import sys

import mpmath
import numpy as np
import scipy
from scipy import integrate

mpmath.mp.dps = 30


def panel_rows():
    """Invented panel: 4 entities, 9, 12, 7 and 10 periods; entity 'north' misses period 5."""
    spec = [("north", 9), ("south", 12), ("east", 7), ("west", 10)]
    rows = []
    for e, (name, count) in enumerate(spec):
        times = [t for t in range(1, count + 2) if not (name == "north" and t == 5)][:count]
        for t in times:
            x1 = round(3 + math.cos(0.7 * t + e), 4)
            x2 = round(0.5 * t + math.sin(1.9 * t * (e + 1)), 4)
            y = round(2 + 0.8 * x1 - 0.3 * x2 + math.sin(1.3 * t + 2 * e) + 0.4 * math.cos(2.9 * t * (e + 2)), 4)
            rows.append((name, 2000 + t, y, x1, x2))
    # give the rows out of order (a fixed permutation), as a file sorted by time would
    order = sorted(range(len(rows)), key=lambda i: ((i * 37) % len(rows), i))
    return [rows[i] for i in order]


def imhof_mp(lams):
    """P(sum lams_i z_i^2 <= 0) by Imhof's integral in mpmath."""
    lams = [mpmath.mpf(v) for v in lams if v != 0]

    def f(u):
        if u == 0:
            return mpmath.mpf(sum(lams)) / 2
        theta = sum(mpmath.atan(l * u) for l in lams) / 2
        rho = mpmath.exp(sum(mpmath.log(1 + (l * u) ** 2) for l in lams) / 4)
        return mpmath.sin(theta) / (u * rho)

    pts = [0, 0.25, 1, 4, 16, 64, 256, mpmath.inf]
    val = mpmath.quad(f, pts)
    return mpmath.mpf(1) / 2 - val / mpmath.pi


def imhof_scipy(lams):
    lams = np.asarray(lams, dtype=float)

    def f(u):
        if u == 0:
            return lams.sum() / 2
        theta = 0.5 * np.arctan(lams * u).sum()
        rho = np.exp(0.25 * np.log1p((lams * u) ** 2).sum())
        return math.sin(theta) / (u * rho)

    val, _ = integrate.quad(f, 0, np.inf, limit=2000, epsabs=1e-13, epsrel=1e-12)
    return 0.5 - val / math.pi


def case(rows, entity_effects):
    # sort by entity (order of first appearance) and time: the pairs do not depend on this order
    first = {}
    for r in rows:
        first.setdefault(r[0], len(first))
    srt = sorted(rows, key=lambda r: (first[r[0]], r[1]))
    n = len(srt)
    y = np.array([r[2] for r in srt])
    regs = np.array([[r[3], r[4]] for r in srt])
    ents = list(first)
    if entity_effects:
        dummies = np.array([[1.0 if r[0] == e else 0.0 for e in ents] for r in srt])
        X = np.hstack([regs, dummies])
    else:
        X = np.hstack([np.ones((n, 1)), regs])
    k = X.shape[1]
    pairs = [(i - 1, i) for i in range(1, n) if srt[i][0] == srt[i - 1][0] and srt[i][1] - srt[i - 1][1] == 1]
    D = np.zeros((len(pairs), n))
    for p, (s, t) in enumerate(pairs):
        D[p, s], D[p, t] = -1.0, 1.0
    A = D.T @ D
    M = np.eye(n) - X @ np.linalg.solve(X.T @ X, X.T)
    eig_mam = np.sort(np.linalg.eigvalsh(M @ A @ M))
    Q, _ = np.linalg.qr(X, mode="complete")
    Z = Q[:, k:]
    nu = np.sort(np.linalg.eigvalsh(Z.T @ A @ Z))
    # M A M has the m values nu and k zeros
    both = np.sort(np.concatenate([nu, np.zeros(k)]))
    assert np.max(np.abs(both - eig_mam)) < 1e-12, "spectrum of M A M disagrees with Z'AZ"
    beta, *_ = np.linalg.lstsq(X, y, rcond=None)
    e = y - X @ beta
    d = sum((e[t] - e[s]) ** 2 for s, t in pairs) / float(e @ e)
    lower = imhof_mp(nu - d)
    upper = imhof_mp(d - nu)
    assert abs(lower + upper - 1) < 1e-20, "the two tails do not add to one"
    lo_sp = imhof_scipy(nu - d)
    assert abs(float(lower) - lo_sp) < 1e-9, (float(lower), lo_sp)
    grid = [1.2, 1.6, 2.0, 2.4]
    return {
        "entityEffects": entity_effects,
        "n": n,
        "k": k,
        "pairs": len(pairs),
        "d": d,
        "nu": [float(v) for v in nu],
        "pPositive": float(lower),
        "pNegative": float(upper),
        "cdf": [{"c": c, "p": float(imhof_mp(nu - c))} for c in grid],
    }


def main():
    rows = panel_rows()
    out = {
        "generator": "test/ref/panel_reference.py",
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "mpmath": mpmath.__version__,
        "rows": [{"entity": r[0], "time": r[1], "y": r[2], "x1": r[3], "x2": r[4]} for r in rows],
        "cases": [case(rows, False), case(rows, True)],
    }
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "panel-reference.json")
    with open(path, "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")
    for c in out["cases"]:
        print(f"entityEffects={c['entityEffects']}: n={c['n']} k={c['k']} pairs={c['pairs']} d={c['d']:.6f} P(D<=d)={c['pPositive']:.6e}", file=sys.stderr)


if __name__ == "__main__":
    main()
