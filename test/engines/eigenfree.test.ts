/**
 * The eigen-free characteristic form (docs/methods.md section 5) against the eigenvalue form: weights from
 * a dense reference spectrum of Z'AZ computed by ml-matrix (a general-purpose reference library:
 * QrDecomposition for Q and Z, EigenvalueDecomposition for the spectrum), and, at n = 100000,
 * against the closed-form spectrum of A (lambda_j = 2 - 2 cos(pi j / n), DCT-II eigenvectors).
 */
import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition } from 'ml-matrix';
import { mlMatrixProjection, seededCentred } from '../helpers/reference.js';
import { differenceMatrix, differencePairs } from '../../src/core/difference.js';
import type { BandMatrix, ColumnBasis } from '../../src/core/types.js';
import { eigenfreeForm } from '../../src/engines/eigenfree.js';
import { isDwError } from '../../src/errors.js';

const seeded = seededCentred;

/** Design with intercept, trend, and k - 2 seeded random columns (rows as arrays). */
function design(n: number, k: number, seed: number): number[][] {
  const r = seeded(seed);
  return Array.from({ length: n }, (_, t) => Array.from({ length: k }, (_, j) => (j === 0 ? 1 : j === 1 ? t / n : r())));
}

/**
 * Q (orthonormal basis of col(X)) and the reference weights nu = eig(Z'AZ), both from ml-matrix:
 * QR of [X | R] with R seeded random gives an orthogonal n x n matrix whose first k columns span
 * col(X) and whose last n - k span the complement.
 */
function reference(a: BandMatrix, x: number[][]): { basis: ColumnBasis; nu: Float64Array } {
  const { basis, zaz } = mlMatrixProjection(a, x, 99);
  const nu = Float64Array.from(new EigenvalueDecomposition(zaz, { assumeSymmetric: true }).realEigenvalues).sort();
  return { basis, nu };
}

/** theta and log rho from explicit weights (Imhof 1961). */
function spectralValues(lambda: ArrayLike<number>, u: number): [number, number] {
  let th = 0;
  let lr = 0;
  for (let j = 0; j < lambda.length; j++) {
    const v = lambda[j] * u;
    th += Math.atan(v);
    lr += Math.log1p(v * v);
  }
  return [0.5 * th, 0.25 * lr];
}

const US = Array.from({ length: 25 }, (_, i) => 0.01 * Math.pow(30000, i / 24)); // 0.01 .. 300

function checkAgainstWeights(a: BandMatrix, basis: ColumnBasis, nu: Float64Array, c: number, sign: 1 | -1, tol = 1e-12): void {
  const lambda = nu.map((v) => sign * (v - c));
  const form = eigenfreeForm(a, basis, c, sign);
  const out = new Float64Array(2);
  for (const u of US) {
    form.evaluate(u, out);
    const [th, lr] = spectralValues(lambda, u);
    expect(Math.abs(out[0] - th)).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(th)));
    expect(Math.abs(out[1] - lr)).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(lr)));
  }
  // constants
  let sum = 0;
  let maxAbs = 0;
  let floorSum = 0;
  for (const l of lambda) {
    sum += l;
    maxAbs = Math.max(maxAbs, Math.abs(l));
    floorSum += 0.5 * Math.log(l * l + form.lambdaFloor * form.lambdaFloor);
  }
  expect(form.m).toBe(nu.length);
  expect(form.dimension).toBe(nu.length);
  expect(Math.abs(form.sumLambda - sum)).toBeLessThan(1e-11 * Math.max(1, Math.abs(sum)));
  expect(form.maxAbsLambda).toBeGreaterThanOrEqual(maxAbs);
  expect(Math.abs(form.sumLogAbsLambda - floorSum)).toBeLessThan(1e-8 * Math.max(1, Math.abs(floorSum)));
}

