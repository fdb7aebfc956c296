/**
 * Numerical robustness: designs at awkward scales and conditions either give the answer of an
 * equivalent well-conditioned design or a clear error, never a wrong p-value.
 *
 * Outside references: (1) polynomial trends in raw calendar years span exactly the same space as
 * the same powers of the centred years (a change of polynomial basis; all values are integers
 * below 2^53, so both designs are exact in floating point), so d and every p-value must agree;
 * (2) exact rational arithmetic (BigInt) for the least-squares residuals of a straight-line fit,
 * giving d exactly.
 *
 * The measurements behind CONDITION_LIMIT (src/model/design.ts) are the table of
 * docs/errors-and-limits.md, which this file renders and compares (condition numbers to 1%, errors
 * to within a factor 30, outcome exactly). Regenerate with
 *   UPDATE_DOCS=1 npx vitest run --config test/vitest.config.ts test/robustness.test.ts
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { exactDwTest, type DwTestResult } from '../src/inference/dw-test.js';
import { buildDesign, factorDesign, designErrorAllowance, CONDITION_LIMIT } from '../src/model/design.js';
import { D_ROUNDING_LIMIT, fitLeastSquares, type LeastSquaresFit } from '../src/model/ols.js';
import { durbinWatson } from '../src/core/difference.js';
import { DwError } from '../src/errors.js';
import { seededNormal } from './helpers/reference.js';

interface Case { label: string; t0: number; n: number; powers: number; factor?: number }
const CASES: Case[] = [
  { label: 'years 1990..2019, powers 1..2', t0: 1990, n: 30, powers: 2 },
  { label: 'years 1990..2019, powers 1..3', t0: 1990, n: 30, powers: 3 },
  { label: 'years 1990..2019, powers 1..3, columns x 1e-300', t0: 1990, n: 30, powers: 3, factor: 1e-300 },
  { label: 'years 1990..2019, powers 1..3, columns x 1e+290', t0: 1990, n: 30, powers: 3, factor: 1e290 },
  { label: 'years 1990..2019, powers 1..4', t0: 1990, n: 30, powers: 4 },
  { label: 'years 1800..2020, powers 1..3', t0: 1800, n: 221, powers: 3 },
  { label: 'years 1800..2020, powers 1..4', t0: 1800, n: 221, powers: 4 },
  { label: 'years 1800..2020, powers 1..5', t0: 1800, n: 221, powers: 5 },
  { label: 't = 100..129, powers 1..4', t0: 100, n: 30, powers: 4 },
  { label: 't = 100..129, powers 1..5', t0: 100, n: 30, powers: 5 },
  { label: 't = 100..129, powers 1..6', t0: 100, n: 30, powers: 6 },
  { label: 't = 1000..1029, powers 1..3', t0: 1000, n: 30, powers: 3 },
  { label: 't = 10^4..10^4+29, powers 1..2', t0: 1e4, n: 30, powers: 2 },
  { label: 't = 10^4..10^4+29, powers 1..3', t0: 1e4, n: 30, powers: 3 },
  { label: 't = 10^6..10^6+29, powers 1..2', t0: 1e6, n: 30, powers: 2 },
  { label: 't = 10^7..10^7+29, powers 1..2', t0: 1e7, n: 30, powers: 2 },
];

/** An invented series with a trend and serially correlated noise (seeded). */
function series(n: number, seed: number): number[] {
  const g = seededNormal(seed);
  let u = 0;
  return Array.from({ length: n }, (_, i) => { u = 0.4 * u + g(); return 10 + 0.05 * i + Math.round(100 * u) / 100; });
}

interface Row { label: string; condition: number; dd: number; dp: number; outcome: string }

function measure(c: Case): Row {
  const mid = c.t0 + Math.floor(c.n / 2);
  const f = c.factor ?? 1;
  const raw: Record<string, number[]> = {};
  const cen: Record<string, number[]> = {};
  for (let p = 1; p <= c.powers; p++) {
    raw[`t${p}`] = Array.from({ length: c.n }, (_, i) => (c.t0 + i) ** p * f);
    cen[`t${p}`] = Array.from({ length: c.n }, (_, i) => (c.t0 + i - mid) ** p);
  }
  const y = series(c.n, 7);
  let condition: number;
  try {
    condition = factorDesign(buildDesign(raw, c.n)).condition;
  } catch (e) {
    // ILL_CONDITIONED carries the estimate it refused
    condition = (e as DwError).code === 'ILL_CONDITIONED' ? Number((e as DwError).detail.value) : NaN;
  }
  const ref = exactDwTest({ y, x: cen, alternative: 'two-sided' });
  let r: DwTestResult;
  try {
    r = exactDwTest({ y, x: raw, alternative: 'two-sided' });
  } catch (e) {
    return { label: c.label, condition, dd: NaN, dp: NaN, outcome: (e as DwError).code };
  }
  const dd = Math.abs(r.d - ref.d);
  const dp = Math.max(Math.abs(r.pPositive - ref.pPositive), Math.abs(r.pNegative - ref.pNegative), Math.abs(r.critical.lower - ref.critical.lower));
  return { label: c.label, condition, dd, dp, outcome: 'same answer' };
}

