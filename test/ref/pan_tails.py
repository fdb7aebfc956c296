#!/usr/bin/env python3
"""
Reference tail probabilities of the Durbin-Watson-type ratio d = sum nu_i z_i^2 / sum z_i^2 for
test/pan.test.ts, written to test/ref/pan-tails.json.

How the values are computed (mpmath 1.3.0, 50 significant digits):

* P(d <= c) by Pan's finite-range formula (docs/methods.md section 4),
      P(d <= c) = (1/pi) sum_{odd r, nu_r < c} (-1)^((r-1)/2)
                  Integral_{nu_r}^{min(nu_{r+1}, c)} (c - w)^((m-2)/2) prod_i |w - nu_i|^(-1/2) dw,
  each interval mapped to a smooth integrand (w = mid - half cos t on a full interval,
  w = nu_r + (c - nu_r) sin^2 t on the interval cut at c) and integrated by mpmath.quad
  (tanh-sinh, integrand scaled to order one first, since mpmath's convergence test is absolute)
  with its own error estimate, which must be below 10^(15 - digits) of the sum of |terms|.
  At 50 digits the cancellation in the alternating sum is irrelevant. P(d >= c) is the same
  formula on the mirrored spectrum (nu -> -nu, c -> -c).
* Independent check of every value with m <= 30: Imhof's integral (Imhof 1961, docs/methods.md
  section 3), P(d <= c) = 1/2 - (1/pi) Integral_0^inf sin(theta(u)) / (u rho(u)) du with
  lambda = nu - c, integrated by mpmath.quad on [0, inf) split at multiples of 1/max|lambda|,
  again at 50 digits. The script stops if the two disagree by more than 1e-9 relative.
* The point c for a target probability (1e-8 or 1e-14) is found by bisection on log P at 50
  digits, then rounded to the nearest double; the stored probability is recomputed at exactly
  that double, so the test evaluates at the same c. The stored c is Python's repr of the double
  (round-trips exactly).

Spectra: Durbin-Watson lower-bound spectra nu_i = 2 - 2 cos(pi i / n), i = 1..n - k' - 1
(docs/methods.md section 2) for (n, k') = (12, 1) (m = 10) and (32, 1) (m = 30), an irregular
spectrum with m = 12, the n = 26 spectrum (m = 24) at fixed points across the support, and,
for over- and underflow, the n = 302 spectrum (m = 300) at fixed points near nu_1 and nu_m
(30 digits for these, no Imhof check).

Regenerate (about ten minutes, deterministic):  python3 test/ref/pan_tails.py
"""
import json
import math
import os

import mpmath as mp

mp.mp.dps = 50


def scaled_quad(f, T, pieces):
    """Integral of f over [0, T] split into pieces. mpmath.quad's convergence test is absolute,
    so the integrand is first divided by its largest sampled value (the tails reach 1e-300)."""
    scale = max(abs(f(T * (k + mp.mpf(1) / 2) / 16)) for k in range(16))
    value, e = mp.quad(lambda t: f(t) / scale, mp.linspace(0, T, pieces), error=True)
    return value * scale, e * scale


