/**
 * The pooled panel test against an outside reference: test/ref/panel_reference.py builds the
 * pairs, X, M A M and its spectrum with numpy (dense), d from numpy's least squares, and the
 * p-values by Imhof's integral in mpmath (30 digits), cross-checked by scipy.integrate.quad; the
 * tests read its committed JSON (test/ref/panel-reference.json).
 */
import { warningText } from '../../src/report/wording.js';
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { runExactDwTest, exactDwTest } from '../../src/inference/dw-test.js';
import { preparePanel } from '../../src/panel/panel.js';
import { referenceJson } from '../helpers/reference.js';

interface RefCase { entityEffects: boolean; n: number; k: number; pairs: number; d: number; nu: number[]; pPositive: number; pNegative: number; cdf: Array<{ c: number; p: number }> }
const ref = referenceJson('panel-reference.json') as {
  rows: Array<{ entity: string; time: number; y: number; x1: number; x2: number }>; cases: RefCase[];
};
const rows = ref.rows;
const input = {
  y: rows.map((r) => r.y),
  x: { x1: rows.map((r) => r.x1), x2: rows.map((r) => r.x2) },
};
const panelOf = (entityEffects: boolean) => ({ entity: rows.map((r) => r.entity), time: rows.map((r) => r.time), entityEffects });

