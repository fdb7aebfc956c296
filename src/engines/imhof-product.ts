/**
 * Imhof's characteristic form from an explicit spectrum without a transcendental function per
 * weight. Imhof's (1961) theta and rho are the argument and the square root of the modulus of one
 * complex product:
 *
 *   prod_j (1 + i lambda_j u) = prod_j sqrt(1 + lambda_j^2 u^2) exp(i atan(lambda_j u))
 *                             = rho(u)^2 exp(2 i theta(u)),
 *
 * so one pass of complex multiplications (four products and two sums per weight) replaces m
 * arctangents and m logarithms; the pass keeps two running products (weights at even and at odd
 * positions), whose arguments add and whose moduli multiply, so that two independent chains of
 * multiplications run side by side, and two atan2 and one log finish the evaluation. theta must be the
 * continuous branch (the sum of principal arctangents), so the product's turns about the origin are
 * counted as it is formed: each factor turns it by less than pi/2, hence a change of sign of the
 * imaginary part while the real part is negative is a crossing of the negative real axis, counted
 * +1 (from the upper half plane, turning counter-clockwise) or -1. The count follows the computed
 * product itself, so the final atan2 and the count always agree. The modulus is kept in range by
 * exact powers of two, counted apart.
 *
 * Rounding: each complex multiplication has a relative (normwise) error below sqrt(2) * 2 eps, so
 * theta and log rho carry absolute errors of order m eps, the same order as the sums of m rounded
 * arctangents and logarithms of {@link spectralForm}; the two forms agree to about 1e-14 in the
 * probability (test/engines/imhof-product.test.ts), far inside the engines' error bounds. Used by the batch
 * (src/batch/fast-tail.ts), where Imhof's integral was most of the cost of a series at n ~ 50; the
 * same pass also gives the density of d (the derivative of Imhof's form in c) for one division per
 * weight more.
 */
import { integrateImhof, spectralWeights, type ImhofOptions } from './imhof.js';
import { XGK, WGK, WG } from '../numeric/quadrature.js';
import { exactTail } from '../core/exact-tail.js';
import type { CharacteristicForm, Tail, TailProbability } from '../core/types.js';

/** Rescale the product when its components exceed 2^200 (factors are at least 1 in modulus). */
const BIG = 2 ** 200;
const SMALL = 2 ** -200;
const LOG_BIG = 200 * Math.LN2;

/**
 * theta(u) into out[0] and log rho(u) into out[1] (see the file comment): two running products,
 * of the weights at even and at odd positions, each with its own count of turns and of rescalings,
 * so that the two chains of dependent multiplications run side by side; theta is the sum of their
 * continuous arguments and rho^4 the product of their squared moduli (each below 2^401, so the
 * product cannot overflow). With `density`, out[2] and out[3] receive sum 1/(1 + x_j^2) and
 * sum x_j/(1 + x_j^2), x_j = lambda_j u (the density's sums, {@link imhofProductWithDensity}).
 */
