/**
 * The report's words for the test itself: the null and the alternative, the rejection region,
 * the bounds-test zone and why the bounds may not apply, the engine, the model's intercept and
 * regressors, the conclusion at alpha and the verdict of the asymptotic tests of a dynamic model.
 * Neutral markup of format.ts; every number comes from the DwTestResult. The rejection region is
 * that of the exact test (d <= the exact critical value; docs/methods.md section 7); the zones are
 * those of Durbin & Watson (1951).
 */
import type { BoundsZone, DwTestResult } from '../inference/dw-test.js';
import { andList, bound, cite, fixed, level, plain, probabilityRelation, sym } from './format.js';
import { D_DECIMALS } from './document-model.js';

/**
 * "first-order autocorrelation" or "autocorrelation at lag 4".
 *
 * @example
 * ```ts
 * nullWords(exactDwTest({ y, x }));          // "first-order autocorrelation"
 * nullWords(exactDwTest({ y, x, lag: 4 })); // "autocorrelation at lag 4"
 * ```
 */
export function nullWords(r: DwTestResult): string {
  return r.lag > 1 ? `autocorrelation at lag ${r.lag}` : 'first-order autocorrelation';
}

/**
 * The alternative in words.
 *
 * @example
 * ```ts
 * alternativeWords(exactDwTest({ y, x }));                            // "positive autocorrelation"
 * alternativeWords(exactDwTest({ y, x, alternative: 'two-sided' })); // "autocorrelation of either sign"
 * ```
 */
export function alternativeWords(r: DwTestResult): string {
  if (r.alternative === 'positive') return 'positive autocorrelation';
  if (r.alternative === 'negative') return 'negative autocorrelation';
  return 'autocorrelation of either sign';
}

/**
 * The rejection region of the chosen alternative, e.g. "d <= 1.2046".
 *
 * @example
 * ```ts
 * inline(rejectionRegion(exactDwTest({ y, x })), 'text'); // e.g. "d <= 1.3299"
 * ```
 */
export function rejectionRegion(r: DwTestResult, decimals = D_DECIMALS): string {
  const lo = `${sym('d')} ${sym('le')} ${fixed(r.critical.lower, decimals)}`;
  const hi = `${sym('d')} ${sym('ge')} ${fixed(r.critical.upper, decimals)}`;
  if (r.alternative === 'positive') return lo;
  if (r.alternative === 'negative') return hi;
  return `${lo} or ${hi}`;
}

/**
 * Plain words for a bounds-test zone.
 *
 * @example
 * ```ts
 * inline(zoneWords('inconclusive-positive'), 'text');
 * // "between d_L and d_U: the bounds test is inconclusive"
 * ```
 */
export function zoneWords(zone: BoundsZone['zone']): string {
  switch (zone) {
    case 'reject-positive': return `below ${sym('dL')}: the bounds test rejects in favour of positive autocorrelation`;
    case 'inconclusive-positive': return `between ${sym('dL')} and ${sym('dU')}: the bounds test is inconclusive`;
    case 'no-evidence': return `between ${sym('dU')} and 4 ${sym('minus')} ${sym('dU')}: the bounds test does not reject the null hypothesis of no autocorrelation`;
    case 'inconclusive-negative': return `between 4 ${sym('minus')} ${sym('dU')} and 4 ${sym('minus')} ${sym('dL')}: the bounds test is inconclusive (negative side)`;
    case 'reject-negative': return `above 4 ${sym('minus')} ${sym('dL')}: the bounds test rejects in favour of negative autocorrelation`;
    default: return String(zone);
  }
}

/**
 * Why the bounds test is not shown for a result without a bounds zone.
 *
 * @example
 * ```ts
 * inline(boundsAbsentReason(exactDwTest({ y, x, intercept: false })), 'text');
 * // "The bounds test (d_L, d_U) does not apply here: the model has no intercept, ..."
 * ```
 */
export function boundsAbsentReason(r: DwTestResult): string {
  const why: string[] = [];
  if (!r.intercept) why.push('the model has no intercept, and the bounds assume one');
  if (r.lag > 1) why.push(`the statistic uses differences at lag ${r.lag}, and the classical bounds are for lag 1`);
  if (r.panel && r.panel.entityEffects && r.panel.entities > 1) why.push(`the intercept is replaced by one indicator per entity (${r.panel.entities} entities), and the bounds assume a single intercept and one chain of differences`);
  else if (r.panel && r.panel.entities > 1) why.push(`the pooled panel has ${r.panel.entities} entities, so the differences form ${r.panel.entities} separate chains, and the bounds assume one`);
  else if (r.gaps) why.push('the time index has gaps, so some differences are missing and the bounds do not hold');
  if (why.length === 0) return 'The bounds were not computed for this run; the exact test above does not need them.';
  return `The bounds test (${sym('dL')}, ${sym('dU')}) does not apply here: ${andList(why)}. The exact test above does not need it.`;
}

/**
 * The engine in words.
 *
 * @example
 * ```ts
 * inline(engineWords('pan'), 'text'); // "Pan's finite-range formula (Pan 1968; Farebrother 1980)"
 * ```
 */
