/**
 * The tail probabilities of a batch series: the single test's own engine answer (the `auto` rule
 * of src/engines/choose.ts, Imhof's integral on the spectrum evaluated as a complex product,
 * src/engines/imhof-product.ts), with the allowance for rounding in the spectrum obtained more
 * cheaply.
 *
 * That allowance follows DwNullDistribution.lowerTail / upperTail
 * (src/distribution/null-distribution.ts): every nu_i is known to within delta, so d and c are too,
 * and the tail moves by at most 2 delta times the slope of the distribution function near c. The
 * single test measures that slope by a second integral at c + h; here, for c well inside the
 * support, the density of d at c comes from the same evaluations as the tail (with its own error
 * bound, added to it), which saves the second integral. Near the ends of the support, and where
 * the density cannot be bounded (two weights), the single test's rule is used as it is. Hence every
 * probability is the single test's, bit for bit, and every error bound is built from the same
 * terms (test/batch/batch-fast-tail.test.ts).
 */
import type { DwNullDistribution } from '../distribution/null-distribution.js';
import type { Tail, TailProbability } from '../core/types.js';
import { AUTO_SPECTRUM_MAX_N, AUTO_RELATIVE_TARGET } from '../engines/choose.js';
import { imhofProductWithDensity } from '../engines/imhof-product.js';
import { DwError } from '../errors.js';

/**
 * P(d <= c) (`lower`) or P(d >= c) (`upper`) for the null distribution `dist`, with the error
 * bound of DwNullDistribution.lowerTail / upperTail: the engine's own bound plus the effect of
 * rounding in the spectrum, 2 delta times the density at c plus its error bound (or the slope
 * measured between c and c +- h; near an end of the support, the tails at c -+ 2 delta taken
 * directly).
 *
 * @example
 * ```ts
 * const { distribution } = prepareProblem({ t: [1, 2, 3, 4, 5, 6, 7, 8] }, 8);
 * batchTail(distribution, 1.1, 'lower'); // distribution.lowerTail(1.1)'s p, bit for bit
 * ```
 */
export function batchTail(dist: DwNullDistribution, c: number, tail: Tail): TailProbability {
  if (!Number.isFinite(c)) throw new DwError('D_OUT_OF_RANGE', `The point ${c} is not a finite number.`, 'Give a finite value of d.');
  const { source, options } = dist;
  const delta = source.spectrumError;
  const usesSpectrum = (options.method ?? 'auto') === 'auto' && !(source.operator && (source.basis?.n ?? 0) > AUTO_SPECTRUM_MAX_N);
  if (usesSpectrum && delta > 0) {
    // the usual case, c well inside the support: the tail at c and the density of d there (the
    // slope of the distribution's rule) from the same evaluations (src/engines/imhof-product.ts)
    const nu = source.spectrum();
    const [lo, hi] = [nu[0], nu[nu.length - 1]];
    const h = Math.max(1e4 * delta, 1e-9 * (hi - lo));
    if (c - lo > h && hi - c > h) {
      const { tail: at, density, densityError } = imhofProductWithDensity(nu, c, tail, { tolerance: options.tolerance });
      if (at.relativeError <= AUTO_RELATIVE_TARGET && density !== null) {
        const r = { ...at, reason: { code: 'IMHOF_SPECTRUM' } as const };
        if (r.p === 0 || r.p === 1) return r;
        // moving every nu_i by at most delta moves d by at most delta: the tail moves by at most
        // 2 delta times the density near c (twice, as the distribution's slope rule)
        const extra = 2 * delta * (density + densityError);
        const errorBound = r.errorBound + extra;
        return { ...r, errorBound, relativeError: r.relativeError + extra / r.p };
      }
    }
  }
  // otherwise exactly the distribution's own rule (a second integral for the slope, or both sides near an end)
  return tail === 'lower' ? dist.lowerTail(c) : dist.upperTail(c);
}
