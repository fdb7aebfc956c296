/**
 * The results as the page shows them: every number is a field of the library's DwTestResult (or
 * of the report parts the adapter returns), written with the page's formats. Nothing here
 * computes a statistic.
 */
import type { BoundsZone, DwTestResult } from '../inference/dw-test.js';
import { INTERCEPT_NAME } from '../model/design.js';
import { capabilities, durbinHText, engineChoiceText, resolutionWords, timeIndexText, warningWords, type ReportExtras } from './adapter.js';
import { copyText, h, placeSvg, saveText, symbolText } from './dom.js';
import type { OptionalPart, PlainError } from './protocol.js';
import { atNumericalLimit, formatBound, formatLevel, formatNumber, formatProbability, formatStatistic } from './format.js';

export const ALTERNATIVE_WORDS = {
  positive: 'positive autocorrelation',
  negative: 'negative autocorrelation',
  'two-sided': 'autocorrelation of either sign',
} as const;

const ZONE_WORDS: Record<BoundsZone['zone'], string> = {
  'reject-positive': 'd is below d_L: the bounds test rejects in favour of positive autocorrelation.',
  'inconclusive-positive': 'd lies between d_L and d_U: the bounds test is inconclusive.',
  'no-evidence': 'd lies between d_U and 4 - d_U: the bounds test does not reject the null hypothesis of no autocorrelation.',
  'inconclusive-negative': 'd lies between 4 - d_U and 4 - d_L: the bounds test is inconclusive.',
  'reject-negative': 'd is above 4 - d_L: the bounds test rejects in favour of negative autocorrelation.',
};

/** A term and its value; the value carries `data-field` so that tests and users can find it (also used by render-batch.ts). */
export function pair(term: string | Node, value: string, field?: string, extra?: string): HTMLElement[] {
  return [h('dt', {}, term, extra ? h('span', { class: 'note' }, extra) : null), h('dd', {}, h('span', { class: 'num', 'data-field': field }, value))];
}

type Failures = Partial<Record<OptionalPart, PlainError>>;

/** A failed optional part, in the same words as any other error. */
function failureBox(e: PlainError): HTMLElement {
  return h('div', { class: 'error', 'data-code': e.code }, h('p', { class: 'error-message' }, e.message), e.hint ? h('p', { class: 'error-hint' }, e.hint) : null);
}

/** A card with a heading. */
export function card(title: string, ...content: Node[]): HTMLElement {
  return h('section', { class: 'card' }, h('h3', {}, title), ...content);
}

/** A description list of term-value pairs. */
export function dl(items: HTMLElement[][]): HTMLElement {
  const list = h('dl');
  for (const it of items) list.append(...it);
  return list;
}

/** A live region for short confirmations ("Copied."). */
export function statusLine(): HTMLElement {
  return h('span', { class: 'note copy-status', role: 'status', 'aria-live': 'polite' });
}

/** A button that copies text to the clipboard and says so in `status`. */
export function copyButton(label: string, text: () => string, status: HTMLElement, id?: string): HTMLButtonElement {
  const b = h('button', { type: 'button', class: 'secondary', id }, label);
  b.addEventListener('click', () => {
    void copyText(text()).then((ok) => {
      status.textContent = ok ? 'Copied to the clipboard.' : 'The browser refused to copy: select the text and copy it by hand.';
    });
  });
  return b;
}

/** A button that offers text as a file to save (dom.ts saveText: a local blob, no network). */
export function saveButton(label: string, fileName: string, type: string, text: string, id?: string): HTMLButtonElement {
  const b = h('button', { type: 'button', class: 'secondary', id }, label);
  b.addEventListener('click', () => saveText(fileName, type, text));
  return b;
}

function verdict(r: DwTestResult): HTMLElement {
  const alt = ALTERNATIVE_WORDS[r.alternative];
  const p = formatProbability(r.pValue, { alpha: r.alpha, errorBound: r.errorBound });
  const level = formatLevel(r.alpha);
  const limit = atNumericalLimit(r.pValue, r.alpha, r.errorBound)
    ? ` The p-value lies within the numerical error bound (${formatBound(r.errorBound)}) of the level, so this decision is at the numerical limit of the computation.`
    : '';
  if (r.dynamic) {
    return h('p', { class: 'verdict invalid', id: 'verdict' },
      `d is not a valid test here: the regressor '${r.dynamic.laggedDependent}' is the dependent variable lagged. `,
      'Use the tests shown below instead.');
  }
  const text = r.decision === 'reject'
    ? `The exact test rejects "no autocorrelation" in favour of ${alt} at level ${level} (p ${pRelation(p)}).${limit}`
    : `The exact test does not reject "no autocorrelation" against ${alt} at level ${level} (p ${pRelation(p)}).${limit}`;
  return h('p', { class: `verdict ${r.decision}`, id: 'verdict' }, h('strong', {}, `d = ${formatStatistic(r.d)}. `), text);
}

