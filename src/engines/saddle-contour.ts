/**
 * Small tails with relative accuracy, for any spectrum (ties included): the Laplace inversion of
 * the distribution of Q = sum lambda_j z_j^2 along a vertical line through the saddlepoint.
 *
 * With M(s) = E exp(sQ) = prod (1 - 2 s lambda_j)^(-1/2), defined for 1 - 2 s lambda_j > 0, and any
 * sigma < 0 in that strip (Laplace inversion of the CDF; e.g. Feller, An Introduction to Probability
 * Theory, vol. II, chapter XIII; the choice of line as in saddlepoint methods, Daniels 1954,
 * Ann. Math. Statist. 25, 631-650):
 *
 *   P(Q <= 0) = -(1/pi) Integral_0^inf Re[ M(sigma + i t) / (sigma + i t) ] dt.
 *
 * Imhof's integral is the same inversion on the line sigma = 0, where the result comes out as
 * 1/2 minus a number near 1/2 and a small tail keeps only absolute accuracy. Moving the line to the
 * minimiser sigma* of g(sigma) = log M(sigma) - log(-sigma) (a convex function) makes the integrand
 * of one sign near t = 0 and of the size of the answer, so the probability carries relative
 * accuracy however small it is. Truncation at T: |1 - 2 s lambda_j| >= 2 t |lambda_j| and
 * |s| >= t give a tail of at most T^(-m/2) / ((m/2) pi prod (2|lambda_j|)^(1/2)).
 */
import { adaptiveIntegrate } from '../numeric/quadrature.js';
import { exactTail } from '../core/exact-tail.js';
import type { Tail, TailProbability } from '../core/types.js';
import { POLICY } from '../policy.js';

/**
 * P(d <= c) (lower) or P(d >= c) (upper) for the spectrum `nu` by the shifted inversion. Meant for
 * the small tail (where it keeps relative accuracy); valid everywhere inside the support.
 *
 * @example
 * ```ts
 * contourTail(nu, nu[0] + 0.01, 'lower'); // { p: 3.2e-19, relativeError: 1e-10, ... }
 * ```
 */
export function contourTail(nu: Float64Array, c: number, tail: Tail, relTolerance = POLICY.tolerances.CONTOUR_RELATIVE_TOLERANCE): TailProbability {
  const m = nu.length;
  const below = tail === 'lower';
  if (c <= nu[0]) return exactTail(below ? 0 : 1, 'saddlepoint');
  if (c >= nu[m - 1]) return exactTail(below ? 1 : 0, 'saddlepoint');
  const lambda = new Float64Array(m);
  let minL = Infinity, maxAbs = 0;
  for (let j = 0; j < m; j++) {
    lambda[j] = below ? nu[j] - c : c - nu[j];
    minL = Math.min(minL, lambda[j]);
    maxAbs = Math.max(maxAbs, Math.abs(lambda[j]));
  }
  // strip: sigma in (1 / (2 min lambda), 0), min lambda < 0 inside the support
  const left = 1 / (2 * minL);
  // g'(sigma) = sum lambda / (1 - 2 sigma lambda) - 1/sigma: increasing; find its zero by bisection
  const gPrime = (s: number) => {
    let acc = 0;
    for (let j = 0; j < m; j++) acc += lambda[j] / (1 - 2 * s * lambda[j]);
    return acc - 1 / s;
  };
  let a = left, b = 0;
  for (let it = 0; it < 200; it++) {
    const mid = 0.5 * (a + b);
    if (mid === a || mid === b) break;
    if (gPrime(mid) > 0) b = mid; else a = mid;
  }
  const sigma = 0.5 * (a + b);
  // g(sigma) and g''(sigma)
  let logM0 = 0, g2 = 1 / (sigma * sigma), sumLog2 = 0, count = 0;
  for (let j = 0; j < m; j++) {
    const w = 1 - 2 * sigma * lambda[j];
    logM0 -= 0.5 * Math.log(w);
    g2 += (2 * lambda[j] * lambda[j]) / (w * w);
    const al = Math.abs(lambda[j]);
    if (al > 1e-13 * maxAbs) { count++; sumLog2 += Math.log(2 * al); }
  }
  const g0 = logM0 - Math.log(-sigma);
  // normalised integrand: Re[M(s)/s] / exp(g0), which is -1 at t = 0
  const f = (t: number): number => {
    let re = 0, im = 0;
    for (let j = 0; j < m; j++) {
      const ar = 1 - 2 * sigma * lambda[j];
      const ai = -2 * t * lambda[j];
      re += 0.5 * Math.log(ar * ar + ai * ai);
      im += Math.atan2(ai, ar);
    }
    // log(M/s) = -(1/2)(re + i im) - log(sigma + i t)
    const lr = -0.5 * re - 0.5 * Math.log(sigma * sigma + t * t) - g0;
    const li = -0.5 * im - Math.atan2(t, sigma);
    return Math.exp(lr) * Math.cos(li);
  };
  // truncation: tail <= T^(-s/2) / ((s/2) pi prod (2|lambda|)^(1/2)) in absolute terms, relative to exp(g0)
  const scale = 1 / Math.sqrt(g2);
  const targetAbs = relTolerance * scale; // the normalised integral is of the order of scale
  const logT = (2 / count) * (-Math.log((count / 2) * targetAbs * 0.25) - 0.5 * sumLog2 - g0);
  const upper = Math.max(Math.exp(logT), 50 * scale);
  const truncation = Math.exp(-(count / 2) * Math.log(upper) - 0.5 * sumLog2 - g0) / (count / 2);
  const breaks = [0];
  for (let x = 0.25 * scale; x < upper; x *= 2) breaks.push(x);
  breaks.push(upper);
  const q = adaptiveIntegrate(f, breaks, targetAbs * 0.5, 6000);
  const integral = -q.value; // of the normalised integrand, times -1
  const p = (Math.exp(g0) * integral) / Math.PI;
  const errAbsNorm = q.error + truncation;
  const relativeError = integral > 0 ? errAbsNorm / integral : Infinity;
  const pc = Math.min(1, Math.max(0, p));
  return { p: pc, errorBound: pc * relativeError + 4 * Number.EPSILON * pc, relativeError, method: 'saddlepoint' };
}

