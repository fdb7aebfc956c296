/**
 * Exact power without eigenvalues (src/power/eigenfree-power.ts and its route in exact-power.ts),
 * checked against outside sources: the dense route's weights (eigenvalues of G'(Z'AZ - cI)G, which
 * test/power/power.test.ts checks against ml-matrix), ml-matrix directly (Cholesky of S_rho, explicit M,
 * symmetric eigen-solver), the mpmath reference JSON (test/ref/reference.json, field "power"), the
 * null distribution (power at rho = 0 is alpha), and a seeded simulation of stationary AR(1) errors.
 */
import { describe, expect, it } from 'vitest';
import { notesText } from '../helpers/power.js';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { CholeskyDecomposition } from 'ml-matrix';
import { bandToDense, durbinWatson } from '../../src/core/difference.js';
import { columnBasis } from '../../src/linalg/qr.js';
import { spectralForm } from '../../src/engines/imhof.js';
import { prepareProblem } from '../../src/problem/problem.js';
import { alternativeTail, autoPowerRoute, exactPower, powerForProblem, POWER_SIZE_LIMIT } from '../../src/power/exact-power.js';
import { alternativeForm, alternativeStructure, chernoffTail, eigenfreeAlternativeTail } from '../../src/power/eigenfree-power.js';
import { errorCovariance, powerContext, powerWeights, type ErrorProcess } from '../../src/power/weights.js';
import { checkPowerSize, POWER_MAX_N } from '../../src/limits.js';
import { cli, scratch } from '../helpers/cli.js';
import { EigenvalueDecomposition, Matrix, seededNormal, seededRandom, solve } from '../helpers/reference.js';
import { referenceJson } from '../helpers/reference.js';
import { randomColumns, trend } from '../helpers/reference.js';



/** Increasing integer times with gaps of 1 to 4 periods (seeded). */
function gappedTimes(seed: number, n: number): number[] {
  const u = seededRandom(seed);
  const out: number[] = [];
  let t = 1990;
  for (let i = 0; i < n; i++) { t += u() < 0.7 ? 1 : 2 + Math.floor(3 * u()); out.push(t); }
  return out;
}

interface Case { label: string; n: number; lag: number; process: ErrorProcess; times?: number[] }

const CASES: Case[] = [
  { label: 'lag 1, n = 60', n: 60, lag: 1, process: 'ar1' },
  { label: 'lag 1, n = 200', n: 200, lag: 1, process: 'ar1' },
  { label: 'lag 4, seasonal process u_t = rho u_{t-4} + e_t, n = 80', n: 80, lag: 4, process: 'seasonal' },
  { label: 'lag 4 statistic, AR(1) process (general band), n = 96', n: 96, lag: 4, process: 'ar1' },
  { label: 'lag 1, gapped times, n = 90', n: 90, lag: 1, process: 'ar1', times: gappedTimes(3, 90) },
  { label: 'lag 4, seasonal process, gapped times, n = 120', n: 120, lag: 4, process: 'seasonal', times: gappedTimes(5, 120) },
];

const POINTS: [number, number, 1 | -1][] = [[0.5, 1.63, 1], [-0.7, 2.21, -1], [0.95, 1.87, 1], [0, 1.97, 1], [-0.3, 1.52, -1]];

