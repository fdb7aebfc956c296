/**
 * The exact null distribution of d for one design (docs/methods.md sections 2 and 7), with the SciPy
 * convention of computing each tail directly: `sf` is P(d >= c) from its own integral, never
 * 1 - cdf, and both tails have their own inverse.
 */
import { DwError } from '../errors.js';
import type { MethodChoice, Tail, TailProbability } from '../core/types.js';
import { tailProbability, dctApplies, AUTO_SPECTRUM_MAX_N } from '../engines/choose.js';
import { dctDensity } from '../engines/dct.js';
import { imhofDensity } from '../engines/imhof.js';
import { brentRoot } from '../numeric/root.js';
import { normalUpperQuantileStart } from '../numeric/normal-start.js';
import { spectrumSource, type NullSource } from '../core/source.js';
import { POLICY } from '../policy.js';

/** Options of a null distribution. */
export interface DistributionOptions {
  /** Engine: `auto` (default), `imhof`, `pan`, `eigenfree`, `saddlepoint` or `dct`. */
  method?: MethodChoice;
  /** Target absolute error of each probability (default 1e-11). */
  tolerance?: number;
}

/**
 * The exact distribution of d = sum nu_i z_i^2 / sum z_i^2 under the null.
 *
 * @example
 * ```ts
 * const dist = DwNullDistribution.fromSpectrum(nu);
 * dist.cdf(1.2);          // P(d <= 1.2)
 * dist.sf(2.8);           // P(d >= 2.8), computed directly
 * dist.quantile(0.05);    // the exact 5% lower critical value
 * dist.upperQuantile(0.05);
 * ```
 */
export class DwNullDistribution {
  readonly source: NullSource;
  readonly options: DistributionOptions;

  constructor(source: NullSource, options: DistributionOptions = {}) {
    this.source = source;
    this.options = options;
  }

  /** From an explicit spectrum (ascending). */
  static fromSpectrum(nu: Float64Array, options: DistributionOptions = {}): DwNullDistribution {
    return new DwNullDistribution(spectrumSource(nu), options);
  }

  /** Number of weights m = n - k. */
  get m(): number { return this.source.m; }

  /** The ascending spectrum nu (computed on first use for a design). */
  get spectrum(): Float64Array { return this.source.spectrum(); }

  /** Exact mean of d. */
  get mean(): number { return this.source.mean(); }

  /** Exact variance of d. */
  get variance(): number { return this.source.variance(); }

  /** The interval from nu_1 to nu_m (or, before the spectrum is known, a Gershgorin interval containing it): d lies in it with probability one. */
  get support(): [number, number] { return this.source.support(); }

  /**
   * P(d <= c) with its error bound and the engine that answered. The bound covers the engine's
   * own error and the effect of the spectrum's rounding ({@link NullSource.spectrumError}): since
   * d is a weighted mean of the nu_i, moving every nu_i by at most delta moves d by at most delta,
   * so the probability moves by at most delta times the slope of the CDF near c, which is
   * measured by one more evaluation at c + h.
   */
  lowerTail(c: number): TailProbability {
    checkPoint(c);
    return this.withInputError(tailProbability(this.source, c, 'lower', this.options), c, 'lower');
  }

  /** P(d >= c), computed directly, with its error bound (as for {@link lowerTail}) and the engine that answered. */
  upperTail(c: number): TailProbability {
    checkPoint(c);
    return this.withInputError(tailProbability(this.source, c, 'upper', this.options), c, 'upper');
  }

  private withInputError(r: TailProbability, c: number, tail: 'lower' | 'upper'): TailProbability {
    const delta = this.source.spectrumError;
    if (!(delta > 0)) return r;
    const [lo, hi] = this.support;
    const h = Math.max(1e4 * delta, 1e-9 * (hi - lo));
    if (c - lo <= h || hi - c <= h) {
      // near an end of the support the CDF need not be smooth (for m = 2 it has a square-root edge:
      // P(d <= nu_1 + x) ~ (2/pi) sqrt(x / (nu_2 - nu_1))), and c may even lie beyond the computed
      // end while inside the true one. The true tail lies between the tails at c - 2 delta and
      // c + 2 delta (d moves by at most delta when every nu_i does); take both sides directly.
      let extra = 0;
      for (const c2 of [c - 2 * delta, c + 2 * delta]) {
        const r2 = tailProbability(this.source, c2, tail, this.options);
        extra = Math.max(extra, Math.abs(r2.p - r.p) + r2.errorBound);
      }
      const errorBound = r.errorBound + extra;
      return { ...r, errorBound, relativeError: r.p > 0 ? errorBound / r.p : Infinity };
    }
    if (r.p === 0 || r.p === 1) return r;
    // step into the tail's own direction of growth so the slope is taken where P is larger
    const c2 = tail === 'lower' ? c + h : c - h;
    const r2 = tailProbability(this.source, c2, tail, this.options);
    const slope = (Math.abs(r2.p - r.p) + r.errorBound + r2.errorBound) / h;
    const extra = 2 * delta * slope;
    const errorBound = r.errorBound + extra;
    return { ...r, errorBound, relativeError: r.relativeError + extra / r.p };
  }

