/**
 * Exact Durbin-Watson bounds against outside sources: the published Savin & White (1977) table
 * (values quoted in docs/methods.md section 13, from memory, each confirmed by an independent computation),
 * the Durbin & Watson (1950) bounds theorem (interlacing) on seeded random designs, numeric's
 * eigen-solver for the bounding spectra, the arcsine law (m = 2), and a standard Chebyshev identity.
 */
import { describe, expect, it } from 'vitest';
import { bounds } from '../../src/bounds/bounds.js';
import { lowerBoundSpectrum, upperBoundSpectrum, lowerBoundIndices, upperBoundIndices, differenceEigenvalue } from '../../src/bounds/spectra.js';
import { cosineSpectrumForm } from '../../src/bounds/cosine-form.js';
import { boundQuantile } from '../../src/bounds/quantile.js';
import { boundsTable, MAX_TABLE_CELLS } from '../../src/bounds/table.js';
import { boundsZone, formatPValue, zoneOf } from '../../src/bounds/zone.js';
import { boundsResolutionWords as words } from '../../src/report/wording.js';
import { parseIntegerList, parseLevelList } from '../../src/bounds/ranges.js';
import { spectralForm } from '../../src/engines/imhof.js';
import { exactDwCritical } from '../../src/inference/dw-test.js';
import { DwError } from '../../src/errors.js';
import { parseOptions } from '../../src/cli/args.js';
import { processIo, type CliIo } from '../../src/cli/io.js';
import type { Command } from '../../src/cli/commands/command.js';
import { boundsCommand } from '../../src/cli/commands/bounds.js';
import { tableCommand } from '../../src/cli/commands/table.js';
import { numeric, seededNormal, seededRandom } from '../helpers/reference.js';
import { scratch } from '../helpers/cli.js';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** Savin & White (1977), Econometrica 45, 1989-1996, as quoted in docs/methods.md section 13 (from memory). */
const SAVIN_WHITE: { alpha: number; n: number; k: number; dL: number; dU: number }[] = [
  { alpha: 0.05, n: 6, k: 1, dL: 0.610, dU: 1.400 },
  { alpha: 0.05, n: 10, k: 1, dL: 0.879, dU: 1.320 },
  { alpha: 0.05, n: 15, k: 1, dL: 1.077, dU: 1.361 },
  { alpha: 0.05, n: 20, k: 1, dL: 1.201, dU: 1.411 },
  { alpha: 0.05, n: 20, k: 2, dL: 1.100, dU: 1.537 },
  { alpha: 0.05, n: 20, k: 5, dL: 0.792, dU: 1.991 },
  { alpha: 0.05, n: 30, k: 1, dL: 1.352, dU: 1.489 },
  { alpha: 0.05, n: 30, k: 3, dL: 1.214, dU: 1.650 },
  { alpha: 0.05, n: 50, k: 1, dL: 1.503, dU: 1.585 },
  { alpha: 0.05, n: 100, k: 1, dL: 1.654, dU: 1.694 },
  { alpha: 0.01, n: 15, k: 1, dL: 0.811, dU: 1.070 },
  { alpha: 0.01, n: 20, k: 1, dL: 0.952, dU: 1.147 },
  { alpha: 0.01, n: 30, k: 1, dL: 1.133, dU: 1.263 },
  { alpha: 0.01, n: 50, k: 1, dL: 1.324, dU: 1.403 },
  { alpha: 0.01, n: 100, k: 1, dL: 1.522, dU: 1.562 },
];

/** Run one of the bounds commands in-process, as the dispatcher would (parse, then run). */
async function run(command: Command, ...argv: string[]): Promise<{ status: number; out: string; err: string; error?: DwError }> {
  let out = '';
  const io: CliIo = { ...processIo, out: (t) => { out += t; }, err: () => {} };
  try {
    const { values, positionals } = parseOptions(argv, command.options, command.name);
    const status = await command.run({ values, positionals, io });
    return { status, out, err: '' };
  } catch (err) {
    if (err instanceof DwError) return { status: 2, out, err: err.toLine(), error: err };
    throw err;
  }
}

function thrown(f: () => unknown): DwError {
  try { f(); } catch (err) { if (err instanceof DwError) return err; throw err; }
  throw new Error('expected a DwError');
}

