/**
 * Number formatting and inline markup shared by every report format, so that a number is rounded
 * once, in one place, and reads the same in text, Markdown, LaTeX and the paper paragraph.
 *
 * Report text is first written in a neutral form: plain words plus tokens in angle quotes
 * (`⟨dL⟩`, `⟨alpha⟩`, `⟨sci:1.2:-4⟩`, ...). {@link inline} then turns it into one output format,
 * escaping the plain words for that format and replacing each token by its spelling there.
 */
import { PAPER_STYLE, REPORT_STYLE, formatProbability, type FormattedProbability, type ProbabilityContext, type ProbabilityStyle } from '../core/format-number.js';
import { citeInline } from './citations.js';
import type { InlineFormat } from './inline-format.js';

export type { InlineFormat } from './inline-format.js';

const OPEN = '⟨';
const CLOSE = '⟩';

/** Spelling of each symbol token in each format. */
const SYMBOLS: Record<string, Record<InlineFormat, string>> = {
  d: { text: 'd', markdown: '*d*', latex: '$d$' },
  D: { text: 'D', markdown: '*D*', latex: '$D$' },
  dL: { text: 'd_L', markdown: '*d*<sub>L</sub>', latex: '$d_L$' },
  dU: { text: 'd_U', markdown: '*d*<sub>U</sub>', latex: '$d_U$' },
  d4: { text: 'd_4', markdown: '*d*<sub>4</sub>', latex: '$d_4$' },
  rhoHat: { text: 'rho-hat', markdown: 'ρ̂', latex: '$\\hat\\rho$' },
  nV: { text: 'n V', markdown: '*nV*', latex: '$nV$' },
  n: { text: 'n', markdown: '*n*', latex: '$n$' },
  k: { text: 'k', markdown: '*k*', latex: '$k$' },
  kp: { text: "k'", markdown: "*k*'", latex: "$k'$" },
  m: { text: 'm', markdown: '*m*', latex: '$m$' },
  h: { text: 'h', markdown: '*h*', latex: '$h$' },
  p: { text: 'p', markdown: '*p*', latex: '$p$' },
  t: { text: 't', markdown: '*t*', latex: '$t$' },
  F: { text: 'F', markdown: '*F*', latex: '$F$' },
  alpha: { text: 'alpha', markdown: 'α', latex: '$\\alpha$' },
  rho: { text: 'rho', markdown: 'ρ', latex: '$\\rho$' },
  R2: { text: 'R^2', markdown: '*R*²', latex: '$R^2$' },
  chi2: { text: 'chi-square', markdown: 'χ²', latex: '$\\chi^2$' },
  le: { text: '<=', markdown: '≤', latex: '$\\le$' },
  ge: { text: '>=', markdown: '≥', latex: '$\\ge$' },
  lt: { text: '<', markdown: '<', latex: '$<$' },
  gt: { text: '>', markdown: '>', latex: '$>$' },
  minus: { text: '-', markdown: '-', latex: '$-$' },
  ndash: { text: '-', markdown: '–', latex: '--' },
  pm: { text: '+/-', markdown: '±', latex: '$\\pm$' },
  percent: { text: '%', markdown: '%', latex: '\\%' },
  PDle: { text: 'P(D <= d)', markdown: 'P(*D* ≤ *d*)', latex: '$P(D \\le d)$' },
  PDge: { text: 'P(D >= d)', markdown: 'P(*D* ≥ *d*)', latex: '$P(D \\ge d)$' },
  PDlec: { text: 'P(D <= c)', markdown: 'P(*D* ≤ *c*)', latex: '$P(D \\le c)$' },
  PDgec: { text: 'P(D >= c)', markdown: 'P(*D* ≥ *c*)', latex: '$P(D \\ge c)$' },
};

/**
 * A symbol token, e.g. `sym('dL')`.
 *
 * @example
 * ```ts
 * inline(sym('dL'), 'text');     // "d_L"
 * inline(sym('dL'), 'latex');    // "$d_L$"
 * ```
 */
export function sym(name: keyof typeof SYMBOLS & string): string {
  if (!(name in SYMBOLS)) throw new RangeError(`report: unknown symbol ${name}`);
  return `${OPEN}${name}${CLOSE}`;
}

