/**
 * Time labels and the time-index rule (src/data/time-index.ts), dropped rows, the reproducibility
 * record and the Breusch-Godfrey test beside d, through the library, the command line and the
 * page's column guess. Outside checks: calendar facts (leap years, month lengths, weekdays; from
 * memory: 2024-01-01 was a Monday), numpy least squares and scipy tails for Breusch-Godfrey and
 * rho-hat (test/ref/bg_static.py -> bg-static.json), jstat's chi-square tail, the system's
 * sha256sum for the input digest.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { isDwError } from '../../src/errors.js';
import { chooseTimeIndex, parseTimeLabels } from '../../src/data/time-index.js';
import { parseCsv } from '../../src/data/csv.js';
import { durbinWatson, differencePairs } from '../../src/core/difference.js';
import { exactDwTest, runExactDwTest } from '../../src/inference/dw-test.js';
import { guessColumns, summarizeColumns } from '../../src/web/columns.js';
import { renderText } from '../../src/report/text.js';
import { renderMarkdown } from '../../src/report/markdown.js';
import { renderLatex } from '../../src/report/latex.js';
import { cli, scratch } from '../helpers/cli.js';
import { jStat, seededNormal } from '../helpers/reference.js';
import { referenceJson } from '../helpers/reference.js';

const dir = scratch();
let fileNo = 0;
function file(content: string, name?: string): string {
  const p = join(dir, name ?? `t${++fileNo}.csv`);
  writeFileSync(p, content);
  return p;
}
function codeOf(f: () => unknown): string {
  try { f(); } catch (e) { return isDwError(e) ? e.code : `not a DwError: ${String(e)}`; }
  return 'no error';
}
const flat = (s: string) => s.replace(/\s+/g, ' ');

describe('time labels become integer periods', () => {
  it('integers: the numbers themselves; gaps counted', () => {
    const t = parseTimeLabels(['2001', '2002', '2004', '2007']);
    expect(Array.from(t.periods)).toEqual([2001, 2002, 2004, 2007]);
    expect(t).toMatchObject({ format: 'integer', frequency: 'integer', missingPeriods: 3 });
    expect(parseTimeLabels([1, 2, 3], { frequency: 'annual' }).frequency).toBe('annual');
    // whole numbers as spreadsheets export them
    expect(Array.from(parseTimeLabels(['2001.0', '2002', '2.003e3']).periods)).toEqual([2001, 2002, 2003]);
  });
  it('quarters YYYYQn and YYYY-Qn: 4 year + quarter - 1, quarterly', () => {
    const a = parseTimeLabels(['2015Q3', '2015Q4', '2016Q1', '2016Q3']);
    expect(Array.from(a.periods)).toEqual([8062, 8063, 8064, 8066]);
    expect(a).toMatchObject({ format: 'quarter', frequency: 'quarterly', missingPeriods: 1 });
    expect(Array.from(parseTimeLabels(['2015-Q3', '2015-q4', '2016-Q1']).periods)).toEqual([8062, 8063, 8064]);
  });
  it('months YYYY-MM: 12 year + month - 1, monthly, across the year end', () => {
    const m = parseTimeLabels(['2015-11', '2015-12', '2016-01', '2016-03']);
    expect(Array.from(m.periods)).toEqual([24190, 24191, 24192, 24194]);
    expect(m).toMatchObject({ format: 'month', frequency: 'monthly', missingPeriods: 1 });
  });
  it('ISO dates: the frequency is inferred (annual, quarterly, monthly, month ends, weekly, daily) and reported', () => {
    expect(parseTimeLabels(['2001-06-30', '2002-06-30', '2004-06-30'])).toMatchObject({ frequency: 'annual', missingPeriods: 1, frequencySource: 'inferred' });
    expect(parseTimeLabels(['2015-01-01', '2015-04-01', '2015-10-01'])).toMatchObject({ frequency: 'quarterly', missingPeriods: 1 });
    // month ends: 31, 29 (2016 is a leap year), 31, 30 are all "the last day"
    const ends = parseTimeLabels(['2016-01-31', '2016-02-29', '2016-03-31', '2016-04-30', '2016-06-30']);
    expect(ends).toMatchObject({ frequency: 'monthly', missingPeriods: 1 });
    expect(Array.from(ends.periods)).toEqual([24192, 24193, 24194, 24195, 24197]);
    // quarter ends are a fixed position in the quarter (the last month) and the last day
    expect(parseTimeLabels(['2016-03-31', '2016-06-30', '2016-09-30', '2016-12-31']).frequency).toBe('quarterly');
    // Mondays (2024-01-01 was a Monday, from memory), one week missing
    const w = parseTimeLabels(['2024-01-01', '2024-01-08', '2024-01-22']);
    expect(w).toMatchObject({ frequency: 'weekly', missingPeriods: 1 });
    expect(w.periods[1] - w.periods[0]).toBe(1);
    // 2015-02-28 and 2015-03-01 are one day apart (2015 is not a leap year)
    const d = parseTimeLabels(['2015-02-27', '2015-02-28', '2015-03-01', '2015-03-04']);
    expect(d).toMatchObject({ frequency: 'daily', missingPeriods: 2 });
    expect(Array.from(d.periods, (p) => p - d.periods[0])).toEqual([0, 1, 2, 5]);
  });
  it('--frequency overrides the inferred frequency', () => {
    expect(parseTimeLabels(['2015-01-15', '2015-04-15', '2015-10-15']).frequency).toBe('quarterly');
    const t = parseTimeLabels(['2015-01-15', '2015-04-15', '2015-10-15'], { frequency: 'monthly' });
    expect(t).toMatchObject({ frequency: 'monthly', frequencySource: 'given', missingPeriods: 7 });
    expect(codeOf(() => parseTimeLabels(['2015-01-15', '2015-02-15', '2015-03-15'], { frequency: 'quarterly' }))).toBe('TIME_INVALID'); // one quarter
    expect(codeOf(() => parseTimeLabels(['2015-01-15', '2015-02-15', '2015-03-15'], { frequency: 'annual' }))).toBe('TIME_INVALID'); // the same year twice
    const daily = parseTimeLabels(['2015-01-15', '2015-02-15'], { frequency: 'daily' });
    expect(daily.periods[1] - daily.periods[0]).toBe(31); // January has 31 days
  });
  it('bad labels are refused with their codes, naming the row and column', () => {
    const cases: [unknown[], string, object?][] = [
      [['2015Q1', '2015Q5'], 'TIME_LABEL_INVALID'],
      [['2015-12', '2015-13'], 'TIME_LABEL_INVALID'],
      [['2015-02-28', '2015-02-29'], 'TIME_LABEL_INVALID'], // not a leap year
      [['2015', 'spring'], 'TIME_LABEL_INVALID'],
      [['01/02/2015', '02/02/2015'], 'TIME_LABEL_AMBIGUOUS'],
      [['2015Q1', '2015-04'], 'TIME_FORMATS_MIXED'],
      [['2015', '2016-01'], 'TIME_FORMATS_MIXED'],
      [['2015-01-05', '2015-02-17', '2015-04-02'], 'TIME_IRREGULAR'],
      [['2015Q1', '2015Q2'], 'TIME_FREQUENCY_CONFLICT', { frequency: 'monthly' }],
      [['2015-01-01', '2015-02-01'], 'TIME_FREQUENCY_CONFLICT', { frequency: 'integer' }],
      [['2015Q2', '2015Q1'], 'TIME_INVALID'],
      [['2015Q2', '2015Q2'], 'TIME_INVALID'],
      [['2001', '2001.5'], 'TIME_INVALID'],
      [['2001', 'NA'], 'CELL_EMPTY'],
    ];
    for (const [labels, code, options] of cases) {
      expect(codeOf(() => parseTimeLabels(labels as string[], { column: 'period', ...(options ?? {}) })), String(labels)).toBe(code);
    }
    try { parseTimeLabels(['2015Q1', '2015Q5'], { column: 'quarter', source: "'sales.csv'" }); } catch (e) {
      expect(String((e as Error).message)).toContain("'2015Q5' at data row 2, column 'quarter' of 'sales.csv'");
    }
  });
});

describe('a time index with no two observations one period apart', () => {
  it('quarter-end dates read as monthly, lag 3: d is the quarterly d; rho-hat and Breusch-Godfrey are undefined and said so, not an error', () => {
    const dates = ['2019-03-31', '2019-06-30', '2019-09-30', '2019-12-31', '2020-03-31', '2020-06-30', '2020-12-31',
      '2021-03-31', '2021-06-30', '2021-09-30', '2021-12-31', '2022-03-31', '2022-06-30', '2022-09-30'];
    const y = dates.map((_, i) => 5 + Math.cos(0.9 * i) + 0.1 * i);
    const x = { price: dates.map((_, i) => 1 + Math.sin(1.7 * i)) };
    const monthly = exactDwTest({ y, x, time: { labels: dates, frequency: 'monthly' }, lag: 3 });
    const quarterly = exactDwTest({ y, x, time: { labels: dates } });
    expect(quarterly.timeColumn?.frequency).toBe('quarterly');
    // the same pairs (three months apart = consecutive quarters), so the same statistic (definition of d)
    expect(monthly.d).toBeCloseTo(quarterly.d, 14);
    expect(monthly.rhoHat).toBeNull();
    expect(monthly.breuschGodfrey).toBeNull();
    expect(monthly.warnings).toContainEqual({ code: 'BREUSCH_GODFREY_UNDEFINED', order: 1 });
    expect(renderText(monthly)).toMatch(/Breusch-Godfrey test of order 1 is not defined here/);
    // and the quarterly reading has both
    expect(quarterly.rhoHat).not.toBeNull();
    expect(quarterly.breuschGodfrey?.order).toBe(1);
  });
});

describe('gaps and lag 4 on quarter labels, months and dates', () => {
  const g = seededNormal(41);
  const quarters: string[] = [];
  for (let y = 2010; y < 2018; y++) for (let q = 1; q <= 4; q++) quarters.push(`${y}Q${q}`);
  const kept = quarters.filter((_, i) => i !== 6 && i !== 17);
  const n = kept.length;
  const price = Array.from({ length: n }, () => 3 + g());
  const y = price.map((p, i) => 1 + 0.5 * p + Math.sin(i) + g());
  const periods = kept.map((q) => 4 * Number(q.slice(0, 4)) + Number(q.slice(5)) - 1);
  it('quarter labels with gaps give the same d and p as their period numbers, at lag 1 and at lag 4', () => {
    for (const lag of [1, 4]) {
      const a = exactDwTest({ y, x: { price }, time: { labels: kept, name: 'quarter' }, lag });
      const b = exactDwTest({ y, x: { price }, times: periods, lag });
      expect(a.d).toBe(b.d);
      expect(a.pValue).toBe(b.pValue);
      expect(a.gaps).toBe(true);
      expect(a.timeColumn).toMatchObject({ name: 'quarter', format: 'quarter', frequency: 'quarterly', missingPeriods: 2 });
    }
  });
  it('at lag 4 only pairs exactly four quarters apart are differenced (d by hand from the residuals)', () => {
    const { result, problem } = runExactDwTest({ y, x: { price }, time: { labels: kept }, lag: 4 });
    const e = runExactDwTest({ y, x: { price }, time: { labels: kept }, lag: 1 }).problem; // same design
    expect(e.factored.design.n).toBe(n);
    // residuals by the normal equations (closed form for one regressor and an intercept)
    const mx = price.reduce((s, v) => s + v, 0) / n;
    const my = y.reduce((s, v) => s + v, 0) / n;
    let sxy = 0, sxx = 0;
    for (let i = 0; i < n; i++) { sxy += (price[i] - mx) * (y[i] - my); sxx += (price[i] - mx) ** 2; }
    const b = sxy / sxx;
    const res = y.map((v, i) => v - my - b * (price[i] - mx));
    let num = 0, den = 0, pairs = 0;
    for (let i = 0; i < n; i++) {
      den += res[i] ** 2;
      const j = periods.indexOf(periods[i] - 4);
      if (j >= 0) { num += (res[i] - res[j]) ** 2; pairs++; }
    }
    expect(problem.pairs.from.length).toBe(pairs);
    expect(result.d).toBeCloseTo(num / den, 12);
    expect(durbinWatson(Float64Array.from(res), differencePairs(n, 4, periods))).toBeCloseTo(result.d, 12);
  });
  it('months and dates: the same d as their period numbers, with gaps', () => {
    const months = ['2019-10', '2019-11', '2020-01', '2020-02', '2020-03', '2020-05', '2020-06', '2020-07', '2020-08', '2020-09', '2020-10', '2020-12'];
    const mp = months.map((m) => 12 * Number(m.slice(0, 4)) + Number(m.slice(5)) - 1);
    const h = seededNormal(5);
    const yy = months.map(() => h());
    const xx = months.map(() => h());
    expect(exactDwTest({ y: yy, x: { xx }, time: { labels: months } }).d).toBe(exactDwTest({ y: yy, x: { xx }, times: mp }).d);
    const dates = months.map((m) => `${m}-01`);
    const r = exactDwTest({ y: yy, x: { xx }, time: { labels: dates } });
    expect(r.timeColumn).toMatchObject({ format: 'date', frequency: 'monthly', frequencySource: 'inferred', missingPeriods: 3 });
    expect(r.d).toBe(exactDwTest({ y: yy, x: { xx }, times: mp }).d);
  });
});

describe('one time-index rule for the library, the command line and the page', () => {
  // the invented file of the complaint: an integer year with gaps, no --time
  const years = [1990, 1991, 1993, 1994, 1995, 1997, 1998, 1999, 2000, 2002, 2003, 2004, 2005, 2007, 2008, 2009];
  const g = seededNormal(77);
  const rain = years.map(() => 100 + 10 * g());
  let u = 0;
  const yv = years.map((_, i) => { u = 0.6 * u + g(); return 5 + 0.02 * rain[i] + u; });
  const text = 'year,yield,rain\n' + years.map((t, i) => `${t},${yv[i].toFixed(4)},${rain[i].toFixed(3)}`).join('\n') + '\n';
  const path = file(text, 'gapped-years.csv');
  const table = parseCsv(text);
  const num = (c: string) => table.rows.map((r) => Number(r[table.headers.indexOf(c)]));

  it('without --time, the integer column named year is taken as the time index by all three, and said so', async () => {
    const api = exactDwTest({ y: num('yield'), x: { year: num('year'), rain: num('rain') } });
    const run = await cli('test', path, '--y', 'yield', '--format', 'json');
    expect(run.status).toBe(0);
    const j = JSON.parse(run.out);
    const page = guessColumns(table, summarizeColumns(table));
    expect(api.timeColumn?.name).toBe('year');
    expect(j.timeColumn).toMatchObject({ name: 'year', how: 'detected', missingPeriods: 4 });
    expect(page.time).toBe('year');
    expect(page.x).toEqual(['rain']);
    expect(j.columns).toEqual(['(intercept)', 'rain']);
    expect(j.d).toBe(api.d);
    expect(j.pValue).toBe(api.pValue);
    expect(j.warnings).toContainEqual({ code: 'TIME_INDEX_DETECTED', column: 'year', format: 'integer', frequency: 'integer' });
    // and the same numbers as naming it
    const named = JSON.parse((await cli('test', path, '--y', 'yield', '--time', 'year', '--format', 'json')).out);
    expect(named.d).toBe(j.d);
    expect(named.pValue).toBe(j.pValue);
    expect(named.timeColumn.how).toBe('named');
    // every format says which column is the time index
    for (const fmt of ['text', 'markdown', 'latex']) {
      expect(flat((await cli('test', path, '--y', 'yield', '--format', fmt)).out)).toMatch(/Time index.*year.*detected by the time-index rule/);
    }
  });
  it('kept as a regressor (listed in --x, or --no-time), its gaps are flagged as not honoured', async () => {
    const listed = JSON.parse((await cli('test', path, '--y', 'yield', '--x', 'year,rain', '--format', 'json')).out);
    expect(listed.timeColumn).toBeNull();
    expect(listed.warnings).toContainEqual({ code: 'TIME_GAPS_NOT_HONOURED', column: 'year' });
    const off = JSON.parse((await cli('test', path, '--y', 'yield', '--no-time', '--format', 'json')).out);
    expect(off.columns).toContain('year');
    expect(off.warnings).toContainEqual({ code: 'TIME_GAPS_NOT_HONOURED', column: 'year' });
    expect(off.d).toBe(exactDwTest({ y: num('yield'), x: { year: num('year'), rain: num('rain') }, timeColumn: false }).d);
    const txt = flat((await cli('test', path, '--y', 'yield', '--no-time')).out);
    expect(txt).toMatch(/looks like a time index with gaps .* its gaps are not honoured/);
  });
  it('pvalue, critical and power follow the same rule on a design file, with a note on stderr', async () => {
    const design = file('year,rain\n' + years.map((t, i) => `${t},${rain[i].toFixed(3)}`).join('\n') + '\n');
    for (const cmd of [['pvalue', '--d', '1.4'], ['critical'], ['power', '--rho', '0.5']]) {
      const auto = await cli(cmd[0], '--design', design, ...cmd.slice(1), '--format', 'json');
      const named = await cli(cmd[0], '--design', design, '--time', 'year', ...cmd.slice(1), '--format', 'json');
      expect(auto.status).toBe(0);
      expect(auto.out).toBe(named.out);
      expect(auto.err).toMatch(/note: No time column was named, so year \(whole numbers, integer\) was taken as the time index/);
      expect(named.err).toBe('');
      const off = await cli(cmd[0], '--design', design, '--no-time', ...cmd.slice(1), '--format', 'json');
      expect(off.err).toMatch(/note: The regressor year looks like a time index with gaps/);
      expect(JSON.parse(off.out).k).toBe(3);
    }
  });
  it('quarter labels are found by all three; a column named t stays a regressor everywhere', async () => {
    const q = 'period,sales,price\n' + ['2019Q1', '2019Q2', '2019Q4', '2020Q1', '2020Q2', '2020Q3', '2020Q4', '2021Q1', '2021Q3', '2021Q4', '2022Q1', '2022Q2']
      .map((p, i) => `${p},${(10 + Math.sin(i) + 0.1 * i).toFixed(3)},${(2 + Math.cos(2 * i)).toFixed(3)}`).join('\n') + '\n';
    const qt = parseCsv(q);
    const j = JSON.parse((await cli('test', file(q), '--y', 'sales', '--lag', '4', '--format', 'json')).out);
    expect(j.timeColumn).toMatchObject({ name: 'period', format: 'quarter', frequency: 'quarterly', how: 'detected' });
    expect(guessColumns(qt, summarizeColumns(qt)).time).toBe('period');
    expect(chooseTimeIndex(qt.headers.map((h) => ({ name: h, cells: qt.rows.map((r) => r[qt.headers.indexOf(h)]) })), { y: 'sales' }).column).toBe('period');
    const t = 't,sales,price\n1,3.5,2\n2,3.9,2.5\n3,4.1,2.25\n4,4.0,2.5\n5,4.4,2.1\n6,4.2,2.6\n';
    const tt = parseCsv(t);
    const jt = JSON.parse((await cli('test', file(t), '--y', 'sales', '--format', 'json')).out);
    expect(jt.timeColumn).toBeNull();
    expect(jt.columns).toEqual(['(intercept)', 't', 'price']);
    expect(guessColumns(tt, summarizeColumns(tt)).time).toBeNull();
    expect(exactDwTest({ y: [3.5, 3.9, 4.1, 4.0, 4.4, 4.2], x: { t: [1, 2, 3, 4, 5, 6], price: [2, 2.5, 2.25, 2.5, 2.1, 2.6] } }).timeColumn).toBeNull();
  });
  it('--frequency overrides the inferred frequency of dates on the command line; without --time it is refused', async () => {
    const d = 'date,y,x\n' + ['2020-01-15', '2020-02-15', '2020-03-15', '2020-05-15', '2020-06-15', '2020-07-15', '2020-08-15', '2020-09-15', '2020-11-15', '2020-12-15']
      .map((s, i) => `${s},${(Math.sin(i) + 0.2 * i).toFixed(3)},${Math.cos(i).toFixed(3)}`).join('\n') + '\n';
    const p = file(d);
    const inferred = JSON.parse((await cli('test', p, '--y', 'y', '--time', 'date', '--format', 'json')).out);
    expect(inferred.timeColumn).toMatchObject({ frequency: 'monthly', frequencySource: 'inferred', missingPeriods: 2 });
    const monthly = JSON.parse((await cli('test', p, '--y', 'y', '--time', 'date', '--frequency', 'monthly', '--format', 'json')).out);
    expect(monthly.timeColumn).toMatchObject({ frequency: 'monthly', frequencySource: 'given' });
    expect(monthly.d).toBe(inferred.d);
    // read as daily, no two dates are one day apart: refused, never a d of nothing
    const daily = await cli('test', p, '--y', 'y', '--time', 'date', '--frequency', 'daily');
    expect(daily.status).toBe(2);
    expect(daily.err).toMatch(/No two observations are exactly 1 time unit\(s\) apart.*\[TIME_INVALID\]/);
    const bad = await cli('test', p, '--y', 'y', '--frequency', 'daily');
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(/--frequency describes the --time column.*\[OPTION_CONFLICT\]/);
  });
});

describe('rows with missing values', () => {
  const rows = Array.from({ length: 14 }, (_, i) => [2001 + i, (5 + Math.sin(1.1 * i) + 0.3 * i).toFixed(3), (2 + Math.cos(0.8 * i)).toFixed(3)]);
  const withNa = rows.map((r, i) => (i === 3 ? [r[0], 'NA', r[2]] : i === 8 ? [r[0], r[1], ''] : r));
  const text = 'year,y,x\n' + withNa.map((r) => r.join(',')).join('\n') + '\n';
  const p = file(text);
  const cleaned = 'year,y,x\n' + rows.filter((_, i) => i !== 3 && i !== 8).map((r) => r.join(',')).join('\n') + '\n';
  it('are refused without --drop-missing, with a hint naming the option', async () => {
    const r = await cli('test', p, '--y', 'y');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/Missing value 'NA' at data row 4, column 'y'.*--drop-missing.*\[CELL_EMPTY\]/);
    expect(r.err.trim().split('\n')).toHaveLength(1);
  });
  it('with --drop-missing are dropped, listed (1-based data rows) and become gaps: the same d and p as the file without them', async () => {
    const j = JSON.parse((await cli('test', p, '--y', 'y', '--drop-missing', '--format', 'json')).out);
    expect(j.droppedRows).toEqual({ count: 2, rows: [4, 9] });
    expect(j.n).toBe(12);
    expect(j.gaps).toBe(true);
    expect(j.warnings).toContainEqual({ code: 'ROWS_DROPPED', count: 2, rows: [4, 9], asGaps: true });
    const c = JSON.parse((await cli('test', file(cleaned), '--y', 'y', '--time', 'year', '--format', 'json')).out);
    expect(j.d).toBe(c.d);
    expect(j.pValue).toBe(c.pValue);
    const txt = flat((await cli('test', p, '--y', 'y', '--drop-missing')).out);
    expect(txt).toMatch(/2 rows with a missing value in a column of the model were dropped \(data rows 4 and 9, counted from 1 after the header\)/);
    expect(txt).toMatch(/Rows dropped \(missing values\) \.* 2: data rows 4 and 9/);
    const para = flat((await cli('test', p, '--y', 'y', '--drop-missing', '--paragraph')).out);
    expect(para).toMatch(/2 observations with a missing value were dropped and treated as gaps in the time index/);
  });
  it('without a time column the data-row numbers are the time index, so a dropped row is still a gap', () => {
    const y = rows.map((r) => Number(r[1]));
    const x = rows.map((r) => Number(r[2]));
    const yNa = y.map((v, i) => (i === 5 ? NaN : v));
    const r = exactDwTest({ y: yNa, x: { x }, dropMissing: true, timeColumn: false });
    expect(r.droppedRows).toEqual({ count: 1, rows: [6] });
    expect(r.timeColumn).toMatchObject({ how: 'rows', missingPeriods: 1 });
    const keep = y.map((_, i) => i).filter((i) => i !== 5);
    expect(r.d).toBe(exactDwTest({ y: keep.map((i) => y[i]), x: { x: keep.map((i) => x[i]) }, times: keep.map((i) => i + 1) }).d);
    expect(codeOf(() => exactDwTest({ y: yNa, x: { x } }))).not.toBe('no error');
  });
});

describe('reproducibility record and the Breusch-Godfrey test beside d', () => {
  const ref = referenceJson('bg-static.json') as {
    cases: { name: string; order: number; times: number[]; y: number[]; x: Record<string, number[]>; lm: number; pChiSquare: number; f: number; pF: number; df2: number; rSquared: number; rhoHat: number }[];
  };
  for (const c of ref.cases) {
    it(`Breusch-Godfrey and rho-hat against numpy lstsq and scipy tails: ${c.name}`, () => {
      const r = exactDwTest({ y: c.y, x: c.x, times: c.times, bgOrder: c.order });
      const bg = r.breuschGodfrey!;
      expect(bg.order).toBe(c.order);
      expect(bg.lm).toBeCloseTo(c.lm, 9);
      expect(bg.rSquared).toBeCloseTo(c.rSquared, 11);
      expect(bg.f).toBeCloseTo(c.f, 9);
      expect(bg.df2).toBe(c.df2);
      expect(Math.abs(bg.pChiSquare - c.pChiSquare)).toBeLessThan(1e-10 + 1e-8 * c.pChiSquare);
      expect(Math.abs(bg.pF - c.pF)).toBeLessThan(1e-9);
      // jstat's chi-square distribution function, a second outside reference for the tail
      expect(Math.abs(bg.pChiSquare - (1 - jStat.chisquare.cdf(bg.lm, c.order)))).toBeLessThan(1e-7);
      expect(r.rhoHat).toBeCloseTo(c.rhoHat, 12);
    });
  }
  it('the JSON carries input (file, bytes, SHA-256 as sha256sum computes it), the options, the software and BG of order --bg-order', async () => {
    const text = 'year,y,x\n' + Array.from({ length: 16 }, (_, i) => `${2000 + i},${(Math.sin(i) + 0.1 * i).toFixed(3)},${Math.cos(1.7 * i).toFixed(3)}`).join('\n') + '\n';
    const p = file(text, 'record.csv');
    const j = JSON.parse((await cli('test', p, '--y', 'y', '--bg-order', '4', '--lag', '4', '--format', 'json')).out);
    const digest = execFileSync('sha256sum', [p], { encoding: 'utf8' }).split(' ')[0];
    expect(j.input).toEqual({ name: p, sha256: digest, bytes: Buffer.byteLength(text) });
    expect(j.options).toMatchObject({ y: 'y', 'bg-order': '4', lag: '4', format: 'json' });
    expect(j.software).toEqual({ name: 'exact-dw', version: j.packageVersion });
    expect(j.breuschGodfrey.order).toBe(4);
    expect(typeof j.rhoHat).toBe('number');
    const md = (await cli('test', p, '--y', 'y', '--format', 'markdown')).out;
    expect(md).toContain(`SHA-256 \`${digest}\``);
    expect(md).toMatch(/Breusch–Godfrey test of order 1 \(asymptotic\)/);
    expect(md).toMatch(/ρ̂ \| -?\d\.\d{4}/);
  });
  it('--fragment writes LaTeX to \\input: no preamble, no document environment; other formats refuse it', async () => {
    const text = 'year,y,x\n' + Array.from({ length: 12 }, (_, i) => `${2000 + i},${(Math.sin(i) + 0.1 * i).toFixed(3)},${Math.cos(1.7 * i).toFixed(3)}`).join('\n') + '\n';
    const p = file(text);
    const frag = (await cli('test', p, '--y', 'y', '--format', 'latex', '--fragment')).out;
    expect(frag).not.toMatch(/\\documentclass|\\begin\{document\}|\\end\{document\}|\\usepackage/);
    expect(frag).toMatch(/\\section\*\{Exact Durbin--Watson test\}/);
    const full = (await cli('test', p, '--y', 'y', '--format', 'latex')).out;
    expect(full).toMatch(/\\documentclass/);
    const bad = await cli('test', p, '--y', 'y', '--fragment');
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(/--fragment gives a LaTeX fragment.*\[OPTION_CONFLICT\]/);
  });
});

describe('wording a referee would flag', () => {
  const g = seededNormal(3);
  const n = 24;
  const x = Array.from({ length: n }, () => g());
  let u = 0;
  const yRej = x.map((v) => { u = 0.8 * u + g(); return 1 + v + u; });
  const yNot = x.map((v) => 1 + v + g());
  it('"does not reject", never "no evidence"; the bounds test cited to Durbin and Watson (1951)', () => {
    const r = exactDwTest({ y: yNot, x: { x } });
    for (const doc of [renderText(r), renderMarkdown(r), renderLatex(r)]) expect(doc).not.toMatch(/no evidence/i);
    expect(flat(renderText(r))).toMatch(/The bounds d_L and d_U of the bounds test \(Durbin and Watson 1951\)/);
    expect(flat(renderText(r))).toMatch(/does not reject/);
  });
  it('the next steps follow a rejection only, in general words', () => {
    const rej = flat(renderText(exactDwTest({ y: yRej, x: { x } })));
    expect(rej).toMatch(/robust to autocorrelation/);
    expect(rej).toMatch(/feasible generalised least squares/);
    expect(rej).toMatch(/respecify the dynamics/);
    expect(rej).toMatch(/misspecified model/);
    const r = exactDwTest({ y: yNot, x: { x } });
    if (r.decision !== 'reject' && r.breuschGodfrey!.pChiSquare > r.alpha) expect(flat(renderText(r))).not.toMatch(/Usual next steps/);
  });
  it('math in the LaTeX report sits in math mode: a relation and its number in one span', () => {
    const r = exactDwTest({ y: yRej, x: { x }, power: { rho: [0.3, 0.6] } });
    const tex = renderLatex(r);
    expect(tex).toContain('$u_t = \\rho\\, u_{t-1} + \\varepsilon_t$');
    expect(tex).not.toMatch(/\$ (=|\$\\le\$|\$\\ge\$) -?\d/); // no "$alpha$ = 0.05" or "$p$ $\le$ 0.05"
    expect(tex).toMatch(/\$\\alpha = 0\.05\$/);
    expect(tex).toMatch(/\$m = n - k\$/);
    expect(tex).toMatch(/\$d = \d\.\d{4}\$/);
    expect(tex).not.toMatch(/u\(t\)|e\(t\)/); // the AR formula is in math mode, not 'u(t) = rho u(t - 1) + e(t)'
  });
  it("lag 4 is named Wallis's d_4 in every format; Durbin's alternative test by its name", () => {
    const r = exactDwTest({ y: yRej, x: { x }, lag: 4 });
    expect(flat(renderText(r))).toMatch(/lag 4: Wallis's d_4 \(Wallis 1972\)/);
    expect(renderLatex(r)).toContain("Wallis's $d_4$");
    expect(renderMarkdown(r)).toContain("Wallis's *d*<sub>4</sub>");
    const ylag = [0, ...yRej.slice(0, -1)];
    const dyn = exactDwTest({ y: yRej.slice(1), x: { x: x.slice(1), ylag: ylag.slice(1) }, laggedDependent: 'ylag' });
    expect(flat(renderText(dyn))).toMatch(/Durbin's alternative test, t on the lagged residual/);
  });
});
