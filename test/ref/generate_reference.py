#!/usr/bin/env python3
"""Arbitrary-precision reference values for exact-dw.

Writes test/ref/reference.json (format described in test/ref/README.md). Pure Python + mpmath;
no numpy, no randomness outside the small LCG below (its seeds are stored in the case
descriptions). Run from the repository root:

    nice python3 test/ref/generate_reference.py
    nice python3 test/ref/generate_reference.py --out /tmp/part.json trend-n20 gaps-n27   # subset

Notation follows docs/methods.md: X (n x k), A = D'D for lag J (and optional times),
Z an orthonormal basis of the complement of col(X), nu = eig(Z'AZ) (m = n - k values, ascending),
lambda_i = nu_i - c, P(d <= c) = P(sum lambda_i z_i^2 <= 0).

Every probability is computed by Imhof's integral (primary value, the one stored) and checked
against at least one second method:
  * Pan's finite-range form (docs/methods.md section 4) when the spectrum has no ties,
  * closed forms for special spectra (m = 2 arcsine law; all multiplicities even: partial
    fractions of the Laplace transform, generalised to repeated poles),
  * Pan's form in the limit of split ties (Richardson extrapolation) when some multiplicity
    is odd and > 1,
  * the Laplace inversion integral along a vertical line through the saddlepoint
    (a shifted contour; tails computed directly, no cancellation) for every point whose
    spectrum has ties, every far-tail point and every power value.
The script exits with status 1 (and writes nothing) if any disagreement exceeds 1e-25 absolute
or 1e-20 relative to the smaller tail, or if two methods round to different doubles.
"""

import json
import math
import os
import sys
import time
from fractions import Fraction

import mpmath
import mpmath.matrices.eigen_symmetric
from mpmath import mp, mpf
from mpmath.libmp import round_nearest, to_float

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "reference.json")

WORK_DPS = 50          # working precision (decimal digits) of spectrum and integrals
IMHOF_TOL = mpf(10) ** -40   # absolute tolerance on the Imhof integral I (P = 1/2 -+ I/pi)
SHIFT_TOL = mpf(10) ** -42   # absolute tolerance on the shifted-contour tail integrals
PAN_REL = 1e-35        # relative tolerance aimed for in Pan's sum
FAIL_ABS = 1e-25       # a disagreement above this (absolute) fails the run
FAIL_REL = 1e-20       # ... or above this relative to the smaller of lower/upper
TIE_TOL = 1e-40        # eigenvalues closer than this are one eigenvalue with multiplicity
PAN_MIN_GAP = 1e-8     # Pan's form is used only if all gaps exceed this


def log(msg):
    print(msg, file=sys.stderr, flush=True)


def ulp(x):
    return math.ulp(x) if x != 0 else 5e-324


def to_double(x):
    """Nearest double to an mpf (mpmath's float() truncates)."""
    return to_float(mpf(x)._mpf_, rnd=round_nearest)


# ----------------------------------------------------------------------------------------------
# Designs
# ----------------------------------------------------------------------------------------------

class LCG:
    """64-bit linear congruential generator (multiplier and increment of Knuth's MMIX).

    Used only to make 'random-looking' design columns reproducibly; values are dyadic
    fractions j/16 so that every entry is an exactly representable double.
    """

    MUL = 6364136223846793005
    INC = 1442695040888963407

    def __init__(self, seed):
        self.state = seed % 2 ** 64

    def next31(self):
        self.state = (self.MUL * self.state + self.INC) % 2 ** 64
        return self.state >> 33

    def dyadic(self, lo, hi, den=16):
        """Uniform on {lo, lo + 1/den, ..., hi - 1/den}."""
        return Fraction(lo) + Fraction(self.next31() % ((hi - lo) * den), den)


def lcg_columns(seed, n, ncols, lo=-4, hi=4):
    g = LCG(seed)
    return [[g.dyadic(lo, hi) for _ in range(n)] for _ in range(ncols)]


def make_case(cid, description, cols, intercept, lag=1, times=None, tails=False):
    n = len(cols[0])
    x = [[Fraction(col[i]) for col in cols] for i in range(n)]
    for row in x:
        for v in row:
            d = v.denominator
            assert d & (d - 1) == 0 and Fraction(float(v)) == v, "design entry not a double"
    return dict(id=cid, description=description, n=n, lag=lag, times=times,
                intercept=intercept, xfrac=x, k=len(cols), tails=tails)


def designs():
    cases = []

    def const(n):
        return [1] * n

    def trend(n):
        return list(range(1, n + 1))

    def power_col(n, p):
        return [t ** p for t in range(1, n + 1)]

    def quarter(n, q):  # dummy for quarter q (1..4), observation t = 1..n in quarter ((t-1) mod 4)+1
        return [1 if (t - 1) % 4 == q - 1 else 0 for t in range(1, n + 1)]

    cases.append(make_case(
        "const-n10", "intercept only, n = 10 (nu_i = 2 - 2 cos(pi i / n) exactly)",
        [const(10)], True))
    cases.append(make_case(
        "trend-n6", "intercept + linear trend t = 1..6", [const(6), trend(6)], True))
    cases.append(make_case(
        "poly3-n6", "intercept, t, t^2, t^3 with t = 1..6 (m = 2: arcsine law)",
        [const(6), trend(6), power_col(6, 2), power_col(6, 3)], True))
    for n in (15, 20):
        cases.append(make_case(
            f"trend-n{n}", f"intercept + linear trend t = 1..{n}", [const(n), trend(n)], True,
            tails=(n == 20)))
    cases.append(make_case(
        "quad-n30", "intercept + t + t^2, t = 1..30",
        [const(30), trend(30), power_col(30, 2)], True, tails=True))
    cases.append(make_case(
        "trend-n50", "intercept + linear trend t = 1..50", [const(50), trend(50)], True,
        tails=True))
    cases.append(make_case(
        "quarterly-n40", "intercept + quarter-2,3,4 dummies + trend t = 1..40 (quarter of t is "
        "((t-1) mod 4) + 1), lag 1",
        [const(40), quarter(40, 2), quarter(40, 3), quarter(40, 4), trend(40)], True))
    cols = lcg_columns(20240601, 25, 3)
    cases.append(make_case(
        "lcg-n25-k4", "intercept + 3 LCG columns (seed 20240601, values j/16 in [-4, 4))",
        [const(25)] + cols, True))
    cols = lcg_columns(777, 60, 7)
    cases.append(make_case(
        "lcg-n60-k8", "intercept + 7 LCG columns (seed 777, values j/16 in [-4, 4))",
        [const(60)] + cols, True, tails=True))
    cases.append(make_case(
        "noint-trend-n12", "no intercept: single column t = 1..12", [trend(12)], False,
        tails=True))
    cols = lcg_columns(31337, 40, 3)
    cases.append(make_case(
        "noint-lcg-n40-k3", "no intercept: 3 LCG columns (seed 31337, values j/16 in [-4, 4))",
        cols, False))
    cases.append(make_case(
        "lag4-seasonal-n32", "lag 4, intercept + quarter-2,3,4 dummies, n = 32 (every eigenvalue "
        "has multiplicity 4)",
        [const(32), quarter(32, 2), quarter(32, 3), quarter(32, 4)], True, lag=4))
    cases.append(make_case(
        "lag4-seasonal-trend-n48", "lag 4, intercept + quarter-2,3,4 dummies + trend, n = 48 "
        "(eigenvalues of multiplicity 4, 3 and 1)",
        [const(48), quarter(48, 2), quarter(48, 3), quarter(48, 4), trend(48)], True, lag=4,
        tails=True))
    # gaps: years 1..30 without 8, 18, 19 -> runs of 7, 9, 11 consecutive years
    times = [t for t in range(1, 31) if t not in (8, 18, 19)]
    cases.append(make_case(
        "gaps-n27", "intercept + time, times 1..30 without 8, 18, 19 (runs of 7, 9, 11); "
        "nu_1 = 0 exactly (residuals constant on each run)",
        [[1] * len(times), list(times)], True, times=times, tails=True))
    # gaps with raw calendar years: runs of 11, 13, 17 years
    times = (list(range(1961, 1972)) + list(range(1974, 1987)) + list(range(1988, 2005)))
    lc = lcg_columns(4242, len(times), 1)[0]
    cases.append(make_case(
        "gaps-years-n41", "intercept + calendar year + 1 LCG column (seed 4242), years 1961..2004 "
        "without 1972, 1973, 1987 (runs of 11, 13, 17)",
        [[1] * len(times), list(times), lc], True, times=times))
    cases.append(make_case(
        "trend-n100", "intercept + linear trend t = 1..100", [const(100), trend(100)], True,
        tails=True))
    cols = lcg_columns(99991, 150, 5)
    cases.append(make_case(
        "lcg-n150-k6", "intercept + 5 LCG columns (seed 99991, values j/16 in [-4, 4))",
        [const(150)] + cols, True))
    cases.append(make_case(
        "trend-n200", "intercept + linear trend t = 1..200", [const(200), trend(200)], True,
        tails=True))
    cases.append(make_case(
        "quad-n300", "intercept + t + t^2, t = 1..300",
        [const(300), trend(300), power_col(300, 2)], True))
    return cases