/**
 * Remove the token quotes from text that comes from the caller (column names) or from other
 * modules (reasons, warnings), so that it is always printed as plain words.
 *
 * @example
 * ```ts
 * plain('a ⟨b⟩'); // "a <b>"
 * ```
 */
export function plain(s: string): string {
  return s.replace(/[⟨⟩]/g, (c) => (c === OPEN ? '<' : '>'));
}

/**
 * Text written elsewhere in the library (a bounds resolution, a warning, a reason): plain words,
 * with the trade's notations it uses (d_L, d_U, <=, >=) set as symbols in each format.
 *
 * @example
 * ```ts
 * inline(prose('d_L <= d'), 'markdown'); // "*d*<sub>L</sub> ≤ d"
 * ```
 */
export function prose(s: string): string {
  return plain(s)
    .replace(/(^|[\s(])d(?= (?:=|<=|>=|<|>) )/g, (_m, pre: string) => `${pre}${sym('d')}`)
    .replace(/\bd_L\b/g, sym('dL'))
    .replace(/\bd_U\b/g, sym('dU'))
    .replace(/ <= /g, ` ${sym('le')} `)
    .replace(/ >= /g, ` ${sym('ge')} `);
}

/**
 * Escape plain words for LaTeX text mode.
 *
 * @example
 * ```ts
 * escapeLatex('50% of x_1'); // "50\\% of x\\_1"
 * ```
 */
export function escapeLatex(s: string): string {
  return s.replace(/[\\{}#$%&_^~<>|"]/g, (c) => {
    switch (c) {
      case '\\': return '\\textbackslash{}';
      case '{': return '\\{';
      case '}': return '\\}';
      case '^': return '\\textasciicircum{}';
      case '~': return '\\textasciitilde{}';
      case '<': return '\\textless{}';
      case '>': return '\\textgreater{}';
      case '|': return '\\textbar{}';
      case '"': return "''";
      default: return `\\${c}`;
    }
  });
}

/**
 * Escape plain words for Markdown (also safe inside a table cell).
 *
 * @example
 * ```ts
 * escapeMarkdown('x_1 * 2'); // "x\\_1 \\* 2"
 * ```
 */
export function escapeMarkdown(s: string): string {
  return s.replace(/[\\`*_|[\]<>#]/g, (c) => {
    if (c === '<') return '&lt;';
    if (c === '>') return '&gt;';
    return `\\${c}`;
  });
}

/**
 * Turn neutral report text into one format: escape the words, spell the tokens.
 *
 * @example
 * ```ts
 * inline(`${sym('d')} ${sym('le')} 1.2`, 'markdown'); // "*d* ≤ 1.2"
 * inline(`${sym('d')} ${sym('le')} 1.2`, 'latex');    // "$d$ $\\le$ 1.2"
 * ```
 */
export function inline(s: string, format: InlineFormat): string {
  let out = '';
  let i = 0;
  while (i < s.length) {
    const a = s.indexOf(OPEN, i);
    if (a < 0) { out += escapeWords(s.slice(i), format); break; }
    const b = s.indexOf(CLOSE, a + 1);
    if (b < 0) throw new RangeError('report: unclosed token');
    out += escapeWords(s.slice(i, a), format);
    out += token(s.slice(a + 1, b), format);
    i = b + 1;
  }
  return format === 'latex' ? mergeMath(out) : out;
}

const NUMBER_TEX = String.raw`-?\d+(?:\.\d+)?(?:\s\\times 10\^\{-?\d+\})?`;

/**
 * Join neighbouring LaTeX math so that a relation and its number sit in one math span:
 * "$\alpha$ = 0.05" becomes "$\alpha = 0.05$", "$p$ $\le$ 0.05" becomes "$p \le 0.05$".
 *
 * @example
 * ```ts
 * mergeMath('$d$ = 1.2 and $p$ $\\le$ 0.05'); // "$d = 1.2$ and $p \\le 0.05$"
 * ```
 */
export function mergeMath(tex: string): string {
  const rules: [RegExp, (...m: string[]) => string][] = [
    // a relation or a minus joins its neighbours; two symbols side by side ("chi^2 p") stay apart
    [/\$([^$]+)\$ \$((?:\\le|\\ge|<|>|-)(?![a-zA-Z])[^$]*)\$/g, (_m, a, b) => `$${a} ${b}$`],
    [/\$([^$]*(?:\\le|\\ge|<|>|-))\$ \$([^$]+)\$/g, (_m, a, b) => `$${a} ${b}$`],
    [/(?<![\w.])(\d+(?:\.\d+)?) \$((?:\\le|\\ge|<|>|-) [^$]+)\$/g, (_m, a, b) => `$${a} ${b}$`],
    [/\$-\$(\d+(?:\.\d+)?)(?!\d|\.\d)/g, (_m, a) => `$-${a}$`],
    [/\$([^$]+)\$ = \$([^$]+)\$/g, (_m, a, b) => `$${a} = ${b}$`],
    [new RegExp(String.raw`\$([^$]+)\$ = (${NUMBER_TEX})(?!\d|\.\d)`, 'g'), (_m, a, b) => `$${a} = ${b}$`],
    [new RegExp(String.raw`\$([^$]*(?:\\le|\\ge|<|>|-))\$ (${NUMBER_TEX})(?!\d|\.\d)`, 'g'), (_m, a, b) => `$${a} ${b}$`],
  ];
  let prev = '';
  let out = tex;
  while (out !== prev) {
    prev = out;
    for (const [re, f] of rules) out = out.replace(re, f as (...args: string[]) => string);
  }
  return out;
}

function escapeWords(s: string, format: InlineFormat): string {
  if (format === 'latex') return escapeLatex(s);
  if (format === 'markdown') return escapeMarkdown(s);
  return s;
}

function token(t: string, format: InlineFormat): string {
  if (t.startsWith('sci:')) {
    const [, mant, exp] = t.split(':');
    if (format === 'latex') return `$${mant.replace(/^-/, '-')} \\times 10^{${exp}}$`;
    if (format === 'markdown') return `${mant} × 10<sup>${exp}</sup>`;
    return `${mant}e${exp}`;
  }
  if (t.startsWith('dformula:')) {
    // d = sum (e_t - e_{t-j})^2 / sum e_t^2
    const j = t.slice(9);
    if (format === 'latex') return `$d = \\sum_t (e_t - e_{t-${j}})^2 / \\sum_t e_t^2$`;
    if (format === 'markdown') return `*d* = Σ (*e*<sub>t</sub> - *e*<sub>t-${j}</sub>)<sup>2</sup> / Σ *e*<sub>t</sub><sup>2</sup>`;
    return `d = sum (e(t) - e(t-${j}))^2 / sum e(t)^2`;
  }
  if (t.startsWith('arformula:')) {
    // u_t = rho u_{t-j} + eps_t: u the errors, eps the innovations (not the residuals e)
    const j = t.slice(10);
    if (format === 'latex') return `$u_t = \\rho\\, u_{t-${j}} + \\varepsilon_t$`;
    if (format === 'markdown') return `*u*<sub>t</sub> = ρ *u*<sub>t-${j}</sub> + ε<sub>t</sub>`;
    return `u(t) = rho u(t-${j}) + eps(t)`;
  }
  if (t.startsWith('math:')) {
    // a short formula: LaTeX math mode as written, plain text and Markdown with the ASCII spelling
    const [tex, plainText, md] = t.slice(5).split('|');
    if (format === 'latex') return `$${tex}$`;
    return format === 'markdown' ? (md ?? escapeMarkdown(plainText ?? tex)) : (plainText ?? tex);
  }
  if (t.startsWith('code:')) {
    const body = t.slice(5);
    if (format === 'latex') return `\\texttt{${escapeLatex(body)}}`;
    if (format === 'markdown') return '`' + body.replace(/`/g, "'") + '`';
    return body;
  }
  if (t.startsWith('cite:')) return citeInline(t.slice(5).split(','), format);
  const s = SYMBOLS[t];
  if (!s) throw new RangeError(`report: unknown token ${t}`);
  return s[format];
}

/**
 * The AR error process as a formula token: errors u, innovations epsilon (the residuals are e).
 *
 * @example
 * ```ts
 * inline(arFormula(1), 'latex'); // "$u_t = \\rho\\, u_{t-1} + \\varepsilon_t$"
 * ```
 */
export function arFormula(step: number): string {
  return `${OPEN}arformula:${step}${CLOSE}`;
}

/**
 * A short formula: set in LaTeX math mode as `tex`, as `text` in plain text, and as `markdown`
 * (already Markdown; default: `text` escaped) in Markdown. No '|' or angle quotes in any of them.
 *
 * @example
 * ```ts
 * inline(math('m = n - k', 'm = n - k'), 'latex'); // "$m = n - k$"
 * ```
 */
export function math(tex: string, text: string, markdown?: string): string {
  return `${OPEN}math:${tex}|${text}${markdown !== undefined ? `|${markdown}` : ''}${CLOSE}`;
}

/**
 * The definition of d at lag j as a formula token.
 *
 * @example
 * ```ts
 * inline(dFormula(4), 'text'); // "d = sum (e(t) - e(t-4))^2 / sum e(t)^2"
 * ```
 */
export function dFormula(lag: number): string {
  return `${OPEN}dformula:${lag}${CLOSE}`;
}

/**
 * An in-text citation token of the works with these BibTeX keys (see citations.ts).
 *
 * @example
 * ```ts
 * inline(cite('imhof-1961'), 'text'); // "(Imhof 1961)"
 * ```
 */
export function cite(...keys: string[]): string {
  return `${OPEN}cite:${keys.join(',')}${CLOSE}`;
}

/**
 * A column name or other caller text shown verbatim (monospace in Markdown and LaTeX).
 *
 * @example
 * ```ts
 * inline(code('log_gdp'), 'markdown'); // "`log_gdp`"
 * inline(code('log_gdp'), 'latex');    // "\\texttt{log\\_gdp}"
 * ```
 */
export function code(s: string): string {
  return `${OPEN}code:${s.replace(/[⟨⟩]/g, '')}${CLOSE}`;
}

// ---------------------------------------------------------------------------------------------
// numbers

/** x with a minus token when negative, never "-0". */
function signed(body: string, negative: boolean): string {
  return negative ? `${sym('minus')}${body}` : body;
}

/**
 * Fixed decimals, e.g. fixed(1.23456, 4) = "1.2346".
 *
 * @example
 * ```ts
 * fixed(1.23456, 4);                 // "1.2346"
 * inline(fixed(-0.00001, 3), 'text'); // "0.000" (never "-0.000")
 * ```
 */
export function fixed(x: number, decimals: number): string {
  if (!Number.isFinite(x)) return String(x);
  const s = Math.abs(x).toFixed(decimals);
  const zero = Number(s) === 0;
  return signed(s, x < 0 && !zero);
}

/**
 * Scientific form mantissa x 10^exp as a token, `digits` significant digits.
 *
 * @example
 * ```ts
 * inline(scientific(0.000123456, 3), 'text');  // "1.23e-4"
 * inline(scientific(0.000123456, 3), 'latex'); // "$1.23 \\times 10^{-4}$"
 * ```
 */
export function scientific(x: number, digits: number): string {
  const [mant, exp] = Math.abs(x).toExponential(digits - 1).split('e');
  return signed(`${OPEN}sci:${mant}:${Number(exp)}${CLOSE}`, x < 0);
}

/** A plain number as printed by core/format-number.ts ("0.0312", "2.50e-7") in neutral markup. */
function numberMarkup(value: string): string {
  const m = /^(-?[0-9.]+)e(-?\d+)$/.exec(value);
  return m ? `${OPEN}sci:${m[1]}:${Number(m[2])}${CLOSE}` : value;
}

function relationMarkup(relation: FormattedProbability['relation']): string {
  return relation === '<' ? sym('lt') : relation === '>' ? sym('gt') : '=';
}

/**
 * A probability in a report (core/format-number.ts, REPORT_STYLE): four decimals from 0.001 up,
 * below that three significant digits in scientific form; with `alpha`, as many more digits as keep
 * it on its side of alpha; a value clamped to 0 with an error bound > 0 as "< bound".
 *
 * @example
 * ```ts
 * inline(probability(0.05004, { alpha: 0.05 }), 'text');     // "0.05004"
 * inline(probability(0, { errorBound: 3e-12 }), 'text');     // "< 3e-12"
 * ```
 */
export function probability(p: number, context: ProbabilityContext = {}): string {
  const f = formatProbability(p, REPORT_STYLE, context);
  return f.relation === '=' ? numberMarkup(f.value) : `${relationMarkup(f.relation)} ${numberMarkup(f.value)}`;
}

/**
 * A probability in a report as relation and number (neutral markup), for sentences such as
 * "p = 0.0312 <= 0.05" or "p < 1e-11 <= 0.05"; `atLimit` when |p - alpha| <= the error bound.
 *
 * @example
 * ```ts
 * probabilityRelation(0.0312, { alpha: 0.05 }); // { relation: '=', number: '0.0312', atLimit: false }
 * inline(probabilityRelation(0, { errorBound: 1e-12 }).number, 'text'); // "1e-12" (relation '<')
 * ```
 */
export function probabilityRelation(p: number, context: ProbabilityContext = {}, style: ProbabilityStyle = REPORT_STYLE): { relation: string; number: string; atLimit: boolean } {
  const f = formatProbability(p, style, context);
  return { relation: relationMarkup(f.relation), number: numberMarkup(f.value), atLimit: f.atLimit };
}

/** Rounding of a probability in a report, as a number (for the checks that parse reports back). */
export const PROBABILITY_DECIMALS = 4;

/**
 * A p-value for the paper (core/format-number.ts, PAPER_STYLE): two significant digits (more when
 * needed to stay on the side of `alpha` it lies on), "< 0.001" below 0.001, "> 0.99" when two
 * digits would round it to 1. Returns the relation and the number, e.g. ['=', '0.021'].
 *
 * @example
 * ```ts
 * paperP(0.02134);                 // ['=', '0.021']
 * paperP(0.0501, { alpha: 0.05 }); // ['=', '0.0501']: kept above alpha
 * ```
 */
export function paperP(p: number, context: ProbabilityContext = {}): [string, string] {
  const f = probabilityRelation(p, context, PAPER_STYLE);
  return [f.relation, f.number];
}

/**
 * An upper bound: rounded up to two significant digits in scientific form ("2.4e-12").
 *
 * @example
 * ```ts
 * inline(bound(2.31e-12), 'text'); // "2.4e-12"
 * ```
 */
export function bound(x: number): string {
  if (x === 0) return '0';
  if (!Number.isFinite(x)) return String(x);
  const e = Math.floor(Math.log10(x));
  let mant = Math.ceil((x / 10 ** e) * 10 - 1e-9) / 10;
  let exp = e;
  if (mant >= 10) { mant /= 10; exp += 1; }
  const m = mant.toFixed(1);
  // guard against the division above rounding below x
  return Number(`${m}e${exp}`) >= x ? `${OPEN}sci:${m}:${exp}${CLOSE}` : `${OPEN}sci:${(Number(m) + 0.1).toFixed(1)}:${exp}${CLOSE}`;
}

/**
 * A regression coefficient or standard error: four significant digits, scientific when tiny or huge.
 *
 * @example
 * ```ts
 * inline(estimate(1.234567), 'text');     // "1.235"
 * inline(estimate(-0.000123456), 'text'); // "-1.235e-4"
 * ```
 */
export function estimate(x: number): string {
  if (x === 0) return '0';
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a < 1e-3 || a >= 1e6) return scientific(x, 4);
  // four significant digits in fixed notation (toPrecision would switch to exponents from 1e4)
  const decimals = Math.max(0, 3 - Math.floor(Math.log10(a)));
  let s = a.toFixed(decimals);
  if (s.replace('.', '').replace(/^0+/, '').length > 4 && decimals > 0) s = a.toFixed(decimals - 1); // 9.9996 -> "10.00"
  return signed(s, x < 0);
}

/**
 * alpha as a percentage without trailing zeros: 0.05 -> "5", 0.025 -> "2.5".
 *
 * @example
 * ```ts
 * percent(0.05);  // "5"
 * percent(0.025); // "2.5"
 * ```
 */
export function percent(alpha: number): string {
  return String(Number((alpha * 100).toPrecision(10)));
}

/**
 * A level such as alpha as a plain decimal without trailing zeros (0.05 -> "0.05").
 *
 * @example
 * ```ts
 * level(0.05);      // "0.05"
 * level(0.1 + 0.2); // "0.3"
 * ```
 */
export function level(x: number): string {
  return String(Number(x.toPrecision(10)));
}

/**
 * Join words as "a, b and c".
 *
 * @example
 * ```ts
 * andList(['a', 'b', 'c']); // "a, b and c"
 * andList(['a']);           // "a"
 * ```
 */
export function andList(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
