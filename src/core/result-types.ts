/**
 * Shapes of the parts of a test result that lower layers compute (the bounds zone, the power
 * summary, the dynamic-model diagnosis), kept here so that bounds/, power/ and dynamic/ need not
 * import from the inference layer above them.
 */

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
  /** Durbin's h (asymptotic N(0, 1)); null value with a reason when n V >= 1. */
  durbinH: { h: number | null; pValue: number | null; reason: string };
  /** Breusch-Godfrey LM test of order `order` (asymptotic), chi-square and F forms. */
  breuschGodfrey: { order: number; lm: number; pChiSquare: number; f: number; pF: number; df1: number; df2: number };
  /** t-test of the residual on its own lag and the regressors (asymptotic). */
  residualT: { t: number; pValue: number };
}
