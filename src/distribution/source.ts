/**
 * Where a null distribution comes from: an explicit spectrum (bounds, closed forms), or a design
 * (operator A and a basis of col(X)) whose spectrum is computed only when an engine needs it.
 */
import type { BandMatrix, ColumnBasis } from '../core/types.js';
import { spectrumMean, spectrumVariance } from '../core/spectrum.js';

/** The inputs every engine can draw from. */
export interface NullSource {
  /** m = n - k, the number of weights. */
  m: number;
  /** The ascending spectrum nu (computed on first use and then kept). */
  spectrum(): Float64Array;
  /** True when the spectrum is already known (no O(n^3) work to get it). */
  hasSpectrum(): boolean;
  /** The operator A and basis of col(X), when the source is a design (for the eigen-free engine). */
  operator?: BandMatrix;
  basis?: ColumnBasis;
  /** Exact mean and variance of d. */
  mean(): number;
  variance(): number;
  /** Interval holding the support of d (exactly [nu_1, nu_m] once the spectrum is known). */
  support(): [number, number];
}

/**
 * A source from an explicit ascending spectrum.
 *
 * @example
 * ```ts
 * spectrumSource(Float64Array.of(0.5, 1.5, 3)).mean(); // 5/3
 * ```
 */
export function spectrumSource(nu: Float64Array): NullSource {
  for (let i = 1; i < nu.length; i++) {
    if (!(nu[i] >= nu[i - 1])) throw new RangeError('spectrumSource: the spectrum must be sorted ascending and finite');
  }
  return {
    m: nu.length,
    spectrum: () => nu,
    hasSpectrum: () => true,
    mean: () => spectrumMean(nu),
    variance: () => spectrumVariance(nu),
    support: () => [nu[0], nu[nu.length - 1]],
  };
}

/** A source from a design: the spectrum is computed lazily by `compute`. */
export function designSource(m: number, operator: BandMatrix, basis: ColumnBasis, compute: () => Float64Array): NullSource {
  let nu: Float64Array | undefined;
  const spectrum = () => (nu ??= compute());
  return {
    m,
    spectrum,
    hasSpectrum: () => nu !== undefined,
    operator,
    basis,
    mean: () => spectrumMean(spectrum()),
    variance: () => spectrumVariance(spectrum()),
    support: () => { const s = spectrum(); return [s[0], s[s.length - 1]]; },
  };
}
