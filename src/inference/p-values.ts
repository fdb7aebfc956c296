/**
 * Exact p-values of an observed d for a prepared problem: P(D <= d) and P(D >= d) under the null
 * of independent normal errors, from the problem's exact null distribution (Imhof 1961 and the
 * other engines of src/engines/; docs/methods.md section 2), and the two-sided
 * min(1, 2 min(P(D <= d), P(D >= d))).
 */
import { DwError } from '../errors.js';
import type { Alternative } from '../core/alternative.js';
import type { DwProblem } from '../problem/problem.js';
import type { DwPValues } from './test-types.js';

/**
 * Exact p-values of d for a prepared problem. The engine named is the one that computed the tail
 * that was tested (for two-sided, or when no alternative is given, the smaller tail).
 *
 * @example
 * ```ts
 * const p = pValuesFor(prepareProblem({ t: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10] }, 10), 1.1, 'positive');
 * p.pPositive; // P(D <= 1.1) for this design
 * ```
 */
export function pValuesFor(problem: DwProblem, d: number, alternative?: Alternative): DwPValues {
  // each residual enters at most two differences, and (a - b)^2 <= 2a^2 + 2b^2: 0 <= d <= 4 at any lag
  if (!(Number.isFinite(d) && d >= 0 && d <= 4)) {
    throw new DwError('D_OUT_OF_RANGE', `d = ${d} is outside the possible range [0, 4].`, 'Check the value of d you passed.');
  }
  const lower = problem.distribution.lowerTail(d);
  const upper = problem.distribution.upperTail(d);
  const pTwo = Math.min(1, 2 * Math.min(lower.p, upper.p));
  // the engine named is the one that computed the tail that was tested (for two-sided, or when no
  // alternative is given, the smaller tail)
  const tested = alternative === 'positive' ? lower : alternative === 'negative' ? upper : lower.p <= upper.p ? lower : upper;
  return {
    d,
    n: problem.factored.design.n,
    k: problem.factored.design.k,
    pPositive: lower.p,
    pNegative: upper.p,
    pTwoSided: pTwo,
    method: tested.method,
    methodChoice: tested.reason ?? null,
    errorBound: Math.max(lower.errorBound, upper.errorBound) * (pTwo < 1 ? 2 : 1),
    errorBoundPositive: lower.errorBound,
    errorBoundNegative: upper.errorBound,
  };
}
