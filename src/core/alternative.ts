/**
 * The two choices every test in the library shares: the alternative hypothesis (the side of d that
 * counts as evidence: small d for positive autocorrelation, large d for negative) and the
 * significance level. Checked where the input enters, with a DwError a caller can act on.
 */
import { DwError } from '../errors.js';

/** Alternative hypothesis: positive autocorrelation (small d), negative (large d), or either. */
export type Alternative = 'positive' | 'negative' | 'two-sided';

const ALTERNATIVES: readonly Alternative[] = ['positive', 'negative', 'two-sided'];

/**
 * Check an alternative given by a caller (an option, a CLI word, a field of a JSON request) and
 * return it typed. Throws `OPTION_VALUE` for anything but `positive`, `negative` or `two-sided`.
 *
 * @example
 * ```ts
 * checkAlternative('two-sided'); // 'two-sided'
 * checkAlternative('greater');   // throws DwError OPTION_VALUE: Unknown alternative 'greater'.
 * const alt = checkAlternative(options.alternative ?? 'positive');
 * ```
 */
export function checkAlternative(value: unknown): Alternative {
  if (!(ALTERNATIVES as readonly unknown[]).includes(value)) {
    throw new DwError('OPTION_VALUE', `Unknown alternative '${String(value)}'.`, 'Use positive, negative or two-sided.');
  }
  return value as Alternative;
}

/**
 * Check a significance level: a number strictly between 0 and 1 (NaN and non-numbers refused).
 * Throws `ALPHA_OUT_OF_RANGE` otherwise, with the value in the error's detail.
 *
 * @example
 * ```ts
 * checkAlpha(0.05); // fine
 * checkAlpha(5);    // throws DwError ALPHA_OUT_OF_RANGE: write 0.05 for 5%
 * checkAlpha(0);    // throws: a level of 0 rejects nothing
 * ```
 */
export function checkAlpha(alpha: number): void {
  if (!(typeof alpha === 'number' && alpha > 0 && alpha < 1)) {
    throw new DwError('ALPHA_OUT_OF_RANGE', `The significance level ${alpha} is outside (0, 1).`,
      'Give the level as a fraction, e.g. 0.05 for 5%.', { value: String(alpha) });
  }
}
