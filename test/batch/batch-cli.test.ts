/**
 * `exact-dw batch` and `exact-dw test --panel` on the command line: formats, per-group errors,
 * adjustment, files never overwritten, worker threads giving the same numbers as one thread
 * (through the built CLI, dist/), and the panel p-value equal to the library's (whose outside
 * check is test/panel/panel.test.ts against test/ref/panel-reference.json).
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, scratch } from '../helpers/cli.js';
import { exactDwBatch } from '../../src/batch/batch.js';
import { parseCsv } from '../../src/data/csv.js';
import { referenceJson } from '../helpers/reference.js';

const dir = scratch();
// invented data: 9 stations, 16 periods; stations 1-6 share a design, 7 and 8 their own, 9 has 2 rows
function stations(): string {
  const lines = ['station,period,flow,rain'];
  for (let s = 1; s <= 9; s++) {
    const n = s === 9 ? 2 : 16;
    for (let t = 1; t <= n; t++) {
      const rain = (2 + Math.cos(0.9 * t + (s > 6 ? s : 0))).toFixed(4);
      const flow = (5 + 0.7 * Number(rain) + Math.sin(1.7 * t * s) + 0.6 * Math.sin(0.5 * t + s)).toFixed(4);
      lines.push(`st${s},${t},${flow},${rain}`);
    }
  }
  return lines.join('\n') + '\n';
}
const data = join(dir, 'stations.csv');
writeFileSync(data, stations());
const args = [data, '--by', 'station', '--y', 'flow', '--x', 'rain', '--time', 'period'];

describe('exact-dw batch', () => {
  it('JSON: one entry per group, the small group as an error entry, the summary counts it', async () => {
    const r = await cli('batch', ...args, '--format', 'json', '--adjust', 'bh', '--workers', '1');
    expect(r.status).toBe(0);
    expect(r.err).toBe('');
    const j = JSON.parse(r.out);
    expect(j.groups).toHaveLength(9);
    expect(j.groups[8]).toMatchObject({ group: 'st9', pValue: null, pAdjusted: null, decision: null, error: { code: 'TOO_FEW_ROWS' } });
    expect(j.summary).toMatchObject({ groups: 9, tested: 8, failed: 1, designs: 3 });
    const lib = exactDwBatch({ table: parseCsv(stations()), by: 'station', y: 'flow', x: ['rain'], time: 'period', adjust: 'bh' });
    expect(j.groups.map((g: { pAdjusted: number | null }) => g.pAdjusted)).toEqual(lib.groups.map((g) => g.pAdjusted));
  });

  it('Markdown (default), CSV and booktabs LaTeX tables', async () => {
    const md = await cli('batch', ...args, '--adjust', 'holm');
    expect(md.out).toMatch(/^\| series \| \*n\* \| \*k\* \| \*d\* \| \*p\* \| \*p\* \(Holm\) \| decision \|/);
    expect(md.out).toMatch(/st9: .*TOO_FEW_ROWS/);
    expect(md.out).toMatch(/independent, normally distributed errors .* exogenous regressors .* does not replace, the judgement/);
    const csv = await cli('batch', ...args, '--format', 'csv');
    const lines = csv.out.trim().split('\n');
    expect(lines[0]).toBe('group,n,k,d,p_value,p_adjusted,decision,d_lower_critical,d_upper_critical,error_bound,bounds_zone,design,error_code,error_message');
    expect(lines).toHaveLength(10);
    expect(lines[9]).toMatch(/^st9,,,,,,error,.*TOO_FEW_ROWS/);
    const tex = await cli('batch', ...args, '--format', 'latex', '--adjust', 'bh');
    expect(tex.out).toMatch(/\\toprule/);
    expect(tex.out).toMatch(/\\midrule/);
    expect(tex.out).toMatch(/\\bottomrule/);
    expect(tex.out).toMatch(/p_\{\\mathrm\{BH\}\}/);
  });

  it('--out never replaces a file without --force', async () => {
    const out = join(dir, 'table.md');
    writeFileSync(out, 'keep me');
    const r = await cli('batch', ...args, '--out', out);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/already exists.*\[FILE_EXISTS\]/);
    expect(readFileSync(out, 'utf8')).toBe('keep me');
    const f = await cli('batch', ...args, '--out', out, '--force');
    expect(f.status).toBe(0);
    expect(readFileSync(out, 'utf8')).toMatch(/^\| series/);
  });

  it('--drop-missing: a missing cell leaves its row, listed per group in JSON and in the CSV\'s rows_dropped column; the numbers are the library\'s', async () => {
    const lines = stations().trimEnd().split('\n');
    const hole = lines.findIndex((l) => l.startsWith('st3,7,'));
    lines[hole] = lines[hole].replace(/^st3,7,[^,]+,/, 'st3,7,NA,');
    const file = join(dir, 'stations-hole.csv');
    writeFileSync(file, lines.join('\n') + '\n');
    const strict = JSON.parse((await cli('batch', file, '--by', 'station', '--y', 'flow', '--x', 'rain', '--time', 'period', '--format', 'json')).out);
    expect(strict.groups.find((g: { group: string }) => g.group === 'st3').error.code).toBe('CELL_EMPTY');
    const r = await cli('batch', file, '--by', 'station', '--y', 'flow', '--x', 'rain', '--time', 'period', '--drop-missing', '--format', 'json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    const lib = exactDwBatch({ table: parseCsv(lines.join('\n') + '\n', { source: `'${file}'` }), by: 'station', y: 'flow', x: ['rain'], time: 'period', dropMissing: true });
    const st3 = j.groups.find((g: { group: string }) => g.group === 'st3');
    expect(st3.droppedRows).toEqual({ count: 1, rows: [hole] });
    expect(st3.n).toBe(15);
    expect(st3.pValue).toBe(lib.groups.find((g) => g.group === 'st3')!.pValue);
    expect(j.notes.map((n: { code: string }) => n.code)).toContain('BATCH_ROWS_DROPPED');
    const csv = await cli('batch', file, '--by', 'station', '--y', 'flow', '--x', 'rain', '--time', 'period', '--drop-missing', '--format', 'csv');
    const table = parseCsv(csv.out);
    expect(table.headers.at(-1)).toBe('rows_dropped');
    expect(table.rows.find((row) => row[0] === 'st3')!.at(-1)).toBe(String(hole));
    expect(table.rows.find((row) => row[0] === 'st1')!.at(-1)).toBe('');
  });

  it('file-level problems are one line and exit 2', async () => {
    for (const [argv, code] of [
      [[data, '--by', 'site', '--y', 'flow'], 'COLUMN_UNKNOWN'],
      [[data, '--y', 'flow'], 'OPTION_MISSING'],
      [[data, '--by', 'station', '--y', 'flow', '--adjust', 'bonferroni'], 'OPTION_VALUE'],
      [[join(dir, 'nope.csv'), '--by', 'station', '--y', 'flow'], 'FILE_NOT_FOUND'],
    ] as const) {
      const r = await cli('batch', ...argv);
      expect(r.status).toBe(2);
      expect(r.out).toBe('');
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(new RegExp(`\\[${code}\\]$`, 'm'));
    }
  });

  it('two worker threads give the same numbers as one (built CLI)', () => {
    const main = join(process.cwd(), 'dist/src/cli/main.js');
    if (!existsSync(main)) throw new Error('build first (npm test builds)');
    const run = (w: string) => JSON.parse(execFileSync(process.execPath, [main, 'batch', ...args, '--format', 'json', '--adjust', 'holm', '--workers', w], { encoding: 'utf8' }));
    const one = run('1');
    const two = run('2');
    const strip = (j: { groups: Array<Record<string, unknown>> }) => j.groups.map(({ design: _d, ...rest }) => rest);
    expect(strip(two)).toEqual(strip(one));
    expect(two.summary.tested).toBe(one.summary.tested);
  });

  it('three threads (this one and two workers): the same numbers, and a bad cell in a worker\'s share is named by its row in the file', () => {
    const main = join(process.cwd(), 'dist/src/cli/main.js');
    if (!existsSync(main)) throw new Error('build first (npm test builds)');
    const lines = stations().trimEnd().split('\n');
    // station 8, period 5 (data row 7 * 16 + 5 = 117): text where a number belongs
    const bad = lines.findIndex((l) => l.startsWith('st8,5,'));
    lines[bad] = lines[bad].replace(/^st8,5,[^,]*/, 'st8,5,n/q');
    const file = join(dir, 'stations-bad.csv');
    writeFileSync(file, lines.join('\n') + '\n');
    const run = (w: string) => JSON.parse(execFileSync(process.execPath, [main, 'batch', file, '--by', 'station', '--y', 'flow', '--x', 'rain', '--time', 'period', '--format', 'json', '--workers', w], { encoding: 'utf8' }));
    const one = run('1');
    const three = run('3');
    const strip = (j: { groups: Array<Record<string, unknown>> }) => j.groups.map(({ design: _d, ...rest }) => rest);
    expect(strip(three)).toEqual(strip(one));
    const st8 = three.groups.find((g: { group: string }) => g.group === 'st8');
    expect(st8.error.code).toBe('CELL_NOT_NUMERIC');
    expect(st8.error.message).toMatch(new RegExp(`data row ${bad}, column 'flow'`));
  });
});

