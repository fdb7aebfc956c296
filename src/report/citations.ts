/**
 * The published sources of the methods a result actually used, as BibTeX entries and as in-text
 * citations (author-year for plain text, pandoc keys for Markdown, \cite for LaTeX).
 *
 * Durbin & Watson (1950, 1951) define d and the bounds test; Imhof (1961) the numerical inversion;
 * Pan (1968) and Farebrother (1980, AS 153) the finite-range formula; Daniels (1954) the choice of
 * the inversion line through the saddlepoint (the inversion itself is exact); Savin & White (1977)
 * the extended bounds tables (cited only for cases inside them); Wallis (1972) the lag-4 statistic; Durbin (1970), Breusch (1978) and
 * Godfrey (1978) the tests for dynamic models and the Breusch-Godfrey test beside d; the software
 * itself under the key `exact-dw`.
 *
 * Bibliographic details (volumes, issue numbers, pages, titles) are quoted from memory: check
 * them against the journals before a final submission.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import type { InlineFormat } from './inline-format.js';
import { VERSION } from '../version.js';

/** One cited work. */
export interface CitedWork {
  /** BibTeX key, also the pandoc and \cite key. */
  key: string;
  /** Authors as cited in running text ("Durbin and Watson"). */
  authors: string;
  year: number;
  /** The BibTeX entry. */
  bibtex: string;
  /** The BibTeX fields (author, title, journal, year, volume, number, pages). */
  fields: Record<string, string>;
}

/** The BibTeX entry of this software (a @software entry; biblatex reads it, BibTeX styles treat it as @misc). */
function softwareWork(): CitedWork {
  const fields: [string, string][] = [
    ['author', '{exact-dw contributors}'],
    ['title', 'exact-dw: Exact Finite-Sample {Durbin--Watson} Tests for Your Own Design'],
    ['year', '2026'],
    ['version', VERSION],
    ['note', `TypeScript library, command-line tool and offline web page, version ${VERSION}`],
  ];
  const body = fields.map(([k, v]) => `  ${k.padEnd(7)} = {${v}},`).join('\n');
  return { key: 'exact-dw', authors: 'exact-dw contributors', year: 2026, bibtex: `@software{exact-dw,\n${body}\n}\n`, fields: Object.fromEntries(fields) };
}

function article(key: string, authors: string, year: number, fields: [string, string][]): CitedWork {
  const body = fields.map(([k, v]) => `  ${k.padEnd(7)} = {${v}},`).join('\n');
  return { key, authors, year, bibtex: `@article{${key},\n${body}\n}\n`, fields: Object.fromEntries(fields) };
}

/**
 * A reference-list entry for a work: "Durbin, J. and Watson, G. S. (1950). Title. Biometrika 37,
 * 409-428." In LaTeX the journal is set in italics and the page range with an en dash.
 *
 * @example
 * ```ts
 * formatReference('durbin-watson-1950', 'text');
 * // "Durbin, J. and Watson, G. S. (1950). Testing for Serial Correlation in Least Squares
 * // Regression. I. Biometrika 37, 409-428."
 * ```
 */
