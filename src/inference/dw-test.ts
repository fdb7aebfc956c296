/**
 * The exact Durbin-Watson test for the caller's own design: d, its exact p-values under the null
 * of independent normal errors (Durbin & Watson 1950, 1951; exact distribution as in Imhof 1961),
 * the exact critical values at alpha, and the decision.
 */
import { DwError } from '../errors.js';
import { durbinWatson, differencePairs } from '../core/difference.js';
import type { EngineName, MethodChoice } from '../core/types.js';
import { fitLeastSquares, type Coefficient } from '../model/ols.js';
import { designErrorAllowance, rowCount, type RegressorInput } from '../model/design.js';
import { checkAlpha, checkAlternative, type Alternative } from '../core/alternative.js';
import type { BoundsZone, PowerSummary, DynamicModelCheck } from '../core/result-types.js';
import { prepareProblem, type DwProblem, type ProblemOptions } from '../problem/problem.js';
import { dynamicModelCheck } from '../dynamic/serial-tests.js';
import { detectLaggedDependent } from '../dynamic/lagged-dependent.js';
import { boundsZone } from '../bounds/zone.js';
import { MAX_BOUNDS_N } from '../bounds/spectra.js';
import { powerForProblem } from '../power/exact-power.js';
import type { ErrorProcess } from '../power/weights.js';
import { preparePanel, reorder, type PanelInput, type PanelSummary } from '../panel/panel.js';
import type { PanelNote } from './warnings.js';
import { breuschGodfrey, type BreuschGodfrey } from '../dynamic/serial-tests.js';
import { VERSION } from '../version.js';
import type { TimeFrequency } from '../data/time-index.js';
import { resolveDataInput, type DroppedRows, type TimeColumnInfo, type TimeLabelsInput } from './data-input.js';
import type { DwWarning } from './warnings.js';
import { POLICY } from '../policy.js';

export type { DwWarning, DwWarningCode } from './warnings.js';
export type { DroppedRows, TimeColumnInfo, TimeLabelsInput } from './data-input.js';

/** Where the data came from, as the caller describes it (the library reads no file). */
export interface InputDescription {
  /** File name (or a description such as "pasted text"). */
  name: string;
  /** SHA-256 of the bytes read, in lower-case hexadecimal. */
  sha256?: string;
  /** Size in bytes. */
  bytes?: number;
}

/** Reproducibility record of a result: the input, the options used and the software. */
export interface Provenance {
  input?: InputDescription;
  /** The options of the run as the caller gave them (e.g. the command-line options). */
  options?: Record<string, string | number | boolean | string[]>;
}

/** The alternative hypothesis: positive or negative first-order autocorrelation, or either. */
export type { Alternative } from '../core/alternative.js';
export type { BoundsZone, PowerSummary, DynamicModelCheck } from '../core/result-types.js';

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
  /**
   * Order p of the Breusch-Godfrey test (default 1; 4 is usual for quarterly data), reported next
   * to d for a static model and in place of d for a dynamic one.
   */
  bgOrder?: number;
  /**
   * Time labels (integers, 2015Q1 or 2015-Q1, 2015-01, 2015-01-31) instead of `times`; parsed by
   * {@link parseTimeLabels}, the frequency inferred and reported.
   */
  time?: TimeLabelsInput;
  /**
   * The column of `x` (named columns) that is the time index, taken out of the regressors; when
   * omitted the time-index rule may pick one (see README); `false` turns the rule off.
   */
  timeColumn?: string | false;
  /** Frequency of the time index instead of the inferred one. */
  frequency?: TimeFrequency;
  /**
   * Drop the rows with a missing value (NaN, null) in y, a regressor or the time index; they are
   * listed in `droppedRows` and become gaps. Without it such values are refused.
   */
  dropMissing?: boolean;
  /** Input file and options, copied into the result for reproducibility. */
  provenance?: Provenance;
  /** Exact power of this test against AR(1) errors at these rho (and the rho reaching `target`, default 0.8). */
  power?: { rho: ArrayLike<number>; target?: number; process?: ErrorProcess };
  /**
   * Panel data: the entity and time of each row. One pooled regression on all rows, differences
   * only between times `lag` apart within the same entity; `entityEffects` replaces the intercept
   * by one indicator per entity. Not together with `times` (the panel's own times are used).
   */
  panel?: PanelInput;
}

