/**
 * Property-based tests (fast-check, seeded so that every run draws the same cases): the exact
 * null distribution behaves as a distribution should, and d with its p-values depend on the
 * column space of X and on the residual direction only (Durbin & Watson 1950: d = e'Ae / e'e with
 * e = M y, M the projector off col(X)), so every transformation that keeps col(X) and the residual
 * direction must leave them unchanged. References: the defining properties of a CDF and its
 * inverse; the invariances follow from the formula; the direct sum formula is checked against
 * residuals from ml-matrix's normal equations (general-purpose library).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DwNullDistribution } from '../src/distribution/null-distribution.js';
import { imhofDensity } from '../src/engines/imhof.js';
import { exactDwTest, type DwTestResult } from '../src/inference/dw-test.js';
import { Matrix, solve } from './helpers/reference.js';

const SEED = 42;

/** An ascending spectrum of m values in [0, 4] with distinct values (d's support for lag 1). */
const spectrum = fc.array(fc.double({ min: 0.01, max: 3.99, noNaN: true }), { minLength: 2, maxLength: 16 })
  .map((v) => Float64Array.from(new Set(v.map((x) => Math.round(x * 1e6) / 1e6))).sort())
  .filter((nu) => nu.length >= 2 && nu[nu.length - 1] - nu[0] > 0.05);

describe('the exact null distribution (properties of any distribution function)', () => {
  it('the CDF is monotone and within [0, 1] (up to its error bound)', () => {
    fc.assert(fc.property(spectrum, fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (nu, u, v) => {
      const dist = DwNullDistribution.fromSpectrum(nu);
      const [lo, hi] = [nu[0] - 0.1, nu[nu.length - 1] + 0.1];
      const a = lo + Math.min(u, v) * (hi - lo);
      const b = lo + Math.max(u, v) * (hi - lo);
      const pa = dist.lowerTail(a);
      const pb = dist.lowerTail(b);
      expect(pa.p).toBeGreaterThanOrEqual(0);
      expect(pb.p).toBeLessThanOrEqual(1);
      expect(pa.p).toBeLessThanOrEqual(pb.p + pa.errorBound + pb.errorBound);
    }), { seed: SEED, numRuns: 60 });
  });
  it('cdf + sf = 1 within the sum of their error bounds (sf computed directly)', () => {
    fc.assert(fc.property(spectrum, fc.double({ min: 0, max: 1, noNaN: true }), (nu, u) => {
      const dist = DwNullDistribution.fromSpectrum(nu);
      const c = nu[0] + u * (nu[nu.length - 1] - nu[0]);
      const l = dist.lowerTail(c);
      const r = dist.upperTail(c);
      expect(Math.abs(l.p + r.p - 1)).toBeLessThanOrEqual(l.errorBound + r.errorBound + 1e-15);
    }), { seed: SEED, numRuns: 60 });
  });
  it('quantile(cdf(c)) = c, to the CDF error divided by the density', () => {
    fc.assert(fc.property(spectrum, fc.double({ min: 0.05, max: 0.95, noNaN: true }), (nu, u) => {
      const dist = DwNullDistribution.fromSpectrum(nu);
      const c = nu[0] + u * (nu[nu.length - 1] - nu[0]);
      const t = dist.lowerTail(c);
      fc.pre(t.p > 1e-3 && t.p < 1 - 1e-3);
      const f = imhofDensity(nu, c).value;
      fc.pre(f > 1e-3);
      const back = dist.quantile(t.p);
      // Brent's tolerance 1e-12 (times the spread) plus the CDF's own error over the density
      expect(Math.abs(back - c)).toBeLessThanOrEqual(2e-12 * 4 + (4 * t.errorBound + 1e-13) / f);
      const up = dist.upperQuantile(dist.sf(c));
      expect(Math.abs(up - c)).toBeLessThanOrEqual(2e-12 * 4 + (4 * t.errorBound + 1e-13) / f);
    }), { seed: SEED, numRuns: 40 });
  });
});

/**
 * A random regression: n observations, p regressors and y, with values like those of a data file
 * (two decimals in [-10, 10]); the transformations below are then exact enough in floating point
 * that they keep col(X) to rounding (subnormal or wildly mixed magnitudes would not: a shift of
 * 1e-237 swallows a value of 1e-300, changing the data, not the computation).
 */
const cell = fc.integer({ min: -1000, max: 1000 }).map((v) => v / 100);
const regression = fc.integer({ min: 8, max: 22 }).chain((n) => fc.integer({ min: 1, max: 3 }).chain((p) =>
  fc.record({
    n: fc.constant(n),
    cols: fc.array(fc.array(cell, { minLength: n, maxLength: n }), { minLength: p, maxLength: p }),
    y: fc.array(cell, { minLength: n, maxLength: n }),
  })));

