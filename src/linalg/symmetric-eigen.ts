/**
 * Eigenvalues (only) of a dense real symmetric matrix: Householder reduction to tridiagonal form,
 * then bisection on Sturm counts (Golub & Van Loan, Matrix Computations, sections 8.3 and 8.4).
 * O(4/3 m^3) for the reduction, O(m^2) per significant bit for bisection. Bisection is chosen for
 * robustness: every eigenvalue is bracketed independently, ties and clusters need no special care,
 * and the absolute accuracy is a small multiple of eps * ||T||.
 */

/**
 * Reduce the dense symmetric m x m matrix `a` (row-major, overwritten) to tridiagonal form.
 * Returns the diagonal and the off-diagonal (length m - 1).
 *
 * @example
 * ```ts
 * tridiagonalize(Float64Array.of(4, 1, 2,  1, 3, 0,  2, 0, 5), 3);
 * // { diag: [4, 4.6, 3.4], off: [-2.2361, -0.8] }: same eigenvalues, trace 12 kept
 * ```
 */
export function tridiagonalize(a: Float64Array, m: number): { diag: Float64Array; off: Float64Array } {
  const diag = new Float64Array(m);
  const off = new Float64Array(Math.max(0, m - 1));
  const v = new Float64Array(m);
  const p = new Float64Array(m);
  for (let k = 0; k < m - 2; k++) {
    // x = a[k+1..m-1, k]
    let scale = 0;
    for (let i = k + 1; i < m; i++) scale = Math.max(scale, Math.abs(a[i * m + k]));
    diag[k] = a[k * m + k];
    if (scale === 0) { off[k] = 0; continue; }
    let s = 0;
    for (let i = k + 1; i < m; i++) { const t = a[i * m + k] / scale; v[i] = t; s += t * t; }
    const norm = Math.sqrt(s);
    const alpha = v[k + 1] >= 0 ? -norm : norm;
    v[k + 1] -= alpha;
    let vv = 0;
    for (let i = k + 1; i < m; i++) vv += v[i] * v[i];
    off[k] = alpha * scale;
    if (vv === 0) continue;
    const beta = 2 / vv;
    // p = beta * A22 v
    for (let i = k + 1; i < m; i++) {
      const row = i * m;
      let acc = 0;
      for (let j = k + 1; j < m; j++) acc += a[row + j] * v[j];
      p[i] = beta * acc;
    }
    let vp = 0;
    for (let i = k + 1; i < m; i++) vp += v[i] * p[i];
    const kk = 0.5 * beta * vp;
    for (let i = k + 1; i < m; i++) p[i] -= kk * v[i];
    // A22 -= v p' + p v' (lower and upper, keep symmetric)
    for (let i = k + 1; i < m; i++) {
      const row = i * m;
      const vi = v[i];
      const pi = p[i];
      for (let j = k + 1; j <= i; j++) {
        const val = a[row + j] - vi * p[j] - pi * v[j];
        a[row + j] = val;
        a[j * m + i] = val;
      }
    }
  }
  if (m >= 2) {
    diag[m - 2] = a[(m - 2) * m + m - 2];
    diag[m - 1] = a[(m - 1) * m + m - 1];
    off[m - 2] = a[(m - 1) * m + m - 2];
  } else if (m === 1) {
    diag[0] = a[0];
  }
  return { diag, off };
}

/**
 * Number of eigenvalues of the tridiagonal (diag, off) strictly less than x (Sturm count).
 * `off2` holds the squared off-diagonal; a pivot smaller than `pivmin` in magnitude is replaced
 * by -pivmin.
 *
 * @example
 * ```ts
 * // diag (2, 2, 2), off (1, 1): eigenvalues 2 - sqrt 2, 2, 2 + sqrt 2
 * sturmCount(Float64Array.of(2, 2, 2), Float64Array.of(1, 1), 2.5, 1e-300); // 2
 * ```
 */
export function sturmCount(diag: Float64Array, off2: Float64Array, x: number, pivmin: number): number {
  let count = 0;
  let q = diag[0] - x;
  if (Math.abs(q) < pivmin) q = -pivmin;
  if (q < 0) count++;
  for (let i = 1; i < diag.length; i++) {
    q = diag[i] - x - off2[i - 1] / q;
    if (Math.abs(q) < pivmin) q = -pivmin;
    if (q < 0) count++;
  }
  return count;
}

/**
 * All eigenvalues of a symmetric tridiagonal matrix, ascending, by bisection.
 *
 * @example
 * ```ts
 * tridiagonalEigenvalues(Float64Array.of(2, 2), Float64Array.of(1)); // [1, 3]
 * ```
 */
export function tridiagonalEigenvalues(diag: Float64Array, off: Float64Array): Float64Array {
  const m = diag.length;
  const out = new Float64Array(m);
  if (m === 0) return out;
  const off2 = new Float64Array(Math.max(0, m - 1));
  let lo = Infinity;
  let hi = -Infinity;
  let norm = 0;
  for (let i = 0; i < m; i++) {
    const r = (i > 0 ? Math.abs(off[i - 1]) : 0) + (i < m - 1 ? Math.abs(off[i]) : 0);
    lo = Math.min(lo, diag[i] - r);
    hi = Math.max(hi, diag[i] + r);
    norm = Math.max(norm, Math.abs(diag[i]) + r);
    if (i < m - 1) off2[i] = off[i] * off[i];
  }
  if (norm === 0) return out;
  const pivmin = Number.MIN_VALUE * 1e10 + norm * 1e-300;
  const tol = 2 * Number.EPSILON * norm;
  lo -= tol;
  hi += tol;
  // bracket each eigenvalue in turn, reusing the bracket of the previous one as a lower end
  let left = lo;
  for (let j = 0; j < m; j++) {
    let a = left;
    let b = hi;
    while (b - a > tol && b - a > 4 * Number.EPSILON * Math.max(Math.abs(a), Math.abs(b))) {
      const mid = 0.5 * (a + b);
      if (mid === a || mid === b) break;
      if (sturmCount(diag, off2, mid, pivmin) > j) b = mid;
      else a = mid;
    }
    out[j] = 0.5 * (a + b);
    left = a;
  }
  return out;
}

/**
 * Eigenvalues of a dense symmetric m x m matrix (row-major; overwritten), ascending.
 *
 * @example
 * ```ts
 * symmetricEigenvalues(Float64Array.of(2, 1, 1, 2), 2); // [1, 3]
 * ```
 */
export function symmetricEigenvalues(a: Float64Array, m: number): Float64Array {
  const { diag, off } = tridiagonalize(a, m);
  return tridiagonalEigenvalues(diag, off);
}
