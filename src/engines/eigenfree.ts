/**
 * The characteristic form of the Durbin-Watson quadratic form without any eigenvalues
 * (docs/methods.md section 5). For the weights lambda_j = sign (nu_j - c), nu_j the eigenvalues of A on
 * the complement of col(X), Imhof's phase and modulus (Imhof 1961, Biometrika 48, 419-426) are
 *
 *   theta(u) = -(1/2) Im L(u),   log rho(u) = (1/2) Re L(u),   L(u) = sum_j log(1 - i u lambda_j),
 *
 * and L(u) is a log-determinant on the complement: with S = sign (A - cI), B = I - i u S (complex
 * symmetric, banded like A) and Q the n x k orthonormal basis of col(X),
 *
 *   det(Z'BZ) = det(B) det(Q'B^-1 Q)      (U = [Z Q] orthogonal; (U'BU)^-1 = U'B^-1 U, Schur complement).
 *
 * det(B) comes from the complex LDL' factorisation of B without pivoting; the same sweep computes
 * Y = L^-1 Q and accumulates Q'B^-1 Q = Y' D^-1 Y; a k x k complex LDL' finishes. L(u) is the sum of
 * the principal logarithms of all n + k pivots. Every pivot is a ratio of determinants of nested
 * compressions of B, whose eigenvalues 1 - i u mu interlace, so each pivot has argument in
 * (-pi/2, pi/2); the pivots of B have real part >= 1 (B's Hermitian part is I): no pivoting is
 * needed, and the sum of principal logarithms is the continuous branch of L(u). (The sum is kept as
 * a running product with a count of turns, so that only O(1) logarithms are taken per evaluation.)
 * Operators of `differenceMatrix` with lag > 1 or gaps are unions of chains and are permuted to a
 * tridiagonal matrix first (det and Q'B^-1 Q are invariant under a simultaneous permutation of B and
 * Q). Cost O(n k^2) per evaluation (O(n k (k + p^2)) for a general band of half-width p), memory
 * O(n k), nothing allocated per evaluation.
 */
import { DwError } from '../errors.js';
import { operatorChains } from '../core/fast-spectrum.js';
import { PivotProduct, smallLogDet } from '../linalg/complex-ldl.js';
import { BandLdl } from '../linalg/band-ldl.js';
import type { BandMatrix, CharacteristicForm, ColumnBasis } from '../core/types.js';
import { POLICY } from '../policy.js';

/**
 * Relative size of the regularisation used for {@link CharacteristicForm.sumLogAbsLambda}: the
 * constant is (1/2) sum log(lambda_j^2 + tau^2) with tau = LAMBDA_FLOOR * maxAbsLambda.
 *
 * @example
 * ```ts
 * eigenfreeForm(a, basis, c).lambdaFloor === LAMBDA_FLOOR * eigenfreeForm(a, basis, c).maxAbsLambda; // true
 * ```
 */
export const LAMBDA_FLOOR = POLICY.tolerances.LAMBDA_FLOOR;

/**
 * The eigen-free characteristic form, with the two facts its constants rest on.
 *
 * @example
 * ```ts
 * const form = eigenfreeForm(a, basis, 2);
 * form.dimension === form.m;    // n - k: no weight is dropped
 * form.lambdaFloor;             // 1e-9 * form.maxAbsLambda
 * ```
 */
export interface EigenfreeForm extends CharacteristicForm {
  /** n - k, the number of weights (m equals it: no weight is dropped). */
  dimension: number;
  /**
   * tau such that sumLogAbsLambda = (1/2) sum log(lambda_j^2 + tau^2), which is >= sum log|lambda_j|.
   * For u <= 1/tau each factor obeys 1 + lambda^2 u^2 >= u^2 (lambda^2 + tau^2), so
   * rho(u) >= u^(m/2) exp(sumLogAbsLambda / 2) there, and the truncation bound T(U) built from
   * (m, sumLogAbsLambda) covers the stretch [U, 1/tau]. Beyond 1/tau, log rho is convex in log u
   * with slope >= (m - z)/4 (z = number of weights below tau), which adds at most a relative
   * 2 (m / (m - z)) (U tau)^(m/2) to T(U): negligible for U <= 1e-3 / tau. A weight that is exactly
   * zero (c on an eigenvalue) thus enters as log(tau) instead of -infinity and needs no special case.
   * Where T(U) would ask for a larger U (small m, c near an eigenvalue), {@link truncationValidBelow}
   * = 1e-3 / tau makes `integrateImhof` place the cut by the convexity bound instead, which needs
   * no floor.
   */
  lambdaFloor: number;
}

