/**
 * The structured spectrum of Z'AZ (closed-form chain eigenpairs + secular equations) against dense
 * references from the general-purpose libraries ml-matrix (QrDecomposition, EigenvalueDecomposition)
 * and numeric (numeric.eig), and against closed forms: with an intercept the constant vector is the
 * j = 0 eigenvector of A, and with X spanned by DCT-II eigenvectors of A the projected spectrum is A's
 * spectrum without those eigenvalues (Durbin & Watson 1950; docs/methods.md section 2).
 */
import { describe, expect, it } from 'vitest';
import { Matrix, EigenvalueDecomposition } from 'ml-matrix';
import { mlMatrixProjection, seededCentred } from '../helpers/reference.js';
import numericModule from 'numeric';
import { differenceMatrix, differencePairs } from '../../src/core/difference.js';
import type { BandMatrix, ColumnBasis } from '../../src/core/types.js';
import { FAST_SPECTRUM_MAX_N, fastSpectrum, operatorChains } from '../../src/core/fast-spectrum.js';
import { isDwError } from '../../src/errors.js';

const numeric = numericModule as unknown as { eig(a: number[][]): { lambda: { x: number[]; y?: number[] } } };

const seeded = seededCentred;

/** Columns: optional intercept, optional trend, then seeded random columns, k in all. */
function design(n: number, k: number, seed: number, intercept = true): number[][] {
  const r = seeded(seed);
  return Array.from({ length: n }, (_, t) => Array.from({ length: k }, (_, j) => {
    if (intercept && j === 0) return 1;
    if (intercept && j === 1) return t / n;
    return r();
  }));
}

/** Q and Z'AZ (dense, symmetrised) by ml-matrix's QR of [X | R]. */
function projected(a: BandMatrix, x: number[][]): { basis: ColumnBasis; zaz: Matrix } {
  return mlMatrixProjection(a, x, 77);
}

function mlMatrixSpectrum(zaz: Matrix): Float64Array {
  return Float64Array.from(new EigenvalueDecomposition(zaz, { assumeSymmetric: true }).realEigenvalues).sort();
}

function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  expect(a.length).toBe(b.length);
  let e = 0;
  for (let i = 0; i < a.length; i++) e = Math.max(e, Math.abs(a[i] - b[i]));
  return e;
}

function check(a: BandMatrix, x: number[][], tol = 1e-11): Float64Array {
  const { basis, zaz } = projected(a, x);
  const nu = fastSpectrum(a, basis);
  expect(maxAbsDiff(nu, mlMatrixSpectrum(zaz))).toBeLessThan(tol);
  for (let i = 1; i < nu.length; i++) expect(nu[i]).toBeGreaterThanOrEqual(nu[i - 1]);
  return nu;
}

/** Orthonormal DCT-II eigenvectors j of the lag-1 A of size n, as a column basis. */
function dctBasis(n: number, js: number[]): ColumnBasis {
  const q = new Float64Array(n * js.length);
  js.forEach((j, col) => {
    const s = Math.sqrt((j === 0 ? 1 : 2) / n);
    for (let t = 0; t < n; t++) q[col * n + t] = s * Math.cos((Math.PI * j * (t + 0.5)) / n);
  });
  return { n, k: js.length, q };
}

const gappedTimes = (n: number): number[] =>
  Array.from({ length: n }, (_, t) => t + (t >= 11 ? 2 : 0) + (t >= 30 ? 1 : 0) + (t >= 31 ? 5 : 0) + (t >= 70 ? 1 : 0));

describe('fast spectrum against ml-matrix EigenvalueDecomposition of the dense Z\'AZ (within 1e-11)', () => {
  it('lag 1 with intercept, n = 200, k = 5', () => {
    check(differenceMatrix(differencePairs(200)), design(200, 5, 1));
  });
  it('lag 1 without intercept, n = 150, k = 3', () => {
    check(differenceMatrix(differencePairs(150)), design(150, 3, 2, false));
  });
  it('lag 4 (Wallis) with intercept, n = 120, k = 4', () => {
    check(differenceMatrix(differencePairs(120, 4)), design(120, 4, 3));
  });
  it('gapped times, lag 1 (an isolated observation included) and lag 4, n = 100, k = 3', () => {
    const times = gappedTimes(100);
    check(differenceMatrix(differencePairs(100, 1, times)), design(100, 3, 4));
    check(differenceMatrix(differencePairs(100, 4, times)), design(100, 3, 5));
  });
  it('a band matrix that is not a difference operator takes the dense fallback, n = 80, k = 3', () => {
    const r = seeded(8);
    const n = 80;
    const a: BandMatrix = { n, bandwidth: 2, bands: [0, 1, 2].map((j) => Float64Array.from({ length: n - j }, () => (j === 0 ? 2 + r() : r()))) };
    check(a, design(n, 3, 6));
  });
  it('n = 6 edge: k = 1 .. 5 (m = 5 .. 1), lag 1', () => {
    const a = differenceMatrix(differencePairs(6));
    for (let k = 1; k <= 5; k++) check(a, design(6, k, 10 + k));
  });
});

