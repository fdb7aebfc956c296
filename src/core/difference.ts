/**
 * The difference operator behind d (docs/methods.md section 1).
 *
 *   d = sum over pairs (s, t) of (e_t - e_s)^2 / sum e_t^2 = e'A e / e'e,   A = D'D,
 *
 * where each pair is two observations whose times differ by exactly the lag. With consecutive
 * times 1..n and lag 1 this is the Durbin-Watson statistic (Durbin & Watson 1950) and A is
 * tridiagonal with diagonal (1, 2, ..., 2, 1); lag j gives Wallis's (1972) statistic; with gaps
 * in time only the pairs that exist contribute.
 */
import { DwError } from '../errors.js';
import type { BandMatrix } from './types.js';

/** The pairs (s, t), s < t, of observations that are differenced. */
export interface DifferencePairs {
  n: number;
  lag: number;
  /** Earlier index of each pair (0-based). */
  from: Int32Array;
  /** Later index of each pair (0-based). */
  to: Int32Array;
}

/**
 * Pairs for consecutive observations 0..n-1 at lag `lag`, or, when `times` is given, for the
 * observations whose times differ by exactly `lag`.
 *
 * @example
 * ```ts
 * differencePairs(5).from; // Int32Array [0, 1, 2, 3]
 * differencePairs(4, 1, [1990, 1991, 1993, 1994]).from; // Int32Array [0, 2]
 * ```
 */
export function differencePairs(n: number, lag = 1, times?: ArrayLike<number>): DifferencePairs {
  if (!Number.isInteger(lag) || lag < 1) {
    throw new DwError('LAG_INVALID', `The lag must be a whole number of at least 1 (got ${lag}).`,
      'Use 1 for annual data, 4 for the quarterly (Wallis) statistic.');
  }
  const from: number[] = [];
  const to: number[] = [];
  if (!times) {
    if (lag >= n) {
      throw new DwError('LAG_INVALID', `The lag ${lag} leaves no pair of observations among n = ${n}.`,
        'Use a smaller lag or more observations.');
    }
    for (let t = lag; t < n; t++) { from.push(t - lag); to.push(t); }
  } else {
    if (times.length !== n) {
      throw new DwError('LENGTH_MISMATCH', `The time column has ${times.length} values for ${n} observations.`,
        'Give one time value per row.');
    }
    for (let t = 0; t < n; t++) {
      const v = times[t];
      if (!Number.isSafeInteger(v)) {
        throw new DwError('TIME_INVALID', `Time value ${v} at observation ${t + 1} is not a whole number.`,
          'The time column must hold integers such as years or quarter numbers.', { row: t + 1, value: String(v) });
      }
      if (t > 0 && v === times[t - 1]) {
        throw new DwError('TIME_INVALID', `The time ${v} appears twice (observations ${t} and ${t + 1}).`,
          'Each period may appear once: remove or merge the duplicated row.', { row: t + 1, value: String(v) });
      }
      if (t > 0 && v < times[t - 1]) {
        throw new DwError('TIME_INVALID', `Times must increase; observation ${t + 1} has ${v} after ${times[t - 1]}.`,
          'Sort the rows by time.', { row: t + 1, value: String(v) });
      }
    }
    // times are strictly increasing integers: the partner at time v - lag is at most lag rows back
    for (let t = 1; t < n; t++) {
      const want = times[t] - lag;
      for (let s = t - 1; s >= 0 && s >= t - lag; s--) {
        if (times[s] === want) { from.push(s); to.push(t); break; }
        if (times[s] < want) break;
      }
    }
    if (from.length === 0) {
      throw new DwError('TIME_INVALID', `No two observations are exactly ${lag} time unit(s) apart.`,
        'Check the time column and the lag.');
    }
  }
  return { n, lag, from: Int32Array.from(from), to: Int32Array.from(to) };
}