/** Rows of an n x (1 + p) design: intercept, trend and p - 1 seeded normal regressors. */
function randomColumns(seed: number, n: number, p: number): Record<string, number[]> {
  const g = seededNormal(seed);
  const u = seededRandom(seed + 1000);
  const cols: Record<string, number[]> = {};
  for (let j = 0; j < p; j++) {
    const kind = Math.floor(u() * 3);
    cols[`x${j}`] = Array.from({ length: n }, (_, t) => (j === 0 ? t + 1 : kind === 0 ? g() : kind === 1 ? Math.sin(t * (1 + u())) + 0.3 * g() : g() + 0.1 * t));
  }
  return cols;
}

/** The DCT-II eigenvector j of A, cos(pi j (t - 1/2) / n), t = 1..n (docs/methods.md section 2). */
function eigenvector(n: number, j: number): number[] {
  return Array.from({ length: n }, (_, t) => Math.cos((Math.PI * j * (t + 0.5)) / n));
}

describe('Savin & White (1977) table, 5% and 1% (values quoted in docs/methods.md section 13), to 0.001', () => {
  it.each(SAVIN_WHITE)('bounds(): alpha $alpha, n $n, k\' $k', ({ alpha, n, k, dL, dU }) => {
    const b = bounds(n, k, alpha);
    expect(Math.abs(b.dL - dL)).toBeLessThanOrEqual(0.0005 + 1e-9);
    expect(Math.abs(b.dU - dU)).toBeLessThanOrEqual(0.0005 + 1e-9);
    expect(b.m).toBe(n - k - 1);
  });

  it('the table command, CSV parsed back, reproduces every quoted value at 3 decimals', async () => {
    const r = await run(tableCommand, '--n', '6,10,15,20,30,50,100', '--k', '1-5', '--alpha', '0.05,0.01', '--format', 'csv');
    expect(r.status).toBe(0);
    const [header, ...rows] = r.out.trim().split('\n');
    expect(header).toBe('n,k_prime_excl_intercept,alpha_one_sided_positive,d_L,d_U,intercept');
    const cells = new Map(rows.map((line) => {
      const [n, k, a, dL, dU, ic] = line.split(',');
      expect(ic).toBe('true');
      return [`${a}|${n}|${k}`, { dL: Number(dL), dU: Number(dU) }];
    }));
    // n = 6 leaves out k' = 4, 5 (n < k' + 3): 7 x 5 x 2 cells minus 2 x 2
    expect(cells.size).toBe(7 * 5 * 2 - 4);
    for (const s of SAVIN_WHITE) {
      const c = cells.get(`${s.alpha}|${s.n}|${s.k}`);
      expect(c, `${s.alpha} ${s.n} ${s.k}`).toBeDefined();
      expect(Math.abs(c!.dL - s.dL)).toBeLessThanOrEqual(0.001);
      expect(Math.abs(c!.dU - s.dU)).toBeLessThanOrEqual(0.001);
    }
  });

  it('the table command, JSON parsed back, states its conventions and reproduces the quoted values', async () => {
    const r = await run(tableCommand, '--n', '6,10,15,20,30,50,100', '--k', '1,2,3,5', '--alpha', '0.05,0.01', '--format', 'json', '--digits', '4');
    expect(r.status).toBe(0);
    const t = JSON.parse(r.out);
    expect(t.intercept).toBe(true);
    expect(t.alternative).toBe('positive');
    expect(t.definitions.kPrime).toMatch(/other than the intercept/);
    expect(t.definitions.alpha).toMatch(/one-sided/);
    for (const s of SAVIN_WHITE) {
      const c = t.cells.find((x: { n: number; kPrime: number; alpha: number }) => x.n === s.n && x.kPrime === s.k && x.alpha === s.alpha);
      expect(Math.abs(c.dL - s.dL)).toBeLessThanOrEqual(0.001);
      expect(Math.abs(c.dU - s.dU)).toBeLessThanOrEqual(0.001);
    }
  });

  it('the Markdown and text layouts carry a heading with the k\', alpha and direction conventions', async () => {
    const md = await run(tableCommand, '--n', '6-8', '--k', '1-4', '--format', 'markdown');
    expect(md.out).toMatch(/^## Durbin-Watson bounds at alpha = 0\.05 \(5% one-sided, test against positive autocorrelation\)/);
    expect(md.out).toMatch(/\nNote: k' is the number of regressors other than the intercept/);
    expect(md.out).toContain('| 6 | 0.610 | 1.400 |');
    expect(md.out).toContain('- | - |'); // n = 6, k' = 4 left out
    const tx = await run(tableCommand, '--n', '6-8', '--k', '1-4');
    expect(tx.out).toMatch(/one-sided, test against positive autocorrelation/);
    expect(tx.out).toMatch(/\n {4}6 {2}0\.610 {2}1\.400/);
  });
});

describe('bounds theorem (Durbin & Watson 1950): the exact critical value of any design lies in [d_L, d_U]', () => {
  const designs = Array.from({ length: 20 }, (_, i) => ({ seed: 101 + i, n: 10 + ((i * 7) % 31), p: 1 + (i % 4), alpha: i % 3 === 0 ? 0.01 : 0.05 }));
  it.each(designs)('seeded design $seed: n $n, intercept and $p regressors, alpha $alpha', ({ seed, n, p, alpha }) => {
    const x = randomColumns(seed, n, p);
    const crit = exactDwCritical({ x, alpha });
    expect(crit.k).toBe(p + 1);
    const b = bounds(n, p, alpha);
    expect(crit.lower).toBeGreaterThanOrEqual(b.dL - 1e-9);
    expect(crit.lower).toBeLessThanOrEqual(b.dU + 1e-9);
    // the negative side mirrors: P(D >= upper) = alpha puts upper in [4 - dU, 4 - dL]
    expect(crit.upper).toBeGreaterThanOrEqual(4 - b.dU - 1e-9);
    expect(crit.upper).toBeLessThanOrEqual(4 - b.dL + 1e-9);
  });

  it.each([{ seed: 7, n: 14, p: 1 }, { seed: 8, n: 25, p: 2 }, { seed: 9, n: 33, p: 3 }, { seed: 10, n: 18, p: 4 }])(
    'without intercept (interlacing lambda_{i-1} <= nu_i <= lambda_{i+k-1}): seeded design $seed, n $n, $p regressors',
    ({ seed, n, p }) => {
      const x = randomColumns(seed, n, p);
      const crit = exactDwCritical({ x, alpha: 0.05, intercept: false });
      expect(crit.k).toBe(p);
      const b = bounds(n, p, 0.05, { intercept: false });
      expect(crit.lower).toBeGreaterThanOrEqual(b.dL - 1e-9);
      expect(crit.lower).toBeLessThanOrEqual(b.dU + 1e-9);
    },
  );

  it('the bounds are attained: X spanned by the top (bottom) eigenvectors of A gives d_L (d_U) exactly', () => {
    const n = 16, k = 2;
    const top = Object.fromEntries(Array.from({ length: k }, (_, i) => [`v${i}`, eigenvector(n, n - 1 - i)]));
    const bottom = Object.fromEntries(Array.from({ length: k }, (_, i) => [`v${i}`, eigenvector(n, 1 + i)]));
    const b = bounds(n, k, 0.05);
    expect(Math.abs(exactDwCritical({ x: top, alpha: 0.05 }).lower - b.dL)).toBeLessThan(1e-8);
    expect(Math.abs(exactDwCritical({ x: bottom, alpha: 0.05 }).lower - b.dU)).toBeLessThan(1e-8);
    // without intercept: bottom eigenvectors including the constant give the no-intercept d_U
    const withConstant = { c: eigenvector(n, 0), v1: eigenvector(n, 1) };
    const noInt = bounds(n, 2, 0.05, { intercept: false });
    expect(Math.abs(exactDwCritical({ x: withConstant, alpha: 0.05, intercept: false }).lower - noInt.dU)).toBeLessThan(1e-8);
    // and the no-intercept d_U for k' equals the with-intercept d_U for k' - 1 (same spectrum)
    expect(Math.abs(noInt.dU - bounds(n, 1, 0.05).dU)).toBeLessThan(1e-10);
  });
});

describe('bounding spectra against numeric (general-purpose eigen-solver)', () => {
  // numeric.eig applied to the tridiagonal A itself returns wrong eigenvalues without warning for
  // n >= 20 (errors near 0.1: its QR iteration stalls on this matrix), so it is given the similar
  // dense matrix Q A Q', Q a seeded random orthogonal matrix, and its answer
  // is cross-checked by numeric.svd of A (A is positive semi-definite, so its singular values are
  // its eigenvalues).
  function numericEigenvaluesOfA(n: number): number[] {
    const a = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) =>
      i === j ? (i === 0 || i === n - 1 ? 1 : 2) : Math.abs(i - j) === 1 ? -1 : 0));
    // Q = I - 2 v v' / v'v, a Householder reflection with a seeded random v: orthogonal, and Q A Q' is dense
    const u = seededRandom(n);
    const v = Array.from({ length: n }, () => u() - 0.5);
    const vv = v.reduce((s, x) => s + x * x, 0);
    const q = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0) - (2 * v[i] * v[j]) / vv));
    const rotated = numeric.dot(numeric.dot(q, a), numeric.transpose(q));
    const eig = (numeric.eig(rotated).lambda.x as number[]).slice().sort((x, y) => x - y);
    const sv = (numeric.svd(a).S as number[]).slice().sort((x, y) => x - y);
    eig.forEach((v, i) => expect(Math.abs(v - sv[i])).toBeLessThan(1e-11));
    return eig;
  }
  it.each([{ n: 6, k: 1 }, { n: 20, k: 3 }, { n: 29, k: 5 }, { n: 24, k: 0 }])('n $n, k\' $k, with and without intercept', ({ n, k }) => {
    const lam = numericEigenvaluesOfA(n);
    expect(Math.abs(lam[0])).toBeLessThan(1e-11);
    const m = n - k - 1;
    const lo = lowerBoundSpectrum(n, k), up = upperBoundSpectrum(n, k);
    expect(lo.length).toBe(m);
    expect(up.length).toBe(m);
    for (let i = 0; i < m; i++) {
      expect(Math.abs(lo[i] - lam[i + 1])).toBeLessThan(1e-11);
      expect(Math.abs(up[i] - lam[i + k + 1])).toBeLessThan(1e-11);
    }
    const lo0 = lowerBoundSpectrum(n, k, false), up0 = upperBoundSpectrum(n, k, false);
    expect(lo0.length).toBe(n - k);
    for (let i = 0; i < n - k; i++) {
      expect(Math.abs(lo0[i] - lam[i])).toBeLessThan(1e-11);
      expect(Math.abs(up0[i] - lam[i + k])).toBeLessThan(1e-11);
    }
  });
});

