/**
 * The precision policy (src/policy.ts) is the one place of every size limit and tolerance: it is
 * frozen, the modules' named constants are its values, checkSize applies exactly its limits, and
 * the size table of docs/errors-and-limits.md and the sizes quoted in README.md agree with it.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { POLICY, type SizeLimitName } from '../src/policy.js';
import * as limits from '../src/limits.js';
import { FAST_SPECTRUM_MAX_N, DENSE_SPECTRUM_MAX_N } from '../src/core/fast-spectrum.js';
import { AUTO_SPECTRUM_MAX_N, AUTO_RELATIVE_TARGET } from '../src/engines/choose.js';
import { LAMBDA_FLOOR } from '../src/engines/eigenfree.js';
import { POWER_SIZE_LIMIT, POWER_DENSE_MAX_N } from '../src/power/exact-power.js';
import { MAX_BOUNDS_N } from '../src/bounds/spectra.js';
import { MAX_TABLE_CELLS, MAX_TABLE_WORK } from '../src/bounds/table.js';
import { MAX_LIST_LENGTH } from '../src/bounds/ranges.js';
import { RANK_TOLERANCE, CONDITION_LIMIT, CONDITION_WARNING, CONDITION_ERROR_FACTOR } from '../src/model/design.js';
import { D_ROUNDING_LIMIT } from '../src/model/ols.js';
import { RESIDUAL_DRIFT_LIMIT } from '../src/inference/dw-test.js';
import { LAG_MATCH_TOLERANCE } from '../src/dynamic/lagged-dependent.js';
import { isDwError } from '../src/errors.js';

const L = POLICY.limits;
const T = POLICY.tolerances;

describe('POLICY', () => {
  it('is frozen, groups and all', () => {
    expect(Object.isFrozen(POLICY)).toBe(true);
    expect(Object.isFrozen(L)).toBe(true);
    expect(Object.isFrozen(T)).toBe(true);
    expect(() => { (L as { EIGENFREE_MAX_N: number }).EIGENFREE_MAX_N = 1; }).toThrow(TypeError);
    expect(L.EIGENFREE_MAX_N).toBe(100000);
  });

  it('holds positive finite numbers only', () => {
    for (const [name, v] of [...Object.entries(L), ...Object.entries(T)]) {
      expect(Number.isFinite(v) && v > 0, name).toBe(true);
    }
    for (const [name, v] of Object.entries(L)) expect(Number.isSafeInteger(v), name).toBe(true);
  });

  it('is what the modules export under their old names', () => {
    expect([limits.DENSE_SPECTRUM_MAX_N, DENSE_SPECTRUM_MAX_N]).toEqual([L.DENSE_SPECTRUM_MAX_N, L.DENSE_SPECTRUM_MAX_N]);
    expect([limits.STRUCTURED_SPECTRUM_MAX_N, FAST_SPECTRUM_MAX_N]).toEqual([L.STRUCTURED_SPECTRUM_MAX_N, L.STRUCTURED_SPECTRUM_MAX_N]);
    expect(limits.PAN_MAX_M).toBe(L.PAN_MAX_M);
    expect(limits.EIGENFREE_MAX_N).toBe(L.EIGENFREE_MAX_N);
    expect(limits.DCT_MAX_N).toBe(L.DCT_MAX_N);
    expect(limits.POWER_MAX_N).toBe(L.POWER_MAX_N);
    expect(limits.MEMORY_BUDGET_BYTES).toBe(L.MEMORY_BUDGET_BYTES);
    expect(AUTO_SPECTRUM_MAX_N).toBe(L.AUTO_SPECTRUM_MAX_N);
    expect([POWER_SIZE_LIMIT, POWER_DENSE_MAX_N]).toEqual([L.POWER_SIZE_LIMIT, L.POWER_DENSE_MAX_N]);
    expect([MAX_BOUNDS_N, MAX_TABLE_CELLS, MAX_TABLE_WORK, MAX_LIST_LENGTH]).toEqual([L.MAX_BOUNDS_N, L.MAX_TABLE_CELLS, L.MAX_TABLE_WORK, L.MAX_LIST_LENGTH]);
    expect([AUTO_RELATIVE_TARGET, LAMBDA_FLOOR, RANK_TOLERANCE, CONDITION_LIMIT, CONDITION_WARNING, CONDITION_ERROR_FACTOR, D_ROUNDING_LIMIT, RESIDUAL_DRIFT_LIMIT, LAG_MATCH_TOLERANCE])
      .toEqual([T.AUTO_RELATIVE_TARGET, T.LAMBDA_FLOOR, T.RANK_TOLERANCE, T.CONDITION_LIMIT, T.CONDITION_WARNING, T.CONDITION_ERROR_FACTOR, T.D_ROUNDING_LIMIT, T.RESIDUAL_DRIFT_LIMIT, T.LAG_MATCH_TOLERANCE]);
  });

  it('sets where checkSize starts refusing (exactly at each limit)', () => {
    const refuses = (f: () => void): boolean => {
      try { f(); return false; } catch (e) { if (isDwError(e) && e.code === 'SIZE_LIMIT') return true; throw e; }
    };
    expect(refuses(() => limits.checkSize(L.DENSE_SPECTRUM_MAX_N, 3, 'imhof'))).toBe(false);
    expect(refuses(() => limits.checkSize(L.DENSE_SPECTRUM_MAX_N + 1, 3, 'imhof'))).toBe(true);
    expect(refuses(() => limits.checkSize(L.STRUCTURED_SPECTRUM_MAX_N, 3, 'imhof', { spectrum: 'structured' }))).toBe(false);
    expect(refuses(() => limits.checkSize(L.STRUCTURED_SPECTRUM_MAX_N + 1, 3, 'imhof', { spectrum: 'structured' }))).toBe(true);
    expect(refuses(() => limits.checkSize(L.PAN_MAX_M + 3, 3, 'pan'))).toBe(false);
    expect(refuses(() => limits.checkSize(L.PAN_MAX_M + 4, 3, 'pan'))).toBe(true);
    expect(refuses(() => limits.checkSize(L.EIGENFREE_MAX_N, 3, 'eigenfree'))).toBe(false);
    expect(refuses(() => limits.checkSize(L.EIGENFREE_MAX_N + 1, 3, 'eigenfree'))).toBe(true);
    expect(refuses(() => limits.checkSize(L.DCT_MAX_N, 3, 'dct'))).toBe(false);
    expect(refuses(() => limits.checkSize(L.DCT_MAX_N + 1, 3, 'auto'))).toBe(true);
    expect(refuses(() => limits.checkPowerSize(L.POWER_MAX_N, 3, 1))).toBe(false);
    expect(refuses(() => limits.checkPowerSize(L.POWER_MAX_N + 1, 3, 1))).toBe(true);
  });
});

describe('the documents agree with POLICY', () => {
  const doc = readFileSync(new URL('../docs/errors-and-limits.md', import.meta.url), 'utf8');
  const section = doc.slice(doc.indexOf('## Size limits'));
  const table = section.slice(0, section.indexOf('\n\n', section.indexOf('|---')));

  it('docs/errors-and-limits.md: every size limit is in the table, with its value', () => {
    const quoted = new Map<string, number>();
    // "n = 2000 (`DENSE_SPECTRUM_MAX_N`)", "100000 cells (`MAX_TABLE_CELLS`)", "1 GiB planned memory (`MEMORY_BUDGET_BYTES`)"
    for (const m of table.matchAll(/(\d+)( GiB)?[^|(`]*\(`([A-Z_]+)`/g)) {
      quoted.set(m[3], Number(m[1]) * (m[2] ? 2 ** 30 : 1));
    }
    expect([...quoted.keys()].sort()).toEqual(Object.keys(L).sort());
    for (const name of Object.keys(L) as SizeLimitName[]) expect(quoted.get(name), name).toBe(L[name]);
  });

  it('README.md quotes the auto switch and the largest n as POLICY sets them', () => {
    const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8').replace(/\s+/g, ' ');
    expect(readme).toContain(`Beyond n = ${L.AUTO_SPECTRUM_MAX_N} \`auto\``);
    expect(readme).toContain(`designs up to n = 10^${Math.log10(L.DCT_MAX_N)};`);
  });
});