function productAt(lambda: Float64Array, m: number, u: number, out: Float64Array, density = false): void {
  let re1 = 1, im1 = 0, turns1 = 0, scale1 = 0;
  let re2 = 1, im2 = 0, turns2 = 0, scale2 = 0;
  let a = 0, b = 0;
  let j = 0;
  for (; j + 1 < m; j += 2) {
    const x1 = lambda[j] * u;
    const x2 = lambda[j + 1] * u;
    const nr1 = re1 - im1 * x1;
    const ni1 = im1 + re1 * x1;
    const nr2 = re2 - im2 * x2;
    const ni2 = im2 + re2 * x2;
    // upper half plane: im >= 0 (with -0 counted as upper, as the final atan2 below reads it)
    if (nr1 < 0 && (ni1 < 0) !== (im1 < 0)) turns1 += im1 < 0 ? -1 : 1;
    if (nr2 < 0 && (ni2 < 0) !== (im2 < 0)) turns2 += im2 < 0 ? -1 : 1;
    re1 = nr1; im1 = ni1;
    re2 = nr2; im2 = ni2;
    if (Math.abs(re1) > BIG || Math.abs(im1) > BIG) { re1 *= SMALL; im1 *= SMALL; scale1++; }
    if (Math.abs(re2) > BIG || Math.abs(im2) > BIG) { re2 *= SMALL; im2 *= SMALL; scale2++; }
    if (density) {
      const q1 = 1 / (1 + x1 * x1);
      const q2 = 1 / (1 + x2 * x2);
      a += q1 + q2;
      b += x1 * q1 + x2 * q2;
    }
  }
  if (j < m) {
    const x = lambda[j] * u;
    const nr = re1 - im1 * x;
    const ni = im1 + re1 * x;
    if (nr < 0 && (ni < 0) !== (im1 < 0)) turns1 += im1 < 0 ? -1 : 1;
    re1 = nr; im1 = ni;
    if (Math.abs(re1) > BIG || Math.abs(im1) > BIG) { re1 *= SMALL; im1 *= SMALL; scale1++; }
    if (density) {
      const q = 1 / (1 + x * x);
      a += q;
      b += x * q;
    }
  }
  const arg = Math.atan2(im1 === 0 ? 0 : im1, re1) + Math.atan2(im2 === 0 ? 0 : im2, re2) + 2 * Math.PI * (turns1 + turns2);
  out[0] = 0.5 * arg;
  out[1] = 0.25 * Math.log((re1 * re1 + im1 * im1) * (re2 * re2 + im2 * im2)) + 0.5 * (scale1 + scale2) * LOG_BIG;
  if (density) { out[2] = a; out[3] = b; }
}

/**
 * The characteristic form of Q = sign * sum (nu_j - c) z_j^2 from an explicit spectrum, evaluated
 * as a complex product (see the file comment). The same weights, m, sums and truncation data as
 * {@link spectralForm} (src/engines/imhof.ts); only `evaluate` differs, by rounding.
 *
 * @example
 * ```ts
 * const form = productSpectralForm(Float64Array.from([0.5, 1, 2, 3]), 1.5);
 * const out = new Float64Array(2);
 * form.evaluate(2, out); // out[0] = (atan(-2) + atan(-1) + atan(1) + atan(3)) / 2, out[1] = log rho(2)
 * ```
 */
export function productSpectralForm(nu: Float64Array, c: number, sign: 1 | -1 = 1): CharacteristicForm {
  const { lambda, summary } = spectralWeights(nu, c, sign);
  const m = lambda.length;
  return {
    ...summary,
    evaluate(u: number, out: Float64Array): void {
      productAt(lambda, m, u, out);
    },
  };
}

/**
 * P(d <= c) (`lower`) or P(d >= c) (`upper`) from the spectrum `nu` (ascending) by Imhof's integral
 * (src/engines/imhof.ts: `integrateImhof`, its cut and error bound) on the complex-product form of
 * its integrand (`productSpectralForm`, src/engines/imhof-product.ts).
 * The upper tail is computed directly as P(-Q <= 0), not as 1 - P(Q <= 0). Method `imhof`.
 *
 * @example
 * ```ts
 * const nu = Float64Array.from({ length: 18 }, (_, i) => 2 - 2 * Math.cos(Math.PI * (i + 1) / 20));
 * imhofTail(nu, 1.2, 'lower'); // { p: ~0.05, errorBound: < 1e-10, method: 'imhof', ... }
 * ```
 */
export function imhofTail(nu: Float64Array, c: number, tail: Tail, options: ImhofOptions = {}): TailProbability {
  const m = nu.length;
  const below = tail === 'lower';
  if (c <= nu[0]) return exactTail(below ? 0 : 1, 'imhof');
  if (c >= nu[m - 1]) return exactTail(below ? 1 : 0, 'imhof');
  const r = integrateImhof(productSpectralForm(nu, c, below ? 1 : -1), options);
  return { p: r.p, errorBound: r.errorBound, relativeError: r.p > 0 ? r.errorBound / r.p : Infinity, method: 'imhof' };
}



/** One panel of the pair: per integrand the Kronrod value, |K - G| and the sum of |f| w. */
interface PairPanel { a: number; b: number; v1: number; e1: number; s1: number; v2: number; e2: number; s2: number }

