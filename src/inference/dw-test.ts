/**
 * The exact Durbin-Watson test for the caller's own design: d, its exact p-values under the null
 * of independent normal errors (Durbin & Watson 1950, 1951; exact distribution as in Imhof 1961),
 * the exact critical values at alpha, and the decision.
 */
import { DwError } from '../errors.js';
import { durbinWatson } from '../core/difference.js';
import type { EngineName, MethodChoice } from '../core/types.js';
import { fitLeastSquares, type Coefficient } from '../model/ols.js';
import { designErrorAllowance, type RegressorInput } from '../model/design.js';
import { prepareProblem, type DwProblem, type ProblemOptions } from './problem.js';
import { dynamicModelCheck } from '../dynamic/serial-tests.js';
import { boundsZone } from '../bounds/zone.js';
import { MAX_BOUNDS_N } from '../bounds/spectra.js';
import { powerForProblem } from '../power/exact-power.js';
import type { ErrorProcess } from '../power/weights.js';

/** The alternative hypothesis: positive or negative first-order autocorrelation, or either. */
export type Alternative = 'positive' | 'negative' | 'two-sided';

/** Input of {@link exactDwTest}: y (fitted here) or residuals (already fitted) with the regressors. */
export interface DwTestInput extends ProblemOptions {
  /** The dependent variable; the regression of y on x is fitted by least squares. */
  y?: ArrayLike<number>;
  /** OLS residuals from the caller's own fit of y on x (instead of y). */
  residuals?: ArrayLike<number>;
  /** The regressors (rows or named columns), without the intercept (it is added by default). */
  x: RegressorInput;
  /** Alternative hypothesis (default `positive`, the usual one-sided test). */
  alternative?: Alternative;
  /** Significance level (default 0.05). */
  alpha?: number;
  /**
   * The regressor that is y lagged one period (then d is not valid and `dynamic` holds Durbin's h
   * and the Breusch-Godfrey test). Detected from the data when omitted; `false` turns detection off.
   */
  laggedDependent?: string | false;
  /** Order of the Breusch-Godfrey test reported when the model is dynamic (default 1). */
  bgOrder?: number;
  /** Exact power of this test against AR(1) errors at these rho (and the rho reaching `target`, default 0.8). */
  power?: { rho: ArrayLike<number>; target?: number; process?: ErrorProcess };
}

/** Exact p-values of an observed d. */
export interface DwPValues {
  /** The statistic. */
  d: number;
  /** Observations. */
  n: number;
  /** Columns of X including the intercept. */
  k: number;
  /** P(D <= d): evidence of positive autocorrelation. */
  pPositive: number;
  /** P(D >= d): evidence of negative autocorrelation. */
  pNegative: number;
  /** min(1, 2 min(pPositive, pNegative)). */
  pTwoSided: number;
  /** Engine that computed the p-values. */
  method: EngineName;
  /** Why that engine answered. */
  methodReason: string;
  /** Absolute error bound of the larger of the two one-sided p-values (doubled for two-sided). */
  errorBound: number;
}

/**
 * Where the classical bounds test (Durbin & Watson 1950, 1951; tables such as Savin & White 1977)
 * would have landed for this n and k, and how the exact p-value resolves it.
 */
export interface BoundsZone {
  /** Regressors other than the intercept (the tables' k'). */
  kPrime: number;
  /** Level of each one-sided bound used (alpha, or alpha/2 for a two-sided test). */
  level: number;
  dL: number;
  dU: number;
  /**
   * Zone of d: 'reject-positive' (d < dL), 'inconclusive-positive' (dL <= d <= dU),
   * 'no-evidence' (dU < d < 4 - dU), 'inconclusive-negative' (4 - dU <= d <= 4 - dL),
   * 'reject-negative' (d > 4 - dL).
   */
  zone: 'reject-positive' | 'inconclusive-positive' | 'no-evidence' | 'inconclusive-negative' | 'reject-negative';
  /** Plain-words account of what the bounds say and, when inconclusive, how the exact test decides. */
  resolution: string;
}

/** Exact power of the test against stationary AR(1) errors for this X (METHODS.md section 6). */
export interface PowerSummary {
  alpha: number;
  /** The exact critical value used (P(D <= critical) = alpha under the null). */
  critical: number;
  curve: { rho: number; power: number }[];
  /** Target power and the smallest rho > 0 reaching it (null when not reached for rho < 1). */
  target: number;
  rhoAtTarget: number | null;
}

/** Diagnosis when the regressors include the dependent variable lagged (METHODS.md section 8). */
export interface DynamicModelCheck {
  /** Name of the lagged dependent regressor. */
  laggedDependent: string;
  /** How it was found: declared by the caller or detected from the data. */
  how: 'declared' | 'detected';
  /** Durbin's h (asymptotic N(0, 1)); null value with a reason when n V >= 1. */
  durbinH: { h: number | null; pValue: number | null; reason: string };
  /** Breusch-Godfrey LM test of order `order` (asymptotic), chi-square and F forms. */
  breuschGodfrey: { order: number; lm: number; pChiSquare: number; f: number; pF: number; df1: number; df2: number };
  /** t-test of the residual on its own lag and the regressors (asymptotic). */
  residualT: { t: number; pValue: number };
}

