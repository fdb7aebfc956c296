/**
 * Batches of series: Holm and Benjamini-Hochberg adjustment against worked examples computed by
 * hand (below, step by step), and every group of a batch equal, number for number, to a single
 * exact test of that group's rows (internal consistency: sharing a null distribution must not
 * change any number).
 */
import { noteText, warningText } from '../../src/report/wording.js';
import { describe, expect, it } from 'vitest';
import { adjustPValues } from '../../src/batch/adjust.js';
import { exactDwBatch, groupRows } from '../../src/batch/batch.js';
import { DesignCache } from '../../src/batch/shared-design.js';
import { exactDwTest } from '../../src/inference/dw-test.js';
import { parseCsv } from '../../src/data/csv.js';

describe('multiple-testing adjustment (worked by hand)', () => {
  // p = (0.01, 0.04, 0.03, 0.005), m = 4; sorted: 0.005 (4th), 0.01 (1st), 0.03 (3rd), 0.04 (2nd)
  const p = [0.01, 0.04, 0.03, 0.005];
  it('Holm (1979): running maximum of (m - j + 1) p_(j)', () => {
    // 4 x 0.005 = 0.02; 3 x 0.01 = 0.03; 2 x 0.03 = 0.06; 1 x 0.04 = 0.04 -> max so far 0.06
    const a = adjustPValues(p, 'holm');
    expect(a[0]).toBeCloseTo(0.03, 15); expect(a[1]).toBeCloseTo(0.06, 15);
    expect(a[2]).toBeCloseTo(0.06, 15); expect(a[3]).toBeCloseTo(0.02, 15);
  });
  it('Benjamini-Hochberg (1995): running minimum from the top of m p_(j) / j', () => {
    // j = 4: 4 x 0.04 / 4 = 0.04; j = 3: 4 x 0.03 / 3 = 0.04; j = 2: 4 x 0.01 / 2 = 0.02; j = 1: 4 x 0.005 = 0.02
    const a = adjustPValues(p, 'bh');
    expect(a[0]).toBeCloseTo(0.02, 15); expect(a[1]).toBeCloseTo(0.04, 15);
    expect(a[2]).toBeCloseTo(0.04, 15); expect(a[3]).toBeCloseTo(0.02, 15);
  });
  it('the example of Benjamini & Hochberg (1995, section 3.2, 15 p-values; from memory): BH rejects 4 at q = 0.05, Holm (Bonferroni-type) 3', () => {
    const ps = [0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344, 0.0459, 0.3240, 0.4262, 0.5719, 0.6528, 0.7590, 1.0];
    const bh = adjustPValues(ps, 'bh');
    const holm = adjustPValues(ps, 'holm');
    expect(Array.from(bh).filter((v) => v <= 0.05).length).toBe(4);
    expect(Array.from(holm).filter((v) => v <= 0.05).length).toBe(3);
    // by hand: BH of the 4th is min over j >= 4 of 15 p_(j) / j = 15 x 0.0095 / 4 = 0.035625
    expect(bh[3]).toBeCloseTo(0.035625, 14);
    // Holm of the 3rd: max(15 x 0.0001, 14 x 0.0004, 13 x 0.0019) = 0.0247
    expect(holm[2]).toBeCloseTo(0.0247, 14);
  });
  it('adjusted values are capped at 1, keep input order, and refuse a non-probability', () => {
    expect(Array.from(adjustPValues([0.9, 0.8], 'holm'))).toEqual([1, 1]);
    expect(Array.from(adjustPValues([0.5], 'bh'))).toEqual([0.5]);
    expect(() => adjustPValues([0.5, 1.2], 'bh')).toThrowError(/not a probability/);
  });
});

// invented data: 7 shops, weekly; shops a..d share one design (price the same), e and f their own,
// g too short to test; sines so that the numbers are not special
function shopData(): string {
  const lines = ['shop,week,sales,price'];
  const spec: Array<[string, number, number]> = [['a', 20, 0], ['b', 20, 0], ['c', 20, 0], ['d', 20, 0], ['e', 24, 1], ['f', 18, 2], ['g', 3, 0]];
  spec.forEach(([shop, n, variant], s) => {
    for (let t = 1; t <= n; t++) {
      const price = (3 + Math.cos(0.7 * t + variant)).toFixed(4);
      const sales = (10 + 0.3 * t + Math.sin(1.1 * t * (s + 1)) + 0.5 * Math.sin(0.37 * t + s)).toFixed(4);
      lines.push(`${shop},${t},${sales},${price}`);
    }
  });
  return lines.join('\n') + '\n';
}

