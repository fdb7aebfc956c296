/**
 * The content of a report, independent of its format: sections of paragraphs, labelled values,
 * tables and lists, written in the neutral markup of format.ts. Every renderer (text, Markdown,
 * LaTeX) prints this one document, so the formats cannot disagree about a number or a sentence.
 * Nothing here computes a statistic: every number comes from the DwTestResult.
 */
import type { BoundsZone, DwTestResult } from '../inference/dw-test.js';
import { VERSION } from '../version.js';
import { boundsResolutionWords, durbinHWords, engineChoiceWords, nextStepsWords, powerNoteText, timeIndexWords, warningText, rowList } from './wording.js';
import type { PowerNote } from '../power/exact-power.js';
import { dIsValid, savinWhiteCovers } from './citations.js';
import { andList, arFormula, bound, cite, code, dFormula, estimate, fixed, level, math, plain, probability, probabilityRelation, prose, sym } from './format.js';

/** A paragraph. */
export interface ParagraphBlock { kind: 'para'; text: string }
/** Labelled values, one per row. */
export interface FieldsBlock { kind: 'fields'; rows: [label: string, value: string][] }
/** A table with a header row. */
export interface TableBlock { kind: 'table'; head: string[]; align: ('l' | 'r')[]; rows: string[][] }
/** A bulleted list. */
export interface ListBlock { kind: 'list'; items: string[] }
/** The reference list: works by BibTeX key, in order of first citation. */
export interface ReferencesBlock { kind: 'references'; keys: string[] }
export type ReportBlock = ParagraphBlock | FieldsBlock | TableBlock | ListBlock | ReferencesBlock;

/** One section of a report. */
export interface ReportSection {
  /** Stable identifier (used for anchors and by the tests). */
  id: string;
  heading: string;
  blocks: ReportBlock[];
}

/** A whole report in neutral markup. */
export interface ReportDocument {
  title: string;
  /** "exact-dw 0.1.0" */
  producer: string;
  sections: ReportSection[];
}

/** Decimals of d, critical values and bounds in the reports. */
export const D_DECIMALS = 4;

const para = (text: string): ParagraphBlock => ({ kind: 'para', text });

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

function interceptWords(r: DwTestResult): string {
  if (!r.intercept) return 'none';
  if (r.panel?.entityEffects) return `one indicator per entity (${r.panel.entities}), instead of a common intercept`;
  return r.interceptAdded ? 'added by exact-dw' : 'a constant column of the data (detected, not duplicated)';
}

function regressorNames(r: DwTestResult): string[] {
  return r.columns.filter((c, i) => !(r.interceptAdded && i === 0));
}

/**
 * What the report says about the power: read from the result's power object, which exactDwTest
 * fills with the ExactPower of src/power/exact-power.ts (alternative, process, criticalUpper,
 * route, notes); a bare PowerSummary (older results) reads as the test's own alternative and AR(1).
 */
export interface PowerDescription {
  alternative: DwTestResult['alternative'];
  process: 'ar1' | 'seasonal';
  /** The critical value(s) of the test whose power is shown. */
  lower: number | null;
  upper: number | null;
  route: string | null;
  notes: PowerNote[];
  /** False when the rho reaching the target power was not searched for. */
  searched: boolean;
}

/**
 * The power object of a result in the terms the reports use.
 *
 * @example
 * ```ts
 * const result = exactDwTest({ y, x, power: { rho: [0.2, 0.4, 0.6] } });
 * describePower(result).lower; // the critical value whose power is shown (one-sided, positive)
 * ```
 */
export function describePower(r: DwTestResult): PowerDescription {
  const pw = r.power!;
  const extra = pw as Partial<{ alternative: DwTestResult['alternative']; process: 'ar1' | 'seasonal'; criticalUpper: number | null; route: string; notes: PowerNote[] }>;
  const alternative = extra.alternative ?? r.alternative;
  const process = extra.process ?? 'ar1';
  const notes = Array.isArray(extra.notes) ? extra.notes : [];
  let lower: number | null = null;
  let upper: number | null = null;
  if (alternative === 'positive') lower = pw.critical;
  else if (alternative === 'negative') upper = pw.critical;
  else { lower = pw.critical; upper = extra.criticalUpper ?? null; }
  return {
    alternative, process, lower, upper, route: extra.route ?? null,
    notes, searched: !notes.some((n) => n.code === 'TARGET_NOT_SEARCHED'),
  };
}