/**
 * A = D'D as a symmetric band matrix. Bandwidth is at most the lag (pairs are at most `lag`
 * rows apart because times increase strictly).
 *
 * @example
 * ```ts
 * const a = differenceMatrix(differencePairs(4));
 * a.bands; // [Float64Array [1, 2, 2, 1], Float64Array [-1, -1, -1]]: diagonal, first off-diagonal
 * differenceMatrix(differencePairs(4, 1, [1990, 1991, 1993, 1994])).bands;
 * // [[1, 1, 1, 1], [-1, 0, -1]]: no pair across the missing year 1992
 * ```
 */
export function differenceMatrix(pairs: DifferencePairs): BandMatrix {
  const { n } = pairs;
  let bw = 0;
  for (let i = 0; i < pairs.from.length; i++) bw = Math.max(bw, pairs.to[i] - pairs.from[i]);
  const bands: Float64Array[] = [];
  for (let j = 0; j <= bw; j++) bands.push(new Float64Array(n - j));
  for (let i = 0; i < pairs.from.length; i++) {
    const s = pairs.from[i];
    const t = pairs.to[i];
    bands[0][s] += 1;
    bands[0][t] += 1;
    bands[t - s][s] -= 1;
  }
  return { n, bandwidth: bw, bands };
}

/**
 * The band matrix as a dense row-major n x n array (for references and small problems).
 *
 * @example
 * ```ts
 * bandToDense(differenceMatrix(differencePairs(3)));
 * // Float64Array [1, -1, 0,  -1, 2, -1,  0, -1, 1]
 * ```
 */
export function bandToDense(a: BandMatrix): Float64Array {
  const { n, bands } = a;
  const out = new Float64Array(n * n);
  for (let j = 0; j < bands.length; j++) {
    const b = bands[j];
    for (let t = 0; t < b.length; t++) {
      out[t * n + t + j] = b[t];
      out[(t + j) * n + t] = b[t];
    }
  }
  return out;
}

/**
 * y = A x for a symmetric band matrix (y may be passed in to avoid an allocation).
 *
 * @example
 * ```ts
 * const a = differenceMatrix(differencePairs(4));
 * bandMultiply(a, [1, 2, 3, 4]); // Float64Array [-1, 0, 0, 1]
 * // e'Ae / e'e is d: for e = [1, -1, 1, -1], A e = [2, -4, 4, -2], e'Ae = 12, d = 12 / 4 = 3
 * ```
 */
export function bandMultiply(a: BandMatrix, x: ArrayLike<number>, y = new Float64Array(a.n)): Float64Array {
  const { n, bands } = a;
  const d0 = bands[0];
  for (let t = 0; t < n; t++) y[t] = d0[t] * x[t];
  for (let j = 1; j < bands.length; j++) {
    const b = bands[j];
    for (let t = 0; t < b.length; t++) {
      y[t] += b[t] * x[t + j];
      y[t + j] += b[t] * x[t];
    }
  }
  return y;
}

/**
 * The statistic itself from residuals: sum over pairs of (e_t - e_s)^2 divided by sum e_t^2.
 * Throws RESIDUALS_ZERO when every residual is zero (d is then undefined).
 *
 * @example
 * ```ts
 * durbinWatson([1, -1, 1, -1]); // 12 / 4 = 3
 * ```
 */
export function durbinWatson(e: ArrayLike<number>, pairs: DifferencePairs = differencePairs(e.length)): number {
  // scale first so that residuals near 1e-300 or 1e300 neither underflow nor overflow
  let scale = 0;
  for (let t = 0; t < e.length; t++) scale = Math.max(scale, Math.abs(e[t]));
  if (!(scale > 0) || !Number.isFinite(scale)) {
    throw new DwError('RESIDUALS_ZERO', 'Every residual is zero (or not finite), so d is undefined.',
      'The regressors reproduce y exactly; check that y is not among the regressors.');
  }
  let num = 0;
  let den = 0;
  for (let i = 0; i < pairs.from.length; i++) {
    const diff = (e[pairs.to[i]] - e[pairs.from[i]]) / scale;
    num += diff * diff;
  }
  for (let t = 0; t < e.length; t++) { const v = e[t] / scale; den += v * v; }
  return num / den;
}
