/**
 * Exact power without eigenvalues: the characteristic form of d's distribution under AR(1) (or
 * seasonal) errors from banded factorisations, O(n k (k + p)) per evaluation (docs/methods.md sections 5
 * and 6; Imhof 1961, Biometrika 48, 419-426, for the integral; the Schur-complement and
 * determinant identities are standard linear algebra).
 *
 * With u ~ N(0, S), S the error correlation at the observation times (unit variances; the factor
 * 1 / (1 - rho^2) does not change the sign of a quadratic form), C = M K M, K = sign (A - cI), and
 * L L' = S, the weights are the eigenvalues w_j of L'CL, and Imhof's integrand needs
 *
 *   L(u) = sum_j log(1 - i u w_j) = log det(I - i u L'CL) = log det(P - i u C) - log det P.
 *
 * The computation is split by concern:
 *   - src/power/alternative-structure.ts: the order in which P = S^-1 is tridiagonal, and the gaps;
 *   - src/power/alternative-form.ts: the characteristic form from one band LDL' sweep of
 *     P - i u K per evaluation and the Schur-complement identities;
 *   - src/power/alternative-real.ts and src/power/chernoff.ts: Chernoff's bound from the same
 *     factorisation at a real argument;
 *   - this file: the tail probability, settled by Chernoff's bound where it is small enough,
 *     else by Imhof's integral (src/engines/imhof.ts).
 */
import type { Tail } from '../core/types.js';
import { integrateImhof } from '../engines/imhof.js';
import { POLICY } from '../policy.js';
import type { AlternativeStructure } from './alternative-structure.js';
import { alternativeForm } from './alternative-form.js';
import { chernoffTail } from './chernoff.js';

export { alternativeStructure, type AlternativeStructure } from './alternative-structure.js';
export { alternativeForm, type AlternativeForm } from './alternative-form.js';
export { chernoffTail } from './chernoff.js';

/**
 * P(d <= c | rho) (`lower`) or P(d >= c | rho) (`upper`) by Imhof's integral on the eigen-free
 * form (the upper tail directly, from the negated weights). When the tail on the far side of the
 * mean is below a tenth of the tolerance by Chernoff's bound ({@link chernoffTail}), the answer is
 * 0 or 1 with that bound as its error, and Imhof's integral (which needs many evaluations when the
 * integrand oscillates, as it does far from the mean at large n) is skipped.
 *
 * @example
 * ```ts
 * const st = alternativeStructure(basis, operator, 1);
 * eigenfreeAlternativeTail(st, 1.95, 0.05, 'lower'); // { p, errorBound, via: 'imhof' }
 * ```
 */
export function eigenfreeAlternativeTail(st: AlternativeStructure, c: number, rho: number, tail: Tail,
  options: { tolerance?: number } = {}): { p: number; errorBound: number; via: 'imhof' | 'chernoff' } {
  const tol = options.tolerance ?? POLICY.tolerances.PROBABILITY_TOLERANCE;
  const form = alternativeForm(st, c, rho, tail === 'lower' ? 1 : -1);
  const ch = chernoffTail(form, 0.1 * tol);
  if (ch !== null && ch.bound < 0.1 * tol) {
    // ch.tail 'lower': P(Q <= 0) <= bound, so the wanted probability is in [0, bound];
    // 'upper': P(Q >= 0) <= bound, so P(Q <= 0) is in [1 - bound, 1]
    return { p: ch.tail === 'lower' ? 0 : 1, errorBound: ch.bound, via: 'chernoff' };
  }
  const r = integrateImhof(form, { tolerance: tol });
  return { p: r.p, errorBound: r.errorBound, via: 'imhof' };
}