/** A prepared design shared by several series with the same design (see src/batch/). */
export interface DesignReuse {
  /** The problem prepared for exactly this design and these options. */
  problem: DwProblem;
  /** d_L and d_U for (n, k', level), remembered across series. */
  bounds?: (n: number, kPrime: number, level: number) => { dL: number; dU: number };
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
  /** Absolute error bound of pPositive = P(D <= d) alone: |pPositive - exact| <= errorBoundPositive. */
  errorBoundPositive: number;
  /** Absolute error bound of pNegative = P(D >= d) alone: |pNegative - exact| <= errorBoundNegative. */
  errorBoundNegative: number;
}

/** Full result of {@link exactDwTest}. */
export interface DwTestResult extends DwPValues {
  /** m = n - k. */
  m: number;
  lag: number;
  /** Whether the model has an intercept in effect: added, the caller's constant column, or columns that span the constant (a full set of dummies). */
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
  /**
   * 'reject' when pValue <= alpha; 'not-valid' when a lagged dependent variable makes d invalid
   * (then `dynamic` holds the tests that replace it, and `dValid` is false).
   */
  decision: 'reject' | 'not-rejected' | 'not-valid';
  /** False when d is not a valid test for this model (a lagged dependent variable). */
  dValid: boolean;
  /** Exact mean and variance of d under the null. */
  nullMean: number;
  nullVariance: number;
  /** The bounds-test zone (null when the bounds do not apply: no intercept, lag > 1, or gaps). */
  bounds: BoundsZone | null;
  /** Exact power against AR(1) errors, when asked for. */
  power: PowerSummary | null;
  /** When a lagged dependent variable is among the regressors: d is not valid, and these tests replace it. */
  dynamic: DynamicModelCheck | null;
  /** True when the time column has gaps, so that some differences are missing (always, for a panel of several entities). */
  gaps: boolean;
  /** The pooled panel design, when the input was a panel (absent otherwise). */
  panel?: PanelSummary & { notes: PanelNote[] };
  /** The time index used (null: the rows are consecutive periods). */
  timeColumn: TimeColumnInfo | null;
  /** Rows dropped for missing values (null when none were). */
  droppedRows: DroppedRows | null;
  /**
   * First-order autocorrelation of the residuals, sum e_t e_{t-1} / sum e_t^2 over the pairs one
   * period apart (gaps honoured); 1 - d/2 approximates it at lag 1 (common practice).
   */
  rhoHat: number;
  /**
   * Breusch-Godfrey LM test of order p (asymptotic) for a static model with y given; for a dynamic
   * model it is in `dynamic`, and null here.
   */
  breuschGodfrey: BreuschGodfrey | null;
  /** The input and options (as described by the caller) and the software version. */
  input: InputDescription | null;
  options: Provenance['options'] | null;
  software: { name: 'exact-dw'; version: string };
  /** Notes on the result as typed codes; the words are in src/report/wording.ts. */
  warnings: DwWarning[];
}

export { checkAlpha } from '../core/alternative.js';

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
    methodReason: tested.reason ?? '',
    errorBound: Math.max(lower.errorBound, upper.errorBound) * (pTwo < 1 ? 2 : 1),
    errorBoundPositive: lower.errorBound,
    errorBoundNegative: upper.errorBound,
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
export function runExactDwTest(input: DwTestInput, reuse?: DesignReuse): { result: DwTestResult; problem: DwProblem; times?: ArrayLike<number> } {
  if (input.panel !== undefined) return runPanelTest(input, reuse);
  return runSeries(input, reuse, false);
}

/**
 * The pooled panel test: rows ordered entity by entity, times on one axis with a gap of more than
 * the lag between entities (src/panel/panel.ts), then the ordinary test on that design.
 */
