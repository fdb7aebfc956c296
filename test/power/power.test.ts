/**
 * Exact power against AR(1) errors (docs/methods.md section 6), checked against outside sources:
 * the null distribution itself (power at rho = 0 is alpha), an independent dense computation of
 * the weights with ml-matrix (Cholesky of S_rho, explicit M, symmetric eigen-solver), the mpmath
 * reference JSON (test/ref/), and seeded simulation of AR(1) errors with a stationary start.
 */
import { describe, expect, it } from 'vitest';
import { notesText } from '../helpers/power.js';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { bandToDense, durbinWatson } from '../../src/core/difference.js';
import { columnBasis } from '../../src/linalg/qr.js';
import { prepareProblem } from '../../src/problem/problem.js';
import { alternativeTail, exactPower, powerForProblem } from '../../src/power/exact-power.js';
import { errorCovariance, powerContext, powerWeights } from '../../src/power/weights.js';
import { parseRhoList, powerCommand } from '../../src/cli/commands/power.js';
import { parseOptions } from '../../src/cli/args.js';
import { isDwError, type DwError } from '../../src/errors.js';
import type { CliIo } from '../../src/cli/io.js';
import { processIo } from '../../src/cli/io.js';
import { cli, scratch } from '../helpers/cli.js';
import { CholeskyDecomposition } from 'ml-matrix';
import { EigenvalueDecomposition, Matrix, seededNormal, solve } from '../helpers/reference.js';
import { referenceJson } from '../helpers/reference.js';
import { randomColumns, trend } from '../helpers/reference.js';



/** Run one command object as runCli would (exit 2 and one line on a DwError), without the registry. */
async function runCommand(argv: string[]): Promise<{ status: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const io: CliIo = { ...processIo, out: (t) => { out += t; }, err: (t) => { err += t; } };
  try {
    const { values, positionals } = parseOptions(argv, powerCommand.options, 'power');
    const status = await powerCommand.run({ values, positionals, io });
    return { status, out, err };
  } catch (e) {
    if (isDwError(e)) return { status: 2, out, err: `exact-dw: ${(e as DwError).toLine()}\n` };
    throw e;
  }
}

/**
 * Monte Carlo power: u stationary AR(1) (u_1 ~ N(0, 1/(1 - rho^2))) on the time axis `times`
 * (consecutive when omitted), residuals from the projection on col(X), d, and the share rejected.
 */
function simulatePower(opts: {
  x: Record<string, number[]>; n: number; rho: number; reps: number; seed: number;
  reject: (d: number) => boolean; lag?: number; times?: number[]; seasonal?: boolean;
}): number {
  const { n, rho, reps } = opts;
  const problem = prepareProblem(opts.x, n, { lag: opts.lag, times: opts.times });
  const { q, k } = columnBasis(problem.factored.qr);
  const g = seededNormal(opts.seed);
  const times = opts.times ?? trend(n);
  const span = times[n - 1] - times[0] + 1;
  const step = opts.seasonal ? (opts.lag ?? 1) : 1;
  const full = new Float64Array(span);
  const e = new Float64Array(n);
  let hits = 0;
  for (let r = 0; r < reps; r++) {
    for (let t = 0; t < span; t++) {
      full[t] = t < step ? g() / Math.sqrt(1 - rho * rho) : rho * full[t - step] + g();
    }
    for (let i = 0; i < n; i++) e[i] = full[times[i] - times[0]];
    for (let j = 0; j < k; j++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += q[j * n + i] * e[i];
      for (let i = 0; i < n; i++) e[i] -= s * q[j * n + i];
    }
    if (opts.reject(durbinWatson(e, problem.pairs))) hits++;
  }
  return hits / reps;
}

