/**
 * No rounding slip between formats: every number shown in the text, Markdown and LaTeX reports
 * and in the paper paragraph (plain, Markdown, LaTeX) is parsed back by this file's own readers
 * and compared with the JSON result, within half a unit of its last shown digit (error bounds:
 * rounded up, never down). The readers are written here independently of the renderers.
 */
import { describe, expect, it } from 'vitest';
import { renderText } from '../../src/report/text.js';
import { renderMarkdown } from '../../src/report/markdown.js';
import { renderLatex } from '../../src/report/latex.js';
import { renderJson } from '../../src/report/json.js';
import { paperParagraph } from '../../src/report/paragraph.js';
import { exactDwTest, type DwTestResult } from '../../src/inference/dw-test.js';
import { seededNormal } from '../helpers/reference.js';
import { FIXTURES } from '../helpers/report-fixtures.js';

const NUM = String.raw`-?\d+(?:\.\d+)?(?:e-?\d+)?`;

/** LaTeX -> plain words: math, escapes, table separators and citations removed. */
function fromLatex(s: string): string {
  return s
    .replace(/^\\begin\{tabular\}.*$/gm, '')
    .replace(/\$?(-?[\d.]+) \\times 10\^\{(-?\d+)\}\$?/g, '$1e$2')
    .replace(/\\cite\{[^}]*\}/g, '')
    .replace(/\\texttt\{([^}]*)\}/g, '$1')
    .replace(/\\textgreater\{\}/g, '>').replace(/\\textless\{\}/g, '<')
    .replace(/\$-\$/g, '-')
    .replace(/\\le\b/g, '<=').replace(/\\ge\b/g, '>=').replace(/\$<\$/g, '<').replace(/\$>\$/g, '>')
    .replace(/\\alpha\b/g, 'alpha').replace(/\\rho\b/g, 'rho').replace(/\\chi\^2/g, 'chi-square')
    .replace(/(?<!\\) & /g, '   ')
    .replace(/\\([_%&#])/g, '$1')
    .replace(/--/g, '-')
    .replace(/\$/g, '')
    .replace(/\\\\/g, ' ');
}

/** Markdown -> plain words. */
function fromMarkdown(s: string): string {
  return s
    .replace(/ × 10<sup>(-?\d+)<\/sup>/g, 'e$1')
    .replace(/\*d\*<sub>([LU])<\/sub>/g, 'd_$1')
    .replace(/\[@[^\]]*\]/g, '')
    .replace(/\\([\\`*_|[\]#])/g, '$1')
    .replace(/`/g, '').replace(/\*/g, '')
    .replace(/&lt;/g, '<').replace(/&gt;/g, '>')
    .replace(/≤/g, '<=').replace(/≥/g, '>=').replace(/α/g, 'alpha').replace(/ρ/g, 'rho')
    .replace(/R²/g, 'R^2').replace(/χ²/g, 'chi-square').replace(/–/g, '-')
    .replace(/\|/g, '   ');
}

const flat = (s: string) => s.replace(/\s+/g, ' ');

/** Half a unit in the last shown digit of `shown` ("0.0386" -> 5e-5, "1.4e-11" -> 5e-13). */
function halfUnit(shown: string): number {
  const [mant, exp] = shown.replace(/^-/, '').split('e');
  const decimals = mant.includes('.') ? mant.split('.')[1].length : 0;
  return 0.5 * 10 ** (Number(exp ?? 0) - decimals);
}

function agrees(shown: string, exact: number, what: string): void {
  const v = Number(shown);
  expect(Number.isFinite(v), `${what}: '${shown}' is a number`).toBe(true);
  expect(Math.abs(v - exact), `${what}: shown ${shown}, exact ${exact}`).toBeLessThanOrEqual(halfUnit(shown) * (1 + 1e-9) + 1e-15);
}

/** An error bound is rounded up: shown >= exact and within one unit of the last digit. */
function boundAgrees(shown: string, exact: number, what: string): void {
  const v = Number(shown);
  expect(v, `${what}: ${shown} >= ${exact}`).toBeGreaterThanOrEqual(exact);
  expect(v - exact, `${what}: ${shown} - ${exact}`).toBeLessThanOrEqual(2 * halfUnit(shown) * (1 + 1e-9));
}

/** The first number after a label (dot leaders, spaces and table separators in between). */
function after(doc: string, label: string, what: string, count = 1): string[] {
  const re = new RegExp(`${label}[ .]*?((?:${NUM})(?:\\s+${NUM}){${count - 1}})(?!\\d|\\.\\d|e)`);
  const m = re.exec(doc);
  expect(m, `${what}: /${re.source}/ found`).not.toBeNull();
  return m![1].trim().split(/\s+/);
}

const esc = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** Check every number of the report `doc` (plain words, white space flattened) against the JSON. */
function checkReport(doc: string, j: DwTestResult, format: string): void {
  const w = (x: string) => `${format}: ${x}`;
  agrees(after(doc, 'Durbin-Watson d', w('d'))[0], j.d, w('d'));
  agrees(after(doc, 'Observations n', w('n'))[0], j.n, w('n'));
  agrees(after(doc, String.raw`Columns of X, k \(including any intercept\)`, w('k'))[0], j.k, w('k'));
  agrees(after(doc, 'm = n - k', w('m'))[0], j.m, w('m'));
  if (j.rSquared !== null) agrees(after(doc, String.raw`R\^2`, w('R^2'))[0], j.rSquared, w('R^2'));
  for (const c of j.coefficients ?? []) {
    const [est, se] = after(doc, esc(c.name), w(`coefficient ${c.name}`), 2);
    agrees(est, c.estimate, w(`estimate of ${c.name}`));
    agrees(se, c.stdError, w(`standard error of ${c.name}`));
  }
  if (j.dynamic) {
    const dyn = j.dynamic;
    if (dyn.durbinH.h !== null) {
      const [h, p] = after(doc, "Durbin's h", w('h'), 2);
      agrees(h, dyn.durbinH.h, w('h'));
      agrees(p, dyn.durbinH.pValue!, w('p of h'));
    }
    const [lm, plm] = after(doc, `Breusch-Godfrey LM, order ${dyn.breuschGodfrey.order}`, w('LM'), 2);
    agrees(lm, dyn.breuschGodfrey.lm, w('LM'));
    agrees(plm, dyn.breuschGodfrey.pChiSquare, w('p of LM'));
    const [f, pf] = after(doc, 'Breusch-Godfrey, F form', w('F'), 2);
    agrees(f, dyn.breuschGodfrey.f, w('F'));
    agrees(pf, dyn.breuschGodfrey.pF, w('p of F'));
    const [t, pt] = after(doc, "Durbin's alternative test, t on the lagged residual", w('t'), 2);
    agrees(t, dyn.residualT.t, w('t'));
    agrees(pt, dyn.residualT.pValue, w('p of t'));
    return;
  }
  agrees(after(doc, 'Exact null mean of d', w('mean'))[0], j.nullMean, w('null mean'));
  agrees(after(doc, 'Exact null standard deviation of d', w('sd'))[0], Math.sqrt(j.nullVariance), w('null sd'));
  agrees(after(doc, String.raw`positive autocorrelation P\(D <= d\)`, w('pPositive'))[0], j.pPositive, w('pPositive'));
  agrees(after(doc, String.raw`negative autocorrelation P\(D >= d\)`, w('pNegative'))[0], j.pNegative, w('pNegative'));
  agrees(after(doc, 'twice the smaller tail', w('pTwoSided'))[0], j.pTwoSided, w('pTwoSided'));
  agrees(after(doc, String.raw`Lower critical value, P\(D <= c\) = ${NUM}`, w('lower'))[0], j.critical.lower, w('lower critical'));
  agrees(after(doc, String.raw`Upper critical value, P\(D >= c\) = ${NUM}`, w('upper'))[0], j.critical.upper, w('upper critical'));
  boundAgrees(after(doc, String.raw`Numerical error bound \(p-values\)`, w('error bound'))[0], j.errorBound, w('error bound'));
  // the conclusion repeats p, d and the critical value
  agrees(after(doc, 'the exact test (?:does not )?rejects? the null hypothesis .*?: p =', w('conclusion p'))[0], j.pValue, w('conclusion p'));
  agrees(after(doc, ', and d =', w('conclusion d'))[0], j.d, w('conclusion d'));
  if (j.bounds) {
    agrees(after(doc, '(?<!4 - )d_L', w('d_L'))[0], j.bounds.dL, w('d_L'));
    agrees(after(doc, '(?<!4 - )d_U', w('d_U'))[0], j.bounds.dU, w('d_U'));
  }
  if (j.power) {
    agrees(after(doc, 'Exact critical value used', w('power critical'))[0], j.power.critical, w('power critical'));
    const table = doc.slice(doc.indexOf('Exact power', doc.indexOf('Exact critical value used')));
    const rows = [...table.matchAll(new RegExp(`(?:^|\\s)(0\\.\\d+|1)\\s+(${NUM})(?=\\s)`, 'g'))].slice(0, 40);
    expect(rows.length, w('power rows')).toBeGreaterThan(0);
    for (const [, rho, power] of rows) {
      const near = [...j.power.curve].sort((a, b) => Math.abs(a.rho - Number(rho)) - Math.abs(b.rho - Number(rho)))[0];
      if (Math.abs(near.rho - Number(rho)) > halfUnit(rho)) continue; // a number of the prose after the table
      const point = near;
      agrees(power, point.power, w(`power at rho ${rho}`));
    }
    if (j.power.rhoAtTarget !== null) agrees(after(doc, String.raw`reaches \d+% at rho =`, w('rho at target'))[0], j.power.rhoAtTarget, w('rho at target'));
  }
}

/** Check the numbers of a paragraph (plain words) against the JSON. */
function checkParagraph(doc: string, j: DwTestResult, format: string): void {
  const w = (x: string) => `${format} paragraph: ${x}`;
  agrees(after(doc, 'n =', w('n'))[0], j.n, w('n'));
  agrees(after(doc, 'k =', w('k'))[0], j.k, w('k'));
  const twoDigits = (rel: string, shown: string, p: number, what: string) => {
    if (rel === 'of' || rel === '=') {
      const v = Number(shown);
      const unit = 10 ** (Math.floor(Math.log10(v)) - 1);
      expect(Math.abs(v - p), `${what}: ${shown} vs ${p}`).toBeLessThanOrEqual(unit / 2 * (1 + 1e-9));
    } else if (rel === 'below' || rel === '<') {
      expect(p).toBeLessThan(Number(shown));
    } else {
      expect(p).toBeGreaterThan(Number(shown));
    }
  };
  if (j.dynamic) {
    agrees(after(doc, 'so d =', w('d'))[0], j.d, w('d'));
    const dyn = j.dynamic;
    if (dyn.durbinH.h !== null) {
      const m = new RegExp(`h = (${NUM}) \\(asymptotic p (=|<|>) (${NUM})\\)`).exec(doc);
      expect(m, w('h')).not.toBeNull();
      agrees(m![1], dyn.durbinH.h, w('h'));
      twoDigits(m![2], m![3], dyn.durbinH.pValue!, w('p of h'));
    }
    const m = new RegExp(`LM = (${NUM}) \\(asymptotic chi-square p (=|<|>) (${NUM})\\)`).exec(doc);
    expect(m, w('LM')).not.toBeNull();
    agrees(m![1], dyn.breuschGodfrey.lm, w('LM'));
    twoDigits(m![2], m![3], dyn.breuschGodfrey.pChiSquare, w('p of LM'));
    return;
  }
  agrees(after(doc, 'The observed d =', w('d'))[0], j.d, w('d'));
  const m = new RegExp(`exact p-value (of|below|above) (${NUM})`).exec(doc);
  expect(m, w('p')).not.toBeNull();
  twoDigits(m![1], m![2], j.pValue, w('p'));
  if (j.alternative === 'two-sided') {
    const [lo] = after(doc, 'critical values', w('lower'));
    agrees(lo, j.critical.lower, w('lower'));
    agrees(after(doc, `critical values ${NUM} and`, w('upper'))[0], j.critical.upper, w('upper'));
  } else {
    agrees(after(doc, String.raw`exact \d+(?:\.\d+)?% critical value`, w('critical'))[0], j.alternative === 'positive' ? j.critical.lower : j.critical.upper, w('critical'));
  }
  boundAgrees(after(doc, 'numerical error below', w('error bound'))[0], j.errorBound, w('error bound'));
  if (j.bounds) {
    agrees(after(doc, 'd_L =', w('d_L'))[0], j.bounds.dL, w('d_L'));
    agrees(after(doc, 'd_U =', w('d_U'))[0], j.bounds.dU, w('d_U'));
  }
  if (j.power && j.power.rhoAtTarget !== null) agrees(after(doc, 'at rho =', w('rho'))[0], j.power.rhoAtTarget, w('rho'));
}

function realResult(): DwTestResult {
  // invented data (seeded): a trend and a cycle, n = 30, AR(1)-like errors
  const z = seededNormal(20240607);
  const n = 30;
  const t = Array.from({ length: n }, (_, i) => i + 1);
  const c = t.map((v) => Math.cos(v / 3));
  let u = 0;
  const y = t.map((v, i) => { u = 0.5 * u + z(); return 10 + 0.3 * v + 2 * c[i] + u; });
  return exactDwTest({ y, x: { trend: t, cycle: c }, alternative: 'two-sided' });
}

const cases: [string, () => DwTestResult][] = [...Object.entries(FIXTURES), ['computed (seeded invented data)', realResult]];

describe('numbers parsed back from every format agree with the JSON at their shown precision', () => {
  for (const [name, make] of cases) {
    it(`${name}: text, Markdown and LaTeX reports`, () => {
      const r = make();
      const j = JSON.parse(renderJson(r)) as DwTestResult;
      checkReport(flat(renderText(r)), j, 'text');
      checkReport(flat(fromMarkdown(renderMarkdown(r))), j, 'markdown');
      checkReport(flat(fromLatex(renderLatex(r))), j, 'latex');
    });
    it(`${name}: the paragraph in text, Markdown and LaTeX`, () => {
      const r = make();
      const j = JSON.parse(renderJson(r)) as DwTestResult;
      checkParagraph(flat(paperParagraph(r, 'text')), j, 'text');
      checkParagraph(flat(fromMarkdown(paperParagraph(r, 'markdown'))), j, 'markdown');
      checkParagraph(flat(fromLatex(paperParagraph(r, 'latex'))), j, 'latex');
    });
  }
  it('the three formats show the same digits (the readers agree with each other, not only within tolerance)', () => {
    const r = FIXTURES.negativeWithGaps();
    const nums = (s: string) => [...s.matchAll(new RegExp(NUM, 'g'))].map((m) => m[0]).join(' ');
    const body = (s: string) => s.slice(s.indexOf('Conclusion') >= 0 ? s.indexOf('Conclusion') : s.indexOf('CONCLUSION'), s.search(/References|REFERENCES|thebibliography/));
    // author-year citations of the text format are the one thing the other formats write as keys
    const t = nums(body(renderText(r).replace(/\((?:[A-Za-z][A-Za-z\s-]+\s\d{4}(?:, \d{4})*;?\s?)+\)/g, '')));
    expect(nums(body(fromMarkdown(renderMarkdown(r))))).toBe(t);
    expect(nums(body(fromLatex(renderLatex(r))))).toBe(t);
  });
});
