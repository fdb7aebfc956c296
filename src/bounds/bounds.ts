/**
 * The Durbin-Watson bounds d_L and d_U (Durbin & Watson 1950, Biometrika 37, 409-428; 1951,
 * Biometrika 38, 159-178) computed exactly for any n, k' and alpha: the alpha-quantiles of the
 * lower- and upper-bound statistics of docs/methods.md section 2, whose spectra are known in closed form
 * (spectra.ts), solved by Imhof's integral (Imhof 1961) on a closed form of the characteristic
 * function (cosine-form.ts) or, on request, by any engine of the library. For every design X with an intercept and k' further regressors the exact lower
 * critical value of d at level alpha lies in [d_L, d_U]; that is the bounds test of the printed
 * tables (Savin & White 1977, Econometrica 45, 1989-1996, for n = 6..200).
 */
import { DwError } from '../errors.js';
import { checkAlpha } from '../core/alternative.js';
import type { MethodChoice } from '../core/types.js';
import { DwNullDistribution } from '../distribution/null-distribution.js';
import { boundQuantile } from './quantile.js';
import { checkBoundsDesign, lowerBoundIndices, lowerBoundSpectrum, upperBoundIndices, upperBoundSpectrum } from './spectra.js';

/** Options of {@link bounds}. */
export interface BoundsOptions {
  /** Whether the model has an intercept (default true, the tables' case). */
  intercept?: boolean;
  /**
   * Engine for the quantiles. `auto` (default): Imhof's integral on the closed-form characteristic
   * form of the bounding spectrum (cosine-form.ts, O(k') per point; about 1e-9 in d), with small
   * tails handed to the general engine choice. A named engine (`imhof`, `pan`) runs
   * DwNullDistribution.fromSpectrum(spectrum).quantile with that engine on the explicit spectrum
   * (O(m) per point; 1e-12 in d).
   */
  method?: MethodChoice;
  /** Target absolute error of each probability (default: 1e-10 for `auto`, the distribution's 1e-11 otherwise). */
  tolerance?: number;
}

/** The two bounds for one (n, k', alpha). */
export interface DwBounds {
  /** Observations. */
  n: number;
  /** Regressors other than the intercept (the tables' k'). */
  kPrime: number;
  /** One-sided level: P(d_lower <= dL) = P(d_upper <= dU) = alpha. */
  alpha: number;
  /** Whether the bounds are those of a model with an intercept. */
  intercept: boolean;
  /** Weights in each bounding statistic: m = n - k' - 1 with an intercept, n - k' without. */
  m: number;
  /** Lower bound d_L: reject in favour of positive autocorrelation when d < dL, whatever X is. */
  dL: number;
  /** Upper bound d_U: the bounds test does not reject (against positive autocorrelation) when d > dU, whatever X is. */
  dU: number;
}

/**
 * Check a significance level for the bounds: the library's one level check, {@link checkAlpha}
 * of src/core/alternative.ts, under its former name (kept so that existing callers still compile).
 *
 * @deprecated Use `checkAlpha`.
 * @example
 * ```ts
 * checkBoundsAlpha(0.05); // fine
 * checkBoundsAlpha(5);    // throws ALPHA_OUT_OF_RANGE: write 0.05 for 5%
 * ```
 */
export const checkBoundsAlpha: (alpha: number) => void = checkAlpha;

/**
 * Exact d_L and d_U for n observations, k' regressors other than the intercept and one-sided level
 * alpha (test against positive autocorrelation; for negative autocorrelation use 4 - dU and 4 - dL).
 *
 * @example
 * ```ts
 * bounds(20, 1, 0.05); // { dL: 1.2015..., dU: 1.4107..., m: 18, ... } (Savin & White 1977: 1.201, 1.411)
 * bounds(20, 1, 0.05, { intercept: false }); // the no-intercept bounds (docs/methods.md section 2)
 * ```
 */
export function bounds(n: number, kPrime: number, alpha: number, options: BoundsOptions = {}): DwBounds {
  const intercept = options.intercept ?? true;
  checkAlpha(alpha);
  const m = checkBoundsDesign(n, kPrime, intercept);
  const method = options.method ?? 'auto';
  let dL: number;
  let dU: number;
  if (method === 'auto') {
    const opts = options.tolerance === undefined ? {} : { tolerance: options.tolerance };
    dL = boundQuantile(n, lowerBoundIndices(n, kPrime, intercept), alpha, opts).value;
    dU = boundQuantile(n, upperBoundIndices(n, kPrime, intercept), alpha, opts).value;
  } else {
    const dist = { method, tolerance: options.tolerance };
    // for levels above 1/2 solve P(d >= c) = 1 - alpha: the upper tail is computed directly
    const level = Math.min(alpha, 1 - alpha);
    const solve = (nu: Float64Array) => {
      const d = DwNullDistribution.fromSpectrum(nu, dist);
      const c = alpha <= 0.5 ? d.quantile(alpha) : d.upperQuantile(1 - alpha);
      // a named engine answers with its own accuracy: refuse a level it cannot resolve
      const check = alpha <= 0.5 ? d.lowerTail(c) : d.upperTail(c);
      if (check.errorBound > 1e-3 * level) {
        throw new DwError('ENGINE_NOT_APPLICABLE',
          `The engine '${method}' cannot resolve the level ${alpha}: its error bound near the quantile is ${check.errorBound.toExponential(1)}.`,
          "Use the default method ('auto'), which keeps relative accuracy in the far tails.");
      }
      return c;
    };
    dL = solve(lowerBoundSpectrum(n, kPrime, intercept));
    dU = solve(upperBoundSpectrum(n, kPrime, intercept));
  }
  return { n, kPrime, alpha, intercept, m, dL, dU };
}