/**
 * The CharacteristicForm of Q = sign * e'(A - cI)e restricted to the complement of col(X), i.e. of
 * the weights lambda_j = sign (nu_j - c), computed without eigenvalues in O(n k) per evaluation.
 * `sign = 1` gives the lower tail P(d <= c) = P(Q <= 0); `sign = -1` the upper tail
 * P(d >= c) = P(-Q <= 0).
 *
 * Constants: `m = n - k`; `sumLambda = sign (trace A - trace Q'AQ - m c)` exactly;
 * `maxAbsLambda` is the Gershgorin upper bound max(|g_max - c|, |c - g_min|) (an upper bound on
 * max |lambda_j|, not its value); `sumLogAbsLambda` is (1/2) sum log(lambda_j^2 + tau^2) with
 * tau = {@link LAMBDA_FLOOR} * maxAbsLambda, from one extra factorisation (see
 * {@link EigenfreeForm.lambdaFloor} for why the truncation bound stays valid, also when c sits on an
 * eigenvalue and a weight is zero).
 *
 * Accuracy: theta and log rho agree with the eigenvalue form to about 1e-13 (absolute, n = 60,
 * u up to 1e6); sumLogAbsLambda, from a factorisation of S + i tau I without pivoting, to about
 * 1e-12, also with c on an eigenvalue of A or of Z'AZ (it only feeds an error bound).
 *
 * @param a the difference operator A (symmetric band)
 * @param basis orthonormal basis Q of col(X)
 * @param c the point at which a tail probability is wanted
 * @param sign 1 for weights nu - c (lower tail), -1 for c - nu (upper tail)
 * @throws DwError ENGINE_NOT_APPLICABLE when the shapes disagree, k >= n, c is not finite, or every
 *   weight is zero
 *
 * @example
 * ```ts
 * const a = differenceMatrix(differencePairs(1000));
 * const form = eigenfreeForm(a, basis, 1.8);       // basis: orthonormal Q of col(X)
 * const out = new Float64Array(2);
 * form.evaluate(3.5, out);                         // out[0] = theta(3.5), out[1] = log rho(3.5)
 * integrateImhof(form).p;                          // P(d <= 1.8)
 * integrateImhof(eigenfreeForm(a, basis, 1.8, -1)).p; // P(d >= 1.8)
 * ```
 */
export function eigenfreeForm(a: BandMatrix, basis: ColumnBasis, c: number, sign: 1 | -1 = 1): EigenfreeForm {
  validate(a, basis, c, sign);
  const { n } = a;
  const { k, q } = basis;
  const m = n - k;
  const p = a.bandwidth;

  // S = sign (A - cI), by diagonals; Gershgorin interval of A
  const s: Float64Array[] = [];
  for (let j = 0; j <= p; j++) {
    const src = a.bands[j];
    const dst = new Float64Array(n - j);
    for (let t = 0; t < dst.length; t++) dst[t] = sign * (j === 0 ? src[t] - c : src[t]);
    s.push(dst);
  }
  let gMin = Infinity;
  let gMax = -Infinity;
  for (let t = 0; t < n; t++) {
    let r = 0;
    for (let j = 1; j <= p; j++) {
      if (t < n - j) r += Math.abs(a.bands[j][t]);
      if (t >= j) r += Math.abs(a.bands[j][t - j]);
    }
    gMin = Math.min(gMin, a.bands[0][t] - r);
    gMax = Math.max(gMax, a.bands[0][t] + r);
  }
  const maxAbsLambda = Math.max(Math.abs(gMax - c), Math.abs(c - gMin));
  if (!(maxAbsLambda > 0)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', 'Every weight nu - c is zero: A is zero and c = 0, so d has no distribution to integrate.',
      'Check the difference operator; it has no pairs of observations.');
  }

  // sum lambda = sign (trace A - trace Q'AQ - m c)
  let traceA = 0;
  for (let t = 0; t < n; t++) traceA += a.bands[0][t];
  let traceQAQ = 0;
  for (let col = 0; col < k; col++) {
    const o = col * n;
    for (let t = 0; t < n; t++) {
      const qt = q[o + t];
      traceQAQ += a.bands[0][t] * qt * qt;
      for (let j = 1; j <= p && t + j < n; j++) traceQAQ += 2 * a.bands[j][t] * qt * q[o + t + j];
    }
  }
  const sumLambda = sign * (traceA - traceQAQ - m * c);

  const det = projectedLogDet(a, s, q, n, k);
  const res = new Float64Array(2);

  // (1/2) sum log(lambda^2 + tau^2) = log|det(Z'(S + i tau I)Z)|
  const tau = LAMBDA_FLOOR * maxAbsLambda;
  det(0, tau, 1, 0, false, res);
  const sumLogAbsLambda = res[0];

  return {
    m,
    dimension: m,
    sumLambda,
    sumLogAbsLambda,
    maxAbsLambda,
    lambdaFloor: tau,
    truncationValidBelow: 1e-3 / tau,
    evaluate(u: number, out: Float64Array): void {
      if (u === 0) { out[0] = 0; out[1] = 0; return; }
      // B = I - i u S
      det(1, 0, 0, -u, true, res);
      out[0] = -0.5 * res[1];
      out[1] = 0.5 * res[0];
    },
  };
}

