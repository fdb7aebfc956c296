/**
 * The weights of d's distribution under AR(1) errors (docs/methods.md section 6).
 *
 * With u ~ N(0, S_rho), S_rho[i, j] = rho^|t_i - t_j| / (1 - rho^2) (stationary AR(1) errors), and
 * Z an orthonormal basis of the complement of col(X), the residuals are e = Z w with w = Z'u ~
 * N(0, Z'S Z). Writing Z'S Z = G G' (Cholesky) and w = G z, z ~ N(0, I_m):
 *
 *   P(d <= c | rho) = P( z' G' (Z'AZ - cI) G z <= 0 ) = P( sum_i w_i z_i^2 <= 0 ),
 *
 * where w_i are the eigenvalues of the m x m symmetric matrix G'(Z'AZ - cI)G = G'TG - c G'G,
 * T = Z'AZ. These are the nonzero eigenvalues of L' M (A - cI) M L, L L' = S_rho (the two matrices
 * are similar on the complement). The positive factor 1 / (1 - rho^2) does not change the sign of
 * the quadratic form and is left out. With observation times the process runs on the integer time
 * axis and the covariance uses |t_i - t_j|, so gaps are honoured; the 'seasonal' process
 * u_t = rho u_{t-J} + eps_t (Wallis 1972's alternative for quarterly data, J = 4) has
 * S[i, j] = rho^(|t_i - t_j| / J) when J divides |t_i - t_j|, else 0.
 *
 * Cost per rho: O(n^2 k) for Z'SZ by two-sided Householder reflections, O(m^3) for the Cholesky
 * factor, the products and the eigenvalues. The eigen-free route for large n, which needs no
 * weights because S_rho^-1 is tridiagonal (docs/methods.md section 5), is in eigenfree-power.ts.
 */
import { DwError } from '../errors.js';
import { bandToDense } from '../core/difference.js';
import { congruence, type HouseholderQR } from '../linalg/qr.js';
import { symmetricEigenvalues } from '../linalg/symmetric-eigen.js';
import type { BandMatrix } from '../core/types.js';

/** The autocorrelated error process under the alternative. */
export type ErrorProcess = 'ar1' | 'seasonal';

/** What stays fixed while rho varies: the factored design, the operator and T = Z'AZ. */
export interface PowerContext {
  n: number;
  k: number;
  m: number;
  /** Householder QR of X (its trailing n - k columns of Q span the complement Z). */
  qr: HouseholderQR;
  /** Observation times (0..n-1 when the caller gave none). */
  times: Float64Array;
  /** Lag of the statistic (sets the step of the seasonal process). */
  lag: number;
  /** T = Z'AZ, row-major m x m. */
  t: Float64Array;
}

/**
 * Precompute T = Z'AZ for a design and operator.
 *
 * @example
 * ```ts
 * const p = prepareProblem({ trend }, n);
 * const ctx = powerContext(p.factored.qr, p.operator, p.pairs.lag);
 * ```
 */
export function powerContext(qr: HouseholderQR, operator: BandMatrix, lag: number, times?: ArrayLike<number>): PowerContext {
  const { n, k } = qr;
  const m = n - k;
  const full = congruence(qr, bandToDense(operator));
  const t = trailingBlock(full, n, k);
  const tt = new Float64Array(n);
  for (let i = 0; i < n; i++) tt[i] = times ? times[i] : i;
  return { n, k, m, qr, times: tt, lag, t };
}

/**
 * Check that rho lies in the open interval (-1, 1); RHO_OUT_OF_RANGE otherwise.
 *
 * @example
 * ```ts
 * checkRho(0.5); // passes
 * checkRho(1);   // throws DwError RHO_OUT_OF_RANGE
 * ```
 */
export function checkRho(rho: number): void {
  if (!(Number.isFinite(rho) && rho > -1 && rho < 1)) {
    throw new DwError('RHO_OUT_OF_RANGE', `The autocorrelation rho = ${rho} is outside the open interval (-1, 1).`,
      'A stationary AR(1) process needs -1 < rho < 1; give values such as 0.3 or -0.5.', { value: String(rho) });
  }
}

/**
 * The covariance of the errors at the observation times, up to the positive factor 1 / (1 - rho^2):
 * rho^|t_i - t_j| (ar1), or rho^(|t_i - t_j| / J) when the lag J divides |t_i - t_j| and 0
 * otherwise (seasonal). Dense, row-major n x n.
 *
 * @example
 * ```ts
 * errorCovariance(ctx, 0.5)[1]; // 0.5: neighbouring observations
 * ```
 */
export function errorCovariance(ctx: PowerContext, rho: number, process: ErrorProcess = 'ar1'): Float64Array {
  const { n, times, lag } = ctx;
  const s = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    s[i * n + i] = 1;
    for (let j = 0; j < i; j++) {
      const gap = Math.abs(times[i] - times[j]);
      let v: number;
      if (process === 'ar1') v = rho === 0 ? 0 : Math.pow(rho, gap);
      else v = gap % lag === 0 && rho !== 0 ? Math.pow(rho, gap / lag) : 0;
      s[i * n + j] = v;
      s[j * n + i] = v;
    }
  }
  return s;
}

