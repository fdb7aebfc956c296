/**
 * Dynamic models (docs/methods.md section 8): the reference distributions written for the asymptotic
 * tests (normal, chi-square, F, Student t) against jstat, closed forms and values computed with
 * mpmath 1.3.0 at 40 digits; detection of a lagged dependent regressor; Durbin's h, the
 * Breusch-Godfrey LM test and the residual t-test against an explicit second computation with
 * ml-matrix's normal equations; and the CLI.
 *
 * No worked example from a textbook is quoted: none is known reliably enough from memory.
 */
import { describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { chiSquareSf, fSf, incompleteBeta, incompleteGamma, logGamma, normalCdf, normalPdf, normalSf, studentTSf } from '../../src/numeric/tails.js';
import { detectLaggedDependent } from '../../src/dynamic/lagged-dependent.js';
import { breuschGodfrey, durbinH, dynamicModelCheck, residualT, serialCorrelationTests } from '../../src/dynamic/serial-tests.js';
import { buildDesign, factorDesign } from '../../src/model/design.js';
import { fitLeastSquares } from '../../src/model/ols.js';
import { durbinHWords, warningText } from '../../src/report/wording.js';
import { inline } from '../../src/report/format.js';
import { diagnoseCommand } from '../../src/cli/commands/diagnose.js';
import { parseOptions } from '../../src/cli/args.js';
import { isDwError, type DwError } from '../../src/errors.js';
import { processIo, type CliIo } from '../../src/cli/io.js';
import { cli, scratch } from '../helpers/cli.js';
import { jStat, Matrix, seededNormal, solve } from '../helpers/reference.js';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('normal distribution (written here, erfc-free series and continued fraction)', () => {
  it('central values against jstat to 3e-16 absolute', () => {
    for (let z = -3; z <= 3; z += 0.125) {
      expect(Math.abs(normalCdf(z) - jStat.normal.cdf(z, 0, 1))).toBeLessThan(3e-16);
      expect(Math.abs(normalPdf(z) - jStat.normal.pdf(z, 0, 1))).toBeLessThan(3e-16);
    }
  });
  it('tails against mpmath (40 digits) to 1e-14 relative, where jstat\'s 1/2(1 + erf) loses its digits', () => {
    const ref: [number, number][] = [
      [-0.3, 0.38208857781104736693], [-0.69, 0.24509709367430947489], [-0.71, 0.23885206808998673293],
      [-1.2, 0.11506967022170827665], [-1.5, 0.066807201268858066004], [-3, 0.0013498980316300945267],
      [-5, 2.8665157187919391167e-7], [-8, 6.2209605742717841235e-16], [-10, 7.619853024160526066e-24],
      [-20, 2.7536241186062336951e-89], [-37, 5.7255712225245768227e-300],
    ];
    for (const [z, p] of ref) {
      expect(rel(normalCdf(z), p)).toBeLessThan(1e-14);
      expect(rel(normalSf(-z), p)).toBeLessThan(1e-14);
    }
  });
  it('the 97.5% point 1.959963984540054 (from memory) gives 0.025; symmetry and complement', () => {
    expect(rel(normalCdf(-1.959963984540054), 0.025)).toBeLessThan(1e-15);
    for (const z of [-6, -1, -0.2, 0, 0.4, 2.5]) {
      expect(normalSf(z)).toBe(normalCdf(-z));
      expect(Math.abs(normalCdf(z) + normalSf(z) - 1)).toBeLessThan(2e-16);
    }
    expect(normalCdf(0)).toBe(0.5);
    expect(normalCdf(-Infinity)).toBe(0);
    expect(normalSf(Infinity)).toBe(0);
  });
});

describe('chi-square, F and Student t tails (regularised incomplete gamma and beta, written here)', () => {
  it('log Gamma against factorials (closed form) and jstat.gammaln', () => {
    let f = 1;
    for (let n = 1; n < 25; n++) {
      expect(Math.abs(logGamma(n + 1) - Math.log((f *= n)))).toBeLessThan(2e-14 * Math.max(1, Math.log(f)));
    }
    expect(Math.abs(logGamma(0.5) - 0.5 * Math.log(Math.PI))).toBeLessThan(1e-15);
    // mpmath (30 digits)
    const ref: [number, number][] = [[0.1, 2.252712651734205902], [0.7, 0.26086724653166656857], [3.3, 0.98709857789473440406],
      [17.5, 32.081114895947349487], [100.5, 361.43554046777762156], [1234.5, 7550.5509010778948957]];
    for (const [x, v] of ref) expect(rel(logGamma(x), v)).toBeLessThan(3e-15);
    // jstat's gammaln is itself accurate to about 1e-13 relative
    for (const [x] of ref) expect(rel(logGamma(x), jStat.gammaln(x))).toBeLessThan(1e-12);
  });
  it('chi-square with 2 df is exp(-x/2) (closed form), to 1e-16 times the exponent x/2 (and 5e-15 below x = 50)', () => {
    for (const x of [0.01, 0.5, 1, 3, 10, 50, 200, 1000]) expect(rel(chiSquareSf(x, 2), Math.exp(-x / 2))).toBeLessThan(Math.max(5e-15, 1e-16 * x));
  });
  it('chi-square with even df 2r is the Poisson sum exp(-x/2) sum_{j<r} (x/2)^j / j! (closed form)', () => {
    for (const r of [2, 3, 5, 10]) {
      for (const x of [0.5, 4, 15, 40]) {
        let term = Math.exp(-x / 2);
        let sum = 0;
        for (let j = 0; j < r; j++) { sum += term; term *= x / 2 / (j + 1); }
        expect(rel(chiSquareSf(x, 2 * r), sum)).toBeLessThan(1e-13);
      }
    }
  });
  it('chi-square with 1 df is 2 P(Z > sqrt x) (closed form) and matches mpmath values', () => {
    for (const x of [0.01, 1, 3.841458820694124, 10, 30]) expect(rel(chiSquareSf(x, 1), 2 * normalSf(Math.sqrt(x)))).toBeLessThan(1e-13);
    const ref: [number, number, number][] = [
      [3.841458820694124, 1, 0.050000000000000057435], [10, 5, 0.075235246146512178722], [50, 30, 0.012402060718900579954],
      [200, 150, 0.0039731859708216113254], [0.1, 3, 0.99183742373187647779], [400, 300, 0.00009678621994933577085],
      [0.001, 0.5, 0.83504024923158716309], [30, 4, 4.8944371280292126139e-6], [1000, 2, 7.1245764067412855315e-218],
    ];
    for (const [x, k, p] of ref) expect(rel(chiSquareSf(x, k), p)).toBeLessThan(1e-12);
  });
  it('chi-square, F and t against jstat (to 1e-9 for chi-square and 1e-6 for F and t: jstat\'s own accuracy, which is below ours — its F(10; 1, 5) is off mpmath by 4e-9 relative)', () => {
    for (const k of [1, 2, 3, 4, 7, 12, 30]) {
      for (const x of [0.2, 1, 2.5, 6, 14, 30]) expect(rel(chiSquareSf(x, k), 1 - jStat.chisquare.cdf(x, k))).toBeLessThan(1e-9);
    }
    for (const [d1, d2] of [[1, 5], [2, 10], [3, 7], [4, 20], [6, 40]]) {
      for (const f of [0.3, 1, 2.5, 5]) expect(rel(fSf(f, d1, d2), 1 - jStat.centralF.cdf(f, d1, d2))).toBeLessThan(1e-6);
    }
    for (const v of [3, 5, 10, 30]) {
      for (const t of [-2, -0.5, 0.5, 1.5, 3]) expect(rel(studentTSf(t, v), 1 - jStat.studentt.cdf(t, v))).toBeLessThan(1e-6);
    }
  });
  it('F(2, d2) has P(F > f) = (1 + 2f/d2)^(-d2/2) and F(d1, 2) has 1 - (d1 f / (2 + d1 f))^(d1/2) (closed forms)', () => {
    for (const d2 of [3, 10, 57]) for (const f of [0.1, 1, 3, 25]) expect(rel(fSf(f, 2, d2), (1 + (2 * f) / d2) ** (-d2 / 2))).toBeLessThan(1e-13);
    for (const d1 of [1, 4, 9]) for (const f of [0.2, 1, 4]) expect(rel(fSf(f, d1, 2), 1 - ((d1 * f) / (2 + d1 * f)) ** (d1 / 2))).toBeLessThan(1e-12);
    const ref: [number, number, number, number][] = [
      [2.5, 4, 20, 0.075146629635274658899], [0.5, 3, 7, 0.69403638756881372389], [10, 1, 5, 0.025031015818452945537],
      [40, 3, 30, 1.3227357450572027001e-10],
    ];
    for (const [f, a, b, p] of ref) expect(rel(fSf(f, a, b), p)).toBeLessThan(1e-12); // mpmath
  });
  it('Student t: Cauchy (1 df) and 2 df closed forms, and mpmath values', () => {
    for (const t of [-3, -0.4, 0.7, 2, 10]) {
      expect(Math.abs(studentTSf(t, 1) - (0.5 - Math.atan(t) / Math.PI))).toBeLessThan(1e-15);
      expect(Math.abs(studentTSf(t, 2) - (0.5 - t / (2 * Math.sqrt(2 + t * t))))).toBeLessThan(1e-15);
    }
    const ref: [number, number, number][] = [
      [2.5, 10, 0.015723422118304402125], [-1, 5, 0.8183912661754386872], [6, 20, 3.6218499652082854007e-6], [3.3, 7, 0.0065603574692190616866],
    ];
    for (const [t, v, p] of ref) expect(rel(studentTSf(t, v), p)).toBeLessThan(1e-12);
  });
  it('the two sides of the incomplete gamma and beta functions add to 1', () => {
    for (const [a, x] of [[0.5, 0.2], [3, 2], [3, 8], [40, 35]]) {
      const g = incompleteGamma(a, x);
      expect(Math.abs(g.lower + g.upper - 1)).toBeLessThan(1e-14);
    }
    for (const [x, a, b] of [[0.2, 2, 3], [0.8, 2, 3], [0.5, 10, 0.5]]) {
      const r = incompleteBeta(x, a, b);
      expect(Math.abs(r.lower + r.upper - 1)).toBeLessThan(1e-14);
      expect(rel(r.lower, jStat.ibeta(x, a, b))).toBeLessThan(1e-7);
    }
  });
});

/** A dynamic model y_t = a + b y_{t-1} + c x_t + u_t with AR(1) errors of parameter phi; y_0 is the pre-sample value. */
function dynamicData(seed: number, n: number, phi: number, b = 0.5) {
  const g = seededNormal(seed);
  const x = Array.from({ length: n }, () => g());
  const y: number[] = [];
  const ylag: number[] = [];
  let prev = 2;
  let u = 0;
  // burn-in of 50 periods so that the start is close to the stationary one
  for (let t = -50; t < n; t++) {
    u = phi * u + g();
    const v = 1 + b * prev + (t >= 0 ? 0.8 * x[t] : 0) + u;
    if (t >= 0) { ylag.push(prev); y.push(v); }
    prev = v;
  }
  return { y, x, ylag };
}

/** OLS by ml-matrix's normal equations: coefficients, residuals, covariance. */
function normalEquations(cols: number[][], y: number[]) {
  const n = y.length;
  const Z = new Matrix(Array.from({ length: n }, (_, i) => cols.map((c) => c[i])));
  const ZtZ = Z.transpose().mmul(Z);
  const b = solve(ZtZ, Z.transpose().mmul(Matrix.columnVector(y)));
  const e = Matrix.columnVector(y).sub(Z.mmul(b)).to1DArray();
  const rss = e.reduce((s, v) => s + v * v, 0);
  const inv = solve(ZtZ, Matrix.eye(cols.length));
  const s2 = rss / (n - cols.length);
  return { b: b.to1DArray(), e, rss, cov: (i: number) => s2 * inv.get(i, i) };
}

describe('detecting a lagged dependent regressor', () => {
  const { y, x, ylag } = dynamicData(3, 30, 0);
  it('finds y lagged one period whatever its first (pre-sample) value', () => {
    expect(detectLaggedDependent(y, { x, ylag })).toBe('ylag');
    expect(detectLaggedDependent(y, { x, ylag: [-99, ...ylag.slice(1)] })).toBe('ylag');
    expect(detectLaggedDependent(y, { x })).toBeNull();
  });
  it('accepts differences up to 1e-12 relative to max |y|, and no more', () => {
    const scale = Math.max(...y.map(Math.abs));
    expect(detectLaggedDependent(y, { near: ylag.map((v, t) => v + (t % 2 ? 5e-13 : -5e-13) * scale) })).toBe('near');
    expect(detectLaggedDependent(y, { far: ylag.map((v, t) => v + (t === 7 ? 1e-9 * scale : 0)) })).toBeNull();
    expect(detectLaggedDependent(y, { lag2: [0, 0, ...y.slice(0, -2)] })).toBeNull();
  });
  it('with gaps in time, compares only rows whose previous period is observed', () => {
    const times = [1, 2, 3, 5, 6, 7, 8];
    const yy = [1, 4, 2, 7, 5, 3, 6];
    // row 4 (time 5) follows a gap: its lag (y at time 4) was not observed and may be anything
    expect(detectLaggedDependent(yy, { ylag: [0, 1, 4, 9.5, 7, 5, 3] }, times)).toBe('ylag');
    expect(detectLaggedDependent(yy, { ylag: [0, 1, 4, 9.5, 7, 5, 3] })).toBeNull();
  });
});

describe("Durbin's h (Durbin 1970) against a direct computation with ml-matrix", () => {
  it('h = r1 sqrt(n / (1 - n V)) with r1 the residual autocorrelation and V from the OLS covariance, to 1e-10', () => {
    const { y, x, ylag } = dynamicData(5, 40, 0.4);
    const fd = factorDesign(buildDesign({ x, ylag }, 40));
    const fit = fitLeastSquares(fd, y);
    const h = durbinH(fit, 2, 'positive');
    const ref = normalEquations([y.map(() => 1), x, ylag], y);
    let num = 0;
    let den = 0;
    for (let t = 0; t < 40; t++) { den += ref.e[t] ** 2; if (t > 0) num += ref.e[t] * ref.e[t - 1]; }
    const V = ref.cov(2);
    const direct = (num / den) * Math.sqrt(40 / (1 - 40 * V));
    expect(rel(h.r1, num / den)).toBeLessThan(1e-10);
    expect(rel(h.variance, V)).toBeLessThan(1e-10);
    expect(rel(h.h as number, direct)).toBeLessThan(1e-10);
    expect(Math.abs((h.pValue as number) - (1 - jStat.normal.cdf(direct, 0, 1)))).toBeLessThan(1e-14);
    const two = durbinH(fit, 2, 'two-sided');
    expect(Math.abs((two.pValue as number) - 2 * (1 - jStat.normal.cdf(Math.abs(direct), 0, 1)))).toBeLessThan(1e-14);
    expect(Math.abs(h.r1FromD - h.r1)).toBeLessThan(0.15); // r1 ~ 1 - d/2 (common practice)
  });
  it('is undefined, with the reason, when n V >= 1', () => {
    // y nearly a trend, so that y_{t-1} is nearly collinear with the trend and its coefficient is imprecise
    const g = seededNormal(17);
    const n = 12;
    const full = Array.from({ length: n + 1 }, (_, t) => 0.3 * t + 0.3 * g());
    const y = full.slice(1);
    const ylag = full.slice(0, n);
    const trend = Array.from({ length: n }, (_, t) => t + 1);
    const fit = fitLeastSquares(factorDesign(buildDesign({ trend, ylag }, n)), y);
    const h = durbinH(fit, 2);
    expect(h.nV).toBeGreaterThanOrEqual(1);
    expect(h.h).toBeNull();
    expect(h.pValue).toBeNull();
    expect(h.status).toBe('DURBIN_H_UNDEFINED');
    expect(inline(durbinHWords(h), 'text')).toMatch(/^Durbin's h is undefined here: n V = .* >= 1 .*Durbin's alternative test/);
  });
});

describe('Breusch-Godfrey LM test (Breusch 1978, Godfrey 1978) against an explicit auxiliary regression by ml-matrix normal equations', () => {
  for (const order of [1, 2, 4]) {
    it(`order ${order}: R^2, LM = n R^2, F and their p-values (jstat) agree`, () => {
      const n = 36;
      const { y, x, ylag } = dynamicData(11 + order, n, 0.5);
      const fd = factorDesign(buildDesign({ x, ylag }, n));
      const fit = fitLeastSquares(fd, y);
      const bg = breuschGodfrey(fd, fit.residuals, order);
      // second computation: residuals and the auxiliary regression from the normal equations
      const cols = [y.map(() => 1), x, ylag];
      const e = normalEquations(cols, y).e;
      const lags = Array.from({ length: order }, (_, p) => e.map((_, t) => (t > p ? e[t - p - 1] : 0)));
      const aux = normalEquations([...cols, ...lags], e);
      const ee = e.reduce((s, v) => s + v * v, 0);
      const r2 = 1 - aux.rss / ee;
      const k = 3;
      expect(rel(bg.rSquared, r2)).toBeLessThan(1e-9);
      expect(rel(bg.lm, n * r2)).toBeLessThan(1e-9);
      expect(rel(bg.f, (r2 / order) / ((1 - r2) / (n - k - order)))).toBeLessThan(1e-9);
      expect([bg.df1, bg.df2]).toEqual([order, n - k - order]);
      expect(rel(bg.pChiSquare, 1 - jStat.chisquare.cdf(n * r2, order))).toBeLessThan(1e-8);
      expect(rel(bg.pF, 1 - jStat.centralF.cdf(bg.f, order, n - k - order))).toBeLessThan(1e-6);
    });
  }
  it('residual t-test: t of e_{t-1} in the regression of e_t on X_t and e_{t-1}, normal and t(n - k - 1) p-values', () => {
    const n = 30;
    const { y, x, ylag } = dynamicData(23, n, 0.6);
    const fd = factorDesign(buildDesign({ x, ylag }, n));
    const fit = fitLeastSquares(fd, y);
    const rt = residualT(fd, fit.residuals, 'positive');
    const cols = [y.map(() => 1), x, ylag];
    const e = normalEquations(cols, y).e;
    const aux = normalEquations([...cols, e.map((_, t) => (t > 0 ? e[t - 1] : 0))], e);
    const t = aux.b[3] / Math.sqrt(aux.cov(3));
    expect(rel(rt.t, t)).toBeLessThan(1e-9);
    expect(rt.df).toBe(n - 4);
    expect(rel(rt.pValue, 1 - jStat.normal.cdf(t, 0, 1))).toBeLessThan(1e-9);
    expect(rel(rt.pStudent, 1 - jStat.studentt.cdf(t, n - 4))).toBeLessThan(1e-8);
    const neg = residualT(fd, fit.residuals, 'negative');
    expect(Math.abs(neg.pValue - jStat.normal.cdf(t, 0, 1))).toBeLessThan(1e-12);
  });
  it('with gaps, the lagged residual is that of the previous period, 0 when it was not observed', () => {
    const n = 20;
    const { y, x } = dynamicData(29, n, 0.3);
    const times = Array.from({ length: n }, (_, t) => t + (t >= 10 ? 3 : 0));
    const fd = factorDesign(buildDesign({ x }, n));
    const e = fitLeastSquares(fd, y).residuals;
    const bg = breuschGodfrey(fd, e, 1, times);
    const ea = Array.from(e);
    const aux = normalEquations([y.map(() => 1), x, ea.map((_, t) => (t > 0 && t !== 10 ? ea[t - 1] : 0))], ea);
    expect(rel(bg.rSquared, 1 - aux.rss / ea.reduce((s, v) => s + v * v, 0))).toBeLessThan(1e-9);
  });
});

describe('the asymptotic tests keep their size in a dynamic model (seeded simulation; a weak check of an asymptotic claim)', () => {
  it('n = 150, 1500 replications: rejection rates of BG(1) and h at 5% within 0.025 of 0.05', () => {
    const reps = 1500;
    let bgHits = 0;
    let hHits = 0;
    let hCount = 0;
    for (let r = 0; r < reps; r++) {
      const { y, x, ylag } = dynamicData(1000 + r, 150, 0);
      const s = serialCorrelationTests({ y, x: { x, ylag }, laggedDependent: 'ylag', alternative: 'two-sided' });
      if (s.breuschGodfrey.pChiSquare <= 0.05) bgHits++;
      if (s.durbinH && s.durbinH.pValue !== null) { hCount++; if (s.durbinH.pValue <= 0.05) hHits++; }
    }
    expect(Math.abs(bgHits / reps - 0.05)).toBeLessThan(0.025);
    expect(hCount).toBe(reps);
    expect(Math.abs(hHits / hCount - 0.05)).toBeLessThan(0.025);
  });
});

describe('dynamicModelCheck: d is not valid, and what replaces it', () => {
  const { y, x, ylag } = dynamicData(41, 40, 0.5);
  it('detects the lagged dependent regressor and says d is not valid; the numbers are those of the parts', () => {
    const r = dynamicModelCheck({ y, x: { x, ylag }, order: 2 });
    expect(r).not.toBeNull();
    expect(r!.laggedDependent).toBe('ylag');
    expect(r!.how).toBe('detected');
    expect(r!.notes[0]).toEqual({ code: 'D_NOT_VALID_LAGGED_DEPENDENT', column: 'ylag', how: 'detected', hDefined: r!.durbinH.h !== null, bgOrder: 2 });
    expect(inline(warningText(r!.notes[0]), 'text')).toMatch(/not a valid test/);
    expect(r!.asymptotic).toBe(true);
    const s = serialCorrelationTests({ y, x: { x, ylag }, laggedDependent: 'ylag', order: 2 });
    expect(r!.breuschGodfrey).toEqual(s.breuschGodfrey);
    expect(r!.durbinH).toEqual(s.durbinH);
    expect(r!.residualT).toEqual(s.residualT);
    expect(r!.breuschGodfrey.order).toBe(2);
  });
  it('declared: how is "declared"; a declared column that is not y lagged gets a note', () => {
    expect(dynamicModelCheck({ y, x: { x, ylag }, laggedDependent: 'ylag' })!.how).toBe('declared');
    const odd = dynamicModelCheck({ y, x: { x, ylag }, laggedDependent: 'x' });
    expect(odd!.notes).toContainEqual({ code: 'LAGGED_DEPENDENT_MISMATCH', column: odd!.laggedDependent });
    expect(odd!.notes.map((n) => inline(warningText(n), 'text')).join(' ')).toMatch(/not equal to y lagged/);
  });
  it('null without a lagged dependent variable, or with detection turned off', () => {
    expect(dynamicModelCheck({ y, x: { x } })).toBeNull();
    expect(dynamicModelCheck({ y, x: { x, ylag }, laggedDependent: false })).toBeNull();
  });
  it('bad input: unknown column, order 0, an order too high for n', () => {
    expect(() => dynamicModelCheck({ y, x: { x, ylag }, laggedDependent: 'nope' })).toThrow(expect.objectContaining({ code: 'COLUMN_UNKNOWN' }));
    expect(() => dynamicModelCheck({ y, x: { x, ylag }, order: 0 })).toThrow(expect.objectContaining({ code: 'OPTION_VALUE' }));
    expect(() => dynamicModelCheck({ y, x: { x, ylag }, order: 36 })).toThrow(expect.objectContaining({ code: 'TOO_FEW_ROWS' }));
  });
});

describe('exact-dw diagnose and exact-dw test --lagged-dependent (CLI)', () => {
  const dir = scratch();
  const { y, x, ylag } = dynamicData(43, 30, 0.4);
  const data = join(dir, 'dyn.csv');
  writeFileSync(data, 'year,y,x,ylag\n' + y.map((v, t) => `${1990 + t},${v},${x[t]},${ylag[t]}`).join('\n') + '\n');
  async function runDiagnose(argv: string[]) {
    let out = '';
    let err = '';
    const io: CliIo = { ...processIo, out: (t) => { out += t; }, err: (t) => { err += t; } };
    try {
      const { values, positionals } = parseOptions(argv, diagnoseCommand.options, 'diagnose');
      return { status: await diagnoseCommand.run({ values, positionals, io }), out, err };
    } catch (e) {
      if (isDwError(e)) return { status: 2, out, err: (e as DwError).toLine() };
      throw e;
    }
  }
  it('diagnose detects ylag and reports h, BG (chi-square and F) and the t-test as the library does', async () => {
    const r = await runDiagnose([data, '--y', 'y', '--time', 'year', '--bg-order', '2', '--format', 'json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.laggedDependent).toEqual({ name: 'ylag', how: 'detected' });
    expect(j.dValid).toBe(false);
    expect(j.asymptotic).toBe(true);
    const lib = dynamicModelCheck({ y, x: { x, ylag }, order: 2, times: y.map((_, t) => 1990 + t) })!;
    expect(j.durbinH.h).toBe(lib.durbinH.h);
    expect(j.breuschGodfrey.lm).toBe(lib.breuschGodfrey.lm);
    expect(j.breuschGodfrey.pF).toBe(lib.breuschGodfrey.pF);
    expect(j.residualT.t).toBe(lib.residualT.t);
    const text = await runDiagnose([data, '--y', 'y']);
    expect(text.out).toMatch(/not a valid test/);
    expect(text.out).toMatch(/Durbin's h = /);
    expect(text.out).toMatch(/Breusch-Godfrey, order 1/);
  });
  it('diagnose without a lagged dependent regressor says the exact test applies', async () => {
    const j = JSON.parse((await runDiagnose([data, '--y', 'y', '--x', 'x', '--format', 'json'])).out);
    expect(j.dValid).toBe(true);
    expect(j.durbinH).toBeNull();
    expect(j.breuschGodfrey.order).toBe(1);
  });
  it('diagnose: unknown declared column and bad order exit with one line', async () => {
    const a = await runDiagnose([data, '--y', 'y', '--lagged-dependent', 'lagy']);
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/'lagy' is not among the regressors/);
    const b = await runDiagnose([data, '--y', 'y', '--bg-order', '0']);
    expect(b.status).toBe(2);
  });
  it('is registered in the command list (exact-dw diagnose)', async () => {
    const r = await cli('diagnose', data, '--y', 'y', '--format', 'json');
    expect(r.status).toBe(0);
  });
  it('exact-dw test --lagged-dependent ylag --bg-order 2: the result says d is not valid and carries the checks', async () => {
    const r = await cli('test', data, '--y', 'y', '--time', 'year', '--lagged-dependent', 'ylag', '--bg-order', '2', '--format', 'json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.dynamic.laggedDependent).toBe('ylag');
    expect(j.dynamic.how).toBe('declared');
    expect(j.dynamic.breuschGodfrey.order).toBe(2);
    expect(j.warnings).toContainEqual({ code: 'D_NOT_VALID_LAGGED_DEPENDENT', column: 'ylag', how: 'declared', hDefined: j.dynamic.durbinH.h !== null, bgOrder: 2 });
    // detected without the option too
    const d = JSON.parse((await cli('test', data, '--y', 'y', '--time', 'year', '--format', 'json')).out);
    expect(d.dynamic.how).toBe('detected');
  });
});
