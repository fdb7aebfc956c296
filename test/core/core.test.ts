/**
 * The numerical core against outside sources: closed forms from published mathematics, the
 * general-purpose libraries jstat, numeric and ml-matrix, and seeded simulation.
 */
import { describe, expect, it } from 'vitest';
import { kronrodPanel, adaptiveIntegrate } from '../../src/numeric/quadrature.js';
import { symmetricEigenvalues } from '../../src/linalg/symmetric-eigen.js';
import { bandToDense, differenceMatrix, differencePairs, durbinWatson } from '../../src/core/difference.js';
import { householderQR } from '../../src/linalg/qr.js';
import { denseSpectrum, spectrumMean, spectrumVariance } from '../../src/core/spectrum.js';
import { imhofDensity } from '../../src/engines/imhof.js';
import { imhofTail } from '../../src/engines/imhof-product.js';
import { DwNullDistribution } from '../../src/distribution/null-distribution.js';
import { brentRoot } from '../../src/numeric/root.js';
import { jStat, numeric, Matrix, EigenvalueDecomposition, seededNormal, seededRandom, referenceSpectrum } from '../helpers/reference.js';

function randomDesign(seed: number, n: number, p: number, intercept: boolean): number[][] {
  const g = seededNormal(seed);
  return Array.from({ length: n }, (_, t) => {
    const row = Array.from({ length: p }, (_, j) => (j === 0 ? t / n : g()));
    return intercept ? [1, ...row] : row;
  });
}

function colMajor(rows: number[][]): Float64Array {
  const n = rows.length, k = rows[0].length;
  const x = new Float64Array(n * k);
  for (let i = 0; i < n; i++) for (let j = 0; j < k; j++) x[j * n + i] = rows[i][j];
  return x;
}

describe('Gauss-Kronrod rule (exactness degrees from Kronrod 1965 / QUADPACK)', () => {
  it('K15 integrates x^22 on [0, 1] exactly and its weights sum to 2 on [-1, 1]', () => {
    expect(kronrodPanel((x) => x ** 22, 0, 1).value).toBeCloseTo(1 / 23, 15);
    expect(kronrodPanel(() => 1, -1, 1).value).toBeCloseTo(2, 15);
  });
  it('the embedded G7 is exact to degree 13, so |K - G| vanishes for x^12', () => {
    expect(kronrodPanel((x) => x ** 12, -1, 1).error).toBeLessThan(1e-15);
    expect(kronrodPanel((x) => x ** 20, -1, 1).error).toBeGreaterThan(1e-6);
  });
  it('adaptive integration of a peaked function agrees with its closed form', () => {
    const r = adaptiveIntegrate((x) => 1 / (1e-4 + x * x), [-1, 1], 1e-9);
    expect(Math.abs(r.value - 2 * 100 * Math.atan(100))).toBeLessThan(1e-9);
    expect(r.converged).toBe(true);
  });
});

describe('symmetric eigenvalues against ml-matrix (general-purpose reference library)', () => {
  it('random symmetric 40 x 40', () => {
    const u = seededRandom(7);
    const m = 40;
    const a = new Float64Array(m * m);
    for (let i = 0; i < m; i++) for (let j = 0; j <= i; j++) { const v = u() - 0.5; a[i * m + j] = v; a[j * m + i] = v; }
    const ref = new EigenvalueDecomposition(new Matrix(Array.from({ length: m }, (_, i) => Array.from(a.subarray(i * m, i * m + m)))), { assumeSymmetric: true })
      .realEigenvalues.slice().sort((x, y) => x - y);
    const got = symmetricEigenvalues(Float64Array.from(a), m);
    ref.forEach((v, i) => expect(Math.abs(got[i] - v)).toBeLessThan(1e-12));
  });
  it('ties: the 2 x 2 block pattern diag(1,1,3,3) rotated keeps its repeated values', () => {
    const got = symmetricEigenvalues(Float64Array.of(2, 1, 0, 0, 1, 2, 0, 0, 0, 0, 2, 1, 0, 0, 1, 2), 4);
    expect(Array.from(got).map((v) => +v.toFixed(12))).toEqual([1, 1, 3, 3]);
  });
});

