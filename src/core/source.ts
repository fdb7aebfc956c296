/**
 * Where a null distribution comes from: an explicit spectrum (bounds, closed forms), or a design
 * (operator A and a basis of col(X)) whose spectrum is computed only when an engine needs it.
 */
import type { BandMatrix, ColumnBasis } from './types.js';
import { spectrumMean, spectrumVariance } from './spectrum.js';
import { bandMultiply } from './difference.js';

/** The inputs every engine can draw from. */
export interface NullSource {
  /** m = n - k, the number of weights. */
  m: number;
  /**
   * Bound on how far each nu_i may be from the true eigenvalue of the caller's design (rounding in
   * the design's basis and in the spectrum). Every reported probability carries the effect of
   * this on top of the engine's own error bound.
   */
  spectrumError: number;
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
  let big = 0;
  for (let i = 0; i < nu.length; i++) big = Math.max(big, Math.abs(nu[i]));
  return {
    m: nu.length,
    // the spectrum is taken as given: only its own rounding (a few ulps) remains
    spectrumError: 4 * Number.EPSILON * big,
    spectrum: () => nu,
    hasSpectrum: () => true,
    mean: () => spectrumMean(nu),
    variance: () => spectrumVariance(nu),
    support: () => [nu[0], nu[nu.length - 1]],
  };
}

/**
 * Sum of nu and sum of nu^2 without eigenvalues, O(n k): with W = A Q,
 *   sum nu   = trace A - trace Q'AQ,
 *   sum nu^2 = trace(A M A M) = ||A||_F^2 - 2 ||W||_F^2 + ||Q'W||_F^2.
 */
function traceMoments(a: BandMatrix, basis: ColumnBasis): { s1: number; s2: number } {
  const { n, k, q } = basis;
  let trA = 0, frobA = 0;
  for (let j = 0; j < a.bands.length; j++) {
    for (const v of a.bands[j]) { if (j === 0) trA += v; frobA += (j === 0 ? 1 : 2) * v * v; }
  }
  const w = new Float64Array(n);
  let trQAQ = 0, frobW = 0, frobQW = 0;
  const cols: Float64Array[] = [];
  for (let l = 0; l < k; l++) cols.push(bandMultiply(a, q.subarray(l * n, l * n + n), new Float64Array(n)));
  for (let l = 0; l < k; l++) {
    w.set(cols[l]);
    for (let i = 0; i < n; i++) frobW += w[i] * w[i];
    for (let r = 0; r < k; r++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += q[r * n + i] * w[i];
      frobQW += s * s;
      if (r === l) trQAQ += s;
    }
  }
  return { s1: trA - trQAQ, s2: frobA - 2 * frobW + frobQW };
}

/** Gershgorin interval of a band matrix: it contains every eigenvalue, hence the support of d. */
function gershgorin(a: BandMatrix): [number, number] {
  const { n, bands } = a;
  let lo = Infinity, hi = -Infinity;
  for (let t = 0; t < n; t++) {
    let r = 0;
    for (let j = 1; j < bands.length; j++) {
      if (t < bands[j].length) r += Math.abs(bands[j][t]);
      if (t - j >= 0) r += Math.abs(bands[j][t - j]);
    }
    lo = Math.min(lo, bands[0][t] - r);
    hi = Math.max(hi, bands[0][t] + r);
  }
  return [Math.max(0, lo), hi];
}

/**
 * A source from a design: the spectrum is computed lazily by `compute`; the mean, the variance
 * and a support interval come from traces and need no eigenvalues.
 *
 * @example
 * ```ts
 * const source = designSource(n - k, operator, basis, () => fastSpectrum(operator, basis));
 * source.mean();  // exact E[d], from traces: no eigenvalues computed yet
 * new DwNullDistribution(source);
 * ```
 */
export function designSource(m: number, operator: BandMatrix, basis: ColumnBasis, compute: () => Float64Array, spectrumError = 0): NullSource {
  let nu: Float64Array | undefined;
  let moments: { s1: number; s2: number } | undefined;
  const spectrum = () => (nu ??= compute());
  const mom = () => (moments ??= traceMoments(operator, basis));
  return {
    m,
    spectrumError,
    spectrum,
    hasSpectrum: () => nu !== undefined,
    operator,
    basis,
    mean: () => (nu ? spectrumMean(nu) : mom().s1 / m),
    variance: () => {
      if (nu) return spectrumVariance(nu);
      const { s1, s2 } = mom();
      return Math.max(0, (2 * (m * s2 - s1 * s1)) / (m * m * (m + 2)));
    },
    support: () => (nu ? [nu[0], nu[nu.length - 1]] : gershgorin(operator)),
  };
}
