/**
 * Lag-j statistics (Wallis 1972, j = 4 for quarterly data) and gaps in time (docs/methods.md section 1),
 * checked against outside sources: the spectrum against numeric's and ml-matrix's eigen-solvers on
 * the dense matrices, closed forms from published mathematics (eigenvalues of the path Laplacian;
 * the partial-fraction law for weights of even multiplicity, docs/methods.md section 13), the mpmath
 * reference JSON (test/ref/), and seeded simulation; then the CLI contract for --lag and --time.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { bandToDense, differenceMatrix, differencePairs, durbinWatson } from '../../src/core/difference.js';
import { prepareProblem } from '../../src/problem/problem.js';
import { exactDwPValue, exactDwCritical, exactDwTest } from '../../src/inference/dw-test.js';
import { fitLeastSquares } from '../../src/model/ols.js';
import { cli, scratch } from '../helpers/cli.js';
import { numeric, referenceSpectrum, seededNormal } from '../helpers/reference.js';
import { referenceJson } from '../helpers/reference.js';

const seq = (n: number, from = 1) => Array.from({ length: n }, (_, i) => i + from);
const quarterDummy = (n: number, q: number) => seq(n).map((t) => ((t - 1) % 4 === q - 1 ? 1 : 0));

/** numeric's general eigen-solver on M A M (n x n); the k eigenvalues of X's directions are zeros. */
function numericSpectrum(rows: number[][], aDense: Float64Array, n: number): number[] {
  const k = rows[0].length;
  const X = rows;
  const Xt = numeric.transpose(X);
  const H = numeric.dot(numeric.dot(X, numeric.inv(numeric.dot(Xt, X))), Xt);
  const M = numeric.sub(numeric.identity(n), H);
  const A = Array.from({ length: n }, (_, i) => Array.from(aDense.subarray(i * n, i * n + n)));
  const MAM = numeric.dot(numeric.dot(M, A), M);
  // A is positive semi-definite, so every eigenvalue is >= 0 and the k from col(X) are the k
  // smallest (zeros of the spectrum itself, as with lag 4, are indistinguishable from them)
  const ev = (numeric.eig(MAM).lambda.x as number[]).slice().sort((p, q) => p - q);
  return ev.slice(k);
}

function rowsOf(cols: number[][]): number[][] {
  return cols[0].map((_, i) => cols.map((c) => c[i]));
}

function maxDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  expect(a.length).toBe(b.length);
  let d = 0;
  for (let i = 0; i < a.length; i++) d = Math.max(d, Math.abs(a[i] - b[i]));
  return d;
}

describe('the lag-4 and gapped spectra against numeric and ml-matrix on the dense matrices', () => {
  const n = 28;
  const g = seededNormal(4);
  const z = seq(n).map(() => g());
  const designs: [string, number, number[] | undefined, number[][]][] = [
    ['lag 4, intercept + trend + quarter dummies + a random column', 4, undefined,
      [seq(n).map(() => 1), seq(n).map((t) => t / n), quarterDummy(n, 2), quarterDummy(n, 3), quarterDummy(n, 4), z]],
    ['lag 4, intercept + trend', 4, undefined, [seq(n).map(() => 1), seq(n)]],
    ['lag 1, gapped years 1971..2004 without 1975, 1983-1985, 1990, 1999', 1,
      seq(34, 1971).filter((t) => ![1975, 1983, 1984, 1985, 1990, 1999].includes(t)),
      [seq(28).map(() => 1), seq(34, 1971).filter((t) => ![1975, 1983, 1984, 1985, 1990, 1999].includes(t)).map((t) => (t - 1987) / 10), z]],
    ['lag 4, gapped quarters (two quarters missing)', 4, seq(30).filter((t) => t !== 9 && t !== 22),
      [seq(28).map(() => 1), z]],
  ];
  for (const [name, lag, times, cols] of designs) {
    it(`${name}: agreement to 1e-11`, () => {
      const rows = rowsOf(cols);
      const problem = prepareProblem(rows, n, { intercept: false, lag, times });
      const nu = problem.distribution.spectrum;
      const aDense = bandToDense(differenceMatrix(differencePairs(n, lag, times)));
      expect(maxDiff(nu, referenceSpectrum(rows, aDense, n))).toBeLessThan(1e-11);
      expect(maxDiff(nu, numericSpectrum(rows, aDense, n))).toBeLessThan(1e-11);
    });
  }
  it('lag 4 with intercept + quarter dummies: four copies of 2 - 2cos(pi j / (n/4)), j = 1..n/4 - 1 (closed form: the four interleaved chains are path Laplacians, each deflated by its own constant)', () => {
    const n4 = 8;
    const N = 4 * n4;
    const problem = prepareProblem({ q2: quarterDummy(N, 2), q3: quarterDummy(N, 3), q4: quarterDummy(N, 4) }, N, { lag: 4 });
    const expected = seq(n4 - 1).flatMap((j) => [0, 1, 2, 3].map(() => 2 - 2 * Math.cos((Math.PI * j) / n4))).sort((a, b) => a - b);
    expect(maxDiff(problem.distribution.spectrum, expected)).toBeLessThan(1e-13);
  });
  it('gapped times: residual directions constant on each run give nu = 0 (one per run beyond the intercept)', () => {
    const times = seq(30).filter((t) => ![8, 18, 19].includes(t));
    const problem = prepareProblem({}, times.length, { times });
    const nu = problem.distribution.spectrum;
    expect(nu[0]).toBeLessThan(1e-13);
    expect(nu[1]).toBeLessThan(1e-13);
    expect(nu[2]).toBeGreaterThan(1e-3);
  });
});