function validate(a: BandMatrix, basis: ColumnBasis, c: number, sign: number): void {
  const hint = 'Build A with differenceMatrix and Q from the QR factorisation of the same design.';
  if (a.n !== basis.n || basis.q.length !== basis.n * basis.k || a.bands.length !== a.bandwidth + 1) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The operator (n = ${a.n}) and the column basis (n = ${basis.n}, k = ${basis.k}) do not fit together.`, hint);
  }
  for (let j = 0; j <= a.bandwidth; j++) {
    if (a.bands[j].length !== a.n - j) {
      throw new DwError('ENGINE_NOT_APPLICABLE', `Band ${j} of the operator has ${a.bands[j].length} entries, expected ${a.n - j}.`, hint);
    }
  }
  if (!(basis.k >= 0 && basis.k < a.n)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The design has k = ${basis.k} columns for n = ${a.n} observations; the residuals have no room left.`,
      'Use fewer regressors than observations.');
  }
  if (!Number.isFinite(c)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The point c = ${c} is not a finite number.`, 'Give the value of d at which the probability is wanted.');
  }
  if (sign !== 1 && sign !== -1) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The sign must be 1 or -1 (got ${sign}).`, 'Use 1 for the lower tail, -1 for the upper tail.');
  }
}

/**
 * The function (alpha, beta) -> log det(Z'(alpha I + beta S)Z) = log det(B) + log det(Q'B^-1 Q),
 * B = alpha I + beta S, alpha = ar + i ai, beta = br + i bi. Writes Re into out[0] and Im into out[1].
 * With `wantArg` the imaginary part is the sum of the principal arguments of the pivots, which
 * requires every pivot of B to have positive real part (true for alpha = 1, beta = -iu); without it
 * only out[0] is meaningful. Work arrays are allocated once here.
 */
type LogDet = (ar: number, ai: number, br: number, bi: number, wantArg: boolean, out: Float64Array) => void;

function projectedLogDet(a: BandMatrix, s: Float64Array[], q: Float64Array, n: number, k: number): LogDet {
  const p = s.length - 1;
  if (p <= 1) return sweepLogDet(s, q, n, k);
  // chains (every difference operator): permute to a tridiagonal matrix; det(B) and Q'B^-1 Q are
  // invariant under a simultaneous permutation of the rows of B and of Q
  const chains = operatorChains(a);
  if (chains === null) return sweepLogDet(s, q, n, k); // general band: L, D and Y stored
  const { order, link } = chains;
  const diagP = new Float64Array(n);
  const offP = new Float64Array(Math.max(0, n - 1));
  const qP = new Float64Array(n * k);
  for (let i = 0; i < n; i++) {
    const v = order[i];
    diagP[i] = s[0][v];
    for (let c = 0; c < k; c++) qP[c * n + i] = q[c * n + v];
  }
  for (let i = 0; i + 1 < n; i++) {
    if (link[i] === 0) continue;
    const u = order[i], v = order[i + 1];
    const lo = Math.min(u, v);
    offP[i] = s[Math.abs(v - u)][lo];
  }
  return sweepLogDet([diagP, offP], qP, n, k); // tridiagonal: O(k) work memory
}

/**
 * The LogDet from the shared band LDL' sweep (src/linalg/band-ldl.ts) of B = alpha I + beta S:
 * the pivots give det B, the rows of L^-1 Q give G = Q'B^-1 Q = sum_t y_t y_t' / D(t).
 */
function sweepLogDet(s: Float64Array[], q: Float64Array, n: number, k: number): LogDet {
  const small = smallLogDet(k);
  const acc = new Float64Array(2);
  const prod = new PivotProduct();
  // Q row-major (the sweep reads one row of every right-hand side at a time)
  const qRows = new Float64Array(n * k);
  for (let c = 0; c < k; c++) for (let t = 0; t < n; t++) qRows[t * k + c] = q[c * n + t];
  const ldl = new BandLdl('identity', s, qRows);
  const gr = ldl.gR, gi = ldl.gI; // G = Q'B^-1 Q, accumulated by the sweep itself
  return (ar, ai, br, bi, wantArg, out) => {
    ldl.sweep(ar, ai, br, bi, prod, wantArg);
    small(gr, gi, acc);
    out[0] = prod.logModulus() + acc[0];
    out[1] = wantArg ? prod.argument() + acc[1] : 0;
  };
}
