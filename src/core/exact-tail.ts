/**
 * A tail probability known exactly without integration: c at or beyond an end of the support of a
 * quadratic form sum lambda_j z_j^2 (weights lambda_j = nu_j - c all of one sign) gives 0 or 1 with
 * no error. The engines and the bounds return it in the same shape as a computed probability.
 */
import type { EngineName, TailProbability } from './types.js';

/**
 * The TailProbability of an exactly known p (0 or 1 in practice): zero absolute and relative error,
 * attributed to the engine that was asked.
 *
 * @example
 * ```ts
 * exactTail(0, 'imhof'); // { p: 0, errorBound: 0, relativeError: 0, method: 'imhof' }
 * if (c <= nu[0]) return exactTail(tail === 'lower' ? 0 : 1, 'pan'); // c below the smallest eigenvalue
 * ```
 */
export function exactTail(p: number, method: EngineName): TailProbability {
  return { p, errorBound: 0, relativeError: 0, method };
}
