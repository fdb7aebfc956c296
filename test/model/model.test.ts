/** Least squares and the design rules, against ml-matrix (general-purpose reference library). */
import { describe, expect, it } from 'vitest';
import { buildDesign, factorDesign, INTERCEPT_NAME } from '../../src/model/design.js';
import { fitLeastSquares } from '../../src/model/ols.js';
import { exactDwTest } from '../../src/inference/dw-test.js';
import { DwError } from '../../src/errors.js';
import { Matrix, solve, seededNormal } from '../helpers/reference.js';

function codeOf(f: () => unknown): string {
  try { f(); } catch (e) { return e instanceof DwError ? e.code : `not a DwError: ${String(e)}`; }
  return 'no error';
}

describe('least squares against ml-matrix normal equations', () => {
  const g = seededNormal(31);
  const n = 30;
  const x1 = Array.from({ length: n }, (_, t) => 1990 + t);
  const x2 = Array.from({ length: n }, () => 10 + g());
  const y = x1.map((v, t) => 3 + 0.2 * (v - 2000) - 1.5 * x2[t] + g());
  const fit = fitLeastSquares(factorDesign(buildDesign({ year: x1, x2 }, n)), y);
  const X = new Matrix(x1.map((v, t) => [1, v, x2[t]]));
  const Y = Matrix.columnVector(y);
  const XtX = X.transpose().mmul(X);
  const b = solve(XtX, X.transpose().mmul(Y));
  it('coefficients (intercept restored after internal centring)', () => {
    fit.coefficients.forEach((c, j) => expect(Math.abs(c.estimate - b.get(j, 0))).toBeLessThan(1e-8 * (1 + Math.abs(b.get(j, 0)))));
    expect(fit.coefficients.map((c) => c.name)).toEqual([INTERCEPT_NAME, 'year', 'x2']);
  });
  it('standard errors sqrt(sigma^2 diag (X\'X)^-1)', () => {
    const res = Y.sub(X.mmul(b));
    const s2 = res.transpose().mmul(res).get(0, 0) / (n - 3);
    const inv = solve(XtX, Matrix.eye(3));
    fit.coefficients.forEach((c, j) => expect(Math.abs(c.stdError - Math.sqrt(s2 * inv.get(j, j)))).toBeLessThan(1e-6 * Math.sqrt(s2 * inv.get(j, j))));
    expect(Math.abs(fit.sigma2 - s2)).toBeLessThan(1e-10 * s2);
  });
  it('residuals are orthogonal to every column', () => {
    const r = fit.residuals;
    let s1 = 0, s2 = 0, s3 = 0;
    for (let t = 0; t < n; t++) { s1 += r[t]; s2 += r[t] * (x1[t] - 2000); s3 += r[t] * x2[t]; }
    expect(Math.abs(s1) + Math.abs(s2) + Math.abs(s3)).toBeLessThan(1e-9);
  });
});

describe('the intercept rule and rank detection', () => {
  it('adds an intercept by default and detects (does not duplicate) a constant column', () => {
    expect(buildDesign({ t: [1, 2, 3, 4] }, 4).names).toEqual([INTERCEPT_NAME, 't']);
    const d = buildDesign({ one: [1, 1, 1, 1], t: [1, 2, 3, 4] }, 4);
    expect(d.names).toEqual(['one', 't']);
    expect(d.interceptIndex).toBe(0);
    expect(d.interceptAdded).toBe(false);
    expect(buildDesign({ t: [1, 2, 3, 4] }, 4, { intercept: false }).interceptIndex).toBe(-1);
  });
  it('names the offending column of an exactly collinear design', () => {
    try {
      factorDesign(buildDesign({ a: [1, 2, 3, 4, 5, 6], b: [2, 1, 4, 3, 6, 5], c: [3, 3, 7, 7, 11, 11] }, 6));
      expect.unreachable();
    } catch (e) {
      expect((e as DwError).code).toBe('RANK_DEFICIENT');
      expect((e as DwError).message).toContain("'c'");
    }
  });
  it('a second constant column is rank deficient', () => {
    expect(codeOf(() => buildDesign({ a: [2, 2, 2, 2], b: [5, 5, 5, 5], t: [1, 2, 3, 4] }, 4))).toBe('RANK_DEFICIENT');
  });
  it('too few rows for k + 2', () => {
    expect(codeOf(() => buildDesign({ a: [1, 2, 3], b: [4, 1, 2] }, 3))).toBe('TOO_FEW_ROWS');
  });
});

describe('the test function', () => {
  const g = seededNormal(8);
  const n = 25;
  const t = Array.from({ length: n }, (_, i) => i + 1);
  const y = t.map((v) => 1 + 0.3 * v + g());
  it('y mode and residual mode give the same d and p-values', () => {
    const a = exactDwTest({ y, x: { t } });
    const b = exactDwTest({ residuals: a.coefficients ? residualsOf(y, t, a.coefficients.map((c) => c.estimate)) : [], x: { t } });
    expect(b.d).toBeCloseTo(a.d, 10);
    expect(b.pPositive).toBeCloseTo(a.pPositive, 10);
    expect(b.warnings).toEqual([]);
  });
  it('refuses residuals that are not orthogonal to the design (they come from another model)', () => {
    expect(codeOf(() => exactDwTest({ residuals: y, x: { t } }))).toBe('RESIDUALS_NOT_FROM_DESIGN');
  });
  it('two-sided p is min(1, 2 min) and critical values sit at alpha/2', () => {
    const r = exactDwTest({ y, x: { t }, alternative: 'two-sided', alpha: 0.1 });
    expect(r.pTwoSided).toBeCloseTo(Math.min(1, 2 * Math.min(r.pPositive, r.pNegative)), 15);
    expect(r.critical.tailLevel).toBe(0.05);
  });
  it('bad alpha, conflicting inputs and all-zero residuals are typed errors', () => {
    expect(codeOf(() => exactDwTest({ y, x: { t }, alpha: 1.5 }))).toBe('ALPHA_OUT_OF_RANGE');
    expect(codeOf(() => exactDwTest({ y, residuals: y, x: { t } }))).toBe('OPTION_CONFLICT');
    expect(codeOf(() => exactDwTest({ y: t.map((v) => 2 * v + 1), x: { t } }))).toBe('RESIDUALS_ZERO');
  });
});

function residualsOf(y: number[], t: number[], b: number[]): number[] {
  return y.map((v, i) => v - b[0] - b[1] * t[i]);
}
