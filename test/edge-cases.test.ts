/**
 * Edge cases found by review, each with a second route as the outside check: degenerate designs
 * (d constant), columns constant up to rounding, residuals from another model, far tails and
 * small levels at n > 1000 (the spectral tail engines, checked against the mpmath-verified Pan and
 * saddlepoint engines on the same spectrum), and the independence of `auto` from cached state.
 */
import { describe, expect, it } from 'vitest';
import { prepareProblem } from '../src/problem/problem.js';
import { exactDwTest, checkResiduals } from '../src/inference/dw-test.js';
import { DwNullDistribution } from '../src/distribution/null-distribution.js';
import { DwError } from '../src/errors.js';
import { seededNormal } from './helpers/reference.js';

function codeOf(f: () => unknown): string {
  try { f(); } catch (e) { return e instanceof DwError ? e.code : `not a DwError: ${String(e)}`; }
  return 'no error';
}

describe('designs for which d is constant', () => {
  it('lag 9 with n = 10 and indicators for the only two differenced rows: D_DEGENERATE, not a hang or a p-value', () => {
    const a = [1, 0, 0, 0, 0, 0, 0, 0, 0, 0];
    const b = [0, 0, 0, 0, 0, 0, 0, 0, 0, 1];
    expect(codeOf(() => prepareProblem({ a, b }, 10, { lag: 9 }))).toBe('D_DEGENERATE');
  });
  it('x = (0, 1, 0) without intercept: d = 1 for every sample (closed form), so D_DEGENERATE', () => {
    expect(codeOf(() => prepareProblem({ x: [0, 1, 0] }, 3, { intercept: false }))).toBe('D_DEGENERATE');
  });
});

describe('a column constant up to rounding', () => {
  it('0.3 / 0.30000000000000004 alternating next to the intercept is RANK_DEFICIENT, named', () => {
    const g = seededNormal(1);
    const n = 20;
    const y = Array.from({ length: n }, () => g());
    const c = Array.from({ length: n }, (_, i) => (i % 2 ? 0.3 : 0.30000000000000004));
    const b = Array.from({ length: n }, () => g());
    try { exactDwTest({ y, x: { c, b } }); expect.unreachable(); } catch (e) {
      expect((e as DwError).code).toBe('RANK_DEFICIENT');
      expect((e as DwError).message).toMatch(/'c' is constant up to rounding/);
    }
  });
  it("a user column named '(intercept)' next to the added intercept is refused", () => {
    expect(codeOf(() => prepareProblem({ '(intercept)': [1, 2, 3, 4, 5, 7] }, 6))).toBe('COLUMN_REPEATED');
  });
});

describe('residuals that do not come from this design', () => {
  const g = seededNormal(2);
  const n = 30;
  const t = Array.from({ length: n }, (_, i) => i);
  const y = t.map((v) => 2 + 0.1 * v + g());
  it('raw y given as residuals is refused (RESIDUALS_NOT_FROM_DESIGN), not read as an exact p = 0', () => {
    expect(codeOf(() => exactDwTest({ residuals: y, x: { t } }))).toBe('RESIDUALS_NOT_FROM_DESIGN');
  });
  it('residuals rounded to 6 significant digits are accepted, cleaned of their col(X) part, and give d to 1e-6', () => {
    const fit = exactDwTest({ y, x: { t } });
    const b = fit.coefficients!.map((c) => c.estimate);
    const e = y.map((v, i) => v - b[0] - b[1] * t[i]);
    const rounded = Float64Array.from(e, (v) => Number(v.toPrecision(6)));
    const r = exactDwTest({ residuals: rounded, x: { t } });
    expect(Math.abs(r.d - fit.d)).toBeLessThan(1e-5);
    const problem = prepareProblem({ t }, n);
    const checked = checkResiduals(problem, rounded);
    let s = 0;
    for (let i = 0; i < n; i++) s += checked.residuals[i];
    expect(Math.abs(s)).toBeLessThan(1e-12);
  });
});