describe('exactDwBatch', () => {
  const table = parseCsv(shopData(), { source: "'shops.csv'" });
  const batch = exactDwBatch({ table, by: 'shop', y: 'sales', x: ['price'], time: 'week' });
  const full = exactDwBatch({ table, by: 'shop', y: 'sales', x: ['price'], time: 'week', critical: true });
  const single = (r: number[]) => exactDwTest({
    y: r.map((i) => Number(table.rows[i][2])), x: { price: r.map((i) => Number(table.rows[i][3])) }, times: r.map((i) => Number(table.rows[i][1])),
  });

  it('by default each group has the d, p-value and decision of a single exact test on its rows, and an error bound no larger', () => {
    const { labels, rows } = groupRows(table, 'shop');
    for (let g = 0; g < labels.length; g++) {
      if (labels[g] === 'g') continue;
      const s = single(Array.from(rows[g]));
      const got = batch.groups[g];
      expect(got.d).toBe(s.d);
      // the same integral on the same nodes, its integrand evaluated as one complex product
      // (src/batch/fast-tail.ts): equal up to rounding, far inside either error bound
      expect(Math.abs(got.pValue! - s.pValue)).toBeLessThan(1e-14);
      expect(got.decision).toBe(s.decision);
      expect(got.critical).toBeNull();
      expect(got.errorBound!).toBeGreaterThan(0);
      expect(got.errorBound!).toBeLessThanOrEqual(s.errorBound);
    }
  });

  it('with critical values every number equals a single exact test on its rows (internal consistency)', () => {
    const { labels, rows } = groupRows(table, 'shop');
    for (let g = 0; g < labels.length; g++) {
      const r = Array.from(rows[g]);
      const got = full.groups[g];
      expect(got.group).toBe(labels[g]);
      if (labels[g] === 'g') continue;
      const s = single(r);
      expect(got.error).toBeNull();
      expect(got.d).toBe(s.d);
      expect(got.pValue).toBe(s.pValue);
      expect(got.critical).toEqual({ lower: s.critical.lower, upper: s.critical.upper });
      expect(got.errorBound).toBe(s.errorBound);
      expect(got.zone).toBe(s.bounds?.zone ?? null);
      expect(got.decision).toBe(s.decision);
    }
  });

  it('groups with the same design share one null distribution; the others have their own', () => {
    const ids = batch.groups.slice(0, 6).map((g) => g.design);
    expect(new Set(ids.slice(0, 4)).size).toBe(1);
    expect(new Set(ids).size).toBe(3);
    expect(batch.summary.designs).toBe(3);
  });

  it('a group too small becomes an error entry and the batch goes on', () => {
    const g = batch.groups.find((x) => x.group === 'g')!;
    expect(g.error?.code).toBe('TOO_FEW_ROWS');
    expect(g.pValue).toBeNull();
    expect(batch.summary).toMatchObject({ groups: 7, tested: 6, failed: 1 });
    expect(batch.notes).toContainEqual({ code: 'BATCH_GROUPS_FAILED', failed: 1, groups: 7 });
  });

  it('a design that cannot be prepared (rank-deficient) fails its group and is not counted among the designs', () => {
    const cols = {
      shop: [...Array(10).fill('a'), ...Array(10).fill('b'), ...Array(10).fill('c')],
      y: Array.from({ length: 30 }, (_, i) => Math.sin(1.7 * i) + 0.1 * i),
      z: Array.from({ length: 30 }, (_, i) => Math.cos(0.9 * i)),
      // shop b: w is twice z
      w: Array.from({ length: 30 }, (_, i) => (i >= 10 && i < 20 ? 2 * Math.cos(0.9 * i) : Math.sin(0.4 * i))),
    };
    const b = exactDwBatch({ columns: cols, by: 'shop', y: 'y', x: ['z', 'w'] });
    expect(b.groups.map((g) => g.error?.code ?? null)).toEqual([null, 'RANK_DEFICIENT', null]);
    expect(b.groups.map((g) => g.design)).toEqual([0, null, 1]);
    expect(b.summary).toMatchObject({ groups: 3, tested: 2, failed: 1, designs: 2 });
  });

  it('dropMissing: each group loses its incomplete rows (listed, file rows) and is the single test with dropMissing on its rows, bit for bit; without it the group fails', () => {
    // shop b: no sales in week 5; shop e: no price in week 9 and no week label in row 12 of e
    const lines = shopData().trimEnd().split('\n');
    const at = (shop: string, week: number) => lines.findIndex((l) => l.startsWith(`${shop},${week},`));
    const holes = [at('b', 5), at('e', 9), at('e', 12)];
    lines[holes[0]] = lines[holes[0]].replace(/^b,5,[^,]+,/, 'b,5,NA,');
    lines[holes[1]] = lines[holes[1]].replace(/,[^,]+$/, ',');
    lines[holes[2]] = lines[holes[2]].replace(/^e,12,/, 'e,,');
    const text = lines.join('\n') + '\n';
    const t = parseCsv(text, { source: "'shops.csv'" });
    for (const time of ['week', undefined] as const) {
      const strict = exactDwBatch({ table: t, by: 'shop', y: 'sales', x: ['price'], time: time ?? 'week' });
      expect(strict.groups.filter((g) => g.error !== null).map((g) => [g.group, g.error!.code])).toEqual([['b', 'CELL_EMPTY'], ['e', 'CELL_EMPTY'], ['g', 'TOO_FEW_ROWS']]);
      // without a time column the rows of a group are its time; the week labels are left out of the model
      const input = time === 'week' ? { time: 'week' } : { timeColumn: false as const };
      const b = exactDwBatch({ table: t, by: 'shop', y: 'sales', x: ['price'], ...input, dropMissing: true });
      for (const g of b.groups) {
        if (g.group === 'g') continue;
        const rows = groupRows(t, 'shop').rows[groupRows(t, 'shop').labels.indexOf(g.group)];
        const cellsOf = (col: string) => Array.from(rows, (r) => t.rows[r][t.headers.indexOf(col)]);
        const num = (v: string) => (v.trim() === '' || v.trim() === 'NA' ? NaN : Number(v));
        const one = exactDwTest({
          y: cellsOf('sales').map(num), x: { price: cellsOf('price').map(num) }, dropMissing: true,
          ...(time === 'week' ? { time: { labels: cellsOf('week') } } : { timeColumn: false }),
        });
        expect(g.error, g.group).toBeNull();
        expect(g.d, g.group).toBe(one.d);
        expect(g.pValue, g.group).toBe(one.pValue);
        expect(g.n, g.group).toBe(one.n);
        // the single test counts rows within its own input; the batch names the file's data rows
        expect(g.droppedRows?.count ?? 0, g.group).toBe(one.droppedRows?.count ?? 0);
      }
      expect(b.groups.find((g) => g.group === 'b')!.droppedRows).toEqual({ count: 1, rows: [holes[0]] });
      // the missing week label counts only when the week is the time column
      const eRows = time === 'week' ? [holes[1], holes[2]] : [holes[1]];
      expect(b.groups.find((g) => g.group === 'e')!.droppedRows).toEqual({ count: eRows.length, rows: eRows });
      expect(b.groups.find((g) => g.group === 'e')!.warnings).toContainEqual({ code: 'ROWS_DROPPED', count: eRows.length, rows: eRows, asGaps: true });
      expect(b.notes).toContainEqual({ code: 'BATCH_ROWS_DROPPED', rows: 1 + eRows.length, groups: 2 });
      expect(noteText(b.notes.find((n) => n.code === 'BATCH_ROWS_DROPPED')!)).toMatch(new RegExp(`^${1 + eRows.length} rows with a missing value .* in 2 groups; .*gap in time`));
    }
  });

  it('a bad cell fails only its group, naming the data row; rows without a group label are counted', () => {
    const text = shopData().replace(/\ne,5,[^,]+,/, '\ne,5,oops,').replace(/\nf,2,/, '\n,2,');
    const b = exactDwBatch({ table: parseCsv(text, { source: "'shops.csv'" }), by: 'shop', y: 'sales', x: ['price'], time: 'week' });
    const e = b.groups.find((x) => x.group === 'e')!;
    expect(e.error?.code).toBe('CELL_NOT_NUMERIC');
    expect(e.error?.message).toMatch(/'oops' at data row \d+, column 'sales'/);
    const f = b.groups.find((x) => x.group === 'f')!;
    // f lost its week-2 row to the unlabelled rows: it is tested on the rest, with the gap honoured
    expect(f.error).toBeNull();
    expect(f.n).toBe(17);
    const missing = b.groups.find((x) => x.group === '')!;
    expect(missing.error?.code).toBe('CELL_EMPTY');
    expect(b.summary.groups).toBe(batch.summary.groups + 1);
  });

  it('times that do not increase within a group fail that group, naming the data rows of the file', () => {
    const text = shopData().replace('\ne,3,', '\ne,2,');
    const b = exactDwBatch({ table: parseCsv(text, { source: "'shops.csv'" }), by: 'shop', y: 'sales', x: ['price'], time: 'week' });
    const e = b.groups.find((x) => x.group === 'e')!;
    expect(e.error?.code).toBe('TIME_INVALID');
    // e starts after the 4 x 20 rows of a..d: its 2nd and 3rd rows are data rows 82 and 83
    expect(e.error?.message).toBe("The time 2 appears twice, at data row 82, column 'week' of 'shops.csv' and row 83.");
    expect(b.groups.filter((x) => x.error).map((x) => x.group)).toEqual(['e', 'g']);
  });

  it('quarter labels as the time of each group give the same numbers as their period numbers (gaps honoured)', () => {
    // the same groups twice: once with integer periods, once with the quarter labels of those periods
    const rows = ['g,t,q,y,x'];
    let seed = 7;
    const rnd = () => { seed = (seed * 16807) % 2147483647; return seed / 2147483647 - 0.5; };
    for (const g of ['a', 'b']) {
      for (let t = 0; t < 24; t++) {
        if (g === 'b' && (t === 5 || t === 17)) continue; // two missing quarters in b
        rows.push(`${g},${t},${2000 + Math.floor(t / 4)}Q${(t % 4) + 1},${(rnd() + 0.1 * t).toFixed(6)},${rnd().toFixed(6)}`);
      }
    }
    const table = parseCsv(rows.join('\n'));
    const byInt = exactDwBatch({ table, by: 'g', y: 'y', x: ['x'], time: 't' });
    const byQuarter = exactDwBatch({ table, by: 'g', y: 'y', x: ['x'], time: 'q' });
    expect(byQuarter.groups.map((r) => r.error)).toEqual([null, null]);
    expect(byQuarter.groups.map((r) => r.d)).toEqual(byInt.groups.map((r) => r.d));
    expect(byQuarter.groups.map((r) => r.pValue)).toEqual(byInt.groups.map((r) => r.pValue));
    // without a named time column the time-index rule takes the quarter labels, group by group
    // (the same rule as the single test), and says so
    const ruled = exactDwBatch({ table, by: 'g', y: 'y', x: ['x'] });
    expect(ruled.groups.map((r) => r.d)).toEqual(byQuarter.groups.map((r) => r.d));
    expect(ruled.notes).toContainEqual({ code: 'BATCH_TIME_DETECTED', column: 'q' });
    expect(noteText(ruled.notes.find((n) => n.code === 'BATCH_TIME_DETECTED')!)).toMatch(/'q' was taken as the time index/);
    // and the gaps matter: b without its times (the rule turned off) is another operator
    const noTime = exactDwBatch({ table, by: 'g', y: 'y', x: ['x'], timeColumn: false });
    expect(noTime.groups[1].d).not.toBe(byQuarter.groups[1].d);
    expect(noTime.notes.map((n) => n.code)).not.toContain('BATCH_TIME_DETECTED');
  });

  it('a column named week is the time index of each group when no time column is named (the time-index rule), not a regressor', () => {
    const rows = ['shop,week,sales,price'];
    let seed = 11;
    const rnd = () => { seed = (seed * 16807) % 2147483647; return seed / 2147483647 - 0.5; };
    for (const g of ['a', 'b']) for (let w = 1; w <= 20; w++) if (!(g === 'a' && w === 9)) rows.push(`${g},${w},${rnd().toFixed(5)},${rnd().toFixed(5)}`);
    const table = parseCsv(rows.join('\n'));
    const named = exactDwBatch({ table, by: 'shop', y: 'sales', time: 'week' });
    const ruled = exactDwBatch({ table, by: 'shop', y: 'sales' });
    expect(ruled.x).toEqual(['price']);
    expect(ruled.time).toBe('week');
    expect(ruled.groups.map((r) => [r.k, r.d, r.pValue])).toEqual(named.groups.map((r) => [r.k, r.d, r.pValue]));
    const off = exactDwBatch({ table, by: 'shop', y: 'sales', timeColumn: false });
    expect(off.x).toEqual(['week', 'price']);
    expect(off.groups[0].k).toBe(3);
  });

  it('Holm-adjusted decisions use the adjusted p-values over the groups tested', () => {
    const b = exactDwBatch({ table, by: 'shop', y: 'sales', x: ['price'], time: 'week', adjust: 'holm', alternative: 'two-sided' });
    const fam = b.groups.filter((g) => g.pValue !== null);
    const adj = adjustPValues(fam.map((g) => g.pValue!), 'holm');
    fam.forEach((g, i) => {
      expect(g.pAdjusted).toBe(adj[i]);
      expect(g.decision).toBe(adj[i] <= 0.05 ? 'reject' : 'not-rejected');
    });
    expect(b.notes[0]).toEqual({ code: 'BATCH_ADJUSTED', method: 'holm', family: 6 });
  });

  it('columns input gives the same answer as the table', () => {
    const cols: Record<string, Array<string | number>> = { shop: [], week: [], sales: [], price: [] };
    for (const r of table.rows) { cols.shop.push(r[0]); cols.week.push(+r[1]); cols.sales.push(+r[2]); cols.price.push(+r[3]); }
    const b = exactDwBatch({ columns: cols, by: 'shop', y: 'sales', time: 'week' });
    expect(b.x).toEqual(['price']);
    expect(b.groups.map((g) => g.pValue)).toEqual(batch.groups.map((g) => g.pValue));
  });

  it('a column that does not exist is a file-level error', () => {
    expect(() => exactDwBatch({ table, by: 'store', y: 'sales' })).toThrowError(expect.objectContaining({ code: 'COLUMN_UNKNOWN' }));
  });

  it('twelve series on one design (the shared density ceiling) keep the p-values of single tests', () => {
    const lines = ['unit,t,v,z'];
    for (let s = 0; s < 12; s++) for (let t = 1; t <= 30; t++) lines.push(`u${s},${t},${(Math.sin(1.7 * t * (s + 1)) + 0.4 * Math.cos(0.3 * t + s)).toFixed(5)},${Math.cos(0.5 * t).toFixed(5)}`);
    const tab = parseCsv(lines.join('\n') + '\n');
    for (const alternative of ['positive', 'two-sided'] as const) {
      const b = exactDwBatch({ table: tab, by: 'unit', y: 'v', x: ['z'], time: 't', alternative });
      expect(b.summary.designs).toBe(1);
      const { rows } = groupRows(tab, 'unit');
      b.groups.forEach((g, i) => {
        const r = Array.from(rows[i]);
        const s = exactDwTest({ y: r.map((j) => +tab.rows[j][2]), x: { z: r.map((j) => +tab.rows[j][3]) }, times: r.map((j) => +tab.rows[j][1]), alternative });
        expect(Math.abs(g.pValue! - s.pValue)).toBeLessThan(1e-14); // up to rounding in the integrand, as above
        expect(g.d).toBe(s.d);
        // the bound of the tested tail, with the rounding allowances from a density ceiling: of the same small size
        expect(g.errorBound!).toBeGreaterThan(0);
        expect(g.errorBound!).toBeLessThan(Math.max(1e-10, 10 * s.errorBound));
      });
    }
  });

  it('a group whose regressor is y lagged one period: d is not valid there, and it is left out of the adjusted family', () => {
    const lines = ['unit,t,v,vlag'];
    for (let s = 0; s < 3; s++) {
      const v = Array.from({ length: 21 }, (_, t) => +(Math.sin(1.1 * t * (s + 1)) + 0.2 * t).toFixed(4));
      for (let t = 1; t <= 20; t++) lines.push(`u${s},${t},${v[t]},${s === 1 ? v[t - 1] : (+Math.cos(0.9 * t + s)).toFixed(4)}`);
    }
    const b = exactDwBatch({ table: parseCsv(lines.join('\n') + '\n'), by: 'unit', y: 'v', x: ['vlag'], time: 't', adjust: 'bh' });
    expect(b.groups[1]).toMatchObject({ decision: 'not-valid', pValue: null, pAdjusted: null, error: null });
    expect(b.groups[1].warnings.map((w) => w.code)).toContain('D_NOT_VALID_LAGGED_DEPENDENT');
    expect(b.groups[1].warnings.map((w) => warningText(w)).join(' ')).toMatch(/lagged one period/);
    expect(b.summary.notValid).toBe(1);
    expect(b.notes).toContainEqual({ code: 'BATCH_NOT_VALID_EXCLUDED', excluded: 1 });
    expect(b.notes).toContainEqual({ code: 'BATCH_ADJUSTED', method: 'bh', family: 2 });
  });

  it('the design cache compares designs bit for bit', () => {
    const cache = new DesignCache({});
    const a = cache.lookup({ t: [1, 2, 3, 4, 5, 6] }, 6);
    const b = cache.lookup({ t: [1, 2, 3, 4, 5, 6 + 2 ** -50] }, 6);
    const c = cache.lookup({ t: [1, 2, 3, 4, 5, 6] }, 6);
    expect(a.id).toBe(c.id);
    expect(b.id).not.toBe(a.id);
    expect(cache.size).toBe(2);
  });
});
