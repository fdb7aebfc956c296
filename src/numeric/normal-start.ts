/**
 * A rough standard normal quantile for starting a root search: the rational approximation of
 * Abramowitz & Stegun (1964), Handbook of Mathematical Functions, formula 26.2.23, absolute error
 * in z below 4.5e-4 for 0 < q <= 0.5. Only a starting value: every caller refines it by an exact
 * root search.
 */

/**
 * The z with P(Z > z) = q, roughly (|error| < 4.5e-4), for a standard normal Z and 0 < q <= 0.5
 * (A&S 26.2.23). The caller keeps q in that range (for instance by clamping, or by passing
 * min(alpha, 1 - alpha) and choosing the sign of z itself).
 *
 * @example
 * ```ts
 * normalUpperQuantileStart(0.05);  // 1.6452... (exact 1.6449)
 * normalUpperQuantileStart(0.5);   // about 0 (|z| < 4.5e-4)
 * const alpha = 0.95;
 * const z = (alpha < 0.5 ? -1 : 1) * normalUpperQuantileStart(Math.min(alpha, 1 - alpha)); // about 1.645
 * ```
 */
export function normalUpperQuantileStart(q: number): number {
  const t = Math.sqrt(-2 * Math.log(q));
  return t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
}