describe('n > 1000: small tails and small levels keep relative accuracy', () => {
  const n = 1500;
  const g = seededNormal(3);
  const x = { trend: Float64Array.from({ length: n }, (_, i) => i / n), z: Float64Array.from({ length: n }, () => g()) };
  const dist = prepareProblem(x, n).distribution;
  const nu = prepareProblem(x, n).distribution.spectrum;
  const spectral = DwNullDistribution.fromSpectrum(nu, { method: 'saddlepoint' });
  it('a far-tail p-value is not reported as 0: it agrees with the saddlepoint engine on the spectrum to 1e-6 relative', () => {
    const c = 1.7;
    const r = dist.lowerTail(c);
    const ref = spectral.lowerTail(c);
    expect(ref.p).toBeGreaterThan(0);
    expect(ref.p).toBeLessThan(1e-8);
    expect(r.p).toBeGreaterThan(0);
    expect(Math.abs(r.p - ref.p) / ref.p).toBeLessThan(1e-6);
  });
  it('the critical value at alpha = 1e-12 agrees with the one solved on the spectrum by the saddlepoint engine', () => {
    const q = dist.quantile(1e-12);
    const want = spectral.quantile(1e-12);
    expect(Math.abs(q - want)).toBeLessThan(1e-7);
  });
  it('a forced engine that cannot resolve a tiny level says so (NOT_CONVERGED) instead of a wrong critical value', () => {
    const forced = new DwNullDistribution(dist.source, { method: 'imhof' });
    expect(codeOf(() => forced.quantile(1e-20))).toBe('NOT_CONVERGED');
  });
  it('auto gives the same number whether or not the spectrum was computed before (bit-identical)', () => {
    const fresh = prepareProblem(x, n).distribution;
    const a = fresh.lowerTail(1.93);
    const warmed = prepareProblem(x, n).distribution;
    void warmed.spectrum;
    const b = warmed.lowerTail(1.93);
    expect(b.p).toBe(a.p);
    expect(b.method).toBe(a.method);
  });
});

describe('an intercept in effect without a constant column', () => {
  it('four quarterly dummies with intercept: false span the constant: centred R^2 and the bounds, as for intercept + three dummies', () => {
    const g = seededNormal(9);
    const n = 24;
    const q = (j: number) => Array.from({ length: n }, (_, i) => (i % 4 === j ? 1 : 0));
    const t = Array.from({ length: n }, (_, i) => i / n);
    const y = t.map((v, i) => 1 + v + 0.3 * (i % 4) + g());
    const full = exactDwTest({ y, x: { t, q0: q(0), q1: q(1), q2: q(2), q3: q(3) }, intercept: false });
    const usual = exactDwTest({ y, x: { t, q1: q(1), q2: q(2), q3: q(3) } });
    expect(full.intercept).toBe(true);
    expect(full.bounds).not.toBeNull();
    expect(full.d).toBeCloseTo(usual.d, 12);
    expect(full.pPositive).toBeCloseTo(usual.pPositive, 10);
    expect(full.rSquared!).toBeCloseTo(usual.rSquared!, 10);
    expect(full.bounds!.dL).toBeCloseTo(usual.bounds!.dL, 10);
  });
});

describe('a time index with gaps given as a regressor', () => {
  it('is taken as the time index by the rule when named like one, flagged when kept as a regressor, and the gaps are honoured', () => {
    const years = [1990, 1991, 1992, 1994, 1995, 1996, 1997, 1999, 2000, 2001, 2002, 2003, 2004, 2006, 2007];
    const g = seededNormal(12);
    const y = years.map((t) => 0.1 * (t - 1990) + g());
    const detected = exactDwTest({ y, x: { year: years } });
    expect(detected.timeColumn).toMatchObject({ name: 'year', how: 'detected', missingPeriods: 3 });
    expect(detected.columns).not.toContain('year');
    expect(detected.warnings).toContainEqual({ code: 'TIME_INDEX_DETECTED', column: 'year', format: 'integer', frequency: 'integer' });
    expect(detected.d).toBe(exactDwTest({ y, x: {}, times: years }).d);
    const kept = exactDwTest({ y, x: { year: years }, timeColumn: false });
    expect(kept.warnings).toContainEqual({ code: 'TIME_GAPS_NOT_HONOURED', column: 'year' });
    expect(kept.gaps).toBe(false);
    const timed = exactDwTest({ y, x: { trend: years.map((t) => t - 1990) }, times: years });
    expect(timed.gaps).toBe(true);
    expect(timed.warnings.map((w) => w.code)).not.toContain('TIME_GAPS_NOT_HONOURED');
    const consecutive = exactDwTest({ y, x: { t: years.map((_, i) => i) } });
    expect(consecutive.warnings.map((w) => w.code)).not.toContain('TIME_GAPS_NOT_HONOURED');
    expect(consecutive.timeColumn).toBeNull(); // 't' is not a time-like name: a trend regressor
  });
});
