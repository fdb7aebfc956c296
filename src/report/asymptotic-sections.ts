/**
 * The report sections of the asymptotic tests: for a model with a lagged dependent variable,
 * Durbin's h (Durbin 1970), the Breusch-Godfrey test (Breusch 1978; Godfrey 1978) and Durbin's
 * alternative test in place of d; for a static model, the Breusch-Godfrey test beside d
 * (docs/methods.md section 8). Neutral markup; every number comes from the DwTestResult.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { durbinHWords } from './wording.js';
import { cite, code, fixed, level, math, probability, sym } from './format.js';
import { STAT_DECIMALS, para, type ReportBlock, type ReportSection } from './document-model.js';

/** The section of the tests that replace d in a dynamic model. */
export function dynamicSection(r: DwTestResult): ReportSection {
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
export function rejectsSomewhere(r: DwTestResult): boolean {
  if (r.dynamic) return r.dynamic.breuschGodfrey.pChiSquare <= r.alpha || (r.dynamic.durbinH.pValue !== null && r.dynamic.durbinH.pValue <= r.alpha);
  return r.decision === 'reject' || (r.breuschGodfrey !== null && r.breuschGodfrey !== undefined && r.breuschGodfrey.pChiSquare <= r.alpha);
}

/** The section of the Breusch-Godfrey test beside a valid d. */
export function serialSection(r: DwTestResult): ReportSection {
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
        kind: 'fields', rows: [[`First-order autocorrelation of the residuals, ${sym('rhoHat')}`, r.rhoHat !== null ? fixed(r.rhoHat, STAT_DECIMALS) : 'not defined: no two observations are one period apart']],
      },
      para(`The Breusch${sym('ndash')}Godfrey test ${cite('breusch-1978', 'godfrey-1978')} regresses the residuals on the regressors and ${bg.order === 1 ? 'the residual lagged once' : `the residuals lagged 1 to ${bg.order} periods`} ` +
        `(zero before the sample and across gaps); it is asymptotic and, unlike ${sym('d')}, also aimed at autocorrelation up to order ${bg.order}. At ${sym('alpha')} = ${level(r.alpha)} it ${verdict} the null hypothesis of no autocorrelation. ` +
        `${sym('rhoHat')} is the sum of the products of residuals one period apart over the sum of squared residuals.`),
    ],
  };
}

