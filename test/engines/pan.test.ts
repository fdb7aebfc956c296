/**
 * Pan's engine (src/engines/pan.ts) against sources outside it: closed forms (the arcsine law for
 * m = 2, the beta law for two distinct values), an independent evaluation of Imhof's integral
 * written below, the Savin & White (1977) bounds tables, and 50-digit reference values from
 * test/ref/pan_tails.py (mpmath).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { panApplicable, panTail } from '../../src/engines/pan.js';
import { DwError } from '../../src/errors.js';
import { referenceJson } from '../helpers/reference.js';

const require = createRequire(import.meta.url);
const { jStat } = require('jstat') as { jStat: { beta: { cdf(x: number, a: number, b: number): number } } };

// ---------------------------------------------------------------------------------------------
// helpers

/** Durbin-Watson lower-bound spectrum (docs/methods.md section 2): 2 - 2 cos(pi i / n), i = from..to. */
function dwSpectrum(n: number, from: number, to: number): Float64Array {
  const out = new Float64Array(to - from + 1);
  for (let i = from; i <= to; i++) out[i - from] = 2 - 2 * Math.cos((Math.PI * i) / n);
  return out;
}

/**
 * Independent evaluation of Imhof's integral (Imhof 1961, Biometrika 48, 419-426; docs/methods.md
 * section 3): P(d <= c) = P(Q <= 0) = 1/2 - (1/pi) Integral_0^inf sin(theta(u)) / (u rho(u)) du,
 * lambda = nu - c. Simple and slow: the substitution u = s exp((pi/2) sinh(tau)) (exp-sinh) and
 * the trapezoidal rule in tau, halving the step until two estimates agree to 1e-13.
 */
function imhofLower(nu: Float64Array, c: number): { p: number; err: number } {
  const lam = Array.from(nu, (v) => v - c).filter((v) => v !== 0);
  const s = 1 / Math.max(...lam.map(Math.abs));
  const g = (tau: number): number => {
    const u = s * Math.exp((Math.PI / 2) * Math.sinh(tau));
    if (u === 0 || !Number.isFinite(u)) return 0;
    let theta = 0;
    let logRho = 0;
    for (const l of lam) {
      theta += Math.atan(l * u);
      logRho += Math.log1p(l * u * (l * u));
    }
    return (Math.sin(theta / 2) / Math.exp(logRho / 4)) * (Math.PI / 2) * Math.cosh(tau);
  };
  const T = 4.5;
  let h = 0.25;
  let sum = 0;
  for (let k = -Math.ceil(T / h); k <= Math.ceil(T / h); k++) sum += g(k * h);
  let integral = h * sum;
  for (;;) {
    let odd = 0;
    for (let k = -Math.ceil(T / h); k < Math.ceil(T / h); k++) odd += g((k + 0.5) * h);
    const next = 0.5 * integral + 0.5 * h * odd;
    h /= 2;
    const diff = Math.abs(next - integral);
    integral = next;
    if ((diff < 1e-13 && h <= 1 / 32) || h < 1 / 2048) return { p: 0.5 - integral / Math.PI, err: diff / Math.PI };
  }
}

function expectNotApplicable(fn: () => unknown): DwError {
  try {
    fn();
  } catch (err) {
    expect(err).toBeInstanceOf(DwError);
    expect((err as DwError).code).toBe('ENGINE_NOT_APPLICABLE');
    return err as DwError;
  }
  throw new Error('expected ENGINE_NOT_APPLICABLE');
}

// ---------------------------------------------------------------------------------------------

