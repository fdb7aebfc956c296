/**
 * The test of one series of a batch on a shared prepared design, computing only what the batch
 * table shows: d (from the least-squares residuals, Durbin & Watson 1950), the exact p-value of
 * the alternative tested with its error bound, and the decision. It calls the same functions as the
 * single test (src/inference/dw-test.ts), so d and the p-value are the same numbers bit for bit
 * (the same engines on the same spectrum, src/batch/fast-tail.ts); the error bound is that of the
 * tail(s) tested only (the single test reports the larger of both tails'). The allowance for rounding in X and y (a slope of the distribution function times a
 * rounding size of order 1e-14) is bounded through the tail's own error bound, which already holds
 * the distribution's slope at d, instead of by two more evaluations; for a design shared by many
 * series both rounding allowances use a ceiling of the density computed once
 * (src/batch/shared-design.ts), which saves one evaluation per series. A series whose regressors include y
 * lagged one period, and batches that ask for critical values, go through the single test itself.
 */
import { durbinWatson } from '../core/difference.js';
import { fitLeastSquares } from '../model/ols.js';
import { designErrorAllowance } from '../model/design.js';
import { detectLaggedDependent } from '../dynamic/lagged-dependent.js';
import type { Alternative } from '../core/alternative.js';
import type { DesignReuse } from '../inference/dw-test.js';
import type { TailProbability } from '../core/types.js';
import { batchTail } from './fast-tail.js';
import { AUTO_SPECTRUM_MAX_N, tailProbability } from '../engines/choose.js';
import { DwError } from '../errors.js';
import type { DwWarning } from '../inference/warnings.js';

/** Fewest residual degrees of freedom for a density ceiling (below, the density may be unbounded at the ends). */
export const CEILING_MIN_M = 8;

/**
 * A ceiling of the exact density of d for a shared design: twice the largest density on 97 points
 * across mean +- 8 standard deviations (inside the support). With m >= 8 the density is smooth,
 * bounded and has one broad hump, so twice its largest value on a fine grid is a safe ceiling (a
 * safety factor, as the single test's own "twice", not a proof). The batch uses it in place of a
 * finite-difference slope per series in the allowance for rounding in X and y, a term of order
 * 1e-14 for an ordinary design. Null for smaller m.
 *
 * @example
 * ```ts
 * densityCeiling(reuse); // e.g. 2.9 for n = 52, k = 3
 * ```
 */
export function densityCeiling(reuse: DesignReuse): number | null {
  const dist = reuse.problem.distribution;
  if (dist.m < CEILING_MIN_M || reuse.problem.factored.design.n > AUTO_SPECTRUM_MAX_N) return null;
  const [lo, hi] = dist.support;
  const sd = Math.sqrt(dist.variance);
  const a = Math.max(lo, dist.mean - 8 * sd);
  const b = Math.min(hi, dist.mean + 8 * sd);
  let top = 0;
  for (let i = 0; i <= 96; i++) top = Math.max(top, dist.pdf(a + ((b - a) * i) / 96));
  return Number.isFinite(top) && top > 0 ? 2 * top : null;
}

/** What the batch keeps of one series' test. */
export interface SeriesAnswer {
  n: number;
  k: number;
  d: number;
  pValue: number;
  errorBound: number;
  method: string;
  decision: 'reject' | 'not-rejected';
  warnings: DwWarning[];
}

/**
 * The test of one series on a prepared design, or null when a regressor is y lagged one period
 * (then the caller runs the full single test, which reports Durbin's h and Breusch-Godfrey).
 *
 * @example
 * ```ts
 * const { reuse } = new DesignCache({}).lookup({ price }, price.length, weeks);
 * seriesAnswer(sales, reuse, 'positive', 0.05, weeks); // { d, pValue, errorBound, decision, ... }
 * ```
 */
