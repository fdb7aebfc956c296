/**
 * Words for the checks of a dynamic model (src/dynamic/serial-tests.ts, docs/methods.md section
 * 8): whether Durbin's h is defined (h = r1 sqrt(n / (1 - n V)), Durbin 1970, Econometrica 38,
 * 410-421; undefined when n V >= 1) and the notes of the diagnosis. Neutral markup of format.ts
 * (render with `inline(text, format)`), shared by every report format, the command line and the
 * page.
 */
import type { DurbinHStatus } from '../../dynamic/serial-tests.js';
import { math, sym } from '../format.js';

/** The fields of Durbin's h that its words need. */
export interface DurbinHFacts {
  status: DurbinHStatus;
  nV: number;
  variance: number;
  r1?: number;
}

/** Four significant digits, as the dynamic checks print their parts. */
export function fourDigits(v: number): string {
  return Number.isFinite(v) ? Number(v.toPrecision(4)).toString() : String(v);
}

/**
 * Whether Durbin's h is defined, and why (neutral markup).
 *
 * @example
 * ```ts
 * inline(durbinHWords({ status: 'DURBIN_H_UNDEFINED', nV: 1.31, variance: 0.0546 }), 'text');
 * // "Durbin's h is undefined here: n V = 1.31 >= 1 (V = 0.0546 is ...), so 1 - n V has no square root. ..."
 * ```
 */
export function durbinHWords(h: DurbinHFacts): string {
  const V = math('V', 'V', '*V*');
  if (h.status === 'DURBIN_H_UNDEFINED') {
    return `Durbin's ${sym('h')} is undefined here: ${nVRelation(h.nV, 'ge')} (${V} = ${fourDigits(h.variance)} is the estimated variance of the coefficient of the lagged dependent variable), ` +
      `so 1 ${sym('minus')} ${sym('nV')} has no square root. The Breusch${sym('ndash')}Godfrey test and Durbin's alternative test (the ${sym('t')}-test of the residual on its own lag and the regressors) remain valid.`;
  }
  return `Durbin's ${sym('h')} is defined: ${nVRelation(h.nV, 'lt')}, and ${math('h = r_1 \\sqrt{n / (1 - nV)}', 'h = r1 sqrt(n / (1 - n V))', '*h* = *r*<sub>1</sub> √(*n* / (1 − *nV*))')}` +
    `${h.r1 === undefined ? '' : ` with ${math('r_1', 'r1', '*r*<sub>1</sub>')} = ${fourDigits(h.r1)}`}, asymptotically N(0, 1).`;
}

/**
 * "n V = 1.31 >= 1" (or "< 1") as one formula (neutral markup).
 *
 * @example
 * ```ts
 * inline(nVRelation(1.31, 'ge'), 'latex'); // "$nV = 1.31 \\ge 1$"
 * ```
 */
export function nVRelation(nV: number, rel: 'ge' | 'lt'): string {
  const v = fourDigits(nV);
  return rel === 'ge'
    ? math(`nV = ${v} \\ge 1`, `n V = ${v} >= 1`, `*nV* = ${v} ≥ 1`)
    : math(`nV = ${v} < 1`, `n V = ${v} < 1`, `*nV* = ${v} < 1`);
}