const ROWS = CASES.map(measure);

describe('polynomial trends in raw years: the answer of the centred design, or ILL_CONDITIONED', () => {
  for (const row of ROWS) {
    it(`${row.label}: ${row.outcome}`, () => {
      if (row.outcome === 'same answer') {
        expect(row.condition).toBeLessThanOrEqual(CONDITION_LIMIT);
        expect(row.dd).toBeLessThanOrEqual(1e-8);
        expect(row.dp).toBeLessThanOrEqual(1e-8);
        // the measured error stays inside the stated allowance (amplification ||y - ybar|| / ||e|| < 10 here)
        expect(Math.max(row.dd, row.dp)).toBeLessThanOrEqual(designErrorAllowance(row.condition, 10));
      } else {
        expect(['ILL_CONDITIONED', 'RANK_DEFICIENT']).toContain(row.outcome);
      }
    });
  }
  it('the case the limit is about: raw years 1990..2019 with powers up to 3 agree with the centred form to 1e-8 in p', () => {
    const row = ROWS.find((r) => r.label === 'years 1990..2019, powers 1..3')!;
    expect(row.outcome).toBe('same answer');
    expect(row.dp).toBeLessThan(1e-8);
  });
});

/** Exact d of the straight-line fit y = a + b t + e by rational arithmetic (BigInt), for y given as integers / 2^shift. */
function exactLineD(yInt: bigint[], tInt: bigint[]): number {
  const n = BigInt(yInt.length);
  let st = 0n, stt = 0n, sy = 0n, sty = 0n;
  for (let i = 0; i < yInt.length; i++) { st += tInt[i]; stt += tInt[i] * tInt[i]; sy += yInt[i]; sty += tInt[i] * yInt[i]; }
  const den = n * stt - st * st;              // b = bNum / den, a = (sy - b st) / n
  const bNum = n * sty - st * sy;
  // e_i * n * den = y_i n den - (sy den - bNum st) - n bNum t_i: all integers
  const e = yInt.map((y, i) => y * n * den - (sy * den - bNum * st) - n * bNum * tInt[i]);
  let num = 0n, ss = 0n;
  for (let i = 0; i < e.length; i++) { ss += e[i] * e[i]; if (i > 0) num += (e[i] - e[i - 1]) ** 2n; }
  const scale = 10n ** 30n;
  return Number((num * scale) / ss) / 1e30;
}

describe('nearly perfect fits: d exact (rational arithmetic) or RESIDUALS_ZERO', () => {
  const n = 20;
  const t = Array.from({ length: n }, (_, i) => 2000 + i);
  const z = Array.from({ length: n }, (_, i) => [3, -1, 4, -1, -5, 9, -2, 6, -5, 3, -5, 8, -9, 7, -9, 3, -2, 3, -8, 4][i]);
  for (const k of [4, 12, 20, 28, 33, 36, 40]) {
    it(`y = 3 + t/2 + 2^-${k} z: d to within the allowance, or refused`, () => {
      // y = (3 * 2^(k+1) + t * 2^k + 2 z) / 2^(k+1): exact in double for these k
      const shift = BigInt(k + 1);
      const yInt = t.map((ti, i) => 3n * (1n << shift) + BigInt(ti) * (1n << (shift - 1n)) + 2n * BigInt(z[i]));
      const y = yInt.map((v) => Number(v) / 2 ** (k + 1));
      yInt.forEach((v, i) => expect(BigInt(y[i] * 2 ** (k + 1))).toBe(v)); // the doubles are the exact data
      const exact = exactLineD(yInt, t.map(BigInt));
      const fd = factorDesign(buildDesign({ year: t }, n));
      let fit: LeastSquaresFit | DwError;
      try { fit = fitLeastSquares(fd, y); } catch (e) { fit = e as DwError; }
      if (fit instanceof DwError) {
        expect(fit.code).toBe('RESIDUALS_ZERO');
        expect(k).toBeGreaterThanOrEqual(28); // refused only when the residuals are near rounding level
      } else {
        const d = durbinWatson(fit.residuals);
        expect(d).toBe(exactDwTest({ y, x: { year: t }, timeColumn: false }).d); // year as a trend regressor, not the time index
        expect(Math.abs(d - exact)).toBeLessThanOrEqual(D_ROUNDING_LIMIT);
        expect(Math.abs(d - exact)).toBeLessThanOrEqual(designErrorAllowance(fd.condition, fit.amplification));
        if (process.env.SHOW_MEASUREMENTS) console.log(`k = ${k}: amplification ${fit.amplification.toExponential(1)}, |d - exact| = ${Math.abs(d - exact).toExponential(1)}, allowance ${designErrorAllowance(fd.condition, fit.amplification).toExponential(1)}`);
      }
    });
  }
});