export function engineWords(method: string): string {
  if (method === 'imhof') return `Imhof's numerical inversion of the characteristic function, on the eigenvalues of the design ${cite('imhof-1961')}`;
  if (method === 'pan') return `Pan's finite-range formula ${cite('pan-1968', 'farebrother-1980')}`;
  if (method === 'eigenfree') return `Imhof's numerical inversion of the characteristic function, evaluated through a log-determinant without eigenvalues ${cite('imhof-1961')}`;
  if (method === 'dct') return `Imhof's numerical inversion of the characteristic function, evaluated in the closed-form (DCT) eigenbasis of the difference operator ${cite('imhof-1961')}`;
  if (method === 'saddlepoint') return `exact numerical inversion of the distribution function on the eigenvalues of the design, along the vertical line through the saddlepoint; the saddlepoint is that of Daniels ${cite('daniels-1954')}, used only to place the line (which keeps relative accuracy in small tails), so the result is the exact inversion, not Daniels's saddlepoint approximation`;
  return plain(method);
}

/** The intercept of the model in words. */
export function interceptWords(r: DwTestResult): string {
  if (!r.intercept) return 'none';
  if (r.panel?.entityEffects) return `one indicator per entity (${r.panel.entities}), instead of a common intercept`;
  return r.interceptAdded ? 'added by exact-dw' : 'a constant column of the data (detected, not duplicated)';
}

/** The regressors other than the added intercept. */
export function regressorNames(r: DwTestResult): string[] {
  return r.columns.filter((c, i) => !(r.interceptAdded && i === 0));
}

/**
 * The sentence added when |p - alpha| <= the error bound: the decision against alpha is at the
 * numerical limit of the computation.
 *
 * @example
 * ```ts
 * inline(numericalLimitWords(result), 'text');
 * // e.g. "The p-value lies within the numerical error bound (7.0e-12) of alpha, so ..."
 * ```
 */
export function numericalLimitWords(r: DwTestResult): string {
  return `The ${sym('p')}-value lies within the numerical error bound (${bound(r.errorBound)}) of ${sym('alpha')}, so this decision is at the numerical limit of the computation: ` +
    `report the ${sym('p')}-value itself rather than only the decision.`;
}

/** The conclusion of a valid exact test at alpha. */
export function conclusionStatic(r: DwTestResult): string {
  const { relation, number, atLimit } = probabilityRelation(r.pValue, { alpha: r.alpha, errorBound: r.errorBound });
  const a = level(r.alpha);
  const limit = atLimit ? ` ${numericalLimitWords(r)}` : '';
  if (r.decision === 'reject') {
    return `At ${sym('alpha')} = ${a} the exact test rejects the null hypothesis of no ${nullWords(r)} in favour of ${alternativeWords(r)}: ` +
      `${sym('p')} ${relation} ${number} ${sym('le')} ${a}, and ${sym('d')} = ${fixed(r.d, D_DECIMALS)} lies in the rejection region ${rejectionRegion(r)}.${limit}`;
  }
  return `At ${sym('alpha')} = ${a} the exact test does not reject the null hypothesis of no ${nullWords(r)} against ${alternativeWords(r)}: ` +
    `${sym('p')} ${relation} ${number} ${sym('gt')} ${a}, and ${sym('d')} = ${fixed(r.d, D_DECIMALS)} lies outside the rejection region ${rejectionRegion(r)}.${limit}`;
}

/**
 * What the asymptotic tests of a dynamic model say at alpha, in words.
 *
 * @example
 * ```ts
 * const result = exactDwTest({ y, x, laggedDependent: 'y_lag1' }); // result.dynamic is set
 * inline(dynamicVerdict(result), 'text'); // what Breusch-Godfrey and Durbin's h say at alpha
 * ```
 */
export function dynamicVerdict(r: DwTestResult, at = `at ${sym('alpha')} = ${level(r.alpha)}`): string {
  const dyn = r.dynamic!;
  const bg = dyn.breuschGodfrey.pChiSquare <= r.alpha;
  const hp = dyn.durbinH.pValue;
  if (hp === null || hp === undefined || !Number.isFinite(hp)) {
    return bg
      ? `the Breusch${sym('ndash')}Godfrey test rejects the null hypothesis of no autocorrelation ${at}`
      : `the Breusch${sym('ndash')}Godfrey test does not reject the null hypothesis of no autocorrelation ${at}`;
  }
  const h = hp <= r.alpha;
  if (h && bg) return `both asymptotic tests reject the null hypothesis of no autocorrelation ${at}`;
  if (!h && !bg) return `neither asymptotic test rejects the null hypothesis of no autocorrelation ${at}`;
  return h
    ? `Durbin's ${sym('h')} rejects the null hypothesis of no autocorrelation ${at}, the Breusch${sym('ndash')}Godfrey test does not; the evidence is mixed`
    : `the Breusch${sym('ndash')}Godfrey test rejects the null hypothesis of no autocorrelation ${at}, Durbin's ${sym('h')} does not; the evidence is mixed`;
}

/** The first letter in upper case. */
export function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