describe('lag-2 ties against the partial-fraction closed form for weights of even multiplicity (docs/methods.md section 13)', () => {
  it('intercept + parity dummy, n = 24, lag 2: every nu has multiplicity 2, and P(d <= c) matches to 1e-10 at five points', () => {
    const n = 24;
    const problem = prepareProblem({ odd: seq(n).map((t) => t % 2) }, n, { lag: 2 });
    const nu = problem.distribution.spectrum;
    const distinct = seq(n / 2 - 1).map((j) => 2 - 2 * Math.cos((Math.PI * j) / (n / 2)));
    const doubled = distinct.flatMap((v) => [v, v]).sort((a, b) => a - b);
    expect(maxDiff(nu, doubled)).toBeLessThan(1e-13);
    for (const c of [0.3, 1.1, 1.9, 2.6, 3.5]) {
      // Q = sum mu_j (z_{j1}^2 + z_{j2}^2) = sum 2 mu_j E_j, E_j ~ Exp(1):
      // P(Q > 0) = sum over mu_j > 0 of prod_{i != j} mu_j / (mu_j - mu_i)
      const mu = distinct.map((v) => v - c);
      let upper = 0;
      for (let j = 0; j < mu.length; j++) {
        if (mu[j] <= 0) continue;
        let prod = 1;
        for (let i = 0; i < mu.length; i++) if (i !== j) prod *= mu[j] / (mu[j] - mu[i]);
        upper += prod;
      }
      const r = problem.distribution.lowerTail(c);
      expect(Math.abs(r.p - (1 - upper))).toBeLessThan(1e-10);
      expect(Math.abs(problem.distribution.upperTail(c).p - upper)).toBeLessThan(1e-10);
    }
  });
});

interface RefCase {
  id: string; n: number; lag: number; times: number[] | null; intercept: boolean; x: number[][]; k: number;
  nu: number[]; points: { c: number; lower: number; upper: number }[];
}

describe('p-values against the mpmath reference (test/ref/reference.json)', () => {
  const ref = referenceJson('reference.json') as { cases: RefCase[] };
  const lagged = ref.cases.filter((c) => c.lag > 1);
  const gapped = ref.cases.filter((c) => c.times !== null);
  it('the reference file has lag-4 and gapped-time cases', () => {
    expect(lagged.length).toBeGreaterThanOrEqual(1);
    expect(gapped.length).toBeGreaterThanOrEqual(1);
  });
  it('every lag-4 and gapped case: spectrum to 1e-11, both tails to 1e-10 absolute (engine auto, ties included)', () => {
    for (const c of [...lagged, ...gapped]) {
      // the reference lists every column, the constant one included; intercept: false adds nothing
      const problem = prepareProblem(c.x, c.n, { intercept: false, lag: c.lag, times: c.times ?? undefined });
      expect(problem.factored.design.k, c.id).toBe(c.k);
      expect(maxDiff(problem.distribution.spectrum, c.nu), c.id).toBeLessThan(1e-11);
      for (const p of c.points) {
        expect(Math.abs(problem.distribution.cdf(p.c) - p.lower), `${c.id} at ${p.c}`).toBeLessThan(1e-10);
        expect(Math.abs(problem.distribution.sf(p.c) - p.upper), `${c.id} at ${p.c}`).toBeLessThan(1e-10);
      }
    }
  });
});