describe('the eigen-free form against the dense route\'s weights (spectralForm on the eigenvalues of G\'(Z\'AZ - cI)G; those are checked against ml-matrix in test/power/power.test.ts)', () => {
  for (const cs of CASES) {
    it(`${cs.label}: theta(u) and log rho(u) to 1e-12 (relative to 1 + |value|) for u from 1e-3 to 1e4; the constants`, () => {
      const x = randomColumns(cs.n, cs.n, 2);
      const problem = prepareProblem(x, cs.n, { lag: cs.lag, times: cs.times });
      const ctx = powerContext(problem.factored.qr, problem.operator, cs.lag, cs.times);
      const st = alternativeStructure(columnBasis(problem.factored.qr), problem.operator, cs.lag, cs.times, cs.process);
      const a = new Float64Array(2);
      const b = new Float64Array(2);
      for (const [rho, c, sign] of POINTS) {
        const w = powerWeights(ctx, c, rho, cs.process);
        const ref = spectralForm(w, 0, sign);
        const form = alternativeForm(st, c, rho, sign);
        // at rho = 0.95 the dense weights (Cholesky of Z'SZ, condition ~ 1/(1 - rho)^2) carry errors of
        // a few 1e-12 in theta at large u: measured against ml-matrix's eigenvalues of L'MCML for the
        // seasonal case, the dense route is off by 2.5e-12 at u = 1946, the eigen-free form by 1.2e-13
        const tol = Math.abs(rho) > 0.9 ? 5e-12 : 1e-12;
        for (let u = 1e-3; u < 1e4; u *= 1.37) {
          ref.evaluate(u, a);
          form.evaluate(u, b);
          expect(Math.abs(a[0] - b[0]), `theta, rho ${rho}, c ${c}, u ${u}`).toBeLessThan(tol * (1 + Math.abs(a[0])));
          expect(Math.abs(a[1] - b[1]), `log rho, rho ${rho}, c ${c}, u ${u}`).toBeLessThan(tol * (1 + Math.abs(a[1])));
        }
        // sum w exactly, an upper bound on max |w|, the regularised sum of log |w|
        expect(Math.abs(form.sumLambda - ref.sumLambda)).toBeLessThan(1e-12 * (1 + Math.abs(ref.sumLambda)));
        expect(form.maxAbsLambda).toBeGreaterThanOrEqual(ref.maxAbsLambda);
        expect(form.m).toBe(w.length);
        let regular = 0;
        for (const v of w) regular += 0.5 * Math.log(v * v + form.lambdaFloor ** 2);
        expect(Math.abs(form.sumLogAbsLambda - regular)).toBeLessThan(1e-10 * (1 + Math.abs(regular)));
        expect(form.sumLogAbsLambda).toBeGreaterThanOrEqual(ref.sumLogAbsLambda - 1e-9);
      }
    });
  }

  it('the real log-determinant psi(beta) = sum log(1 + beta w) and its domain (1 + beta w > 0 for all w) match the weights', () => {
    for (const cs of [CASES[1], CASES[3], CASES[5]]) {
      const x = randomColumns(cs.n + 1, cs.n, 2);
      const problem = prepareProblem(x, cs.n, { lag: cs.lag, times: cs.times });
      const ctx = powerContext(problem.factored.qr, problem.operator, cs.lag, cs.times);
      const st = alternativeStructure(columnBasis(problem.factored.qr), problem.operator, cs.lag, cs.times, cs.process);
      for (const [rho, c, sign] of POINTS) {
        const w = Array.from(powerWeights(ctx, c, rho, cs.process), (v) => sign * v);
        const form = alternativeForm(st, c, rho, sign);
        const lo = Math.min(...w), hi = Math.max(...w);
        for (const f of [-1.3, -0.97, -0.4, 0.4, 0.97, 1.3]) {
          const beta = f > 0 ? f / Math.abs(lo) : f / hi;
          const inside = w.every((v) => 1 + beta * v > 0);
          const got = form.logMgf(beta);
          expect(got === null, `beta ${beta}`).toBe(!inside);
          if (inside) {
            const ref = w.reduce((s, v) => s + Math.log1p(beta * v), 0);
            expect(Math.abs((got as number) - ref)).toBeLessThan(1e-11 * (1 + Math.abs(ref)));
          }
        }
      }
    }
  });
});

describe('the weights themselves against ml-matrix (Cholesky of S_rho, explicit M, eigenvalues of L\'M(A - cI)ML)', () => {
  it('seasonal process at lag 4 with gapped times, n = 40: Imhof\'s integrand from both agrees to 1e-12', () => {
    const n = 40;
    const times = gappedTimes(17, n);
    const x = randomColumns(9, n, 2);
    const problem = prepareProblem(x, n, { lag: 4, times });
    const ctx = powerContext(problem.factored.qr, problem.operator, 4, times);
    const st = alternativeStructure(columnBasis(problem.factored.qr), problem.operator, 4, times, 'seasonal');
    const X = new Matrix(Array.from({ length: n }, (_, i) => [1, x.x1[i], x.x2[i]]));
    const M = Matrix.eye(n).sub(X.mmul(solve(X.transpose().mmul(X), X.transpose())));
    const aDense = bandToDense(problem.operator);
    for (const [rho, c] of [[0.6, 1.7], [-0.5, 2.4]]) {
      const s = errorCovariance(ctx, rho, 'seasonal');
      const S = new Matrix(n, n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) S.set(i, j, s[i * n + j]);
      const L = new CholeskyDecomposition(S).lowerTriangularMatrix;
      const AC = new Matrix(n, n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) AC.set(i, j, aDense[i * n + j] - (i === j ? c : 0));
      const N = L.transpose().mmul(M).mmul(AC).mmul(M).mmul(L);
      const w = new EigenvalueDecomposition(N.add(N.transpose()).mul(0.5), { assumeSymmetric: true }).realEigenvalues;
      const ref = spectralForm(Float64Array.from(w), 0);
      const form = alternativeForm(st, c, rho);
      const a = new Float64Array(2), b = new Float64Array(2);
      for (let u = 1e-2; u < 1e3; u *= 1.7) {
        ref.evaluate(u, a);
        form.evaluate(u, b);
        expect(Math.abs(a[0] - b[0])).toBeLessThan(1e-12 * (1 + Math.abs(a[0])));
        expect(Math.abs(a[1] - b[1])).toBeLessThan(1e-12 * (1 + Math.abs(a[1])));
      }
    }
  });
});

