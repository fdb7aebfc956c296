/**
 * Multiple-testing adjustment of a family of p-values.
 *
 * Holm (1979), "A simple sequentially rejective multiple test procedure", Scandinavian Journal of
 * Statistics 6, 65-70: with the p-values sorted, p_(1) <= ... <= p_(m), the adjusted value of
 * p_(i) is max over j <= i of min(1, (m - j + 1) p_(j)); rejecting where it is <= alpha controls
 * the family-wise error rate at alpha under any dependence.
 *
 * Benjamini & Hochberg (1995), "Controlling the false discovery rate", Journal of the Royal
 * Statistical Society B 57, 289-300: the adjusted value of p_(i) is min over j >= i of
 * min(1, m p_(j) / j); rejecting where it is <= alpha controls the false discovery rate at alpha
 * for independent (or positively dependent) tests.
 */
import { DwError } from '../errors.js';

/** The adjustments offered: Holm's step-down (family-wise error) and Benjamini-Hochberg's step-up (false discovery rate). */
export const ADJUSTMENTS = ['holm', 'bh'] as const;
export type Adjustment = (typeof ADJUSTMENTS)[number];

/**
 * Adjusted p-values, in the order of `p`. Every entry must be a number in [0, 1]; ties keep their
 * input order (the adjusted values of tied p-values are equal either way).
 *
 * @example
 * ```ts
 * adjustPValues([0.01, 0.04, 0.03, 0.005], 'holm'); // [0.03, 0.06, 0.06, 0.02]
 * adjustPValues([0.01, 0.04, 0.03, 0.005], 'bh');   // [0.02, 0.04, 0.04, 0.02]
 * ```
 */
export function adjustPValues(p: ArrayLike<number>, method: Adjustment): Float64Array {
  if (!(ADJUSTMENTS as readonly string[]).includes(method)) {
    throw new DwError('OPTION_VALUE', `The adjustment '${String(method)}' is not known.`, "Use 'holm' (family-wise error rate) or 'bh' (false discovery rate).", { value: String(method) });
  }
  const m = p.length;
  for (let i = 0; i < m; i++) {
    if (!(typeof p[i] === 'number' && p[i] >= 0 && p[i] <= 1)) {
      throw new DwError('PROBABILITY_OUT_OF_RANGE', `p-value ${i + 1} of the family is ${p[i]}, not a probability.`, 'Every p-value must lie in [0, 1].', { value: String(p[i]) });
    }
  }
  const order = Array.from({ length: m }, (_, i) => i).sort((a, b) => p[a] - p[b] || a - b);
  const out = new Float64Array(m);
  if (method === 'holm') {
    let running = 0;
    for (let r = 0; r < m; r++) {
      running = Math.max(running, Math.min(1, (m - r) * p[order[r]]));
      out[order[r]] = running;
    }
  } else {
    let running = 1;
    for (let r = m - 1; r >= 0; r--) {
      running = Math.min(running, Math.min(1, (m * p[order[r]]) / (r + 1)));
      out[order[r]] = running;
    }
  }
  return out;
}