describe('closed forms (docs/methods.md section 13)', () => {
  it('m = 2 follows the arcsine law P(d <= c) = (2/pi) asin(sqrt((c - nu1)/(nu2 - nu1))), both tails', () => {
    for (const [a, b] of [[0, 1], [0.3, 3.7], [1.9, 2.1]]) {
      const nu = Float64Array.of(a, b);
      for (let k = 1; k < 40; k++) {
        const c = a + ((b - a) * k) / 40;
        const exact = (2 / Math.PI) * Math.asin(Math.sqrt((c - a) / (b - a)));
        const lo = panTail(nu, c, 'lower');
        const up = panTail(nu, c, 'upper');
        expect(lo.method).toBe('pan');
        expect(Math.abs(lo.p - exact)).toBeLessThan(1e-14);
        expect(Math.abs(up.p - (1 - exact))).toBeLessThan(1e-14);
        expect(lo.errorBound).toBeGreaterThanOrEqual(Math.abs(lo.p - exact) - 1e-16);
      }
    }
  });

  it('one simple and one repeated eigenvalue follow the beta law: d = a + (b - a) B, B ~ Beta(q/2, p/2), exact to 1e-14', () => {
    // With p = 1 or q = 1 and the other multiplicity odd, B has a Beta(1/2 + j, 1/2) law, whose
    // distribution function is elementary by the recurrence I_x(s + 1, 1/2) = I_x(s, 1/2) -
    // x^s (1 - x)^(1/2) / (s B(s, 1/2)) from I_x(1/2, 1/2) = (2/pi) asin(sqrt(x)) (Abramowitz &
    // Stegun 1964, section 26.5). The tie sits on the side that is not integrated (the lower form
    // for [a, b, b, b], the mirror form for [a, a, a, b]), where it enters only through smooth
    // factors.
    const betaHalf = (x: number, j: number): number => {
      let value = (2 / Math.PI) * Math.asin(Math.sqrt(x));
      let B = Math.PI; // B(1/2 + i, 1/2)
      for (let i = 0; i < j; i++) {
        const s = 0.5 + i;
        value -= (Math.pow(x, s) * Math.sqrt(1 - x)) / (s * B);
        B *= s / (1 + i);
      }
      return value;
    };
    const a = 0.4;
    const b = 2.9;
    for (const [p, q] of [[1, 3], [1, 5], [3, 1], [7, 1]]) {
      const nu = Float64Array.from([...Array(p).fill(a), ...Array(q).fill(b)]);
      for (let k = 1; k < 40; k++) {
        const c = a + ((b - a) * k) / 40;
        const x = (c - a) / (b - a);
        const exact = p === 1 ? betaHalf(x, (q - 1) / 2) : 1 - betaHalf(1 - x, (p - 1) / 2);
        const lo = panTail(nu, c, 'lower');
        expect(Math.abs(lo.p - exact)).toBeLessThan(1e-14);
        expect(Math.abs(panTail(nu, c, 'upper').p - (1 - exact))).toBeLessThan(1e-14);
        expect(lo.errorBound).toBeGreaterThanOrEqual(Math.abs(lo.p - exact) - 2e-16);
      }
    }
  });

  it('the same beta law from jstat\'s beta CDF, to jstat\'s own accuracy (1e-7: measured against mpmath, its continued fraction reaches ~1e-8 here)', () => {
    const a = 0.4;
    const b = 2.9;
    for (const [p, q] of [[1, 3], [1, 6], [3, 1], [5, 1]]) {
      const nu = Float64Array.from([...Array(p).fill(a), ...Array(q).fill(b)]);
      for (let k = 1; k < 20; k++) {
        const c = a + ((b - a) * k) / 20;
        const exact = jStat.beta.cdf((c - a) / (b - a), q / 2, p / 2);
        expect(Math.abs(panTail(nu, c, 'lower').p - exact)).toBeLessThan(1e-7);
        expect(Math.abs(panTail(nu, c, 'upper').p - (1 - exact))).toBeLessThan(1e-7);
      }
    }
  });

  it('both values repeated (beta law with p, q >= 2) and all-even multiplicities (partial fractions) are refused', () => {
    const betaCase = Float64Array.of(0.4, 0.4, 2.9, 2.9, 2.9);
    const evenCase = Float64Array.of(1, 1, 2, 2, 4, 4);
    expect(panApplicable(betaCase).ok).toBe(false);
    expect(panApplicable(evenCase).ok).toBe(false);
    for (const c of [0.5, 1.5, 2.8]) expectNotApplicable(() => panTail(betaCase, c, 'lower'));
    for (const c of [1.2, 2, 3.5]) expectNotApplicable(() => panTail(evenCase, c, 'upper'));
  });
});

