/**
 * The CLI contract other tools rely on (JSON keys, exit codes, one-line errors), run in-process,
 * plus one run of the built executable.
 */
import { describe, expect, it } from 'vitest';
import { writeFileSync, readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { execFileSync, spawnSync } from 'node:child_process';
import { cli, scratch } from '../helpers/cli.js';
import { exactDwPValue, exactDwTest } from '../../src/inference/dw-test.js';
import { VERSION } from '../../src/version.js';

const dir = scratch();
const design = join(dir, 'X.csv');
writeFileSync(design, 'trend,price\n' + Array.from({ length: 16 }, (_, i) => `${i + 1},${(10 + Math.sin(i * 1.7) * 3).toFixed(3)}`).join('\n') + '\n');
const data = join(dir, 'data.csv');
writeFileSync(data, 'year,y,trend,price\n' + Array.from({ length: 16 }, (_, i) => `${2001 + i},${(3 + 0.4 * i + Math.cos(i * 2.3)).toFixed(4)},${i + 1},${(10 + Math.sin(i * 1.7) * 3).toFixed(3)}`).join('\n') + '\n');

describe('exact-dw pvalue', () => {
  it('JSON has exactly the keys d, n, k, pPositive, pNegative, pTwoSided, method, errorBound and the per-tail bounds', async () => {
    const r = await cli('pvalue', '--design', design, '--d', '1.23', '--format', 'json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(Object.keys(j).sort()).toEqual(['d', 'errorBound', 'errorBoundNegative', 'errorBoundPositive', 'k', 'method', 'n', 'pNegative', 'pPositive', 'pTwoSided'].sort());
    expect(j.k).toBe(3);
    expect(j.n).toBe(16);
    const lib = exactDwPValue({ x: { trend: Array.from({ length: 16 }, (_, i) => i + 1), price: Array.from({ length: 16 }, (_, i) => +(10 + Math.sin(i * 1.7) * 3).toFixed(3)) }, d: 1.23 });
    expect(j.pPositive).toBe(lib.pPositive);
  });
  it('--no-intercept gives k = 2', async () => {
    const j = JSON.parse((await cli('pvalue', '--design', design, '--d', '1.5', '--no-intercept', '--format', 'json')).out);
    expect(j.k).toBe(2);
  });
  it('--residuals computes d from the residual file', async () => {
    const t = Array.from({ length: 16 }, (_, i) => i + 1);
    const price = t.map((_, i) => +(10 + Math.sin(i * 1.7) * 3).toFixed(3));
    const y = t.map((v, i) => 3 + 0.4 * i + Math.cos(i * 2.3));
    const res = exactDwTest({ y, x: { trend: t, price } });
    const e = join(dir, 'e.csv');
    // residuals of the same fit, computed here by the library
    const fitted = t.map((v, i) => res.coefficients!.reduce((s, c, j) => s + c.estimate * [1, v, price[i]][j], 0));
    writeFileSync(e, 'e\n' + y.map((v, i) => String(v - fitted[i])).join('\n') + '\n');
    const j = JSON.parse((await cli('pvalue', '--design', design, '--residuals', e, '--format', 'json')).out);
    expect(j.d).toBeCloseTo(res.d, 9);
  });
  it('d outside [0, 4] exits 2 with one line on stderr', async () => {
    const r = await cli('pvalue', '--design', design, '--d', '4.5');
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/outside the possible range/);
    expect(r.out).toBe('');
  });
});

describe('exact-dw critical', () => {
  it('JSON keys lower and upper, with P(D <= lower) = alpha', async () => {
    const j = JSON.parse((await cli('critical', '--design', design, '--alpha', '0.05', '--format', 'json')).out);
    expect(j.lower).toBeLessThan(2);
    expect(j.upper).toBeGreaterThan(2);
    const p = JSON.parse((await cli('pvalue', '--design', design, '--d', String(j.lower), '--format', 'json')).out);
    expect(Math.abs(p.pPositive - 0.05)).toBeLessThan(1e-9);
    const q = JSON.parse((await cli('pvalue', '--design', design, '--d', String(j.upper), '--format', 'json')).out);
    expect(Math.abs(q.pNegative - 0.05)).toBeLessThan(1e-9);
  });
  it('alpha outside (0, 1) exits 2', async () => {
    const r = await cli('critical', '--design', design, '--alpha', '1.2');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/outside \(0, 1\)/);
  });
});

describe('exact-dw test', () => {
  it('JSON has d, n, k, pValue, alternative, critical, decision, warnings; --x defaults to the other numeric columns', async () => {
    const r = await cli('test', data, '--y', 'y', '--time', 'year', '--format', 'json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    for (const key of ['d', 'n', 'k', 'pValue', 'alternative', 'critical', 'decision', 'warnings']) expect(j).toHaveProperty(key);
    expect(j.columns).toEqual(['(intercept)', 'trend', 'price']);
    const r2 = JSON.parse((await cli('test', data, '--y', 'y', '--x', 'trend,price', '--format', 'json')).out);
    expect(r2.d).toBe(j.d);
  });
  it('unknown column, missing file and unknown option exit 2 with a specific message', async () => {
    const a = await cli('test', data, '--y', 'sales');
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/no column 'sales'/);
    const b = await cli('test', join(dir, 'nope.csv'), '--y', 'y');
    expect(b.status).toBe(2);
    expect(b.err).toMatch(/does not exist/);
    const c = await cli('test', data, '--y', 'y', '--alpah', '0.1');
    expect(c.status).toBe(2);
    expect(c.err).toMatch(/Did you mean --alpha/);
  });
  it('a non-numeric cell names its row and column', async () => {
    const bad = join(dir, 'bad.csv');
    writeFileSync(bad, 'y,x\n1,2\n2,3\n3,abc\n4,1\n5,0\n');
    const r = await cli('test', bad, '--y', 'y', '--x', 'x');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/'abc' at data row 3, column 'x'/);
  });
  it('a rank-deficient design names the column', async () => {
    const bad = join(dir, 'collinear.csv');
    writeFileSync(bad, 'y,a,b\n' + Array.from({ length: 10 }, (_, i) => `${Math.sin(i)},${i},${2 * i + 3}`).join('\n') + '\n');
    const r = await cli('test', bad, '--y', 'y');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/rank deficient: 'b'/);
  });
});

describe('the built executable', () => {
  it('runs, prints the version from package.json, and exits 2 on bad input without a stack trace', () => {
    const bin = join(process.cwd(), 'dist', 'src', 'cli', 'main.js');
    expect(existsSync(bin)).toBe(true);
    const pkg = JSON.parse(readFileSync('package.json', 'utf8'));
    expect(execFileSync('node', [bin, 'version']).toString().trim()).toBe(pkg.version);
    expect(VERSION).toBe(pkg.version);
    const bad = spawnSync('node', [bin, 'critical', '--design', join(dir, 'missing.csv')]);
    expect(bad.status).toBe(2);
    expect(bad.stderr.toString()).not.toMatch(/at .*\.js:\d+/);
  });
});
