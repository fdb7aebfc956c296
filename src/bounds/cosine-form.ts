/**
 * Imhof's phase and modulus for a bounding spectrum in O(k') operations per point instead of O(m).
 *
 * The bounding spectra (spectra.ts) are runs of consecutive eigenvalues lambda_j = 2 - 2 cos(pi j / n)
 * of the difference matrix. For Q = sign * sum_{j in S} (lambda_j - c) z_j^2, Imhof's integrand
 * (Imhof 1961, Biometrika 48, 419-426; docs/methods.md section 3) needs
 *
 *   G_S(u) = sum_{j in S} log(1 + i u (lambda_j - c)),   theta = sign Im G_S / 2,   log rho = Re G_S / 2.
 *
 * Over the full set F = {1, ..., n-1} the product is a Chebyshev polynomial of the second kind,
 * U_{n-1}(y) = 2^(n-1) prod_{j=1..n-1} (y - cos(pi j / n)) (a standard identity):
 *
 *   prod_{j in F} (1 + i u (lambda_j - c)) = (i u)^(n-1) U_{n-1}(y),   y = 1 - c/2 - i/(2u).
 *
 * With psi = arcsin(y) (principal branch; Im psi < 0 because Im y < 0) and U_{n-1}(cos phi) =
 * sin(n phi) / sin(phi), phi = pi/2 - psi, the continuous branch (the sum of the principal logarithms,
 * each of argument in (-pi/2, pi/2)) is
 *
 *   G_F(u) = (n - 1) (log u + i psi) + Log(1 - q_n) - Log(1 - q_1),   q_N = (-1)^N exp(-2 i N psi),
 *
 * where |q_N| = exp(2 N Im psi) < 1, so both logarithms are principal and continuous; no multiple
 * of 2 pi i is missing, because both sides are continuous on the lower half-plane of y and agree as
 * u -> 0 (y -> -i infinity), where G_F -> 0. G_S then follows by subtracting the few terms of F outside S (k' of them for the
 * tables' bounds) and adding lambda_0 = 0 when S contains it (the no-intercept lower bound).
 * arcsin is evaluated in the cancellation-free form of Hull, Fairgrieve & Tang (1997, ACM TOMS 23,
 * 299-335), so that theta keeps full relative accuracy as u -> 0.
 */
import type { CharacteristicForm } from '../core/types.js';
import { differenceEigenvalue, type BoundIndices } from './spectra.js';

/**
 * The characteristic form of Q = sign * sum_{j = first .. first + m - 1} (lambda_j - c) z_j^2 for the
 * eigenvalues lambda_j of the n x n first-difference matrix, evaluated through the Chebyshev closed
 * form when that is cheaper than the direct sum (always for the published tables' ranges).
 *
 * @example
 * ```ts
 * const f = cosineSpectrumForm(20, { first: 1, m: 18 }, 1.2);
 * integrateImhof(f).p; // P(d_L <= 1.2) for n = 20, k' = 1: about 0.05
 * ```
 */
