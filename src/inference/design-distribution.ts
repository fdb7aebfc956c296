/**
 * The exact null distribution of d for the caller's own regressors, in one call: the design is
 * validated and factored, the difference operator built (lag, gaps) and the distribution tied to
 * the engines, exactly as the test does (docs/methods.md sections 1 and 2).
 */
import type { DwNullDistribution } from '../distribution/null-distribution.js';
import type { RegressorInput } from '../model/design.js';
import { prepareProblem, type ProblemOptions } from '../problem/problem.js';

/**
 * The exact null distribution of d for regressors `x` with `n` observations (an intercept is added
 * unless `options.intercept` is false; `lag` and `times` define the differences).
 *
 * @example
 * ```ts
 * const dist = designDistribution({ trend: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10] }, 10);
 * dist.cdf(1.1);           // P(D <= 1.1) under the null, for this design
 * dist.quantile(0.05);     // the exact 5% lower critical value
 * dist.mean; dist.variance;
 * ```
 */
export function designDistribution(x: RegressorInput, n: number, options: ProblemOptions = {}): DwNullDistribution {
  return prepareProblem(x, n, options).distribution;
}