type Reg = { n: number; cols: number[][]; y: number[] };
const named = (cols: number[][]) => Object.fromEntries(cols.map((c, j) => [`x${j + 1}`, c]));

function tryTest(y: number[], cols: Record<string, number[]>): DwTestResult | null {
  try { return exactDwTest({ y, x: cols, alternative: 'two-sided' }); } catch { return null; }
}

/** d and every p-value agree (absolute 1e-9: far above rounding for these well-conditioned draws). */
function same(a: DwTestResult, b: DwTestResult): void {
  expect(Math.abs(a.d - b.d)).toBeLessThan(1e-9);
  expect(Math.abs(a.pPositive - b.pPositive)).toBeLessThan(1e-9);
  expect(Math.abs(a.pNegative - b.pNegative)).toBeLessThan(1e-9);
  expect(Math.abs(a.pTwoSided - b.pTwoSided)).toBeLessThan(1e-9);
  expect(Math.abs(a.critical.lower - b.critical.lower)).toBeLessThan(1e-8);
  expect(Math.abs(a.critical.upper - b.critical.upper)).toBeLessThan(1e-8);
}

/** Skip the rare draw that is nearly collinear or nearly fits exactly (invariance is then loose). */
function base(r: Reg): DwTestResult {
  const a = tryTest(r.y, named(r.cols));
  fc.pre(a !== null && a.warnings.length === 0 && (a.rSquared ?? 0) < 0.999);
  return a as DwTestResult;
}

describe('d and its p-values depend only on col(X) and the residual direction', () => {
  const runs = { seed: SEED, numRuns: 25 };
  it('rescaling a regressor (by 10^-6 .. 10^6)', () => {
    fc.assert(fc.property(regression, fc.integer({ min: -6, max: 6 }), (r, e) => {
      const a = base(r);
      const b = tryTest(r.y, named(r.cols.map((c, j) => (j === 0 ? c.map((v) => v * 10 ** e) : c))));
      same(a, b as DwTestResult);
    }), runs);
  });
  it('re-centring a regressor (with an intercept)', () => {
    fc.assert(fc.property(regression, fc.integer({ min: -1e6, max: 1e6 }).map((v) => v / 100), (r, shift) => {
      const a = base(r);
      same(a, tryTest(r.y, named(r.cols.map((c, j) => (j === r.cols.length - 1 ? c.map((v) => v + shift) : c)))) as DwTestResult);
    }), runs);
  });
  it('permuting the columns', () => {
    fc.assert(fc.property(regression, (r) => {
      const a = base(r);
      const rev = [...r.cols].reverse();
      same(a, tryTest(r.y, Object.fromEntries(rev.map((c, j) => [`z${j}`, c]))) as DwTestResult);
    }), runs);
  });
  it('adding a multiple of one column to another', () => {
    fc.assert(fc.property(regression.filter((r) => r.cols.length >= 2), fc.integer({ min: -1000, max: 1000 }).map((v) => v / 100), (r, f) => {
      const a = base(r);
      same(a, tryTest(r.y, named(r.cols.map((c, j) => (j === 1 ? c.map((v, i) => v + f * r.cols[0][i]) : c)))) as DwTestResult);
    }), runs);
  });
  it('an affine change of y (y -> a y + b, with an intercept)', () => {
    fc.assert(fc.property(regression, fc.integer({ min: -3, max: 3 }).chain((e) => fc.integer({ min: 1, max: 999 }).map((m) => m * 10 ** e)), fc.boolean(), fc.integer({ min: -1e6, max: 1e6 }), (r, scale, flip, shift) => {
      const a = base(r);
      const s = flip ? -scale : scale;
      same(a, tryTest(r.y.map((v) => s * v + shift), named(r.cols)) as DwTestResult);
    }), runs);
  });
  it('d equals the direct sum formula on residuals from ml-matrix normal equations', () => {
    fc.assert(fc.property(regression, (r) => {
      const a = base(r);
      const X = new Matrix(r.y.map((_, i) => [1, ...r.cols.map((c) => c[i])]));
      const Y = Matrix.columnVector(r.y);
      const b = solve(X.transpose().mmul(X), X.transpose().mmul(Y));
      const e = Y.sub(X.mmul(b)).to1DArray();
      let num = 0, den = 0;
      for (let t = 0; t < e.length; t++) { den += e[t] * e[t]; if (t > 0) num += (e[t] - e[t - 1]) ** 2; }
      expect(Math.abs(a.d - num / den)).toBeLessThan(1e-8 * (num / den));
    }), runs);
  });
});