/**
 * "u(t) = rho u(t-1) + eps(t)" or, for the seasonal process, "u(t) = rho u(t-4) + eps(t)": u the
 * errors, eps the innovations, kept apart from the residuals e of the fit.
 *
 * @example
 * ```ts
 * inline(processFormula('ar1', 1), 'text');      // "u(t) = rho u(t-1) + eps(t)"
 * inline(processFormula('seasonal', 4), 'latex'); // "$u_t = \rho\, u_{t-4} + \varepsilon_t$"
 * ```
 */
export function processFormula(process: 'ar1' | 'seasonal', lag: number): string {
  return arFormula(process === 'seasonal' ? lag : 1);
}

/** The rejection region of the test whose power is shown, e.g. "d <= 1.2046 or d >= 2.7954". */
function powerRegion(p: PowerDescription): string {
  const lo = p.lower !== null ? `${sym('d')} ${sym('le')} ${fixed(p.lower, D_DECIMALS)}` : null;
  const hi = p.upper !== null ? `${sym('d')} ${sym('ge')} ${fixed(p.upper, D_DECIMALS)}` : null;
  return [lo, hi].filter((x): x is string => x !== null).join(' or ');
}

function powerSection(r: DwTestResult): ReportSection {
  const pw = r.power!;
  const p = describePower(r);
  const target = `${fixed(pw.target * 100, 0)}${sym('percent')}`;
  const seasonal = p.process === 'seasonal';
  const errors = seasonal ? `seasonal autoregressive errors at lag ${r.lag}` : 'AR(1) errors';
  const rows: [string, string][] = [['Level', p.alternative === 'two-sided' ? `${level(pw.alpha)} (${level(pw.alpha / 2)} in each tail)` : level(pw.alpha)]];
  if (p.alternative === 'two-sided') {
    rows.push(['Exact lower critical value', p.lower !== null ? fixed(p.lower, D_DECIMALS) : 'not given']);
    rows.push(['Exact upper critical value', p.upper !== null ? fixed(p.upper, D_DECIMALS) : 'not given']);
  } else {
    rows.push(['Exact critical value used', fixed(pw.critical, D_DECIMALS)]);
  }
  rows.push(['Rejection region', powerRegion(p)]);
  let reach: string;
  const range = p.alternative === 'negative' ? `between ${sym('minus')}0.99 and 0` : 'between 0 and 0.99';
  if (!p.searched) reach = `The ${sym('rho')} at which the power reaches ${target} was not searched for.`;
  else if (pw.rhoAtTarget !== null && pw.rhoAtTarget !== undefined) reach = `The power reaches ${target} at ${sym('rho')} = ${fixed(pw.rhoAtTarget, 3)}.`;
  else reach = `The power does not reach ${target} for any ${sym('rho')} ${range} with this design.`;
  const testWords = p.alternative === 'positive' ? 'the one-sided test for positive autocorrelation'
    : p.alternative === 'negative' ? 'the one-sided test for negative autocorrelation'
      : `the two-sided test (${level(pw.alpha / 2)} in each tail)`;
  const blocks: ReportBlock[] = [
    { kind: 'fields', rows },
    {
      kind: 'table', head: [`${seasonal ? `Seasonal (lag ${r.lag})` : 'AR(1)'} coefficient ${sym('rho')}`, 'Exact power'], align: ['r', 'r'],
      rows: powerRows(pw.curve).map((c) => [level(c.rho), fixed(c.power, 4)]),
    },
    para(reach),
    para(`Power of ${testWords}, with stationary errors ${processFormula(p.process, r.lag)}, computed exactly for this design matrix.`),
  ];
  const notes = p.notes.filter((n) => n.code !== 'TARGET_NOT_SEARCHED' && n.code !== 'TARGET_NOT_REACHED').map(powerNoteText);
  if (notes.length) blocks.push({ kind: 'list', items: notes });
  return { id: 'power', heading: `Exact power against ${errors}`, blocks };
}

