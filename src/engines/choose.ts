/**
 * Engine choice. `auto` answers with the engine best suited to the request and says why:
 *
 *   1. a design with n above {@link AUTO_SPECTRUM_MAX_N} goes to the DCT eigenbasis route when its
 *      operator is a difference operator (every operator `differenceMatrix` builds: any lag, gaps):
 *      the eigenbasis is known in closed form, one fast DCT per column gives the regressors in it,
 *      and each evaluation is O(n k^2) of plain loops with the integral cut on the scale of the
 *      integrand, which makes it faster than the eigen-free sweep at every such n (bench/large-n.ts);
 *      any other band operator goes to the eigen-free engine (no eigenvalues at all). If the answer
 *      is a small tail without relative accuracy and n allows the structured spectrum, the tail
 *      engines below take over;
 *   2. otherwise Imhof's integral on the spectrum (absolute error <= 1e-10, any spectrum, ties too);
 *   3. when that probability is small enough that its absolute bound is a poor relative one
 *      (relative error above {@link AUTO_RELATIVE_TARGET}), Pan's finite-range form answers instead
 *      if it applies (distinct eigenvalues, acceptable cancellation): it computes the small tail
 *      directly with relative accuracy. Where it does not apply (ties, clusters, cancellation), the
 *      tail goes to the Laplace inversion on a line through the saddlepoint (saddle-contour.ts),
 *      which keeps relative accuracy for any spectrum, ties included.
 *
 * Callers may force an engine with `method`; a forced engine that cannot answer raises
 * ENGINE_NOT_APPLICABLE with the reason, never a wrong number.
 */
import { DwError, isDwError } from '../errors.js';
import { FAST_SPECTRUM_MAX_N } from '../core/fast-spectrum.js';
import type { MethodChoice, Tail, TailProbability } from '../core/types.js';
import { integrateImhof } from './imhof.js';
import { imhofTail } from './imhof-product.js';
import { panApplicable, panTail } from './pan.js';
import { eigenfreeForm } from './eigenfree.js';
import { contourTail } from './saddle-contour.js';
import { dctEigenbasis, dctTail } from './dct.js';
import type { NullSource } from '../core/source.js';
import { POLICY } from '../policy.js';

/** Above this n, `auto` avoids computing a spectrum that is not already known. */
export const AUTO_SPECTRUM_MAX_N = POLICY.limits.AUTO_SPECTRUM_MAX_N;
/** Relative error above which `auto` hands a tail probability to Pan's engine. */
export const AUTO_RELATIVE_TARGET = POLICY.tolerances.AUTO_RELATIVE_TARGET;

/** Options for a tail probability. */
export interface EngineOptions {
  method?: MethodChoice;
  /** Target absolute error (default 1e-11). */
  tolerance?: number;
}

function eigenfree(source: NullSource, c: number, tail: Tail, tolerance?: number): TailProbability {
  if (!source.operator || !source.basis) {
    throw new DwError('ENGINE_NOT_APPLICABLE', 'The eigen-free engine needs a design (operator and regressors), not a bare spectrum.',
      "Choose the Imhof or Pan engine (method 'imhof' or 'pan') for a given spectrum.", { suggest: [{ option: 'method', value: 'imhof' }, { option: 'method', value: 'pan' }] });
  }
  const below = tail === 'lower';
  const r = integrateImhof(eigenfreeForm(source.operator, source.basis, c, below ? 1 : -1), { tolerance });
  return { p: r.p, errorBound: r.errorBound, relativeError: r.p > 0 ? r.errorBound / r.p : Infinity, method: 'eigenfree' };
}

function dct(source: NullSource, c: number, tail: Tail, tolerance?: number): TailProbability {
  if (!source.operator || !source.basis) {
    throw new DwError('ENGINE_NOT_APPLICABLE', 'The DCT route needs a design (operator and regressors), not a bare spectrum.',
      "Choose the Imhof or Pan engine (method 'imhof' or 'pan') for a given spectrum.", { suggest: [{ option: 'method', value: 'imhof' }, { option: 'method', value: 'pan' }] });
  }
  return dctTail(source.operator, source.basis, c, tail, { tolerance });
}

/**
 * True when the source is a design whose operator the DCT route takes (a union of chains).
 *
 * @example
 * ```ts
 * dctApplies(prepareProblem({ t: [1, 2, 3, 4, 5, 6] }, 6).distribution.source); // true
 * dctApplies(spectrumSource(Float64Array.of(1, 3)));                         // false: no design
 * ```
 */
