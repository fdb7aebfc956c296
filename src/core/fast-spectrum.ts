/**
 * The spectrum nu_1 <= ... <= nu_m of Z'AZ (docs/methods.md section 2) without an O(n^3) step, for
 * every operator built by `differenceMatrix`.
 *
 * Such an A is a disjoint union of chains (path graphs): lag j splits the series into j
 * interleaved chains, gaps cut chains. A chain of length L has the closed-form eigenpairs
 *
 *   lambda_j = 2 - 2 cos(pi j / L) = 4 sin^2(pi j / (2L)),   v_j(t) = sqrt((2 - [j = 0]) / L) cos(pi j (t + 1/2) / L),
 *
 * (the DCT-II basis; docs/methods.md section 2 for L = n). In that eigenbasis A is diagonal and the
 * columns q_1..q_k of Q become x_1..x_k = V'q. The complement of col(Q) is reached by removing one
 * direction at a time: the compression of diag(d) to the complement of a unit vector x has the
 * eigenvalues that solve the secular equation
 *
 *   f(nu) = sum_j x_j^2 / (d_j - nu) = 0,
 *
 * one root strictly inside each gap between consecutive poles (f increases from -inf to +inf there),
 * with eigenvectors proportional to (d - nu)^-1 x. Each step is the rank-one step of a
 * divide-and-conquer eigensolver with the rank-one weight sent to infinity:
 *   * deflation (Dongarra & Sorensen 1987; LAPACK dlaed2): components |x_j| <= 8 eps are dropped and
 *     poles closer than 8 eps ||A|| (ties: lag j gives groups of j equal values) are merged by a
 *     plane rotation that zeroes one component;
 *   * each root by Li's "middle way" rational iteration (Li 1993, LAPACK dlaed4, with 1/rho = 0),
 *     bracketed, from the two-pole start, with differences to the nearer pole kept exactly;
 *   * the remaining columns x_2.. are carried into the new eigenbasis with the eigenvectors of the
 *     re-fitted vector x^ (Gu & Eisenstat 1995: x^_j^2 = prod_i (nu_i - d_j) / prod_{l != j} (d_l - d_j),
 *     for which the computed roots are exact), so the new basis is orthonormal to working precision.
 * References (quoted from memory): J. J. Dongarra & D. C. Sorensen (1987), SIAM J. Sci. Stat.
 * Comput. 8, s139-s154; R.-C. Li (1993), "Solving secular equations stably and efficiently",
 * LAPACK Working Note 89; M. Gu & S. C. Eisenstat (1995), SIAM J. Matrix Anal. Appl. 16, 172-191.
 * Cost O(k n^2) in all (the chain transforms O(k L^2) per chain of length L, each secular sweep
 * O(n^2)), memory O(n k); absolute accuracy a small multiple of eps ||A|| (measured: below 2e-14
 * against dense solvers). Any other band matrix falls back to the dense route (spectrum.ts).
 */
import { DwError } from '../errors.js';
import { householderQR } from '../linalg/qr.js';
import { denseSpectrum } from './spectrum.js';
import type { BandMatrix, ColumnBasis } from './types.js';
import { POLICY } from '../policy.js';

const EPS = Number.EPSILON / 2; // unit roundoff 2^-53

/**
 * Largest n for the structured path. Time grows as k n^2 (measured by `npm run bench`:
 * docs/performance.md). Beyond, the eigen-free or DCT route answers.
 *
 * @example
 * ```ts
 * if (n <= FAST_SPECTRUM_MAX_N) nu = fastSpectrum(a, basis);
 * ```
 */
export const FAST_SPECTRUM_MAX_N = POLICY.limits.STRUCTURED_SPECTRUM_MAX_N;

/**
 * Largest n for the dense fallback taken by band matrices that are not difference operators
 * (time O(n^3), about 2.4 s at n = 1000 and 23 s at n = 2000 when the limit was set, as in
 * docs/errors-and-limits.md; memory 8 n^2 bytes).
 *
 * @example
 * ```ts
 * DENSE_SPECTRUM_MAX_N; // 2000
 * ```
 */