describe('agreement with an independent evaluation of Imhof\'s integral', () => {
  const spectra: Record<string, Float64Array> = {
    // Durbin-Watson lower-bound spectra (distinct values), n = 10 and 20 with k' = 1
    'dw n=10': dwSpectrum(10, 1, 8),
    'dw n=20': dwSpectrum(20, 1, 18),
    // Durbin-Watson upper-bound spectrum, n = 15, k' = 3: lambda_{i+3}, i = 1..11
    'dw-upper n=15 k=3': dwSpectrum(15, 4, 14),
    'irregular m=7': Float64Array.of(-1.3, -0.2, 0.05, 0.6, 0.61, 2, 9),
    'odd m=5': Float64Array.of(0.2, 0.7, 1.1, 2.5, 3.9),
  };
  for (const [name, nu] of Object.entries(spectra)) {
    it(`${name}: both tails at 25 points across the support agree to 1e-9`, () => {
      const lo = nu[0];
      const hi = nu[nu.length - 1];
      for (let k = 1; k < 26; k++) {
        const c = lo + ((hi - lo) * k) / 26;
        const ref = imhofLower(nu, c);
        expect(ref.err).toBeLessThan(1e-11);
        const pl = panTail(nu, c, 'lower');
        const pu = panTail(nu, c, 'upper');
        expect(Math.abs(pl.p - ref.p)).toBeLessThan(1e-9);
        expect(Math.abs(pu.p - (1 - ref.p))).toBeLessThan(1e-9);
        expect(pl.errorBound).toBeLessThan(1e-12);
      }
    });
  }

  it('c equal to an eigenvalue, and one ulp either side of it', () => {
    const nu = spectra['dw n=20'];
    for (const j of [1, 2, 5, 9, 16]) {
      const v = nu[j];
      const ref = imhofLower(nu, v).p;
      for (const c of [v, v * (1 + 2.3e-16), v * (1 - 2.3e-16)]) {
        expect(Math.abs(panTail(nu, c, 'lower').p - ref)).toBeLessThan(1e-9);
        expect(Math.abs(panTail(nu, c, 'upper').p - (1 - ref))).toBeLessThan(1e-9);
      }
    }
    const odd = spectra['odd m=5'];
    for (let j = 1; j < 4; j++) {
      expect(Math.abs(panTail(odd, odd[j], 'lower').p - imhofLower(odd, odd[j]).p)).toBeLessThan(1e-9);
    }
  });

  it('a tie on the side that is not integrated is harmless: [0.5, 0.5, 1, 2] answers by the mirror form', () => {
    const nu = Float64Array.of(0.5, 0.5, 1, 2);
    for (const c of [0.55, 0.9, 1, 1.4, 1.99]) {
      expect(panApplicable(nu, c).ok).toBe(true);
      expect(Math.abs(panTail(nu, c, 'lower').p - imhofLower(nu, c).p)).toBeLessThan(1e-9);
    }
  });
});

describe('edge cases', () => {
  const nu = dwSpectrum(12, 1, 10);
  it('c <= nu_1 and c >= nu_m give 0 and 1 exactly', () => {
    for (const c of [-5, 0, nu[0]]) {
      expect(panTail(nu, c, 'lower')).toMatchObject({ p: 0, errorBound: 0 });
      expect(panTail(nu, c, 'upper')).toMatchObject({ p: 1, errorBound: 0 });
    }
    for (const c of [nu[9], 4, 100]) {
      expect(panTail(nu, c, 'lower')).toMatchObject({ p: 1, errorBound: 0 });
      expect(panTail(nu, c, 'upper')).toMatchObject({ p: 0, errorBound: 0 });
    }
  });

  it('lower + upper = 1 within the reported bounds (the two tails come from different forms)', () => {
    for (let k = 1; k < 50; k++) {
      const c = nu[0] + ((nu[9] - nu[0]) * k) / 50;
      const a = panTail(nu, c, 'lower');
      const b = panTail(nu, c, 'upper');
      expect(Math.abs(a.p + b.p - 1)).toBeLessThanOrEqual(a.errorBound + b.errorBound + 4e-16);
    }
  });

  it('malformed input is rejected with a DwError', () => {
    const codeOf = (fn: () => unknown): string => {
      try { fn(); } catch (err) { return (err as DwError).code; }
      return 'none';
    };
    expect(codeOf(() => panTail(Float64Array.of(2, 1), 1.5, 'lower'))).toBe('OPTION_VALUE');
    expect(codeOf(() => panTail(Float64Array.of(1), 1, 'lower'))).toBe('OPTION_VALUE');
    expect(codeOf(() => panTail(Float64Array.of(1, NaN), 1, 'lower'))).toBe('OPTION_VALUE');
    expect(codeOf(() => panTail(Float64Array.of(1, 2), NaN, 'lower'))).toBe('D_OUT_OF_RANGE');
    expect(codeOf(() => panTail(Float64Array.of(1, 2), 1.5, 'lower', { tolerance: 0 }))).toBe('OPTION_VALUE');
    expect(panApplicable(Float64Array.of(2, 1)).ok).toBe(false);
  });
});

