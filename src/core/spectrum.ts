/**
 * The spectrum behind the exact distribution (docs/methods.md section 2): the m = n - k eigenvalues
 * nu_1 <= ... <= nu_m of Z'AZ, Z an orthonormal basis of the complement of col(X). Then
 * d = sum nu_i z_i^2 / sum z_i^2 with z ~ N(0, I_m) under the null (Durbin & Watson 1950).
 */
import { bandToDense } from './difference.js';
import { congruence, type HouseholderQR } from '../linalg/qr.js';
import { symmetricEigenvalues } from '../linalg/symmetric-eigen.js';
import type { BandMatrix } from './types.js';

/**
 * Dense route: Q'AQ by two-sided Householder reflections (O(n^2 k)), then the eigenvalues of the
 * trailing m x m block (O(m^3)). Ascending.
 *
 * @example
 * ```ts
 * const nu = denseSpectrum(differenceMatrix(differencePairs(10)), householderQR(ones, 10, 1));
 * // nu[i] = 2 - 2 cos(pi (i + 1) / 10): an intercept deflates A exactly
 * ```
 */
export function denseSpectrum(a: BandMatrix, f: HouseholderQR): Float64Array {
  const { n, k } = f;
  const m = n - k;
  const s = congruence(f, bandToDense(a));
  const block = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    block.set(s.subarray((i + k) * n + k, (i + k) * n + n), i * m);
  }
  return symmetricEigenvalues(block, m);
}

/**
 * Exact mean of d: sum nu / m (docs/methods.md section 2).
 *
 * @example
 * ```ts
 * spectrumMean(Float64Array.of(1, 2, 3)); // 2
 * ```
 */
export function spectrumMean(nu: Float64Array): number {
  let s = 0;
  for (let i = 0; i < nu.length; i++) s += nu[i];
  return s / nu.length;
}

/**
 * Exact variance of d: 2 (m sum nu^2 - (sum nu)^2) / (m^2 (m + 2)), computed stably about the mean.
 *
 * @example
 * ```ts
 * spectrumVariance(Float64Array.of(1, 2, 3)); // 2 * 3 * 2 / (9 * 5) = 0.2667
 * ```
 */
export function spectrumVariance(nu: Float64Array): number {
  const m = nu.length;
  const mean = spectrumMean(nu);
  let ss = 0;
  for (let i = 0; i < m; i++) { const dv = nu[i] - mean; ss += dv * dv; }
  // m sum nu^2 - (sum nu)^2 = m * sum (nu - mean)^2
  return (2 * m * ss) / (m * m * (m + 2));
}