describe('power through the two routes at n = 300 (the dense route as the reference)', () => {
  const n = 300;
  const x = { t: trend(n), z: trend(n).map((t) => Math.sin(t / 5)) };
  const problem = prepareProblem(x, n);
  it('P(d <= c | rho) and P(d >= c | rho) agree to 1e-9 for rho from -0.6 to 0.8, at the critical values and elsewhere', () => {
    const ctx = powerContext(problem.factored.qr, problem.operator, 1);
    const st = alternativeStructure(columnBasis(problem.factored.qr), problem.operator, 1);
    const lower = problem.distribution.quantile(0.05);
    const upper = problem.distribution.upperQuantile(0.05);
    for (const [rho, cs] of [[-0.6, [[upper, 'upper'], [2.1, 'lower']]], [-0.05, [[upper, 'upper'], [lower, 'lower']]],
      [0.05, [[lower, 'lower'], [1.8, 'upper']]], [0.15, [[lower, 'lower'], [upper, 'upper']]], [0.8, [[lower, 'lower'], [1.5, 'upper']]]] as const) {
      for (const [c, tail] of cs) {
        const d = alternativeTail(ctx, c, rho, tail);
        const e = eigenfreeAlternativeTail(st, c, rho, tail);
        expect(Math.abs(d.p - e.p), `rho ${rho}, c ${c}, ${tail}`).toBeLessThan(1e-9);
        expect(e.errorBound).toBeLessThan(1e-9);
      }
    }
  });
  it('whole results for the three alternatives agree: curves to 1e-9, rhoAtTarget to 1e-6, same critical values', () => {
    for (const alternative of ['positive', 'negative', 'two-sided'] as const) {
      // the target search (a dozen power values) only for the two-sided test, which uses both tails
      const searchTarget = alternative === 'two-sided';
      const opts = { rho: [-0.3, 0.1], alternative, target: 0.35, searchTarget };
      const d = powerForProblem(problem, { ...opts, route: 'dense' });
      const e = powerForProblem(problem, { ...opts, route: 'eigenfree' });
      expect(d.route).toBe('dense');
      expect(e.route).toBe('eigenfree');
      expect(e.critical).toBe(d.critical);
      expect(e.criticalUpper).toBe(d.criticalUpper);
      d.curve.forEach((p, i) => expect(Math.abs(p.power - e.curve[i].power), `${alternative}, rho ${p.rho}`).toBeLessThan(1e-9));
      if (searchTarget) {
        expect(d.rhoAtTarget).not.toBeNull();
        expect(Math.abs((d.rhoAtTarget as number) - (e.rhoAtTarget as number))).toBeLessThan(1e-6);
      }
      expect(d.notes).toContainEqual({ code: 'POWER_ROUTE', route: 'dense', n: d.n, bySize: false });
      expect(notesText(d.notes)).toMatch(/Route: dense/);
      expect(notesText(e.notes)).toMatch(/Route: eigen-free/);
    }
  });
  it('auto picks the dense route for small n and the eigen-free one above it (n = 300, k = 3 is eigen-free)', () => {
    expect(autoPowerRoute(60, 3)).toBe('dense');
    expect(autoPowerRoute(300, 3)).toBe('eigenfree');
    expect(autoPowerRoute(300, 16)).toBe('dense');
    expect(autoPowerRoute(POWER_SIZE_LIMIT + 1, 40)).toBe('eigenfree');
    expect(powerForProblem(problem, { rho: [0.1], searchTarget: false }).route).toBe('eigenfree');
  });
});