describe('power at rho = 0 is the size of the test (docs/methods.md section 6: the weights reduce to nu - c)', () => {
  const cases: [string, Record<string, number[]>, number, boolean][] = [
    ['intercept + trend, n = 20', { t: trend(20) }, 20, true],
    ['intercept + 3 random columns, n = 30', randomColumns(11, 30, 3), 30, true],
    ['no intercept, trend only, n = 12', { t: trend(12) }, 12, false],
  ];
  for (const [name, x, n, intercept] of cases) {
    it(`${name}: |power(0) - alpha| below 1e-9 for all three alternatives`, () => {
      for (const alternative of ['positive', 'negative', 'two-sided'] as const) {
        for (const alpha of [0.01, 0.05]) {
          const s = exactPower({ x, n, intercept, alpha, rho: [0], alternative });
          expect(Math.abs(s.curve[0].power - alpha)).toBeLessThan(1e-9);
          expect(s.curve[0].errorBound).toBeLessThan(1e-9);
        }
      }
    });
  }
});

describe('the weights against an independent dense computation (ml-matrix: Cholesky of S_rho, explicit M, eigenvalues of L\'M(A - cI)ML)', () => {
  for (const [label, lag, times] of [
    ['lag 1, consecutive', 1, undefined],
    ['lag 4', 4, undefined],
    ['lag 1, gapped times', 1, [1, 2, 3, 5, 6, 7, 8, 9, 12, 13, 14, 15, 16, 17, 18, 20, 21, 22]],
  ] as const) {
    it(`${label}: the n eigenvalues are the m weights and k zeros, to 1e-10`, () => {
      const n = 18;
      const x = randomColumns(5, n, 2);
      const problem = prepareProblem(x, n, { lag, times: times as number[] | undefined });
      const ctx = powerContext(problem.factored.qr, problem.operator, lag, times as number[] | undefined);
      const rows = Array.from({ length: n }, (_, i) => [1, x.x1[i], x.x2[i]]);
      const X = new Matrix(rows);
      const M = Matrix.eye(n).sub(X.mmul(solve(X.transpose().mmul(X), X.transpose())));
      const aDense = bandToDense(problem.operator);
      for (const [rho, c] of [[0.5, 1.4], [-0.7, 2.3], [0.95, 0.9]]) {
        const w = powerWeights(ctx, c, rho);
        const S = new Matrix(n, n);
        const s = errorCovariance(ctx, rho);
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) S.set(i, j, s[i * n + j] / (1 - rho * rho));
        const L = new CholeskyDecomposition(S).lowerTriangularMatrix;
        const AC = new Matrix(n, n);
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) AC.set(i, j, aDense[i * n + j] - (i === j ? c : 0));
        const N = L.transpose().mmul(M).mmul(AC).mmul(M).mmul(L);
        const sym = N.add(N.transpose()).mul(0.5);
        const ref = new EigenvalueDecomposition(sym, { assumeSymmetric: true }).realEigenvalues.slice().sort((a, b) => a - b);
        // our weights are for S without the factor 1/(1 - rho^2): scale them to compare
        const ours = [...Array.from(w, (v) => v / (1 - rho * rho)), ...new Array(problem.factored.design.k).fill(0)].sort((a, b) => a - b);
        const scale = Math.max(...ref.map(Math.abs));
        for (let i = 0; i < n; i++) expect(Math.abs(ours[i] - ref[i]) / scale).toBeLessThan(1e-10);
      }
    });
  }
});

describe('power against the mpmath reference (test/ref/reference.json, field "power": P(d <= c | rho) at 60 digits)', () => {
  const ref = referenceJson('reference.json') as {
    power: { id: string; n: number; x: number[][]; lag: number; rho: number; c: number; lower: number }[];
  };
  it('the reference file carries AR(1) power values', () => {
    expect(Array.isArray(ref.power)).toBe(true);
    expect(ref.power.length).toBeGreaterThanOrEqual(4);
  });
  it('every reference value is matched within the reported error bound (about 3e-12 to 7e-12)', () => {
    for (const p of ref.power) {
      // the reference design lists every column, the constant one included: a constant column
      // counts as the intercept, so nothing is added (intercept: false)
      const problem = prepareProblem(p.x, p.n, { intercept: false, lag: p.lag });
      const ctx = powerContext(problem.factored.qr, problem.operator, p.lag);
      const r = alternativeTail(ctx, p.c, p.rho, 'lower');
      expect(r.errorBound, p.id).toBeLessThan(1e-10);
      expect(Math.abs(r.p - p.lower), p.id).toBeLessThan(Math.max(r.errorBound, 1e-13));
      const u = alternativeTail(ctx, p.c, p.rho, 'upper');
      expect(Math.abs(u.p - (1 - p.lower)), p.id).toBeLessThan(Math.max(u.errorBound, 1e-13));
    }
  });
});