describe('fast spectrum against numeric.eig (a second general-purpose eigen-solver)', () => {
  it('lag 1 with intercept, n = 60, k = 5, and lag 2 with gaps, n = 60, k = 2', () => {
    for (const [a, x] of [
      [differenceMatrix(differencePairs(60)), design(60, 5, 20)],
      [differenceMatrix(differencePairs(60, 2, gappedTimes(60))), design(60, 2, 21)],
    ] as const) {
      const { basis, zaz } = projected(a, x);
      const ref = Float64Array.from(numeric.eig(zaz.to2DArray()).lambda.x).sort();
      expect(maxAbsDiff(fastSpectrum(a, basis), ref)).toBeLessThan(1e-11);
    }
  });
});

describe('fast spectrum against closed forms', () => {
  it('a tied spectrum: lag 4, n = 100, intercept only, gives A\'s groups of four equal values (one zero removed)', () => {
    const n = 100;
    const a = differenceMatrix(differencePairs(n, 4));
    const nu = fastSpectrum(a, { n, k: 1, q: new Float64Array(n).fill(1 / Math.sqrt(n)) });
    // four chains of length 25: 4 sin^2(pi j / 50), j = 0..24, each four times; the intercept takes one zero
    const expected: number[] = [0, 0, 0];
    for (let j = 1; j < 25; j++) for (let r = 0; r < 4; r++) expected.push(4 * Math.sin((Math.PI * j) / 50) ** 2);
    expect(maxAbsDiff(nu, expected)).toBeLessThan(1e-13);
  });
  it('a tied spectrum with regressors: lag 4, n = 120, k = 3 agrees with ml-matrix and keeps its ties', () => {
    const nu = check(differenceMatrix(differencePairs(120, 4)), design(120, 3, 30));
    // each interior value of A has multiplicity 4; k = 3 constraints leave at least one copy in place
    let ties = 0;
    for (let i = 1; i < nu.length; i++) if (nu[i] - nu[i - 1] < 1e-12) ties++;
    expect(ties).toBeGreaterThan(0);
  });
  it('n = 1000, k = 5, X spanned by five DCT-II eigenvectors of A: the spectrum of A without them, within 1e-12', () => {
    const n = 1000;
    const js = [0, 1, 2, 499, 999];
    const nu = fastSpectrum(differenceMatrix(differencePairs(n)), dctBasis(n, js));
    const expected: number[] = [];
    for (let j = 0; j < n; j++) if (!js.includes(j)) expected.push(4 * Math.sin((Math.PI * j) / (2 * n)) ** 2);
    expect(maxAbsDiff(nu, expected)).toBeLessThan(1e-12);
  });
  it('n = 1000, intercept and a rotated pair of eigenvectors: the same as removing the pair', () => {
    const n = 1000;
    const b = dctBasis(n, [0, 7, 300]);
    // replace columns 2 and 3 by orthonormal mixtures of themselves: col(X) unchanged
    const c = Math.cos(0.3), s = Math.sin(0.3);
    const q = Float64Array.from(b.q);
    for (let t = 0; t < n; t++) {
      const u = b.q[n + t], v = b.q[2 * n + t];
      q[n + t] = c * u + s * v;
      q[2 * n + t] = -s * u + c * v;
    }
    const nu = fastSpectrum(differenceMatrix(differencePairs(n)), { n, k: 3, q });
    const expected: number[] = [];
    for (let j = 0; j < n; j++) if (j !== 0 && j !== 7 && j !== 300) expected.push(4 * Math.sin((Math.PI * j) / (2 * n)) ** 2);
    expect(maxAbsDiff(nu, expected)).toBeLessThan(1e-12);
  });
});

describe('chains of a difference operator', () => {
  it('lag 2 splits 6 observations into the chains 0-2-4 and 1-3-5; a full band matrix has none', () => {
    const ch = operatorChains(differenceMatrix(differencePairs(6, 2)));
    expect(Array.from(ch!.order)).toEqual([0, 2, 4, 1, 3, 5]);
    expect(Array.from(ch!.starts)).toEqual([0, 3, 6]);
    expect(Array.from(ch!.link)).toEqual([-1, -1, 0, -1, -1]);
    const full: BandMatrix = { n: 3, bandwidth: 2, bands: [Float64Array.of(1, 1, 1), Float64Array.of(1, 1), Float64Array.of(1)] };
    expect(operatorChains(full)).toBeNull();
  });
  it('k = 0 gives the spectrum of A itself (closed form, n = 50, lag 1)', () => {
    const n = 50;
    const nu = fastSpectrum(differenceMatrix(differencePairs(n)), { n, k: 0, q: new Float64Array(0) });
    expect(maxAbsDiff(nu, Array.from({ length: n }, (_, j) => 4 * Math.sin((Math.PI * j) / (2 * n)) ** 2))).toBeLessThan(1e-14);
  });
});

describe('fast spectrum: errors a caller can act on', () => {
  it('mismatched shapes raise ENGINE_NOT_APPLICABLE; n beyond the structured limit raises SIZE_LIMIT', () => {
    const a = differenceMatrix(differencePairs(10));
    try { fastSpectrum(a, { n: 10, k: 10, q: new Float64Array(100) }); expect.unreachable(); } catch (err) {
      expect(isDwError(err) && err.code === 'ENGINE_NOT_APPLICABLE').toBe(true);
    }
    const big = FAST_SPECTRUM_MAX_N + 1;
    try { fastSpectrum(differenceMatrix(differencePairs(big)), { n: big, k: 1, q: new Float64Array(big).fill(1 / Math.sqrt(big)) }); expect.unreachable(); } catch (err) {
      expect(isDwError(err) && err.code === 'SIZE_LIMIT').toBe(true);
    }
  });
});
