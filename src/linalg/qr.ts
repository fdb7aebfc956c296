/**
 * Householder QR of an n x k design, with rank detection (Golub & Van Loan, Matrix Computations,
 * section 5.2). Reflectors are kept in factored form: H_j = I - beta_j v_j v_j', v_j stored below
 * the diagonal of column j with v_j[j] = 1 implicit. Q = H_1 ... H_k; the first k columns of Q
 * span col(X), the last n - k span its orthogonal complement.
 */
/**
 * An orthonormal basis of col(X): `q` is n x k, column-major (column j occupies
 * q[j*n .. j*n + n - 1]). Q'Q = I to working precision.
 */
export interface ColumnBasis {
  n: number;
  k: number;
  q: Float64Array;
}

/** A Householder QR factorisation in factored form. */
export interface HouseholderQR {
  n: number;
  k: number;
  /** Column-major n x k: R on and above the diagonal, reflector tails below it. */
  qr: Float64Array;
  /** beta_j of each reflector (0 when the reflector is the identity). */
  beta: Float64Array;
  /** Diagonal of R. */
  rdiag: Float64Array;
}

/**
 * Factorise X (column-major n x k, not modified) as X = Q R.
 *
 * @example
 * ```ts
 * const f = householderQR(Float64Array.from([1, 1, 1, 1, 2, 3]), 3, 2);
 * f.rdiag; // |R_11| = sqrt(3), ...
 * ```
 */
export function householderQR(x: Float64Array, n: number, k: number): HouseholderQR {
  const qr = Float64Array.from(x);
  const beta = new Float64Array(k);
  const rdiag = new Float64Array(k);
  for (let j = 0; j < k && j < n; j++) {
    const off = j * n;
    // norm of the part of column j on and below the diagonal, scaled against overflow
    let scale = 0;
    for (let i = j; i < n; i++) scale = Math.max(scale, Math.abs(qr[off + i]));
    if (scale === 0) { beta[j] = 0; rdiag[j] = 0; continue; }
    let s = 0;
    for (let i = j; i < n; i++) { const v = qr[off + i] / scale; s += v * v; }
    const norm = scale * Math.sqrt(s);
    const x0 = qr[off + j];
    const alpha = x0 >= 0 ? -norm : norm;
    const v0 = x0 - alpha;
    // v = (1, x_{j+1..}/v0), beta = -v0 / alpha
    for (let i = j + 1; i < n; i++) qr[off + i] /= v0;
    beta[j] = -v0 / alpha;
    rdiag[j] = alpha;
    qr[off + j] = alpha;
    // apply H_j to the remaining columns
    for (let c = j + 1; c < k; c++) {
      const oc = c * n;
      let dot = qr[oc + j];
      for (let i = j + 1; i < n; i++) dot += qr[off + i] * qr[oc + i];
      const f = beta[j] * dot;
      qr[oc + j] -= f;
      for (let i = j + 1; i < n; i++) qr[oc + i] -= f * qr[off + i];
    }
  }
  return { n, k, qr, beta, rdiag };
}

/** Apply H_j (in place) to a vector of length n. */
function reflect(f: HouseholderQR, j: number, y: Float64Array): void {
  const { n, qr, beta } = f;
  if (beta[j] === 0) return;
  const off = j * n;
  let dot = y[j];
  for (let i = j + 1; i < n; i++) dot += qr[off + i] * y[i];
  const s = beta[j] * dot;
  y[j] -= s;
  for (let i = j + 1; i < n; i++) y[i] -= s * qr[off + i];
}

/**
 * y <- Q' y (in place; returns y). The first k entries are the coordinates of y in col(X), the
 * last n - k those of its residual: their sum of squares is the residual sum of squares.
 *
 * @example
 * ```ts
 * const f = householderQR(Float64Array.of(1, 1, 1, 1), 4, 1); // intercept only
 * applyQt(f, Float64Array.of(1, 2, 3, 4)); // Float64Array [-5, 0, 1, 2]: 0^2 + 1^2 + 2^2 = 5 = sum (y - 2.5)^2
 * ```
 */