describe('spectrum of M A M (docs/methods.md section 2)', () => {
  it('intercept only: nu_j = 2 - 2 cos(pi j / n), j = 1..n-1 (closed-form eigenvalues of A)', () => {
    const n = 15;
    const nu = denseSpectrum(differenceMatrix(differencePairs(n)), householderQR(new Float64Array(n).fill(1), n, 1));
    for (let j = 1; j < n; j++) expect(Math.abs(nu[j - 1] - (2 - 2 * Math.cos((Math.PI * j) / n)))).toBeLessThan(1e-13);
  });
  it("random design with intercept: agrees with numeric's eigen-solver on the dense M A M", () => {
    const n = 30;
    const rows = randomDesign(11, n, 3, true);
    const a = differenceMatrix(differencePairs(n));
    const nu = denseSpectrum(a, householderQR(colMajor(rows), n, 4));
    // M A M from numeric: the k = 4 eigenvalues of col(X) are 0; the rest are nu (all > 0 with an intercept)
    const X = rows;
    const Xt = numeric.transpose(X);
    const H = numeric.dot(numeric.dot(X, numeric.inv(numeric.dot(Xt, X))), Xt);
    const M = numeric.sub(numeric.identity(n), H);
    const A = Array.from({ length: n }, (_, i) => Array.from(bandToDense(a).subarray(i * n, i * n + n)));
    const MAM = numeric.dot(numeric.dot(M, A), M);
    const ev = (numeric.eig(MAM).lambda.x as number[]).slice().sort((p, q) => Math.abs(p) - Math.abs(q)).slice(4).sort((p, q) => p - q);
    ev.forEach((v, i) => expect(Math.abs(nu[i] - v)).toBeLessThan(1e-10));
  });
  it('random design without intercept: agrees with an ml-matrix route (Z from the eigenvectors of M)', () => {
    const n = 25;
    const rows = randomDesign(12, n, 3, false);
    const a = differenceMatrix(differencePairs(n));
    const nu = denseSpectrum(a, householderQR(colMajor(rows), n, 3));
    const ref = referenceSpectrum(rows, bandToDense(a), n);
    ref.forEach((v, i) => expect(Math.abs(nu[i] - v)).toBeLessThan(1e-11));
  });
  it('exact mean and variance agree with a seeded simulation of d (within 4 standard errors)', () => {
    const n = 20;
    const nu = denseSpectrum(differenceMatrix(differencePairs(n)), householderQR(colMajor(randomDesign(3, n, 2, true)), n, 3));
    const g = seededNormal(99);
    const draws = 100000;
    let s = 0, s2 = 0, s4 = 0;
    const mean = spectrumMean(nu), variance = spectrumVariance(nu);
    for (let r = 0; r < draws; r++) {
      let num = 0, den = 0;
      for (let i = 0; i < nu.length; i++) { const z = g(); num += nu[i] * z * z; den += z * z; }
      const d = num / den;
      s += d; s2 += (d - mean) ** 2; s4 += (d - mean) ** 4;
    }
    const simMean = s / draws, simVar = s2 / draws;
    expect(Math.abs(simMean - mean)).toBeLessThan(4 * Math.sqrt(variance / draws));
    const seVar = Math.sqrt((s4 / draws - simVar ** 2) / draws);
    expect(Math.abs(simVar - variance)).toBeLessThan(4 * seVar);
  });
});