/** A tail probability and the density of d at the same point, with an error bound for the density. */
export interface TailAndDensity {
  tail: TailProbability;
  /** The density of d at c (the slope of either tail), or null when its truncation cannot be bounded at this cut. */
  density: number | null;
  /** Absolute error bound of `density` (quadrature estimate on the tail's nodes, truncation, rounding). */
  densityError: number;
}

/**
 * The tail at c by Imhof's integral (exactly `imhofTail(nu, c, tail)`: the same nodes,
 * cut and bound) and, from the same evaluations, the density of d at c: the derivative of Imhof's
 * form with respect to c (as `imhofDensity`, src/engines/imhof.ts),
 *
 *   f(c) = (1/pi) Integral_0^inf (1/2) [cos(theta) sum 1/(1 + x_j^2) - sin(theta) sum x_j/(1 + x_j^2)] / rho(u) du,
 *
 * x_j = lambda_j u, whose sums cost one division per weight beside the complex product. Its error
 * bound: the |K15 - G7| estimates on the tail's panels, plus 50 eps times the integral of |f|
 * (rounding), plus a truncation bound at the tail's cut U that holds at any U: the bracket is at
 * most n in modulus and rho(u) >= prod_S (|lambda_j| u)^(1/2), S the s weights above 1e-13 of the
 * largest, which integrates to (n/2) U^(1 - s/2) / (pi (s/2 - 1) prod_S |lambda_j|^(1/2)) for
 * s > 2 (about n U (s/2) / (s/2 - 1) times the tail's own truncation bound). For s <= 2 the
 * density is null. c must lie strictly inside (nu_1, nu_m).
 *
 * @example
 * ```ts
 * const nu = Float64Array.of(1, 3);
 * imhofProductWithDensity(nu, 2, 'lower').density; // 1 / pi: the arcsine density 1 / (pi sqrt((c - 1)(3 - c)))
 * ```
 */
export function imhofProductWithDensity(nu: Float64Array, c: number, tail: Tail, options: ImhofOptions = {}): TailAndDensity {
  const n = nu.length;
  if (!(c > nu[0] && c < nu[n - 1])) throw new RangeError('imhofProductWithDensity: c must lie strictly inside the support');
  const tol = options.tolerance ?? 1e-11;
  const { lambda: l, summary: w } = spectralWeights(nu, c, tail === 'lower' ? 1 : -1);
  const m = w.m;
  const logU = (2 / m) * (-Math.log((Math.PI * m * tol) / 8) - 0.5 * w.sumLogAbsLambda);
  const upper = Math.exp(logU);
  const truncation = 1 / (Math.PI * (m / 2) * Math.exp((m / 2) * logU + 0.5 * w.sumLogAbsLambda));
  const half = 0.5 * w.sumLambda;
  let g1 = 0;
  let g2 = 0;
  const form = new Float64Array(4);
  const at = (u: number): void => {
    if (u === 0) { g1 = half; g2 = 0.5 * n; return; }
    productAt(l, n, u, form, true);
    // exactly the arithmetic of productSpectralForm + integrateImhof's integrand
    const theta = form[0];
    const rho = Math.exp(form[1]);
    const sin = Math.sin(theta);
    g1 = sin / (u * rho);
    g2 = (0.5 * (Math.cos(theta) * form[2] - sin * form[3])) / rho;
  };
  const panels = adaptivePair(at, () => g1, () => g2, upper, w.maxAbsLambda, Math.PI * tol * 0.5, options.maxPanels ?? 4000);
  const p = Math.min(1, Math.max(0, 0.5 - panels[0] / Math.PI));
  const errorBound = truncation + (panels[1] + 50 * Number.EPSILON * panels[2]) / Math.PI + 4 * Number.EPSILON;
  const result: TailProbability = { p, errorBound, relativeError: p > 0 ? errorBound / p : Infinity, method: 'imhof' };
  // truncation of the density integral at U: |cos(theta) a - sin(theta) b| <= |sum 1/(1 + i x_j)|
  // <= n and rho(u) >= prod_S (|lambda_j| u)^(1/2) (S: the weights above 1e-13 of the largest), so
  // the integrand is at most (n/2) u^(-s/2) prod_S |lambda_j|^(-1/2), whose integral over [U, inf)
  // is (n/2) U^(1 - s/2) / ((s/2 - 1) prod_S |lambda_j|^(1/2)) for s > 2; for s <= 2 no bound
  if (m <= 2) return { tail: result, density: null, densityError: Infinity };
  const tb = (0.5 * n * Math.exp((1 - m / 2) * logU - 0.5 * w.sumLogAbsLambda)) / (m / 2 - 1);
  const densityError = tb / Math.PI + (panels[4] + 50 * Number.EPSILON * panels[5]) / Math.PI;
  return { tail: result, density: Math.max(0, panels[3] / Math.PI), densityError };
}

