/**
 * How the page writes numbers. A probability keeps four decimals down to 1e-4 and three
 * significant digits below, in e-notation that a spreadsheet reads back (the one rule of
 * src/core/format-number.ts, PAGE_STYLE: more digits when needed to stay on its side of alpha, and
 * "< bound" for a value clamped to 0); statistics keep four decimals. The browser test reads the
 * shown text back and compares it with the library's value to this precision.
 */
import { PAGE_STYLE, formatProbability as formatWith, type ProbabilityContext } from '../core/format-number.js';

/**
 * A probability for display; with `alpha`, as many more digits as keep it on its side of alpha;
 * with an `errorBound`, a value clamped to 0 shows as "< bound".
 *
 * @example
 * ```ts
 * formatProbability(0.031234);                  // '0.0312'
 * formatProbability(2.5e-7);                    // '2.50e-7'
 * formatProbability(0.05004, { alpha: 0.05 });  // '0.05004'
 * formatProbability(0, { errorBound: 2e-12 });  // '< 2e-12'
 * ```
 */
export function formatProbability(p: number, context: ProbabilityContext = {}): string {
  return formatWith(p, PAGE_STYLE, context).text;
}

/** True when |p - alpha| <= errorBound: the decision against alpha is at the numerical limit. */
export function atNumericalLimit(p: number, alpha: number, errorBound: number): boolean {
  return formatWith(p, PAGE_STYLE, { alpha, errorBound }).atLimit;
}

/**
 * A statistic (d, a critical value, a bound) for display.
 *
 * @example
 * ```ts
 * formatStatistic(1.234567); // '1.2346'
 * ```
 */
export function formatStatistic(x: number, digits = 4): string {
  return Number.isFinite(x) ? x.toFixed(digits) : String(x);
}

/**
 * A regression coefficient or standard error: four significant digits, e-notation when far from 1.
 *
 * @example
 * ```ts
 * formatNumber(1234.5678); // '1235'
 * formatNumber(0.00012345); // '1.235e-4'
 * ```
 */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return Number(x.toPrecision(4)).toString();
  return x.toExponential(3).replace('e+', 'e');
}

/**
 * An error bound: one significant digit, rounded up (a bound must not shrink in print).
 *
 * @example
 * ```ts
 * formatBound(3.2e-12); // '4e-12'
 * ```
 */
export function formatBound(x: number): string {
  if (x === 0 || !Number.isFinite(x)) return String(x);
  let e = Math.floor(Math.log10(x));
  let mant = Math.ceil(x / 10 ** e - 1e-9);
  if (mant >= 10) { mant = 1; e += 1; }
  if (mant * 10 ** e < x) mant += 1; // guard against rounding in the division above
  return `${mant}e${e}`;
}

/**
 * The significance level as the user wrote it, without float noise.
 *
 * @example
 * ```ts
 * formatLevel(0.05); // '0.05'
 * ```
 */
export function formatLevel(a: number): string {
  return Number(a.toPrecision(6)).toString();
}
