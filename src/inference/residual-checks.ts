/**
 * Checks on the residuals and columns of a test: caller's residuals must be least-squares
 * residuals of the design (orthogonal to col(X), up to rounding, which is projected out);
 * a regressor that looks like a time index with gaps; a regressor that is y lagged one period;
 * the first-order autocorrelation r1 = sum e_t e_{t-1} / sum e_t^2 of the residuals.
 */
import { DwError } from '../errors.js';
import { differencePairs } from '../core/difference.js';
import type { DwProblem } from '../problem/problem.js';
import { detectLaggedDependent } from '../dynamic/lagged-dependent.js';
import type { DwWarning } from './warnings.js';

/** Whether a regressor of the prepared design is y lagged one period (the detection of src/dynamic/lagged-dependent.ts). */
export function laggedDependentPresent(y: ArrayLike<number>, problem: DwProblem, times?: ArrayLike<number>): boolean {
  const { n, names, x, interceptAdded } = problem.factored.design;
  const columns: Record<string, Float64Array> = {};
  names.forEach((nm, j) => { if (!(interceptAdded && j === 0)) columns[nm] = x.subarray(j * n, j * n + n); });
  return detectLaggedDependent(y, columns, times) !== null;
}

/** Residuals whose component in col(X) is larger than this (relative) are refused. */
export const RESIDUAL_DRIFT_LIMIT = 1e-3;

/**
 * Check residuals given by the caller against the design: least-squares residuals are orthogonal
 * to every column of X. Rounding (e.g. residuals exported with 6 significant digits) leaves a small
 * component in col(X): it is removed (e <- M e) and a note says so. A large component means the
 * residuals come from another model, and their d would be read against the wrong distribution:
 * that is refused.
 *
 * @example
 * ```ts
 * const { residuals, warnings } = checkResiduals(prepareProblem(x, n), e);
 * ```
 */
export function checkResiduals(problem: DwProblem, e: Float64Array): { residuals: Float64Array; warnings: DwWarning[] } {
  const drift = orthogonalityDrift(problem, e);
  if (drift > RESIDUAL_DRIFT_LIMIT) {
    throw new DwError('RESIDUALS_NOT_FROM_DESIGN',
      `These residuals are not least-squares residuals of this design: their component in the space of the regressors is ${(100 * drift).toPrecision(2)}% of their size (it would be 0).`,
      'Give the residuals of a fit on exactly these columns (the intercept included, unless the model has none), or give y and let exact-dw fit it.');
  }
  if (!(drift > 1e-12)) return { residuals: e, warnings: [] };
  const basis = problem.distribution.source.basis!;
  const { n, k, q } = basis;
  const out = Float64Array.from(e);
  for (let j = 0; j < k; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += q[j * n + i] * out[i];
    for (let i = 0; i < n; i++) out[i] -= s * q[j * n + i];
  }
  const warnings: DwWarning[] = drift > 1e-8 ? [{ code: 'RESIDUALS_PROJECTED', drift }] : [];
  return { residuals: out, warnings };
}

/**
 * The name of a regressor that looks like an integer time index with gaps (strictly increasing
 * whole numbers with at least one step larger than the smallest step), or null.
 */
export function timeLikeColumn(x: Float64Array, n: number, names: string[]): string | null {
  for (let j = 0; j < names.length; j++) {
    const o = j * n;
    let increasing = true, minStep = Infinity, maxStep = 0;
    for (let i = 0; i < n; i++) {
      const v = x[o + i];
      if (!Number.isInteger(v)) { increasing = false; break; }
      if (i > 0) {
        const step = v - x[o + i - 1];
        if (!(step > 0)) { increasing = false; break; }
        minStep = Math.min(minStep, step);
        maxStep = Math.max(maxStep, step);
      }
    }
    if (increasing && n > 2 && maxStep > minStep) return names[j];
  }
  return null;
}

/**
 * sum e_t e_{t-1} / sum e_t^2 over the pairs of observations one period apart (gaps honoured);
 * null when no two observations are one period apart (e.g. quarterly dates read as monthly).
 *
 * @example
 * ```ts
 * firstOrderAutocorrelation(Float64Array.of(1, -1, 1, -1)); // -0.75
 * ```
 */
export function firstOrderAutocorrelation(e: Float64Array, times?: ArrayLike<number>): number | null {
  // the pairs one period apart (as differencePairs builds them for lag 1); none: no estimate
  let num = 0, den = 0, pairs = 0;
  for (let t = 1; t < e.length; t++) {
    if (times !== undefined && times[t] - times[t - 1] !== 1) continue;
    num += e[t] * e[t - 1];
    pairs++;
  }
  if (pairs === 0) return null;
  for (let t = 0; t < e.length; t++) den += e[t] * e[t];
  return den > 0 ? num / den : 0;
}

/** ||Q'e|| / ||e|| for the basis Q of col(X). */
function orthogonalityDrift(problem: DwProblem, e: Float64Array): number {
  const basis = problem.distribution.source.basis;
  if (!basis) return 0;
  const { n, k, q } = basis;
  let big = 0;
  for (let i = 0; i < n; i++) big = Math.max(big, Math.abs(e[i]));
  if (big === 0) return 0;
  let ee = 0, proj = 0;
  for (let i = 0; i < n; i++) ee += (e[i] / big) ** 2;
  for (let j = 0; j < k; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += q[j * n + i] * (e[i] / big);
    proj += s * s;
  }
  return Math.sqrt(proj / ee);
}