  /** P(d <= c) (the number alone: no error-bound bookkeeping, so it is cheap inside root finders). */
  cdf(c: number): number {
    checkPoint(c);
    return tailProbability(this.source, c, 'lower', this.options).p;
  }

  /** P(d >= c) (the upper tail, computed directly; the number alone, as for {@link cdf}). */
  sf(c: number): number {
    checkPoint(c);
    return tailProbability(this.source, c, 'upper', this.options).p;
  }

  /**
   * The exact density of d at c (the derivative of the exact CDF): from the spectrum, or, for a
   * design with n above 1000 whose operator is a difference operator (or with `method: 'dct'`),
   * from the DCT eigenbasis route's characteristic form, so that it needs no spectrum at any n.
   */
  pdf(c: number): number {
    checkPoint(c);
    const { operator, basis } = this.source;
    const n = basis?.n ?? 0;
    const method = this.options.method ?? 'auto';
    if (operator && basis && (method === 'dct' || (method === 'auto' && n > AUTO_SPECTRUM_MAX_N && dctApplies(this.source)))) {
      return dctDensity(operator, basis, c).value;
    }
    return imhofDensity(this.source.spectrum(), c).value;
  }

  /**
   * The c with P(d <= c) = p (the lower critical value at level p): accepted only when
   * |P(d <= c) - p| is within {@link quantileTolerance}(p) plus the engine's bound at c.
   *
   * @throws DwError QUANTILE_UNREACHABLE when no double c reaches that (the CDF jumps over p
   *   between neighbouring doubles, as next to an end of the support when m = 2); NOT_CONVERGED
   *   when the engine cannot resolve the level
   */
  quantile(p: number): number {
    checkProbability(p);
    const [lo, hi] = this.support;
    if (p === 0) return lo;
    if (p === 1) return hi;
    // above the median solve on the upper tail, which keeps relative accuracy as p -> 1
    return p > 0.5 ? this.solveTail('upper', 1 - p) : this.solveTail('lower', p);
  }

  /** The c with P(d >= c) = p (the upper critical value at level p), accepted as for {@link quantile}. */
  upperQuantile(p: number): number {
    checkProbability(p);
    const [lo, hi] = this.support;
    if (p === 0) return hi;
    if (p === 1) return lo;
    return p > 0.5 ? this.solveTail('lower', 1 - p) : this.solveTail('upper', p);
  }