describe('values near 1e300 and 1e-300 work (d is scale invariant) and match the rescaled data', () => {
  const n = 15;
  const g = seededNormal(3);
  const x1 = Array.from({ length: n }, () => g());
  const x2 = Array.from({ length: n }, (_, i) => i + g());
  const y = Array.from({ length: n }, (_, i) => 1 + x1[i] - 0.5 * x2[i] + g());
  const ref = exactDwTest({ y, x: { x1, x2 } });
  for (const s of [1e300, 1e-300, 1e200, 1e-200]) {
    it(`y, x1 and x2 all times ${s}`, () => {
      const r = exactDwTest({ y: y.map((v) => v * s), x: { x1: x1.map((v) => v * s), x2: x2.map((v) => v * s) } });
      expect(Math.abs(r.d - ref.d)).toBeLessThan(1e-13);
      expect(Math.abs(r.pValue - ref.pValue)).toBeLessThan(1e-13);
      expect(r.coefficients![1].estimate).toBeCloseTo(ref.coefficients![1].estimate, 10);
    });
  }
  it('columns at wildly different scales (1e-250, 1, 1e250)', () => {
    const r = exactDwTest({ y, x: { x1: x1.map((v) => v * 1e-250), x2: x2.map((v) => v * 1e250) } });
    expect(Math.abs(r.d - ref.d)).toBeLessThan(1e-13);
    expect(Math.abs(r.pValue - ref.pValue)).toBeLessThan(1e-13);
  });
});

/** The measurement table of docs/errors-and-limits.md. */
function renderMeasurements(): string {
  const e = (v: number) => (Number.isNaN(v) ? '-' : v === 0 ? '0' : v.toExponential(1));
  const lines = ['| design (with intercept), against the same powers of the centred variable | condition number | abs. error in d | max abs. error in p-values, critical value | outcome |', '|---|---|---|---|---|'];
  for (const r of ROWS) lines.push(`| ${r.label} | ${Number.isNaN(r.condition) ? '-' : r.condition.toExponential(2)} | ${e(r.dd)} | ${e(r.dp)} | ${r.outcome} |`);
  return lines.join('\n');
}

describe('docs/errors-and-limits.md', () => {
  it('holds the conditioning measurements of this file (condition to 1%, errors to a factor 30)', () => {
    const path = join(process.cwd(), 'docs', 'errors-and-limits.md');
    let doc = readFileSync(path, 'utf8');
    const start = '<!-- conditioning:start (generated by test/robustness.test.ts) -->';
    const end = '<!-- conditioning:end -->';
    let i = doc.indexOf(start);
    let j = doc.indexOf(end);
    expect(i).toBeGreaterThanOrEqual(0);
    expect(j).toBeGreaterThan(i);
    if (process.env.UPDATE_DOCS === '1' && !process.env.CI) {
      // update mode: rewrite the section, then check the file as written (never a silent pass)
      writeFileSync(path, doc.slice(0, i + start.length) + '\n' + renderMeasurements() + '\n' + doc.slice(j));
      doc = readFileSync(path, 'utf8');
      [i, j] = [doc.indexOf(start), doc.indexOf(end)];
    }
    const rows = doc.slice(i + start.length, j).trim().split('\n').slice(2).map((l) => l.split('|').slice(1, -1).map((c) => c.trim()));
    expect(rows.map((r) => r[0])).toEqual(ROWS.map((r) => r.label));
    rows.forEach((cells, k) => {
      const m = ROWS[k];
      expect(cells[4]).toBe(m.outcome);
      if (cells[1] !== '-') expect(Math.abs(Number(cells[1]) / m.condition - 1)).toBeLessThan(0.01);
      for (const [text, v] of [[cells[2], m.dd], [cells[3], m.dp]] as const) {
        if (text === '-') { expect(Number.isNaN(v)).toBe(true); continue; }
        const doc = Number(text);
        if (doc < 1e-14 && v < 1e-14) continue;
        expect(v).toBeLessThan(30 * doc);
        expect(v).toBeGreaterThan(doc / 30);
      }
    });
    expect(doc).toContain(`CONDITION_LIMIT = ${CONDITION_LIMIT.toExponential(0)}`);
  });
});
