/**
 * One paragraph for the methods or results section of a paper: what was tested, how the p-value
 * was computed (the exact null distribution by Imhof's or Pan's method, with citations whose keys
 * match the BibTeX of citations.ts), the result with numbers rounded for print (p-values to two
 * significant digits or "< 0.001", d and critical values to three decimals), the bounds test for
 * comparison, the power when known, and the software version.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { VERSION } from '../version.js';
import { nVRelation } from './wording.js';
import { dIsValid, engineKeys, savinWhiteCovers } from './citations.js';
import { alternativeWords, describePower, dynamicVerdict, nullWords, processFormula } from './document.js';
import type { ProbabilityContext } from '../core/format-number.js';
import { andList, bound, cite, fixed, inline, level, math, paperP, percent, plain, probabilityRelation, sym, type InlineFormat } from './format.js';

/** Decimals of d, critical values and bounds in the paragraph. */
export const PARAGRAPH_D_DECIMALS = 3;

const D3 = (x: number) => fixed(x, PARAGRAPH_D_DECIMALS);

function pPhrase(p: number, context: ProbabilityContext = {}): string {
  const [rel, num] = paperP(p, context);
  return `${sym('p')} ${rel} ${num}`;
}

/** "of 0.021", "below 0.001", "above 0.99" (with more digits when needed to stay on its side of alpha). */
function pWords(p: number, context: ProbabilityContext = {}): string {
  const [rel, num] = paperP(p, context);
  return rel === '=' ? `of ${num}` : rel === sym('lt') ? `below ${num}` : `above ${num}`;
}

/** The model in words: "n = 24 observations and k = 3 columns (an intercept, a and b)". */
function modelWords(r: DwTestResult): string {
  const regs = r.columns.filter((_, i) => !(r.interceptAdded && i === 0)).map(plain);
  const parts: string[] = [];
  if (r.interceptAdded) parts.push('an intercept');
  parts.push(...regs);
  const what = r.intercept && !r.interceptAdded ? `${andList(parts)}, one of them constant` : andList(parts);
  return `${sym('n')} = ${r.n} observations and ${sym('k')} = ${r.k} column${r.k === 1 ? '' : 's'} in the design (${what})`;
}

function methodPhrase(method: string): string {
  const c = cite(...engineKeys(method));
  if (method === 'pan') return `Pan's finite-range representation of its distribution function ${c}`;
  if (method === 'eigenfree') return `Imhof's numerical inversion of its characteristic function, evaluated through a log-determinant ${c}`;
  if (method === 'saddlepoint') return `exact numerical inversion of its distribution function along the line through the saddlepoint (the point of Daniels's saddlepoint method ${c}, used only to place the line; no saddlepoint approximation is made)`;
  if (method === 'dct') return `Imhof's numerical inversion of its characteristic function, evaluated in the closed-form (DCT) eigenbasis of the difference operator ${c}`;
  return `Imhof's numerical inversion of its characteristic function ${c}`;
}

function boundsPhrase(r: DwTestResult): string {
  const b = r.bounds!;
  const zone = b.zone;
  const verdict =
    zone === 'reject-positive' ? 'would have rejected in favour of positive autocorrelation'
      : zone === 'reject-negative' ? 'would have rejected in favour of negative autocorrelation'
        : zone === 'no-evidence' ? 'would not have rejected the null hypothesis of no autocorrelation'
          : 'would have been inconclusive';
  const lvl = `${percent(b.level)}${sym('percent')} level${r.alternative === 'two-sided' ? ' in each tail' : ''}`;
  const source = savinWhiteCovers(r.n, b.kPrime, b.level)
    ? `the classical bounds test ${cite('savin-white-1977')}`
    : `the classical bounds test ${cite('durbin-watson-1950', 'durbin-watson-1951')}, with bounds computed exactly because this case lies beyond the printed tables`;
  return `For comparison, ${source}, with ${sym('dL')} = ${D3(b.dL)} and ${sym('dU')} = ${D3(b.dU)} ` +
    `for ${sym('n')} = ${r.n} and ${sym('kp')} = ${b.kPrime} at the ${lvl}, ${verdict} for this value of ${sym('d')}.`;
}