function runPanelTest(input: DwTestInput, reuse?: DesignReuse): { result: DwTestResult; problem: DwProblem; times?: ArrayLike<number> } {
  const panel = input.panel!;
  if (input.times !== undefined || input.time !== undefined) {
    throw new DwError('OPTION_CONFLICT', 'A panel brings its own times; separate observation times cannot be given as well.', 'Give the time of each row with the panel only.');
  }
  if (input.power !== undefined) {
    throw new DwError('OPTION_CONFLICT', 'Exact power against AR(1) errors is not available for a pooled panel (it would need one error process per entity).',
      'Test the panel without power, or compute the power of one entity as a single series.');
  }
  if ((input.y === undefined) === (input.residuals === undefined)) {
    throw new DwError('OPTION_CONFLICT', 'Give exactly one of y and residuals.', 'Pass y to fit the regression here, or the residuals of your own fit.');
  }
  if (input.dropMissing === true) {
    throw new DwError('OPTION_CONFLICT', 'Dropping rows with missing values is not available for a pooled panel: it needs every row of every entity.',
      'Remove the rows with missing values before the test, or test the entities one by one as a batch.');
  }
  const series = (input.y ?? input.residuals) as ArrayLike<number>;
  const n = series.length;
  const prepared = preparePanel(panel, input.x, n, input.lag ?? 1, input.intercept ?? true, input.names);
  const ordered = reorder(series, prepared.order);
  const { result, problem, times } = runSeries({
    ...input,
    panel: undefined,
    time: undefined,
    timeColumn: false,
    x: prepared.x,
    names: undefined,
    intercept: prepared.intercept,
    times: prepared.axis,
    y: input.y !== undefined ? ordered : undefined,
    residuals: input.residuals !== undefined ? ordered : undefined,
  }, reuse, true);
  const notes: PanelNote[] = [];
  if (prepared.summary.entityEffects && prepared.summary.entities > 1) notes.push({ code: 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE', entities: prepared.summary.entities });
  else if (result.bounds === null && prepared.summary.entities > 1) notes.push({ code: 'PANEL_BOUNDS_NOT_APPLICABLE', entities: prepared.summary.entities });
  if (prepared.summary.entityEffects && prepared.summary.entities > 1) result.bounds = null;
  result.panel = { ...prepared.summary, pairs: problem.pairs.from.length, notes };
  result.warnings.push(...notes);
  return { result, problem, times };
}

function runSeries(input: DwTestInput, reuse: DesignReuse | undefined, panelMode: boolean): { result: DwTestResult; problem: DwProblem; times?: ArrayLike<number> } {
  const alternative = input.alternative ?? 'positive';
  checkAlternative(alternative);
  const alpha = input.alpha ?? 0.05;
  checkAlpha(alpha);
  if ((input.y === undefined) === (input.residuals === undefined)) {
    throw new DwError('OPTION_CONFLICT', 'Give exactly one of y and residuals.', 'Pass y to fit the regression here, or the residuals of your own fit.');
  }
  const data = resolveDataInput(input);
  const x = data.x;
  const times = data.times;
  const series = (data.y ?? data.residuals) as ArrayLike<number>;
  const n = series.length;
  const problem = reuse?.problem ?? prepareProblem(x, n, { ...input, times });
  const { design } = problem.factored;
  const warnings: DwWarning[] = [...data.warnings, ...problem.warnings];
  let residuals: Float64Array;
  let coefficients: Coefficient[] | null = null;
  let rSquared: number | null = null;
  // how far rounding in X and y can move d itself (measured bound, src/model/design.ts)
  let dAllowance = 0;
  if (data.y !== undefined) {
    const fit = fitLeastSquares(problem.factored, data.y);
    residuals = fit.residuals;
    coefficients = fit.coefficients;
    rSquared = fit.rSquared;
    dAllowance = designErrorAllowance(problem.factored.condition, fit.amplification);
  } else {
    const raw = data.residuals as ArrayLike<unknown>;
    for (let i = 0; i < n; i++) {
      if (typeof raw[i] !== 'number') {
        throw new DwError('CELL_NOT_NUMERIC', `Residual ${i + 1} is ${String(raw[i])}, not a number.`, 'Every residual must be a finite number.', { row: i + 1 });
      }
    }
    residuals = Float64Array.from(data.residuals as ArrayLike<number>);
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(residuals[i])) {
        throw new DwError('CELL_NOT_FINITE', `Residual ${i + 1} is ${residuals[i]}.`, 'Every residual must be a finite number.', { row: i + 1 });
      }
    }
    const checked = checkResiduals(problem, residuals);
    residuals = checked.residuals;
    warnings.push(...checked.warnings);
  }
  const d = durbinWatson(residuals, problem.pairs);
  const p = pValuesFor(problem, d, alternative);
  if (dAllowance > 0) {
    // d is known to within dAllowance: add the density of d there times that (twice, for safety)
    const dist0 = problem.distribution;
    const [lo, hi] = dist0.support;
    const h = Math.max(1e-6, 1e3 * dAllowance) * (hi - lo);
    const slope = Math.abs(dist0.cdf(Math.min(hi, d + h)) - dist0.cdf(Math.max(lo, d - h))) / (2 * h);
    p.errorBound += 2 * slope * dAllowance * (p.pTwoSided < 1 ? 2 : 1);
    p.errorBoundPositive += 2 * slope * dAllowance;
    p.errorBoundNegative += 2 * slope * dAllowance;
  }
  const pValue = alternative === 'positive' ? p.pPositive : alternative === 'negative' ? p.pNegative : p.pTwoSided;
  const tailLevel = alternative === 'two-sided' ? alpha / 2 : alpha;
  const dist = problem.distribution;
  const critical = { lower: dist.quantile(tailLevel), upper: dist.upperQuantile(tailLevel), tailLevel };
  const interceptInEffect = problem.factored.spansConstant;
  if (Array.isArray(x)) {
    // rows carry no column names for the rule; still flag a gapped-looking column
    const index = timeLikeColumn(design.x, design.n, design.names);
    if (index && times === undefined) warnings.push({ code: 'TIME_GAPS_NOT_HONOURED', column: index });
  }
  if (!interceptInEffect) warnings.push({ code: 'BOUNDS_NO_INTERCEPT' });
  const gaps = problem.pairs.from.length < n - problem.pairs.lag;
  if ((problem.pairs.lag > 1 || gaps) && !panelMode) warnings.push({ code: 'BOUNDS_LAG_OR_GAPS', lag: problem.pairs.lag, gaps });
  const rhoHat = firstOrderAutocorrelation(residuals, times);
  let dynamic: DynamicModelCheck | null = null;
  let bg: BreuschGodfrey | null = null;
  if (data.y !== undefined) {
    // detection alone is cheap and the check refits the model: look first (same answer either way)
    const check = input.laggedDependent !== undefined || laggedDependentPresent(data.y, problem, times)
      ? dynamicModelCheck({
        y: data.y, x, intercept: input.intercept, names: input.names, times,
        laggedDependent: input.laggedDependent, order: input.bgOrder, alternative,
      })
      : null;
    if (check) {
      dynamic = check;
      warnings.push({ code: 'D_NOT_VALID_LAGGED_DEPENDENT', column: check.laggedDependent, how: check.how, hDefined: check.durbinH.h !== null, bgOrder: check.breuschGodfrey.order });
      if (check.notes.length > 0) warnings.push({ code: 'LAGGED_DEPENDENT_MISMATCH', column: check.laggedDependent });
    } else {
      // the same Breusch-Godfrey test as for a dynamic model (src/dynamic/serial-tests.ts), next to d
      bg = breuschGodfrey(problem.factored, residuals, input.bgOrder ?? 1, times);
    }
  } else if (typeof input.laggedDependent === 'string') {
    throw new DwError('OPTION_CONFLICT', "Durbin's h and the Breusch-Godfrey test refit the model, so they need y, not residuals.",
      'Pass y (and the regressors) instead of the residuals.');
  }
  const boundsApply = interceptInEffect && problem.pairs.lag === 1 && !gaps && n <= MAX_BOUNDS_N && n - design.k >= 2;
  const result: DwTestResult = {
    ...p,
    m: n - design.k,
    lag: problem.pairs.lag,
    intercept: interceptInEffect,
    interceptAdded: design.interceptAdded,
    columns: design.names,
    coefficients,
    rSquared,
    alternative,
    alpha,
    pValue,
    critical,
    decision: dynamic ? 'not-valid' : pValue <= alpha ? 'reject' : 'not-rejected',
    dValid: dynamic === null,
    nullMean: dist.mean,
    nullVariance: dist.variance,
    bounds: boundsApply && !dynamic ? boundsZone(d, n, design.k - 1, alpha, alternative, pValue, {
      exactPErrorBound: p.errorBound,
      known: reuse?.bounds?.(n, design.k - 1, alternative === 'two-sided' ? alpha / 2 : alpha),
    }) : null,
    power: input.power ? powerForProblem(problem, { ...input.power, alpha, alternative, times }) : null,
    dynamic,
    gaps,
    timeColumn: data.timeColumn,
    droppedRows: data.droppedRows,
    rhoHat,
    breuschGodfrey: bg,
    input: input.provenance?.input ?? null,
    options: input.provenance?.options ?? null,
    software: { name: 'exact-dw', version: VERSION },
    warnings,
  };
  return { result, problem, times };
}