describe('power against the mpmath reference (test/ref/reference.json, field "power"), eigen-free route forced', () => {
  const ref = referenceJson('reference.json') as {
    power: { id: string; n: number; x: number[][]; lag: number; rho: number; c: number; lower: number }[];
  };
  it('every reference value is matched within the reported error bound, both tails', () => {
    expect(ref.power.length).toBeGreaterThanOrEqual(4);
    for (const p of ref.power) {
      // the reference design lists every column, the constant one included
      const problem = prepareProblem(p.x, p.n, { intercept: false, lag: p.lag });
      const st = alternativeStructure(columnBasis(problem.factored.qr), problem.operator, p.lag);
      const lo = eigenfreeAlternativeTail(st, p.c, p.rho, 'lower');
      expect(lo.errorBound, p.id).toBeLessThan(1e-10);
      expect(Math.abs(lo.p - p.lower), p.id).toBeLessThan(Math.max(lo.errorBound, 1e-13));
      const up = eigenfreeAlternativeTail(st, p.c, p.rho, 'upper');
      expect(Math.abs(up.p - (1 - p.lower)), p.id).toBeLessThan(Math.max(up.errorBound, 1e-13));
    }
  });
});

describe('power at rho = 0 is the size of the test (docs/methods.md section 6), eigen-free route forced', () => {
  it('n = 250, three random regressors and gapped times: |power(0) - alpha| below 1e-9 for the three alternatives', () => {
    const n = 250;
    const times = gappedTimes(23, n);
    const problem = prepareProblem(randomColumns(41, n, 3), n, { times });
    for (const alternative of ['positive', 'negative', 'two-sided'] as const) {
      for (const alpha of [0.01, 0.05]) {
        const s = powerForProblem(problem, { rho: [0], alpha, alternative, times, route: 'eigenfree', searchTarget: false });
        expect(Math.abs(s.curve[0].power - alpha), `${alternative} ${alpha}`).toBeLessThan(1e-9);
      }
    }
  });
});

describe('Chernoff\'s bound settles probabilities far from the mean (Chernoff 1952: P(Q <= 0) <= E exp(-sQ))', () => {
  it('the bound is above the dense route\'s probability wherever it is used, and the settled answers agree with it', () => {
    const n = 200;
    const problem = prepareProblem({ t: trend(n) }, n);
    const ctx = powerContext(problem.factored.qr, problem.operator, 1);
    const st = alternativeStructure(columnBasis(problem.factored.qr), problem.operator, 1);
    const c = problem.distribution.quantile(0.05);
    let settled = 0;
    for (const rho of [-0.5, -0.2, 0.3, 0.5, 0.7]) {
      const ch = chernoffTail(alternativeForm(st, c, rho));
      expect(ch).not.toBeNull();
      const { tail, bound } = ch as { tail: 'lower' | 'upper'; bound: number };
      const dense = alternativeTail(ctx, c, rho, tail).p;
      expect(dense).toBeLessThanOrEqual(bound * (1 + 1e-9) + 1e-15);
      const e = eigenfreeAlternativeTail(st, c, rho, 'lower');
      if (e.via === 'chernoff') {
        settled++;
        expect(Math.abs(e.p - alternativeTail(ctx, c, rho, 'lower').p)).toBeLessThanOrEqual(e.errorBound + 1e-15);
      }
    }
    expect(settled).toBeGreaterThanOrEqual(2);
  });
});

