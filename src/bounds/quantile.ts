/**
 * Quantiles of a bounding statistic by Imhof's integral on the closed-form characteristic form
 * (cosine-form.ts), with a root finder that can start from a nearby known value: the table of
 * bounds solves thousands of neighbouring quantiles, and a warm start from the previous n cuts the
 * number of integrals per quantile from about fifteen to about five (docs/methods.md section 7).
 */
import { DwError } from '../errors.js';
import type { Tail, TailProbability } from '../core/types.js';
import { exactTail } from '../core/exact-tail.js';
import { normalUpperQuantileStart } from '../numeric/normal-start.js';
import { integrateImhof } from '../engines/imhof.js';
import { tailProbability } from '../engines/choose.js';
import { spectrumSource } from '../core/source.js';
import { brentRoot } from '../numeric/root.js';
import { cosineSpectrumForm } from './cosine-form.js';
import { differenceEigenvalue, type BoundIndices } from './spectra.js';
import { POLICY } from '../policy.js';

/** Accuracy settings of {@link boundQuantile}. */
export interface BoundQuantileOptions {
  /** Absolute error allowed in each probability (default 1e-10, or 1e-7 alpha for small alpha). */
  tolerance?: number;
  /** Absolute error allowed in the quantile (default 1e-9). */
  xtol?: number;
  /** A nearby value to start from (for instance the same bound at the previous n). */
  guess?: number;
  /** First step away from the guess when bracketing the root (default 1e-3). */
  step?: number;
}

/** A quantile with the count of Imhof integrals it took. */
export interface BoundQuantile {
  value: number;
  evaluations: number;
}

/** Relative error above which a tail probability of the closed-form route is handed to the general engine. */
const RELATIVE_TARGET = POLICY.tolerances.BOUNDS_RELATIVE_TARGET;

/**
 * P(d_bound <= c) (`lower`) or P(d_bound >= c) (`upper`, computed directly) for the bounding statistic
 * whose spectrum is lambda_first .. lambda_{first+m-1} of the n x n difference matrix, with its
 * absolute error bound. Imhof's integral on the closed-form characteristic form answers; a small
 * tail whose absolute bound is a poor relative one (above 1e-6) goes to the library's general
 * engine choice on the explicit spectrum (Pan's form or the saddlepoint contour keep relative accuracy).
 *
 * @example
 * ```ts
 * boundTail(20, { first: 1, m: 18 }, 1.2015, 'lower').p; // about 0.05 (Savin & White 1977: d_L = 1.201)
 * ```
 */
export function boundTail(n: number, idx: BoundIndices, c: number, tail: Tail = 'lower', tolerance = POLICY.tolerances.BOUNDS_PROBABILITY_TOLERANCE): TailProbability {
  const lo = differenceEigenvalue(n, idx.first);
  const hi = differenceEigenvalue(n, idx.first + idx.m - 1);
  const below = tail === 'lower';
  if (c <= lo) return exactTail(below ? 0 : 1, 'imhof');
  if (c >= hi) return exactTail(below ? 1 : 0, 'imhof');
  const r = integrateImhof(cosineSpectrumForm(n, idx, c, below ? 1 : -1), { tolerance: Math.max(tolerance, 1e-13) });
  const relativeError = r.p > 0 ? r.errorBound / r.p : Infinity;
  if (relativeError <= RELATIVE_TARGET || r.errorBound <= tolerance) {
    return { p: r.p, errorBound: r.errorBound, relativeError, method: 'imhof' };
  }
  const nu = new Float64Array(idx.m);
  for (let i = 0; i < idx.m; i++) nu[i] = differenceEigenvalue(n, idx.first + i);
  return tailProbability(spectrumSource(nu), c, tail, { method: 'auto', tolerance });
}

/**
 * The alpha-quantile of a bounding statistic: the c with P(d_bound <= c) = alpha. For alpha above
 * 1/2 the equation P(d_bound >= c) = 1 - alpha is solved instead, so that levels near 1 keep
 * their relative accuracy too.
 *
 * @example
 * ```ts
 * boundQuantile(20, { first: 1, m: 18 }, 0.05).value; // d_L(n = 20, k' = 1) = 1.2015...
 * ```
 */