describe('exact-dw test --panel', () => {
  const ref = referenceJson('panel-reference.json') as {
    rows: Array<{ entity: string; time: number; y: number; x1: number; x2: number }>; cases: Array<{ entityEffects: boolean; pPositive: number; d: number }>;
  };
  const file = join(dir, 'panel.csv');
  writeFileSync(file, 'entity,year,y,x1,x2\n' + ref.rows.map((r) => `${r.entity},${r.time},${r.y},${r.x1},${r.x2}`).join('\n') + '\n');
  for (const c of ref.cases) {
    it(`the JSON p-value matches the numpy/mpmath reference (${c.entityEffects ? 'entity effects' : 'pooled'})`, async () => {
      const r = await cli('test', file, '--y', 'y', '--panel', 'entity', '--time', 'year', '--format', 'json', ...(c.entityEffects ? ['--entity-effects'] : []));
      expect(r.status).toBe(0);
      const j = JSON.parse(r.out);
      expect(Math.abs(j.pPositive - c.pPositive)).toBeLessThan(1e-9);
      expect(Math.abs(j.d - c.d)).toBeLessThan(1e-12);
      expect(j.bounds).toBeNull();
      expect(j.panel.entities).toBe(4);
    });
  }
  it('quarter labels as the panel times give the reference p-value too (the same periods, read entity by entity, rows shuffled)', async () => {
    const c = ref.cases.find((x) => !x.entityEffects)!;
    const label = (t: number) => `${2000 + Math.floor(t / 4)}Q${(t % 4) + 1}`;
    // reversed row order: the labels are read per entity in their own order, not the file's
    const lines = ref.rows.map((r) => `${r.entity},${label(r.time)},${r.y},${r.x1},${r.x2}`).reverse();
    const quarterly = join(dir, 'panel-quarters.csv');
    writeFileSync(quarterly, 'entity,quarter,y,x1,x2\n' + lines.join('\n') + '\n');
    const r = await cli('test', quarterly, '--y', 'y', '--panel', 'entity', '--time', 'quarter', '--format', 'json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(Math.abs(j.pPositive - c.pPositive)).toBeLessThan(1e-9);
    expect(Math.abs(j.d - c.d)).toBeLessThan(1e-12);
  });
  it('--drop-missing with --panel: incomplete rows (no y, no x1, no time, no entity) are dropped and listed, and the reference p-value comes back', async () => {
    const c = ref.cases.find((x) => !x.entityEffects)!;
    const lines = ref.rows.map((r) => `${r.entity},${r.time},${r.y},${r.x1},${r.x2}`);
    lines.splice(2, 0, 'north,2005,NA,3.1,1');
    lines.splice(9, 0, 'south,2013,2.5,,1.2');
    lines.splice(15, 0, 'east,NA,2.2,2.9,0.7');
    lines.splice(30, 0, ',2003,2.4,3.3,0.9');
    const gappy = join(dir, 'panel-missing.csv');
    writeFileSync(gappy, 'entity,year,y,x1,x2\n' + lines.join('\n') + '\n');
    const refused = await cli('test', gappy, '--y', 'y', '--panel', 'entity', '--time', 'year', '--format', 'json');
    expect(refused.status).toBe(2);
    expect(refused.err).toMatch(/--drop-missing[\s\S]*\[CELL_EMPTY\]/);
    const r = await cli('test', gappy, '--y', 'y', '--panel', 'entity', '--time', 'year', '--drop-missing', '--format', 'json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(Math.abs(j.pPositive - c.pPositive)).toBeLessThan(1e-9);
    expect(Math.abs(j.d - c.d)).toBeLessThan(1e-12);
    expect(j.droppedRows).toEqual({ count: 4, rows: [3, 10, 16, 31] });
    // quarter labels, one of them missing, read entity by entity
    const label = (t: number) => `${2000 + Math.floor(t / 4)}Q${(t % 4) + 1}`;
    const quarters = lines.map((l) => { const f = l.split(','); f[1] = f[1] === 'NA' ? 'NA' : label(Number(f[1])); return f.join(','); });
    const qfile = join(dir, 'panel-missing-quarters.csv');
    writeFileSync(qfile, 'entity,quarter,y,x1,x2\n' + quarters.join('\n') + '\n');
    const q = await cli('test', qfile, '--y', 'y', '--panel', 'entity', '--time', 'quarter', '--drop-missing', '--format', 'json');
    expect(q.status).toBe(0);
    expect(Math.abs(JSON.parse(q.out).pPositive - c.pPositive)).toBeLessThan(1e-9);
  });
  it('--panel needs --time; --entity-effects needs --panel', async () => {
    const a = await cli('test', file, '--y', 'y', '--panel', 'entity');
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/\[OPTION_MISSING\]/);
    const b = await cli('test', file, '--y', 'y', '--x', 'x1', '--entity-effects');
    expect(b.status).toBe(2);
    expect(b.err).toMatch(/\[OPTION_CONFLICT\]/);
  });
});