export function formatReference(key: string, format: InlineFormat): string {
  const w = WORKS[key];
  if (!w) throw new RangeError(`report: no work with key ${key}`);
  const f = w.fields;
  if (key === 'exact-dw') {
    const title = f.title.replace(/[{}]/g, '').replace('--', format === 'latex' ? '--' : format === 'markdown' ? '–' : '-');
    return format === 'markdown' ? `exact-dw contributors (${f.year}). *${title}*. Version ${f.version}.`
      : format === 'latex' ? `exact-dw contributors (${f.year}). \\emph{${title}}. Version ${f.version}.`
        : `exact-dw contributors (${f.year}). ${title}. Version ${f.version}.`;
  }
  const title = f.title.replace(/[{}]/g, '');
  const pages = format === 'latex' ? f.pages : f.pages.replace('--', format === 'markdown' ? '–' : '-');
  if (format === 'latex') {
    const esc = (s: string) => s.replace(/[&%$#_]/g, (c) => `\\${c}`);
    return `${esc(f.author)} (${f.year}). ${esc(title)}. \\emph{${esc(f.journal)}} ${f.volume}, ${pages}.`;
  }
  if (format === 'markdown') return `${f.author} (${f.year}). ${title}. *${f.journal}* ${f.volume}, ${pages}.`;
  return `${f.author} (${f.year}). ${title}. ${f.journal} ${f.volume}, ${pages}.`;
}

// All volume, issue and page numbers below are from memory (see the note at the top).
/** Every work the reports can cite, by key. */
export const WORKS: Record<string, CitedWork> = {
  'exact-dw': softwareWork(),
  'durbin-watson-1950': article('durbin-watson-1950', 'Durbin and Watson', 1950, [
    ['author', 'Durbin, J. and Watson, G. S.'],
    ['title', 'Testing for Serial Correlation in Least Squares Regression. {I}'],
    ['journal', 'Biometrika'],
    ['year', '1950'],
    ['volume', '37'],
    ['number', '3/4'],
    ['pages', '409--428'],
  ]),
  'durbin-watson-1951': article('durbin-watson-1951', 'Durbin and Watson', 1951, [
    ['author', 'Durbin, J. and Watson, G. S.'],
    ['title', 'Testing for Serial Correlation in Least Squares Regression. {II}'],
    ['journal', 'Biometrika'],
    ['year', '1951'],
    ['volume', '38'],
    ['number', '1/2'],
    ['pages', '159--178'],
  ]),
  'imhof-1961': article('imhof-1961', 'Imhof', 1961, [
    ['author', 'Imhof, J. P.'],
    ['title', 'Computing the Distribution of Quadratic Forms in Normal Variables'],
    ['journal', 'Biometrika'],
    ['year', '1961'],
    ['volume', '48'],
    ['number', '3/4'],
    ['pages', '419--426'],
  ]),
  'pan-1968': article('pan-1968', 'Pan', 1968, [
    ['author', 'Pan, Jie-Jian'],
    ['title', 'Distributions of the Noncircular Serial Correlation Coefficients'],
    ['journal', 'Selected Translations in Mathematical Statistics and Probability'],
    ['year', '1968'],
    ['volume', '7'],
    ['pages', '281--292'],
  ]),
  'farebrother-1980': article('farebrother-1980', 'Farebrother', 1980, [
    ['author', 'Farebrother, R. W.'],
    ['title', "Algorithm {AS} 153: {Pan's} Procedure for the Tail Probabilities of the {Durbin-Watson} Statistic"],
    ['journal', 'Applied Statistics'],
    ['year', '1980'],
    ['volume', '29'],
    ['number', '2'],
    ['pages', '224--227'],
  ]),
  // Cited for the choice of the integration line through the saddlepoint, not for an
  // approximation: the saddlepoint engine inverts exactly. Volume and pages from memory.
  'daniels-1954': article('daniels-1954', 'Daniels', 1954, [
    ['author', 'Daniels, H. E.'],
    ['title', 'Saddlepoint Approximations in Statistics'],
    ['journal', 'Annals of Mathematical Statistics'],
    ['year', '1954'],
    ['volume', '25'],
    ['number', '4'],
    ['pages', '631--650'],
  ]),
  'savin-white-1977': article('savin-white-1977', 'Savin and White', 1977, [
    ['author', 'Savin, N. E. and White, Kenneth J.'],
    ['title', 'The {Durbin-Watson} Test for Serial Correlation with Extreme Sample Sizes or Many Regressors'],
    ['journal', 'Econometrica'],
    ['year', '1977'],
    ['volume', '45'],
    ['number', '8'],
    ['pages', '1989--1996'],
  ]),
  'wallis-1972': article('wallis-1972', 'Wallis', 1972, [
    ['author', 'Wallis, Kenneth F.'],
    ['title', 'Testing for Fourth Order Autocorrelation in Quarterly Regression Equations'],
    ['journal', 'Econometrica'],
    ['year', '1972'],
    ['volume', '40'],
    ['number', '4'],
    ['pages', '617--636'],
  ]),
  'durbin-1970': article('durbin-1970', 'Durbin', 1970, [
    ['author', 'Durbin, J.'],
    ['title', 'Testing for Serial Correlation in Least-Squares Regression When Some of the Regressors are Lagged Dependent Variables'],
    ['journal', 'Econometrica'],
    ['year', '1970'],
    ['volume', '38'],
    ['number', '3'],
    ['pages', '410--421'],
  ]),
  'breusch-1978': article('breusch-1978', 'Breusch', 1978, [
    ['author', 'Breusch, T. S.'],
    ['title', 'Testing for Autocorrelation in Dynamic Linear Models'],
    ['journal', 'Australian Economic Papers'],
    ['year', '1978'],
    ['volume', '17'],
    ['number', '31'],
    ['pages', '334--355'],
  ]),
  'godfrey-1978': article('godfrey-1978', 'Godfrey', 1978, [
    ['author', 'Godfrey, L. G.'],
    ['title', 'Testing Against General Autoregressive and Moving Average Error Models when the Regressors Include Lagged Dependent Variables'],
    ['journal', 'Econometrica'],
    ['year', '1978'],
    ['volume', '46'],
    ['number', '6'],
    ['pages', '1293--1301'],
  ]),
};

/**
 * Keys of the engine's sources.
 *
 * @example
 * ```ts
 * engineKeys('pan');   // ['pan-1968', 'farebrother-1980']
 * engineKeys('imhof'); // ['imhof-1961']
 * ```
 */
export function engineKeys(method: string): string[] {
  if (method === 'pan') return ['pan-1968', 'farebrother-1980'];
  if (method === 'saddlepoint') return ['daniels-1954'];
  return ['imhof-1961']; // imhof, and eigenfree (Imhof's integral through a log-determinant)
}

/**
 * True when Savin & White (1977) print d_L and d_U for this case, so that they can be cited as a
 * printed source of the bounds: 6 <= n <= 200, 1 <= k' <= 20, a one-sided level of 5% or 1% (a
 * two-sided test at 10% or 2% uses these). From memory: their tables run over n = 6..200 and
 * k' = 1..20 at the 5% and 1% levels, with entries only where n is large enough for the bounds to
 * exist; n >= k' + 5 is taken as that start (from memory, to be checked against the journal).
 * Outside this range the bounds are computed exactly and lie beyond the printed tables.
 *
 * @example
 * ```ts
 * savinWhiteCovers(30, 2, 0.05);   // true
 * savinWhiteCovers(300, 2, 0.05);  // false: n beyond the tables
 * savinWhiteCovers(30, 2, 0.025);  // false: level not tabulated
 * ```
 */
export function savinWhiteCovers(n: number, kPrime: number, level: number): boolean {
  const tabulated = [0.05, 0.01].some((a) => Math.abs(level - a) <= 1e-12);
  return tabulated && n >= 6 && n <= 200 && kPrime >= 1 && kPrime <= 20 && n >= kPrime + 5;
}

/**
 * True when the report treats d as a valid test (no lagged dependent variable).
 *
 * @example
 * ```ts
 * dIsValid(exactDwTest({ y, x })); // true: no lagged dependent variable among x
 * ```
 */
export function dIsValid(r: DwTestResult): boolean {
  return r.dynamic === null || r.dynamic === undefined;
}

/**
 * Keys of the works a result's report cites, in the order the paragraph cites them: the statistic
 * (Durbin & Watson), the engine (unless d is not valid), the bounds tables (when the bounds are
 * shown and the case lies inside the printed tables), Wallis (lag > 1), and the tests for dynamic models (when a lagged dependent variable is
 * present).
 *
 * @example
 * ```ts
 * citedKeys(exactDwTest({ y, x: { t: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12] } }));
 * // ['durbin-watson-1950', 'durbin-watson-1951', 'imhof-1961', 'savin-white-1977']
 * ```
 */
export function citedKeys(r: DwTestResult): string[] {
  const keys = ['durbin-watson-1950', 'durbin-watson-1951'];
  if (r.lag > 1) keys.push('wallis-1972');
  if (dIsValid(r)) {
    keys.push(...engineKeys(r.method));
    if (r.bounds && savinWhiteCovers(r.n, r.bounds.kPrime, r.bounds.level)) keys.push('savin-white-1977');
  } else {
    keys.push('durbin-1970', 'breusch-1978', 'godfrey-1978');
  }
  if (dIsValid(r) && r.breuschGodfrey) keys.push('breusch-1978', 'godfrey-1978');
  keys.push('exact-dw');
  return keys;
}

/**
 * BibTeX entries for the methods a test result actually used.
 *
 * @example
 * ```ts
 * writeFileSync('exact-dw.bib', citations(exactDwTest({ y, x })));
 * ```
 */
export function citations(r: DwTestResult): string {
  return citedKeys(r).map((k) => WORKS[k].bibtex).join('\n');
}

/**
 * An in-text citation of `keys` in one format: "(Durbin and Watson 1950, 1951)" in plain text,
 * "[@durbin-watson-1950; @durbin-watson-1951]" in Markdown (pandoc), "\cite{...}" in LaTeX.
 *
 * @example
 * ```ts
 * citeInline(['durbin-watson-1950', 'durbin-watson-1951'], 'text'); // "(Durbin and Watson 1950, 1951)"
 * citeInline(['imhof-1961'], 'latex');                              // "\\cite{imhof-1961}"
 * ```
 */
export function citeInline(keys: string[], format: InlineFormat): string {
  const works = keys.map((k) => {
    const w = WORKS[k];
    if (!w) throw new RangeError(`report: no work with key ${k}`);
    return w;
  });
  if (format === 'markdown') return `[${works.map((w) => `@${w.key}`).join('; ')}]`;
  if (format === 'latex') return `\\cite{${works.map((w) => w.key).join(',')}}`;
  const groups: { authors: string; years: number[] }[] = [];
  for (const w of works) {
    const last = groups[groups.length - 1];
    if (last && last.authors === w.authors) last.years.push(w.year);
    else groups.push({ authors: w.authors, years: [w.year] });
  }
  return `(${groups.map((g) => `${g.authors} ${g.years.join(', ')}`).join('; ')})`;
}