/** "= 0.0312" or "< 1e-11" after "p". */
function pRelation(text: string): string {
  return /^[<>]/.test(text) ? text : `= ${text}`;
}

/** The engine in words, as in the reports. */
export function engineDescription(method: string): string {
  switch (method) {
    case 'imhof': return "Imhof's inversion of the characteristic function (Imhof 1961)";
    case 'pan': return "Pan's finite-range formula (Pan 1968; Farebrother 1980)";
    case 'eigenfree': return "Imhof's inversion through a log-determinant, without eigenvalues (Imhof 1961)";
    case 'saddlepoint': return "exact numerical inversion along the line through the saddlepoint (the saddlepoint of Daniels 1954 places the line; the result is the exact inversion, not Daniels's approximation)";
    case 'dct': return "Imhof's inversion in the closed-form (DCT) eigenbasis of the difference operator (Imhof 1961)";
    default: return method;
  }
}

function statisticCard(r: DwTestResult): HTMLElement {
  const names = r.columns.map((c) => (c === INTERCEPT_NAME ? 'intercept' : c)).join(', ');
  return card('The statistic', dl([
    pair('d', formatStatistic(r.d), 'd'),
    pair('observations n', String(r.n), 'n'),
    pair('columns of X, k', String(r.k), 'k', `(${names})`),
    pair('degrees of freedom n - k', String(r.m), 'm'),
    pair('lag', String(r.lag), 'lag', r.lag === 4 ? "(Wallis's d\u2084)" : r.gaps ? '(with gaps in time)' : undefined),
    pair('time index', timeIndexText(r), 'time-index'),
    ...(r.droppedRows ? [pair('rows dropped', String(r.droppedRows.count), 'dropped-rows', `(data rows ${r.droppedRows.rows.slice(0, 20).join(', ')}${r.droppedRows.count > 20 ? ', ...' : ''})`)] : []),
    // the null moments belong to d's exact distribution, which does not hold with a lagged dependent variable
    ...(r.dynamic ? [] : [
      pair('null mean of d', formatStatistic(r.nullMean), 'null-mean'),
      pair('null standard deviation', formatStatistic(Math.sqrt(r.nullVariance)), 'null-sd'),
    ]),
  ]));
}

function pValueCard(r: DwTestResult): HTMLElement {
  const mark = (alt: DwTestResult['alternative']): string | undefined => (r.alternative === alt ? '(your alternative)' : undefined);
  const pc = { alpha: r.alpha, errorBound: r.errorBound };
  const chosen = h('p', { class: 'headline' }, 'p-value for your alternative: ',
    h('span', { class: 'num big', 'data-field': 'p-value' }, formatProbability(r.pValue, pc)),
    r.dynamic ? h('span', { class: 'note' }, ' (not a valid test for this model: see the tests above)') : null);
  return card('Exact p-values', chosen, dl([
    pair('P(D \u2264 d): positive', formatProbability(r.pPositive, pc), 'p-positive', mark('positive')),
    pair('P(D \u2265 d): negative', formatProbability(r.pNegative, pc), 'p-negative', mark('negative')),
    pair('two-sided', formatProbability(r.pTwoSided, pc), 'p-two-sided', mark('two-sided')),
    pair('numerical error below', formatBound(r.errorBound), 'error-bound'),
    pair('engine', r.method, 'method', `${engineDescription(r.method)}${r.methodChoice ? ` (${engineChoiceText(r)})` : ''}`),
  ]));
}