describe('Savin & White (1977) bounds tables (docs/methods.md section 13)', () => {
  // alpha, n, k', d_L, d_U (Econometrica 45, 1989-1996)
  const rows: Array<[number, number, number, number, number]> = [
    [0.05, 6, 1, 0.61, 1.4], [0.05, 10, 1, 0.879, 1.32], [0.05, 15, 1, 1.077, 1.361],
    [0.05, 20, 1, 1.201, 1.411], [0.05, 20, 2, 1.1, 1.537], [0.05, 20, 5, 0.792, 1.991],
    [0.05, 30, 1, 1.352, 1.489], [0.05, 30, 3, 1.214, 1.65], [0.05, 50, 1, 1.503, 1.585],
    [0.05, 100, 1, 1.654, 1.694], [0.01, 15, 1, 0.811, 1.07], [0.01, 20, 1, 0.952, 1.147],
    [0.01, 30, 1, 1.133, 1.263], [0.01, 50, 1, 1.324, 1.403], [0.01, 100, 1, 1.522, 1.562],
  ];

  /** The alpha-quantile of d by bisection on P(d <= x), bracketed around a normal approximation. */
  function quantile(nu: Float64Array, alpha: number): number {
    // At n = 100 (m = 98) the alternating sum has cancelled to ~1e-6 near the 5% point (Pan's
    // limitation: there the library's auto choice is Imhof), so ask for 1e-4, ample for a table
    // given to 0.001 in d (the density of d there is below 10, so 1e-4 in P is < 2e-5 in d). The
    // bracket stays close to the quantile, where the lower form is still usable.
    const P = (x: number): number => panTail(nu, x, 'lower', { tolerance: 1e-4 }).p;
    const m = nu.length;
    let s1 = 0;
    let s2 = 0;
    for (const v of nu) { s1 += v; s2 += v * v; }
    const mean = s1 / m;
    const sd = Math.sqrt((2 * (m * s2 - s1 * s1)) / (m * m * (m + 2))); // docs/methods.md section 2
    const z = alpha === 0.05 ? -1.645 : -2.326;
    let lo = Math.max(nu[0], mean + z * sd - 0.02);
    let hi = mean + z * sd + 0.02;
    while (P(lo) > alpha) lo = Math.max(nu[0], lo - 0.02);
    while (P(hi) < alpha) hi += 0.02;
    for (let it = 0; it < 24; it++) {
      const mid = 0.5 * (lo + hi);
      if (P(mid) < alpha) lo = mid; else hi = mid;
    }
    return 0.5 * (lo + hi);
  }

  for (const [alpha, n, kp, dL, dU] of rows) {
    it(`alpha = ${alpha}, n = ${n}, k' = ${kp}: d_L = ${dL}, d_U = ${dU} to 0.001`, () => {
      const m = n - kp - 1;
      expect(Math.abs(quantile(dwSpectrum(n, 1, m), alpha) - dL)).toBeLessThanOrEqual(0.001);
      expect(Math.abs(quantile(dwSpectrum(n, kp + 1, kp + m), alpha) - dU)).toBeLessThanOrEqual(0.001);
    });
  }
});

