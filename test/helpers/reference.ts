/**
 * Outside references for the tests: general-purpose libraries from the registry (jstat, numeric,
 * ml-matrix), used only here, never by the library itself.
 */
import jstatModule from 'jstat';
import numericModule from 'numeric';
import { Matrix, EigenvalueDecomposition, QrDecomposition, solve } from 'ml-matrix';
import { bandToDense } from '../../src/core/difference.js';
import type { BandMatrix, ColumnBasis } from '../../src/core/types.js';

// jstat ships CommonJS with its namespace as the default export
export const jStat = (jstatModule as unknown as { jStat?: any }).jStat ?? (jstatModule as any);
export const numeric = numericModule as any;
export { Matrix, EigenvalueDecomposition, QrDecomposition, solve };

/** A small seeded generator (mulberry32) for test data; deterministic across runs. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal draws by Box-Muller from a seeded uniform source. */
export function seededNormal(seed: number): () => number {
  const u = seededRandom(seed);
  let spare: number | null = null;
  return () => {
    if (spare !== null) { const s = spare; spare = null; return s; }
    let a = 0;
    while (a === 0) a = u();
    const b = u();
    const r = Math.sqrt(-2 * Math.log(a));
    spare = r * Math.sin(2 * Math.PI * b);
    return r * Math.cos(2 * Math.PI * b);
  };
}

/**
 * Dense reference spectrum of M A M on the complement of col(X), by ml-matrix alone: M = I - X (X'X)^-1 X'
 * from ml-matrix's solve, Z = the eigenvectors of M with eigenvalue 1 (ml-matrix's symmetric
 * eigen-solver), then the eigenvalues of Z'AZ. X is given as rows; A dense row-major.
 */
export function referenceSpectrum(xRows: number[][], aDense: ArrayLike<number>, n: number): Float64Array {
  const X = new Matrix(xRows);
  const XtX = X.transpose().mmul(X);
  const H = X.mmul(solve(XtX, X.transpose()));
  const M = Matrix.eye(n).sub(H);
  const Ms = M.add(M.transpose()).mul(0.5);
  const eig = new EigenvalueDecomposition(Ms, { assumeSymmetric: true });
  const vals = eig.realEigenvalues;
  const V = eig.eigenvectorMatrix;
  const cols: number[] = [];
  vals.forEach((v, i) => { if (v > 0.5) cols.push(i); });
  const Z = new Matrix(n, cols.length);
  cols.forEach((c, j) => { for (let i = 0; i < n; i++) Z.set(i, j, V.get(i, c)); });
  const A = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) A.set(i, j, aDense[i * n + j]);
  const ZAZ = Z.transpose().mmul(A).mmul(Z);
  const S = ZAZ.add(ZAZ.transpose()).mul(0.5);
  return Float64Array.from(new EigenvalueDecomposition(S, { assumeSymmetric: true }).realEigenvalues.slice().sort((a, b) => a - b));
}

/** Seeded uniforms on [-1/2, 1/2) (mulberry32 shifted), for random design columns. */
export function seededCentred(seed: number): () => number {
  const u = seededRandom(seed);
  return () => u() - 0.5;
}

/**
 * Q (orthonormal basis of col(X)) and Z'AZ (dense, symmetrised), both by ml-matrix alone: the QR of
 * [X | R], R seeded random, gives an orthogonal n x n matrix whose first k columns span col(X) and
 * whose last n - k span the complement Z. X is given as rows.
 */
export function mlMatrixProjection(a: BandMatrix, x: number[][], seed: number): { basis: ColumnBasis; zaz: Matrix } {
  const n = x.length;
  const k = x[0].length;
  const r = seededCentred(seed);
  const full = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) full.set(i, j, j < k ? x[i][j] : r());
  const u = new QrDecomposition(full).orthogonalMatrix;
  const q = new Float64Array(n * k);
  for (let j = 0; j < k; j++) for (let i = 0; i < n; i++) q[j * n + i] = u.get(i, j);
  const z = u.subMatrix(0, n - 1, k, n - 1);
  const dense = bandToDense(a);
  const am = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) am.set(i, j, dense[i * n + j]);
  const zaz = z.transpose().mmul(am).mmul(z);
  return { basis: { n, k, q }, zaz: zaz.add(zaz.transpose()).mul(0.5) };
}
