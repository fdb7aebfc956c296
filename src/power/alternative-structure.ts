/**
 * The structure of the alternative for exact power without eigenvalues (docs/methods.md section 6):
 * the order of the observations in which the error precision P = S^-1 is tridiagonal, the gaps
 * between neighbours in that order, and the design's basis Q and operator A in that order. It is
 * fixed while rho and c vary; src/power/alternative-form.ts builds P for each rho from the gaps.
 *
 * P = S^-1. P is tridiagonal: the process observed at the given times is a Gauss-Markov chain with
 * lag-one correlations r_i = rho^(g_i), g_i the gap between neighbouring observations (in time
 * units; in units of J for the seasonal process u_t = rho u_{t-J} + e_t, whose J interleaved chains
 * are placed one after the other). From -2 log density = x_1^2 + sum_i (x_{i+1} - r_i x_i)^2 / (1 - r_i^2):
 *
 *   P_ii = [i has a left neighbour] / (1 - r_{i-1}^2) + [no left neighbour] + [i has a right neighbour] r_i^2 / (1 - r_i^2),
 *   P_{i,i+1} = -r_i / (1 - r_i^2)
 *
 * (consecutive times: diagonal (1, 1 + rho^2, ..., 1 + rho^2, 1) / (1 - rho^2), off-diagonal
 * -rho / (1 - rho^2)).
 *
 * This is the Markov property of the AR(1) process observed at arbitrary times. It is checked
 * through the form built on it, which agrees with the dense route that builds S itself
 * (test/power/power-eigenfree.test.ts).
 */
import { DwError } from '../errors.js';
import type { BandMatrix, ColumnBasis } from '../core/types.js';
import type { ErrorProcess } from './weights.js';

/**
 * What stays fixed while rho and c vary: the design's basis and the operator, both in the order in
 * which the error precision is tridiagonal, and the gaps between neighbours in that order.
 *
 * @example
 * ```ts
 * const p = prepareProblem({ trend }, 5000);
 * const st = alternativeStructure(columnBasis(p.factored.qr), p.operator, 1);
 * ```
 */
export interface AlternativeStructure {
  n: number;
  k: number;
  m: number;
  process: ErrorProcess;
  /** Lag of the statistic (the step J of the seasonal process). */
  lag: number;
  /** Position -> observation index (null: observation order). */
  order: Int32Array | null;
  /**
   * Gap between position i and i + 1 in steps of the process (time units for ar1, units of J for
   * the seasonal process), Infinity where two independent chains meet. Length n - 1.
   */
  gaps: Float64Array;
  /** The operator A by diagonals in the chosen order (bands.length - 1 = its bandwidth there). */
  a: Float64Array[];
  /** Q (row-major n x k, chosen order). */
  q: Float64Array;
  /** AQ (row-major n x k, chosen order). */
  aq: Float64Array;
  /** Gershgorin interval [gMin, gMax] of A. */
  gMin: number;
  gMax: number;
}

/**
 * Prepare the eigen-free power computation for a design, its difference operator and the error
 * process. The operator must be the one of `differenceMatrix` for the same `lag` and `times`.
 *
 * @param basis orthonormal basis Q of col(X)
 * @param operator the difference operator A
 * @param lag lag of the statistic (sets the step of the seasonal process)
 * @param times observation times (0..n-1 when omitted)
 * @param process `ar1` (default) or `seasonal`
 * @throws DwError ENGINE_NOT_APPLICABLE when the shapes disagree or the operator does not link
 *   neighbours of the seasonal chains only
 * @example
 * ```ts
 * const st = alternativeStructure(basis, operator, 4, undefined, 'seasonal');
 * alternativeForm(st, 1.6, 0.5).evaluate(2, out); // theta(2), log rho(2) at c = 1.6, rho = 0.5
 * ```
 */