export function cosineSpectrumForm(n: number, idx: BoundIndices, c: number, sign: 1 | -1 = 1): CharacteristicForm {
  const { first, m } = idx;
  const last = first + m - 1;
  let maxAbs = 0;
  let sum = 0;
  const ell = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    ell[i] = differenceEigenvalue(n, first + i) - c;
    maxAbs = Math.max(maxAbs, Math.abs(ell[i]));
    sum += ell[i];
  }
  let count = 0;
  let sumLog = 0;
  for (let i = 0; i < m; i++) {
    const a = Math.abs(ell[i]);
    if (a > 1e-13 * maxAbs) { count++; sumLog += Math.log(a); }
  }
  // corrections to the full set F = {1..n-1}: indices of F outside S are subtracted, j = 0 is added
  const minus: number[] = [];
  for (let j = 1; j < Math.max(1, first); j++) minus.push(differenceEigenvalue(n, j) - c);
  for (let j = last + 1; j <= n - 1; j++) minus.push(differenceEigenvalue(n, j) - c);
  const plus: number[] = first === 0 ? [-c] : [];
  const closed = minus.length + plus.length + 8 < m && c > 0 && c < 4;
  const minusW = Float64Array.from(minus);
  const plusW = Float64Array.from(plus);
  const x = 1 - c / 2;
  const evaluate = closed
    ? (u: number, out: Float64Array): void => {
        chebyshevLog(n, x, u, out);
        let re = out[1];
        let im = out[0];
        // pairs of factors at once: (1 + i t1)(1 + i t2) = (1 - t1 t2) + i (t1 + t2) has its argument
        // arctan t1 + arctan t2 inside (-pi, pi), so one atan2 gives it exactly; |.|^2 = (1 + t1^2)(1 + t2^2)
        let i = 0;
        for (; i + 1 < minusW.length; i += 2) {
          const t1 = minusW[i] * u, t2 = minusW[i + 1] * u;
          const a1 = t1 * t1, a2 = t2 * t2;
          im -= Math.atan2(t1 + t2, 1 - t1 * t2);
          re -= 0.5 * Math.log1p(a1 + a2 + a1 * a2);
        }
        for (; i < minusW.length; i++) {
          const t = minusW[i] * u;
          im -= Math.atan(t);
          re -= 0.5 * Math.log1p(t * t);
        }
        for (let j = 0; j < plusW.length; j++) {
          const t = plusW[j] * u;
          im += Math.atan(t);
          re += 0.5 * Math.log1p(t * t);
        }
        out[0] = 0.5 * sign * im;
        out[1] = 0.5 * re;
      }
    : (u: number, out: Float64Array): void => {
        let theta = 0;
        let logRho = 0;
        for (let i = 0; i < m; i++) {
          const t = ell[i] * u;
          theta += Math.atan(t);
          logRho += Math.log1p(t * t);
        }
        out[0] = 0.5 * sign * theta;
        out[1] = 0.25 * logRho;
      };
  return { m: count, sumLambda: sign * sum, sumLogAbsLambda: sumLog, maxAbsLambda: maxAbs, evaluate };
}

/**
 * The full-set sum G_F(u) = sum_{j=1..n-1} log(1 + i u (lambda_j - c)): out[0] = Im G_F,
 * out[1] = Re G_F. Requires -1 < x = 1 - c/2 < 1 and u > 0.
 *
 * @example
 * ```ts
 * const out = new Float64Array(2);
 * chebyshevLog(20, 1 - 1.2 / 2, 0.5, out); // out[0] = sum_j arctan(0.5 (lambda_j - 1.2)), j = 1..19
 * ```
 */
export function chebyshevLog(n: number, x: number, u: number, out: Float64Array): void {
  const v = -0.5 / u; // y = x + i v, v < 0
  const v2 = v * v;
  const r = Math.hypot(x + 1, v); // |y + 1|
  const s = Math.hypot(x - 1, v); // |y - 1|
  const a = 0.5 * (r + s); // >= 1
  const t1 = v2 / (r + (1 + x)); // r - (1 + x), without cancellation
  const t2 = v2 / (s + (1 - x)); // s - (1 - x)
  const am1 = 0.5 * (t1 + t2); // a - 1
  const amx = 0.5 * (t1 + s + (1 - x)); // a - x
  const rePsi = Math.atan2(x, Math.sqrt((a + x) * amx)); // Re arcsin(y), Hull-Fairgrieve-Tang
  const b = Math.log1p(am1 + Math.sqrt(am1 * (a + 1))); // -Im arcsin(y) = acosh(a) > 0
  // Log(1 - q_N), q_N = (-1)^N exp(-2 N b) (cos(2 N Re psi) - i sin(2 N Re psi)); N = n, then N = 1
  logOneMinusQ(n, rePsi, b, out);
  const nRe = out[1];
  const nIm = out[0];
  logOneMinusQ(1, rePsi, b, out);
  out[0] = (n - 1) * rePsi + nIm - out[0];
  // log u + b = log(u (a + sqrt(a^2 - 1))): the product form avoids cancelling log u against b as u -> 0
  const logUB = b < 1 ? Math.log(u) + b : Math.log(u * (a + Math.sqrt(am1 * (a + 1))));
  out[1] = (n - 1) * logUB + nRe - out[1];
}

/** out[0] = Im Log(1 - q_N), out[1] = Re Log(1 - q_N), with |q_N| = exp(-2 N b) < 1. */
function logOneMinusQ(N: number, rePsi: number, b: number, out: Float64Array): void {
  const mag = Math.exp(-2 * N * b) * (N % 2 === 0 ? 1 : -1);
  const ang = 2 * N * rePsi;
  const qr = mag * Math.cos(ang);
  const qi = -mag * Math.sin(ang);
  const abs2 = qr * qr + qi * qi;
  out[1] = abs2 < 0.25 ? 0.5 * Math.log1p(abs2 - 2 * qr) : Math.log(Math.hypot(1 - qr, qi));
  out[0] = Math.atan2(-qi, 1 - qr);
}