describe('closed forms', () => {
  it('m = 2 (n = 3, only the intercept): d = 1 + 2 B with B arcsine, so d_L = d_U = 1 + 2 sin^2(pi alpha / 2)', () => {
    for (const alpha of [0.01, 0.05, 0.3, 0.9]) {
      const b = bounds(3, 0, alpha);
      const exact = 1 + 2 * Math.sin((Math.PI * alpha) / 2) ** 2;
      expect(Math.abs(b.dL - exact)).toBeLessThan(1e-9);
      expect(Math.abs(b.dU - exact)).toBeLessThan(1e-9);
      expect(Math.abs(boundQuantile(3, lowerBoundIndices(3, 0), alpha).value - exact)).toBeLessThan(1e-8);
    }
  });

  it('Chebyshev identity prod_{j=1}^{n-1} (1 + i u (lambda_j - c)) = (i u)^(n-1) U_{n-1}(1 - c/2 - i/(2u)): phase and modulus equal the direct sums', () => {
    const a = new Float64Array(2), b = new Float64Array(2);
    for (const [n, k, intercept] of [[20, 1, true], [200, 20, true], [2000, 5, false], [60, 3, false]] as const) {
      for (const upper of [false, true]) {
        const idx = upper ? upperBoundIndices(n, k, intercept) : lowerBoundIndices(n, k, intercept);
        const nu = upper ? upperBoundSpectrum(n, k, intercept) : lowerBoundSpectrum(n, k, intercept);
        for (const c of [0.2, 1.3, 1.97, 3.1]) {
          const fast = cosineSpectrumForm(n, idx, c), direct = spectralForm(nu, c);
          expect(fast.sumLambda).toBeCloseTo(direct.sumLambda, 9);
          for (const u of [1e-5, 0.01, 0.7, 30, 5e3]) {
            fast.evaluate(u, a); direct.evaluate(u, b);
            expect(Math.abs(a[0] - b[0])).toBeLessThan(1e-11 * Math.max(1, Math.abs(b[0])));
            expect(Math.abs(a[1] - b[1])).toBeLessThan(1e-11 * Math.max(1, Math.abs(b[1])));
          }
        }
      }
    }
  });
});

