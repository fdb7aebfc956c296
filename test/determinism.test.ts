/**
 * Determinism: the same input gives bit-identical JSON, run after run, in-process and through the
 * built executable (no hidden state, no clock, no randomness in the numerical path).
 */
import { describe, expect, it } from 'vitest';
import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { cli, scratch } from './helpers/cli.js';
import { exactDwTest } from '../src/inference/dw-test.js';
import { seededNormal } from './helpers/reference.js';

const dir = scratch();
const g = seededNormal(2024);
const n = 28;
// invented quarterly-style data, with a gap in time (period 15 missing)
const times = Array.from({ length: n }, (_, i) => 1 + i + (i >= 14 ? 1 : 0));
const x1 = Array.from({ length: n }, () => +(10 + g()).toFixed(3));
const x2 = Array.from({ length: n }, (_, i) => +(Math.sin(i / 2) + 0.1 * g()).toFixed(3));
let u = 0;
const y = x1.map((v, i) => { u = 0.5 * u + g(); return +(2 + 0.3 * v - x2[i] + u).toFixed(4); });
const data = join(dir, 'data.csv');
writeFileSync(data, 'period,y,x1,x2\n' + y.map((v, i) => `${times[i]},${v},${x1[i]},${x2[i]}`).join('\n') + '\n');
const design = join(dir, 'X.csv');
writeFileSync(design, 'x1,x2\n' + x1.map((v, i) => `${v},${x2[i]}`).join('\n') + '\n');

const COMMANDS: string[][] = [
  ['test', data, '--y', 'y', '--time', 'period', '--alternative', 'two-sided', '--format', 'json'],
  ['test', data, '--y', 'y', '--x', 'x1', '--lag', '4', '--format', 'json'],
  ['pvalue', '--design', design, '--d', '1.37', '--format', 'json'],
  ['critical', '--design', design, '--alpha', '0.01', '--format', 'json'],
];

describe('bit-identical output for the same input', () => {
  it('the library: two calls, with another problem in between, give identical JSON', () => {
    const input = { y, x: { x1, x2 }, times, alternative: 'two-sided' as const };
    const a = JSON.stringify(exactDwTest(input));
    exactDwTest({ y: y.slice(0, 20), x: { x1: x1.slice(0, 20) } });
    const b = JSON.stringify(exactDwTest(input));
    expect(b).toBe(a);
  });
  for (const argv of COMMANDS) {
    it(`in-process, twice: exact-dw ${argv.filter((a) => !a.startsWith('/')).join(' ')}`, async () => {
      const a = await cli(...argv);
      const b = await cli(...argv);
      expect(a.status).toBe(0);
      expect(a.err).toBe('');
      expect(b.out).toBe(a.out);
      JSON.parse(a.out); // it is JSON
    });
  }
  it('the built executable, twice, gives the same bytes as the in-process run', async () => {
    const bin = join(process.cwd(), 'dist', 'src', 'cli', 'main.js');
    expect(existsSync(bin)).toBe(true); // npm test builds first
    for (const argv of [COMMANDS[0], COMMANDS[3]]) {
      const first = spawnSync(process.execPath, [bin, ...argv], { encoding: 'utf8' });
      const second = spawnSync(process.execPath, [bin, ...argv], { encoding: 'utf8' });
      expect(first.status).toBe(0);
      expect(second.stdout).toBe(first.stdout);
      expect(first.stdout).toBe((await cli(...argv)).out);
    }
  });
  it('an error is as deterministic as a result: same line, same status, from the executable', () => {
    const bin = join(process.cwd(), 'dist', 'src', 'cli', 'main.js');
    const argv = ['pvalue', '--design', design, '--d', '4.5'];
    const a = spawnSync(process.execPath, [bin, ...argv], { encoding: 'utf8' });
    const b = spawnSync(process.execPath, [bin, ...argv], { encoding: 'utf8' });
    expect(a.status).toBe(2);
    expect(a.stdout).toBe('');
    expect(b.stderr).toBe(a.stderr);
    expect(a.stderr.trim().split('\n')).toHaveLength(1);
    expect(a.stderr.trim().endsWith('[D_OUT_OF_RANGE]')).toBe(true);
  });
});
