/**
 * Where the classical bounds test (Durbin & Watson 1950, 1951) would have landed for an observed d,
 * and the exact p-value for the caller's own design beside it, as plain data (the sentence that
 * resolves it is written by src/report/wording.ts). Zones on [0, 4]:
 *
 *   reject-positive  d < d_L  |  inconclusive-positive  d_L <= d <= d_U  |  no-evidence  d_U < d < 4 - d_U
 *   |  inconclusive-negative  4 - d_U <= d <= 4 - d_L  |  reject-negative  d > 4 - d_L
 *
 * The negative side mirrors the positive one because the bounding distributions of 4 - d are those
 * of d (the spectrum of A is symmetric about 2). When d_U > 2 (many regressors, few observations)
 * the two inconclusive zones overlap; d <= 2 is then read on the positive side, d > 2 on the
 * negative side. A two-sided test at level alpha uses the bounds at alpha / 2 in each tail.
 */
import { DwError } from '../errors.js';
import type { MethodChoice } from '../core/types.js';
import type { BoundsOutcome, BoundsZone } from '../core/result-types.js';
import { checkAlpha, checkAlternative, type Alternative } from '../core/alternative.js';
import { SENTENCE_STYLE, formatProbability } from '../core/format-number.js';
import { bounds } from './bounds.js';

/** Options of {@link boundsZone}. */
export interface BoundsZoneOptions {
  /** Bounds of a model with an intercept (default true; the printed tables' case). */
  intercept?: boolean;
  /** Engine for the bounds (default `auto`). */
  method?: MethodChoice;
  /** Bounds already computed at the level `alpha` (or `alpha / 2` two-sided), to skip the computation. */
  known?: { dL: number; dU: number };
  /** Absolute error bound of `exactP` (so that a p clamped to 0 prints as "< bound", not "0"). */
  exactPErrorBound?: number;
}

/**
 * The bounds-test zone of d for n observations and k' regressors other than the intercept, with
 * its outcome as a typed code (`outcome.code`; words by `boundsResolutionWords` of the reports). `exactP` is the exact p-value of d for the caller's design under the same
 * alternative (P(D <= d) for `positive`, P(D >= d) for `negative`, the two-sided p-value for
 * `two-sided`); pass null when it is not known.
 *
 * @example
 * ```ts
 * const z = boundsZone(1.31, 20, 1, 0.05, 'positive', 0.039);
 * z.zone;         // 'inconclusive-positive' (d_L = 1.201 <= d <= d_U = 1.411)
 * z.outcome.code; // 'BOUNDS_INCONCLUSIVE': the exact p-value, 0.039, decides
 * ```
 */
export function boundsZone(
  d: number,
  n: number,
  kPrime: number,
  alpha: number,
  alternative: Alternative = 'positive',
  exactP: number | null = null,
  options: BoundsZoneOptions = {},
): BoundsZone {
  if (!(typeof d === 'number' && Number.isFinite(d) && d >= 0 && d <= 4)) {
    throw new DwError('D_OUT_OF_RANGE', `d = ${d} is outside the possible range [0, 4].`, 'Give the Durbin-Watson statistic of your regression.', { value: String(d) });
  }
  checkAlternative(alternative);
  checkAlpha(alpha);
  if (exactP !== null && !(typeof exactP === 'number' && exactP >= 0 && exactP <= 1)) {
    throw new DwError('PROBABILITY_OUT_OF_RANGE', `The exact p-value ${exactP} is outside [0, 1].`, 'Pass the p-value of the exact test, or null.', { value: String(exactP) });
  }
  const level = alternative === 'two-sided' ? alpha / 2 : alpha;
  const intercept = options.intercept ?? true;
  const { dL, dU } = options.known ?? bounds(n, kPrime, level, { intercept, method: options.method });
  const zone = zoneOf(d, dL, dU);
  return { kPrime, level, dL, dU, zone, outcome: outcomeOf(d, zone, alpha, alternative, exactP, intercept, options.exactPErrorBound ?? 0) };
}

/**
 * The zone of d for bounds dL <= dU (d <= 2 read on the positive side when the zones overlap).
 *
 * @example
 * ```ts
 * zoneOf(1.3, 1.201, 1.411); // 'inconclusive-positive'
 * zoneOf(2.9, 1.201, 1.411); // 'reject-negative'
 * ```
 */
export function zoneOf(d: number, dL: number, dU: number): BoundsZone['zone'] {
  if (d <= 2) {
    if (d < dL) return 'reject-positive';
    if (d <= dU) return 'inconclusive-positive';
    return 'no-evidence';
  }
  if (d > 4 - dL) return 'reject-negative';
  if (d >= 4 - dU) return 'inconclusive-negative';
  return 'no-evidence';
}

function outcomeOf(d: number, zone: BoundsZone['zone'], alpha: number, alternative: Alternative, exactP: number | null, intercept: boolean, exactPErrorBound: number): BoundsOutcome {
  const inconclusive = (zone === 'inconclusive-positive' && alternative !== 'negative') || (zone === 'inconclusive-negative' && alternative !== 'positive');
  const rejects = (zone === 'reject-positive' && alternative !== 'negative') || (zone === 'reject-negative' && alternative !== 'positive');
  const code = inconclusive ? 'BOUNDS_INCONCLUSIVE' : rejects ? 'BOUNDS_REJECT' : 'BOUNDS_DO_NOT_REJECT';
  return { code, d, alpha, alternative, intercept, exactP, exactPErrorBound };
}

/**
 * A level as a percentage.
 *
 * @example
 * ```ts
 * pct(0.05);  // "5%"
 * pct(0.025); // "2.5%"
 * ```
 */
export function pct(a: number): string {
  return `${Number((a * 100).toPrecision(6))}%`;
}

/**
 * A p-value in a sentence beside a decision at alpha (core/format-number.ts, SENTENCE_STYLE): two
 * significant digits, more when needed so that the printed number lies on the same side of alpha
 * as the exact one (0.0501 is never shown as "0.050" beside "does not reject at 5%"); a value
 * clamped to 0 with an error bound > 0 as "< bound"; "at the numerical limit" added when
 * |p - alpha| <= errorBound.
 *
 * @example
 * ```ts
 * formatPValue(0.039, 0.05);        // "0.039"
 * formatPValue(0.0501, 0.05);       // "0.0501"
 * formatPValue(0, 0.05, 3e-12);     // "< 3e-12"
 * ```
 */
export function formatPValue(p: number, alpha: number, errorBound = 0): string {
  const f = formatProbability(p, SENTENCE_STYLE, { alpha, errorBound });
  return f.atLimit ? `${f.text} (within the numerical error bound of ${pct(alpha)}: the decision is at the numerical limit)` : f.text;
}
