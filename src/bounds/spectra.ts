/**
 * The spectra of the Durbin-Watson bounds (Durbin & Watson 1950, Biometrika 37, 409-428;
 * docs/methods.md section 2). The first-difference matrix A = D'D has the eigenvalues
 *
 *   lambda_j = 2 - 2 cos(pi j / n) = 4 sin^2(pi j / (2n)),   j = 0..n-1,
 *
 * and the m = n - k eigenvalues nu_1 <= ... <= nu_m of the design's M A M interlace them:
 * lambda_{i-1} <= nu_i <= lambda_{i+k-1}. With an intercept in X the constant vector (the j = 0
 * eigenvector) is removed exactly and the lower side tightens to lambda_i <= nu_i. Replacing each
 * nu_i by its bound gives the two bounding statistics, pathwise d_lower <= d <= d_upper:
 *
 *   with intercept (k = k' + 1):  lower  lambda_1 .. lambda_m,       upper  lambda_k .. lambda_{n-1}
 *   without (k = k'):             lower  lambda_0 .. lambda_{m-1},   upper  lambda_k .. lambda_{n-1}
 *
 * The no-intercept lower bound is Farebrother's (1980, Econometrica 48, 1553-1563; from memory).
 * The no-intercept upper bound is our own reading of the interlacing nu_i <= lambda_{i+k-1} with
 * k = k' columns: it is the sharp bound over all designs of k' columns (reached when col(X) is
 * spanned by the first k' eigenvectors, the constant among them), and it equals the with-intercept
 * upper bound for k' - 1 regressors.
 */
import { DwError } from '../errors.js';
import { POLICY } from '../policy.js';

/** Largest n accepted by the bounds functions (a limit on time, not on the mathematics). */
export const MAX_BOUNDS_N = POLICY.limits.MAX_BOUNDS_N;

/**
 * The eigenvalue lambda_j = 4 sin^2(pi j / (2n)) of the first-difference matrix A of size n (the
 * sine form keeps full relative accuracy for small j, where 2 - 2 cos loses it).
 *
 * @example
 * ```ts
 * differenceEigenvalue(10, 5); // 2
 * ```
 */
export function differenceEigenvalue(n: number, j: number): number {
  const s = Math.sin((Math.PI * j) / (2 * n));
  return 4 * s * s;
}

/** Which eigenvalues of A (0-based indices j, ascending, contiguous) make up a bounding spectrum. */
export interface BoundIndices {
  /** Smallest index j. */
  first: number;
  /** Number of weights m = n - k. */
  m: number;
}

/**
 * Check a bounds request (n, k') and return m = n - k, k = k' + 1 with an intercept, k' without.
 * Throws `K_INVALID`, `N_INVALID` or `SIZE_LIMIT`.
 *
 * @example
 * ```ts
 * checkBoundsDesign(20, 1, true); // 18
 * ```
 */
export function checkBoundsDesign(n: number, kPrime: number, intercept: boolean): number {
  if (!(Number.isInteger(kPrime) && kPrime >= 0)) {
    throw new DwError('K_INVALID', `k' must be a whole number of at least 0 (got ${kPrime}).`,
      "k' counts the regressors other than the intercept, e.g. 1 for a regression on one variable and a constant.",
      { value: String(kPrime) });
  }
  if (!Number.isInteger(n)) {
    throw new DwError('N_INVALID', `n must be a whole number of observations (got ${n}).`, 'Give the sample size, e.g. 20.', { value: String(n) });
  }
  const nMin = kPrime + (intercept ? 3 : 2);
  if (n < nMin) {
    throw new DwError('N_INVALID',
      `n = ${n} is too small for k' = ${kPrime}${intercept ? ' and an intercept' : ' without an intercept'}: the bounds need n >= ${nMin} (at least 2 residual degrees of freedom).`,
      `Use n >= ${nMin}, or fewer regressors.`, { value: String(n) });
  }
  if (n > MAX_BOUNDS_N) {
    throw new DwError('SIZE_LIMIT', `n = ${n} is above the limit of ${MAX_BOUNDS_N} for the bounds.`,
      `Use n <= ${MAX_BOUNDS_N}; for a larger sample compute the exact critical value of your own design instead ('exact-dw critical').`,
      { value: String(n) });
  }
  return n - kPrime - (intercept ? 1 : 0);
}

/**
 * Indices of the lower-bound spectrum: lambda_1..lambda_m with an intercept, lambda_0..lambda_{m-1} without.
 *
 * @example
 * ```ts
 * lowerBoundIndices(20, 1);        // { first: 1, m: 18 }
 * lowerBoundIndices(20, 1, false); // { first: 0, m: 19 }
 * ```
 */
export function lowerBoundIndices(n: number, kPrime: number, intercept = true): BoundIndices {
  const m = checkBoundsDesign(n, kPrime, intercept);
  return { first: intercept ? 1 : 0, m };
}

/**
 * Indices of the upper-bound spectrum: lambda_k..lambda_{n-1} (k = k' + 1 with an intercept, k' without).
 *
 * @example
 * ```ts
 * upperBoundIndices(20, 1);        // { first: 2, m: 18 }
 * upperBoundIndices(20, 1, false); // { first: 1, m: 19 }
 * ```
 */
export function upperBoundIndices(n: number, kPrime: number, intercept = true): BoundIndices {
  const m = checkBoundsDesign(n, kPrime, intercept);
  return { first: n - m, m };
}

function spectrumOf(n: number, idx: BoundIndices): Float64Array {
  const nu = new Float64Array(idx.m);
  for (let i = 0; i < idx.m; i++) nu[i] = differenceEigenvalue(n, idx.first + i);
  return nu;
}

/**
 * The ascending spectrum of the lower bound d_L for n observations and k' regressors other than
 * the intercept (docs/methods.md section 2).
 *
 * @example
 * ```ts
 * lowerBoundSpectrum(20, 1);        // lambda_1..lambda_18 of the 20 x 20 difference matrix
 * lowerBoundSpectrum(20, 1, false); // lambda_0..lambda_18 (no intercept: 0 comes first)
 * ```
 */
export function lowerBoundSpectrum(n: number, kPrime: number, intercept = true): Float64Array {
  return spectrumOf(n, lowerBoundIndices(n, kPrime, intercept));
}

/**
 * The ascending spectrum of the upper bound d_U for n observations and k' regressors other than
 * the intercept (docs/methods.md section 2).
 *
 * @example
 * ```ts
 * upperBoundSpectrum(20, 1); // lambda_2..lambda_19
 * ```
 */
export function upperBoundSpectrum(n: number, kPrime: number, intercept = true): Float64Array {
  return spectrumOf(n, upperBoundIndices(n, kPrime, intercept));
}
