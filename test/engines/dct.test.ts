/**
 * The DCT eigenbasis route (src/engines/dct.ts, src/linalg/dct.ts) against outside references:
 * the DCT-II against its defining cosine sum (closed form), the engine against Imhof's integral on
 * the structured spectrum and against the eigen-free engine, the density against the spectral
 * density formula, and the size rules that let it take n = 10^6.
 */
import { describe, expect, it } from 'vitest';
import { dctPlan } from '../../src/linalg/dct.js';
import { dctDensity, dctEigenbasis, dctTail } from '../../src/engines/dct.js';
import { imhofDensity } from '../../src/engines/imhof.js';
import { tailProbability } from '../../src/engines/choose.js';
import { prepareProblem } from '../../src/problem/problem.js';
import { designSource } from '../../src/core/source.js';
import { DwNullDistribution } from '../../src/distribution/null-distribution.js';
import { checkSize } from '../../src/limits.js';
import { seededNormal } from '../helpers/reference.js';
import type { BandMatrix } from '../../src/core/types.js';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, scratch } from '../helpers/cli.js';

function design(n: number, seed: number) {
  const g = seededNormal(seed);
  return { trend: Float64Array.from({ length: n }, (_, t) => t / n), z: Float64Array.from({ length: n }, () => g()) };
}

describe('DCT-II of any length', () => {
  // lengths: direct (<= 32), powers of two, products of small primes (mixed radix), a prime (Bluestein)
  for (const L of [1, 7, 32, 64, 100, 333, 334, 1009, 4096, 6000]) {
    it(`L = ${L}: equals the defining sum s_j sum_t x_t cos(pi j (t + 1/2) / L) (closed form) to 1e-13 ||x||`, () => {
      const g = seededNormal(L);
      const x = Float64Array.from({ length: L }, () => g());
      const out = new Float64Array(L);
      dctPlan(L).transform(x, out);
      let norm = 0;
      for (const v of x) norm += v * v;
      norm = Math.sqrt(norm);
      for (const j of new Set([0, Math.min(1, L - 1), Math.floor(L / 3), L - 1])) {
        let s = 0;
        for (let t = 0; t < L; t++) s += x[t] * Math.cos((Math.PI * j * (t + 0.5)) / L);
        s *= Math.sqrt((j === 0 ? 1 : 2) / L);
        expect(Math.abs(out[j] - s)).toBeLessThan(1e-13 * Math.max(1, norm));
      }
      // two at once (one complex FFT): the same numbers as one at a time
      const x2 = Float64Array.from(x, (v, t) => v * Math.cos(t) + 1);
      const o1 = new Float64Array(L), o2 = new Float64Array(L), o2s = new Float64Array(L);
      dctPlan(L).transform2(x, x2, o1, o2);
      dctPlan(L).transform(x2, o2s);
      for (let j = 0; j < L; j++) {
        expect(Math.abs(o1[j] - out[j])).toBeLessThan(1e-13 * Math.max(1, norm));
        expect(Math.abs(o2[j] - o2s[j])).toBeLessThan(1e-13 * Math.max(1, 2 * norm + Math.sqrt(L)));
      }
      // orthonormal: ||V'x|| = ||x|| (Parseval)
      let no = 0;
      for (const v of out) no += v * v;
      expect(Math.abs(Math.sqrt(no) - norm)).toBeLessThan(1e-12 * Math.max(1, norm));
    });
  }
});