describe('power against seeded simulation of stationary AR(1) errors (within 3.5 standard errors)', () => {
  const reps = 20000;
  const within = (sim: number, exact: number) => {
    const se = Math.sqrt(exact * (1 - exact) / reps);
    expect(Math.abs(sim - exact)).toBeLessThan(3.5 * se + 1e-12);
  };
  it('intercept + trend, n = 20, alpha 0.05, rho = 0.3 and 0.6 (lower test) and -0.5 (upper test)', () => {
    const x = { t: trend(20) };
    const pos = exactPower({ x, alpha: 0.05, rho: [0.3, 0.6] });
    pos.curve.forEach((pt, i) => {
      within(simulatePower({ x, n: 20, rho: pt.rho, reps, seed: 100 + i, reject: (d) => d <= pos.critical }), pt.power);
    });
    const neg = exactPower({ x, alpha: 0.05, rho: [-0.5], alternative: 'negative' });
    within(simulatePower({ x, n: 20, rho: -0.5, reps, seed: 7, reject: (d) => d >= neg.critical }), neg.curve[0].power);
  });
  it('three random regressors, n = 25, two-sided at 0.10, rho = 0.5', () => {
    const x = randomColumns(21, 25, 3);
    const s = exactPower({ x, alpha: 0.1, rho: [0.5], alternative: 'two-sided' });
    const hi = s.criticalUpper as number;
    within(simulatePower({ x, n: 25, rho: 0.5, reps, seed: 9, reject: (d) => d <= s.critical || d >= hi }), s.curve[0].power);
  });
  it('gapped times: the AR(1) process runs on the time axis and unobserved years are dropped', () => {
    const times = [1, 2, 3, 4, 5, 6, 9, 10, 11, 12, 13, 14, 15, 16, 18, 19, 20, 21, 22, 23, 24, 25];
    const n = times.length;
    const x = { t: times.map((v) => v / 10) };
    const s = exactPower({ x, times, alpha: 0.05, rho: [0.5] });
    within(simulatePower({ x, n, rho: 0.5, reps, seed: 31, times, reject: (d) => d <= s.critical }), s.curve[0].power);
  });
  it('lag 4 (Wallis) against the seasonal process u_t = rho u_{t-4} + e_t, n = 32, rho = 0.5', () => {
    const n = 32;
    const x = { t: trend(n) };
    const s = exactPower({ x, lag: 4, alpha: 0.05, rho: [0.5], process: 'seasonal' });
    within(simulatePower({ x, n, rho: 0.5, reps, seed: 41, lag: 4, seasonal: true, reject: (d) => d <= s.critical }), s.curve[0].power);
  });
});