describe('pooled panel (reference: numpy dense spectrum of M A M, mpmath Imhof)', () => {
  for (const c of ref.cases) {
    const label = c.entityEffects ? 'with entity effects' : 'pooled, one intercept';
    it(`${label}: pairs, k, spectrum, d and exact p-values`, () => {
      const { result, problem } = runExactDwTest({ ...input, panel: panelOf(c.entityEffects), alternative: 'positive' });
      expect(result.n).toBe(c.n);
      expect(result.k).toBe(c.k);
      expect(problem.pairs.from.length).toBe(c.pairs);
      expect(result.panel?.pairs).toBe(c.pairs);
      const nu = problem.distribution.spectrum;
      expect(nu.length).toBe(c.nu.length);
      for (let i = 0; i < nu.length; i++) expect(Math.abs(nu[i] - c.nu[i])).toBeLessThan(1e-10);
      expect(Math.abs(result.d - c.d)).toBeLessThan(1e-12);
      expect(Math.abs(result.pPositive - c.pPositive)).toBeLessThan(1e-9);
      expect(Math.abs(result.pNegative - c.pNegative)).toBeLessThan(1e-9);
      for (const g of c.cdf) expect(Math.abs(problem.distribution.cdf(g.c) - g.p)).toBeLessThan(1e-9);
    });
  }

  it('with entity effects the bounds are not shown and the result says why', () => {
    const r = exactDwTest({ ...input, panel: panelOf(true) });
    expect(r.bounds).toBeNull();
    expect(r.panel?.notes).toEqual([{ code: 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE', entities: 4 }]);
    expect(r.panel?.effectColumns).toEqual([...new Set(rows.map((x) => x.entity))].map((e) => `entity:${e}`)); // in the order of their first row
    expect(r.interceptAdded).toBe(false);
    expect(r.intercept).toBe(true); // the indicators span the constant
    expect(r.warnings.map((w) => w.code)).toContain('ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE');
    expect(r.warnings.map((w) => warningText(w)).join(' ')).toMatch(/do not apply/);
  });

  it('the pooled model without entity effects: no bounds zone either (several chains)', () => {
    const r = exactDwTest({ ...input, panel: panelOf(false) });
    expect(r.bounds).toBeNull();
    expect(r.panel?.notes).toEqual([{ code: 'PANEL_BOUNDS_NOT_APPLICABLE', entities: 4 }]);
  });

  it('the order of the rows does not matter', () => {
    const perm = rows.map((_, i) => i).reverse();
    const a = exactDwTest({ ...input, panel: panelOf(true) });
    const b = exactDwTest({
      y: perm.map((i) => rows[i].y),
      x: { x1: perm.map((i) => rows[i].x1), x2: perm.map((i) => rows[i].x2) },
      panel: { entity: perm.map((i) => rows[i].entity), time: perm.map((i) => rows[i].time), entityEffects: true },
    });
    expect(b.d).toBeCloseTo(a.d, 13);
    expect(b.pValue).toBeCloseTo(a.pValue, 12);
  });

  it('one entity is the ordinary series test', () => {
    const t = Array.from({ length: 15 }, (_, i) => i + 1);
    const y = t.map((v) => Math.sin(1.3 * v) + 0.1 * v);
    const z = t.map((v) => Math.cos(0.4 * v));
    const a = exactDwTest({ y, x: { z }, panel: { entity: t.map(() => 'only'), time: t } });
    const b = exactDwTest({ y, x: { z } });
    expect(a.d).toBe(b.d);
    expect(a.pValue).toBe(b.pValue);
  });

  it('bad panel input: a time twice within an entity, a missing entity, times together with the panel, power', () => {
    const base = { entity: ['a', 'a', 'b', 'b'], time: [1, 1, 1, 2] };
    expect(() => preparePanel(base, {}, 4, 1)).toThrowError(expect.objectContaining({ code: 'TIME_INVALID', message: expect.stringMatching(/'a' has the time 1 twice/) }));
    expect(() => preparePanel({ entity: ['a', '', 'b', 'b'], time: [1, 2, 1, 2] }, {}, 4, 1)).toThrowError(expect.objectContaining({ code: 'CELL_EMPTY' }));
    expect(() => exactDwTest({ ...input, panel: panelOf(false), times: rows.map((r) => r.time) })).toThrowError(expect.objectContaining({ code: 'OPTION_CONFLICT' }));
    expect(() => exactDwTest({ ...input, panel: panelOf(false), power: { rho: [0.5] } })).toThrowError(expect.objectContaining({ code: 'OPTION_CONFLICT' }));
    // time labels beside the panel's own times
    expect(() => exactDwTest({ ...input, panel: panelOf(false), time: { labels: rows.map((r) => String(r.time)) } })).toThrowError(expect.objectContaining({ code: 'OPTION_CONFLICT' }));
  });

  it('dropping rows with missing values: the rows of the reference panel plus four incomplete ones give the reference p-values', () => {
    // the extra rows: north's missing period with no y, a later period of south with no x1, a row
    // of east without its time, a row without its entity; once they are dropped the data are the
    // reference panel's rows (north keeps its gap at period 5)
    const extra = [
      { at: 3, entity: 'north', time: 2005, y: NaN, x1: 3.1, x2: 1 },
      { at: 10, entity: 'south', time: 2013, y: 2.5, x1: NaN, x2: 1.2 },
      { at: 20, entity: 'east', time: NaN, y: 2.2, x1: 2.9, x2: 0.7 },
      { at: 31, entity: 'NA', time: 2003, y: 2.4, x1: 3.3, x2: 0.9 },
    ];
    const all: Array<{ entity: string; time: number; y: number; x1: number; x2: number }> = [...rows];
    for (const e of extra) all.splice(e.at, 0, e);
    const data = {
      y: all.map((r) => r.y),
      x: { x1: all.map((r) => r.x1), x2: all.map((r) => r.x2) },
    };
    for (const c of ref.cases) {
      const panel = { entity: all.map((r) => r.entity), time: all.map((r) => r.time), entityEffects: c.entityEffects };
      expect(() => exactDwTest({ ...data, panel })).toThrowError(expect.objectContaining({ code: expect.stringMatching(/CELL_|LENGTH|TIME/) }));
      const r = exactDwTest({ ...data, panel, dropMissing: true, alternative: 'positive' });
      expect(r.n).toBe(c.n);
      expect(r.panel?.pairs).toBe(c.pairs);
      expect(Math.abs(r.d - c.d)).toBeLessThan(1e-12);
      expect(Math.abs(r.pPositive - c.pPositive)).toBeLessThan(1e-9);
      expect(Math.abs(r.pNegative - c.pNegative)).toBeLessThan(1e-9);
      expect(r.droppedRows).toEqual({ count: 4, rows: extra.map((e) => e.at + 1) });
      expect(r.warnings).toContainEqual({ code: 'ROWS_DROPPED', count: 4, rows: extra.map((e) => e.at + 1), asGaps: true });
    }
  });

  it('a regressor constant within each entity is absorbed by the entity effects (rank-deficient)', () => {
    const groupLevel = rows.map((r) => r.entity.length);
    expect(() => exactDwTest({ y: input.y, x: { size: groupLevel }, panel: panelOf(true) })).toThrowError(expect.objectContaining({ code: 'RANK_DEFICIENT' }));
  });
});
