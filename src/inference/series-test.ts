/**
 * The test of one series: resolve the input (time index, dropped rows, y or residuals), prepare
 * the design, compute d = sum (e_t - e_{t-lag})^2 / sum e_t^2 over the pairs of the time index
 * (Durbin & Watson 1950), its exact p-values and critical values, the bounds zone, the power, the
 * checks of a dynamic model, and the typed notes of the result.
 */
import { DwError } from '../errors.js';
import { durbinWatson } from '../core/difference.js';
import { fitLeastSquares, type Coefficient } from '../model/ols.js';
import { designErrorAllowance } from '../model/design.js';
import { checkAlpha, checkAlternative } from '../core/alternative.js';
import type { DynamicModelCheck } from '../core/result-types.js';
import { prepareProblem } from '../problem/problem.js';
import { dynamicModelCheck, breuschGodfrey, type BreuschGodfrey } from '../dynamic/serial-tests.js';
import { boundsZone } from '../bounds/zone.js';
import { MAX_BOUNDS_N } from '../bounds/spectra.js';
import { powerForProblem } from '../power/exact-power.js';
import type { DwWarning } from './warnings.js';
import { VERSION } from '../version.js';
import { resolveDataInput } from './data-input.js';
import type { DwTestInput, DesignReuse, DwTestResult, TestRun } from './test-types.js';
import { pValuesFor } from './p-values.js';
import { checkResiduals, firstOrderAutocorrelation, laggedDependentPresent, timeLikeColumn } from './residual-checks.js';

/**
 * Run the test on one series (`panelMode` when called by the panel route on its reordered rows).
 *
 * @example
 * ```ts
 * const { result } = runSeries({ y, x: { price } }, undefined, false);
 * ```
 */
export function runSeries(input: DwTestInput, reuse: DesignReuse | undefined, panelMode: boolean): TestRun {
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
      warnings.push(...check.notes);
    } else {
      // the same Breusch-Godfrey test as for a dynamic model (src/dynamic/serial-tests.ts), next to d;
      // with no two observations j periods apart (j <= p) its auxiliary regression has no lagged
      // residual there, and the test is not defined: a note says so, and d's test goes on
      const order = input.bgOrder ?? 1;
      try {
        bg = breuschGodfrey(problem.factored, residuals, order, times);
      } catch (err) {
        if (!(err instanceof DwError && err.code === 'TIME_INVALID' && times !== undefined)) throw err;
        warnings.push({ code: 'BREUSCH_GODFREY_UNDEFINED', order });
      }
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