describe('shape of the power curve', () => {
  it('increases with rho on the positive side (intercept + trend, n = 20; random design, n = 40)', () => {
    const grid = Array.from({ length: 19 }, (_, i) => 0.05 * (i + 1));
    for (const [x, n] of [[{ t: trend(20) }, 20], [randomColumns(3, 40, 2), 40]] as const) {
      const s = exactPower({ x, n, rho: grid });
      for (let i = 1; i < s.curve.length; i++) expect(s.curve[i].power).toBeGreaterThan(s.curve[i - 1].power);
      expect(s.curve[0].power).toBeGreaterThan(0.05);
    }
  });
  it('the lower-tail test has power below its size against negative rho', () => {
    const s = exactPower({ x: { t: trend(20) }, rho: [-0.3, -0.6] });
    for (const pt of s.curve) expect(pt.power).toBeLessThan(0.05);
  });
  it('rhoAtTarget is where the curve crosses the target (to 1e-6), and is null when the target is out of reach', () => {
    const x = { t: trend(20) };
    const s = exactPower({ x, rho: [0.5], target: 0.8 });
    expect(s.rhoAtTarget).not.toBeNull();
    const r = s.rhoAtTarget as number;
    const at = exactPower({ x, rho: [r - 1e-4, r + 1e-4] });
    expect(at.curve[0].power).toBeLessThan(0.8);
    expect(at.curve[1].power).toBeGreaterThan(0.8);
    // negative side: the rho closest to 0 with power >= target is negative
    const neg = exactPower({ x, rho: [], target: 0.5, alternative: 'negative' });
    expect(neg.rhoAtTarget).toBeLessThan(0);
    const at2 = exactPower({ x, rho: [(neg.rhoAtTarget as number) + 1e-4, (neg.rhoAtTarget as number) - 1e-4], alternative: 'negative' });
    expect(at2.curve[0].power).toBeLessThan(0.5);
    expect(at2.curve[1].power).toBeGreaterThan(0.5);
    // n = 6 with two regressors: power 0.999 is not reached by rho = 0.99
    const tiny = exactPower({ x: { t: trend(6), s: [1, -1, 2, 0, 3, 1] }, rho: [], target: 0.999 });
    expect(tiny.rhoAtTarget).toBeNull();
    expect(tiny.notes.map((n) => n.code)).toContain('TARGET_NOT_REACHED');
    expect(notesText(tiny.notes)).toMatch(/not reached/);
  });
  it('power can fall as rho -> 1 without an intercept, and the result says so (limit of d is (M1)\'A(M1) / (M1)\'(M1); Tillman 1975, Kramer 1985, from memory)', () => {
    // x alternates 1.9, 0.1: the residual of the constant on x oscillates, so as rho -> 1 (errors
    // close to a constant) d tends to a value above the critical value and the power to 0
    const n = 16;
    const a = trend(n).map((t) => (t % 2 ? 1.9 : 0.1));
    const s = exactPower({ x: { a }, intercept: false, rho: [0.3, 0.6, 0.9, 0.99] });
    const beta = a.reduce((u, v) => u + v, 0) / a.reduce((u, v) => u + v * v, 0);
    const r = a.map((v) => 1 - beta * v);
    let num = 0;
    for (let t = 1; t < n; t++) num += (r[t] - r[t - 1]) ** 2;
    const dLimit = num / r.reduce((u, v) => u + v * v, 0);
    expect(dLimit).toBeGreaterThan(s.critical);
    expect(s.curve[3].power).toBeLessThan(s.curve[2].power);
    expect(s.notes).toContainEqual({ code: 'POWER_FALLS', from: 0.9, to: 0.99 });
    expect(notesText(s.notes)).toMatch(/power falls as \|rho\| grows from 0.9 to 0.99/);
  });
  it('with consecutive times, giving the time column changes nothing (bit-identical)', () => {
    const x = randomColumns(8, 24, 2);
    const a = exactPower({ x, rho: [0.2, 0.7], alternative: 'two-sided' });
    const b = exactPower({ x, rho: [0.2, 0.7], alternative: 'two-sided', times: trend(24).map((t) => t + 1990) });
    expect(b).toEqual(a);
  });
  it('powerForProblem on a prepared problem gives the same as exactPower', () => {
    const x = { t: trend(15) };
    expect(powerForProblem(prepareProblem(x, 15), { rho: [0.4] })).toEqual(exactPower({ x, rho: [0.4] }));
  });
});

describe('bad input', () => {
  const x = { t: trend(12) };
  it.each([[1], [-1], [1.5], [NaN]])('rho = %s is RHO_OUT_OF_RANGE', (rho) => {
    expect(() => exactPower({ x, rho: [rho] })).toThrow(expect.objectContaining({ code: 'RHO_OUT_OF_RANGE' }));
  });
  it('the dense route forced above its limit is SIZE_LIMIT (before any O(n^3) work)', () => {
    expect(() => exactPower({ x: { t: trend(601) }, rho: [0.5], route: 'dense' })).toThrow(expect.objectContaining({ code: 'SIZE_LIMIT' }));
  });
  it('alpha outside (0, 1), a target not above alpha, an unknown alternative', () => {
    expect(() => exactPower({ x, rho: [0.5], alpha: 0 })).toThrow(expect.objectContaining({ code: 'ALPHA_OUT_OF_RANGE' }));
    expect(() => exactPower({ x, rho: [0.5], target: 0.04 })).toThrow(expect.objectContaining({ code: 'PROBABILITY_OUT_OF_RANGE' }));
    expect(() => exactPower({ x, rho: [0.5], alternative: 'up' as never })).toThrow(expect.objectContaining({ code: 'OPTION_VALUE' }));
  });
});