describe('closed-form route (default) agrees with the general distribution (DwNullDistribution, explicit spectrum)', () => {
  it('on a spread of cells, to 1e-8, with and without intercept', () => {
    for (const intercept of [true, false]) {
      const t = boundsTable({ n: [8, 9, 10, 11, 40, 41, 42, 43, 150], kPrime: [1, 4, 9], alpha: [0.05, 0.001], intercept });
      expect(t.cells.length).toBe(2 * (9 * 3 - (intercept ? 4 : 3))); // k' = 9 needs n >= 12 (11 without intercept)
      const spot = t.cells.filter((c) => [10, 43, 150].includes(c.n) && c.kPrime !== 4);
      expect(spot.length).toBe(2 * 5); // n = 10 is too small for k' = 9
      for (const c of spot) {
        const b = bounds(c.n, c.kPrime, c.alpha, { intercept, method: 'imhof' });
        expect(Math.abs(c.dL - b.dL), `${intercept} ${c.n} ${c.kPrime} ${c.alpha}`).toBeLessThan(1e-8);
        expect(Math.abs(c.dU - b.dU), `${intercept} ${c.n} ${c.kPrime} ${c.alpha}`).toBeLessThan(1e-8);
      }
    }
  });
  it('n = 2000 and any alpha: d_L < d_U inside the support, increasing in alpha; the two routes agree', () => {
    const b5 = bounds(2000, 5, 0.05, { method: 'imhof' });
    const t = boundsTable({ n: [2000], kPrime: [5], alpha: [0.01, 0.05, 0.9] });
    const [c1, c5, c90] = t.cells;
    expect(Math.abs(c5.dL - b5.dL)).toBeLessThan(1e-8);
    expect(Math.abs(c5.dU - b5.dU)).toBeLessThan(1e-8);
    for (const c of t.cells) {
      expect(c.dL).toBeLessThan(c.dU);
      expect(c.dL).toBeGreaterThan(differenceEigenvalue(2000, 1));
      expect(c.dU).toBeLessThan(differenceEigenvalue(2000, 1999));
    }
    expect(c1.dL).toBeLessThan(c5.dL);
    expect(c5.dU).toBeLessThan(c90.dU);
  });
});