/**
 * For one rho, the two m x m matrices H1 = G'TG and H2 = G'G, so that the weights at any c are
 * the eigenvalues of H1 - c H2.
 */
export interface RhoFactor {
  rho: number;
  h1: Float64Array;
  h2: Float64Array;
}

/**
 * Factor Z'S_rho Z = G G' and form G'TG and G'G. Throws NOT_CONVERGED when Z'SZ is not
 * numerically positive definite (rho extremely close to -1 or 1).
 *
 * @example
 * ```ts
 * const f = rhoFactor(ctx, 0.6);
 * weightsAt(f, ctx.m, 1.4); // weights at c = 1.4
 * weightsAt(f, ctx.m, 2.6); // and at c = 2.6, from the same factor
 * ```
 */
export function rhoFactor(ctx: PowerContext, rho: number, process: ErrorProcess = 'ar1'): RhoFactor {
  checkRho(rho);
  const { n, k, m, qr, t } = ctx;
  const w = trailingBlock(congruence(qr, errorCovariance(ctx, rho, process)), n, k);
  const g = cholesky(w, m, rho);
  // TG (m x m), G lower triangular: (TG)[i][j] = sum_{l >= j} T[i][l] G[l][j]; loops ordered so
  // that the innermost one runs along rows (contiguous memory)
  const tg = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    const ti = i * m;
    for (let l = 0; l < m; l++) {
      const til = t[ti + l];
      if (til === 0) continue;
      const gl = l * m;
      for (let j = 0; j <= l; j++) tg[ti + j] += til * g[gl + j];
    }
  }
  // H1 = G'(TG) and H2 = G'G, lower triangles: H[i][j] = sum_{l >= i} G[l][i] Y[l][j], j <= i
  const h1 = new Float64Array(m * m);
  const h2 = new Float64Array(m * m);
  for (let l = 0; l < m; l++) {
    const gl = l * m;
    for (let i = 0; i <= l; i++) {
      const gli = g[gl + i];
      if (gli === 0) continue;
      const hi = i * m;
      for (let j = 0; j <= i; j++) {
        h1[hi + j] += gli * tg[gl + j];
        h2[hi + j] += gli * g[gl + j];
      }
    }
  }
  // both are symmetric: mirror the lower triangles
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < i; j++) {
      h1[j * m + i] = h1[i * m + j];
      h2[j * m + i] = h2[i * m + j];
    }
  }
  return { rho, h1, h2 };
}

/**
 * The weights w (ascending) with P(d <= c | rho) = P(sum w_i z_i^2 <= 0).
 *
 * @example
 * ```ts
 * const w = powerWeights(ctx, 1.5, 0.3); // eigenvalues of G'(Z'AZ - 1.5 I)G
 * ```
 */
export function powerWeights(ctx: PowerContext, c: number, rho: number, process: ErrorProcess = 'ar1'): Float64Array {
  return weightsAt(rhoFactor(ctx, rho, process), ctx.m, c);
}

/**
 * The weights at c: eigenvalues of H1 - c H2 = G'(Z'AZ - cI)G, ascending.
 *
 * @example
 * ```ts
 * weightsAt(rhoFactor(ctx, 0), ctx.m, c); // nu_i - c: at rho = 0 the null spectrum shifted by c
 * ```
 */
export function weightsAt(f: RhoFactor, m: number, c: number): Float64Array {
  const a = new Float64Array(m * m);
  for (let i = 0; i < m * m; i++) a[i] = f.h1[i] - c * f.h2[i];
  return symmetricEigenvalues(a, m);
}

/** The trailing (n - k) x (n - k) block of a row-major n x n matrix. */
function trailingBlock(s: Float64Array, n: number, k: number): Float64Array {
  const m = n - k;
  const out = new Float64Array(m * m);
  for (let i = 0; i < m; i++) out.set(s.subarray((i + k) * n + k, (i + k) * n + n), i * m);
  // symmetrise against rounding in the two-sided reflections
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < i; j++) {
      const v = 0.5 * (out[i * m + j] + out[j * m + i]);
      out[i * m + j] = v;
      out[j * m + i] = v;
    }
  }
  return out;
}

/** Lower Cholesky factor G (row-major m x m) of a symmetric positive definite matrix. */
function cholesky(a: Float64Array, m: number, rho: number): Float64Array {
  const g = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    let s = a[j * m + j];
    for (let l = 0; l < j; l++) s -= g[j * m + l] * g[j * m + l];
    if (!(s > 1e-14 * Math.abs(a[j * m + j]))) {
      throw new DwError('NOT_CONVERGED',
        `The error covariance at rho = ${rho} is too close to singular on the residual space for an exact power computation.`,
        'Use a value of rho further from -1 and 1 (|rho| <= 0.999 is safe for ordinary designs).', { value: String(rho) });
    }
    const d = Math.sqrt(s);
    g[j * m + j] = d;
    for (let i = j + 1; i < m; i++) {
      let v = a[i * m + j];
      for (let l = 0; l < j; l++) v -= g[i * m + l] * g[j * m + l];
      g[i * m + j] = v / d;
    }
  }
  return g;
}
