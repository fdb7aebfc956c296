"""Reference values for a small batch (exact-dw test/batch-reference.test.ts).

An invented file of 8 series (n = 14 to 30, one with a gap in time, three sharing a design) and,
for each series, d and P(D <= d) computed independently: numpy builds X, A (pairs only between
times exactly one apart), a complete QR, the eigenvalues of Z'AZ and the residuals; mpmath
evaluates Imhof's (1961) integral at 30 digits. The Holm (1979) and Benjamini-Hochberg (1995)
adjusted p-values of the family are computed here too, by the textbook formulas written with numpy
(sorted p-values, cumulative maximum / minimum), as a second implementation of src/batch/adjust.ts.

Run from the repository root:  nice python3 test/ref/batch_reference.py
It writes test/ref/batch-reference.json.
"""
import json
import math
import os

import mpmath
import numpy as np

mpmath.mp.dps = 30


def imhof_lower(lams):
    lams = [mpmath.mpf(float(v)) for v in lams if v != 0]

    def f(u):
        if u == 0:
            return sum(lams) / 2
        theta = sum(mpmath.atan(l * u) for l in lams) / 2
        rho = mpmath.exp(sum(mpmath.log(1 + (l * u) ** 2) for l in lams) / 4)
        return mpmath.sin(theta) / (u * rho)

    return float(mpmath.mpf(1) / 2 - mpmath.quad(f, [0, 0.25, 1, 4, 16, 64, 256, mpmath.inf]) / mpmath.pi)


def rows():
    out = []
    spec = [("alpha", 20, 0), ("beta", 20, 0), ("gamma", 20, 0), ("delta", 14, 1), ("eps", 30, 2), ("zeta", 24, 3), ("eta", 18, 4), ("theta", 22, 5)]
    for s, (name, n, v) in enumerate(spec):
        times = [t for t in range(1, n + 2) if not (name == "zeta" and t == 9)][:n]
        for t in times:
            x = round(2 + math.cos(0.6 * t + v) + (0.1 * math.sin(2.3 * t) if v else 0), 4)
            y = round(1 + 0.5 * x + math.sin(1.7 * t * (s + 1)) + (0.8 * math.sin(0.35 * t + s) if s % 2 else 0.3 * math.cos(2.1 * t + s)), 4)
            out.append((name, t, y, x))
    return out


def series(rs):
    y = np.array([r[2] for r in rs])
    X = np.column_stack([np.ones(len(rs)), [r[3] for r in rs]])
    t = [r[1] for r in rs]
    n, k = X.shape
    A = np.zeros((n, n))
    for i in range(1, n):
        if t[i] - t[i - 1] == 1:
            A[i, i] += 1; A[i - 1, i - 1] += 1; A[i, i - 1] -= 1; A[i - 1, i] -= 1
    Q, _ = np.linalg.qr(X, mode="complete")
    Z = Q[:, k:]
    nu = np.linalg.eigvalsh(Z.T @ A @ Z)
    e = y - Q[:, :k] @ (Q[:, :k].T @ y)
    d = float(e @ A @ e) / float(e @ e)
    return d, imhof_lower(nu - d)


def holm(p):
    p = np.asarray(p); m = len(p); o = np.argsort(p, kind="stable")
    adj = np.minimum(1, np.maximum.accumulate((m - np.arange(m)) * p[o]))
    out = np.empty(m); out[o] = adj
    return out


def bh(p):
    p = np.asarray(p); m = len(p); o = np.argsort(p, kind="stable")
    adj = np.minimum(1, np.minimum.accumulate((m * p[o] / np.arange(1, m + 1))[::-1])[::-1])
    out = np.empty(m); out[o] = adj
    return out


def main():
    rs = rows()
    labels = list(dict.fromkeys(r[0] for r in rs))
    groups = []
    for g in labels:
        d, p = series([r for r in rs if r[0] == g])
        groups.append({"group": g, "d": d, "pPositive": p})
    ps = [g["pPositive"] for g in groups]
    for g, h, b in zip(groups, holm(ps), bh(ps)):
        g["holm"] = float(h); g["bh"] = float(b)
    out = {
        "generator": "test/ref/batch_reference.py", "numpy": np.__version__, "mpmath": mpmath.__version__,
        "csv": "shop,week,sales,price\n" + "".join(f"{r[0]},{r[1]},{r[2]},{r[3]}\n" for r in rs),
        "groups": groups,
    }
    with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "batch-reference.json"), "w") as f:
        json.dump(out, f, indent=1); f.write("\n")


if __name__ == "__main__":
    main()
