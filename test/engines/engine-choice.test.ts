/** The `auto` rule and the eigen-free design source, against the spectral route. */
import { describe, expect, it } from 'vitest';
import { prepareProblem } from '../../src/problem/problem.js';
import { DwNullDistribution } from '../../src/distribution/null-distribution.js';
import { spectrumMean, spectrumVariance } from '../../src/core/spectrum.js';
import { seededNormal } from '../helpers/reference.js';

function regressors(n: number, seed: number) {
  const g = seededNormal(seed);
  return {
    trend: Float64Array.from({ length: n }, (_, t) => t / n),
    z: Float64Array.from({ length: n }, () => g()),
  };
}

describe('auto engine choice', () => {
  it('small n: Imhof in the body of the distribution, Pan in a far tail (relative accuracy)', () => {
    const { distribution } = prepareProblem(regressors(30, 1), 30);
    const body = distribution.lowerTail(1.8);
    expect(body.method).toBe('imhof');
    expect(body.reason).toEqual({ code: 'IMHOF_SPECTRUM' });
    const [lo] = distribution.support;
    const tail = distribution.lowerTail(lo + 0.02);
    expect(tail.p).toBeLessThan(1e-6);
    expect(tail.method).toBe('pan');
    expect(tail.relativeError).toBeLessThan(1e-6);
    expect(tail.reason).toEqual({ code: 'SMALL_TAIL_PAN' });
  });
  it('large n: the DCT eigenbasis route for a difference operator, agreeing with Imhof on the spectrum to 1e-9', () => {
    const n = 1500;
    const x = regressors(n, 2);
    const big = prepareProblem(x, n).distribution;
    const r = big.lowerTail(1.93);
    expect(r.method).toBe('dct');
    expect(r.reason).toEqual({ code: 'LARGE_N_DCT', n });
    const spectral = new DwNullDistribution(prepareProblem(x, n).distribution.source, { method: 'imhof' });
    expect(Math.abs(spectral.cdf(1.93) - r.p)).toBeLessThan(1e-9);
  });
  it('mean and variance from traces equal the spectral formulas (no eigenvalues needed)', () => {
    const n = 200;
    const p = prepareProblem(regressors(n, 3), n, { lag: 4 });
    const fromTraces = [p.distribution.mean, p.distribution.variance];
    const nu = p.distribution.spectrum;
    expect(Math.abs(fromTraces[0] - spectrumMean(nu))).toBeLessThan(1e-12);
    expect(Math.abs(fromTraces[1] - spectrumVariance(nu))).toBeLessThan(1e-12);
  });
  it('a forced engine that cannot answer refuses with ENGINE_NOT_APPLICABLE (Pan on a lag-4 spectrum with ties)', () => {
    const n = 40;
    const p = prepareProblem(regressors(n, 4), n, { lag: 4, method: 'pan' });
    expect(() => p.distribution.cdf(2)).toThrowError(/does not apply/);
  });
});