/** Whether a regressor of the prepared design is y lagged one period (the detection of src/dynamic/lagged-dependent.ts). */
function laggedDependentPresent(y: ArrayLike<number>, problem: DwProblem, times?: ArrayLike<number>): boolean {
  const { n, names, x, interceptAdded } = problem.factored.design;
  const columns: Record<string, Float64Array> = {};
  names.forEach((nm, j) => { if (!(interceptAdded && j === 0)) columns[nm] = x.subarray(j * n, j * n + n); });
  return detectLaggedDependent(y, columns, times) !== null;
}

/** Residuals whose component in col(X) is larger than this (relative) are refused. */
export const RESIDUAL_DRIFT_LIMIT = POLICY.tolerances.RESIDUAL_DRIFT_LIMIT;

/**
 * Check residuals given by the caller against the design: least-squares residuals are orthogonal
 * to every column of X. Rounding (e.g. residuals exported with 6 significant digits) leaves a small
 * component in col(X): it is removed (e <- M e) and a note says so. A large component means the
 * residuals come from another model, and their d would be read against the wrong distribution:
 * that is refused.
 *
 * @example
 * ```ts
 * const { residuals, warnings } = checkResiduals(prepareProblem(x, n), e);
 * ```
 */
export function checkResiduals(problem: DwProblem, e: Float64Array): { residuals: Float64Array; warnings: DwWarning[] } {
  const drift = orthogonalityDrift(problem, e);
  if (drift > RESIDUAL_DRIFT_LIMIT) {
    throw new DwError('RESIDUALS_NOT_FROM_DESIGN',
      `These residuals are not least-squares residuals of this design: their component in the space of the regressors is ${(100 * drift).toPrecision(2)}% of their size (it would be 0).`,
      'Give the residuals of a fit on exactly these columns (with the intercept unless --no-intercept), or give y and let exact-dw fit it.');
  }
  if (!(drift > 1e-12)) return { residuals: e, warnings: [] };
  const basis = problem.distribution.source.basis!;
  const { n, k, q } = basis;
  const out = Float64Array.from(e);
  for (let j = 0; j < k; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += q[j * n + i] * out[i];
    for (let i = 0; i < n; i++) out[i] -= s * q[j * n + i];
  }
  const warnings: DwWarning[] = drift > 1e-8 ? [{ code: 'RESIDUALS_PROJECTED', drift }] : [];
  return { residuals: out, warnings };
}

