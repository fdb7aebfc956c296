/**
 * Asymptotic tests for serial correlation that stay valid when a lagged dependent variable is
 * among the regressors (docs/methods.md section 8). Formulas as used here (from memory, sources named):
 *
 *  - Durbin's h (Durbin 1970, Econometrica 38, 410-421): h = r1 sqrt(n / (1 - n V)), with V the
 *    estimated OLS variance of the coefficient of y_{t-1} and r1 the first-order autocorrelation of
 *    the OLS residuals, r1 = sum_{t>=2} e_t e_{t-1} / sum_{t>=1} e_t^2 (the rule r1 ~ 1 - d/2 is
 *    reported beside it, common practice). Asymptotically N(0, 1) under the null; undefined when
 *    n V >= 1. The p-value is one-sided for the positive or negative alternative (P(Z >= h) or
 *    P(Z <= h)) and 2 P(Z >= |h|) for the two-sided one.
 *  - Breusch-Godfrey LM test of order p (Breusch 1978, Australian Economic Papers 17, 334-355;
 *    Godfrey 1978, Econometrica 46, 1293-1301): the auxiliary regression of e_t on X_t and
 *    e_{t-1}, ..., e_{t-p} over all n observations, pre-sample residuals set to 0;
 *    R^2 = 1 - RSS_aux / e'e (which is the centred R^2 when X has an intercept, since then the
 *    residuals have mean zero). LM = n R^2 ~ chi^2_p asymptotically; F form
 *    F = (R^2 / p) / ((1 - R^2) / (n - k - p)) ~ F(p, n - k - p) approximately.
 *  - Durbin's alternative test (Durbin 1970, for when h is undefined; here in the p = 1 form of
 *    the auxiliary regression, a t-test on the lagged residual): t = estimate / standard error of the coefficient of e_{t-1};
 *    asymptotically N(0, 1) (one-sided by the alternative, like h); the Student t(n - k - 1)
 *    p-value is given beside it as a small-sample variant.
 *
 * With observation times, "lagged one period" means one time unit: e_{t-j} is the residual at
 * time t - j when that period is observed, else 0 (as before the sample).
 */
import { DwError, isDwError } from '../errors.js';
import { durbinWatson, differencePairs } from '../core/difference.js';
import { buildDesign, factorDesign, type FactoredDesign, type RegressorInput } from '../model/design.js';
import { fitLeastSquares, type LeastSquaresFit } from '../model/ols.js';
import type { DynamicModelCheck } from '../core/result-types.js';
import { checkAlternative, type Alternative } from '../core/alternative.js';
import { chiSquareSf, fSf, normalSf, studentTSf } from '../numeric/tails.js';
import { detectLaggedDependent } from './lagged-dependent.js';

/** Whether Durbin's h is defined: `DURBIN_H_DEFINED` when n V < 1, else `DURBIN_H_UNDEFINED`. */
export type DurbinHStatus = 'DURBIN_H_DEFINED' | 'DURBIN_H_UNDEFINED';

/**
 * A note of the diagnosis of a dynamic model, as plain data (the same shapes as the test result's
 * warnings of src/inference/warnings.ts; words in src/report/wording.ts).
 */
export type DynamicNote =
  /** The regressor `column` is y lagged one period: d is not a valid test; h and Breusch-Godfrey replace it. */
  | { code: 'D_NOT_VALID_LAGGED_DEPENDENT'; column: string; how: 'declared' | 'detected'; hDefined: boolean; bgOrder: number }
  /** The declared lagged dependent column is not y lagged one period in the data. */
  | { code: 'LAGGED_DEPENDENT_MISMATCH'; column: string };

/** Durbin's h with the quantities it is made of. */
export interface DurbinH {
  /** h, or null when n V >= 1. */
  h: number | null;
  /** p-value from the standard normal for the chosen alternative (null when h is undefined). */
  pValue: number | null;
  /** Whether h is defined (n V < 1) or not, as a typed code; the words are in src/report/wording.ts. */
  status: DurbinHStatus;
  /** First-order residual autocorrelation used. */
  r1: number;
  /** 1 - d/2, the usual shortcut for r1 (common practice), for comparison. */
  r1FromD: number;
  /** Estimated variance V of the lagged-dependent coefficient. */
  variance: number;
  /** n V. */
  nV: number;
  n: number;
}

