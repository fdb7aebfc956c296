/**
 * Chernoff's bound on a tail of the quadratic form under the alternative (Chernoff 1952, Ann.
 * Math. Statist. 23, 493-507; docs/methods.md section 6): far from the mean (large n, rho well away
 * from 0) Imhof's integrand oscillates many times and the integral needs thousands of evaluations;
 * there the same factorisations at a real argument settle a probability within a tenth of the
 * tolerance of 0 or 1 in a few dozen real sweeps.
 */
import type { Tail } from '../core/types.js';
import type { AlternativeForm } from './alternative-form.js';

/**
 * Chernoff's bound on a tail of Q = sum w_j z_j^2 (Chernoff 1952, Ann. Math. Statist. 23, 493-507):
 * for any real beta with 1 + beta w_j > 0 for all j,
 *
 *   P(Q <= 0) <= E exp(-(beta/2) Q) = exp(-psi(beta)/2)   (beta > 0),
 *   P(Q >= 0) <= exp(-psi(beta)/2)                        (beta < 0),   psi(beta) = sum log(1 + beta w_j).
 *
 * psi is concave with psi(0) = 0 and psi'(0) = sum w, so only the tail on the side away from the
 * mean can be small: beta takes the sign of sumLambda. The search doubles beta from 0.5 / maxAbsLambda
 * (always feasible, as maxAbsLambda bounds every |w_j|) while psi grows, then refines by golden
 * section. The bound is used at beta* only if 1.25 beta* is also found feasible, so that every
 * 1 + beta* w_j >= 0.2: a misjudged inertia within rounding of the boundary cannot make it invalid.
 * Returns the tail that is bounded and the bound, or null when no feasible beta gives psi > 0.
 *
 * @example
 * ```ts
 * chernoffTail(alternativeForm(st, 1.98, 0.3)); // { tail: 'lower', bound: 3e-40 }: P(d <= 1.98 | 0.3) < 3e-40
 * ```
 */
export function chernoffTail(form: AlternativeForm, stopBelow = 0): { tail: Tail; bound: number } | null {
  const side = form.sumLambda > 0 ? 1 : form.sumLambda < 0 ? -1 : 0;
  if (side === 0) return null;
  const psi = (b: number): number => { const v = form.logMgf(side * b); return v === null ? -Infinity : v; };
  let lo = 0;
  let mid = 0.5 / form.maxAbsLambda;
  let midV = psi(mid);
  if (!(midV > 0)) return null;
  let hi = 2 * mid;
  let hiV = psi(hi);
  const done = (v: number) => Math.exp(-v / 2) < stopBelow;
  let guard = 0;
  while (hiV > midV && !done(midV) && guard++ < 200) {
    lo = mid;
    mid = hi; midV = hiV;
    hi *= 2;
    hiV = psi(hi);
  }
  // golden section on [lo, hi] around mid (psi concave)
  if (!done(midV) && hiV <= midV) {
    const gr = (Math.sqrt(5) - 1) / 2;
    let a = lo, b = hi;
    for (let it = 0; it < 12 && !done(midV); it++) {
      const x1 = b - gr * (b - a), x2 = a + gr * (b - a);
      const v1 = psi(x1), v2 = psi(x2);
      if (v1 >= v2) { b = x2; if (v1 > midV) { mid = x1; midV = v1; } } else { a = x1; if (v2 > midV) { mid = x2; midV = v2; } }
    }
  }
  // keep a margin from the boundary of the feasible interval
  if (psi(1.25 * mid) === -Infinity) {
    mid /= 1.25;
    midV = psi(mid);
    if (!(midV > 0) || psi(1.25 * mid) === -Infinity) return null;
  }
  return { tail: side > 0 ? 'lower' : 'upper', bound: Math.exp(-midV / 2) };
}

