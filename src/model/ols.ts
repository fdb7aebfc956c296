/**
 * Ordinary least squares from the Householder QR of the preconditioned design (see design.ts):
 * residuals e = Q [0; (Q'y)_(k+1..n)], coefficients from R beta = (Q'y)_(1..k) mapped back to the
 * caller's columns, and their standard errors from sigma^2 (X'X)^-1.
 */
import { DwError } from '../errors.js';
import { applyQ, applyQt } from '../linalg/qr.js';
import { designErrorAllowance, type FactoredDesign } from './design.js';
import { POLICY } from '../policy.js';

/**
 * Largest rounding error in d that a fit may carry. Rounding in the design and the fit moves the
 * residuals by about condition x 2^-52 x ||y - ybar|| (measured: {@link designErrorAllowance}), so
 * d moves by that allowance times the amplification ||y - ybar|| / ||e||. A fit whose allowance
 * exceeds this is refused with RESIDUALS_ZERO: y is then, to working precision, a linear
 * combination of the regressors (for a well-conditioned design: ||e|| below about 2e-8 ||y - ybar||).
 */
export const D_ROUNDING_LIMIT = POLICY.tolerances.D_ROUNDING_LIMIT;

/** One estimated coefficient. */
export interface Coefficient {
  name: string;
  estimate: number;
  stdError: number;
}

/** A least-squares fit. */
export interface LeastSquaresFit {
  coefficients: Coefficient[];
  residuals: Float64Array;
  /** Residual sum of squares. */
  rss: number;
  /** rss / (n - k). */
  sigma2: number;
  /** Coefficient of determination (centred when the model has an intercept). */
  rSquared: number;
  /** Covariance matrix of the coefficients, row-major k x k. */
  covariance: Float64Array;
  /**
   * ||y - ybar|| / ||e|| (||y|| / ||e|| without an intercept): how much rounding in the fit is
   * amplified in the residuals; `designErrorAllowance(condition, amplification)` bounds the
   * rounding error of d.
   */
  amplification: number;
}

/**
 * Fit y on the factored design.
 *
 * @example
 * ```ts
 * const fit = fitLeastSquares(factorDesign(buildDesign({ t: [1, 2, 3, 4] }, 4)), [1, 3, 2, 5]);
 * fit.coefficients[1].estimate; // slope 1.1
 * ```
 */