/** The Breusch-Godfrey LM test. */
export interface BreuschGodfrey {
  order: number;
  /** n R^2. */
  lm: number;
  /** P(chi^2_p >= lm). */
  pChiSquare: number;
  /** (R^2 / p) / ((1 - R^2) / (n - k - p)). */
  f: number;
  /** P(F(p, n - k - p) >= f). */
  pF: number;
  df1: number;
  df2: number;
  /** R^2 of the auxiliary regression. */
  rSquared: number;
  n: number;
}

/** The t-test of e_t on e_{t-1} and X_t. */
export interface ResidualT {
  t: number;
  /** Normal p-value for the chosen alternative (asymptotic). */
  pValue: number;
  /** Coefficient of e_{t-1} and its standard error. */
  estimate: number;
  stdError: number;
  /** n - k - 1. */
  df: number;
  /** Student t(df) p-value for the chosen alternative (small-sample variant). */
  pStudent: number;
}

/** What the serial-correlation checks need. */
export interface SerialTestInput {
  /** The dependent variable. */
  y: ArrayLike<number>;
  /** The regressors (rows or named columns), without the intercept (added by default). */
  x: RegressorInput;
  /** Include an intercept (default true; a constant column of the caller's counts as one). */
  intercept?: boolean;
  /** Names of the regressors when `x` is given as rows. */
  names?: string[];
  /** Order p of the Breusch-Godfrey test (default 1). */
  order?: number;
  /** Alternative for the one-sided h and t p-values (default `positive`). */
  alternative?: Alternative;
  /** Observation times (strictly increasing integers); lags are in time units. */
  times?: ArrayLike<number>;
}

/** Result of {@link serialCorrelationTests}. */
export interface SerialTests {
  n: number;
  k: number;
  alternative: Alternative;
  breuschGodfrey: BreuschGodfrey;
  residualT: ResidualT;
  /** Durbin's h, when a lagged dependent regressor was named. */
  durbinH: DurbinH | null;
}

/** The diagnosis of a dynamic model: d is not valid, and what replaces it. */
export interface DynamicDiagnosis extends DynamicModelCheck {
  durbinH: DurbinH;
  breuschGodfrey: BreuschGodfrey;
  residualT: ResidualT;
  alternative: Alternative;
  /** Every statistic here is asymptotic (labelled so in reports). */
  asymptotic: true;
  /**
   * The notes of the diagnosis as typed codes: first `D_NOT_VALID_LAGGED_DEPENDENT` (d is not
   * valid here, and what to use), then any further remark (a declared column that does not match
   * y lagged). The words are in src/report/wording.ts.
   */
  notes: DynamicNote[];
}

function oneSided(z: number, alternative: Alternative, sf: (v: number) => number): number {
  if (alternative === 'positive') return sf(z);
  if (alternative === 'negative') return sf(-z);
  return Math.min(1, 2 * sf(Math.abs(z)));
}

/** Row of the observation `lag` time units earlier, or -1. */
function lagIndex(n: number, lag: number, times?: ArrayLike<number>): Int32Array {
  const idx = new Int32Array(n).fill(-1);
  if (!times) {
    for (let t = lag; t < n; t++) idx[t] = t - lag;
    return idx;
  }
  const pairs = differencePairs(n, lag, times);
  for (let i = 0; i < pairs.from.length; i++) idx[pairs.to[i]] = pairs.from[i];
  return idx;
}

function checkOrder(order: number, n: number, k: number): void {
  if (!Number.isInteger(order) || order < 1) {
    throw new DwError('OPTION_VALUE', `The Breusch-Godfrey order must be a whole number of at least 1 (got ${order}).`,
      'Use 1 for annual data, 4 for quarterly data.', { value: String(order) });
  }
  if (n - k - order < 2) {
    throw new DwError('TOO_FEW_ROWS',
      `The Breusch-Godfrey test of order ${order} needs n - k - order >= 2 (n = ${n}, k = ${k}).`,
      'Use a lower order or more observations.');
  }
}