/**
 * The name of a regressor that looks like an integer time index with gaps (strictly increasing
 * whole numbers with at least one step larger than the smallest step), or null.
 */
function timeLikeColumn(x: Float64Array, n: number, names: string[]): string | null {
  for (let j = 0; j < names.length; j++) {
    const o = j * n;
    let increasing = true, minStep = Infinity, maxStep = 0;
    for (let i = 0; i < n; i++) {
      const v = x[o + i];
      if (!Number.isInteger(v)) { increasing = false; break; }
      if (i > 0) {
        const step = v - x[o + i - 1];
        if (!(step > 0)) { increasing = false; break; }
        minStep = Math.min(minStep, step);
        maxStep = Math.max(maxStep, step);
      }
    }
    if (increasing && n > 2 && maxStep > minStep) return names[j];
  }
  return null;
}

/**
 * sum e_t e_{t-1} / sum e_t^2 over the pairs of observations one period apart (gaps honoured).
 *
 * @example
 * ```ts
 * firstOrderAutocorrelation(Float64Array.of(1, -1, 1, -1)); // -0.75
 * ```
 */
export function firstOrderAutocorrelation(e: Float64Array, times?: ArrayLike<number>): number {
  const pairs = differencePairs(e.length, 1, times);
  let num = 0, den = 0;
  for (let i = 0; i < pairs.from.length; i++) num += e[pairs.to[i]] * e[pairs.from[i]];
  for (let t = 0; t < e.length; t++) den += e[t] * e[t];
  return den > 0 ? num / den : 0;
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