export const DENSE_SPECTRUM_MAX_N = POLICY.limits.DENSE_SPECTRUM_MAX_N;

/**
 * The m = n - k eigenvalues of Z'AZ, ascending, Z an orthonormal basis of the complement of col(Q).
 * For a difference operator (any lag, gaps allowed) this uses the closed-form eigenpairs of its
 * chains and k secular-equation sweeps (O(k n^2)); for any other band matrix it falls back to the
 * dense Householder route (O(n^3)).
 *
 * @param a the symmetric band operator A
 * @param basis orthonormal basis Q of col(X) (n x k, column-major)
 * @throws DwError SIZE_LIMIT when n exceeds {@link FAST_SPECTRUM_MAX_N} (structured) or
 *   {@link DENSE_SPECTRUM_MAX_N} (dense fallback); ENGINE_NOT_APPLICABLE when the shapes disagree
 *
 * @example
 * ```ts
 * const n = 1000;
 * const a = differenceMatrix(differencePairs(n));
 * const one = new Float64Array(n).fill(1 / Math.sqrt(n));
 * fastSpectrum(a, { n, k: 1, q: one }); // 4 sin^2(pi j / (2n)), j = 1..n-1: the intercept removes lambda_0 = 0
 * ```
 */
export function fastSpectrum(a: BandMatrix, basis: ColumnBasis): Float64Array {
  const { n } = a;
  const { k } = basis;
  if (a.n !== basis.n || basis.q.length !== n * k || !(k >= 0 && k < n)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The operator (n = ${a.n}) and the column basis (n = ${basis.n}, k = ${k}) do not fit together.`,
      'Build A with differenceMatrix and Q from the QR factorisation of the same design, with fewer columns than rows.');
  }
  const chains = cachedPathChains(a);
  if (chains === null) {
    if (n > DENSE_SPECTRUM_MAX_N) {
      throw new DwError('SIZE_LIMIT', `The operator is not a difference operator, and its dense spectrum at n = ${n} would take too long (limit ${DENSE_SPECTRUM_MAX_N}).`,
        'Use the eigen-free engine, which needs no spectrum.');
    }
    return denseSpectrum(a, householderQR(basis.q, n, k));
  }
  if (n > FAST_SPECTRUM_MAX_N) {
    throw new DwError('SIZE_LIMIT', `Computing all ${n - k} eigenvalues at n = ${n} would take too long (limit ${FAST_SPECTRUM_MAX_N}).`,
      'Use the eigen-free engine, which needs no spectrum and scales to n = 100000.');
  }
  const { values, coords } = chainEigenbasis(chains, basis);
  let vals = values;
  let cols = coords;
  const work = stepWork(n);
  for (let step = 0; step < k; step++) {
    ({ vals, cols } = projectOut(vals, cols, work));
  }
  return vals;
}

/** The chains of operators already seen (an operator is shared by every design on the same times). */
const chainsSeen = new WeakMap<BandMatrix, OperatorChains | null>();

function cachedPathChains(a: BandMatrix): OperatorChains | null {
  let chains = chainsSeen.get(a);
  if (chains === undefined) {
    chains = pathChains(a);
    chainsSeen.set(a, chains);
  }
  return chains;
}

/**
 * A band matrix whose graph is a disjoint union of chains: node indices in chain order (chain c at
 * order[starts[c]] .. order[starts[c+1] - 1]), and link[i] = A(order[i], order[i+1]) inside a chain,
 * 0 where a chain ends. Permuting A to this order makes it tridiagonal.
 */
export interface OperatorChains {
  /** Node indices in chain order. */
  order: Int32Array;
  /** Chain c occupies positions starts[c] .. starts[c+1] - 1 of `order`. */
  starts: Int32Array;
  /** link[i] = A(order[i], order[i+1]) inside a chain, 0 where a chain ends (length n - 1). */
  link: Float64Array;
}

/**
 * The chains of A when every row has at most one nonzero off-diagonal entry to its right and one
 * to its left (true of every `differenceMatrix`: lag j gives j interleaved chains, gaps cut them),
 * else null. O(n bandwidth).
 *
 * @example
 * ```ts
 * operatorChains(differenceMatrix(differencePairs(6, 2))).order; // Int32Array [0, 2, 4, 1, 3, 5]
 * ```
 */
export function operatorChains(a: BandMatrix): OperatorChains | null {
  const { n, bands } = a;
  const next = new Int32Array(n).fill(-1);
  const prev = new Int32Array(n).fill(-1);
  const value = new Float64Array(n);
  for (let j = 1; j < bands.length; j++) {
    const b = bands[j];
    for (let t = 0; t < b.length; t++) {
      const v = b[t];
      if (v === 0) continue;
      if (next[t] !== -1 || prev[t + j] !== -1 || !Number.isFinite(v)) return null;
      next[t] = t + j;
      prev[t + j] = t;
      value[t] = v;
    }
  }
  const order = new Int32Array(n);
  const link = new Float64Array(Math.max(0, n - 1));
  const starts: number[] = [0];
  let pos = 0;
  for (let t = 0; t < n; t++) {
    if (prev[t] !== -1) continue;
    for (let v = t; v !== -1; v = next[v]) {
      if (next[v] !== -1) link[pos] = value[v];
      order[pos++] = v;
    }
    starts.push(pos);
  }
  return { order, starts: Int32Array.from(starts), link };
}

/**
 * The chains of A when A is moreover a union of path-graph Laplacians (off-diagonal entries -1, the
 * diagonal counting them), whose eigenpairs are known in closed form; else null. Used here and by
 * the DCT eigenbasis route (src/engines/dct.ts).
 *
 * @example
 * ```ts
 * pathChains(differenceMatrix(differencePairs(10, 2)))?.starts; // [0, 5, 10]: two chains of 5
 * ```
 */
export function pathChains(a: BandMatrix): OperatorChains | null {
  const ch = operatorChains(a);
  if (ch === null) return null;
  const { order, starts, link } = ch;
  const d0 = a.bands[0];
  for (let c = 0; c + 1 < starts.length; c++) {
    for (let i = starts[c]; i < starts[c + 1]; i++) {
      const left = i > starts[c] ? 1 : 0;
      const right = i + 1 < starts[c + 1] ? 1 : 0;
      if ((left && link[i - 1] !== -1) || (right && link[i] !== -1) || d0[order[i]] !== left + right) return null;
    }
  }
  return ch;
}

/** cos(pi r / (2L)) for r = 0..4L-1, by chain length L (a few lengths per batch of designs). */
const cosineTables = new Map<number, Float64Array>();

function cosineTable(L: number): Float64Array {
  let table = cosineTables.get(L);
  if (table === undefined) {
    table = new Float64Array(4 * L);
    for (let r = 0; r < 4 * L; r++) table[r] = Math.cos((Math.PI * r) / (2 * L));
    if (cosineTables.size >= 64) cosineTables.clear();
    cosineTables.set(L, table);
  }
  return table;
}

/**
 * Eigenvalues of A (ascending) and the columns of Q in A's eigenbasis, chain by chain:
 * x_j = sum_t v_j(t) q(t) with the DCT-II vectors above, cosines from a table of cos(pi r / (2L)).
 * The vectors are even (j even) or odd (j odd) about the chain's middle, cos(pi j (L - 1 - t + 1/2) / L)
 * = (-1)^j cos(pi j (t + 1/2) / L), so each sum runs over half the chain, on q(t) + q(L-1-t) or
 * q(t) - q(L-1-t) (and the middle point of an odd chain).
 */
function chainEigenbasis(chains: OperatorChains, basis: ColumnBasis): { values: Float64Array; coords: Float64Array[] } {
  const { n, k, q } = basis;
  const values = new Float64Array(n);
  const coords = Array.from({ length: k }, () => new Float64Array(n));
  const nc = chains.starts.length - 1;
  let maxL = 0;
  for (let c = 0; c < nc; c++) maxL = Math.max(maxL, chains.starts[c + 1] - chains.starts[c]);
  const even = new Float64Array(maxL);
  const odd = new Float64Array(maxL);
  for (let c = 0; c < nc; c++) {
    const s0 = chains.starts[c];
    const L = chains.starts[c + 1] - s0;
    const period = 4 * L;
    const table = cosineTable(L);
    const h = L >> 1;
    for (let j = 0; j < L; j++) {
      const sn = Math.sin((Math.PI * j) / (2 * L));
      values[s0 + j] = 4 * sn * sn;
    }
    for (let col = 0; col < k; col++) {
      const off = col * n;
      for (let t = 0; t < h; t++) {
        const a = q[off + chains.order[s0 + t]];
        const b = q[off + chains.order[s0 + L - 1 - t]];
        even[t] = a + b;
        odd[t] = a - b;
      }
      const middle = L % 2 === 1 ? q[off + chains.order[s0 + h]] : 0;
      const out = coords[col];
      for (let j = 0; j < L; j++) {
        const f = j % 2 === 0 ? even : odd;
        // angle index r = j (2t + 1) mod 4L, stepping by 2j
        const step = (2 * j) % period;
        let r = j % period;
        let acc = 0;
        for (let t = 0; t < h; t++) {
          acc += table[r] * f[t];
          r += step;
          if (r >= period) r -= period;
        }
        // the middle point of an odd chain: r = j L mod 4L there (cos(pi j / 2): 0 for odd j)
        if (middle !== 0 && j % 2 === 0) acc += table[r] * middle;
        out[s0 + j] = Math.sqrt((j === 0 ? 1 : 2) / L) * acc;
      }
    }
  }
  return sortBasis(values, coords);
}

/** Sort the eigenvalues ascending and permute the coordinate vectors alike. */
function sortBasis(values: Float64Array, coords: Float64Array[]): { values: Float64Array; coords: Float64Array[] } {
  const N = values.length;
  let sorted = true;
  for (let i = 1; i < N && sorted; i++) sorted = values[i - 1] <= values[i];
  // one chain (consecutive times, lag 1): 4 sin^2(pi j / 2L) already ascends, and the stable sort
  // below would return the same order
  if (sorted) return { values, coords };
  const idx = Array.from({ length: N }, (_, i) => i);
  idx.sort((i, j) => values[i] - values[j] || i - j);
  return permuted(values, coords, idx);
}

/** The values and every coordinate vector in the order idx (entry p is entry idx[p] before). */
function permuted(values: Float64Array, coords: Float64Array[], idx: ArrayLike<number>): { values: Float64Array; coords: Float64Array[] } {
  const N = values.length;
  const v = new Float64Array(N);
  for (let i = 0; i < N; i++) v[i] = values[idx[i]];
  const cs = coords.map((y) => {
    const out = new Float64Array(N);
    for (let i = 0; i < N; i++) out[i] = y[idx[i]];
    return out;
  });
  return { values: v, coords: cs };
}

/** Work space of the rank-one steps of one spectrum (every buffer of length n, reused step by step). */
class StepWork {
  readonly kept: Int32Array;
  readonly deflated: Int32Array;
  readonly poles: Float64Array;
  readonly z2: Float64Array;
  readonly origin: Int32Array;
  readonly tau: Float64Array;
  readonly prod: Float64Array;
  readonly diff: Float64Array;
  readonly zhat: Float64Array;
  readonly order: Int32Array;
  readonly res = new Float64Array(1);
  private yk = new Float64Array(0);

  constructor(n: number) {
    this.kept = new Int32Array(n);
    this.deflated = new Int32Array(n);
    this.poles = new Float64Array(n);
    this.z2 = new Float64Array(n);
    this.origin = new Int32Array(n);
    this.tau = new Float64Array(n);
    this.prod = new Float64Array(n);
    this.diff = new Float64Array(n);
    this.zhat = new Float64Array(n);
    this.order = new Int32Array(n);
  }

  /** Work space for the kept coordinates of r columns (row-major, N x r). */
  rows(size: number): Float64Array {
    if (this.yk.length < size) this.yk = new Float64Array(size);
    return this.yk;
  }
}

/** The work space of the last spectrum, reused while large enough (every buffer is written before it is read). */
let lastWork: StepWork | null = null;

function stepWork(n: number): StepWork {
  if (lastWork === null || lastWork.kept.length < n) lastWork = new StepWork(n);
  return lastWork;
}

/**
 * One rank-one step: the compression of diag(vals) (ascending) to the complement of x = cols[0],
 * and the coordinates of cols[1..] in the eigenbasis of that compression. Returns one value fewer.
 * `vals` and `cols` belong to this module and are overwritten.
 */
function projectOut(vals: Float64Array, cols: Float64Array[], work: StepWork): { vals: Float64Array; cols: Float64Array[] } {
  const N0 = vals.length;
  const rest = cols.slice(1); // rotated in place below
  const R = rest.length;
  const x = cols[0];
  let nx = 0;
  for (let j = 0; j < N0; j++) nx += x[j] * x[j];
  nx = Math.sqrt(nx);
  for (let j = 0; j < N0; j++) x[j] /= nx;
  const d = vals;
  const spread = Math.max(Math.abs(d[0]), Math.abs(d[N0 - 1]), Number.MIN_VALUE);
  const tolZ = 8 * Number.EPSILON;
  const tolD = 8 * Number.EPSILON * spread;

  // deflation, in ascending order of the poles
  const { kept, deflated } = work;
  let nKept = 0;
  let nDeflated = 0;
  let prev = -1;
  for (let j = 0; j < N0; j++) {
    if (Math.abs(x[j]) <= tolZ) { deflated[nDeflated++] = j; continue; }
    if (prev < 0) { prev = j; continue; }
    // |x| <= 1 and |x_prev|, |x_j| > tolZ: the sum of squares neither overflows nor underflows
    const r = Math.sqrt(x[prev] * x[prev] + x[j] * x[j]);
    const cs = x[j] / r;
    const sn = x[prev] / r;
    if (Math.abs(cs * sn * (d[j] - d[prev])) <= tolD) {
      // rotate (e_prev, e_j) so that x_prev = 0; the dropped coupling cs sn (d_j - d_prev) is below tolD
      x[prev] = 0;
      x[j] = r;
      for (const y of rest) {
        const yp = y[prev], yj = y[j];
        y[prev] = cs * yp - sn * yj;
        y[j] = sn * yp + cs * yj;
      }
      const dp = d[prev], dj = d[j];
      d[prev] = dp * cs * cs + dj * sn * sn;
      d[j] = dp * sn * sn + dj * cs * cs;
      deflated[nDeflated++] = prev;
    } else {
      kept[nKept++] = prev;
    }
    prev = j;
  }
  if (prev >= 0) kept[nKept++] = prev;

  // the secular problem on the kept poles
  const N = nKept;
  const { poles, z2, origin, tau, prod, diff, res } = work;
  let nz = 0;
  for (let i = 0; i < N; i++) { poles[i] = d[kept[i]]; nz += x[kept[i]] * x[kept[i]]; }
  for (let i = 0; i < N; i++) z2[i] = (x[kept[i]] * x[kept[i]]) / nz;
  const roots = Math.max(0, N - 1);
  prod.fill(1, 0, N);
  for (let i = 0; i < roots; i++) {
    origin[i] = secularRoot(poles, z2, N, i, diff, res);
    tau[i] = res[0];
    if (R > 0) {
      // Gu-Eisenstat: prod_j *= (nu_i - d_j) / (d_i' - d_j), i' = i below j, i + 1 from j on
      const base = poles[origin[i]];
      for (let j = 0; j < N; j++) {
        const nuMinusD = tau[i] - (poles[j] - base);
        prod[j] *= nuMinusD / (poles[i < j ? i : i + 1] - poles[j]);
      }
    }
  }

  // assemble: deflated directions keep their values and coordinates; roots get transformed ones
  // (roots at positions nDeflated.., the deflated directions before them)
  const M = nDeflated + roots;
  const out = new Float64Array(M);
  const outCols = rest.map(() => new Float64Array(M));
  for (let p = 0; p < nDeflated; p++) {
    const j = deflated[p];
    out[p] = d[j];
    for (let c = 0; c < R; c++) outCols[c][p] = rest[c][j];
  }
  const pos = nDeflated;
  if (R > 0 && roots > 0) {
    const zhat = work.zhat;
    for (let j = 0; j < N; j++) zhat[j] = Math.sign(x[kept[j]]) * Math.sqrt(prod[j]);
    const yk = work.rows(N * R);
    for (let j = 0; j < N; j++) for (let c = 0; c < R; c++) yk[j * R + c] = rest[c][kept[j]];
    if (R === 1) {
      for (let i = 0; i < roots; i++) {
        const base = poles[origin[i]];
        const ti = tau[i];
        let norm = 0;
        let dot = 0;
        for (let j = 0; j < N; j++) {
          const w = zhat[j] / ((poles[j] - base) - ti);
          norm += w * w;
          dot += w * yk[j];
        }
        outCols[0][pos + i] = dot * (1 / Math.sqrt(norm));
      }
    } else {
      const dots = new Float64Array(R);
      for (let i = 0; i < roots; i++) {
        const base = poles[origin[i]];
        const ti = tau[i];
        let norm = 0;
        dots.fill(0);
        for (let j = 0; j < N; j++) {
          const w = zhat[j] / ((poles[j] - base) - ti);
          norm += w * w;
          const o = j * R;
          for (let c = 0; c < R; c++) dots[c] += w * yk[o + c];
        }
        const inv = 1 / Math.sqrt(norm);
        for (let c = 0; c < R; c++) outCols[c][pos + i] = dots[c] * inv;
      }
    }
  }
  for (let i = 0; i < roots; i++) out[pos + i] = poles[origin[i]] + tau[i];
  return mergeAscending(out, outCols, nDeflated, work.order);
}

/**
 * Sort values whose first `head` entries are the deflated directions (in any order) and whose
 * remaining entries (the roots) ascend, permuting the coordinate vectors alike: an insertion sort of
 * the head (nearly ascending already) and a merge, which orders exactly as the stable sort of
 * {@link sortBasis} does (used when the roots do not ascend).
 */
function mergeAscending(values: Float64Array, coords: Float64Array[], head: number, order: Int32Array): { vals: Float64Array; cols: Float64Array[] } {
  const N = values.length;
  for (let i = head + 1; i < N; i++) {
    // the roots ascend in exact arithmetic; should rounding have swapped two, sort it all
    if (values[i - 1] > values[i]) {
      const s = sortBasis(values, coords);
      return { vals: s.values, cols: s.coords };
    }
  }
  for (let i = 0; i < head; i++) {
    const v = values[i];
    let p = i;
    while (p > 0 && values[order[p - 1]] > v) { order[p] = order[p - 1]; p--; }
    order[p] = i;
  }
  let sorted = true;
  for (let i = 1; i < head && sorted; i++) sorted = order[i] === i;
  if (sorted && (head === 0 || head === N || values[head - 1] <= values[head])) return { vals: values, cols: coords };
  // merge the sorted head (order[0..head)) with the tail head..N-1, head entries first on ties
  const idx = new Int32Array(N);
  let a = 0;
  let b = head;
  for (let p = 0; p < N; p++) {
    if (b >= N || (a < head && values[order[a]] <= values[b])) idx[p] = order[a++];
    else idx[p] = b++;
  }
  const out = permuted(values, coords, idx);
  return { vals: out.values, cols: out.coords };
}

/**
 * The root of sum_j z2_j / (d_j - nu) = 0 in (d_i, d_{i+1}) (poles d_0..d_{N-1} strictly increasing,
 * weights positive). Returns the index of the nearer pole (the origin) and writes nu - d_origin into res[0];
 * `diff` is work space of length N. Li's middle-way iteration, safeguarded by the bracket.
 */
function secularRoot(d: Float64Array, z2: Float64Array, N: number, i: number, diff: Float64Array, res: Float64Array): number {
  const del = d[i + 1] - d[i];
  const mid = 0.5 * del;
  // f at the midpoint decides which pole is nearer to the root
  let fmid = 0;
  for (let j = 0; j < N; j++) fmid += z2[j] / ((d[j] - d[i]) - mid);
  if (fmid === 0) { res[0] = mid; return i; }
  const org = fmid > 0 ? i : i + 1;
  let lo = org === i ? 0 : -mid;
  let hi = org === i ? mid : 0;
  const base = d[org];
  for (let j = 0; j < N; j++) diff[j] = d[j] - base;
  // start: two-pole model with the other terms frozen at the midpoint
  const a0 = diff[i], b0 = diff[i + 1];
  const cRest = fmid + z2[i] / mid - z2[i + 1] / mid;
  let t = quadraticRoot(cRest, cRest * (a0 + b0) + z2[i] + z2[i + 1], cRest * a0 * b0 + z2[i] * b0 + z2[i + 1] * a0, lo, hi);
  for (let iter = 0; iter < 200; iter++) {
    let psi = 0, dpsi = 0, phi = 0, dphi = 0;
    for (let j = 0; j <= i; j++) {
      const r = 1 / (diff[j] - t);
      const term = z2[j] * r;
      psi += term;
      dpsi += term * r;
    }
    for (let j = i + 1; j < N; j++) {
      const r = 1 / (diff[j] - t);
      const term = z2[j] * r;
      phi += term;
      dphi += term * r;
    }
    const f = psi + phi;
    if (f === 0) break;
    if (f < 0) lo = t; else hi = t;
    if (Math.abs(f) <= EPS * (8 * (phi - psi) + Math.abs(t) * (dpsi + dphi))) break;
    // middle way: psi ~ s + S/(d_i - nu), phi ~ p + P/(d_{i+1} - nu), fitted at t
    const di = diff[i] - t;
    const di1 = diff[i + 1] - t;
    const qa = (di + di1) * f - di * di1 * (dpsi + dphi);
    const qb = di * di1 * f;
    const qc = f - di * dpsi - di1 * dphi;
    let eta: number;
    if (qc === 0) eta = qb / qa;
    else {
      const disc = Math.sqrt(Math.abs(qa * qa - 4 * qb * qc));
      eta = qa <= 0 ? (qa - disc) / (2 * qc) : (2 * qb) / (qa + disc);
    }
    if (f * eta >= 0) eta = -f / (dpsi + dphi); // wrong direction: Newton step
    let next = t + eta;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (next === t || next === lo || next === hi) break;
    const step = Math.abs(next - t);
    t = next;
    if (step <= 2 * EPS * Math.abs(t)) break;
  }
  res[0] = t;
  return org;
}

/**
 * The root in (lo, hi) of c t^2 - b t + e = 0, computed without cancellation; the bracket midpoint
 * if neither root lies inside.
 */
function quadraticRoot(c: number, b: number, e: number, lo: number, hi: number): number {
  let r1: number, r2: number;
  if (c === 0) { r1 = e / b; r2 = r1; } else {
    const disc = Math.sqrt(Math.max(0, b * b - 4 * c * e));
    const qq = 0.5 * (b + (b >= 0 ? disc : -disc));
    r1 = qq / c;
    r2 = qq !== 0 ? e / qq : r1;
  }
  if (r1 > lo && r1 < hi) return r1;
  if (r2 > lo && r2 < hi) return r2;
  return 0.5 * (lo + hi);
}