export function applyQt(f: HouseholderQR, y: Float64Array): Float64Array {
  for (let j = 0; j < f.k; j++) reflect(f, j, y);
  return y;
}

/**
 * y <- Q y (in place; returns y): the inverse of {@link applyQt}.
 *
 * @example
 * ```ts
 * const f = householderQR(Float64Array.of(1, 1, 1, 1), 4, 1);
 * applyQ(f, applyQt(f, Float64Array.of(1, 2, 3, 4))); // Float64Array [1, 2, 3, 4] (to rounding)
 * ```
 */
export function applyQ(f: HouseholderQR, y: Float64Array): Float64Array {
  for (let j = f.k - 1; j >= 0; j--) reflect(f, j, y);
  return y;
}

/**
 * The thin Q (n x k, column-major): an orthonormal basis of col(X).
 *
 * @example
 * ```ts
 * columnBasis(householderQR(Float64Array.of(1, 1, 1, 1), 4, 1));
 * // { n: 4, k: 1, q: Float64Array [-0.5, -0.5, -0.5, -0.5] } (the sign is the reflector's)
 * ```
 */
export function columnBasis(f: HouseholderQR): ColumnBasis {
  const { n, k } = f;
  const q = new Float64Array(n * k);
  const col = new Float64Array(n);
  for (let j = 0; j < k; j++) {
    col.fill(0);
    col[j] = 1;
    applyQ(f, col);
    q.set(col, j * n);
  }
  return { n, k, q };
}

/**
 * Q' S Q for a dense symmetric n x n matrix S (row-major, overwritten), by two-sided application
 * of the reflectors: O(n^2 k). The trailing (n-k) x (n-k) block is Z'SZ for Z an orthonormal basis
 * of the complement of col(X).
 *
 * @example
 * ```ts
 * const f = householderQR(Float64Array.of(1, 1, 1, 1), 4, 1);
 * const s = congruence(f, bandToDense(differenceMatrix(differencePairs(4))));
 * // row and column 0 are zero (A 1 = 0); the trailing 3 x 3 block Z'AZ has the eigenvalues
 * // 2 - 2 cos(pi i / 4), i = 1, 2, 3 (Durbin & Watson 1950)
 * ```
 */
export function congruence(f: HouseholderQR, s: Float64Array): Float64Array {
  const { n, qr, beta } = f;
  const p = new Float64Array(n);
  for (let j = 0; j < f.k; j++) {
    const b = beta[j];
    if (b === 0) continue;
    const off = j * n;
    // v has v[j] = 1, v[i] = qr[off+i] for i > j, 0 before j
    // H S H = S - v w' - w v', with p = b S v, w = p - (b/2)(v'p) v
    let vp = 0;
    for (let r = 0; r < n; r++) {
      const row = r * n;
      let acc = s[row + j];
      for (let i = j + 1; i < n; i++) acc += s[row + i] * qr[off + i];
      p[r] = b * acc;
    }
    vp = p[j];
    for (let i = j + 1; i < n; i++) vp += qr[off + i] * p[i];
    const kk = 0.5 * b * vp;
    // w = p - kk v (in place in p)
    p[j] -= kk;
    for (let i = j + 1; i < n; i++) p[i] -= kk * qr[off + i];
    for (let r = 0; r < n; r++) {
      const vr = r < j ? 0 : r === j ? 1 : qr[off + r];
      const wr = p[r];
      const row = r * n;
      // columns before j: v[c] = 0
      for (let c = 0; c < j; c++) s[row + c] -= vr * p[c];
      s[row + j] -= vr * p[j] + wr;
      for (let c = j + 1; c < n; c++) s[row + c] -= vr * p[c] + wr * qr[off + c];
    }
  }
  return s;
}