/**
 * Rows of a power curve worth printing: all when short, else about eleven evenly spread.
 *
 * @example
 * ```ts
 * const curve = Array.from({ length: 21 }, (_, i) => ({ rho: i / 20, power: 0 }));
 * powerRows(curve).map((c) => c.rho); // [0, 0.1, 0.2, ..., 1]: the tenths
 * ```
 */
export function powerRows(curve: { rho: number; power: number }[]): { rho: number; power: number }[] {
  if (curve.length <= 12) return curve;
  // prefer the rows at rho = 0.1, 0.2, ... when the curve has them
  const tenths = curve.filter((c) => Math.abs(c.rho * 10 - Math.round(c.rho * 10)) < 1e-9);
  if (tenths.length >= 4 && tenths.length <= 12) return tenths;
  const picked = new Set<number>();
  for (let i = 0; i <= 10; i++) picked.add(Math.round((i * (curve.length - 1)) / 10));
  return [...picked].sort((a, b) => a - b).map((i) => curve[i]);
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

function conclusionStatic(r: DwTestResult): string {
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

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** Decimals of the asymptotic statistics (h, LM, F, t). */
export const STAT_DECIMALS = 4;

function dynamicSection(r: DwTestResult): ReportSection {
  const dyn = r.dynamic!;
  const bg = dyn.breuschGodfrey;
  const hOk = dyn.durbinH.h !== null && Number.isFinite(dyn.durbinH.h);
  const rows: string[][] = [
    [`Durbin's ${sym('h')}`, hOk ? fixed(dyn.durbinH.h as number, STAT_DECIMALS) : 'undefined',
      hOk && dyn.durbinH.pValue !== null ? probability(dyn.durbinH.pValue, { alpha: r.alpha }) : '', hOk ? 'normal' : ''],
    [`Breusch${sym('ndash')}Godfrey LM, order ${bg.order}`, fixed(bg.lm, STAT_DECIMALS), probability(bg.pChiSquare, { alpha: r.alpha }), math(`\\chi^2_{${bg.order}}`, `chi-square, ${bg.order} df`, `χ², ${bg.order} df`)],
    [`Breusch${sym('ndash')}Godfrey, ${sym('F')} form`, fixed(bg.f, STAT_DECIMALS), probability(bg.pF, { alpha: r.alpha }), math(`F(${bg.df1}, ${bg.df2})`, `F(${bg.df1}, ${bg.df2})`, `*F*(${bg.df1}, ${bg.df2})`)],
    [`Durbin's alternative test, ${sym('t')} on the lagged residual`, fixed(dyn.residualT.t, STAT_DECIMALS), probability(dyn.residualT.pValue, { alpha: r.alpha }), 'normal'],
  ];
  const blocks: ReportBlock[] = [
    para(`The regressors include the lagged dependent variable ${code(dyn.laggedDependent)} (${dyn.how === 'declared' ? 'declared by the caller' : 'detected from the data'}). ` +
      `With a lagged dependent variable, ${sym('d')} is biased towards 2 and its exact null distribution does not hold, so ${sym('d')} is not a valid test here ` +
      `${cite('durbin-1970')}. The tests below replace it; their ${sym('p')}-values are asymptotic (large-sample) approximations ` +
      `${cite('durbin-1970', 'breusch-1978', 'godfrey-1978')}.`),
    { kind: 'table', head: ['Test', 'Statistic', `${sym('p')} (asymptotic)`, 'Reference'], align: ['l', 'r', 'r', 'l'], rows },
  ];
  if (!hOk) {
    blocks.push(para(durbinHWords(dyn.durbinH)));
  }
  return { id: 'dynamic', heading: 'Tests for a model with a lagged dependent variable (asymptotic)', blocks };
}

/** True when d (valid), the Breusch-Godfrey test beside it, or the tests of a dynamic model reject at alpha. */
function rejectsSomewhere(r: DwTestResult): boolean {
  if (r.dynamic) return r.dynamic.breuschGodfrey.pChiSquare <= r.alpha || (r.dynamic.durbinH.pValue !== null && r.dynamic.durbinH.pValue <= r.alpha);
  return r.decision === 'reject' || (r.breuschGodfrey !== null && r.breuschGodfrey !== undefined && r.breuschGodfrey.pChiSquare <= r.alpha);
}

/** The options of a run on one line, "--y sales --lag 4 --drop-missing". */
function optionsLine(options: NonNullable<DwTestResult['options']>): string {
  return Object.entries(options).filter(([, v]) => v !== false && v !== undefined)
    .map(([k, v]) => (v === true ? `--${k}` : `--${k} ${Array.isArray(v) ? v.join(',') : String(v)}`)).join(' ');
}

function serialSection(r: DwTestResult): ReportSection {
  const bg = r.breuschGodfrey!;
  const rows: string[][] = [
    [`Breusch${sym('ndash')}Godfrey LM, order ${bg.order}`, fixed(bg.lm, STAT_DECIMALS), probability(bg.pChiSquare, { alpha: r.alpha }), math(`\\chi^2_{${bg.order}}`, `chi-square, ${bg.order} df`, `χ², ${bg.order} df`)],
    [`Breusch${sym('ndash')}Godfrey, ${sym('F')} form`, fixed(bg.f, STAT_DECIMALS), probability(bg.pF, { alpha: r.alpha }), math(`F(${bg.df1}, ${bg.df2})`, `F(${bg.df1}, ${bg.df2})`, `*F*(${bg.df1}, ${bg.df2})`)],
  ];
  const verdict = bg.pChiSquare <= r.alpha ? 'rejects' : 'does not reject';
  return {
    id: 'serial', heading: `Breusch${sym('ndash')}Godfrey test of order ${bg.order} (asymptotic)`, blocks: [
      { kind: 'table', head: ['Test', 'Statistic', `${sym('p')} (asymptotic)`, 'Reference'], align: ['l', 'r', 'r', 'l'], rows },
      {
        kind: 'fields', rows: [[`First-order autocorrelation of the residuals, ${sym('rhoHat')}`, fixed(r.rhoHat, STAT_DECIMALS)]],
      },
      para(`The Breusch${sym('ndash')}Godfrey test ${cite('breusch-1978', 'godfrey-1978')} regresses the residuals on the regressors and ${bg.order === 1 ? 'the residual lagged once' : `the residuals lagged 1 to ${bg.order} periods`} ` +
        `(zero before the sample and across gaps); it is asymptotic and, unlike ${sym('d')}, also aimed at autocorrelation up to order ${bg.order}. At ${sym('alpha')} = ${level(r.alpha)} it ${verdict} the null hypothesis of no autocorrelation. ` +
        `${sym('rhoHat')} is the sum of the products of residuals one period apart over the sum of squared residuals.`),
    ],
  };
}

/**
 * Build the format-neutral report of a test result.
 *
 * @example
 * ```ts
 * buildReport(exactDwTest({ y, x })).sections.map((s) => s.heading);
 * ```
 */
export function buildReport(r: DwTestResult): ReportDocument {
  const sections: ReportSection[] = [];
  const valid = dIsValid(r);
  const dText = fixed(r.d, D_DECIMALS);

  // 1. conclusion first
  if (valid) {
    const blocks = [para(conclusionStatic(r))];
    if (rejectsSomewhere(r)) blocks.push(para(nextStepsWords()));
    sections.push({ id: 'conclusion', heading: 'Conclusion', blocks });
  } else {
    sections.push({
      id: 'conclusion', heading: 'Conclusion', blocks: [para(
        `The model has a lagged dependent variable, so the Durbin${sym('ndash')}Watson ${sym('d')} is not a valid test and its ${sym('p')}-value is not reported. ` +
        `${capitalise(dynamicVerdict(r))} (asymptotic tests, see below).`), ...(rejectsSomewhere(r) ? [para(nextStepsWords())] : [])],
    });
    sections.push(dynamicSection(r));
  }

  // 2. the statistic
  const statRows: [string, string][] = [[`Durbin${sym('ndash')}Watson ${sym('d')}`, dText]];
  if (valid) {
    statRows.push([`Exact null mean of ${sym('d')}`, fixed(r.nullMean, D_DECIMALS)]);
    statRows.push([`Exact null standard deviation of ${sym('d')}`, fixed(Math.sqrt(r.nullVariance), D_DECIMALS)]);
  }
  statRows.push(['Differences', r.lag === 4 ? `lag 4: Wallis's ${sym('d4')} ${cite('wallis-1972')}` : r.lag > 1 ? `lag ${r.lag} (the lag-${r.lag} analogue of Wallis's ${sym('d4')} ${cite('wallis-1972')})` : 'lag 1']);
  if (r.panel) statRows.push(['Panel', `${r.panel.entities} entities (${r.panel.smallest} to ${r.panel.largest} periods each), ${r.panel.pairs} differences, each within one entity${r.panel.entityEffects ? '; one indicator per entity instead of the intercept' : ''}`]);
  else if (r.gaps) statRows.push(['Time index', `has gaps: only pairs exactly ${r.lag} period${r.lag > 1 ? 's' : ''} apart are differenced`]);
  const statBlocks: ReportBlock[] = [
    para(`${dFormula(r.lag)}, from the least-squares residuals e ${cite('durbin-watson-1950', 'durbin-watson-1951')}` +
      (r.panel ? `; the sum in the numerator runs over the pairs of observations of the same entity exactly ${r.lag} period${r.lag > 1 ? 's' : ''} apart (one pooled regression on every entity).`
        : r.gaps ? `; the sum in the numerator runs over the pairs of observations exactly ${r.lag} period${r.lag > 1 ? 's' : ''} apart.` : '.')),
    { kind: 'fields', rows: statRows },
  ];
  if (!valid) statBlocks.push(para(`Shown for reference only: ${sym('d')} is not a valid test in this model.`));
  sections.push({ id: 'statistic', heading: 'The statistic', blocks: statBlocks });

  if (valid) {
    // 3. exact p-values
    const mark = (alt: string) => (r.alternative === alt ? 'tested' : '');
    const pc = { alpha: r.alpha, errorBound: r.errorBound };
    sections.push({
      id: 'p-values', heading: 'Exact p-values for this design', blocks: [
        {
          kind: 'table', head: ['Alternative', 'Probability', `${sym('p')}-value`, ''], align: ['l', 'l', 'r', 'l'], rows: [
            ['positive autocorrelation', sym('PDle'), probability(r.pPositive, pc), mark('positive')],
            ['negative autocorrelation', sym('PDge'), probability(r.pNegative, pc), mark('negative')],
            ['either sign (two-sided)', `twice the smaller tail`, probability(r.pTwoSided, pc), mark('two-sided')],
          ],
        },
      ],
    });

    // 4. exact critical values
    const tl = level(r.critical.tailLevel);
    sections.push({
      id: 'critical', heading: `Exact critical values at ${sym('alpha')} = ${level(r.alpha)}`, blocks: [
        {
          kind: 'fields', rows: [
            [`Lower critical value, ${sym('PDlec')} = ${tl}`, fixed(r.critical.lower, D_DECIMALS)],
            [`Upper critical value, ${sym('PDgec')} = ${tl}`, fixed(r.critical.upper, D_DECIMALS)],
          ],
        },
        para(`Rejection region for the alternative tested (${alternativeWords(r)}): ${rejectionRegion(r)}. ` +
          `These critical values are exact for this design matrix; they are not table bounds.`),
      ],
    });

    // 4b. Breusch-Godfrey of order p and the residual autocorrelation, next to d
    if (r.breuschGodfrey) sections.push(serialSection(r));

    // 5. bounds test
    if (r.bounds) {
      const b = r.bounds;
      const rows: [string, string][] = [
        [sym('dL'), fixed(b.dL, D_DECIMALS)],
        [sym('dU'), fixed(b.dU, D_DECIMALS)],
      ];
      if (r.alternative !== 'positive') {
        rows.push([`4 ${sym('minus')} ${sym('dU')}`, fixed(4 - b.dU, D_DECIMALS)]);
        rows.push([`4 ${sym('minus')} ${sym('dL')}`, fixed(4 - b.dL, D_DECIMALS)]);
      }
      rows.push([`Tabulated for`, `${sym('n')} = ${r.n}, ${sym('kp')} = ${b.kPrime} regressors besides the intercept, level ${level(b.level)}`]);
      rows.push([`Zone of the observed ${sym('d')}`, zoneWords(b.zone)]);
      sections.push({
        id: 'bounds', heading: 'The classical bounds test', blocks: [
          { kind: 'fields', rows },
          para(prose(boundsResolutionWords(b))),
          para(`The bounds ${sym('dL')} and ${sym('dU')} of the bounds test ${cite('durbin-watson-1951')} are computed exactly for this ${sym('n')} and ${sym('kp')}; ` +
            (savinWhiteCovers(r.n, b.kPrime, b.level)
              ? `the printed tables ${cite('savin-white-1977')} give the same values to three decimals. `
              : `this case (${sym('n')} = ${r.n}, ${sym('kp')} = ${b.kPrime}, level ${level(b.level)}) lies beyond the printed tables, so the values above are the only source. `) +
            `They hold for every design with an intercept and ${sym('k')} columns; the critical values above are for this one.`),
        ],
      });
    } else {
      sections.push({ id: 'bounds', heading: 'The classical bounds test', blocks: [para(boundsAbsentReason(r))] });
    }

    // 6. power
    if (r.power) sections.push(powerSection(r));
  } else {
    const left = ['exact p-values', 'critical values', 'bounds test'];
    if (r.power) left.push('power curve');
    sections.push({
      id: 'not-shown', heading: 'Not shown for this model', blocks: [
        para(`The ${andList(left)} of ${sym('d')} are left out: they assume that no regressor is a lagged dependent variable.`),
      ],
    });
  }

  // 7. data and model
  const regs = regressorNames(r);
  const modelRows: [string, string][] = [
    [`Observations ${sym('n')}`, String(r.n)],
    [`Columns of X, ${sym('k')} (including any intercept)`, String(r.k)],
    [`Residual degrees of freedom, ${sym('m')} = ${sym('n')} ${sym('minus')} ${sym('k')}`, String(r.m)],
    ['Intercept', interceptWords(r)],
    ['Regressors', regs.length ? regs.map(code).join(', ') : 'none (intercept only)'],
    ['Time index', timeIndexWords(r.timeColumn ?? null)],
  ];
  if (r.droppedRows) modelRows.push(['Rows dropped (missing values)', `${r.droppedRows.count}: data rows ${rowList(r.droppedRows.rows)} (counted from 1 after the header)`]);
  if (r.rSquared !== null && r.rSquared !== undefined) modelRows.push([sym('R2'), Number.isFinite(r.rSquared) ? fixed(r.rSquared, 4) : 'undefined']);
  const modelBlocks: ReportBlock[] = [{ kind: 'fields', rows: modelRows }];
  if (r.coefficients && r.coefficients.length) {
    modelBlocks.push({
      kind: 'table', head: ['Column', 'Estimate', 'Standard error'], align: ['l', 'r', 'r'],
      rows: r.coefficients.map((c) => [code(c.name), estimate(c.estimate), Number.isFinite(c.stdError) ? estimate(c.stdError) : 'n/a']),
    });
    modelBlocks.push(para('Least-squares fit; standard errors from the usual estimate of the error variance.'));
  } else {
    modelBlocks.push(para('The residuals were supplied by the caller, so no fitted coefficients are shown.'));
  }
  sections.push({ id: 'model', heading: 'Data and model', blocks: modelBlocks });

  // 8. computation
  const compRows: [string, string][] = [];
  if (valid) {
    compRows.push(['Method', engineWords(r.method)]);
    if (r.methodChoice) compRows.push(['Why this method', prose(engineChoiceWords(r.methodChoice))]);
    compRows.push([`Numerical error bound (${sym('p')}-values)`, bound(r.errorBound)]);
  } else {
    compRows.push(['Method', `asymptotic normal, ${sym('chi2')} and ${sym('F')} reference distributions`]);
  }
  compRows.push(['Software', `exact-dw ${VERSION} ${cite('exact-dw')}`]);
  if (r.input) {
    const size = r.input.bytes !== undefined ? `, ${r.input.bytes} bytes` : '';
    compRows.push(['Input', `${code(r.input.name)}${size}${r.input.sha256 ? `, SHA-256 ${code(r.input.sha256)}` : ''}`]);
  }
  if (r.options && Object.keys(r.options).length) compRows.push(['Options', code(optionsLine(r.options))]);
  sections.push({ id: 'computation', heading: 'Computation', blocks: [{ kind: 'fields', rows: compRows }] });

  // 9. notes
  if (r.warnings.length) sections.push({ id: 'notes', heading: 'Notes', blocks: [{ kind: 'list', items: r.warnings.map(warningText) }] });

  // 10. cautions
  sections.push({
    id: 'cautions', heading: 'Cautions', blocks: [{
      kind: 'list', items: [
        'The exact null distribution assumes errors that are independent and normally distributed with constant variance under the null hypothesis.',
        'The regressors must be fixed or strictly exogenous.',
        `No lagged dependent variable may be among the regressors: then ${sym('d')} is biased towards 2 and is not a valid test; Durbin's ${sym('h')} or the Breusch${sym('ndash')}Godfrey test replace it.`,
        `The bounds ${sym('dL')} and ${sym('dU')} assume a model with an intercept and lag-1 differences of consecutive observations; the exact test does not.`,
        `A non-significant result is not proof of independent errors: ${sym('d')} is aimed at ${r.lag > 1 ? `autocorrelation at lag ${r.lag}` : 'first-order (AR(1)-type) dependence'}.`,
        "This result supports, and does not replace, the analyst's judgement and the reporting rules of their field.",
      ],
    }],
  });

  // 11. the works cited above, in order of first citation
  const keys = citedIn(sections);
  if (keys.length) sections.push({ id: 'references', heading: 'References', blocks: [{ kind: 'references', keys }] });

  return { title: `Exact Durbin${sym('ndash')}Watson test`, producer: `exact-dw ${VERSION}`, sections };
}

/**
 * BibTeX keys of the citation tokens in neutral text, in order of first appearance.
 *
 * @example
 * ```ts
 * citedIn(buildReport(exactDwTest({ y, x })).sections);
 * // e.g. ['durbin-watson-1950', 'durbin-watson-1951', 'savin-white-1977', 'imhof-1961']
 * ```
 */
export function citedIn(sections: ReportSection[]): string[] {
  const texts: string[] = [];
  for (const s of sections) {
    texts.push(s.heading);
    for (const b of s.blocks) {
      if (b.kind === 'para') texts.push(b.text);
      else if (b.kind === 'list') texts.push(...b.items);
      else if (b.kind === 'fields') for (const [l, v] of b.rows) texts.push(l, v);
      else if (b.kind === 'table') texts.push(...b.head, ...b.rows.flat());
    }
  }
  const keys: string[] = [];
  for (const t of texts) {
    for (const m of t.matchAll(/⟨cite:([^⟩]*)⟩/g)) {
      for (const k of m[1].split(',')) if (!keys.includes(k)) keys.push(k);
    }
  }
  return keys;
}