describe('extreme levels keep relative accuracy', () => {
  it("alpha = 1e-9 and 1 - 1e-9: the default route agrees with Pan's finite-range form (an independent engine) to 1e-8", () => {
    for (const alpha of [1e-9, 1 - 1e-9]) {
      const a = bounds(10, 1, alpha);
      const p = bounds(10, 1, alpha, { method: 'pan' });
      expect(Math.abs(a.dL - p.dL)).toBeLessThan(1e-8);
      expect(Math.abs(a.dU - p.dU)).toBeLessThan(1e-8);
    }
  });
  it('a named engine that cannot resolve an extreme level refuses instead of answering', () => {
    const e = thrown(() => bounds(20, 1, 1e-12, { method: 'imhof' }));
    expect(e.code).toBe('NOT_CONVERGED');
    expect(e.hint).toMatch(/auto/);
  });
});

describe('zones of d and their resolution (zones as in Durbin & Watson 1951)', () => {
  const n = 20, k = 1, alpha = 0.05;
  const b = bounds(n, k, alpha); // d_L = 1.201, d_U = 1.411 (Savin & White 1977)

  it('each of the five zones is reached', () => {
    const cases: [number, string][] = [
      [b.dL - 0.1, 'reject-positive'],
      [(b.dL + b.dU) / 2, 'inconclusive-positive'],
      [2, 'no-evidence'],
      [4 - (b.dL + b.dU) / 2, 'inconclusive-negative'],
      [4 - b.dL + 0.1, 'reject-negative'],
    ];
    for (const [d, zone] of cases) {
      const z = boundsZone(d, n, k, alpha, 'positive', null, { known: b });
      expect(z.zone).toBe(zone);
      expect(z.level).toBe(alpha);
      expect(z.kPrime).toBe(k);
    }
    // the boundaries belong to the inconclusive zones
    expect(zoneOf(b.dL, b.dL, b.dU)).toBe('inconclusive-positive');
    expect(zoneOf(4 - b.dL, b.dL, b.dU)).toBe('inconclusive-negative');
  });

  it('inconclusive: the resolution quotes the bounds and the exact p-value that decides', () => {
    const z = boundsZone(1.31, n, k, alpha, 'positive', 0.039);
    expect(z.zone).toBe('inconclusive-positive');
    expect(z.outcome).toEqual({ code: 'BOUNDS_INCONCLUSIVE', d: 1.31, alpha, alternative: 'positive', intercept: true, exactP: 0.039, exactPErrorBound: 0 });
    expect(words(z)).toBe('The bounds test at 5% (one-sided, against positive autocorrelation) is inconclusive: d_L = 1.201 <= d = 1.310 <= d_U = 1.411; the exact p-value for this design, 0.039, rejects at 5%.');
    expect(words(boundsZone(1.31, n, k, alpha, 'positive', 0.081))).toMatch(/the exact p-value for this design, 0\.081, does not reject at 5%\.$/);
    expect(words(boundsZone(1.31, n, k, alpha, 'positive', null))).toMatch(/only the exact distribution of d for this design decides/);
    expect(words(boundsZone(2.7, n, k, alpha, 'negative', 0.02))).toMatch(/4 - d_U = 2\.589 <= d = 2\.700 <= 4 - d_L = 2\.799; the exact p-value for this design, 0\.02, rejects at 5%/);
  });

  it('decided by the bounds: the exact p-value is quoted beside them, and a disagreement is flagged', () => {
    const z = boundsZone(0.9, n, k, alpha, 'positive', 0.001);
    expect(words(z)).toMatch(/^d = 0\.900 < d_L = 1\.201: the bounds test rejects no autocorrelation in favour of positive autocorrelation at 5%/);
    expect(words(z)).toMatch(/the exact p-value for this design, 0\.001, agrees\.$/);
    expect(z.outcome.code).toBe('BOUNDS_REJECT');
    const far = boundsZone(3.5, n, k, alpha, 'positive', 0.999);
    expect(far.zone).toBe('reject-negative');
    expect(far.outcome.code).toBe('BOUNDS_DO_NOT_REJECT');
    expect(words(far)).not.toMatch(/finds no evidence/);
    expect(words(far)).toMatch(/does not reject no autocorrelation against positive autocorrelation.*where a test against negative autocorrelation would reject/);
    // the zone is computed only for lag 1, an intercept and no gaps, where the bounds are exact: a
    // disagreement can only be a numerical fault, and the text says so (not a lag/gaps matter)
    const clash = words(boundsZone(0.9, n, k, alpha, 'positive', 0.2));
    expect(clash).toMatch(/but the exact p-value for this design, 0\.2, does not reject at 5%\. .*internal numerical inconsistency: please report it/);
    expect(clash).not.toMatch(/hold only for lag 1/);
  });

  it('two-sided: the bounds are taken at alpha / 2 in each tail, and the level says so', () => {
    const z = boundsZone(1.0, n, k, alpha, 'two-sided', 0.01);
    const half = bounds(n, k, alpha / 2);
    expect(z.level).toBe(0.025);
    expect(z.dL).toBeCloseTo(half.dL, 12);
    expect(z.dU).toBeCloseTo(half.dU, 12);
    expect(words(z)).toMatch(/at 5% \(two-sided, bounds at 2\.5% in each tail\)/);
    expect(words(z)).toMatch(/exact two-sided p-value for this design, 0\.01/);
    expect(boundsZone(2.0, n, k, alpha, 'two-sided', 0.9).zone).toBe('no-evidence');
  });

  it('overlapping zones (d_U > 2, few observations, many regressors): d <= 2 is read on the positive side', () => {
    const w = bounds(10, 5, 0.05); // d_U = 2.822 (Savin & White 1977 layout; computed)
    expect(w.dU).toBeGreaterThan(2);
    expect(zoneOf(1.9, w.dL, w.dU)).toBe('inconclusive-positive');
    expect(zoneOf(2.1, w.dL, w.dU)).toBe('inconclusive-negative');
  });

  it('p-values are shown with enough digits to keep their comparison with alpha visible', () => {
    expect(formatPValue(0.039, 0.05)).toBe('0.039');
    expect(formatPValue(0.0501, 0.05)).toBe('0.0501');
    expect(formatPValue(0.04996, 0.05)).toBe('0.04996');
    expect(formatPValue(3e-7, 0.05)).toBe('3.0e-7');
  });

  it('the bounds command places d and prints the resolution', async () => {
    const r = await run(boundsCommand, '--n', '20', '--k', '1', '--d', '1.31', '--format', 'json');
    const j = JSON.parse(r.out);
    expect(j.zone.zone).toBe('inconclusive-positive');
    expect(j.zone.resolution).toMatch(/is inconclusive/);
    expect(j.zone.outcome.code).toBe('BOUNDS_INCONCLUSIVE');
    const above = JSON.parse((await run(boundsCommand, '--n', '20', '--k', '1', '--d', '2', '--format', 'json')).out);
    expect(above.zone.resolution).toMatch(/the bounds test does not reject no autocorrelation against positive autocorrelation at 5%/);
  });
});