def power_cases():
    """(id, design id, rho, c). rho and c are doubles; the mp computation uses those exact doubles."""
    return [
        ("power-trend-n20-rho0.3", "trend-n20", 0.3, 1.5),
        ("power-trend-n20-rho0.6", "trend-n20", 0.6, 1.5),
        ("power-trend-n20-rho-0.4", "trend-n20", -0.4, 1.5),
        ("power-trend-n50-rho0.3", "trend-n50", 0.3, 1.5),
        ("power-quarterly-n40-rho0.6", "quarterly-n40", 0.6, 1.5),
        ("power-lcg-n25-k4-rho-0.4", "lcg-n25-k4", -0.4, 2.5),
        ("power-noint-trend-n12-rho0.6", "noint-trend-n12", 0.6, 1.0),
        ("power-lag4-seasonal-n32-rho0.3", "lag4-seasonal-n32", 0.3, 1.5),
    ]


# ----------------------------------------------------------------------------------------------
# Linear algebra
# ----------------------------------------------------------------------------------------------

def build_A(n, lag, times):
    """A = D'D, one row of D per pair (s, t) with time_t - time_s == lag."""
    tt = times if times is not None else list(range(1, n + 1))
    pos = {t: i for i, t in enumerate(tt)}
    A = [[0] * n for _ in range(n)]
    for i, t in enumerate(tt):
        j = pos.get(t + lag)
        if j is not None:
            A[i][i] += 1
            A[j][j] += 1
            A[i][j] -= 1
            A[j][i] -= 1
    return A


def householder(xfrac):
    """Householder QR of X: list of (j, v, beta) with H_j = I - beta v v' acting on rows j..n-1."""
    n, k = len(xfrac), len(xfrac[0])
    R = [[mpf(v.numerator) / v.denominator for v in row] for row in xfrac]
    scale = max(abs(v) for row in R for v in row)
    refl = []
    for j in range(k):
        col = [R[i][j] for i in range(j, n)]
        alpha = mp.sqrt(mp.fsum(c * c for c in col))
        if alpha <= scale * mpf(10) ** -30:
            raise ValueError("design is rank deficient")
        v = list(col)
        v[0] += alpha if col[0] >= 0 else -alpha
        beta = 2 / mp.fsum(c * c for c in v)
        for jj in range(j, k):
            s = beta * mp.fdot(v, [R[i][jj] for i in range(j, n)])
            for i in range(j, n):
                R[i][jj] -= s * v[i - j]
        refl.append((j, v, beta))
    return refl


def compress(B, refl, k):
    """Trailing (n-k) x (n-k) block of Q'BQ (= Z'BZ), B symmetric (list of lists, modified)."""
    n = len(B)
    for (j, v, beta) in refl:
        sub = n - j
        p = [beta * mp.fdot(v, B[j + i][j:]) for i in range(sub)]
        K = beta * mp.fdot(v, p) / 2
        q = [p[i] - K * v[i] for i in range(sub)]
        for i in range(sub):
            row = B[j + i]
            vi, qi = v[i], q[i]
            for l in range(sub):
                row[j + l] -= vi * q[l] + qi * v[l]
    return [row[k:] for row in B[k:]]


def eig_sorted(T):
    return tridiag_eigenvalues(T)


def frac_inverse(G):
    k = len(G)
    M = [list(row) + [Fraction(int(i == j)) for j in range(k)] for i, row in enumerate(G)]
    for c in range(k):
        p = next(r for r in range(c, k) if M[r][c] != 0)
        M[c], M[p] = M[p], M[c]
        piv = M[c][c]
        M[c] = [v / piv for v in M[c]]
        for r in range(k):
            if r != c and M[r][c] != 0:
                f = M[r][c]
                M[r] = [a - f * b for a, b in zip(M[r], M[c])]
    return [row[k:] for row in M]


def exact_traces(xfrac, A):
    """Exact (rational) tr(MA) and tr((MA)^2) = sum nu and sum nu^2."""
    n, k = len(xfrac), len(xfrac[0])
    X = xfrac
    AX = [[sum((A[i][l] * X[l][j] for l in range(n) if A[i][l]), Fraction(0)) for j in range(k)]
          for i in range(n)]
    G = [[sum((X[l][a] * X[l][b] for l in range(n)), Fraction(0)) for b in range(k)]
         for a in range(k)]
    H1 = [[sum((X[l][a] * AX[l][b] for l in range(n)), Fraction(0)) for b in range(k)]
          for a in range(k)]
    H2 = [[sum((AX[l][a] * AX[l][b] for l in range(n)), Fraction(0)) for b in range(k)]
          for a in range(k)]
    Gi = frac_inverse(G)

    def mul(P, Q):
        return [[sum((P[i][l] * Q[l][j] for l in range(k)), Fraction(0)) for j in range(k)]
                for i in range(k)]

    def tr(P):
        return sum((P[i][i] for i in range(k)), Fraction(0))

    trA = sum(A[i][i] for i in range(n))
    trA2 = sum(A[i][j] ** 2 for i in range(n) for j in range(n))
    GH1 = mul(Gi, H1)
    S1 = trA - tr(GH1)
    S2 = trA2 - 2 * tr(mul(Gi, H2)) + tr(mul(GH1, GH1))
    return S1, S2


