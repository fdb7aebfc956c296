/**
 * The content of a report, independent of its format: sections of paragraphs, labelled values,
 * tables and lists, written in the neutral markup of format.ts. Every renderer (text, Markdown,
 * LaTeX) prints this one document, so the formats cannot disagree about a number or a sentence.
 * Nothing here computes a statistic: every number comes from the DwTestResult.
 *
 * This file assembles the sections of a test report in order (conclusion, statistic, exact
 * distribution, bounds, power, data, computation, notes, references). Its parts live beside it:
 * the block model (document-model.ts), the words for the test (test-words.ts), the power section
 * (power-section.ts), the asymptotic tests (asymptotic-sections.ts); their public names are
 * re-exported here.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { VERSION } from '../version.js';
import { boundsResolutionWords, engineChoiceWords, nextStepsWords, timeIndexWords, warningText, rowList } from './wording.js';
import { dIsValid, savinWhiteCovers } from './citations.js';
import { andList, bound, cite, code, dFormula, estimate, fixed, level, probability, prose, sym } from './format.js';
import { D_DECIMALS, para, type ReportBlock, type ReportSection, type ReportDocument } from './document-model.js';
import { alternativeWords, rejectionRegion, zoneWords, boundsAbsentReason, engineWords, interceptWords, regressorNames, conclusionStatic, dynamicVerdict, capitalise } from './test-words.js';
import { powerSection } from './power-section.js';
import { dynamicSection, serialSection, rejectsSomewhere } from './asymptotic-sections.js';

export type { ParagraphBlock, FieldsBlock, TableBlock, ListBlock, ReferencesBlock, ReportBlock, ReportSection, ReportDocument } from './document-model.js';
export { D_DECIMALS, STAT_DECIMALS } from './document-model.js';
export { nullWords, alternativeWords, rejectionRegion, zoneWords, boundsAbsentReason, engineWords, numericalLimitWords, dynamicVerdict } from './test-words.js';
export { describePower, processFormula, powerRows, type PowerDescription } from './power-section.js';

/** The options of a run on one line, "--y sales --lag 4 --drop-missing". */
function optionsLine(options: NonNullable<DwTestResult['options']>): string {
  return Object.entries(options).filter(([, v]) => v !== false && v !== undefined)
    .map(([k, v]) => (v === true ? `--${k}` : `--${k} ${Array.isArray(v) ? v.join(',') : String(v)}`)).join(' ');
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