describe('large n', () => {
  it('n = 2000, rho = 0.04: the exact power agrees with a seeded simulation of stationary AR(1) errors (4000 draws) within 3.5 standard errors', () => {
    const n = 2000;
    const x = { t: trend(n).map((t) => t / n), s: trend(n).map((t) => Math.cos(t / 30)) };
    const problem = prepareProblem(x, n);
    const rho = 0.04;
    const s = powerForProblem(problem, { rho: [rho], searchTarget: false });
    expect(s.route).toBe('eigenfree');
    const exact = s.curve[0].power;
    expect(exact).toBeGreaterThan(0.2);
    expect(exact).toBeLessThan(0.8);
    // residual maker from the library's QR basis; u_1 ~ N(0, 1/(1 - rho^2)), u_t = rho u_{t-1} + e_t
    const { q, k } = columnBasis(problem.factored.qr);
    const g = seededNormal(2000);
    const e = new Float64Array(n);
    const reps = 4000;
    let hits = 0;
    for (let r = 0; r < reps; r++) {
      e[0] = g() / Math.sqrt(1 - rho * rho);
      for (let t = 1; t < n; t++) e[t] = rho * e[t - 1] + g();
      for (let j = 0; j < k; j++) {
        let dot = 0;
        for (let t = 0; t < n; t++) dot += q[j * n + t] * e[t];
        for (let t = 0; t < n; t++) e[t] -= dot * q[j * n + t];
      }
      if (durbinWatson(e, problem.pairs) <= s.critical) hits++;
    }
    const se = Math.sqrt((exact * (1 - exact)) / reps);
    expect(Math.abs(hits / reps - exact)).toBeLessThan(3.5 * se);
  });

  it('n = 20000: the power curve is computed (eigen-free route, finite numbers in [0, 1], power rising with rho)', () => {
    const n = 20000;
    const problem = prepareProblem({ t: trend(n).map((t) => t / n) }, n);
    const s = powerForProblem(problem, { rho: [0.005, 0.01, 0.3], searchTarget: false });
    expect(s.route).toBe('eigenfree');
    for (const p of s.curve) {
      expect(p.power).toBeGreaterThanOrEqual(0);
      expect(p.power).toBeLessThanOrEqual(1);
      expect(p.errorBound).toBeLessThan(1e-9);
    }
    expect(s.curve[1].power).toBeGreaterThan(s.curve[0].power);
    expect(s.curve[2].power).toBe(1); // settled by Chernoff's bound
    expect(s.notes.map((n) => n.code)).toContain('CHERNOFF_SETTLED');
    expect(notesText(s.notes)).toMatch(/Chernoff/);
    expect(notesText(s.notes)).toMatch(/not searched/);
  });
});

describe('sizes and bad input', () => {
  it('the dense route forced above its limit is SIZE_LIMIT; auto takes such n', () => {
    expect(() => exactPower({ x: { t: trend(POWER_SIZE_LIMIT + 1) }, rho: [0.5], route: 'dense' }))
      .toThrow(expect.objectContaining({ code: 'SIZE_LIMIT' }));
    expect(() => checkPowerSize(POWER_MAX_N, 3, 1)).not.toThrow();
    expect(() => checkPowerSize(POWER_MAX_N + 1, 3, 1)).toThrow(expect.objectContaining({ code: 'SIZE_LIMIT' }));
    expect(() => checkPowerSize(POWER_MAX_N, 200, 1)).toThrow(expect.objectContaining({ code: 'SIZE_LIMIT' }));
  });
  it('an unknown route is OPTION_VALUE', () => {
    expect(() => exactPower({ x: { t: trend(20) }, rho: [0.5], route: 'fast' as never })).toThrow(expect.objectContaining({ code: 'OPTION_VALUE' }));
  });
});

describe('exact-dw power at large n (CLI, generated design file in a temporary folder)', () => {
  const dir = scratch();
  const n = 5000;
  const design = join(dir, 'X.csv');
  writeFileSync(design, 'year,trend,wave\n' + trend(n).map((t) => `${1000 + t},${(t / 100).toFixed(2)},${Math.sin(t / 11).toFixed(6)}`).join('\n') + '\n');
  it('JSON: the eigen-free route answers, equal to the library', async () => {
    const r = await cli('power', '--design', design, '--time', 'year', '--rho', '0.01,0.03', '--target', 'none', '--format', 'json');
    expect(r.status, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.route).toBe('eigenfree');
    expect(j.n).toBe(n);
    expect(j.rhoAtTarget).toBeNull();
    expect(j.target).toBeNull();
    const lib = exactPower({ x: { trend: trend(n).map((t) => +(t / 100).toFixed(2)), wave: trend(n).map((t) => +Math.sin(t / 11).toFixed(6)) },
      times: trend(n).map((t) => 1000 + t), rho: [0.01, 0.03], searchTarget: false });
    expect(j.power).toEqual(lib.curve.map(({ rho, power }) => ({ rho, power })));
  });
  it('text: the route is shown; --route dense above its limit exits 2 with one line', async () => {
    const r = await cli('power', '--design', design, '--time', 'year', '--rho', '0.02', '--target', 'none');
    expect(r.status, r.err).toBe(0);
    expect(r.out).toMatch(/route: eigen-free/);
    expect(r.out).toMatch(/not searched for/);
    const bad = await cli('power', '--design', design, '--time', 'year', '--rho', '0.02', '--route', 'dense');
    expect(bad.status).toBe(2);
    expect(bad.err.trim().split('\n')).toHaveLength(1);
    expect(bad.err).toMatch(/dense power route/);
  });
});