def group_ties(nu):
    """[(value, multiplicity)] with eigenvalues closer than TIE_TOL merged."""
    groups = []
    for v in nu:
        if groups and abs(v - groups[-1][0]) < TIE_TOL:
            val, mult = groups[-1]
            groups[-1] = ((val * mult + v) / (mult + 1), mult + 1)
        else:
            groups.append((v, 1))
    return groups


# ----------------------------------------------------------------------------------------------
# Fixed-point helpers. The inner loops (products over m eigenvalues, Householder updates) run on
# Python integers holding value * 2^FB; this is exact-rounding arithmetic with FB >= prec + 32
# bits, an order of magnitude faster than mpf objects in pure-Python mpmath.
# ----------------------------------------------------------------------------------------------

def to_fixed(x, fb):
    return int(mp.nint(mp.ldexp(x, fb)))


def from_fixed(v, e):
    """mpf value of the integer v times 2^e (rounded to the working precision)."""
    return +mpf((v, e))


def tridiag_eigenvalues(T):
    """Eigenvalues of the symmetric matrix T (list of lists of mpf) in ascending order:
    Householder tridiagonalisation in fixed point (entries are bounded by ||A|| <= 4, and
    orthogonal transformations keep them so), then mpmath's implicit QL (tridiag_eigen)."""
    n = len(T)
    if n == 1:
        return [+T[0][0]]
    FB = mp.prec + 40
    A = [[to_fixed(v, FB) for v in row] for row in T]
    e = [0] * n
    for j in range(n - 2):
        x = [A[i][j] for i in range(j + 1, n)]
        s2 = sum(xi * xi for xi in x)
        if s2 == x[0] * x[0]:          # column already reduced
            e[j] = x[0]
            continue
        alpha = math.isqrt(s2)
        if x[0] > 0:
            alpha = -alpha
        v = x
        v[0] -= alpha                  # |v0| = |x0| + |alpha|: no cancellation
        vv = sum(vi * vi for vi in v)
        rows = [A[i][j + 1:] for i in range(j + 1, n)]
        p = [((2 * sum(map(int.__mul__, row, v))) << FB) // vv for row in rows]
        K = (sum(map(int.__mul__, v, p)) << FB) // vv
        q = [pi - ((K * vi) >> FB) for pi, vi in zip(p, v)]
        for i, row in enumerate(rows):
            vi, qi = v[i], q[i]
            A[j + 1 + i][j + 1:] = [a - ((vi * ql + qi * vl) >> FB)
                                    for a, ql, vl in zip(row, q, v)]
        e[j] = alpha
    e[n - 2] = A[n - 1][n - 2]
    d = [from_fixed(A[i][i], -FB) for i in range(n)]
    ee = [from_fixed(v, -FB) for v in e]
    ee[n - 1] = mpf(0)
    mpmath.matrices.eigen_symmetric.tridiag_eigen(mp, d, ee, False)
    return sorted(d)


# ----------------------------------------------------------------------------------------------
# Quadrature: adaptive composite Gauss-Legendre with a pair of rules as error estimate
# ----------------------------------------------------------------------------------------------

_GL_CACHE = {}


def gl_rule(N):
    """Gauss-Legendre nodes/weights on [-1, 1], computed once at high precision."""
    need = mp.prec + 40
    if N in _GL_CACHE and _GL_CACHE[N][0] >= need:
        return _GL_CACHE[N][1]
    prec = max(need, 1400)
    with mp.workprec(prec):
        nodes = []
        for i in range(1, (N + 1) // 2 + 1):
            x = mp.cos(mp.pi * (i - mpf(1) / 4) / (N + mpf(1) / 2))
            for _ in range(200):
                p0, p1 = mpf(1), x
                for j in range(2, N + 1):
                    p0, p1 = p1, ((2 * j - 1) * x * p1 - (j - 1) * p0) / j
                dp = N * (x * p1 - p0) / (x * x - 1)
                dx = p1 / dp
                x -= dx
                if abs(dx) < mpf(2) ** (-prec + 8):
                    break
            p0, p1 = mpf(1), x
            for j in range(2, N + 1):
                p0, p1 = p1, ((2 * j - 1) * x * p1 - (j - 1) * p0) / j
            dp = N * (x * p1 - p0) / (x * x - 1)
            w = 2 / ((1 - x * x) * dp * dp)
            nodes.append((x, w))
            if not (N % 2 == 1 and i == (N + 1) // 2):
                nodes.append((-x, w))
    _GL_CACHE[N] = (prec, nodes)
    return nodes


N_LO, N_HI = 30, 40
COUNT = {"evals": 0}


def gl_panel(f, a, b, N):
    """(GL_N integral of f over [a, b], GL_N integral of |f|)."""
    h = (b - a) / 2
    c = (a + b) / 2
    vals = [w * f(c + h * x) for x, w in gl_rule(N)]
    return h * mp.fsum(vals), abs(h) * mp.fsum(abs(v) for v in vals)


def adapt(f, a, b, tol, depth=0):
    """Integral of f over [a, b]; a panel is accepted when |GL40 - GL30| is below its share of
    tol (or below the rounding level 2^20 eps int|f| of the working precision), otherwise it is
    bisected. Returns (GL40 sum, sum of |GL40 - GL30|)."""
    lo, _ = gl_panel(f, a, b, N_LO)
    hi, habs = gl_panel(f, a, b, N_HI)
    COUNT["evals"] += N_LO + N_HI
    err = abs(hi - lo)
    if err <= tol or err <= habs * mp.eps * 2 ** 20:
        return hi, err
    if depth >= 60:
        raise RuntimeError("quadrature did not converge")
    m = (a + b) / 2
    v1, e1 = adapt(f, a, m, tol / 2, depth + 1)
    v2, e2 = adapt(f, m, b, tol / 2, depth + 1)
    return v1 + v2, e1 + e2


def log_panels(f, x0, m, logprod, tol):
    """int_0^inf f: [0, x0] directly, then unit panels in s = log x until the bound
    x^(-m/2) / ((m/2) exp(logprod)) on the remainder is below tol/4. Returns (value, error)."""
    log_end = -(mp.log(tol / 4) + mp.log(mpf(m) / 2) + logprod) * 2 / m
    s0 = mp.log(x0)
    npan = max(1, int(mp.ceil(log_end - s0)))
    ptol = tol / (4 * (npan + 1))

    def g(s):
        x = mp.exp(s)
        return f(x) * x

    total, err = adapt(f, mpf(0), x0, ptol)
    s = s0
    for _ in range(npan):
        v, e = adapt(g, s, s + 1, ptol)
        total += v
        err += e
        s += 1
    return total, err + mp.exp(-s * m / 2 - logprod) / (mpf(m) / 2)


def scaled_fixed(vals, fb):
    """Fixed-point images of vals with enough extra bits that the smallest keeps full precision;
    returns (ints at scale 2^(fb + extra), extra)."""
    smallest = min(abs(v) for v in vals)
    extra = max(0, -int(mp.floor(mp.log(smallest, 2)))) + 8
    return [to_fixed(v, fb + extra) for v in vals], extra


def times_fixed(L, extra, t):
    """[l * t * 2^fb] for l in L (ints at scale 2^(fb + extra)), t > 0 an mpf."""
    sign, man, exp, bc = t._mpf_
    sh = exp - extra
    if sh >= 0:
        return [(l * man) << sh for l in L]
    return [(l * man) >> -sh for l in L]


# ----------------------------------------------------------------------------------------------
# Engine 1 (primary): Imhof's integral
# ----------------------------------------------------------------------------------------------

def imhof_integral(lams, tol):
    """I = int_0^inf sin(theta(u)) / (u rho(u)) du; P(Q > 0) = 1/2 + I/pi, P(Q <= 0) = 1/2 - I/pi.

    The continuous branch of sum arctan(lambda_j u) is the argument of prod (1 + i lambda_j u),
    followed factor by factor (each factor turns it by less than pi/2; a crossing of the negative
    real axis is counted). [0, u0] with u0 = 1/max|lambda| by GL panels; [u0, inf) in s = log u
    (singularities at Im s = +-pi/2) in unit panels up to U where the bound
    T(U) = U^(-m/2) / ((m/2) prod |lambda|^(1/2)) on the remainder is below tol/4.
    """
    lams = [l for l in lams if l != 0]
    m = len(lams)
    FB = mp.prec + 32
    LF, extra = scaled_fixed(lams, FB)
    twopi = 2 * mp.pi
    top = FB + 64

    def f(u):
        xs = times_fixed(LF, extra, u)
        pr, pim, E, w = 1 << FB, 0, -FB, 0
        for x in xs:
            npr = pr - ((pim * x) >> FB)
            npi = pim + ((pr * x) >> FB)
            if x > 0:
                if pim >= 0 and npi < 0:
                    w += 1
            elif pim < 0 and npi >= 0:
                w -= 1
            pr, pim = npr, npi
            bl = max(pr.bit_length(), pim.bit_length())
            if bl > top:
                sh = bl - FB
                pr >>= sh
                pim >>= sh
                E += sh
        PR, PI = from_fixed(pr, E), from_fixed(pim, E)
        theta = (mp.atan2(PI, PR) + twopi * w) / 2
        return mp.sin(theta) / (u * mp.sqrt(mp.hypot(PR, PI)))

    u0 = 1 / max(abs(l) for l in lams)
    logprod = mp.fsum(mp.log(abs(l)) for l in lams) / 2
    return log_panels(f, u0, m, logprod, tol)


def imhof_probs(lams, tol=None):
    tol = IMHOF_TOL if tol is None else tol
    I, err = imhof_integral(lams, tol)
    return mpf(1) / 2 - I / mp.pi, mpf(1) / 2 + I / mp.pi, err / mp.pi


# ----------------------------------------------------------------------------------------------
# Engine 2: Pan's finite-range form (distinct eigenvalues)
# ----------------------------------------------------------------------------------------------

def pan_terms(nu, c):
    """Signed integrands of Pan's sum for P(d <= c) (before the factor 1/pi), on phi in [0, pi/2].

    Full interval [nu_r, nu_{r+1}]: w = nu_r + D sin^2(phi) turns the two end singularities into
    the constant 2: integrand 2 (c - w)^((m-2)/2) prod_{i != r, r+1} |w - nu_i|^(-1/2).
    Interval [nu_r, c]: w = nu_r + L sin^2(phi): 2 L^((m-1)/2) cos^(m-1)(phi)
    prod_{i != r} |w - nu_i|^(-1/2). The products are formed in fixed point (differences exact).
    """
    m = len(nu)
    FB = mp.prec + 40
    NF = [to_fixed(v, FB) for v in nu]
    CF = to_fixed(c, FB)
    lim = 2 * FB + 64

    def halfpow(x, p):  # x^(p/2), x > 0, p integer >= 0
        r = x ** (p // 2)
        return r * mp.sqrt(x) if p % 2 else r

    def invsqrt_prod(W, others):
        """prod |w - nu_i|^(-1/2), w given in fixed point (W = NF[r] + offset, so that the
        differences to nearby eigenvalues keep full relative precision)."""
        acc, E = 1, 0
        for V in others:
            d = W - V
            acc *= d if d >= 0 else -d
            bl = acc.bit_length()
            if bl > lim:
                acc >>= bl - FB
                E += bl - FB
        return 1 / mp.sqrt(from_fixed(acc, E - FB * len(others)))

    terms = []
    r = 0  # 0-based index; r = 0, 2, 4, ... are the odd r of the 1-based formula
    while r < m and nu[r] < c:
        sign = 1 if (r // 2) % 2 == 0 else -1
        nr = nu[r]
        if r == m - 1 or c <= nu[r + 1]:
            L = c - nr
            pref = 2 * halfpow(L, m - 1)
            others = NF[:r] + NF[r + 1:]

            def f(phi, NR=NF[r], L=L, others=others, pref=pref):
                sn, cs = mp.sin(phi), mp.cos(phi)
                if sn < cs:
                    W = NR + to_fixed(L * sn * sn, FB)
                else:
                    W = CF - to_fixed(L * cs * cs, FB)
                return pref * cs ** (m - 1) * invsqrt_prod(W, others)
        else:
            D = nu[r + 1] - nr
            others = NF[:r] + NF[r + 2:]

            def f(phi, NR=NF[r], NR1=NF[r + 1], D=D, others=others, cr=c - nr, cr1=c - nu[r + 1]):
                # offsets taken from the nearer end, so that differences to eigenvalues
                # clustered at either end keep their relative precision
                sn, cs = mp.sin(phi), mp.cos(phi)
                if sn < cs:
                    off = D * sn * sn
                    return 2 * halfpow(cr - off, m - 2) * invsqrt_prod(NR + to_fixed(off, FB), others)
                off = D * cs * cs
                return 2 * halfpow(cr1 + off, m - 2) * invsqrt_prod(NR1 - to_fixed(off, FB), others)
        terms.append((sign, f))
        r += 2
    return terms


def pan_lower(nu, c, rel=PAN_REL, min_dps=None, hint=None):
    """P(d <= c) by Pan's form, in two passes: a low-precision pass measures the cancellation
    (log10 of sum |term| / |sum|), the second pass runs with that many extra digits.
    hint = (rough value, digits lost) from a previous call on a nearby spectrum skips the first
    pass. Returns (probability, digits lost to cancellation)."""
    min_dps = WORK_DPS if min_dps is None else min_dps
    if c <= nu[0]:
        return mpf(0), 0
    if c >= nu[-1]:
        return mpf(1), 0
    dps1 = 30
    while hint is None:
        with mp.workdps(dps1):
            vals = []
            for sign, f in pan_terms([+v for v in nu], +mpf(c)):
                v0 = gl_panel(f, mpf(0), mp.pi / 2, 20)[0]
                v, _ = adapt(f, mpf(0), mp.pi / 2, mpf(10) ** -15 * abs(v0) + mpf(10) ** (-dps1))
                vals.append(sign * v)
            p1 = abs(mp.fsum(vals))
            mag = mp.fsum(abs(v) for v in vals)
            loss = max(0, int(mp.ceil(mp.log10(mag / p1)))) if p1 > 0 else dps1
        if loss <= dps1 - 20:
            break
        dps1 = loss + 40
    if hint is not None:
        p1, loss = abs(hint[0]), hint[1] + 2
    digits = int(-math.log10(rel))
    dps = max(min_dps, digits + 10 + loss)
    with mp.workdps(dps):
        terms = pan_terms([+v for v in nu], +mpf(c))
        tol = mpf(rel) * p1 * mp.pi / len(terms)
        total = mpf(0)
        for sign, f in terms:
            v, _ = adapt(f, mpf(0), mp.pi / 2, tol)
            total += sign * v
        res = total / mp.pi
    return +res, loss


def pan_upper(nu, c, **kw):
    """P(d >= c) via the mirror form (nu -> -nu, c -> -c)."""
    return pan_lower([-v for v in reversed(nu)], -c, **kw)


SPLIT_DELTAS = ("1e-10", "2e-10", "4e-10")


def split_pan(groups, c, side):
    """Pan's form for a spectrum with ties, as a limit: every eigenvalue of multiplicity p is
    split into p values spaced delta apart, symmetric about it. P(delta) is smooth and even in
    delta (the split spectra for delta and -delta coincide), so P(delta) = P0 + a delta^2 +
    b delta^4 + ...; two Richardson steps over delta, 2 delta, 4 delta remove a and b.
    Returns (extrapolated P(d <= c) or P(d >= c), |last Richardson correction|)."""
    fn = pan_lower if side == "lower" else pan_upper
    vals = []
    hint = None
    for ds in SPLIT_DELTAS:  # smallest delta first: it loses the most digits
        delta = mpf(ds)
        nu_s = sorted(v + (i - mpf(p - 1) / 2) * delta for v, p in groups for i in range(p))
        v, loss = fn(nu_s, c, hint=hint)
        hint = hint or (v, loss)
        vals.append(v)
    r1a = (4 * vals[0] - vals[1]) / 3
    r1b = (4 * vals[1] - vals[2]) / 3
    r2 = (16 * r1a - r1b) / 15
    return r2, abs(r2 - r1a)


# ----------------------------------------------------------------------------------------------
# Engine 3: Laplace inversion along Re s = sigma through the saddlepoint
# ----------------------------------------------------------------------------------------------

def saddle_sigma(lams, side):
    """Minimiser of K(s) - log|s| on (1/(2 lam_min), 0) (side 'lower') or (0, 1/(2 lam_max)),
    K(s) = -(1/2) sum log(1 - 2 lambda s); rounded to a double."""
    with mp.workdps(20):
        lmin, lmax = min(lams), max(lams)
        if side == "lower":
            a, b = 1 / (2 * lmin), mpf(0)
        else:
            a, b = mpf(0), 1 / (2 * lmax)

        def dphi(s):
            return mp.fsum(l / (1 - 2 * l * s) for l in lams) - 1 / s

        lo, hi = a, b
        for _ in range(80):
            mid = (lo + hi) / 2
            if dphi(mid) > 0:
                hi = mid
            else:
                lo = mid
        s = (lo + hi) / 2
        s = min(max(s, a + (b - a) / 1000), b - (b - a) / 1000)
        return mpf(to_double(s))


def shifted_tail(lams, side, tol):
    """P(Q <= 0) (side 'lower', sigma < 0) or P(Q > 0) (side 'upper', sigma > 0), directly:

        P = -+(1/pi) int_0^inf Re[ M(sigma + i t) / (sigma + i t) ] dt,
        M(s) = prod (1 - 2 lambda_j s)^(-1/2)  (principal branches; 1 - 2 lambda_j sigma > 0),

    the Bromwich inversion of M(s)/s moved off the imaginary axis to the saddlepoint, so a
    small tail is the integral of a non-cancelling integrand. |integrand| <= t^(-1-m/2) /
    prod (2|lambda_j|)^(1/2) bounds the truncated remainder.
    """
    lams = [l for l in lams if l != 0]
    m = len(lams)
    sigma = saddle_sigma(lams, side)
    FB = mp.prec + 32
    AF = [to_fixed(1 - 2 * l * sigma, FB) for l in lams]
    b = [-2 * l for l in lams]
    BF, extra = scaled_fixed(b, FB)
    twopi = 2 * mp.pi
    top = FB + 64
    s2 = sigma * sigma

    def h(t):
        ys = times_fixed(BF, extra, t)
        pr, pim, E, w = 1 << FB, 0, -FB, 0
        for a, y in zip(AF, ys):
            npr = (pr * a - pim * y) >> FB
            npi = (pim * a + pr * y) >> FB
            if y > 0:
                if pim >= 0 and npi < 0:
                    w += 1
            elif pim < 0 and npi >= 0:
                w -= 1
            pr, pim = npr, npi
            bl = max(pr.bit_length(), pim.bit_length())
            if bl > top or bl < FB:
                sh = bl - FB - 32
                if sh > 0:
                    pr >>= sh
                    pim >>= sh
                else:
                    pr <<= -sh
                    pim <<= -sh
                E += sh
        PR, PI = from_fixed(pr, E), from_fixed(pim, E)
        phi = (mp.atan2(PI, PR) + twopi * w) / 2
        mag = 1 / mp.sqrt(mp.hypot(PR, PI))
        return mag * (sigma * mp.cos(phi) - t * mp.sin(phi)) / (s2 + t * t)

    t0 = min([abs(sigma)] + [(1 - 2 * l * sigma) / abs(2 * l) for l in lams])
    logprod = mp.fsum(mp.log(abs(x)) for x in b) / 2
    total, err = log_panels(h, t0, m, logprod, tol)
    val = total / mp.pi
    return (-val if side == "lower" else val), sigma


# ----------------------------------------------------------------------------------------------
# Engine 4: closed forms
# ----------------------------------------------------------------------------------------------

def closed_form_even(groups, c):
    """All multiplicities even: Q = sum mu_j * chi2_{2 p_j}, Laplace transform
    prod (1 + 2 mu_j s)^(-p_j); partial fractions give P(Q > 0) = sum over mu_j > 0 of
    sum_{l=1..p_j} a_{jl}, a_{jl} = [x^(p_j - l)] G_j(x), G_j(x) = prod_{i != j}
    (alpha_i + beta_i x)^(-p_i), alpha_i = 1 - mu_i/mu_j, beta_i = mu_i/mu_j.
    Returns (P(Q <= 0), P(Q > 0)), each summed directly over its own poles."""
    mus = [(v - c, mult // 2) for v, mult in groups]
    assert all(mult % 2 == 0 for _, mult in groups)
    lower, upper = mpf(0), mpf(0)
    for j, (muj, pj) in enumerate(mus):
        ser = [mpf(1)] + [mpf(0)] * (pj - 1)
        for i, (mui, pi_) in enumerate(mus):
            if i == j:
                continue
            al = 1 - mui / muj
            be = mui / muj
            # (al + be x)^(-p) = al^(-p) sum_k binom(-p, k) (be/al)^k x^k
            fac = [al ** (-pi_) * mp.binomial(-pi_, kk) * (be / al) ** kk for kk in range(pj)]
            ser = [mp.fsum(ser[a] * fac[kk - a] for a in range(kk + 1)) for kk in range(pj)]
        s = mp.fsum(ser)
        if muj > 0:
            upper += s
        else:
            lower += s
    return lower, upper


def arcsine(nu, c):
    """m = 2: d = nu1 + (nu2 - nu1) B, B ~ Beta(1/2, 1/2)."""
    n1, n2 = nu
    lower = 2 / mp.pi * mp.asin(mp.sqrt((c - n1) / (n2 - n1)))
    upper = 2 / mp.pi * mp.asin(mp.sqrt((n2 - c) / (n2 - n1)))
    return lower, upper


# ----------------------------------------------------------------------------------------------
# Per-case driver
# ----------------------------------------------------------------------------------------------

class CheckFailure(Exception):
    pass


def spectrum_info(nu):
    groups = group_ties(nu)
    distinct = all(mult == 1 for _, mult in groups)
    min_gap = min((groups[i + 1][0] - groups[i][0] for i in range(len(groups) - 1)),
                  default=mpf(1))
    return dict(groups=groups, distinct=distinct, min_gap=min_gap,
                pan_ok=distinct and min_gap > PAN_MIN_GAP,
                even=all(mult % 2 == 0 for _, mult in groups))


def weights_probability(nu, info, c, want_shifted=False):
    """Imhof (stored) + second methods; returns dict with lower, upper, check, methods."""
    lams = [v - c for v in nu]
    lo_I, up_I, err_I = imhof_probs(lams)
    checks = {}
    small = min(lo_I, up_I)

    doubles = {}

    def record(name, lo, up):
        d = max(abs(lo - lo_I), abs(up - up_I))
        checks[name] = d
        doubles[name] = (lo, up)

    if info["pan_ok"]:
        m = len(nu)
        both = m <= 40
        if lo_I <= up_I or both:
            lo_P, _ = pan_lower(nu, c)
        if up_I < lo_I or both:
            up_P, _ = pan_upper(nu, c)
        if not both:
            if lo_I <= up_I:
                up_P = 1 - lo_P
            else:
                lo_P = 1 - up_P
        else:
            if abs(lo_P + up_P - 1) > mpf(10) ** -35:
                raise CheckFailure(f"Pan direct + mirror != 1 ({mp.nstr(lo_P + up_P - 1, 5)})")
        record("pan", lo_P, up_P)
    if len(nu) == 2:
        record("arcsine", *arcsine(nu, c))
    if info["even"] and not info["distinct"]:
        lo_C, up_C = closed_form_even(info["groups"], c)
        if abs(lo_C + up_C - 1) > mpf(10) ** -35:
            raise CheckFailure("closed form lower + upper != 1")
        record("closed-form-even", lo_C, up_C)
    if not info["distinct"] and not info["even"]:
        side = "lower" if lo_I <= up_I else "upper"
        v, est = split_pan(info["groups"], c, side)
        if est > FAIL_ABS / 100:
            raise CheckFailure(f"split-Pan extrapolation not converged ({mp.nstr(est, 3)})")
        record("pan-split-extrapolated", *((v, 1 - v) if side == "lower" else (1 - v, v)))
    if want_shifted or not info["pan_ok"]:
        lo_S, _ = shifted_tail(lams, "lower", SHIFT_TOL)
        up_S, _ = shifted_tail(lams, "upper", SHIFT_TOL)
        if abs(lo_S + up_S - 1) > mpf(10) ** -35:
            raise CheckFailure("shifted contour lower + upper != 1")
        record("shifted-contour", lo_S, up_S)
    if not checks:
        raise CheckFailure("no second method available")
    dis = max(checks.values())
    dl, du = to_double(lo_I), to_double(up_I)
    for name, (lo_X, up_X) in doubles.items():
        # the stored doubles must not depend on the method (1 ulp allowed for values that lie
        # within the disagreement of a rounding boundary)
        if abs(to_double(lo_X) - dl) > ulp(dl) or abs(to_double(up_X) - du) > ulp(du):
            raise CheckFailure(f"{name} rounds to a different double at c = {mp.nstr(c, 17)}")
    if dis > FAIL_ABS or dis > FAIL_REL * small:
        raise CheckFailure(f"disagreement {mp.nstr(dis, 5)} at c = {mp.nstr(c, 17)} "
                           f"(lower {mp.nstr(lo_I, 10)}, methods {checks})")
    return dict(lower=lo_I, upper=up_I, check=dis, imhof_err=err_I, methods=sorted(checks),
                by_method=checks)


def fast_tail(nu, info, c, side, target):
    """Tail probability to about 10 digits (for root finding): saddlepoint contour at 30 digits."""
    with mp.workdps(30):
        lams = [v - c for v in nu]
        p, _ = shifted_tail(lams, side, target * mpf(10) ** -12)
        return p


def tail_point(nu, info, target, side):
    """c (a double) with P(d <= c) ~ target (side 'lower') or P(d >= c) ~ target ('upper')."""
    if side == "lower":
        base, sgn, far = nu[0], 1, nu[-1]
    else:
        base, sgn, far = nu[-1], -1, nu[0]
    span = abs(far - base)
    ltarget = mp.log(target)

    def g(x):  # x = log distance from the end of the support
        c = base + sgn * mp.exp(x)
        return mp.log(fast_tail(nu, info, c, side, target)) - ltarget

    # bracket
    xhi = mp.log(span / 2)
    ghi = g(xhi)
    assert ghi > 0
    xlo = xhi - 2
    glo = g(xlo)
    while glo > 0:
        xhi, ghi = xlo, glo
        xlo -= 3
        glo = g(xlo)
    # Illinois
    side_kept = 0
    for _ in range(60):
        x = xhi - ghi * (xhi - xlo) / (ghi - glo)
        gx = g(x)
        if abs(gx) < 1e-6:
            break
        if (gx > 0) == (ghi > 0):
            xhi, ghi = x, gx
            if side_kept == 1:
                glo /= 2
            side_kept = 1
        else:
            xlo, glo = x, gx
            if side_kept == -1:
                ghi /= 2
            side_kept = -1
    c = to_double(base + sgn * mp.exp(x))
    return c


def run_case(case, mean, var, nu, info):
    points = []
    m = len(nu)
    sd = mp.sqrt(var)
    lo_end, hi_end = nu[0], nu[-1]
    width = hi_end - lo_end
    cs = set()
    zs = [-2, -1, -0.5, 0, 0.5, 1, 2] if m < 150 else [-2, -0.5, 0, 1]
    for z in zs:
        c = mean + z * sd
        c = min(max(c, lo_end + width / 50), hi_end - width / 50)
        c = mpf(int(mp.nint(c * 1024))) / 1024
        if c <= lo_end or c >= hi_end:
            continue
        if any(abs(c - v) < mpf(10) ** -6 for v in nu):
            c += mpf(1) / 4096
        cs.add(to_double(c))
    tails = []
    if case["tails"]:
        for target in (1e-6, 1e-10, 1e-15):
            for side in ("lower", "upper"):
                c = tail_point(nu, info, mpf(target), side)
                tails.append(c)
                cs.add(c)
    for c in sorted(cs):
        r = weights_probability(nu, info, mpf(c), want_shifted=(c in tails))
        points.append(dict(c=c, **r))
    return points


def spectrum_checks(case, nu):
    """Checks on the computed spectrum beyond the exact trace identities."""
    n, k, lag = case["n"], case["k"], case["lag"]
    m = n - k
    msgs = []
    if lag == 1 and case["times"] is None:
        lam = [2 - 2 * mp.cos(mp.pi * j / n) for j in range(n)]
        tol = mpf(10) ** -40
        for i in range(1, m + 1):  # 1-based i: lam_{i-1} <= nu_i <= lam_{i+k-1}
            lo = lam[i] if case["intercept"] else lam[i - 1]
            if not (lo - tol <= nu[i - 1] <= lam[i + k - 1] + tol):
                raise CheckFailure(f"interlacing bound violated at i = {i}")
        msgs.append("interlacing bounds hold")
        if k == 1 and case["intercept"]:
            d = max(abs(nu[i - 1] - lam[i]) for i in range(1, m + 1))
            if d > mpf(10) ** -40:
                raise CheckFailure("intercept-only spectrum differs from 2 - 2 cos(pi j / n)")
            msgs.append(f"nu = 2 - 2cos(pi j/n) to {mp.nstr(d, 3)}")
    if case["id"].startswith("lag4-seasonal-n"):
        q = n // 4
        expect = sorted([2 - 2 * mp.cos(mp.pi * j / q) for j in range(1, q)] * 4)
        d = max(abs(a - b) for a, b in zip(expect, nu))
        if d > mpf(10) ** -40:
            raise CheckFailure("lag-4 seasonal spectrum differs from path eigenvalues x 4")
        msgs.append(f"nu = path(q) eigenvalues x4 to {mp.nstr(d, 3)}")
    return msgs


def spectrum_of(case):
    n, k = case["n"], case["k"]
    A = build_A(n, case["lag"], case["times"])
    refl = householder(case["xfrac"])
    T = compress([[mpf(v) for v in row] for row in A], refl, k)
    nu = eig_sorted(T)
    if len(nu) <= 60:  # second, independent eigensolver (mpmath's own Householder + QL)
        ev = mp.eigsy(mp.matrix(T), eigvals_only=True)
        d = max(abs(a - b) for a, b in zip(nu, sorted(ev[i] for i in range(len(nu)))))
        if d > mpf(10) ** -40:
            raise CheckFailure(f"{case['id']}: eigenvalues differ from mpmath.eigsy by {d}")
    # exact zero eigenvalues (e.g. residuals constant on each run of a gapped design)
    nu = [mpf(0) if abs(v) < mpf(10) ** -40 else v for v in nu]
    return A, refl, T, nu


def power_weights(case, refl, T, rho, c):
    """Eigenvalues of S^(1/2) M (A - cI) M S^(1/2) on the complement: eig(R'(Z'AZ - cI)R),
    R R' = Z'SZ."""
    n, k = case["n"], case["k"]
    m = n - k
    rho = mpf(rho)
    S = [[rho ** abs(i - j) / (1 - rho * rho) for j in range(n)] for i in range(n)]
    G = compress(S, refl, k)
    Rm = mp.cholesky(mp.matrix(G))
    C = mp.matrix(T) - c * mp.eye(m)
    W = Rm.T * C * Rm
    W = [[(W[i, j] + W[j, i]) / 2 for j in range(m)] for i in range(m)]
    return eig_sorted(W)


def power_trace_check(case, A, rho, c, w):
    """sum w = tr(M(A - cI)M S) and sum w^2 = tr((M(A - cI)M S)^2) via an explicit n x n M."""
    n = case["n"]
    X = mp.matrix([[mpf(v.numerator) / v.denominator for v in row] for row in case["xfrac"]])
    M = mp.eye(n) - X * mp.inverse(X.T * X) * X.T
    rho = mpf(rho)
    S = mp.matrix([[rho ** abs(i - j) / (1 - rho * rho) for j in range(n)] for i in range(n)])
    N = M * (mp.matrix(A) - c * mp.eye(n)) * M * S
    t1 = mp.fsum(N[i, i] for i in range(n))
    t2 = mp.fsum(N[i, j] * N[j, i] for i in range(n) for j in range(n))
    d1 = abs(t1 - mp.fsum(w)) / (1 + abs(t1))
    d2 = abs(t2 - mp.fsum(v * v for v in w)) / (1 + abs(t2))
    if d1 > mpf(10) ** -40 or d2 > mpf(10) ** -40:
        raise CheckFailure(f"power weights trace check failed ({d1}, {d2})")
    return max(d1, d2)


# ----------------------------------------------------------------------------------------------
# Output
# ----------------------------------------------------------------------------------------------

def fmt17(x):
    v = to_double(x) if isinstance(x, mpmath.mpf) else float(x)
    assert math.isfinite(v)
    return format(v, ".17g")


def json_num(v):
    if isinstance(v, Fraction):
        return str(v.numerator) if v.denominator == 1 else repr(float(v))
    if isinstance(v, int):
        return str(v)
    raise TypeError(v)


def write_json(path, cases_out, power_out):
    lines = []
    lines.append("{")
    lines.append(f'  "generator": "test/ref/generate_reference.py",')
    lines.append(f'  "mpmathVersion": {json.dumps(mpmath.__version__)},')
    lines.append(f'  "dps": {WORK_DPS},')
    lines.append('  "cases": [')
    for ci, c in enumerate(cases_out):
        L = []
        L.append("    {")
        L.append(f'      "id": {json.dumps(c["id"])},')
        L.append(f'      "description": {json.dumps(c["description"])},')
        L.append(f'      "n": {c["n"]}, "lag": {c["lag"]},')
        L.append('      "times": ' + ("null" if c["times"] is None else
                                      "[" + ", ".join(str(t) for t in c["times"]) + "]") + ",")
        L.append(f'      "intercept": {"true" if c["intercept"] else "false"},')
        L.append('      "x": [' + ", ".join("[" + ", ".join(json_num(v) for v in row) + "]"
                                          for row in c["xfrac"]) + "],")
        L.append(f'      "k": {c["k"]}, "m": {c["m"]},')
        L.append('      "nu": [' + ", ".join(fmt17(v) for v in c["nu"]) + "],")
        L.append(f'      "mean": {fmt17(c["mean"])}, "variance": {fmt17(c["variance"])},')
        L.append('      "points": [')
        pts = []
        for p in c["points"]:
            pts.append(f'        {{ "c": {repr(p["c"])}, "lower": {fmt17(p["lower"])}, '
                       f'"upper": {fmt17(p["upper"])}, "check": {fmt17(p["check"])} }}')
        L.append(",\n".join(pts))
        L.append("      ]")
        L.append("    }" + ("," if ci < len(cases_out) - 1 else ""))
        lines.extend(L)
    lines.append("  ],")
    lines.append('  "power": [')
    pts = []
    for p in power_out:
        pts.append("    { " + f'"id": {json.dumps(p["id"])}, "n": {p["n"]}, '
                   + '"x": [' + ", ".join("[" + ", ".join(json_num(v) for v in row) + "]"
                                          for row in p["xfrac"]) + "], "
                   + f'"lag": {p["lag"]}, "rho": {repr(p["rho"])}, "c": {repr(p["c"])}, '
                   + f'"lower": {fmt17(p["lower"])}, "check": {fmt17(p["check"])}' + " }")
    lines.append(",\n".join(pts))
    lines.append("  ]")
    lines.append("}")
    text = "\n".join(lines) + "\n"
    json.loads(text)  # must parse
    tmp = path + ".tmp"
    with open(tmp, "w") as fh:
        fh.write(text)
    os.replace(tmp, path)
    return len(text)


def main():
    t_start = time.time()
    mp.dps = WORK_DPS
    args = sys.argv[1:]
    out_path = OUT
    if "--out" in args:
        i = args.index("--out")
        out_path = args[i + 1]
        del args[i:i + 2]
    only = set(args)
    if only and out_path == OUT:
        sys.exit("a partial run (case ids given) needs --out PATH; reference.json is only "
                 "written by a full run")
    cases_out, power_out = [], []
    by_id = {}
    worst = dict(check=mpf(0), rel=mpf(0))
    smallest = mpf(1)
    npoints = 0
    try:
        for case in designs():
            if only and case["id"] not in only:
                continue
            t0 = time.time()
            n, k = case["n"], case["k"]
            m = n - k
            A, refl, T, nu = spectrum_of(case)
            S1, S2 = exact_traces(case["xfrac"], A)
            mean_exact = Fraction(S1, m)
            var_exact = 2 * (m * S2 - S1 * S1) / Fraction(m * m * (m + 2))
            s1 = mp.fsum(nu)
            s2 = mp.fsum(v * v for v in nu)
            d1 = abs(s1 - mpf(S1.numerator) / S1.denominator) / (1 + abs(s1))
            d2 = abs(s2 - mpf(S2.numerator) / S2.denominator) / (1 + abs(s2))
            if d1 > mpf(10) ** -40 or d2 > mpf(10) ** -40:
                raise CheckFailure(f"{case['id']}: eigenvalue sums disagree with exact traces")
            msgs = spectrum_checks(case, nu)
            info = spectrum_info(nu)
            t_spec = time.time() - t0
            mean_mp = mpf(mean_exact.numerator) / mean_exact.denominator
            var_mp = mpf(var_exact.numerator) / var_exact.denominator
            points = run_case(case, mean_mp, var_mp, nu, info)
            for p in points:
                worst["check"] = max(worst["check"], p["check"])
                sm = min(p["lower"], p["upper"])
                worst["rel"] = max(worst["rel"], p["check"] / sm)
                smallest = min(smallest, sm)
            npoints += len(points)
            ties = ", ".join(f"{mp.nstr(v, 6)}x{mult}" for v, mult in info["groups"] if mult > 1)
            log(f"{case['id']:>26}: n={n} k={k} lag={case['lag']} m={m} "
                f"spectrum {t_spec:.1f}s, total {time.time() - t0:.1f}s, {len(points)} points, "
                f"min gap {mp.nstr(info['min_gap'], 3)}"
                + (f", ties {ties}" if ties else "")
                + f"; max check {mp.nstr(max(p['check'] for p in points), 3)}, "
                f"min tail {mp.nstr(min(min(p['lower'], p['upper']) for p in points), 3)}, "
                + "by method " + ", ".join(
                    f"{k} {mp.nstr(max(p['by_method'].get(k, 0) for p in points), 3)}"
                    for k in sorted(set(x for p in points for x in p['methods']))) + "; "
                + "; ".join(msgs))
            out = dict(case, m=m, nu=nu, mean=mean_exact, variance=var_exact, points=points)
            cases_out.append(out)
            by_id[case["id"]] = (case, A, refl, T, nu)
        for pid, did, rho, c in power_cases():
            if did not in by_id:
                continue
            t0 = time.time()
            case, A, refl, T, nu = by_id[did]
            w = power_weights(case, refl, T, rho, mpf(c))
            tr_d = power_trace_check(case, A, rho, mpf(c), w)
            info = spectrum_info(w)
            # Pan's form for a general quadratic form: weights as 'nu', c = 0
            r = weights_probability(w, info, mpf(0), want_shifted=True)
            worst["check"] = max(worst["check"], r["check"])
            log(f"{pid:>34}: P(d <= {c} | rho = {rho}) = {mp.nstr(r['lower'], 17)}, check "
                f"{mp.nstr(r['check'], 3)} ({r['methods']}), trace check {mp.nstr(tr_d, 3)}, "
                f"{time.time() - t0:.1f}s")
            power_out.append(dict(id=pid, n=case["n"], xfrac=case["xfrac"], lag=case["lag"],
                                  rho=rho, c=c, lower=r["lower"], check=r["check"]))
        # rho = 0 must reproduce the null distribution
        if "trend-n20" in by_id:
            case, A, refl, T, nu = by_id["trend-n20"]
            w0 = power_weights(case, refl, T, 0.0, mpf(1.5))
            d0 = max(abs(a - (b - mpf(1.5))) for a, b in zip(w0, nu))
            if d0 > mpf(10) ** -40:
                raise CheckFailure("power weights at rho = 0 differ from nu - c")
    except CheckFailure as e:
        log(f"CHECK FAILED: {e}")
        sys.exit(1)
    size = write_json(out_path, cases_out, power_out)
    log(f"wrote {out_path} ({size} bytes): {len(cases_out)} cases, {npoints} points, "
        f"{len(power_out)} power values; max check {mp.nstr(worst['check'], 3)} (abs), "
        f"max check / min(lower, upper) {mp.nstr(worst['rel'], 3)}, "
        f"smallest tail {mp.nstr(smallest, 3)}; quadrature evaluations {COUNT['evals']}; "
        f"{time.time() - t_start:.0f}s")


if __name__ == "__main__":
    main()