  /**
   * The c at which the given tail has probability q (0 < q <= 1/2), by Brent's method on a bracket
   * grown from the normal approximation with the exact mean and variance. For q >= 1e-4 the
   * absolute accuracy of Imhof's integral (about 1e-11) is ample, so `auto` uses it directly
   * during the search; smaller q keep the full choice (relative accuracy in the far tail).
   */
  private solveTail(tail: Tail, q: number): number {
    const [lo, hi] = this.support;
    const chosen = this.options.method ?? 'auto';
    // for q >= 1e-4 the absolute accuracy of the plain integral (about 1e-11) is ample during the
    // search; the root is checked with the full choice and its bound afterwards
    // (the engine `auto` starts from at this size: no dependence on what has been computed before)
    const n = this.source.basis?.n ?? 0;
    const searchMethod = chosen !== 'auto' || q < 1e-4 ? chosen
      : this.source.operator && n > AUTO_SPECTRUM_MAX_N ? (dctApplies(this.source) ? 'dct' as const : 'eigenfree' as const) : 'imhof' as const;
    const opts = { ...this.options, method: searchMethod };
    // g increases with c: P(d <= c) - q for the lower tail, q - P(d >= c) for the upper tail
    const g = (c: number) => {
      const t = tailProbability(this.source, c, tail, opts).p;
      return tail === 'lower' ? t - q : q - t;
    };
    // normal approximation: lower tail at mean - z sd, upper at mean + z sd
    const sd = Math.sqrt(this.variance);
    const z = normalQuantileUpper(q);
    const guess = Math.min(hi, Math.max(lo, this.mean + (tail === 'lower' ? -z : z) * sd));
    let x0 = guess, x1 = guess;
    let g0 = g(guess), g1 = g0;
    let step = Math.max(0.25 * sd, 1e-6 * (hi - lo));
    if (g0 > 0) {
      // the root lies below the guess
      while (g0 > 0 && x0 > lo) { x1 = x0; g1 = g0; x0 = Math.max(lo, x0 - step); g0 = g(x0); step *= 2; }
    } else {
      while (g1 < 0 && x1 < hi) { x0 = x1; g0 = g1; x1 = Math.min(hi, x1 + step); g1 = g(x1); step *= 2; }
    }
    let root: number;
    if (g0 === 0) root = x0;
    else if (g1 === 0) root = x1;
    else if (g0 > 0 || g1 < 0) {
      throw new DwError('NOT_CONVERGED', `No value of d has tail probability ${q} on the ${tail} side within [${lo}, ${hi}].`,
        'Check the level; if it is valid, please report the design.');
    } else root = brentRoot(g, x0, x1, POLICY.tolerances.QUANTILE_TOLERANCE * Math.max(1, hi - lo));
    // the bound at the root must resolve the level: else the engine cannot vouch for this quantile
    let at = tailProbability(this.source, root, tail, this.options);
    if (!(at.errorBound <= 1e-3 * q)) {
      throw new DwError('NOT_CONVERGED',
        `The ${at.method} engine cannot resolve the level ${q}: its error bound near the critical value is ${at.errorBound.toExponential(1)}.`,
        chosen === 'auto' ? 'The level is beyond what the engines can vouch for at this n; use a larger level.' : "Use the default engine choice ('auto'), which keeps relative accuracy in the far tails.");
    }
    // accept the root only if its tail probability is the level to within the stated tolerance;
    // else bisect on the doubles of the bracket, and refuse when two neighbouring doubles straddle
    // the level (the tail probability jumps over it: double precision cannot reach it)
    const tolP = quantileTolerance(q);
    const miss = (r: TailProbability) => Math.abs(r.p - q) - r.errorBound;
    if (!(miss(at) <= tolP) && g0 < 0 && g1 > 0) {
      let a = x0, b = x1;
      for (let i = 0; i < 2200 && !(miss(at) <= tolP); i++) {
        const mid = a + 0.5 * (b - a);
        if (!(mid > a && mid < b)) break;
        const r = tailProbability(this.source, mid, tail, this.options);
        const below = tail === 'lower' ? r.p < q : r.p > q;
        if (below) a = mid; else b = mid;
        root = mid; at = r;
      }
    }
    if (!(miss(at) <= tolP)) {
      throw new DwError('QUANTILE_UNREACHABLE',
        `No double-precision value of d has ${tail} tail probability ${q} to within ${tolP.toExponential(1)}: the tail probability jumps from below to above it between neighbouring values (at d = ${root} it is ${at.p.toExponential(6)}).`,
        'Use a larger level; at this one the tail of d is steeper than the spacing of double-precision numbers resolves (this happens next to an end of the support when n - k = 2).');
    }
    return root;
  }
}

/**
 * The tolerance a quantile is accepted with: the returned c has |P(tail at c) - q| at most this
 * plus the engine's error bound at c (1e-6 of the level: a critical value whose level is off by
 * one part in a million serves every use).
 *
 * @example
 * ```ts
 * quantileTolerance(0.05); // 5e-8
 * ```
 */
export function quantileTolerance(q: number): number {
  return 1e-6 * q;
}

/** The z with P(Z > z) = q for a standard normal Z, roughly (a starting value only). */
function normalQuantileUpper(q: number): number {
  return normalUpperQuantileStart(Math.min(Math.max(q, 1e-300), 0.5));
}

function checkPoint(c: number): void {
  if (!Number.isFinite(c)) {
    throw new DwError('D_OUT_OF_RANGE', `The point ${c} is not a finite number.`, 'Give a finite value of d.');
  }
}

function checkProbability(p: number): void {
  if (!(p >= 0 && p <= 1)) {
    throw new DwError('PROBABILITY_OUT_OF_RANGE', `The probability ${p} is outside [0, 1].`, 'Give a probability between 0 and 1.');
  }
}