/** Full result of {@link exactDwTest}. */
export interface DwTestResult extends DwPValues {
  /** m = n - k. */
  m: number;
  lag: number;
  /** Whether the model has an intercept (added or the caller's constant column). */
  intercept: boolean;
  /** Whether the library added the intercept column. */
  interceptAdded: boolean;
  /** Column names of X, in order. */
  columns: string[];
  /** Coefficient estimates (when y was given). */
  coefficients: Coefficient[] | null;
  /** R^2 of the fit (when y was given). */
  rSquared: number | null;
  alternative: Alternative;
  alpha: number;
  /** p-value for the chosen alternative. */
  pValue: number;
  /** Exact critical values for this X: P(D <= lower) = a and P(D >= upper) = a, a = alpha (alpha/2 two-sided). */
  critical: { lower: number; upper: number; tailLevel: number };
  /** 'reject' when pValue <= alpha. */
  decision: 'reject' | 'not-rejected';
  /** Exact mean and variance of d under the null. */
  nullMean: number;
  nullVariance: number;
  /** The bounds-test zone (null when the bounds do not apply: no intercept, lag > 1, or gaps). */
  bounds: BoundsZone | null;
  /** Exact power against AR(1) errors, when asked for. */
  power: PowerSummary | null;
  /** When a lagged dependent variable is among the regressors: d is not valid, and these tests replace it. */
  dynamic: DynamicModelCheck | null;
  /** True when the time column has gaps, so that some differences are missing. */
  gaps: boolean;
  warnings: string[];
}

/** Check alpha and the alternative at the boundary where they enter. */
export function checkAlpha(alpha: number): void {
  if (!(alpha > 0 && alpha < 1)) {
    throw new DwError('ALPHA_OUT_OF_RANGE', `The significance level ${alpha} is outside (0, 1).`, 'Use a level such as 0.05 or 0.01.');
  }
}

/** Exact p-values of d for a prepared problem. */
export function pValuesFor(problem: DwProblem, d: number): DwPValues {
  // each residual enters at most two differences, and (a - b)^2 <= 2a^2 + 2b^2: 0 <= d <= 4 at any lag
  if (!(Number.isFinite(d) && d >= 0 && d <= 4)) {
    throw new DwError('D_OUT_OF_RANGE', `d = ${d} is outside the possible range [0, 4].`, 'Check the value of d you passed.');
  }
  const lower = problem.distribution.lowerTail(d);
  const upper = problem.distribution.upperTail(d);
  const pTwo = Math.min(1, 2 * Math.min(lower.p, upper.p));
  return {
    d,
    n: problem.factored.design.n,
    k: problem.factored.design.k,
    pPositive: lower.p,
    pNegative: upper.p,
    pTwoSided: pTwo,
    method: lower.method,
    methodReason: lower.reason ?? '',
    errorBound: Math.max(lower.errorBound, upper.errorBound) * (pTwo < 1 ? 2 : 1),
  };
}

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

