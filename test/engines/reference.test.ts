/**
 * Every engine against the arbitrary-precision reference values of test/ref/reference.json
 * (mpmath at 50 digits, each value cross-checked by a second method; see test/ref/README.md).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { prepareProblem } from '../../src/problem/problem.js';
import { DwNullDistribution } from '../../src/distribution/null-distribution.js';
import { contourTail } from '../../src/engines/saddle-contour.js';
import type { MethodChoice } from '../../src/core/types.js';
import { jStat } from '../helpers/reference.js';
import { referenceJson } from '../helpers/reference.js';

interface RefCase {
  id: string; n: number; lag: number; times: number[] | null; intercept: boolean; x: number[][]; k: number;
  nu: number[]; mean: number; variance: number; points: { c: number; lower: number; upper: number }[];
}
const ref = referenceJson('reference.json') as { cases: RefCase[] };

function problemOf(c: RefCase) {
  return prepareProblem(c.x, c.n, { intercept: c.intercept, lag: c.lag, times: c.times ?? undefined, names: c.x[0].map((_, j) => `x${j}`) });
}

describe('mpmath reference values (test/ref/reference.json)', () => {
  it('has designs of every kind the engines must handle', () => {
    expect(ref.cases.length).toBeGreaterThanOrEqual(15);
    expect(ref.cases.some((c) => c.lag > 1)).toBe(true);
    expect(ref.cases.some((c) => c.times !== null)).toBe(true);
    expect(ref.cases.some((c) => !c.intercept)).toBe(true);
    expect(ref.cases.some((c) => c.points.some((p) => p.lower < 1e-12 || p.upper < 1e-12))).toBe(true);
  });
  it.each(ref.cases.map((c) => [c.id, c] as const))('%s: spectrum, mean and variance', (_id, c) => {
    const p = problemOf(c);
    const nu = p.distribution.spectrum;
    expect(nu.length).toBe(c.nu.length);
    c.nu.forEach((v, i) => expect(Math.abs(nu[i] - v)).toBeLessThan(1e-12));
    expect(Math.abs(p.distribution.mean - c.mean)).toBeLessThan(1e-12);
    expect(Math.abs(p.distribution.variance - c.variance)).toBeLessThan(1e-12);
  });
  for (const method of ['imhof', 'pan', 'eigenfree', 'auto'] as MethodChoice[]) {
    it(`${method}: within 1e-10 of every reference probability and never outside its own bound`, () => {
      let checked = 0, refused = 0;
      for (const c of ref.cases) {
        const dist = new DwNullDistribution(problemOf(c).distribution.source, { method });
        for (const pt of c.points) {
          for (const tail of ['lower', 'upper'] as const) {
            const want = tail === 'lower' ? pt.lower : pt.upper;
            let got;
            try { got = tail === 'lower' ? dist.lowerTail(pt.c) : dist.upperTail(pt.c); } catch (e) {
              // only Pan may refuse (ties, clusters, cancellation), and only with ENGINE_NOT_APPLICABLE
              expect(method).toBe('pan');
              expect((e as { code?: string }).code).toBe('ENGINE_NOT_APPLICABLE');
              refused++;
              continue;
            }
            const err = Math.abs(got.p - want);
            expect(err, `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-10);
            expect(err, `${c.id} c=${pt.c} ${tail}: error above the reported bound`).toBeLessThanOrEqual(got.errorBound);
            checked++;
          }
        }
      }
      expect(checked).toBeGreaterThan(method === 'pan' ? 100 : 250);
      if (method !== 'pan') expect(refused).toBe(0);
    });
  }
  it('auto: tails down to 1e-15 with relative error <= 1e-6', () => {
    let tails = 0;
    for (const c of ref.cases) {
      const dist = problemOf(c).distribution;
      for (const pt of c.points) {
        for (const tail of ['lower', 'upper'] as const) {
          const want = tail === 'lower' ? pt.lower : pt.upper;
          if (!(want >= 1e-15 && want < 1e-6)) continue;
          const got = tail === 'lower' ? dist.lowerTail(pt.c) : dist.upperTail(pt.c);
          expect(Math.abs(got.p - want) / want, `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-6);
          expect(got.relativeError).toBeLessThan(1e-6);
          tails++;
        }
      }
    }
    expect(tails).toBeGreaterThanOrEqual(10);
  });
});

describe('the shifted (saddlepoint-line) inversion against closed forms, ties included', () => {
  it("two eigenvalues with multiplicities: Beta(q/2, p/2) far tails with relative accuracy (exact forms; jstat's beta for a loose cross-check)", () => {
    // Beta(1, 2) (p = 4, q = 2): F(t) = 1 - (1 - t)^2 = t (2 - t); its upper tail (1 - t)^2
    const nu = Float64Array.from([0.7, 0.7, 0.7, 0.7, 3.2, 3.2]);
    for (const t of [1e-4, 1e-7, 1e-10]) {
      const c = 0.7 + 2.5 * t;
      const tt = (c - 0.7) / 2.5; // the t that the rounded c represents
      const want = tt * (2 - tt);
      const r = contourTail(nu, c, 'lower');
      expect(Math.abs(r.p - want) / want).toBeLessThan(1e-6);
      expect(Math.abs(jStat.beta.cdf(tt, 1, 2) - want)).toBeLessThan(1e-8);
    }
    for (const s of [1e-3, 1e-5, 1e-7]) {
      const c = 3.2 - 2.5 * s;
      const ss = (3.2 - c) / 2.5;
      const r = contourTail(nu, c, 'upper');
      expect(Math.abs(r.p - ss * ss) / (ss * ss)).toBeLessThan(1e-6);
    }
  });
});