export function fitLeastSquares(fd: FactoredDesign, y: ArrayLike<number>): LeastSquaresFit {
  const { design, qr, shift, scale } = fd;
  const { n, k, names, interceptIndex, x } = design;
  if (y.length !== n) {
    throw new DwError('LENGTH_MISMATCH', `y has ${y.length} values but the design has ${n} rows.`, 'Give one y per observation.');
  }
  for (let i = 0; i < n; i++) {
    if (typeof y[i] !== 'number' || !Number.isFinite(y[i])) {
      throw new DwError(typeof y[i] === 'number' ? 'CELL_NOT_FINITE' : 'CELL_NOT_NUMERIC', `y has the value ${String(y[i])} at observation ${i + 1}.`,
        'Every value must be a finite number; remove or fill the observation.', { row: i + 1, value: String(y[i]) });
    }
  }
  let constant = true;
  for (let i = 1; i < n; i++) if (y[i] !== y[0]) constant = false;
  if (constant) {
    throw new DwError('RESIDUALS_ZERO', `y is constant (every value is ${y[0]}), so ${interceptIndex >= 0 || y[0] === 0 ? 'every residual is zero and d is undefined' : 'it carries no information about serial correlation'}.`,
      'Check that the right column was chosen as y.');
  }
  // Work in y / 2^e (exact) so that squares neither overflow nor underflow, and, when the model
  // has an intercept, about the mean of y: the mean lies in col(X), so the residuals are the same,
  // and rounding then scales with the spread of y rather than its level (y -> a y + b leaves d as it is).
  let top = 0;
  for (let i = 0; i < n; i++) top = Math.max(top, Math.abs(y[i]));
  const pow = 2 ** Math.floor(Math.log2(top));
  const yc = new Float64Array(n);
  let ybar = 0;
  for (let i = 0; i < n; i++) yc[i] = y[i] / pow;
  if (interceptIndex >= 0) {
    for (let i = 0; i < n; i++) ybar += yc[i];
    ybar /= n;
    for (let i = 0; i < n; i++) yc[i] -= ybar;
  }
  let spread = 0;
  for (let i = 0; i < n; i++) spread = Math.max(spread, Math.abs(yc[i]));
  const ys = pow * spread; // y_c = y - ybar * pow, held as yc * pow = (qty-scaled) * ys
  const qty = new Float64Array(n);
  for (let i = 0; i < n; i++) qty[i] = yc[i] / spread;
  applyQt(qr, qty);
  // coefficients of the preconditioned columns: R beta = (Q'y)_(1..k)
  const beta = new Float64Array(k);
  const r = (i: number, j: number) => qr.qr[j * n + i];
  for (let i = k - 1; i >= 0; i--) {
    let s = qty[i];
    for (let j = i + 1; j < k; j++) s -= r(i, j) * beta[j];
    beta[i] = s / r(i, i);
  }
  const resid = new Float64Array(n);
  for (let i = k; i < n; i++) resid[i] = qty[i];
  applyQ(qr, resid);
  let rssScaled = 0;
  for (let i = k; i < n; i++) rssScaled += qty[i] * qty[i];
  // residuals at rounding level: y is (numerically) a combination of the regressors and d would
  // be computed from rounding noise
  let yy = 0;
  for (let i = 0; i < n; i++) yy += (yc[i] / spread) ** 2;
  const amplification = Math.sqrt(yy) / Math.sqrt(rssScaled);
  if (!(designErrorAllowance(fd.condition, amplification) <= D_ROUNDING_LIMIT)) {
    const zero = rssScaled === 0;
    throw new DwError('RESIDUALS_ZERO',
      `y is ${zero ? 'an exact' : 'numerically a'} linear combination of the regressors (the residuals are ${zero ? 'zero' : `${(1 / amplification).toExponential(1)} of the spread of y, within rounding noise`}), so d is ${zero ? 'undefined' : 'not determined to 1e-8'}.`,
      'Check that y (or a copy or sum of it) is not among the regressors.');
  }
  // (R'R)^-1 = R^-1 R^-T
  const rinv = new Float64Array(k * k); // row-major upper triangular
  for (let c = 0; c < k; c++) {
    for (let i = c; i >= 0; i--) {
      let s = i === c ? 1 : 0;
      for (let j = i + 1; j <= c; j++) s -= r(i, j) * rinv[j * k + c];
      rinv[i * k + c] = s / r(i, i);
    }
  }
  // map back: b = T beta with T[j][j] = 1/scale_j, T[int][j] = -shift_j / (scale_j * c0)
  const t = new Float64Array(k * k);
  const c0 = interceptIndex >= 0 ? x[interceptIndex * n] : 1;
  for (let j = 0; j < k; j++) {
    t[j * k + j] = 1 / scale[j];
    if (interceptIndex >= 0 && j !== interceptIndex) t[interceptIndex * k + j] = -shift[j] / (scale[j] * c0);
  }
  const sigma2Scaled = rssScaled / (n - k);
  // C = T R^-1 (R^-1)' T' sigma^2
  const tr = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) {
    let s = 0;
    for (let l = 0; l < k; l++) s += t[i * k + l] * rinv[l * k + j];
    tr[i * k + j] = s;
  }
  const cov = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) {
    let s = 0;
    for (let l = 0; l < k; l++) s += tr[i * k + l] * tr[j * k + l];
    cov[i * k + j] = s * sigma2Scaled * ys * ys;
  }
  const coefficients: Coefficient[] = [];
  for (let i = 0; i < k; i++) {
    let b = 0;
    for (let l = 0; l < k; l++) b += t[i * k + l] * beta[l];
    // the mean of y taken out above goes back into the intercept
    const level = i === interceptIndex ? (ybar * pow) / c0 : 0;
    coefficients.push({ name: names[i], estimate: b * ys + level, stdError: Math.sqrt(Math.max(0, cov[i * k + i])) });
  }
  for (let i = 0; i < n; i++) resid[i] *= ys;
  // R^2: 1 - rss / tss, tss about the mean when the model has an intercept in effect (yy is that
  // when the intercept is a column; when the columns only span the constant, centre here)
  let tss = yy;
  if (interceptIndex < 0 && fd.spansConstant) {
    let m = 0;
    for (let i = 0; i < n; i++) m += yc[i] / spread;
    m /= n;
    tss = 0;
    for (let i = 0; i < n; i++) tss += (yc[i] / spread - m) ** 2;
  }
  const rSquared = tss > 0 ? 1 - rssScaled / tss : NaN;
  return {
    coefficients,
    residuals: resid,
    rss: rssScaled * ys * ys,
    sigma2: sigma2Scaled * ys * ys,
    rSquared,
    covariance: cov,
    amplification,
  };
}