export function boundQuantile(n: number, idx: BoundIndices, alpha: number, options: BoundQuantileOptions = {}): BoundQuantile {
  const level = Math.min(alpha, 1 - alpha);
  const tail: Tail = alpha <= 0.5 ? 'lower' : 'upper';
  const tolerance = options.tolerance ?? Math.min(POLICY.tolerances.BOUNDS_PROBABILITY_TOLERANCE, 1e-7 * level);
  const xtol = options.xtol ?? POLICY.tolerances.BOUNDS_QUANTILE_TOLERANCE;
  const lo = differenceEigenvalue(n, idx.first);
  const hi = differenceEigenvalue(n, idx.first + idx.m - 1);
  const seen = new Map<number, number>();
  let evaluations = 0;
  // increasing in c, -alpha at lo and 1 - alpha at hi
  const f = (c: number): number => {
    const known = seen.get(c);
    if (known !== undefined) return known;
    if (c > lo && c < hi) evaluations++;
    const t = boundTail(n, idx, c, tail, tolerance);
    const target = tail === 'lower' ? alpha : 1 - alpha;
    // the root finder needs the sign of p - target: refuse only when the error could flip it at the level's scale
    if (t.errorBound > 1e-3 * Math.max(level, Math.abs(t.p - target))) {
      throw new DwError('NOT_CONVERGED',
        `The bounds for n = ${n} at level ${alpha} cannot be computed reliably: the tail probability near c = ${c.toPrecision(6)} has an error bound of ${t.errorBound.toExponential(1)}.`,
        'Use a less extreme level; please report the case.');
    }
    const v = tail === 'lower' ? t.p - alpha : 1 - alpha - t.p;
    seen.set(c, v);
    return v;
  };
  let guess = options.guess;
  let step = options.step ?? 1e-3;
  if (guess === undefined || !(guess > lo && guess < hi)) {
    const start = momentGuess(n, idx, alpha);
    guess = start.guess;
    step = start.step;
  }
  // walk from the guess, doubling the step, until the root is bracketed
  let a = guess;
  let fa = f(a);
  if (fa === 0) return { value: a, evaluations };
  const dir = fa < 0 ? 1 : -1;
  let b = a;
  for (;;) {
    b = Math.min(hi, Math.max(lo, a + dir * step));
    const fb = f(b);
    if (fb === 0) return { value: b, evaluations };
    if (fb > 0 !== fa > 0) break;
    a = b; fa = fb; step *= 2;
  }
  const value = brentRoot(f, Math.min(a, b), Math.max(a, b), xtol);
  return { value, evaluations };
}

/**
 * A starting point from the exact mean and variance of the bound and the normal quantile
 * (Abramowitz & Stegun 1964, 26.2.23, error below 4.5e-4 in z); the step is a tenth of the
 * standard deviation.
 */
function momentGuess(n: number, idx: BoundIndices, alpha: number): { guess: number; step: number } {
  let s = 0;
  for (let i = 0; i < idx.m; i++) s += differenceEigenvalue(n, idx.first + i);
  const mean = s / idx.m;
  let ss = 0;
  for (let i = 0; i < idx.m; i++) ss += (differenceEigenvalue(n, idx.first + i) - mean) ** 2;
  const sd = Math.sqrt((2 * ss) / (idx.m * (idx.m + 2)));
  const z = normalUpperQuantileStart(Math.min(alpha, 1 - alpha));
  const lo = differenceEigenvalue(n, idx.first);
  const hi = differenceEigenvalue(n, idx.first + idx.m - 1);
  const g = mean + (alpha < 0.5 ? -z : z) * sd;
  return { guess: Math.min(hi - 1e-3 * (hi - lo), Math.max(lo + 1e-3 * (hi - lo), g)), step: Math.max(1e-6, 0.1 * sd) };
}