export function alternativeStructure(basis: ColumnBasis, operator: BandMatrix, lag: number,
  times?: ArrayLike<number>, process: ErrorProcess = 'ar1'): AlternativeStructure {
  const { n, k } = basis;
  const hint = 'Build the operator with differenceMatrix and the basis from the QR factorisation of the same design.';
  if (operator.n !== n || basis.q.length !== n * k || operator.bands.length !== operator.bandwidth + 1) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The operator (n = ${operator.n}) and the column basis (n = ${n}, k = ${k}) do not fit together.`, hint);
  }
  if (!(k >= 0 && k < n)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The design has k = ${k} columns for n = ${n} observations; the residuals have no room left.`,
      'Use fewer regressors than observations.');
  }
  if (times && times.length !== n) {
    throw new DwError('LENGTH_MISMATCH', `The time column has ${times.length} values for ${n} observations.`, 'Give one time value per row.');
  }
  if (process !== 'ar1' && process !== 'seasonal') {
    throw new DwError('OPTION_VALUE', `Unknown error process '${String(process)}'.`, 'Use ar1 or seasonal.');
  }
  const tAt = (i: number) => (times ? times[i] : i);
  const step = process === 'seasonal' ? lag : 1;

  // chosen order: observation order, or the seasonal chains (residue classes of t mod J) one after another
  let order: Int32Array | null = null;
  const gaps = new Float64Array(Math.max(0, n - 1));
  if (step === 1) {
    for (let i = 0; i + 1 < n; i++) gaps[i] = tAt(i + 1) - tAt(i);
  } else {
    const cls = (t: number) => ((t % step) + step) % step;
    const idx = Array.from({ length: n }, (_, i) => i);
    idx.sort((x, y) => cls(tAt(x)) - cls(tAt(y)) || x - y); // stable by time within a class
    order = Int32Array.from(idx);
    for (let i = 0; i + 1 < n; i++) {
      const x = order[i], y = order[i + 1];
      gaps[i] = cls(tAt(x)) === cls(tAt(y)) ? (tAt(y) - tAt(x)) / step : Infinity;
    }
  }

  // A in the chosen order
  let a: Float64Array[];
  if (order === null) {
    a = operator.bands.map((b) => Float64Array.from(b));
  } else {
    const d0 = new Float64Array(n);
    const d1 = new Float64Array(Math.max(0, n - 1));
    for (let i = 0; i < n; i++) d0[i] = operator.bands[0][order[i]];
    let captured = 0;
    for (let i = 0; i + 1 < n; i++) {
      const x = order[i], y = order[i + 1];
      const lo = Math.min(x, y), j = Math.abs(y - x);
      if (j <= operator.bandwidth) d1[i] = operator.bands[j][lo];
      if (d1[i] !== 0) captured++;
    }
    let total = 0;
    for (let j = 1; j <= operator.bandwidth; j++) for (const v of operator.bands[j]) if (v !== 0) total++;
    if (captured !== total) {
      throw new DwError('ENGINE_NOT_APPLICABLE', 'The difference operator links observations that are not neighbours in the seasonal chains.',
        hint);
    }
    a = [d0, d1];
  }
  // drop empty outer bands (gapped times can leave the widest one empty)
  while (a.length > 2 && a[a.length - 1].every((v) => v === 0)) a.pop();

  // Q and AQ, row-major in the chosen order
  const q = new Float64Array(n * k);
  for (let i = 0; i < n; i++) {
    const v = order === null ? i : order[i];
    for (let c = 0; c < k; c++) q[i * k + c] = basis.q[c * n + v];
  }
  const aq = bandTimes(a, q, n, k);

  let gMin = Infinity, gMax = -Infinity;
  const p = a.length - 1;
  for (let t = 0; t < n; t++) {
    let r = 0;
    for (let j = 1; j <= p; j++) {
      if (t < n - j) r += Math.abs(a[j][t]);
      if (t >= j) r += Math.abs(a[j][t - j]);
    }
    gMin = Math.min(gMin, a[0][t] - r);
    gMax = Math.max(gMax, a[0][t] + r);
  }
  return { n, k, m: n - k, process, lag, order, gaps, a, q, aq, gMin, gMax };
}

/** y = A x for a band A (diagonals `a`) and row-major n x k x. */
function bandTimes(a: Float64Array[], x: Float64Array, n: number, k: number): Float64Array {
  const y = new Float64Array(n * k);
  for (let t = 0; t < n; t++) for (let c = 0; c < k; c++) y[t * k + c] = a[0][t] * x[t * k + c];
  for (let j = 1; j < a.length; j++) {
    const b = a[j];
    for (let t = 0; t < b.length; t++) {
      const v = b[t];
      if (v === 0) continue;
      for (let c = 0; c < k; c++) {
        y[t * k + c] += v * x[(t + j) * k + c];
        y[(t + j) * k + c] += v * x[t * k + c];
      }
    }
  }
  return y;
}