/** Number of observations in regressors given as rows or columns. */
export function rowCount(x: RegressorInput): number {
  if (Array.isArray(x)) return x.length;
  const cols = Object.values(x as Record<string, ArrayLike<number>>);
  if (cols.length === 0) {
    throw new DwError('OPTION_MISSING', 'With no regressor columns the number of observations must be given.', 'Pass n, or give y.');
  }
  return cols[0].length;
}

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
  const alternative = input.alternative ?? 'positive';
  if (!['positive', 'negative', 'two-sided'].includes(alternative)) {
    throw new DwError('OPTION_VALUE', `Unknown alternative '${alternative}'.`, 'Use positive, negative or two-sided.');
  }
  const alpha = input.alpha ?? 0.05;
  checkAlpha(alpha);
  if ((input.y === undefined) === (input.residuals === undefined)) {
    throw new DwError('OPTION_CONFLICT', 'Give exactly one of y and residuals.', 'Pass y to fit the regression here, or the residuals of your own fit.');
  }
  const series = (input.y ?? input.residuals) as ArrayLike<number>;
  const n = series.length;
  const problem = prepareProblem(input.x, n, input);
  const { design } = problem.factored;
  const warnings = [...problem.warnings];
  let residuals: Float64Array;
  let coefficients: Coefficient[] | null = null;
  let rSquared: number | null = null;
  // how far rounding in X and y can move d itself (measured bound, src/model/design.ts)
  let dAllowance = 0;
  if (input.y !== undefined) {
    const fit = fitLeastSquares(problem.factored, input.y);
    residuals = fit.residuals;
    coefficients = fit.coefficients;
    rSquared = fit.rSquared;
    dAllowance = designErrorAllowance(problem.factored.condition, fit.amplification);
  } else {
    const raw = input.residuals as ArrayLike<unknown>;
    for (let i = 0; i < n; i++) {
      if (typeof raw[i] !== 'number') {
        throw new DwError('CELL_NOT_NUMERIC', `Residual ${i + 1} is ${String(raw[i])}, not a number.`, 'Every residual must be a finite number.', { row: i + 1 });
      }
    }
    residuals = Float64Array.from(input.residuals as ArrayLike<number>);
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(residuals[i])) {
        throw new DwError('CELL_NOT_FINITE', `Residual ${i + 1} is ${residuals[i]}.`, 'Every residual must be a finite number.', { row: i + 1 });
      }
    }
    const drift = orthogonalityDrift(problem, residuals);
    if (drift > 1e-6) {
      warnings.push(`The residuals are not orthogonal to the design (relative size of X'e about ${drift.toExponential(1)}): were they computed by least squares on these same regressors?`);
    }
  }
  const d = durbinWatson(residuals, problem.pairs);
  const p = pValuesFor(problem, d);
  if (dAllowance > 0) {
    // d is known to within dAllowance: add the density of d there times that (twice, for safety)
    const dist0 = problem.distribution;
    const [lo, hi] = dist0.support;
    const h = Math.max(1e-6, 1e3 * dAllowance) * (hi - lo);
    const slope = Math.abs(dist0.cdf(Math.min(hi, d + h)) - dist0.cdf(Math.max(lo, d - h))) / (2 * h);
    p.errorBound += 2 * slope * dAllowance * (p.pTwoSided < 1 ? 2 : 1);
  }
  const pValue = alternative === 'positive' ? p.pPositive : alternative === 'negative' ? p.pNegative : p.pTwoSided;
  const tailLevel = alternative === 'two-sided' ? alpha / 2 : alpha;
  const dist = problem.distribution;
  const critical = { lower: dist.quantile(tailLevel), upper: dist.upperQuantile(tailLevel), tailLevel };
  if (design.interceptIndex < 0) {
    warnings.push('The model has no intercept: the classical bounds tables (d_L, d_U) do not apply; the exact p-value does.');
  }
  const gaps = problem.pairs.from.length < n - problem.pairs.lag;
  if (problem.pairs.lag > 1 || gaps) {
    warnings.push(`The classical bounds tables (d_L, d_U) are for lag 1 and consecutive observations; ${problem.pairs.lag > 1 ? `at lag ${problem.pairs.lag}` : 'with gaps in time'} they do not apply; the exact p-value does.`);
  }
  let dynamic: DynamicModelCheck | null = null;
  if (input.y !== undefined) {
    const check = dynamicModelCheck({
      y: input.y, x: input.x, intercept: input.intercept, names: input.names, times: input.times,
      laggedDependent: input.laggedDependent, order: input.bgOrder, alternative,
    });
    if (check) { dynamic = check; warnings.push(check.message, ...check.notes); }
  } else if (typeof input.laggedDependent === 'string') {
    throw new DwError('OPTION_CONFLICT', "Durbin's h and the Breusch-Godfrey test refit the model, so they need y, not residuals.",
      'Pass y (and the regressors) instead of the residuals.');
  }
  const boundsApply = design.interceptIndex >= 0 && problem.pairs.lag === 1 && !gaps && n <= MAX_BOUNDS_N && n - design.k >= 2;
  return {
    ...p,
    m: n - design.k,
    lag: problem.pairs.lag,
    intercept: design.interceptIndex >= 0,
    interceptAdded: design.interceptAdded,
    columns: design.names,
    coefficients,
    rSquared,
    alternative,
    alpha,
    pValue,
    critical,
    decision: pValue <= alpha ? 'reject' : 'not-rejected',
    nullMean: dist.mean,
    nullVariance: dist.variance,
    bounds: boundsApply && !dynamic ? boundsZone(d, n, design.k - 1, alpha, alternative, pValue) : null,
    power: input.power ? powerForProblem(problem, { ...input.power, alpha, alternative, times: input.times }) : null,
    dynamic,
    gaps,
    warnings,
  };
}

/** ||Q'e|| / ||e|| for the basis Q of col(X). */
function orthogonalityDrift(problem: DwProblem, e: Float64Array): number {
  const basis = problem.distribution.source.basis;
  if (!basis) return 0;
  const { n, k, q } = basis;
  let big = 0;
  for (let i = 0; i < n; i++) big = Math.max(big, Math.abs(e[i]));
  if (big === 0) return 0;
  let ee = 0, proj = 0;
  for (let i = 0; i < n; i++) ee += (e[i] / big) ** 2;
  for (let j = 0; j < k; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += q[j * n + i] * (e[i] / big);
    proj += s * s;
  }
  return Math.sqrt(proj / ee);
}