function criticalCard(r: DwTestResult): HTMLElement {
  const a = formatLevel(r.critical.tailLevel);
  const items = [
    pair(`lower, P(D \u2264 c) = ${a}`, formatStatistic(r.critical.lower), 'critical-lower',
      r.alternative !== 'negative' ? '(reject when d is below)' : undefined),
    pair(`upper, P(D \u2265 c) = ${a}`, formatStatistic(r.critical.upper), 'critical-upper',
      r.alternative !== 'positive' ? '(reject when d is above)' : undefined),
  ];
  return card(`Exact critical values at level ${formatLevel(r.alpha)}`, dl(items),
    h('p', { class: 'note' }, 'Exact for your own X: there is no inconclusive zone.'));
}

function boundsPanel(r: DwTestResult): HTMLElement {
  const panel = h('section', { class: 'panel', id: 'bounds-panel' }, h('h3', {}, 'Where the bounds test would have landed'));
  const b = r.bounds;
  if (b) {
    panel.append(
      dl([
        pair(h('span', {}, ...symbolText(`d_L (k' = ${b.kPrime}, level ${formatLevel(b.level)})`)), formatStatistic(b.dL), 'dL'),
        pair(h('span', {}, ...symbolText('d_U')), formatStatistic(b.dU), 'dU'),
      ]),
      h('p', { 'data-field': 'zone', 'data-zone': b.zone }, ...symbolText(ZONE_WORDS[b.zone])),
      h('p', { class: 'resolution', 'data-field': 'resolution' }, ...symbolText(resolutionWords(b))),
    );
    return panel;
  }
  let why = 'The bounds zone is not part of this build of the page.';
  if (!r.intercept) why = 'The model has no intercept, so the classical bounds d_L, d_U do not apply; the exact p-value does.';
  else if (r.lag > 1) why = `The classical bounds are for lag 1; at lag ${r.lag} only the exact p-value applies.`;
  else if (r.gaps) why = 'The time column has gaps, so the classical bounds do not apply; the exact p-value does.';
  panel.append(h('p', { class: 'note', 'data-field': 'zone' }, ...symbolText(why)));
  return panel;
}

function powerPanel(r: DwTestResult, extras: ReportExtras, rho: number | null, failure?: PlainError): HTMLElement | null {
  if (rho === null && !r.power) return null;
  const panel = h('section', { class: 'panel', id: 'power-panel' }, h('h3', {}, 'Power against AR(1) errors'));
  if (extras.power) {
    const p = extras.power;
    panel.append(h('p', {}, `Exact power at \u03c1 = ${formatLevel(p.rho)}: `,
      h('span', { class: 'num big', 'data-field': 'power' }, p.power.toFixed(3))),
    h('p', {}, `The probability that this test at level ${formatLevel(r.alpha)} (critical value ${formatStatistic(p.critical)}) `
      + 'rejects when the errors follow a stationary AR(1) process with this \u03c1, for your X'
      + (p.errorBound > 0 ? ` (numerical error below ${formatBound(p.errorBound)}).` : '.')),
    h('p', { 'data-field': 'rho-at-target' }, p.rhoAtTarget === null
      ? `Power ${p.target} is not reached for any |\u03c1| below 0.99.`
      : `Power ${p.target} is reached from \u03c1 = ${formatStatistic(p.rhoAtTarget, 3)} on.`));
    if ((r.alternative === 'negative' && p.rho > 0) || (r.alternative === 'positive' && p.rho < 0)) {
      panel.append(h('p', { class: 'note' }, `This \u03c1 points the other way from your alternative, so the power is small; try \u03c1 = ${formatLevel(-p.rho)}.`));
    }
  }
  if (r.power) {
    const rows = r.power.curve.map((c) => h('tr', {}, h('td', { class: 'num' }, formatLevel(c.rho)), h('td', { class: 'num' }, c.power.toFixed(3))));
    panel.append(
      h('table', { class: 'small-table' }, h('caption', {}, `Power curve at level ${formatLevel(r.power.alpha)}`),
        h('thead', {}, h('tr', {}, h('th', { scope: 'col' }, '\u03c1'), h('th', { scope: 'col' }, 'power'))), h('tbody', {}, ...rows)),
      h('p', {}, r.power.rhoAtTarget === null
        ? `Power ${r.power.target} is not reached for any \u03c1 with |\u03c1| \u2264 0.99.`
        : `Power reaches ${r.power.target} at \u03c1 = ${formatStatistic(r.power.rhoAtTarget, 3)}.`),
    );
  }
  if (failure) panel.append(failureBox(failure));
  else if (!extras.power && !r.power) {
    panel.append(h('p', { class: 'note', 'data-field': 'power' },
      capabilities.power ? 'No power was computed.' : 'Exact power is not part of this build of the page.'));
  }
  return panel;
}

