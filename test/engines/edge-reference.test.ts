/**
 * Trust at the edges, against the mpmath reference of test/ref/edge_reference.py
 * (edge-reference.json, 50 digits): every reported bound must cover the true error.
 *   - m = 2 (arcsine law, closed form) with c within a few ulps of either end of the support;
 *   - m = 3 with c within rounding of an eigenvalue, by the eigen-free engine (whose truncation bound
 *     needs U <= 1e-3 / tau; beyond it the convexity cut takes over), by DCT and by auto;
 *   - quantiles: accepted only when P(root) is the level to within the stated tolerance, refused with
 *     QUANTILE_UNREACHABLE where double precision cannot reach it.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { prepareProblem } from '../../src/problem/problem.js';
import { tailProbability } from '../../src/engines/choose.js';
import { quantileTolerance } from '../../src/distribution/null-distribution.js';
import { isDwError } from '../../src/errors.js';
import type { MethodChoice } from '../../src/core/types.js';
import { exactDwTest, pValuesFor } from '../../src/inference/dw-test.js';
import { renderJson } from '../../src/report/json.js';
import { referenceJson } from '../helpers/reference.js';

interface Point { c: string; lower: string; upper: string }
interface Case { id: string; n: number; trend: boolean; nu: string[]; points: Point[]; quantile05: string; jumpAboveNu1?: string }
const ref = referenceJson('edge-reference.json') as { cases: Case[] };

function problem(c: Case, method: MethodChoice = 'auto') {
  const x: Record<string, number[]> = c.trend ? { t: Array.from({ length: c.n }, (_, i) => i + 1) } : {};
  return prepareProblem(x, c.n, { method });
}

describe('edge reference (mpmath, test/ref/edge_reference.py)', () => {
  for (const cs of ref.cases) {
    it(`${cs.id}: both tails at c next to the ends and eigenvalues: |p - reference| <= errorBound (auto)`, () => {
      const dist = problem(cs).distribution;
      for (const pt of cs.points) {
        const c = Number(pt.c);
        for (const [tail, want] of [['lower', Number(pt.lower)], ['upper', Number(pt.upper)]] as const) {
          const r = tail === 'lower' ? dist.lowerTail(c) : dist.upperTail(c);
          // the reference is rounded to a double: allow its half-ulp
          expect(Math.abs(r.p - want), `${cs.id} ${tail} at ${pt.c}: p ${r.p}, bound ${r.errorBound}`).toBeLessThanOrEqual(r.errorBound + 1e-16);
        }
      }
    });
  }

  it('m = 3 next to an eigenvalue and next to both ends: the eigen-free and DCT engines bound their error honestly (the eigen-free bound was 7e-12 against a true error of 2e-11 before the convexity cut)', () => {
    const cs = ref.cases.find((c) => c.id === 'm3-n5')!;
    const src = problem(cs).distribution.source;
    for (const method of ['eigenfree', 'dct', 'imhof'] as const) {
      for (const pt of cs.points) {
        const c = Number(pt.c);
        for (const [tail, want] of [['lower', Number(pt.lower)], ['upper', Number(pt.upper)]] as const) {
          // Imhof works on the computed spectrum, whose rounding the distribution object accounts for
          const r = method === 'imhof'
            ? (tail === 'lower' ? problem(cs, 'imhof').distribution.lowerTail(c) : problem(cs, 'imhof').distribution.upperTail(c))
            : tailProbability(src, c, tail, { method });
          expect(Math.abs(r.p - want), `${method} ${tail} at ${pt.c}: p ${r.p}, bound ${r.errorBound}`).toBeLessThanOrEqual(r.errorBound + 1e-16);
          expect(r.errorBound).toBeLessThan(1e-9);
        }
      }
    }
  });

  it('quantiles at 5%: the root is the mpmath critical value and P(root) is the level within the stated tolerance', () => {
    for (const cs of ref.cases) {
      const dist = problem(cs).distribution;
      const c = dist.quantile(0.05);
      expect(Math.abs(c - Number(cs.quantile05))).toBeLessThan(1e-9);
      expect(Math.abs(dist.cdf(c) - 0.05)).toBeLessThanOrEqual(quantileTolerance(0.05) + 1e-10);
    }
  });

  it('m = 2: a level below the CDF jump at the first double above nu_1 is refused with QUANTILE_UNREACHABLE', () => {
    for (const cs of ref.cases.filter((c) => c.jumpAboveNu1)) {
      const jump = Number(cs.jumpAboveNu1); // about 7e-9 (mpmath): no double c has 0 < P(d <= c) < jump
      expect(jump).toBeGreaterThan(1e-9);
      const dist = problem(cs).distribution;
      for (const q of [1e-10, 1e-12]) {
        let code = 'no error';
        try { dist.quantile(q); } catch (e) { code = isDwError(e) ? e.code : String(e); }
        expect(code).toBe('QUANTILE_UNREACHABLE');
      }
    }
  });

  it('per-tail bounds: errorBoundPositive covers pPositive and errorBoundNegative covers pNegative (m = 2 and m = 3 references)', () => {
    for (const cs of ref.cases) {
      const pr = problem(cs);
      for (const pt of cs.points) {
        const c = Number(pt.c);
        if (!(c >= 0 && c <= 4)) continue;
        const pv = pValuesFor(pr, c);
        expect(Math.abs(pv.pPositive - Number(pt.lower))).toBeLessThanOrEqual(pv.errorBoundPositive + 1e-16);
        expect(Math.abs(pv.pNegative - Number(pt.upper))).toBeLessThanOrEqual(pv.errorBoundNegative + 1e-16);
        expect(pv.errorBound).toBeGreaterThanOrEqual(Math.max(pv.errorBoundPositive, pv.errorBoundNegative));
      }
    }
  });

  it('the JSON report carries both per-tail bounds beside errorBound, equal to the result', () => {
    const y = [3.1, 2.7, 3.9, 4.4, 4.0, 5.2, 5.1, 6.3, 6.0, 7.2]; // invented
    const r = exactDwTest({ y, x: { t: y.map((_, i) => i + 1) } });
    const j = JSON.parse(renderJson(r));
    expect(j.errorBoundPositive).toBe(r.errorBoundPositive);
    expect(j.errorBoundNegative).toBe(r.errorBoundNegative);
    expect(j.errorBound).toBe(r.errorBound);
    expect(r.errorBoundPositive).toBeGreaterThan(0);
  });
});
