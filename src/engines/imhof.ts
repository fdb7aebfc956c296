/**
 * Imhof's integral (Imhof 1961, Biometrika 48, 419-426) for Q = sum lambda_j z_j^2:
 *
 *   P(Q > 0) = 1/2 + (1/pi) Integral_0^inf sin(theta(u)) / (u rho(u)) du,
 *   theta(u) = (1/2) sum arctan(lambda_j u),   rho(u) = prod (1 + lambda_j^2 u^2)^(1/4).
 *
 * With lambda_j = nu_j - c, P(d <= c) = P(Q <= 0) (docs/methods.md section 2). The integral is cut at U
 * with the truncation bound (docs/methods.md section 3)
 *
 *   T(U) = 1 / (pi (s/2) U^(s/2) prod_{j in S} |lambda_j|^(1/2))   for any subset S of s weights,
 *
 * (|sin| <= 1 and rho(u) >= prod_S (|lambda_j| u)^(1/2)), and [0, U] is integrated by globally
 * adaptive Gauss-Kronrod on geometric panels. The reported error bound is T(U) plus the summed
 * |K15 - G7| estimates plus a rounding allowance. Absolute accuracy: small tail probabilities come
 * out as 1/2 minus a number near 1/2, so relative accuracy in the far tails is the Pan engine's job.
 */
import { adaptiveIntegrate } from '../numeric/quadrature.js';
import { exactTail } from '../core/exact-tail.js';
import { convexityCut, probabilityTailBound } from '../numeric/convexity-cut.js';
import type { CharacteristicForm, Tail, TailProbability } from '../core/types.js';
import { POLICY } from '../policy.js';

/** Options shared by the Imhof-type engines. */
export interface ImhofOptions {
  /** Target absolute error of the probability (default 1e-11). */
  tolerance?: number;
  /** Maximum number of Gauss-Kronrod panels (default 4000). */
  maxPanels?: number;
}

/** Raw result of Imhof's integral: P(Q <= 0) and an absolute error bound. */
export interface ImhofIntegral {
  p: number;
  errorBound: number;
  evaluations: number;
  converged: boolean;
}

/**
 * P(Q <= 0) for the quadratic form described by `form`.
 *
 * @example
 * ```ts
 * integrateImhof(spectralForm(Float64Array.of(-1, 1), 0)).p; // 0.5 by symmetry
 * ```
 */
export function integrateImhof(form: CharacteristicForm, options: ImhofOptions = {}): ImhofIntegral {
  const tol = options.tolerance ?? POLICY.tolerances.PROBABILITY_TOLERANCE;
  const { m, sumLogAbsLambda, maxAbsLambda, sumLambda } = form;
  if (!(maxAbsLambda > 0) || m === 0) {
    // Q is identically zero: P(Q <= 0) = 1
    return { p: 1, errorBound: 0, evaluations: 0, converged: true };
  }
  // Truncation point: T(U) = tol / 4
  const logU = (2 / m) * (-Math.log((Math.PI * m * tol) / 8) - 0.5 * sumLogAbsLambda);
  const upper = Math.exp(logU);
  const truncation = 1 / (Math.PI * (m / 2) * Math.exp((m / 2) * logU + 0.5 * sumLogAbsLambda));
  const out = new Float64Array(2);
  const integrand = (u: number): number => {
    if (u === 0) return 0.5 * sumLambda;
    form.evaluate(u, out);
    return Math.sin(out[0]) / (u * Math.exp(out[1]));
  };
  // A form with a floored weight sum (the eigen-free engine) vouches for T(U) only up to
  // U <= validBelow; beyond it the cut is placed by the convexity bound instead, which holds for
  // any weights (src/numeric/convexity-cut.ts)
  let cutAt = upper;
  let cutBound = truncation;
  let extra = 0;
  if (form.truncationValidBelow !== undefined && upper > form.truncationValidBelow) {
    const start = Math.min(upper, Math.max(form.truncationValidBelow, 0.25 / maxAbsLambda));
    const cut = convexityCut((u) => { extra++; form.evaluate(u, out); return out[1]; }, start, tol / 4, probabilityTailBound);
    cutAt = cut.upper;
    cutBound = cut.truncation;
  }
  const breaks = geometricBreaks(cutAt, maxAbsLambda);
  const q = adaptiveIntegrate(integrand, breaks, Math.PI * tol * 0.5, options.maxPanels ?? 4000);
  const p = 0.5 - q.value / Math.PI;
  const errorBound = cutBound + q.error / Math.PI + 4 * Number.EPSILON;
  return { p: Math.min(1, Math.max(0, p)), errorBound, evaluations: q.evaluations + extra, converged: q.converged && Number.isFinite(cutBound) };
}

/** Break points 0, b, 2b, 4b, ... up to `upper`, with b a small multiple of 1 / max|lambda|. */
function geometricBreaks(upper: number, maxAbsLambda: number): number[] {
  const breaks = [0];
  let b = 0.25 / maxAbsLambda;
  while (b < upper) { breaks.push(b); b *= 2; }
  breaks.push(upper);
  return breaks;
}

/**
 * The weights lambda_j = sign (nu_j - c) of Imhof's integrand and the summaries its truncation bound
 * needs: the count and log-product of the weights that are not zero to rounding, their sum and
 * largest magnitude. Shared by every spectral form of this folder.
 *
 * @example
 * ```ts
 * spectralWeights(Float64Array.from([0.5, 1, 2, 3]), 1.5).summary.maxAbsLambda; // 1.5
 * ```
 */