export function seriesAnswer(
  y: Float64Array, reuse: DesignReuse, alternative: Alternative, alpha: number, times?: ArrayLike<number>, densityCeiling?: () => number | null,
): SeriesAnswer | null {
  const problem = reuse.problem;
  const { design } = problem.factored;
  const { n, names, x, interceptAdded } = design;
  const columns: Record<string, Float64Array> = {};
  names.forEach((nm, j) => { if (!(interceptAdded && j === 0)) columns[nm] = x.subarray(j * n, j * n + n); });
  if (detectLaggedDependent(y, columns, times) !== null) return null;
  const fit = fitLeastSquares(problem.factored, y);
  const dAllowance = designErrorAllowance(problem.factored.condition, fit.amplification);
  const d = durbinWatson(fit.residuals, problem.pairs);
  const dist = problem.distribution;
  if (!(d >= 0 && d <= 4)) throw new DwError('D_OUT_OF_RANGE', `d = ${d} is outside the possible range [0, 4].`, 'Check the data of this series.');
  // the design's density ceiling when it is shared by many series (the density needs the
  // spectrum, at hand up to AUTO_SPECTRUM_MAX_N); null: the distribution's own tails
  const ceiling = n <= AUTO_SPECTRUM_MAX_N ? densityCeiling?.() ?? null : null;
  // with a density ceiling, the effect of rounding in the spectrum (the distribution's own
  // finite-difference slope, src/distribution/null-distribution.ts) is bounded by it instead:
  // the same engine call, so the same p, one evaluation fewer
  const delta = dist.source.spectrumError;
  const tailAt = (tail: 'lower' | 'upper'): TailProbability => {
    if (ceiling === null) return batchTail(dist, d, tail);
    const r = tailProbability(dist.source, d, tail, dist.options);
    if (!(delta > 0) || r.p === 0 || r.p === 1) return r;
    const extra = 2 * delta * ceiling;
    return { ...r, errorBound: r.errorBound + extra, relativeError: r.relativeError + extra / r.p };
  };
  let pValue: number;
  let errorBound: number;
  let method: string;
  let tested: TailProbability[];
  if (alternative === 'two-sided') {
    const lower = tailAt('lower');
    const upper = tailAt('upper');
    tested = [lower, upper];
    pValue = Math.min(1, 2 * Math.min(lower.p, upper.p));
    method = (lower.p <= upper.p ? lower : upper).method;
    errorBound = Math.max(lower.errorBound, upper.errorBound) * (pValue < 1 ? 2 : 1);
  } else {
    const tail = tailAt(alternative === 'positive' ? 'lower' : 'upper');
    tested = [tail];
    pValue = tail.p;
    method = tail.method;
    errorBound = tail.errorBound;
  }
  const twice = alternative === 'two-sided' && pValue < 1 ? 2 : 1;
  if (ceiling !== null && dAllowance > 0) {
    // d is known to within dAllowance: add a ceiling of the density of d times that, twice
    errorBound += 2 * ceiling * dAllowance * twice;
  } else if (dAllowance > 0 && delta > 0 && tested.every((t) => t.p > 0 && t.p < 1)) {
    // the distribution's bound of each tail holds 2 delta s for its slope s at d (plus the engine's
    // own bound), so s <= bound / (2 delta), and the allowance 2 s dAllowance (as the single test
    // adds it) is at most bound x dAllowance / delta: no further evaluation needed
    errorBound += Math.max(...tested.map((t) => t.errorBound)) * (dAllowance / delta) * twice;
  } else if (dAllowance > 0) {
    // d is known to within dAllowance: add the density of d there times that, twice (as the single test)
    const [lo, hi] = dist.support;
    const h = Math.max(1e-6, 1e3 * dAllowance) * (hi - lo);
    const slope = Math.abs(dist.cdf(Math.min(hi, d + h)) - dist.cdf(Math.max(lo, d - h))) / (2 * h);
    errorBound += 2 * slope * dAllowance * (alternative === 'two-sided' && pValue < 1 ? 2 : 1);
  }
  return {
    n, k: design.k, d, pValue, errorBound, method,
    decision: pValue <= alpha ? 'reject' : 'not-rejected',
    warnings: [...problem.warnings],
  };
}