/**
 * The adaptive Gauss-Kronrod loop of `adaptiveIntegrate` (src/core/quadrature.ts) on the geometric
 * breaks of `integrateImhof`, for two integrands evaluated together by `at` (read back by `first`
 * and `second`), split by the error of the first. Returns the sums [value, |K - G|, sum |f| w] of
 * the first, then of the second.
 */
function adaptivePair(at: (u: number) => void, first: () => number, second: () => number, upper: number, maxAbs: number, target: number, maxPanels: number): number[] {
  const panel = (a: number, b: number): PairPanel => {
    const half = 0.5 * (b - a);
    const mid = 0.5 * (a + b);
    at(mid);
    let g1 = first(), g2 = second();
    let k1 = WGK[7] * g1, q1 = WG[3] * g1, s1 = WGK[7] * Math.abs(g1);
    let k2 = WGK[7] * g2, q2 = WG[3] * g2, s2 = WGK[7] * Math.abs(g2);
    for (let j = 0; j < 7; j++) {
      const dx = half * XGK[j];
      at(mid - dx);
      const f1 = first(), h1 = second();
      at(mid + dx);
      const f2 = first(), h2 = second();
      k1 += WGK[j] * (f1 + f2);
      s1 += WGK[j] * (Math.abs(f1) + Math.abs(f2));
      k2 += WGK[j] * (h1 + h2);
      s2 += WGK[j] * (Math.abs(h1) + Math.abs(h2));
      if (j % 2 === 1) { q1 += WG[(j - 1) / 2] * (f1 + f2); q2 += WG[(j - 1) / 2] * (h1 + h2); }
    }
    return {
      a, b, v1: k1 * half, e1: Math.abs((k1 - q1) * half), s1: s1 * Math.abs(half),
      v2: k2 * half, e2: Math.abs((k2 - q2) * half), s2: s2 * Math.abs(half),
    };
  };
  const breaks = [0];
  for (let b = 0.25 / maxAbs; b < upper; b *= 2) breaks.push(b);
  breaks.push(upper);
  const panels: PairPanel[] = [];
  for (let i = 0; i + 1 < breaks.length; i++) if (breaks[i + 1] > breaks[i]) panels.push(panel(breaks[i], breaks[i + 1]));
  let used = panels.length;
  const sums = (): number[] => {
    let v1 = 0, e1 = 0, s1 = 0, v2 = 0, e2 = 0, s2 = 0;
    for (const p of panels) { v1 += p.v1; e1 += p.e1; s1 += p.s1; v2 += p.v2; e2 += p.e2; s2 += p.s2; }
    return [v1, e1, s1, v2, e2, s2];
  };
  let t = sums();
  while (t[1] + 50 * Number.EPSILON * t[2] > target && used < maxPanels) {
    let worst = 0;
    for (let i = 1; i < panels.length; i++) if (panels[i].e1 > panels[worst].e1) worst = i;
    const p = panels[worst];
    const mid = 0.5 * (p.a + p.b);
    if (!(mid > p.a && mid < p.b)) break;
    panels[worst] = panel(p.a, mid);
    panels.push(panel(mid, p.b));
    used += 1;
    t = sums();
  }
  return t;
}
