/**
 * Brent's bracketing root finder (Brent 1973, Algorithms for Minimization without Derivatives,
 * chapter 4): inverse quadratic interpolation and secant steps, safeguarded by bisection, so the
 * bracket always shrinks and convergence is guaranteed for a continuous function.
 */

/**
 * A root of f in [a, b], where f(a) and f(b) differ in sign (or one is zero), to within `xtol`.
 *
 * @example
 * ```ts
 * brentRoot((x) => x * x - 2, 0, 2); // 1.4142135623...
 * ```
 */
export function brentRoot(f: (x: number) => number, a: number, b: number, xtol = 1e-13, maxIter = 200): number {
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa > 0 === fb > 0) throw new RangeError('brentRoot: the bracket does not change sign');
  let c = a, fc = fa, d = b - a, e = d;
  for (let iter = 0; iter < maxIter; iter++) {
    if (fb > 0 === fc > 0) { c = a; fc = fa; d = b - a; e = d; }
    if (Math.abs(fc) < Math.abs(fb)) { a = b; b = c; c = a; fa = fb; fb = fc; fc = fa; }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xtol;
    const mid = 0.5 * (c - b);
    if (Math.abs(mid) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number, q: number;
      if (a === c) { p = 2 * mid * s; q = 1 - s; }
      else {
        const qa = fa / fc, r = fb / fc;
        p = s * (2 * mid * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q; else p = -p;
      if (2 * p < Math.min(3 * mid * q - Math.abs(tol * q), Math.abs(e * q))) { e = d; d = p / q; }
      else { d = mid; e = d; }
    } else { d = mid; e = d; }
    a = b; fa = fb;
    b += Math.abs(d) > tol ? d : mid > 0 ? tol : -tol;
    fb = f(b);
  }
  return b;
}