def pan_lower(nu, c):
    """P(d <= c) by Pan's formula at working precision; returns (value, error estimate, sum |terms|)."""
    nu = [mp.mpf(x) for x in nu]
    c = mp.mpf(c)
    m = len(nu)
    total = mp.mpf(0)
    err = mp.mpf(0)
    abs_sum = mp.mpf(0)
    for r0 in range(0, m, 2):
        if not nu[r0] < c:
            break
        a = nu[r0]
        if r0 + 1 < m and nu[r0 + 1] < c:
            b = nu[r0 + 1]
            mid = (a + b) / 2
            half = (b - a) / 2
            others = [x for i, x in enumerate(nu) if i not in (r0, r0 + 1)]

            def f(t):
                w = mid - half * mp.cos(t)
                return (c - w) ** (mp.mpf(m - 2) / 2) / mp.sqrt(mp.fprod(abs(w - x) for x in others))

            value, e = scaled_quad(f, mp.pi, 5 + m // 16)
        else:
            L = c - a
            others = [x for i, x in enumerate(nu) if i != r0]

            def f(t):
                w = a + L * mp.sin(t) ** 2
                cw = L * mp.cos(t) ** 2
                return 2 * mp.sqrt(L) * mp.cos(t) * cw ** (mp.mpf(m - 2) / 2) / mp.sqrt(
                    mp.fprod(abs(w - x) for x in others))

            value, e = scaled_quad(f, mp.pi / 2, 5 + m // 16)
        total += (-1) ** (r0 // 2) * value
        err += e
        abs_sum += abs(value)
    return total / mp.pi, err / mp.pi, abs_sum / mp.pi


def tail(nu, c, which):
    """P(d <= c) ('lower') or P(d >= c) ('upper') by Pan's formula, checked against its error estimate."""
    if which == 'lower':
        p, e, s = pan_lower(nu, c)
    else:
        p, e, s = pan_lower([-x for x in reversed(nu)], -c)
    assert e <= mp.mpf(10) ** (15 - mp.mp.dps) * max(s, mp.mpf(10) ** -300), (e, s)
    return p


def imhof(nu, c, which):
    """The same probability by Imhof's integral."""
    lam = [mp.mpf(x) - mp.mpf(c) for x in nu]
    scale = 1 / max(abs(x) for x in lam)

    def g(u):
        theta = sum(mp.atan(x * u) for x in lam) / 2
        rho = mp.fprod((1 + (x * u) ** 2) for x in lam) ** mp.mpf(0.25)
        return mp.sin(theta) / (u * rho)

    integral = mp.quad(g, [0, scale, 4 * scale, 16 * scale, 64 * scale, 256 * scale, mp.inf])
    upper = mp.mpf(1) / 2 + integral / mp.pi  # P(Q > 0) = P(d > c)
    return upper if which == 'upper' else 1 - upper


def solve(nu, target, which):
    """Double c with tail probability within 1% of target, by bisection on log P."""
    lo, hi = mp.mpf(nu[0]), mp.mpf(nu[-1])
    logt = mp.log(target)
    for _ in range(200):
        mid = (lo + hi) / 2
        p = tail(nu, mid, which)
        if p > 0 and abs(mp.log(p) - logt) < 0.01:
            return float(mid)
        small = p <= 0 or mp.log(p) < logt
        # the lower tail grows with c, the upper tail shrinks
        if (which == 'lower') == small:
            lo = mid
        else:
            hi = mid
    return float((lo + hi) / 2)


def dw_lower_spectrum(n, kp):
    return [2 - 2 * math.cos(math.pi * i / n) for i in range(1, n - kp)]


def main():
    spectra = {
        'dw-lower-n12-k1': dw_lower_spectrum(12, 1),
        'dw-lower-n32-k1': dw_lower_spectrum(32, 1),
        'irregular-m12': [0.11, 0.23, 0.41, 0.47, 0.9, 1.3, 1.35, 1.9, 2.6, 2.75, 3.3, 3.9],
    }
    cases = []
    for name, nu in spectra.items():
        for which in ('lower', 'upper'):
            for target in (1e-8, 1e-14):
                c = solve(nu, target, which)
                p = tail(nu, c, which)
                check = imhof(nu, c, which)
                assert abs(check / p - 1) < 1e-9, (name, which, target, p, check)
                cases.append({'spectrum': name, 'tail': which, 'c': c, 'p': mp.nstr(p, 25),
                              'imhofCheck': mp.nstr(check, 12)})
                print(name, which, target, c, mp.nstr(p, 20), flush=True)
    # m = 24 across the support (fixed points): where the alternating sum cancels most; the test
    # checks the reported bound against these
    mid = dw_lower_spectrum(26, 1)
    spectra['dw-lower-n26-k1'] = mid
    for c in (0.8, 1.4, 1.9, 2.0, 2.1, 2.6, 3.2):
        for which in ('lower', 'upper'):
            p = tail(mid, c, which)
            check = imhof(mid, c, which)
            assert abs(check / p - 1) < 1e-9, ('dw-lower-n26-k1', which, c, p, check)
            cases.append({'spectrum': 'dw-lower-n26-k1', 'tail': which, 'c': c, 'p': mp.nstr(p, 25),
                          'imhofCheck': mp.nstr(check, 12)})
            print('dw-lower-n26-k1', which, c, mp.nstr(p, 20), flush=True)
    # m = 300: fixed points (no root finding, to keep the run short), 30 digits suffice since
    # the alternating sum cancels by at most 1e10 here. At c = 0.6 the double-precision engine
    # loses relative accuracy to cancellation; the test then checks only that its bound holds.
    big = dw_lower_spectrum(302, 1)
    spectra['dw-lower-n302-k1'] = big
    m = len(big)
    with mp.workdps(30):
        for which, c, bound_only in (('lower', (big[10] + big[11]) / 2, False), ('lower', 0.3, False),
                                     ('lower', 0.6, True), ('upper', (big[m - 12] + big[m - 11]) / 2, False)):
            p = tail(big, c, which)
            case = {'spectrum': 'dw-lower-n302-k1', 'tail': which, 'c': c, 'p': mp.nstr(p, 20)}
            if bound_only:
                case['boundOnly'] = True
            cases.append(case)
            print('dw-lower-n302-k1', which, c, mp.nstr(p, 20), flush=True)
    out = {
        'description': 'Tail probabilities of d = sum nu_i z_i^2 / sum z_i^2 at 50 digits (mpmath); '
                       'see test/ref/pan_tails.py for how they were computed and how to regenerate.',
        'spectra': spectra,
        'cases': cases,
    }
    path = os.path.join(os.path.dirname(os.path.abspath(__file__)), 'pan-tails.json')
    with open(path, 'w') as fh:
        json.dump(out, fh, indent=1)
        fh.write('\n')


if __name__ == '__main__':
    main()
