/**
 * The shapes of the exact Durbin-Watson test: its input (y or residuals with the regressors, the
 * options, the time index, a panel), the reproducibility record, the exact p-values and the full
 * result. Plain data: every note is a typed code (src/inference/warnings.ts), its words in
 * src/report/wording.ts. No formula.
 */
import type { EngineChoice, EngineName } from '../core/types.js';
import type { Coefficient } from '../model/ols.js';
import type { RegressorInput } from '../model/design.js';
import type { Alternative } from '../core/alternative.js';
import type { BoundsZone, PowerSummary, DynamicModelCheck } from '../core/result-types.js';
import type { DwProblem, ProblemOptions } from '../problem/problem.js';
import type { BreuschGodfrey } from '../dynamic/serial-tests.js';
import type { ErrorProcess } from '../power/weights.js';
import type { PanelInput, PanelSummary } from '../panel/panel.js';
import type { PanelNote, DwWarning } from './warnings.js';
import type { TimeFrequency } from '../data/time-index.js';
import type { DroppedRows, TimeColumnInfo, TimeLabelsInput } from './data-input.js';

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
   * Drop the rows with a missing value (NaN, null) in y, a regressor or the time index (for a
   * panel also the entity, or a missing-value code as its label); they are listed in `droppedRows`
   * and become gaps (within their entity, for a panel). Without it such values are refused.
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
  /** Why the `auto` chooser let that engine answer, as a typed code (null when the engine was named); words in src/report/wording.ts. */
  methodChoice: EngineChoice | null;
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
  rhoHat: number | null;
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

/** What a run of the test returns: the result, the prepared problem and the observation times used. */
export interface TestRun {
  result: DwTestResult;
  problem: DwProblem;
  times?: ArrayLike<number>;
}
