"""
Reference values for the Breusch-Godfrey test of order p beside d in a static model, and for the
first-order residual autocorrelation rho-hat, computed independently of exact-dw with numpy least
squares (numpy.linalg.lstsq) and scipy's chi-square and F tails.

Definitions (Breusch 1978; Godfrey 1978; as documented in src/dynamic/serial-tests.ts): fit y on
X (with an intercept) by OLS, residuals e; regress e on X and e lagged 1..p periods, where the
lag is in time units: e_{t-j} is the residual at period t - j when that period is observed and 0
otherwise (before the sample, or across a gap). R^2 = 1 - RSS_aux / e'e, LM = n R^2 with
P(chi^2_p >= LM); F = (R^2 / p) / ((1 - R^2) / (n - k - p)) with P(F(p, n - k - p) >= F).
rho-hat = sum over pairs one period apart of e_t e_{t-1}, divided by sum e_t^2.

The data are invented (seeded); only their use as a check matters.
Run: python3 test/ref/bg_static.py  (writes test/ref/bg-static.json)
"""
import json
import os

import numpy as np
from scipy import stats


def lagged(e, periods, j):
    index = {int(p): i for i, p in enumerate(periods)}
    return np.array([e[index[int(p) - j]] if int(p) - j in index else 0.0 for p in periods])


def case(name, seed, n, k_extra, order, gaps=()):
    rng = np.random.default_rng(seed)
    periods = [p for p in range(1, n + 1 + len(gaps)) if p not in gaps]
    n = len(periods)
    X = np.column_stack([np.ones(n)] + [rng.normal(size=n) for _ in range(k_extra)])
    u = np.zeros(n)
    eps = rng.normal(size=n)
    for i in range(n):
        u[i] = (0.5 * u[i - 1] if i > 0 else 0.0) + eps[i]
    y = X @ np.arange(1, k_extra + 2) + u
    beta = np.linalg.lstsq(X, y, rcond=None)[0]
    e = y - X @ beta
    Z = np.column_stack([X] + [lagged(e, periods, j) for j in range(1, order + 1)])
    g = np.linalg.lstsq(Z, e, rcond=None)[0]
    rss = float(np.sum((e - Z @ g) ** 2))
    ee = float(e @ e)
    r2 = 1 - rss / ee
    k = X.shape[1]
    lm = n * r2
    df2 = n - k - order
    f = (r2 / order) / ((1 - r2) / df2)
    e1 = lagged(e, periods, 1)
    rho = float(np.sum(e * e1) / ee)
    return {
        "name": name, "order": order, "times": [int(p) for p in periods],
        "y": [float(v) for v in y], "x": {f"x{j}": [float(v) for v in X[:, j]] for j in range(1, k)},
        "lm": lm, "pChiSquare": float(stats.chi2.sf(lm, order)), "f": f, "pF": float(stats.f.sf(f, order, df2)),
        "df2": df2, "rSquared": r2, "rhoHat": rho,
    }


cases = [
    case("n = 30, one regressor, order 1", 11, 30, 1, 1),
    case("n = 40, two regressors, order 4", 12, 40, 2, 4),
    case("n = 28, quarterly-like with gaps at 7 and 15, order 4", 13, 28, 1, 4, gaps=(7, 15)),
    case("n = 60, three regressors, order 2", 14, 60, 3, 2),
]
out = os.path.join(os.path.dirname(__file__), "bg-static.json")
with open(out, "w") as fh:
    json.dump({"source": "numpy.linalg.lstsq and scipy.stats (bg_static.py)", "cases": cases}, fh, indent=1)
print(f"wrote {out}: {len(cases)} cases")