describe('p-values against seeded simulation (normal errors, least-squares fit, d; within 3.5 standard errors)', () => {
  const reps = 20000;
  function simulate(x: Record<string, number[]>, n: number, lag: number, times: number[] | undefined, cs: number[], seed: number): number[] {
    const problem = prepareProblem(x, n, { lag, times });
    const g = seededNormal(seed);
    const counts = cs.map(() => 0);
    const y = new Float64Array(n);
    for (let r = 0; r < reps; r++) {
      for (let i = 0; i < n; i++) y[i] = 1 + 0.5 * (x.t?.[i] ?? 0) + g();
      const d = durbinWatson(fitLeastSquares(problem.factored, y).residuals, problem.pairs);
      cs.forEach((c, j) => { if (d <= c) counts[j]++; });
    }
    return counts.map((v) => v / reps);
  }
  function check(x: Record<string, number[]>, n: number, lag: number, times: number[] | undefined, seed: number) {
    const dist = prepareProblem(x, n, { lag, times }).distribution;
    const cs = [0.05, 0.25, 0.5, 0.8].map((p) => dist.quantile(p));
    const sim = simulate(x, n, lag, times, cs, seed);
    cs.forEach((c, j) => {
      const p = dist.cdf(c);
      expect(Math.abs(sim[j] - p)).toBeLessThan(3.5 * Math.sqrt(p * (1 - p) / reps));
    });
  }
  it('lag 4, intercept + trend + quarter dummies, n = 32', () => {
    const n = 32;
    check({ t: seq(n), q2: quarterDummy(n, 2), q3: quarterDummy(n, 3), q4: quarterDummy(n, 4) }, n, 4, undefined, 1);
  });
  it('gapped years (1961-2004 without 1966, 1980-1981), intercept + trend', () => {
    const times = seq(44, 1961).filter((t) => ![1966, 1980, 1981].includes(t));
    check({ t: times.map((t) => (t - 1980) / 10) }, times.length, 1, times, 2);
  });
});