function staticParagraph(r: DwTestResult): string[] {
  const s: string[] = [];
  let first = `Serial correlation of the least-squares residuals of a regression with ${modelWords(r)} was examined with the Durbin${sym('ndash')}Watson statistic ${sym('d')} ${cite('durbin-watson-1950', 'durbin-watson-1951')}`;
  if (r.lag > 1) first += r.lag === 4 ? `, formed from differences at lag 4, as in Wallis's ${sym('d4')} ${cite('wallis-1972')}` : `, formed from differences at lag ${r.lag} ${cite('wallis-1972')}`;
  if (r.panel) first += `, pooled over ${r.panel.entities} entities${r.panel.entityEffects ? ' with one intercept per entity (fixed effects)' : ''}, with differences taken only between observations of the same entity exactly ${r.lag} period${r.lag > 1 ? 's' : ''} apart`;
  else if (r.gaps) first += `; as the time index has gaps, only pairs of observations exactly ${r.lag} period${r.lag > 1 ? 's' : ''} apart were differenced`;
  s.push(first + '.');
  s.push(`Its ${sym('p')}-value and critical value${r.alternative === 'two-sided' ? 's' : ''} were computed from the exact finite-sample null distribution of ${sym('d')} for this design matrix, ` +
    `which assumes independent, normally distributed errors with constant variance, using ${methodPhrase(r.method)}, with a numerical error below ${bound(r.errorBound)}.`);
  const a = `${percent(r.alpha)}${sym('percent')}`;
  let crit: string;
  if (r.alternative === 'positive') crit = `exact ${a} critical value ${D3(r.critical.lower)}`;
  else if (r.alternative === 'negative') crit = `exact ${a} critical value ${D3(r.critical.upper)}, rejecting for large ${sym('d')}`;
  else crit = `exact critical values ${D3(r.critical.lower)} and ${D3(r.critical.upper)}, ${percent(r.critical.tailLevel)}${sym('percent')} in each tail`;
  const pc = { alpha: r.alpha, errorBound: r.errorBound };
  s.push(`The observed ${sym('d')} = ${D3(r.d)} gives an exact ${sym('p')}-value ${pWords(r.pValue, pc)} against the alternative of ${alternativeWords(r)} (${crit}), ` +
    `so the hypothesis of no ${nullWords(r)} is ${r.decision === 'reject' ? '' : 'not '}rejected at the ${a} level.`);
  if (probabilityRelation(r.pValue, pc).atLimit) {
    s.push(`The ${sym('p')}-value lies within the numerical error bound of ${sym('alpha')} = ${level(r.alpha)}, so this decision is at the numerical limit of the computation.`);
  }
  if (r.bounds) s.push(boundsPhrase(r));
  if (r.power) {
    const pw = r.power;
    const p = describePower(r);
    const target = `${fixed(pw.target * 100, 0)}${sym('percent')}`;
    const test = p.alternative === 'positive' ? 'the one-sided test against positive autocorrelation'
      : p.alternative === 'negative' ? 'the one-sided test against negative autocorrelation' : 'the two-sided test';
    const against = p.process === 'seasonal'
      ? `Against stationary seasonal errors ${processFormula(p.process, r.lag)}`
      : `Against stationary AR(1) errors ${processFormula(p.process, r.lag)}`;
    const range = p.alternative === 'negative' ? `${sym('rho')} between ${sym('minus')}0.99 and 0` : `${sym('rho')} between 0 and 0.99`;
    if (!p.searched) {
      // the curve was computed without a target search: nothing to summarise in one sentence
    } else {
      s.push(pw.rhoAtTarget !== null && pw.rhoAtTarget !== undefined
        ? `${against}, the exact power of ${test} for this design reaches ${target} at ${sym('rho')} = ${fixed(pw.rhoAtTarget, 2)}.`
        : `${against}, the exact power of ${test} for this design stays below ${target} for every ${range}.`);
    }
  }
  return s;
}