describe('eigen-free theta and log rho agree with the eigenvalue form (weights from ml-matrix)', () => {
  const n = 60;
  const k = 5;
  const x = design(n, k, 1);

  it('lag 1, n = 60, k = 5, u in [0.01, 300], several c, both signs: within 1e-12', () => {
    const a = differenceMatrix(differencePairs(n));
    const { basis, nu } = reference(a, x);
    for (const c of [0.3, 1.1, 1.97, 2.6, 3.7]) {
      checkAgainstWeights(a, basis, nu, c, 1);
      checkAgainstWeights(a, basis, nu, c, -1);
    }
  });

  it('lag 4 (Wallis), n = 60, k = 5: within 1e-12', () => {
    const a = differenceMatrix(differencePairs(n, 4));
    expect(a.bandwidth).toBe(4);
    const { basis, nu } = reference(a, x);
    for (const c of [0.5, 1.5, 2.2, 3.3]) {
      checkAgainstWeights(a, basis, nu, c, 1);
      checkAgainstWeights(a, basis, nu, c, -1);
    }
  });

  it('gapped times, lag 1 and lag 2, n = 60, k = 5: within 1e-12', () => {
    const times = Array.from({ length: n }, (_, t) => t + (t >= 17 ? 1 : 0) + (t >= 40 ? 3 : 0) + (t >= 41 ? 1 : 0));
    for (const lag of [1, 2]) {
      const a = differenceMatrix(differencePairs(n, lag, times));
      const { basis, nu } = reference(a, x);
      for (const c of [0.7, 1.9, 3.1]) {
        checkAgainstWeights(a, basis, nu, c, 1);
        checkAgainstWeights(a, basis, nu, c, -1);
      }
    }
  });

  it('a general symmetric band matrix (bandwidth 2, not a difference operator): within 1e-12', () => {
    const r = seeded(5);
    const bands = [0, 1, 2].map((j) => Float64Array.from({ length: n - j }, () => (j === 0 ? 2 + r() : r())));
    const a: BandMatrix = { n, bandwidth: 2, bands };
    const { basis, nu } = reference(a, x);
    for (const c of [1.2, 2.0, 2.9]) checkAgainstWeights(a, basis, nu, c, 1);
  });

  it('c on an eigenvalue (c = 2, n even, X = [1, t]): one weight is zero, the form still agrees and its constants stay finite', () => {
    const a = differenceMatrix(differencePairs(n));
    const { basis, nu } = reference(a, design(n, 2, 3));
    expect(Math.min(...nu.map((v) => Math.abs(v - 2)))).toBeLessThan(1e-13);
    checkAgainstWeights(a, basis, nu, 2, 1);
    const form = eigenfreeForm(a, basis, 2);
    expect(Number.isFinite(form.sumLogAbsLambda)).toBe(true);
  });

  it('c on an eigenvalue of A that the projection moves (c = 2 - 2 cos(pi / n)): agrees', () => {
    const a = differenceMatrix(differencePairs(n));
    const { basis, nu } = reference(a, x);
    checkAgainstWeights(a, basis, nu, 2 - 2 * Math.cos(Math.PI / n), 1);
  });

  it('theta is the continuous branch far beyond pi/2 (u = 300, 55 weights of one sign: theta near 55 pi / 4)', () => {
    const a = differenceMatrix(differencePairs(n));
    const { basis, nu } = reference(a, x);
    const form = eigenfreeForm(a, basis, -0.5);
    const out = new Float64Array(2);
    form.evaluate(300, out);
    expect(out[0]).toBeGreaterThan(10 * Math.PI);
    expect(Math.abs(out[0] - spectralValues(nu.map((v) => v + 0.5), 300)[0])).toBeLessThan(1e-11);
  });
});

describe('eigen-free form at scale against the closed-form spectrum of A', () => {
  it('n = 100000, k = 5 (X spanned by five DCT-II eigenvectors of A): theta and log rho within 1e-10 relative', () => {
    const n = 100000;
    const a = differenceMatrix(differencePairs(n));
    const js = [0, 3, 250, 50000, 99998];
    const k = js.length;
    const q = new Float64Array(n * k);
    js.forEach((j, col) => {
      const scale = Math.sqrt((j === 0 ? 1 : 2) / n);
      for (let t = 0; t < n; t++) q[col * n + t] = scale * Math.cos((Math.PI * j * (t + 0.5)) / n);
    });
    // the projected spectrum is that of A without the five removed eigenvalues
    const nu: number[] = [];
    for (let j = 0; j < n; j++) if (!js.includes(j)) nu.push(4 * Math.sin((Math.PI * j) / (2 * n)) ** 2);
    const out = new Float64Array(2);
    for (const c of [1.4, 2]) {
      const form = eigenfreeForm(a, { n, k, q }, c);
      expect(form.m).toBe(n - k);
      for (const u of [0.05, 2, 40]) {
        form.evaluate(u, out);
        const [th, lr] = spectralValues(nu.map((v) => v - c), u);
        expect(Math.abs(out[0] - th)).toBeLessThan(1e-10 * Math.abs(th));
        expect(Math.abs(out[1] - lr)).toBeLessThan(1e-10 * Math.abs(lr));
      }
    }
  });
});

describe('eigen-free form: errors a caller can act on', () => {
  it('a basis of the wrong length, k >= n, or a non-finite c raise ENGINE_NOT_APPLICABLE', () => {
    const a = differenceMatrix(differencePairs(10));
    const bad = [
      () => eigenfreeForm(a, { n: 9, k: 1, q: new Float64Array(9) }, 1),
      () => eigenfreeForm(a, { n: 10, k: 10, q: new Float64Array(100) }, 1),
      () => eigenfreeForm(a, { n: 10, k: 1, q: new Float64Array(10).fill(1 / Math.sqrt(10)) }, Number.NaN),
    ];
    for (const f of bad) {
      try { f(); expect.unreachable(); } catch (err) {
        expect(isDwError(err) && err.code === 'ENGINE_NOT_APPLICABLE').toBe(true);
      }
    }
  });
});