describe('Imhof engine against closed forms', () => {
  it("two distinct eigenvalues a (mult p), b (mult q): d = a + (b - a) B, B ~ Beta(q/2, p/2) (jstat's beta CDF)", () => {
    // jstat's regularised incomplete beta is itself accurate to about 1e-8 only (it misses the exact
    // sqrt(1/2) of Beta(1/2, 1) at 1/2 by 7.6e-9), so the comparison with it is at 2e-8; the exact
    // cases below hold the engine to 1e-10.
    for (const [a, b, p, q] of [[0.5, 3, 3, 4], [1, 2, 1, 5], [0.2, 3.8, 6, 6], [1.5, 2.5, 2, 1]]) {
      const nu = Float64Array.from([...Array(p).fill(a), ...Array(q).fill(b)]);
      for (const t of [0.05, 0.3, 0.5, 0.77, 0.97]) {
        const c = a + (b - a) * t;
        const want = jStat.beta.cdf(t, q / 2, p / 2);
        const lo = imhofTail(nu, c, 'lower');
        const up = imhofTail(nu, c, 'upper');
        expect(Math.abs(lo.p - want)).toBeLessThan(2e-8);
        expect(Math.abs(up.p - (1 - want))).toBeLessThan(2e-8);
        expect(lo.errorBound).toBeLessThan(1e-10);
      }
    }
  });
  it('Beta laws with elementary CDFs (B(1/2,1): sqrt t; B(1,1/2): 1 - sqrt(1-t); B(1,1): t; B(2,1): t^2) to 1e-10, inside the bound', () => {
    const cases: [number, number, (t: number) => number][] = [
      [2, 1, (t) => Math.sqrt(t)], [1, 2, (t) => 1 - Math.sqrt(1 - t)], [2, 2, (t) => t], [2, 4, (t) => t * t],
    ];
    for (const [p, q, cdf] of cases) {
      const nu = Float64Array.from([...Array(p).fill(0.7), ...Array(q).fill(3.2)]);
      for (const t of [0.01, 0.2, 0.5, 0.8, 0.99]) {
        const lo = imhofTail(nu, 0.7 + 2.5 * t, 'lower');
        expect(Math.abs(lo.p - cdf(t))).toBeLessThan(1e-10);
        expect(Math.abs(lo.p - cdf(t))).toBeLessThanOrEqual(lo.errorBound);
      }
    }
  });
  it('m = 2: the arcsine law P(d <= c) = (2/pi) asin(sqrt((c - nu1)/(nu2 - nu1)))', () => {
    const nu = Float64Array.of(0.4, 3.1);
    for (const c of [0.41, 0.9, 1.75, 2.5, 3.09]) {
      const want = (2 / Math.PI) * Math.asin(Math.sqrt((c - 0.4) / 2.7));
      expect(Math.abs(imhofTail(nu, c, 'lower').p - want)).toBeLessThan(1e-10);
    }
  });
  it('all multiplicities even: the partial-fraction form sum_{mu_j > 0} prod_{i != j} mu_j / (mu_j - mu_i)', () => {
    const distinct = [0.3, 1.1, 1.9, 2.6, 3.7];
    const nu = Float64Array.from(distinct.flatMap((v) => [v, v]));
    for (const c of [0.5, 1.5, 2.2, 3.0, 3.5]) {
      const mu = distinct.map((v) => v - c);
      let pPos = 0;
      mu.forEach((mj, j) => {
        if (mj <= 0) return;
        let prod = 1;
        mu.forEach((mi, i) => { if (i !== j) prod *= mj / (mj - mi); });
        pPos += prod;
      });
      // P(d <= c) = P(Q <= 0) = 1 - P(Q > 0)
      expect(Math.abs(imhofTail(nu, c, 'lower').p - (1 - pPos))).toBeLessThan(1e-10);
      expect(Math.abs(imhofTail(nu, c, 'upper').p - pPos)).toBeLessThan(1e-10);
    }
  });
  it('outside the support the tails are exactly 0 and 1', () => {
    const nu = Float64Array.of(1, 2, 3);
    expect(imhofTail(nu, 0.5, 'lower').p).toBe(0);
    expect(imhofTail(nu, 0.5, 'upper').p).toBe(1);
    expect(imhofTail(nu, 3, 'lower').p).toBe(1);
  });
});

