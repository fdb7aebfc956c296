/**
 * The batch's tail probabilities (src/batch/fast-tail.ts) against the null distribution's own
 * (DwNullDistribution.lowerTail / upperTail, the single test's numbers: the same p bit for bit) and against the mpmath
 * reference values of test/ref/reference.json (50 digits, see test/ref/README.md).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { prepareProblem } from '../../src/problem/problem.js';
import { DwNullDistribution } from '../../src/distribution/null-distribution.js';
import { batchTail } from '../../src/batch/fast-tail.js';
import { tailProbability } from '../../src/engines/choose.js';
import { referenceJson } from '../helpers/reference.js';

interface RefCase {
  id: string; n: number; lag: number; times: number[] | null; intercept: boolean; x: number[][];
  points: { c: number; lower: number; upper: number }[];
}
const ref = referenceJson('reference.json') as { cases: RefCase[] };
const problemOf = (c: RefCase) => prepareProblem(c.x, c.n, { intercept: c.intercept, lag: c.lag, times: c.times ?? undefined, names: c.x[0].map((_, j) => `x${j}`) });

describe('batchTail', () => {
  it('is the distribution\'s own tail bit for bit, with an error bound built by the same rule, and within it of mpmath', () => {
    let checked = 0;
    let paired = 0;
    for (const c of ref.cases) {
      const dist = problemOf(c).distribution;
      for (const pt of c.points) {
        for (const tail of ['lower', 'upper'] as const) {
          const want = tail === 'lower' ? pt.lower : pt.upper;
          const own = tail === 'lower' ? dist.lowerTail(pt.c) : dist.upperTail(pt.c);
          const got = batchTail(dist, pt.c, tail);
          expect(got.method, `${c.id} c=${pt.c} ${tail}`).toBe(own.method);
          // small tails go to the same engines (Pan, the shifted inversion) by the same rule: the same numbers
          if (own.method !== 'imhof') { expect(got.errorBound).toBe(own.errorBound); } else paired++;
          // the same engine on the same spectrum and nodes: the same probability, bit for bit
          expect(got.p, `${c.id} c=${pt.c} ${tail}`).toBe(own.p);
          // the bound: the engine's own (the same nodes) plus 2 delta x the measured slope
          expect(Math.abs(got.errorBound - own.errorBound), `${c.id} c=${pt.c} ${tail}`).toBeLessThanOrEqual(1e-3 * own.errorBound);
          const err = Math.abs(got.p - want);
          expect(err, `${c.id} c=${pt.c} ${tail}`).toBeLessThanOrEqual(got.errorBound);
          expect(err, `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-10);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(250);
    expect(paired).toBeGreaterThan(200);
  });

  it('forced engines and a bare spectrum go through the usual engine choice unchanged', () => {
    const c = ref.cases.find((r) => r.n >= 20)!;
    const p = problemOf(c);
    for (const method of ['imhof', 'pan', 'eigenfree', 'dct'] as const) {
      const dist = new DwNullDistribution(p.distribution.source, { method });
      const pt = c.points[Math.floor(c.points.length / 2)];
      const own = dist.lowerTail(pt.c);
      const got = batchTail(dist, pt.c, 'lower');
      expect([got.p, got.errorBound, got.method]).toEqual([own.p, own.errorBound, own.method]);
    }
    const bare = DwNullDistribution.fromSpectrum(p.distribution.spectrum);
    const pt = c.points[1];
    const r = tailProbability(bare.source, pt.c, 'upper', {});
    expect(r.p).toBe(bare.upperTail(pt.c).p);
  });

  it('refuses a point that is not a finite number, as the distribution does', () => {
    const dist = problemOf(ref.cases[0]).distribution;
    expect(() => batchTail(dist, Number.NaN, 'lower')).toThrowError(expect.objectContaining({ code: 'D_OUT_OF_RANGE' }));
  });
});