describe('exact-dw power (CLI)', () => {
  const dir = scratch();
  const design = join(dir, 'X.csv');
  writeFileSync(design, 't,z\n' + trend(20).map((t) => `${t},${Math.sin(1.3 * t).toFixed(4)}`).join('\n') + '\n');
  const lib = () => exactPower({ x: { t: trend(20), z: trend(20).map((t) => +Math.sin(1.3 * t).toFixed(4)) }, rho: [0.1, 0.3, 0.5], alpha: 0.05 });
  it('JSON: critical, power as a list of {rho, power}, rhoAtTarget, target, alpha, n, k, equal to the library', async () => {
    const r = await runCommand(['--design', design, '--rho', '0.1,0.3,0.5', '--alpha', '0.05', '--format', 'json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    for (const key of ['critical', 'power', 'rhoAtTarget', 'target', 'alpha', 'n', 'k']) expect(j).toHaveProperty(key);
    const s = lib();
    expect(j.critical).toBe(s.critical);
    expect(j.power).toEqual(s.curve.map(({ rho, power }) => ({ rho, power })));
    expect(j.rhoAtTarget).toBe(s.rhoAtTarget);
    expect([j.target, j.alpha, j.n, j.k]).toEqual([0.8, 0.05, 20, 3]);
  });
  it('text output lists every rho and the rho reaching the target', async () => {
    const r = await runCommand(['--design', design, '--rho', '0.1:0.5:0.2']);
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/0\.100\s+0\.\d{4}/);
    expect(r.out).toMatch(/0\.500\s+0\.\d{4}/);
    expect(r.out).toMatch(/first reached at rho = 0\.\d{4}/);
  });
  it('rho outside (-1, 1) exits 2 with RHO_OUT_OF_RANGE on one line', async () => {
    const r = await runCommand(['--design', design, '--rho', '0.5,1.2']);
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/outside the open interval \(-1, 1\)/);
  });
  it('ranges: 0:0.9:0.3 gives 0, 0.3, 0.6, 0.9; bad ranges are RANGE_SYNTAX', () => {
    expect(parseRhoList('0:0.9:0.3')).toEqual([0, 0.3, 0.6, 0.9]);
    expect(parseRhoList('0.1, -0.2,0.1:0.3:0.1')).toEqual([0.1, -0.2, 0.1, 0.2, 0.3]);
    expect(() => parseRhoList('0.1:0.5')).toThrow(expect.objectContaining({ code: 'RANGE_SYNTAX' }));
    expect(() => parseRhoList('0.5:0.1:0.1')).toThrow(expect.objectContaining({ code: 'RANGE_SYNTAX' }));
    expect(() => parseRhoList('0.1,,0.2')).toThrow(expect.objectContaining({ code: 'OPTION_VALUE' }));
  });
  it('--lag 4 and --time are honoured and reported', async () => {
    const q = join(dir, 'Q.csv');
    writeFileSync(q, 'quarter,t\n' + trend(24).map((t) => `${t + (t > 12 ? 2 : 0)},${t}`).join('\n') + '\n');
    const j = JSON.parse((await runCommand(['--design', q, '--time', 'quarter', '--lag', '4', '--rho', '0.5', '--format', 'json'])).out);
    expect(j.lag).toBe(4);
    expect(j.gaps).toBe(true);
    expect(j.k).toBe(2);
    const times = trend(24).map((t) => t + (t > 12 ? 2 : 0));
    expect(j.power[0].power).toBe(exactPower({ x: { t: trend(24) }, times, lag: 4, rho: [0.5] }).curve[0].power);
  });
  it('is registered in the command list (exact-dw power)', async () => {
    const r = await cli('power', '--design', design, '--rho', '0.3', '--format', 'json');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.out).power).toHaveLength(1);
  });
});