function dynamicPanel(r: DwTestResult): HTMLElement | null {
  const dy = r.dynamic;
  if (!dy) return null;
  const hText = dy.durbinH.h === null
    ? durbinHText(dy.durbinH)
    : `Durbin's h = ${formatStatistic(dy.durbinH.h, 3)}, p = ${formatProbability(dy.durbinH.pValue ?? NaN, { alpha: r.alpha })} (asymptotic).`;
  const bg = dy.breuschGodfrey;
  return h('section', { class: 'panel warning', id: 'dynamic-panel' },
    h('h3', {}, 'A lagged dependent variable: use these tests'),
    h('p', {}, `The regressor '${dy.laggedDependent}' is y lagged one period (${dy.how}). Then d is biased towards 2 and its p-value is not a test.`),
    h('ul', {},
      h('li', {}, hText),
      h('li', {}, `Breusch-Godfrey, order ${bg.order}: LM = ${formatStatistic(bg.lm, 3)}, p = ${formatProbability(bg.pChiSquare, { alpha: r.alpha })} (chi-square); `
        + `F = ${formatStatistic(bg.f, 3)}, p = ${formatProbability(bg.pF, { alpha: r.alpha })} (F with ${bg.df1} and ${bg.df2} df); asymptotic.`),
      h('li', {}, `Durbin's alternative test (t on the lagged residual): t = ${formatStatistic(dy.residualT.t, 3)}, p = ${formatProbability(dy.residualT.pValue, { alpha: r.alpha })} (asymptotic).`),
    ));
}

/** Breusch-Godfrey of order p and the residual autocorrelation, next to d (static model). */
function serialPanel(r: DwTestResult): HTMLElement | null {
  const bg = r.breuschGodfrey;
  if (!bg) return null;
  return h('section', { class: 'panel', id: 'serial-panel' },
    h('h3', {}, `Breusch-Godfrey test of order ${bg.order} (asymptotic)`),
    dl([
      pair('LM statistic', formatStatistic(bg.lm, 3), 'bg-lm', `(chi-square, ${bg.order} df)`),
      pair('p-value', formatProbability(bg.pChiSquare, { alpha: r.alpha }), 'bg-p'),
      pair(h('span', {}, 'residual autocorrelation \u03c1\u0302'), r.rhoHat !== null ? formatStatistic(r.rhoHat, 3) : 'not defined (no two observations one period apart)', 'rho-hat'),
    ]),
    h('p', { class: 'note' }, `At level ${formatLevel(r.alpha)} it ${bg.pChiSquare <= r.alpha ? 'rejects' : 'does not reject'} the null hypothesis of no autocorrelation up to order ${bg.order}.`));
}

function figurePanel(r: DwTestResult, extras: ReportExtras, failure?: PlainError): HTMLElement {
  const host = h('div', { id: 'figure', class: 'figure-host' });
  const fig = h('figure', { class: 'panel', id: 'figure-panel' });
  if (extras.figure && placeSvg(host, extras.figure)) {
    fig.append(host, h('figcaption', {},
      'The exact null density of d for your X, with the observed d and the exact critical value(s) marked. ',
      saveButton('Save the figure (SVG)', 'exact-dw-density.svg', 'image/svg+xml', extras.figure, 'save-svg')));
  } else if (failure) {
    fig.append(failureBox(failure));
  } else {
    fig.append(h('figcaption', { class: 'note', 'data-field': 'figure' },
      extras.figure ? 'The figure could not be read as SVG.'
        : r.dynamic ? 'No figure: d is not a valid test for this model, so its null distribution is not drawn.'
          : 'The figure is not part of this build of the page.'));
  }
  return fig;
}