export function spectralWeights(nu: Float64Array, c: number, sign: 1 | -1 = 1): {
  lambda: Float64Array;
  /** The summaries of a characteristic form (everything but `evaluate`). */
  summary: { m: number; sumLambda: number; sumLogAbsLambda: number; maxAbsLambda: number };
} {
  const m = nu.length;
  const lambda = new Float64Array(m);
  let maxAbs = 0;
  let sum = 0;
  for (let j = 0; j < m; j++) {
    lambda[j] = sign * (nu[j] - c);
    maxAbs = Math.max(maxAbs, Math.abs(lambda[j]));
    sum += lambda[j];
  }
  let count = 0;
  let sumLog = 0;
  for (let j = 0; j < m; j++) {
    const a = Math.abs(lambda[j]);
    if (a > 1e-13 * maxAbs) { count++; sumLog += Math.log(a); }
  }
  return { lambda, summary: { m: count, sumLambda: sum, sumLogAbsLambda: sumLog, maxAbsLambda: maxAbs } };
}

/**
 * The characteristic form of Q = sign * sum (nu_j - c) z_j^2 from an explicit spectrum. Weights
 * smaller than 1e-13 times the largest are left out of the truncation bound (they still enter
 * theta and rho), which keeps the bound valid and the cut point finite when c hits an eigenvalue.
 *
 * @example
 * ```ts
 * const form = spectralForm(Float64Array.from([0.5, 1, 2, 3]), 1.5);
 * form.m;            // 4
 * form.maxAbsLambda; // 1.5 (the weights nu_j - c are -1, -0.5, 0.5, 1.5)
 * ```
 */
export function spectralForm(nu: Float64Array, c: number, sign: 1 | -1 = 1): CharacteristicForm {
  const { lambda, summary } = spectralWeights(nu, c, sign);
  const m = lambda.length;
  return {
    ...summary,
    evaluate(u: number, out: Float64Array): void {
      let theta = 0;
      let logRho = 0;
      for (let j = 0; j < m; j++) {
        const x = lambda[j] * u;
        theta += Math.atan(x);
        logRho += Math.log1p(x * x);
      }
      out[0] = 0.5 * theta;
      out[1] = 0.25 * logRho;
    },
  };
}

/**
 * The exact density of d at c, the derivative of Imhof's form of P(d <= c) with respect to c:
 *
 *   f(c) = (1/pi) Integral_0^inf [cos(theta) (1/2) sum 1/(1 + lambda^2 u^2)
 *                               - sin(theta) (1/2) sum lambda u/(1 + lambda^2 u^2)] / rho(u) du.
 *
 * Returns the value and an error estimate (quadrature plus truncation of a u^(-2-s/2) tail).
 *
 * @example
 * ```ts
 * imhofDensity(Float64Array.of(1, 3), 2).value; // arcsine density 1 / (pi sqrt((c - 1)(3 - c))) = 1/pi
 * ```
 */
export function imhofDensity(nu: Float64Array, c: number, options: ImhofOptions = {}): { value: number; errorBound: number } {
  const m = nu.length;
  if (c <= nu[0] || c >= nu[m - 1]) return { value: 0, errorBound: 0 };
  const tol = options.tolerance ?? POLICY.tolerances.DENSITY_TOLERANCE;
  const lambda = new Float64Array(m);
  let maxAbs = 0;
  for (let j = 0; j < m; j++) { lambda[j] = nu[j] - c; maxAbs = Math.max(maxAbs, Math.abs(lambda[j])); }
  let s = 0;
  let sumLog = 0;
  let minAbs = Infinity;
  for (let j = 0; j < m; j++) {
    const a = Math.abs(lambda[j]);
    if (a > 1e-13 * maxAbs) { s++; sumLog += Math.log(a); minAbs = Math.min(minAbs, a); }
  }
  const f = (u: number): number => {
    let theta = 0, logRho = 0, a = 0, b = 0;
    for (let j = 0; j < m; j++) {
      const x = lambda[j] * u;
      const q = 1 / (1 + x * x);
      theta += Math.atan(x);
      logRho += Math.log1p(x * x);
      a += q;
      b += x * q;
    }
    theta *= 0.5;
    return (0.5 * (Math.cos(theta) * a - Math.sin(theta) * b)) / Math.exp(0.25 * logRho);
  };
  // For u >= 1/min_S |lambda|: each weight in S contributes at most 1/(|lambda| u) to the bracket
  // (1/(lambda^2 u^2) + 1/(|lambda| u) halved), each tiny weight at most 3/4, and
  // rho(u) >= prod_S (|lambda| u)^(1/2). Integrate that bound from U to infinity and double U until
  // it is below a quarter of the tolerance.
  let sumInv = 0;
  for (let j = 0; j < m; j++) {
    const a = Math.abs(lambda[j]);
    if (a > 1e-13 * maxAbs) sumInv += 1 / a;
  }
  const tiny = m - s;
  const tailBound = (u: number): number => {
    const r = Math.exp(-(s / 2) * Math.log(u) - 0.5 * sumLog);
    let t = (sumInv * r) / (s / 2);
    if (tiny > 0) t = s > 2 ? t + (0.75 * tiny * u * r) / (s / 2 - 1) : Infinity;
    return t / Math.PI;
  };
  let upper = 1 / minAbs;
  while (tailBound(upper) > tol / 4 && upper < 1e300) upper *= 2;
  const truncation = tailBound(upper);
  const q = adaptiveIntegrate(f, geometricBreaks(upper, maxAbs), Math.PI * tol * 0.5);
  return { value: Math.max(0, q.value / Math.PI), errorBound: truncation + q.error / Math.PI };
}