describe('DCT route against Imhof on the structured spectrum and the eigen-free engine', () => {
  for (const [n, lag, gap] of [[40, 1, false], [300, 1, false], [250, 4, false], [400, 12, false], [120, 1, true]] as const) {
    it(`n = ${n}, lag ${lag}${gap ? ', gaps' : ''}: both tails and the density agree to 1e-11 and within the bounds`, () => {
      const x = design(n, n + lag);
      const times = gap ? Float64Array.from({ length: n }, (_, t) => t + (t > n / 2 ? 3 : 0) + (t > n / 4 ? 1 : 0)) : undefined;
      const p = prepareProblem(x, n, { lag, times });
      const src = p.distribution.source;
      expect(dctEigenbasis(src.operator!, src.basis!)).not.toBeNull();
      const mean = src.mean(), sd = Math.sqrt(src.variance());
      for (const c of [mean - 2.5 * sd, mean - 0.3 * sd, mean + 1.7 * sd]) {
        for (const tail of ['lower', 'upper'] as const) {
          const a = dctTail(src.operator!, src.basis!, c, tail);
          const b = tailProbability(src, c, tail, { method: 'imhof' });
          const e = tailProbability(src, c, tail, { method: 'eigenfree' });
          expect(a.method).toBe('dct');
          expect(Math.abs(a.p - b.p)).toBeLessThanOrEqual(a.errorBound + b.errorBound);
          expect(Math.abs(a.p - b.p)).toBeLessThan(1e-11);
          expect(Math.abs(a.p - e.p)).toBeLessThan(1e-11);
          expect(a.errorBound).toBeLessThan(2e-11);
        }
        const f1 = dctDensity(src.operator!, src.basis!, c);
        const f2 = imhofDensity(src.spectrum(), c);
        expect(Math.abs(f1.value - f2.value)).toBeLessThanOrEqual(f1.errorBound + f2.errorBound + 1e-12);
        expect(Math.abs(f1.value - f2.value)).toBeLessThan(1e-9);
      }
    });
  }

  it('auto at n = 3000 (beyond the spectral rule) answers by DCT; pdf needs no spectrum there', () => {
    const n = 3000;
    const dist = prepareProblem(design(n, 5), n).distribution;
    const r = dist.lowerTail(1.95);
    expect(r.method).toBe('dct');
    expect(r.reason).toEqual({ code: 'LARGE_N_DCT', n });
    // here every evaluation takes the moment series (u (h + |c0 - c|) <= 1/2 up to the cut):
    // against Imhof's integral on the structured spectrum, both tails, within the two bounds
    const src = dist.source;
    for (const c of [1.9, 1.95, 2.03, 2.1]) {
      for (const tail of ['lower', 'upper'] as const) {
        const a = tailProbability(src, c, tail, { method: 'dct' });
        const b = tailProbability(src, c, tail, { method: 'imhof' });
        expect(Math.abs(a.p - b.p)).toBeLessThanOrEqual(a.errorBound + b.errorBound);
        expect(Math.abs(a.p - b.p)).toBeLessThan(1e-11);
      }
    }
    const fresh = prepareProblem(design(n, 5), n).distribution;
    const f = fresh.pdf(1.95);
    expect(fresh.source.hasSpectrum()).toBe(false);
    // against the density of the structured spectrum (Imhof's derivative formula)
    expect(Math.abs(f - imhofDensity(dist.spectrum, 1.95).value)).toBeLessThan(1e-8);
  });

  it('an operator that is not a union of chains goes to the eigen-free engine under auto, and dct refuses it', () => {
    const n = 1200;
    const base = prepareProblem(design(n, 9), n);
    const a = base.operator;
    // weights 2 on the off-diagonal: a band matrix, but no longer a path-graph Laplacian
    const bands = a.bands.map((b, j) => Float64Array.from(b, (v) => (j === 0 ? 2 * v : 2 * v)));
    bands[0][0] += 0.5;
    const op: BandMatrix = { n, bandwidth: a.bandwidth, bands };
    const src = designSource(n - base.factored.design.k, op, base.distribution.source.basis!, () => { throw new Error('no spectrum'); });
    expect(dctEigenbasis(op, src.basis!)).toBeNull();
    const r = new DwNullDistribution(src).cdf(3.9);
    expect(r).toBeGreaterThan(0);
    expect(tailProbability(src, 3.9, 'lower').method).toBe('eigenfree');
    expect(() => tailProbability(src, 3.9, 'lower', { method: 'dct' })).toThrowError(/DCT route needs a difference operator/);
  });

  it('size rules: n = 10^6 is allowed for dct and auto, beyond it SIZE_LIMIT; eigen-free stays at 10^5', () => {
    expect(() => checkSize(1000000, 5, 'dct')).not.toThrow();
    expect(() => checkSize(1000000, 5, 'auto')).not.toThrow();
    expect(() => checkSize(1000001, 5, 'dct')).toThrowError(/beyond every engine/);
    expect(() => checkSize(200000, 5, 'eigenfree')).toThrowError(/eigen-free engine is limited to n = 100000/);
  });

  it('CLI: --method dct answers with the DCT route and the same p-values as --method imhof (JSON, per-tail bounds)', async () => {
    const n = 60;
    const x = design(n, 3);
    const file = join(scratch(), 'X.csv');
    writeFileSync(file, 'trend,z\n' + Array.from({ length: n }, (_, t) => `${x.trend[t]},${x.z[t]}`).join('\n') + '\n');
    const a = await cli('pvalue', '--design', file, '--d', '1.7', '--method', 'dct', '--format', 'json');
    const b = await cli('pvalue', '--design', file, '--d', '1.7', '--method', 'imhof', '--format', 'json');
    expect(a.status).toBe(0);
    expect(b.status).toBe(0);
    const ja = JSON.parse(a.out), jb = JSON.parse(b.out);
    expect(ja.method).toBe('dct');
    expect(Math.abs(ja.pPositive - jb.pPositive)).toBeLessThanOrEqual(ja.errorBoundPositive + jb.errorBoundPositive);
    expect(Math.abs(ja.pNegative - jb.pNegative)).toBeLessThanOrEqual(ja.errorBoundNegative + jb.errorBoundNegative);
  });
});
