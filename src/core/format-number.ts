/**
 * The one rounding rule for probabilities shown to people (reports, paper paragraph, bounds
 * resolution, web page, terminal). No formula from the literature: the rules are
 *
 *  1. a probability is rounded in one of a few styles (fixed decimals with a scientific form for
 *     small values, or significant digits), chosen by the caller;
 *  2. when a level alpha is given, digits are added until the printed number lies on the same side
 *     of alpha as the exact one (0.05004 never prints as "0.0500" or "0.050" beside "> 0.05"), and
 *     the result says when |p - alpha| <= the engine's error bound, i.e. the decision against alpha
 *     is at the numerical limit of the computation;
 *  3. a probability that the engine clamped to exactly 0 while reporting an error bound > 0 is
 *     printed as "< bound" (bound rounded up to one significant digit), never as "0";
 *  4. in the styles that ask for it (the paper's), a probability below 1 that would round to 1 is
 *     printed as "> 0.99" (as many nines as the style shows).
 *
 * It lives in core/ because both bounds/ (the zone resolution) and report/ use it, and bounds/ lies
 * below report/ in the layers.
 */

/** How a probability is rounded before the alpha rule adds digits. */
export interface ProbabilityStyle {
  /**
   * `decimals`: `decimals` fixed decimals down to `scientificBelow`, below that `significant`
   * significant digits in scientific form. `significant`: `significant` significant digits,
   * scientific form below `scientificBelow`.
   */
  kind: 'decimals' | 'significant';
  decimals?: number;
  significant: number;
  scientificBelow: number;
  /** Drop trailing zeros of the fixed form (default false; a scientific mantissa keeps its digits). */
  trimZeros?: boolean;
  /** Print "< floor" for 0 < p < floor (the paper's "< 0.001"); not applied when alpha < floor. */
  floor?: number;
  /** Print "> 0.99" (as many nines as shown) for p < 1 that rounds to 1 (default false: "1.0000"). */
  belowOne?: boolean;
}

/** Four decimals from 0.001 up, three significant digits below (text, Markdown, LaTeX reports). */
export const REPORT_STYLE: ProbabilityStyle = { kind: 'decimals', decimals: 4, significant: 3, scientificBelow: 1e-3 };
/** Two significant digits, "< 0.001" below 0.001 (the paragraph for a paper). */
export const PAPER_STYLE: ProbabilityStyle = { kind: 'significant', significant: 2, scientificBelow: 1e-3, floor: 1e-3, belowOne: true };
/** Two significant digits, scientific below 1e-4 (sentences of the bounds-test resolution). */
export const SENTENCE_STYLE: ProbabilityStyle = { kind: 'significant', significant: 2, scientificBelow: 1e-4, trimZeros: true };
/** Four decimals down to 1e-4, three significant digits below (the web page). */
export const PAGE_STYLE: ProbabilityStyle = { kind: 'decimals', decimals: 4, significant: 3, scientificBelow: 1e-4 };
/** Up to six decimals, trailing zeros dropped, four significant digits below 1e-4 (terminal). */
export const TERMINAL_STYLE: ProbabilityStyle = { kind: 'decimals', decimals: 6, significant: 4, scientificBelow: 1e-4, trimZeros: true };

/** Context of one probability. */
export interface ProbabilityContext {
  /** The level it is compared with: digits are added until the print is on the same side of alpha. */
  alpha?: number;
  /** The engine's absolute error bound of p (0 or absent when unknown or exact). */
  errorBound?: number;
}

/** A probability ready to print. */
export interface FormattedProbability {
  /** '=' normally; '<' for "< 1e-11" and "< 0.001"; '>' for "> 0.9999". */
  relation: '=' | '<' | '>';
  /** The number in plain ASCII, scientific as "2.50e-7". */
  value: string;
  /** `value` with the relation when it is not '=' ("< 1e-11"), else `value`. */
  text: string;
  /** True when |p - alpha| <= errorBound: the decision against alpha is at the numerical limit. */
  atLimit: boolean;
}

/** Most significant digits ever printed (a double carries about 17). */
const MAX_SIGNIFICANT = 15;

/**
 * x rounded up to one significant digit, as "1e-11", "3e-9".
 *
 * @example
 * ```ts
 * boundUp(2.3e-12); // "3e-12"
 * boundUp(0.00042); // "5e-4"
 * ```
 */
