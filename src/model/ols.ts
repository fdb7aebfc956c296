/**
 * Ordinary least squares from the Householder QR of the preconditioned design (see design.ts):
 * residuals e = Q [0; (Q'y)_(k+1..n)], coefficients from R beta = (Q'y)_(1..k) mapped back to the
 * caller's columns, and their standard errors from sigma^2 (X'X)^-1.
 */
import { DwError } from '../errors.js';
import { applyQ, applyQt } from '../core/qr.js';
import type { FactoredDesign } from './design.js';

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
  let yBig = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(y[i])) {
      throw new DwError('CELL_NOT_FINITE', `y has the value ${y[i]} at observation ${i + 1}.`,
        'Every value must be a finite number; remove or fill the observation.', { row: i + 1, value: String(y[i]) });
    }
    yBig = Math.max(yBig, Math.abs(y[i]));
  }
  // work in y / yBig so that squares neither overflow nor underflow
  const ys = yBig > 0 ? yBig : 1;
  const qty = new Float64Array(n);
  for (let i = 0; i < n; i++) qty[i] = y[i] / ys;
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
  for (let i = 0; i < n; i++) yy += (y[i] / ys) ** 2;
  if (!(Math.sqrt(rssScaled) > 1e-12 * Math.sqrt(yy))) {
    let constant = true;
    for (let i = 1; i < n; i++) if (y[i] !== y[0]) constant = false;
    throw new DwError('RESIDUALS_ZERO',
      constant ? 'y is constant, so every residual is zero and d is undefined.'
        : 'y is an exact linear combination of the regressors (the residuals are zero up to rounding), so d is undefined.',
      constant ? 'Check that the right column was chosen as y.' : 'Check that y (or a copy of it) is not among the regressors.');
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
    coefficients.push({ name: names[i], estimate: b * ys, stdError: Math.sqrt(Math.max(0, cov[i * k + i])) });
  }
  for (let i = 0; i < n; i++) resid[i] *= ys;
  // R^2: 1 - rss / tss (tss about the mean when the model has an intercept)
  let mean = 0;
  if (interceptIndex >= 0) for (let i = 0; i < n; i++) mean += y[i] / ys / n;
  let tss = 0;
  for (let i = 0; i < n; i++) { const v = y[i] / ys - mean; tss += v * v; }
  const rSquared = tss > 0 ? 1 - rssScaled / tss : NaN;
  return {
    coefficients,
    residuals: resid,
    rss: rssScaled * ys * ys,
    sigma2: sigma2Scaled * ys * ys,
    rSquared,
    covariance: cov,
  };
}