function paragraphPanel(extras: ReportExtras, failure?: PlainError): HTMLElement {
  const panel = h('section', { class: 'panel', id: 'paragraph-panel' }, h('h3', {}, 'For your paper'));
  const status = statusLine();
  const para = extras.paragraph;
  if (!para && failure) {
    panel.append(failureBox(failure));
    return panel;
  }
  if (!para) {
    panel.append(h('p', { class: 'note', 'data-field': 'paragraph' }, 'The paragraph for a paper is not part of this build of the page; the plain-text report below can be copied.'));
    return panel;
  }
  const formats = ([['plain', 'plain text'], ['markdown', 'Markdown'], ['latex', 'LaTeX']] as const)
    .filter(([key]) => para[key] !== null);
  let current: 'plain' | 'markdown' | 'latex' = 'plain';
  const out = h('pre', { class: 'paragraph', id: 'paragraph', tabindex: 0 }, para.plain);
  const choose = h('fieldset', { class: 'inline' }, h('legend', {}, 'Format'));
  for (const [key, label] of formats) {
    const input = h('input', { type: 'radio', name: 'paragraph-format', value: key, checked: key === 'plain' });
    input.addEventListener('change', () => { current = key; out.textContent = para[key] ?? ''; status.textContent = ''; });
    choose.append(h('label', { class: 'check' }, input, ` ${label}`));
  }
  panel.append(...(formats.length > 1 ? [choose] : []), out,
    h('div', { class: 'actions' }, copyButton('Copy the paragraph', () => para[current] ?? '', status, 'copy-paragraph'), status));
  return panel;
}

function fitPanel(r: DwTestResult): HTMLElement | null {
  if (!r.coefficients) return null;
  const rows = r.coefficients.map((c) => h('tr', {},
    h('th', { scope: 'row' }, c.name === INTERCEPT_NAME ? 'intercept' : c.name),
    h('td', { class: 'num' }, formatNumber(c.estimate)),
    h('td', { class: 'num' }, formatNumber(c.stdError))));
  return h('section', { class: 'panel', id: 'fit-panel' }, h('h3', {}, 'The fitted regression'),
    h('table', { class: 'small-table' },
      h('caption', {}, `Least squares, R\u00b2 = ${r.rSquared === null ? 'n/a' : r.rSquared.toFixed(4)}`),
      h('thead', {}, h('tr', {}, h('th', { scope: 'col' }, 'term'), h('th', { scope: 'col' }, 'estimate'), h('th', { scope: 'col' }, 'standard error'))),
      h('tbody', {}, ...rows)));
}

/**
 * The whole results view for one computation.
 *
 * @example
 * ```ts
 * body.replaceChildren(renderResult(result, extras, 0.5, {}));
 * ```
 */
export function renderResult(r: DwTestResult, extras: ReportExtras, rho: number | null, failures: Failures = {}): DocumentFragment {
  const frag = document.createDocumentFragment();
  frag.append(verdict(r));
  if (r.warnings.length > 0) {
    frag.append(h('ul', { class: 'warnings', 'aria-label': 'Notes on this result' },
      ...r.warnings.map((w) => h('li', { 'data-code': w.code }, ...symbolText(warningWords(w))))));
  }
  const dyn = dynamicPanel(r);
  if (dyn) frag.append(dyn);
  if (r.dynamic) {
    // d is not a valid test: its p-values, critical values and bounds zone are not shown
    frag.append(h('div', { class: 'cards' }, statisticCard(r)),
      h('p', { class: 'note', id: 'd-not-valid' }, 'The p-values, critical values and bounds of d are not shown: with a lagged dependent variable d is not a valid test (see the tests above).'));
  } else {
    frag.append(h('div', { class: 'cards' }, statisticCard(r), pValueCard(r), criticalCard(r)));
    const serial = serialPanel(r);
    if (serial) frag.append(serial);
    frag.append(boundsPanel(r));
  }
  const pow = powerPanel(r, extras, rho, failures.power);
  if (pow) frag.append(pow);
  frag.append(figurePanel(r, extras, failures.figure));
  frag.append(paragraphPanel(extras, failures.paragraph));
  const fit = fitPanel(r);
  if (fit) frag.append(fit);
  const status = statusLine();
  const json = JSON.stringify(r, null, 2) + '\n';
  frag.append(h('section', { class: 'panel', id: 'report-panel' }, h('h3', {}, 'Reports to keep'),
    h('div', { class: 'actions' },
      copyButton('Copy the text report', () => extras.text, status, 'copy-text'),
      saveButton('Save the result (JSON)', 'exact-dw-result.json', 'application/json', json, 'save-json'),
      extras.markdown ? saveButton('Save the report (Markdown)', 'exact-dw-report.md', 'text/markdown', extras.markdown, 'save-markdown') : null,
      status),
    h('details', {}, h('summary', {}, 'Plain-text report'), h('pre', { class: 'text-report', id: 'text-report', tabindex: 0 }, extras.text))));
  return frag;
}