export function boundUp(x: number): string {
  if (!(x > 0) || !Number.isFinite(x)) return String(x);
  let e = Math.floor(Math.log10(x));
  let mant = Math.ceil(x / 10 ** e - 1e-9);
  if (mant >= 10) { mant = 1; e += 1; }
  if (Number(`${mant}e${e}`) < x) { mant += 1; if (mant >= 10) { mant = 1; e += 1; } }
  return `${mant}e${e}`;
}

function scientificForm(p: number, significant: number): string {
  const [mant, exp] = p.toExponential(Math.max(0, significant - 1)).split('e');
  return `${mant}e${Number(exp)}`;
}

/** Round p in the style, with `extra` more digits than the style's own. */
function rounded(p: number, style: ProbabilityStyle, extra: number): string {
  const trim = style.trimZeros ?? false;
  if (p !== 0 && p < style.scientificBelow) return scientificForm(p, Math.min(MAX_SIGNIFICANT, style.significant + extra));
  if (style.kind === 'decimals') {
    const s = p.toFixed(Math.min(20, (style.decimals ?? 4) + extra));
    return trim && s.includes('.') ? s.replace(/0+$/, '').replace(/\.$/, '') : s;
  }
  const digits = Math.min(MAX_SIGNIFICANT, style.significant + extra);
  // fixed notation with `digits` significant digits (p >= scientificBelow here, so no exponent)
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(p)));
  let s = p.toFixed(Math.min(20, decimals));
  if (trim && s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s;
}

/** The largest number below 1 with the decimals the style shows near 1 (0.9999 for four decimals, 0.99 for two significant digits). */
function justBelowOne(p: number, style: ProbabilityStyle, extra: number): string {
  const dec = style.kind === 'decimals'
    ? (style.decimals ?? 4) + extra
    : Math.min(MAX_SIGNIFICANT, style.significant + extra) - 1 - Math.floor(Math.log10(p));
  return `0.${'9'.repeat(Math.max(1, Math.min(15, dec)))}`;
}

/**
 * Format a probability for people: see the rules at the top of this file.
 *
 * @example
 * ```ts
 * formatProbability(0.05004, REPORT_STYLE, { alpha: 0.05 }).text;  // "0.05004"
 * formatProbability(0.031234, REPORT_STYLE).text;                  // "0.0312"
 * formatProbability(0, REPORT_STYLE, { errorBound: 2e-12 }).text;  // "< 2e-12"
 * formatProbability(0.0004, PAPER_STYLE).text;                     // "< 0.001"
 * ```
 */
export function formatProbability(p: number, style: ProbabilityStyle, context: ProbabilityContext = {}): FormattedProbability {
  const { alpha } = context;
  const eb = context.errorBound !== undefined && Number.isFinite(context.errorBound) && context.errorBound > 0 ? context.errorBound : 0;
  const make = (relation: FormattedProbability['relation'], value: string, atLimit: boolean): FormattedProbability =>
    ({ relation, value, text: relation === '=' ? value : `${relation} ${value}`, atLimit });
  if (!Number.isFinite(p)) return make('=', String(p), false);
  const atLimit = alpha !== undefined && Math.abs(p - alpha) <= eb;
  if (p <= 0 && eb > 0) return make('<', boundUp(eb), atLimit);
  if (p === 0) return make('=', '0', atLimit);
  if (style.floor !== undefined && p < style.floor && (alpha === undefined || alpha >= style.floor)) {
    return make('<', String(style.floor), atLimit);
  }
  const side = (x: number) => (alpha === undefined ? 0 : Math.sign(x - alpha));
  let extra = 0;
  let s = rounded(p, style, 0);
  while (alpha !== undefined && side(Number(s)) !== side(p) && extra < MAX_SIGNIFICANT) {
    extra += 1;
    s = rounded(p, style, extra);
  }
  if (style.belowOne && p < 1 && Number(s) >= 1) {
    const below = justBelowOne(p, style, extra);
    // "> 0.99" must not contradict alpha either (alpha is never that large in practice)
    if (alpha === undefined || side(Number(below)) === side(p) || side(p) > 0) return make('>', below, atLimit);
  }
  return make('=', s, atLimit);
}
