/**
 * Imhof's integrand as one complex product (src/engines/imhof-product.ts): theta and log rho
 * against the sums of arctangents and logarithms they replace (the definition, Imhof 1961), and
 * the tail probabilities against the mpmath reference values of test/ref/reference.json (50 digits,
 * see test/ref/README.md), each within 1e-10 and within its own reported bound.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { productSpectralForm, imhofTail, imhofProductWithDensity } from '../../src/engines/imhof-product.js';
import { imhofDensity, integrateImhof, spectralForm } from '../../src/engines/imhof.js';
import { seededNormal, jStat } from '../helpers/reference.js';
import { referenceJson } from '../helpers/reference.js';

interface RefCase { id: string; nu: number[]; points: { c: number; lower: number; upper: number }[] }
const ref = referenceJson('reference.json') as { cases: RefCase[] };

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

/** Imhof's integral on the textbook form (m arctangents and logarithms per point), the same integration. */
function atanTail(nu: Float64Array, c: number, tail: 'lower' | 'upper'): { p: number; errorBound: number } {
  const r = integrateImhof(spectralForm(nu, c, tail === 'lower' ? 1 : -1));
  return { p: r.p, errorBound: r.errorBound };
}

describe('imhofTail and imhofProductWithDensity against mpmath (test/ref/reference.json)', () => {
  it('every reference probability within 1e-10 and within the reported bound; the atan form agrees to 1e-14', () => {
    let checked = 0;
    for (const c of ref.cases) {
      const nu = Float64Array.from(c.nu);
      for (const pt of c.points) {
        for (const tail of ['lower', 'upper'] as const) {
          const want = tail === 'lower' ? pt.lower : pt.upper;
          const got = imhofTail(nu, pt.c, tail);
          const err = Math.abs(got.p - want);
          expect(err, `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-10);
          expect(err, `${c.id} c=${pt.c} ${tail}: error above the bound`).toBeLessThanOrEqual(got.errorBound);
          expect(got.method).toBe('imhof');
          const atan = atanTail(nu, pt.c, tail);
          expect(Math.abs(got.p - atan.p), `${c.id} c=${pt.c} ${tail}`).toBeLessThan(1e-14);
          expect(Math.abs(got.errorBound - atan.errorBound)).toBeLessThan(1e-3 * atan.errorBound);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(250);
  });

  it('with the density: the tail is imhofTail exactly; the density within its bound of imhofDensity\'s', () => {
    let checked = 0;
    for (const c of ref.cases) {
      const nu = Float64Array.from(c.nu);
      const m = nu.length;
      for (const pt of c.points) {
        if (!(pt.c > nu[0] && pt.c < nu[m - 1])) continue;
        for (const tail of ['lower', 'upper'] as const) {
          const got = imhofProductWithDensity(nu, pt.c, tail);
          const alone = imhofTail(nu, pt.c, tail);
          expect(got.tail.p).toBe(alone.p);
          expect(got.tail.errorBound).toBe(alone.errorBound);
          if (got.density === null) { expect(m).toBeLessThanOrEqual(3); continue; }
          const other = imhofDensity(nu, pt.c, { tolerance: 1e-12 });
          expect(Math.abs(got.density - other.value), `${c.id} c=${pt.c} ${tail}`).toBeLessThanOrEqual(got.densityError + other.errorBound);
          expect(got.densityError).toBeLessThan(1e-4);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(300);
  });

  it('the density of d for two eigenvalues of multiplicities p and q: a scaled Beta(q/2, p/2) law (closed form; jstat)', () => {
    // d = a + (b - a) B with B ~ Beta(q/2, p/2) when nu = (a x p, b x q): uniform for p = q = 2
    const uniform = Float64Array.from([1, 1, 3, 3]);
    for (const c of [1.2, 2, 2.9]) {
      const r = imhofProductWithDensity(uniform, c, 'lower');
      expect(Math.abs(r.density! - 0.5)).toBeLessThanOrEqual(r.densityError);
      expect(Math.abs(r.tail.p - (c - 1) / 2)).toBeLessThanOrEqual(r.tail.errorBound);
    }
    const nu = Float64Array.from([0.5, 0.5, 0.5, 0.5, 2.5, 2.5, 2.5, 2.5, 2.5, 2.5]);
    for (const c of [0.8, 1.5, 2.2]) {
      const r = imhofProductWithDensity(nu, c, 'upper');
      const t = (c - 0.5) / 2;
      const want = jStat.beta.pdf(t, 3, 2) / 2; // B = chi2_6 / (chi2_4 + chi2_6) ~ Beta(3, 2)
      expect(Math.abs(r.density! - want), `c=${c}`).toBeLessThanOrEqual(r.densityError + 1e-12);
    }
  });

  it('the density is null where its truncation cannot be bounded (two weights), and points outside the support are refused', () => {
    const nu = Float64Array.from([0.5, 1, 2]);
    expect(imhofProductWithDensity(Float64Array.of(1, 3), 2, 'lower').density).toBeNull();
    expect(() => imhofProductWithDensity(nu, 0.5, 'lower')).toThrow(RangeError);
    expect(() => imhofProductWithDensity(nu, 2.5, 'upper')).toThrow(RangeError);
  });
});