describe('bounds command', () => {
  it('JSON has dL and dU (Savin & White 1977: n 20, k\' 1, 5%: 1.201, 1.411) and states k\' and the direction', async () => {
    const r = await run(boundsCommand, '--n', '20', '--k', '1', '--alpha', '0.05', '--format', 'json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.dL).toBeCloseTo(1.201, 3);
    expect(j.dU).toBeCloseTo(1.411, 3);
    expect(j).toMatchObject({ n: 20, kPrime: 1, k: 2, alpha: 0.05, intercept: true, m: 18 });
    expect(j.test).toMatch(/one-sided, against positive autocorrelation/);
    expect(j.negative.upper).toBeCloseTo(4 - j.dL, 12);
  });
  it('--no-intercept gives the no-intercept bounds', async () => {
    const j = JSON.parse((await run(boundsCommand, '--n', '20', '--k', '2', '--no-intercept', '--format', 'json')).out);
    const b = bounds(20, 2, 0.05, { intercept: false });
    expect(j.intercept).toBe(false);
    expect(j.dL).toBe(b.dL);
    expect(j.dU).toBe(b.dU);
  });
  it('help text says plainly that K excludes the intercept', () => {
    expect(boundsCommand.details).toMatch(/K is k', the number of regressors OTHER THAN the intercept/);
    expect(boundsCommand.options.k.help).toMatch(/other than the intercept/);
    expect(tableCommand.details).toMatch(/K is k', the number of regressors OTHER THAN the intercept/);
  });
  it('text output shows 3 decimals like printed tables', async () => {
    const r = await run(boundsCommand, '--n', '15', '--k', '1', '--alpha', '0.01');
    expect(r.out).toContain('d_L = 0.811   d_U = 1.070'); // Savin & White (1977), 1%
  });
});

describe('table output files', () => {
  it('--out writes a new file and refuses to overwrite an existing one without --force', async () => {
    const dir = scratch();
    const file = join(dir, 'bounds.csv');
    const first = await run(tableCommand, '--n', '20', '--k', '1', '--format', 'csv', '--out', file);
    expect(first.status).toBe(0);
    expect(first.out).toMatch(/Wrote 1 cell \(csv\)/);
    expect(readFileSync(file, 'utf8')).toBe('n,k_prime_excl_intercept,alpha_one_sided_positive,d_L,d_U,intercept\n20,1,0.05,1.201,1.411,true\n');
    writeFileSync(file, 'mine');
    const again = await run(tableCommand, '--n', '20', '--k', '1', '--out', file);
    expect(again.error?.code).toBe('FILE_EXISTS');
    expect(readFileSync(file, 'utf8')).toBe('mine');
    expect((await run(tableCommand, '--n', '20', '--k', '1', '--out', file, '--force')).status).toBe(0);
    expect(readFileSync(file, 'utf8')).toMatch(/^Durbin-Watson bounds/);
  });
});

describe('bad input: stable codes, messages that say what is wrong, hints with a correct example', () => {
  it('library: n too small, k\' negative or fractional, alpha outside (0, 1), n beyond the limit', () => {
    let e = thrown(() => bounds(4, 2, 0.05));
    expect(e.code).toBe('N_INVALID');
    expect(e.message).toMatch(/n = 4 is too small for k' = 2.*n >= 5/);
    expect(thrown(() => bounds(20, -1, 0.05)).code).toBe('K_INVALID');
    e = thrown(() => bounds(20, 1.5, 0.05));
    expect(e.code).toBe('K_INVALID');
    expect(e.hint).toMatch(/other than the intercept/);
    for (const a of [0, 1, -0.1, 5, Number.NaN]) expect(thrown(() => bounds(20, 1, a)).code).toBe('ALPHA_OUT_OF_RANGE');
    e = thrown(() => bounds(1e7, 1, 0.05));
    expect(e.code).toBe('SIZE_LIMIT');
    expect(e.message).toMatch(/limit of 5000/);
    expect(thrown(() => bounds(20.5, 1, 0.05)).code).toBe('N_INVALID');
    expect(thrown(() => boundsZone(4.2, 20, 1, 0.05)).code).toBe('D_OUT_OF_RANGE');
    expect(thrown(() => boundsZone(1, 20, 1, 0.05, 'positive', 1.5)).code).toBe('PROBABILITY_OUT_OF_RANGE');
  });

  it('range syntax: each mistake named, with a correct example', () => {
    const cases: [string, RegExp][] = [
      ['200-6', /runs backwards.*--n 6-200/],
      ['6,,10', /empty item.*e\.g\. --n 6-200/],
      ['6.5', /not a whole number or a range.*whole numbers/],
      ['10 20', /commas, not spaces/],
      ['ten', /not a whole number or a range/],
      ['', /is empty/],
      ['5-10:0', /step.*at least 1/],
    ];
    for (const [text, re] of cases) {
      const err = thrown(() => parseIntegerList(text, '--n'));
      expect(err.code, text).toBe('RANGE_SYNTAX');
      expect(err.toLine(), text).toMatch(re);
    }
    expect(parseIntegerList('10,15,20-25', '--n')).toEqual([10, 15, 20, 21, 22, 23, 24, 25]);
    expect(parseIntegerList('10-40:10', '--n')).toEqual([10, 20, 30, 40]);
    expect(thrown(() => parseIntegerList('1-100000000', '--n')).code).toBe('SIZE_LIMIT');
    expect(thrown(() => parseLevelList('5%', '--alpha')).toLine()).toMatch(/Write 0\.05 for 5%/);
    expect(thrown(() => parseLevelList('5', '--alpha')).code).toBe('ALPHA_OUT_OF_RANGE');
    expect(thrown(() => parseLevelList('0.05;0.01', '--alpha')).code).toBe('RANGE_SYNTAX');
    expect(parseLevelList('0.05, 0.01', '--alpha')).toEqual([0.05, 0.01]);
  });

  it('absurd requests are refused at once with the limit stated', async () => {
    let r = await run(boundsCommand, '--n', '10000000', '--k', '1');
    expect(r.error?.code).toBe('SIZE_LIMIT');
    expect(r.err).toMatch(/limit of 5000/);
    r = await run(tableCommand, '--n', '6-10000000', '--k', '1');
    expect(r.error?.code).toBe('SIZE_LIMIT');
    expect(r.err).toMatch(/limit of 5,000/);
    r = await run(tableCommand, '--n', '10-5000', '--k', '1-30', '--alpha', '0.05,0.01');
    expect(r.error?.code).toBe('SIZE_LIMIT');
    expect(r.err).toContain(`the limit is ${MAX_TABLE_CELLS.toLocaleString('en-US')}`);
    r = await run(tableCommand, '--n', '1000-5000:10', '--k', '1-50');
    expect(r.error?.code).toBe('SIZE_LIMIT');
    expect(r.err).toMatch(/would take roughly \d+ s of computing.*the limit is about 30 s/);
  });

  it('CLI: missing, fractional or negative k\', n too small, alpha out of range, misplaced options', async () => {
    const expectations: [string[], string, RegExp][] = [
      [['--n', '20'], 'OPTION_MISSING', /needs --k.*regressors other than the intercept/],
      [['--n', '20', '--k', '1.5'], 'K_INVALID', /k' must be a whole number/],
      [['--n', '20', '--k=-1'], 'K_INVALID', /at least 0/],
      [['--n', '4', '--k', '2'], 'N_INVALID', /too small for k' = 2/],
      [['--n', '20', '--k', '1', '--alpha', '1.5'], 'ALPHA_OUT_OF_RANGE', /outside \(0, 1\)/],
      [['--n', '20', '--k', '1', '--alternative', 'negative'], 'OPTION_CONFLICT', /only applies together with --d/],
      [['--n', 'twenty', '--k', '1'], 'OPTION_VALUE', /--n must be a whole number/],
    ];
    for (const [argv, code, re] of expectations) {
      const r = await run(boundsCommand, ...argv);
      expect(r.status, argv.join(' ')).toBe(2);
      expect(r.error?.code, argv.join(' ')).toBe(code);
      expect(r.err, argv.join(' ')).toMatch(re);
    }
    const t = await run(tableCommand, '--n', '6', '--k', '5');
    expect(t.error?.code).toBe('N_INVALID');
    expect(t.err).toMatch(/n >= k' \+ 3/);
    expect((await run(tableCommand, '--n', '6-20', '--k', '1', '--force')).error?.code).toBe('OPTION_CONFLICT');
  });
});

describe('engine choice for bounds and tables (--method)', () => {
  it('a table computed cell by cell with Imhof and with Pan agrees with the default column route to 1e-8 (three independent routes)', async () => {
    const { boundsTable } = await import('../../src/bounds/table.js');
    const req = { n: [12, 20, 31], kPrime: [1, 3], alpha: [0.05, 0.01] };
    const auto = boundsTable(req);
    for (const method of ['imhof', 'pan'] as const) {
      const other = boundsTable({ ...req, method });
      expect(other.cells.length).toBe(auto.cells.length);
      other.cells.forEach((c, i) => {
        expect(Math.abs(c.dL - auto.cells[i].dL)).toBeLessThan(1e-8);
        expect(Math.abs(c.dU - auto.cells[i].dU)).toBeLessThan(1e-8);
      });
    }
  });
});