/** Fit the auxiliary regression of e on X and e lagged 1..p (pre-sample zeros). */
function auxiliaryFit(fd: FactoredDesign, e: Float64Array, order: number, times?: ArrayLike<number>): LeastSquaresFit {
  const { n, k, names, x } = fd.design;
  const cols: Record<string, Float64Array> = {};
  for (let j = 0; j < k; j++) cols[names[j]] = x.subarray(j * n, j * n + n);
  for (let p = 1; p <= order; p++) {
    const idx = lagIndex(n, p, times);
    const col = new Float64Array(n);
    for (let t = 0; t < n; t++) col[t] = idx[t] >= 0 ? e[idx[t]] : 0;
    let name = `residual[t-${p}]`;
    while (name in cols) name = `_${name}`;
    cols[name] = col;
  }
  try {
    const aux = factorDesign(buildDesign(cols, n, { intercept: false }));
    return fitLeastSquares(aux, e);
  } catch (err) {
    if (isDwError(err)) {
      throw new DwError(err.code, `In the auxiliary regression of the residuals on X and ${order} lagged residual(s): ${err.message}`,
        err.hint || 'Use a lower order.', err.detail);
    }
    throw err;
  }
}

/**
 * Breusch-Godfrey LM test of order p, from a factored design and its OLS residuals.
 *
 * @example
 * ```ts
 * const fd = factorDesign(buildDesign({ x }, n));
 * breuschGodfrey(fd, fitLeastSquares(fd, y).residuals, 4).pChiSquare;
 * ```
 */
export function breuschGodfrey(fd: FactoredDesign, e: Float64Array, order: number, times?: ArrayLike<number>): BreuschGodfrey {
  const { n, k } = fd.design;
  checkOrder(order, n, k);
  const aux = auxiliaryFit(fd, e, order, times);
  let ee = 0;
  for (let t = 0; t < n; t++) ee += e[t] * e[t];
  const rSquared = Math.max(0, Math.min(1, 1 - aux.rss / ee));
  const lm = n * rSquared;
  const df1 = order;
  const df2 = n - k - order;
  const f = (rSquared / df1) / ((1 - rSquared) / df2);
  return { order, lm, pChiSquare: chiSquareSf(lm, df1), f, pF: fSf(f, df1, df2), df1, df2, rSquared, n };
}

/**
 * t-test of the coefficient of e_{t-1} in the regression of e_t on X_t and e_{t-1} (e_0 = 0).
 *
 * @example
 * ```ts
 * residualT(fd, residuals, 'positive').pValue;
 * ```
 */
export function residualT(fd: FactoredDesign, e: Float64Array, alternative: Alternative = 'positive', times?: ArrayLike<number>): ResidualT {
  const { n, k } = fd.design;
  checkOrder(1, n, k);
  const aux = auxiliaryFit(fd, e, 1, times);
  const c = aux.coefficients[aux.coefficients.length - 1];
  const t = c.estimate / c.stdError;
  const df = n - k - 1;
  return {
    t,
    pValue: oneSided(t, alternative, normalSf),
    estimate: c.estimate,
    stdError: c.stdError,
    df,
    pStudent: oneSided(t, alternative, (v) => studentTSf(v, df)),
  };
}

/**
 * Durbin's h from an OLS fit whose regressor `index` is y lagged one period.
 *
 * @example
 * ```ts
 * const h = durbinH(fit, fd.design.names.indexOf('ylag'), 'positive');
 * h.h; h.pValue; h.status; // 'DURBIN_H_DEFINED' when n V < 1
 * ```
 */
export function durbinH(fit: LeastSquaresFit, index: number, alternative: Alternative = 'positive', times?: ArrayLike<number>): DurbinH {
  const e = fit.residuals;
  const n = e.length;
  const k = fit.coefficients.length;
  const pairs = differencePairs(n, 1, times);
  let num = 0;
  let den = 0;
  for (let i = 0; i < pairs.from.length; i++) num += e[pairs.to[i]] * e[pairs.from[i]];
  for (let t = 0; t < n; t++) den += e[t] * e[t];
  const r1 = num / den;
  const r1FromD = 1 - durbinWatson(e, pairs) / 2;
  const variance = fit.covariance[index * k + index];
  const nV = n * variance;
  if (!(nV < 1)) {
    return {
      h: null, pValue: null, r1, r1FromD, variance, nV, n, status: 'DURBIN_H_UNDEFINED',
    };
  }
  const h = r1 * Math.sqrt(n / (1 - nV));
  return {
    h, pValue: oneSided(h, alternative, normalSf), r1, r1FromD, variance, nV, n, status: 'DURBIN_H_DEFINED',
  };
}

/** Build, factor and fit; returns the pieces every check needs. */
function fitModel(input: SerialTestInput): { fd: FactoredDesign; fit: LeastSquaresFit; alternative: Alternative; order: number } {
  const alternative = checkAlternative(input.alternative ?? 'positive');
  const n = input.y.length;
  const fd = factorDesign(buildDesign(input.x, n, { intercept: input.intercept, names: input.names }));
  const fit = fitLeastSquares(fd, input.y);
  return { fd, fit, alternative, order: input.order ?? 1 };
}