describe('CLI: --lag and --time on pvalue, critical and test', () => {
  const dir = scratch();
  const n = 24;
  const g = seededNormal(77);
  const price = seq(n).map(() => +(10 + g()).toFixed(4));
  const y = seq(n).map((t, i) => +(2 + 0.1 * t + 0.3 * price[i] + g()).toFixed(4));
  const years = seq(n, 1991);
  const plain = join(dir, 'plain.csv');
  writeFileSync(plain, 'price\n' + price.join('\n') + '\n');
  const withTime = join(dir, 'time.csv');
  writeFileSync(withTime, 'year,price\n' + price.map((p, i) => `${years[i]},${p}`).join('\n') + '\n');
  const gapYears = seq(n, 1991).map((t) => t + (t > 2000 ? 3 : 0));
  const gapped = join(dir, 'gapped.csv');
  writeFileSync(gapped, 'year,price\n' + price.map((p, i) => `${gapYears[i]},${p}`).join('\n') + '\n');
  const data = join(dir, 'data.csv');
  writeFileSync(data, 'year,y,price\n' + price.map((p, i) => `${years[i]},${y[i]},${p}`).join('\n') + '\n');
  const dataGapped = join(dir, 'data-gapped.csv');
  writeFileSync(dataGapped, 'year,y,price\n' + price.map((p, i) => `${gapYears[i]},${y[i]},${p}`).join('\n') + '\n');

  it('with consecutive times, --time changes nothing: pvalue, critical and test JSON are bit-identical', async () => {
    for (const lag of ['1', '4']) {
      const a = await cli('pvalue', '--design', plain, '--d', '1.3', '--lag', lag, '--format', 'json');
      const b = await cli('pvalue', '--design', withTime, '--time', 'year', '--d', '1.3', '--lag', lag, '--format', 'json');
      expect(a.status).toBe(0);
      expect(b.out).toBe(a.out);
      const c1 = await cli('critical', '--design', plain, '--lag', lag, '--format', 'json');
      const c2 = await cli('critical', '--design', withTime, '--time', 'year', '--lag', lag, '--format', 'json');
      expect(c2.out).toBe(c1.out);
      const t1 = await cli('test', data, '--y', 'y', '--x', 'price', '--lag', lag, '--format', 'json');
      const t2 = await cli('test', data, '--y', 'y', '--x', 'price', '--time', 'year', '--lag', lag, '--format', 'json');
      // the same numbers; only the record of how the run was asked for differs
      const strip = (text: string) => { const j = JSON.parse(text); for (const key of ['input', 'options', 'timeColumn', 'warnings']) delete j[key]; return j; };
      expect(strip(t2.out)).toEqual(strip(t1.out));
      expect(JSON.parse(t2.out).timeColumn).toMatchObject({ name: 'year', how: 'named' });
      expect(JSON.parse(t1.out).timeColumn).toMatchObject({ name: 'year', how: 'detected' });
    }
  });
  it('--lag 4 gives the library\'s lag-4 p-value and critical values, and test reports lag 4', async () => {
    const p = JSON.parse((await cli('pvalue', '--design', plain, '--d', '1.3', '--lag', '4', '--format', 'json')).out);
    const lib = exactDwPValue({ x: { price }, d: 1.3, lag: 4 });
    expect(p.pPositive).toBe(lib.pPositive);
    expect(p.pPositive).not.toBe(exactDwPValue({ x: { price }, d: 1.3 }).pPositive);
    const c = JSON.parse((await cli('critical', '--design', plain, '--lag', '4', '--format', 'json')).out);
    const libC = exactDwCritical({ x: { price }, alpha: 0.05, lag: 4 });
    expect([c.lower, c.upper]).toEqual([libC.lower, libC.upper]);
    const t = await cli('test', data, '--y', 'y', '--x', 'price', '--lag', '4', '--format', 'json');
    const j = JSON.parse(t.out);
    expect(j.lag).toBe(4);
    expect(j.d).toBe(exactDwTest({ y, x: { price }, lag: 4 }).d);
    const text = await cli('test', data, '--y', 'y', '--x', 'price', '--lag', '4');
    expect(text.out).toMatch(/lag 4/);
  });
  it('--time with gaps: the time column is not a regressor, the differences skip the gap, and the result says gaps', async () => {
    const t = JSON.parse((await cli('test', dataGapped, '--y', 'y', '--time', 'year', '--format', 'json')).out);
    expect(t.columns).toEqual(['(intercept)', 'price']);
    expect(t.gaps).toBe(true);
    const lib = exactDwTest({ y, x: { price }, times: gapYears });
    expect(t.d).toBe(lib.d);
    expect(t.pValue).toBe(lib.pValue);
    // the gap removes exactly one difference: 2000 -> 2004
    expect(differencePairs(n, 1, gapYears).from.length).toBe(n - 2);
    const p = JSON.parse((await cli('pvalue', '--design', gapped, '--time', 'year', '--d', '1.3', '--format', 'json')).out);
    expect(p.k).toBe(2);
    expect(p.pPositive).toBe(exactDwPValue({ x: { price }, d: 1.3, times: gapYears }).pPositive);
  });
  it('the bounds tables do not apply with lag > 1 or with gaps, and the result says so', () => {
    const r4 = exactDwTest({ y, x: { price }, lag: 4 });
    expect(r4.bounds).toBeNull();
    expect(r4.warnings.some((w) => w.code === 'BOUNDS_LAG_OR_GAPS')).toBe(true);
    const rg = exactDwTest({ y, x: { price }, times: gapYears });
    expect(rg.bounds).toBeNull();
    expect(rg.warnings.some((w) => w.code === 'BOUNDS_LAG_OR_GAPS')).toBe(true);
    const r1 = exactDwTest({ y, x: { price } });
    expect(r1.warnings.some((w) => w.code === 'BOUNDS_LAG_OR_GAPS')).toBe(false);
  });
  it('bad lag and time input exits 2 with one line: LAG_INVALID, TIME_INVALID, COLUMN_UNKNOWN', async () => {
    const bad = join(dir, 'bad-time.csv');
    writeFileSync(bad, 'year,price\n' + price.map((p, i) => `${i === 5 ? 1990.5 : years[i]},${p}`).join('\n') + '\n');
    const dup = join(dir, 'dup-time.csv');
    writeFileSync(dup, 'year,price\n' + price.map((p, i) => `${i === 5 ? years[4] : years[i]},${p}`).join('\n') + '\n');
    const cases: [string[], RegExp][] = [
      [['pvalue', '--design', plain, '--d', '1.3', '--lag', '0'], /lag must be at least 1/],
      [['pvalue', '--design', plain, '--d', '1.3', '--lag', '24'], /leaves no pair/],
      [['critical', '--design', bad, '--time', 'year'], /not a whole number/],
      [['critical', '--design', dup, '--time', 'year'], /increase strictly|appears twice/],
      [['test', data, '--y', 'y', '--time', 'when'], /no column 'when'/],
    ];
    for (const [argv, msg] of cases) {
      const r = await cli(...argv);
      expect(r.status, argv.join(' ')).toBe(2);
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(msg);
    }
  });
});
