/**
 * Shapes of the parts of a test result that lower layers compute (the bounds zone, the power
 * summary, the dynamic-model diagnosis), kept here so that bounds/, power/ and dynamic/ need not
 * import from the inference layer above them.
 */
import type { Alternative } from './alternative.js';

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
  /**
   * What the bounds test says at this level and alternative, and the exact p-value beside it, as
   * plain data; the words (the "resolution") are written by src/report/wording.ts.
   */
  outcome: BoundsOutcome;
}

/** The outcome of the bounds test for one d, level and alternative (see {@link BoundsZone}). */
export interface BoundsOutcome {
  /**
   * `BOUNDS_REJECT`: d lies beyond the bound on the side tested, whatever the regressors;
   * `BOUNDS_INCONCLUSIVE`: d lies between the bounds on the side tested, so only the exact
   * distribution for the design decides; `BOUNDS_DO_NOT_REJECT`: the bounds test does not reject,
   * whatever the regressors.
   */
  code: 'BOUNDS_REJECT' | 'BOUNDS_INCONCLUSIVE' | 'BOUNDS_DO_NOT_REJECT';
  /** The observed d. */
  d: number;
  /** The test's level (the bounds are at alpha / 2 each side for a two-sided test). */
  alpha: number;
  alternative: Alternative;
  /** Bounds of a model with an intercept (the printed tables' case). */
  intercept: boolean;
  /** The exact p-value for the design under the same alternative, or null when not known. */
  exactP: number | null;
  /** Absolute error bound of `exactP` (0 when not known). */
  exactPErrorBound: number;
}

/** Exact power of the test against stationary AR(1) errors for this X (docs/methods.md section 6). */
export interface PowerSummary {
  alpha: number;
  /** The exact critical value used (P(D <= critical) = alpha under the null). */
  critical: number;
  curve: { rho: number; power: number }[];
  /** Target power and the smallest rho > 0 reaching it (null when not reached for rho < 1). */
  target: number;
  rhoAtTarget: number | null;
}

/** Diagnosis when the regressors include the dependent variable lagged (docs/methods.md section 8). */
export interface DynamicModelCheck {
  /** Name of the lagged dependent regressor. */
  laggedDependent: string;
  /** How it was found: declared by the caller or detected from the data. */
  how: 'declared' | 'detected';
  /**
   * Durbin's h (asymptotic N(0, 1)); null value when n V >= 1, with `status` saying which (a typed
   * code, words in src/report/wording.ts) and the n V and V it is decided by.
   */
  durbinH: { h: number | null; pValue: number | null; status: 'DURBIN_H_DEFINED' | 'DURBIN_H_UNDEFINED'; nV: number; variance: number };
  /** Breusch-Godfrey LM test of order `order` (asymptotic), chi-square and F forms. */
  breuschGodfrey: { order: number; lm: number; pChiSquare: number; f: number; pF: number; df1: number; df2: number };
  /** t-test of the residual on its own lag and the regressors (asymptotic). */
  residualT: { t: number; pValue: number };
}
