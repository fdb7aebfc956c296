/**
 * Imhof's integrand as one complex product (src/engines/imhof-product.ts): theta and log rho
 * against the sums of arctangents and logarithms they replace (the definition, Imhof 1961), and
 * the tail probabilities against the mpmath reference values of test/ref/reference.json (50 digits,
 * see test/ref/README.md), each within 1e-10 and within its own reported bound.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { productSpectralForm, imhofProductTail, imhofProductPair } from '../src/engines/imhof-product.js';
import { imhofTail, spectralForm } from '../src/engines/imhof.js';
import { seededNormal } from './helpers/reference.js';

interface RefCase { id: string; nu: number[]; points: { c: number; lower: number; upper: number }[] }
const ref = JSON.parse(readFileSync(new URL('./ref/reference.json', import.meta.url), 'utf8')) as { cases: RefCase[] };

describe('productSpectralForm', () => {
  it('gives theta on the continuous branch and log rho, as the sums of arctangents and logarithms do', () => {
    const z = seededNormal(41);
    const out = new Float64Array(2);
    let turnsSeen = 0;
    for (const m of [1, 2, 3, 7, 49, 400]) {
      const nu = Float64Array.from({ length: m }, () => 2 + 1.5 * z()).sort();
      for (const c of [nu[0] - 0.5, 0.5 * (nu[0] + nu[m - 1]), nu[Math.floor(m / 2)], nu[m - 1] + 0.3]) {
        for (const sign of [1, -1] as const) {
          const form = productSpectralForm(nu, c, sign);
          const lambda = Array.from(nu, (v) => sign * (v - c));
          for (const u of [0.01, 0.3, 1, 4, 40, 1e3, 1e6, 1e12]) {
            form.evaluate(u, out);
            // the definition: theta = (1/2) sum atan(lambda u), log rho = (1/4) sum log(1 + lambda^2 u^2)
            let theta = 0;
            let logRho = 0;
            for (const l of lambda) { theta += Math.atan(l * u); logRho += Math.log1p((l * u) ** 2); }
            theta *= 0.5;
            logRho *= 0.25;
            if (Math.abs(theta) > Math.PI) turnsSeen++;
            expect(Math.abs(out[0] - theta), `m=${m} c=${c} u=${u}`).toBeLessThan(1e-13 * Math.max(1, m));
            expect(Math.abs(out[1] - logRho), `m=${m} c=${c} u=${u}`).toBeLessThan(1e-13 * Math.max(1, Math.abs(logRho)));
          }
        }
      }
    }
    // branches beyond the principal one were exercised (theta up to m pi / 4)
    expect(turnsSeen).toBeGreaterThan(20);
  });

  it('has the weights and truncation data of spectralForm', () => {
    const nu = Float64Array.from([0.2, 0.9, 1.5, 2.5, 3.7]);
    const a = productSpectralForm(nu, 1.5, -1);
    const b = spectralForm(nu, 1.5, -1);
    expect([a.m, a.sumLambda, a.sumLogAbsLambda, a.maxAbsLambda]).toEqual([b.m, b.sumLambda, b.sumLogAbsLambda, b.maxAbsLambda]);
    expect(a.m).toBe(4); // the weight nu_3 - c = 0 is left out of the truncation bound
  });
});

describe('imhofProductTail and imhofProductPair against mpmath (test/ref/reference.json)', () => {
  it('every reference probability within 1e-10 and within the reported bound; the atan form agrees to 1e-14', () => {
    let checked = 0;
    for (const c of ref.cases) {
      const nu = Float64Array.from(c.nu);
      for (const pt of c.points) {
        for (const tail of ['lower', 'upper'] as const) {
          const want = tail === 'lower' ? pt.lower : pt.upper;
          const got = imhofProductTail(nu, pt.c, tail);
          const err = Math.abs(got.p - want);
          expect(err, `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-10);
          expect(err, `${c.id} c=${pt.c} ${tail}: error above the bound`).toBeLessThanOrEqual(got.errorBound);
          expect(got.method).toBe('imhof');
          const atan = imhofTail(nu, pt.c, tail);
          expect(Math.abs(got.p - atan.p), `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-14);
          expect(Math.abs(got.errorBound - atan.errorBound)).toBeLessThan(1e-3 * atan.errorBound);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(250);
  });

  it('the pair: the first tail is imhofProductTail exactly, the second (on the first one\'s nodes) within its own bound of mpmath', () => {
    let checked = 0;
    for (const c of ref.cases) {
      const nu = Float64Array.from(c.nu);
      const m = nu.length;
      const width = nu[m - 1] - nu[0];
      for (const pt of c.points) {
        if (!(pt.c > nu[0] && pt.c < nu[m - 1])) continue;
        for (const tail of ['lower', 'upper'] as const) {
          // the first point a little away from the reference point, towards the middle
          const c1 = pt.c + (pt.c < 0.5 * (nu[0] + nu[m - 1]) ? 1 : -1) * 1e-3 * width;
          if (!(c1 > nu[0] && c1 < nu[m - 1])) continue;
          const [first, second] = imhofProductPair(nu, c1, pt.c, tail);
          const alone = imhofProductTail(nu, c1, tail);
          expect(first.p).toBe(alone.p);
          expect(first.errorBound).toBe(alone.errorBound);
          const want = tail === 'lower' ? pt.lower : pt.upper;
          const err = Math.abs(second.p - want);
          expect(err, `${c.id} c=${pt.c} ${tail}`).toBeLessThanOrEqual(second.errorBound);
          expect(err, `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-10);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(200);
  });

  it('the pair refuses points outside the open support', () => {
    const nu = Float64Array.from([0.5, 1, 2]);
    expect(() => imhofProductPair(nu, 0.5, 1, 'lower')).toThrow(RangeError);
    expect(() => imhofProductPair(nu, 1, 2.5, 'upper')).toThrow(RangeError);
  });
});