describe('the null distribution object', () => {
  const n = 20;
  const nu = denseSpectrum(differenceMatrix(differencePairs(n)), householderQR(colMajor(randomDesign(5, n, 2, true)), n, 3));
  const dist = DwNullDistribution.fromSpectrum(nu);
  it('cdf + sf = 1 within the error bounds, and quantile inverts cdf', () => {
    for (const c of [0.8, 1.3, 2.0, 2.7, 3.3]) {
      const lo = dist.lowerTail(c), up = dist.upperTail(c);
      expect(Math.abs(lo.p + up.p - 1)).toBeLessThanOrEqual(lo.errorBound + up.errorBound);
      expect(Math.abs(dist.quantile(lo.p) - c)).toBeLessThan(1e-8);
      expect(Math.abs(dist.upperQuantile(up.p) - c)).toBeLessThan(1e-8);
    }
  });
  it('the density integrates to 1 and is the derivative of the cdf (central differences)', () => {
    const [a, b] = dist.support;
    const pts = 400;
    let area = 0, prev = 0;
    for (let i = 0; i <= pts; i++) {
      const c = a + ((b - a) * i) / pts;
      const f = dist.pdf(c);
      if (i > 0) area += (0.5 * (f + prev) * (b - a)) / pts;
      prev = f;
    }
    expect(Math.abs(area - 1)).toBeLessThan(1e-3);
    for (const c of [1.1, 1.9, 2.6]) {
      const h = 1e-4;
      const num = (dist.cdf(c + h) - dist.cdf(c - h)) / (2 * h);
      expect(Math.abs(imhofDensity(nu, c).value - num)).toBeLessThan(1e-6);
    }
  });
});

describe('published bounds (Savin & White 1977, Econometrica 45, quoted in docs/methods.md section 13)', () => {
  const rows: [number, number, number, number, number][] = [
    [0.05, 6, 1, 0.61, 1.4], [0.05, 10, 1, 0.879, 1.32], [0.05, 15, 1, 1.077, 1.361], [0.05, 20, 1, 1.201, 1.411],
    [0.05, 20, 2, 1.1, 1.537], [0.05, 20, 5, 0.792, 1.991], [0.05, 30, 1, 1.352, 1.489], [0.05, 30, 3, 1.214, 1.65],
    [0.05, 50, 1, 1.503, 1.585], [0.05, 100, 1, 1.654, 1.694], [0.01, 15, 1, 0.811, 1.07], [0.01, 20, 1, 0.952, 1.147],
    [0.01, 30, 1, 1.133, 1.263], [0.01, 50, 1, 1.324, 1.403], [0.01, 100, 1, 1.522, 1.562],
  ];
  it.each(rows)('alpha %s, n %s, k\' %s: d_L %s and d_U %s to 0.001 (Imhof)', (alpha, n, kp, dL, dU) => {
    const m = n - kp - 1;
    const lam = (j: number) => 2 - 2 * Math.cos((Math.PI * j) / n);
    const lower = Float64Array.from({ length: m }, (_, i) => lam(i + 1));
    const upper = Float64Array.from({ length: m }, (_, i) => lam(i + kp + 1));
    expect(Math.abs(DwNullDistribution.fromSpectrum(lower).quantile(alpha) - dL)).toBeLessThan(0.001);
    expect(Math.abs(DwNullDistribution.fromSpectrum(upper).quantile(alpha) - dU)).toBeLessThan(0.001);
  });
});

describe('the statistic', () => {
  it('d equals the direct sum formula', () => {
    const g = seededNormal(4);
    const e = Array.from({ length: 17 }, () => g());
    let num = 0, den = 0;
    for (let t = 1; t < e.length; t++) num += (e[t] - e[t - 1]) ** 2;
    for (const v of e) den += v * v;
    expect(durbinWatson(e)).toBeCloseTo(num / den, 14);
  });
  it('common practice: d is close to 2(1 - r1) on a long AR(1) series (rho = 0.5)', () => {
    const g = seededNormal(21);
    const n = 20000;
    const e = new Float64Array(n);
    for (let t = 1; t < n; t++) e[t] = 0.5 * e[t - 1] + g();
    let r = 0, s = 0;
    for (let t = 1; t < n; t++) r += e[t] * e[t - 1];
    for (let t = 0; t < n; t++) s += e[t] * e[t];
    expect(Math.abs(durbinWatson(e) - 2 * (1 - r / s))).toBeLessThan(0.01);
    expect(Math.abs(durbinWatson(e) - 1)).toBeLessThan(0.05);
  });
});

describe('root finder', () => {
  it("Brent's method finds sqrt 2 and a root of cos", () => {
    expect(brentRoot((x) => x * x - 2, 0, 2)).toBeCloseTo(Math.SQRT2, 12);
    expect(brentRoot(Math.cos, 0, 3)).toBeCloseTo(Math.PI / 2, 12);
  });
});