export function dctApplies(source: NullSource): boolean {
  return !!(source.operator && source.basis && dctEigenbasis(source.operator, source.basis) !== null);
}

/**
 * P(d <= c) or P(d >= c) from the engine chosen by `options.method`.
 *
 * @example
 * ```ts
 * tailProbability(spectrumSource(nu), 1.3, 'lower', { method: 'auto' }).method; // 'imhof'
 * ```
 */
export function tailProbability(source: NullSource, c: number, tail: Tail, options: EngineOptions = {}): TailProbability {
  const method = options.method ?? 'auto';
  const tolerance = options.tolerance;
  switch (method) {
    case 'imhof':
      return imhofTail(source.spectrum(), c, tail, { tolerance });
    case 'pan': {
      const nu = source.spectrum();
      const ok = panApplicable(nu, c);
      if (!ok.ok) {
        throw new DwError('ENGINE_NOT_APPLICABLE', `Pan's engine does not apply here: ${ok.reason}.`, "Choose method 'auto' or 'imhof'.",
          { suggest: [{ option: 'method', value: 'auto' }, { option: 'method', value: 'imhof' }] });
      }
      return panTail(nu, c, tail, tolerance === undefined ? {} : { tolerance: Math.max(tolerance, POLICY.tolerances.PAN_TOLERANCE) });
    }
    case 'eigenfree':
      return eigenfree(source, c, tail, tolerance);
    case 'saddlepoint':
      return contourTail(source.spectrum(), c, tail);
    case 'dct':
      return dct(source, c, tail, tolerance);
    case 'auto':
      return auto(source, c, tail, tolerance);
    default:
      throw new DwError('OPTION_VALUE', `Unknown engine '${String(method)}'.`, 'Use auto, imhof, pan, eigenfree, saddlepoint or dct.');
  }
}

function auto(source: NullSource, c: number, tail: Tail, tolerance?: number): TailProbability {
  const n = source.basis?.n ?? 0;
  // the rule depends on the problem alone (never on what happens to be computed already), so the
  // same input always gets the same engine and the same number
  if (source.operator && n > AUTO_SPECTRUM_MAX_N) {
    const useDct = dctApplies(source);
    const ef = useDct ? dct(source, c, tail, tolerance) : eigenfree(source, c, tail, tolerance);
    const code = useDct ? 'LARGE_N_DCT' : 'LARGE_N_EIGENFREE';
    if ((ef.p > 0 && ef.relativeError <= AUTO_RELATIVE_TARGET) || (ef.p === 0 && ef.errorBound === 0)) {
      return { ...ef, reason: { code, n } };
    }
    if (n > FAST_SPECTRUM_MAX_N) {
      return { ...ef, reason: { code, n, smallTail: { relativeError: ef.relativeError } } };
    }
    // a small tail at moderate n: the spectrum (O(k n^2)) buys relative accuracy below
  }
  const nu = source.spectrum();
  const im = imhofTail(nu, c, tail, { tolerance });
  if (c <= nu[0] || c >= nu[nu.length - 1] || im.relativeError <= AUTO_RELATIVE_TARGET) {
    return { ...im, reason: { code: 'IMHOF_SPECTRUM' } };
  }
  // a small tail: Pan's form (when it applies) and the shifted inversion both aim at relative
  // accuracy; the one reporting the smaller relative error answers
  const ok = panApplicable(nu, c);
  let pan: TailProbability | null = null;
  if (ok.ok) {
    try { pan = panTail(nu, c, tail); } catch (err) {
      if (!isDwError(err)) throw err;
      pan = null; // Pan could not vouch for its number
    }
  }
  const shifted = contourTail(nu, c, tail);
  if (pan && pan.relativeError <= shifted.relativeError && pan.relativeError < im.relativeError) {
    return { ...pan, reason: { code: 'SMALL_TAIL_PAN' } };
  }
  if (shifted.relativeError < im.relativeError) {
    return { ...shifted, reason: { code: 'SMALL_TAIL_SADDLEPOINT', pan: ok.ok ? (pan ? 'less-accurate' : 'could-not-vouch') : 'not-applicable' } };
  }
  return { ...im, reason: { code: 'SMALL_TAIL_IMHOF', relativeError: im.relativeError } };
}