/**
 * The Breusch-Godfrey test, Durbin's alternative test (the t-test on the lagged residual) and, when `laggedDependent` names a regressor,
 * Durbin's h: the checks for serial correlation that do not rely on d.
 *
 * @example
 * ```ts
 * const s = serialCorrelationTests({ y, x: { price, ylag }, laggedDependent: 'ylag', order: 2 });
 * s.breuschGodfrey.pChiSquare; s.durbinH?.h;
 * ```
 */
export function serialCorrelationTests(input: SerialTestInput & { laggedDependent?: string }): SerialTests {
  const { fd, fit, alternative, order } = fitModel(input);
  const { n, k, names } = fd.design;
  checkOrder(order, n, k);
  let h: DurbinH | null = null;
  if (input.laggedDependent !== undefined) {
    const j = columnOf(names, input.laggedDependent);
    h = durbinH(fit, j, alternative, input.times);
  }
  return {
    n, k, alternative,
    breuschGodfrey: breuschGodfrey(fd, fit.residuals, order, input.times),
    residualT: residualT(fd, fit.residuals, alternative, input.times),
    durbinH: h,
  };
}

function columnOf(names: string[], name: string): number {
  const j = names.indexOf(name);
  if (j < 0) {
    throw new DwError('COLUMN_UNKNOWN', `The lagged dependent variable '${name}' is not among the regressors (${names.map((s) => `'${s}'`).join(', ')}).`,
      'Name one of the regressors, or add the lagged column to the regressors.', { column: name });
  }
  return j;
}

/** Input of {@link dynamicModelCheck}. */
export interface DynamicCheckInput extends SerialTestInput {
  /**
   * The regressor that is y lagged one period. When omitted it is detected from the data
   * ({@link detectLaggedDependent}); `false` turns detection off (the result is then null).
   */
  laggedDependent?: string | false;
}

/**
 * When the regressors include y lagged one period: the diagnosis that d is not valid, with
 * Durbin's h, the Breusch-Godfrey test and Durbin's alternative test in its place (all asymptotic).
 * Returns null when no lagged dependent variable is declared or detected.
 *
 * @example
 * ```ts
 * const r = dynamicModelCheck({ y, x: { income, ylag }, order: 4 });
 * r?.laggedDependent;      // 'ylag' (detected)
 * r?.durbinH.h;            // Durbin's h, or null with r.durbinH.status 'DURBIN_H_UNDEFINED'
 * r?.breuschGodfrey.pChiSquare;
 * ```
 */
export function dynamicModelCheck(input: DynamicCheckInput): DynamicDiagnosis | null {
  if (input.laggedDependent === false) return null;
  const { fd, fit, alternative, order } = fitModel(input);
  const { n, k, names, x, interceptAdded } = fd.design;
  const notes: DynamicNote[] = [];
  let mismatch = false;
  let name: string;
  let how: 'declared' | 'detected';
  const columns: Record<string, Float64Array> = {};
  names.forEach((nm, j) => { if (!(interceptAdded && j === 0)) columns[nm] = x.subarray(j * n, j * n + n); });
  if (input.laggedDependent !== undefined) {
    name = input.laggedDependent;
    how = 'declared';
    columnOf(names, name);
    if (detectLaggedDependent(input.y, { [name]: columns[name] ?? new Float64Array(n) }, input.times) === null) {
      mismatch = true;
    }
  } else {
    const found = detectLaggedDependent(input.y, columns, input.times);
    if (found === null) return null;
    name = found;
    how = 'detected';
  }
  checkOrder(order, n, k);
  const h = durbinH(fit, columnOf(names, name), alternative, input.times);
  const bg = breuschGodfrey(fd, fit.residuals, order, input.times);
  const rt = residualT(fd, fit.residuals, alternative, input.times);
  notes.push({ code: 'D_NOT_VALID_LAGGED_DEPENDENT', column: name, how, hDefined: h.h !== null, bgOrder: order });
  if (mismatch) notes.push({ code: 'LAGGED_DEPENDENT_MISMATCH', column: name });
  return {
    laggedDependent: name,
    how,
    durbinH: h,
    breuschGodfrey: bg,
    residualT: rt,
    alternative,
    asymptotic: true,
    notes,
  };
}
