/**
 * The exact Durbin-Watson test for the caller's own design: d, its exact p-values under the null
 * of independent normal errors (Durbin & Watson 1950, 1951; exact distribution as in Imhof 1961),
 * the exact critical values at alpha, and the decision.
 *
 * The parts live beside this file: the input and result types (test-types.ts), the p-values of a
 * prepared problem (p-values.ts), the test of one series (series-test.ts), the panel route
 * (panel-test.ts) and the checks on residuals and columns (residual-checks.ts); their public
 * names are re-exported here.
 */
import { rowCount, type RegressorInput } from '../model/design.js';
import { checkAlpha } from '../core/alternative.js';
import { prepareProblem, type ProblemOptions } from '../problem/problem.js';
import type { DwTestInput, DesignReuse, DwPValues, DwTestResult, TestRun } from './test-types.js';
import { pValuesFor } from './p-values.js';
import { runSeries } from './series-test.js';
import { runPanelTest } from './panel-test.js';

export type { DwWarning, DwWarningCode } from './warnings.js';
export type { DroppedRows, TimeColumnInfo, TimeLabelsInput } from './data-input.js';
/** The alternative hypothesis: positive or negative first-order autocorrelation, or either. */
export type { Alternative } from '../core/alternative.js';
export type { BoundsZone, PowerSummary, DynamicModelCheck } from '../core/result-types.js';
export type { InputDescription, Provenance, DwTestInput, DesignReuse, DwPValues, DwTestResult, TestRun } from './test-types.js';
export { pValuesFor } from './p-values.js';
export { RESIDUAL_DRIFT_LIMIT, checkResiduals, firstOrderAutocorrelation } from './residual-checks.js';

export { checkAlpha } from '../core/alternative.js';

/**
 * Exact p-values for an observed d and the caller's regressors.
 *
 * @example
 * ```ts
 * exactDwPValue({ x: { trend: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10] }, d: 1.1 }).pPositive;
 * ```
 */
export function exactDwPValue(input: ProblemOptions & { x: RegressorInput; d: number; n?: number }): DwPValues {
  const n = input.n ?? rowCount(input.x);
  return pValuesFor(prepareProblem(input.x, n, input), input.d);
}

/**
 * Exact critical values for the caller's regressors: P(D <= lower) = alpha, P(D >= upper) = alpha.
 *
 * @example
 * ```ts
 * exactDwCritical({ x: { trend: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10] }, alpha: 0.05 }); // { lower, upper }
 * ```
 */
export function exactDwCritical(input: ProblemOptions & { x: RegressorInput; alpha: number; n?: number }): { lower: number; upper: number; n: number; k: number } {
  checkAlpha(input.alpha);
  const n = input.n ?? rowCount(input.x);
  const problem = prepareProblem(input.x, n, input);
  return {
    lower: problem.distribution.quantile(input.alpha),
    upper: problem.distribution.upperQuantile(input.alpha),
    n,
    k: problem.factored.design.k,
  };
}

export { rowCount } from '../model/design.js';

/**
 * The exact Durbin-Watson test: fit (or take residuals), compute d, its exact p-values for this X,
 * the exact critical values, and the decision.
 *
 * @example
 * ```ts
 * const r = exactDwTest({ y: sales, x: { price, income }, alternative: 'positive', alpha: 0.05 });
 * r.d; r.pValue; r.critical.lower; r.decision;
 * ```
 */
export function exactDwTest(input: DwTestInput): DwTestResult {
  return runExactDwTest(input).result;
}

/**
 * {@link exactDwTest}, also returning the prepared problem (design, operator, null distribution)
 * and the observation times used (period numbers of the time index, after any dropped rows), for
 * callers that go on to draw the density or compute power without preparing it again.
 *
 * @example
 * ```ts
 * const { result, problem } = runExactDwTest({ y, x });
 * renderDensitySvg(result, problem.distribution);
 * ```
 */
export function runExactDwTest(input: DwTestInput, reuse?: DesignReuse): TestRun {
  if (input.panel !== undefined) return runPanelTest(input, reuse);
  return runSeries(input, reuse, false);
}