function dynamicParagraph(r: DwTestResult): string[] {
  const dyn = r.dynamic!;
  const bg = dyn.breuschGodfrey;
  const s: string[] = [];
  s.push(`The regression has ${modelWords(r)}, including the lagged dependent variable ${plain(dyn.laggedDependent)}. ` +
    `With a lagged dependent variable the Durbin${sym('ndash')}Watson statistic ${cite('durbin-watson-1950', 'durbin-watson-1951')} is biased towards 2 and its exact null distribution does not apply, ` +
    `so ${sym('d')} = ${D3(r.d)}${r.lag > 1 ? ` (differences at lag ${r.lag}; ${cite('wallis-1972')})` : ''} was not used as a test.`);
  const h = dyn.durbinH;
  const hText = h.h !== null && Number.isFinite(h.h)
    ? `Durbin's ${sym('h')} ${cite('durbin-1970')}, ${sym('h')} = ${fixed(h.h, 2)}${h.pValue !== null ? ` (asymptotic ${pPhrase(h.pValue, { alpha: r.alpha })})` : ''}`
    : `Durbin's ${sym('h')} ${cite('durbin-1970')}, which is undefined here (${nVRelation(h.nV, 'ge')})`;
  s.push(`Serial correlation was instead tested with ${hText}, and with the Breusch${sym('ndash')}Godfrey Lagrange-multiplier test of order ${bg.order} ` +
    `${cite('breusch-1978', 'godfrey-1978')}, LM = ${fixed(bg.lm, 2)} (asymptotic ${sym('chi2')} ${pPhrase(bg.pChiSquare, { alpha: r.alpha })}); ${dynamicVerdict(r, `at the ${percent(r.alpha)}${sym('percent')} level`)}.`);
  return s;
}

/**
 * A paragraph for a paper describing the test and its result, in plain text, Markdown (pandoc
 * citations `[@key]`) or LaTeX (`\cite{key}`); the keys match {@link citations}.
 *
 * @example
 * ```ts
 * const r = exactDwTest({ y, x });
 * paperParagraph(r, 'latex');   // "... (\cite{durbin-watson-1950,durbin-watson-1951}) ..."
 * citations(r);                 // the BibTeX for those keys
 * ```
 */
export function paperParagraph(r: DwTestResult, format: InlineFormat = 'text'): string {
  const sentences = dIsValid(r) ? staticParagraph(r) : dynamicParagraph(r);
  if (r.droppedRows && r.droppedRows.count > 0) {
    const c = r.droppedRows.count;
    sentences.push(`${c === 1 ? 'One observation' : `${c} observations`} with a missing value ${c === 1 ? 'was' : 'were'} dropped and treated as ${c === 1 ? 'a gap' : 'gaps'} in the time index, so no difference was taken across ${c === 1 ? 'it' : 'them'}.`);
  }
  const bg = dIsValid(r) ? r.breuschGodfrey : null;
  if (bg) {
    sentences.push(`The asymptotic Breusch${sym('ndash')}Godfrey test of order ${bg.order} ${cite('breusch-1978', 'godfrey-1978')} gives LM = ${fixed(bg.lm, 2)} ` +
      `(${sym('chi2')} ${pPhrase(bg.pChiSquare, { alpha: r.alpha })})` +
      (r.rhoHat !== null ? `, and the first-order autocorrelation of the residuals is ${sym('rhoHat')} = ${fixed(r.rhoHat, 2)}.` : '.'));
  }
  sentences.push(`The computations used exact-dw ${VERSION} ${cite('exact-dw')}.`);
  return inline(sentences.join(' '), format) + '\n';
}
