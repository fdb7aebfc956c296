/**
 * The sentence that resolves the classical bounds test (Durbin & Watson 1950, 1951) for an
 * observed d: what the bounds say at the level and alternative of the test and, beside it, the
 * exact p-value for the caller's own design (docs/methods.md section 9). Written from the zone's
 * plain data (src/bounds/zone.ts); a test "rejects" or "does not reject", it never "finds no
 * evidence". Plain text with the trade's notation (d_L, <=), for `prose()` of format.ts.
 */
import type { BoundsZone } from '../../core/result-types.js';
import { formatPValue, pct } from '../../bounds/zone.js';

/**
 * The bounds test's resolution of a zone in words (plain text; the reports set d_L, <= as symbols
 * with `prose`).
 *
 * @example
 * ```ts
 * boundsResolutionWords(boundsZone(1.31, 20, 1, 0.05, 'positive', 0.039));
 * // "The bounds test at 5% (one-sided, against positive autocorrelation) is inconclusive:
 * //  d_L = 1.201 <= d = 1.310 <= d_U = 1.411; the exact p-value for this design, 0.039, rejects at 5%."
 * ```
 */
export function boundsResolutionWords(z: BoundsZone): string {
  const { dL, dU, zone } = z;
  const { d, alpha, alternative: alt, exactP: p, intercept, exactPErrorBound: errorBound } = z.outcome;
  const [fd, fL, fU, fL4, fU4] = distinct([d, dL, dU, 4 - dL, 4 - dU]);
  const at = alt === 'two-sided'
    ? `at ${pct(alpha)} (two-sided, bounds at ${pct(alpha / 2)} in each tail)`
    : `at ${pct(alpha)} (one-sided, against ${alt} autocorrelation)`;
  const model = intercept ? '' : ' for a model without intercept';
  const exactP = p === null ? '' : `the exact ${alt === 'two-sided' ? 'two-sided ' : ''}p-value for this design, ${formatPValue(p, alpha, errorBound)}`;
  if (z.outcome.code === 'BOUNDS_INCONCLUSIVE') {
    const range = zone === 'inconclusive-positive'
      ? `d_L = ${fL} <= d = ${fd} <= d_U = ${fU}`
      : `4 - d_U = ${fU4} <= d = ${fd} <= 4 - d_L = ${fL4}`;
    const head = `The bounds test${model} ${at} is inconclusive: ${range}`;
    return p === null
      ? `${head}; only the exact distribution of d for this design decides: compute the exact p-value for your regressors.`
      : `${head}; ${exactP}, ${p <= alpha ? 'rejects' : 'does not reject'} at ${pct(alpha)}.`;
  }
  // the bounds decide: say how, then give the exact p-value beside it
  let verdict: string;
  const rejects = z.outcome.code === 'BOUNDS_REJECT';
  if (rejects) {
    const side = zone === 'reject-positive' ? `d = ${fd} < d_L = ${fL}` : `d = ${fd} > 4 - d_L = ${fL4}`;
    const dir = zone === 'reject-positive' ? 'positive' : 'negative';
    verdict = `${side}: the bounds test${model} rejects no autocorrelation in favour of ${dir} autocorrelation ${at}, whatever the regressors`;
  } else if (alt === 'positive') {
    verdict = `d = ${fd} > d_U = ${fU}: the bounds test${model} does not reject no autocorrelation against positive autocorrelation ${at}, whatever the regressors`;
    if (zone === 'inconclusive-negative') verdict += ` (d lies in the zone 4 - d_U = ${fU4} <= d <= 4 - d_L = ${fL4}, where a test against negative autocorrelation would be inconclusive)`;
    if (zone === 'reject-negative') verdict += ` (d lies beyond 4 - d_L = ${fL4}, where a test against negative autocorrelation would reject)`;
  } else if (alt === 'negative') {
    verdict = `d = ${fd} < 4 - d_U = ${fU4}: the bounds test${model} does not reject no autocorrelation against negative autocorrelation ${at}, whatever the regressors`;
    if (zone === 'inconclusive-positive') verdict += ` (d lies in the zone d_L = ${fL} <= d <= d_U = ${fU}, where a test against positive autocorrelation would be inconclusive)`;
    if (zone === 'reject-positive') verdict += ` (d lies below d_L = ${fL}, where a test against positive autocorrelation would reject)`;
  } else {
    verdict = `d_U = ${fU} < d = ${fd} < 4 - d_U = ${fU4}: the bounds test${model} does not reject no autocorrelation against autocorrelation of either sign ${at}, whatever the regressors`;
  }
  if (p === null) return `${verdict}.`;
  return (p <= alpha) === rejects
    ? `${verdict}; ${exactP}, agrees.`
    : `${verdict}; but ${exactP}, ${p <= alpha ? 'rejects' : 'does not reject'} at ${pct(alpha)}. ` +
      'This cannot happen in exact arithmetic (the bounds are exact for lag 1 with an intercept and no gaps, the only case where they are computed), ' +
      'so it is an internal numerical inconsistency: please report it with the data, and do not rely on either decision until it is resolved.';
}

/** Numbers with 3 decimals, or more (up to 6) when two of them would otherwise print the same. */
function distinct(xs: number[]): string[] {
  for (let dec = 3; dec <= 6; dec++) {
    const s = xs.map((x) => x.toFixed(dec));
    let clash = false;
    for (let i = 0; i < xs.length && !clash; i++) {
      for (let j = i + 1; j < xs.length; j++) if (xs[i] !== xs[j] && s[i] === s[j]) { clash = true; break; }
    }
    if (!clash) return s;
  }
  return xs.map((x) => x.toFixed(6));
}

/**
 * The conventions of a table of bounds, one sentence each, for the notes under a rendered table.
 *
 * @example
 * ```ts
 * tableConvention(true)[0]; // "k' is the number of regressors other than the intercept (...)"
 * ```
 */
export function tableConvention(intercept: boolean): string[] {
  return [
    intercept
      ? "k' is the number of regressors other than the intercept (the model has an intercept, so X has k' + 1 columns)."
      : "k' is the number of regressors; the model has no intercept (X has k' columns; lower bound as in Farebrother 1980, upper bound from the interlacing theorem).",
    'alpha is the one-sided level of the bounds test (Durbin and Watson 1951) against positive first-order autocorrelation: reject when d < d_L, do not reject when d > d_U, inconclusive in between.',
    'For negative autocorrelation use 4 - d with the same bounds (reject when d > 4 - d_L); for a two-sided test at level 2 alpha use both sides.',
    intercept
      ? "Cells with n < k' + 3 are left out (fewer than 2 residual degrees of freedom)."
      : "Cells with n < k' + 2 are left out (fewer than 2 residual degrees of freedom).",
    'Exact quantiles of the bounding distributions (Durbin & Watson 1950), computed by exact-dw; not copied from a printed table.',
  ];
}