describe('tail relative accuracy against 50-digit values (test/ref/pan-tails.json, mpmath)', () => {
  interface RefCase { spectrum: string; tail: 'lower' | 'upper'; c: number; p: string; boundOnly?: boolean }
  const ref = referenceJson('pan-tails.json') as {
    spectra: Record<string, number[]>;
    cases: RefCase[];
  };
  for (const cs of ref.cases) {
    const what = cs.boundOnly ? 'the reported bound covers the error' : 'relative error <= 1e-6 and the bound covers it';
    it(`${cs.spectrum} (m = ${ref.spectra[cs.spectrum].length}) ${cs.tail} tail at c = ${cs.c}, P = ${Number(cs.p).toPrecision(3)}: ${what}`, () => {
      const nu = Float64Array.from(ref.spectra[cs.spectrum]);
      const exact = Number(cs.p);
      const r = panTail(nu, cs.c, cs.tail);
      const err = Math.abs(r.p - exact);
      // the reference is rounded to a double: allow its half ulp
      expect(r.errorBound + 1.2e-16 * exact).toBeGreaterThanOrEqual(err);
      if (!cs.boundOnly) {
        expect(err / exact).toBeLessThanOrEqual(1e-6);
        expect(r.relativeError).toBeLessThan(1e-6);
      }
    });
  }
});

describe('refusal: tied or clustered eigenvalues, cancellation', () => {
  it('[0.5, 0.5, 1, 2] is not applicable as a spectrum, and the reason names the tie', () => {
    const r = panApplicable(Float64Array.of(0.5, 0.5, 1, 2));
    expect(r.ok).toBe(false);
    expect(r.reason).toMatch(/nu_1 = 0.5 and nu_2 = 0.5 are tied/);
  });

  it('[0.5, 0.5, 1, 2, 2] (ties on both sides of every c) gives ENGINE_NOT_APPLICABLE', () => {
    const nu = Float64Array.of(0.5, 0.5, 1, 2, 2);
    for (const c of [0.7, 1, 1.5]) {
      expect(panApplicable(nu, c).ok).toBe(false);
      const err = expectNotApplicable(() => panTail(nu, c, 'lower'));
      expect(err.hint).toMatch(/Imhof/);
    }
  });

  it('a lag-4 spectrum (Wallis 1972: groups of 4 equal values, split by rounding) gives ENGINE_NOT_APPLICABLE', () => {
    // A_4 for n = 16 is 4 interleaved first-difference blocks of length 4, eigenvalues
    // 2 - 2 cos(pi j / 4), j = 0..3, each 4 times; drop the zeros as an intercept would
    const vals: number[] = [];
    for (let j = 1; j < 4; j++) {
      for (let r = 0; r < 4; r++) vals.push((2 - 2 * Math.cos((Math.PI * j) / 4)) * (1 + r * 1e-15));
    }
    const nu = Float64Array.from(vals);
    expect(panApplicable(nu).ok).toBe(false);
    for (const c of [0.7, 1.5, 2, 3]) expectNotApplicable(() => panTail(nu, c, 'lower'));
    // clustered rather than tied: groups spread over 1e-8 of the spread
    const clustered = Float64Array.from(vals.map((v, i) => v + (i % 4) * 3.4e-8));
    expect(panApplicable(clustered).ok).toBe(false);
    expectNotApplicable(() => panTail(clustered, 2, 'upper'));
  });

  it('m = 60: refused without c and in the middle (cancellation), accepted in the tails', () => {
    const nu = dwSpectrum(62, 1, 60);
    expect(panApplicable(nu).ok).toBe(false);
    expect(panApplicable(nu, 2).ok).toBe(false);
    expectNotApplicable(() => panTail(nu, 2, 'lower'));
    expect(panApplicable(nu, 0.6).ok).toBe(true);
    expect(panTail(nu, 0.6, 'lower').relativeError).toBeLessThan(1e-12);
    expect(panApplicable(nu, 3.4).ok).toBe(true);
    expect(panTail(nu, 3.4, 'upper').relativeError).toBeLessThan(1e-12);
  });

  it('all eigenvalues equal (d constant) is refused rather than answered 0 or 1', () => {
    const nu = Float64Array.of(1.5, 1.5, 1.5);
    expect(panApplicable(nu, 1.5).ok).toBe(false);
    expectNotApplicable(() => panTail(nu, 1.5, 'lower'));
  });

  it('small m is applicable everywhere', () => {
    expect(panApplicable(dwSpectrum(20, 1, 18)).ok).toBe(true);
  });
});
