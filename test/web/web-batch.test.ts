/**
 * End-to-end tests of the page's batch mode (one exact Durbin-Watson test per group of rows) in
 * headless Chromium, built and served as in web.test.ts (test/helpers/page.ts). The data are
 * invented here: yearly rainfall at a handful of made-up weather stations, stacked in one file,
 * with AR(1) errors at some stations, one station with too few years and one whose sunshine
 * hours are an exact linear function of its temperature (a design without full rank). Every number the page shows is compared with the
 * library run here in Node on the same file (exactDwBatch, the reference outside the page) to the
 * precision shown, and the downloaded tables with renderBatch byte for byte.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { parseCsv, numericColumn } from '../../src/data/csv.js';
import { exactDwBatch, type BatchInput, type BatchResult } from '../../src/batch/batch.js';
import { renderBatch } from '../../src/batch/render.js';
import { exactDwTest } from '../../src/inference/dw-test.js';
import { inline } from '../../src/report/format.js';
import { BATCH_ASSUMPTIONS, noteText } from '../../src/report/wording.js';
import { seededNormal } from '../helpers/reference.js';
import { expectShown, startPageRig, type PageRig } from '../helpers/page.js';

// ------------------------------------------------------------------ the invented data

interface Station { name: string; years: number[]; rho: number; collinear?: boolean }

const STATIONS: Station[] = [
  { name: 'Aberford', years: range(2005, 2020), rho: 0.8 },
  { name: 'Brackwater', years: range(2007, 2020), rho: 0 },
  { name: 'Cold Ashby', years: range(2006, 2020).filter((y) => y !== 2013), rho: 0.65 }, // one year missing: a gap
  { name: 'Dunmere', years: range(2005, 2020), rho: -0.4 },
  { name: 'Eskby', years: [2018, 2019, 2020], rho: 0 }, // too few years for the regression
  { name: 'Fallow Hill', years: range(2009, 2020), rho: 0.3, collinear: true }, // sunshine = 150 + 10 temperature: rank 2 of 3
];

function range(from: number, to: number): number[] {
  return Array.from({ length: to - from + 1 }, (_, i) => from + i);
}

/** station,year,rain_mm,temp_c,sun_h: rain = 600 + 25 temp - 0.2 sun + AR(1) error, seeded. */
function stationsCsv(): string {
  const z = seededNormal(20240611);
  const lines = ['station,year,rain_mm,temp_c,sun_h'];
  for (const s of STATIONS) {
    let e = 0;
    s.years.forEach((year, i) => {
      const temp = Number((8 + 1.5 * Math.sin(0.9 * i + s.name.length) + 0.4 * z()).toFixed(2));
      const sun = s.collinear ? 150 + 10 * temp : 1400 + 120 * z();
      e = i === 0 ? z() * 40 / Math.sqrt(1 - s.rho * s.rho) : s.rho * e + 40 * z();
      const rain = 600 + 25 * temp - 0.2 * sun + e;
      lines.push(`${s.name},${year},${rain.toFixed(1)},${temp.toFixed(2)},${sun.toFixed(1)}`);
    });
  }
  return lines.join('\n') + '\n';
}

const CSV = stationsCsv();
const FILE = 'stations.csv';
const REGRESSORS = ['temp_c', 'sun_h'];
/** How the page names a chosen file in its messages (data-loading.ts). */
const SOURCE = `'${FILE}'`;

/** The library's batch on the same file, read the way the page reads it. */
function libraryBatch(options: Omit<BatchInput, 'table' | 'by' | 'y' | 'x'>): BatchResult {
  return exactDwBatch({ table: parseCsv(CSV, { source: SOURCE }), by: 'station', y: 'rain_mm', x: REGRESSORS, ...options });
}

// ------------------------------------------------------------------ the browser

let rig: PageRig;

beforeAll(async () => { rig = await startPageRig(); });
afterAll(async () => { await rig?.close(); });

/** Open the page, load the file and choose y = rain_mm on temp_c and sun_h (year is left out of the regressors). */
async function openWithStations(csv = CSV): Promise<Page> {
  const page = await rig.context.newPage();
  await page.goto(rig.served.url);
  await page.setInputFiles('#file', { name: FILE, mimeType: 'text/csv', buffer: Buffer.from(csv) });
  await page.locator('#model-step').waitFor({ state: 'visible' });
  await page.check('input[name="y"][value="rain_mm"]');
  for (const x of await page.locator('input[name="x"]').all()) if (await x.isEnabled()) await x.uncheck();
  for (const x of REGRESSORS) await page.check(`input[name="x"][value="${x}"]`);
  return page;
}

async function compute(page: Page): Promise<void> {
  await page.click('#compute');
  await page.locator('#results[aria-busy="false"]').waitFor({ state: 'attached', timeout: 60_000 });
}

async function cell(page: Page, group: string, field: string): Promise<string> {
  return (await page.locator(`#batch-table tr[data-group="${group}"] [data-field="${field}"]`).textContent())?.trim() ?? '';
}

async function field(page: Page, name: string): Promise<string> {
  return (await page.locator(`[data-field="${name}"]`).first().textContent())?.trim() ?? '';
}

/** The text of a file the page offers for saving when `button` is pressed. */
async function download(page: Page, button: string): Promise<{ name: string; text: string }> {
  const [file] = await Promise.all([page.waitForEvent('download'), page.click(button)]);
  return { name: file.suggestedFilename(), text: readFileSync(await file.path(), 'utf8') };
}

/**
 * The page's own batch result, read back from its JSON download (renderBatchJson writes every field
 * of BatchResult, numbers in their shortest round-trip form): the numbers the page computed.
 */
function pageBatchOf(json: string): BatchResult {
  const j = JSON.parse(json) as Record<string, any>;
  const batch: BatchResult = {
    by: j.by, y: j.y, x: j.x, time: j.time, alternative: j.alternative, alpha: j.alpha, adjust: j.adjust, intercept: j.intercept, lag: j.lag,
    groups: j.groups.map(({ boundsZone, ...g }: Record<string, any>) => ({ ...g, zone: boundsZone })),
    summary: j.summary,
    notes: j.notes.map(({ text: _text, ...n }: Record<string, any>) => n),
  };
  expect(renderBatch(batch, 'json')).toBe(json); // nothing lost on the way back
  return batch;
}

/**
 * The downloads against the library. The browser's JavaScript engine is not Node's, and its
 * Math functions may differ in the last bit, so the exact probabilities (and their error bounds)
 * the page computes can differ from Node's in the last digits of a full-precision CSV. Checked:
 * (1) every download is byte for byte what src/batch/render.ts (the command line's renderer)
 * writes for the page's own result; (2) the CSV agrees with renderBatch of Node's run field by
 * field: text identical, n, k, d and the design identical, p-values within the error bound the
 * library states, error bounds to 1e-3 relative (an estimate of the error, not a value); (3) the Markdown and LaTeX tables, rounded as
 * shown, are byte for byte those of Node's run.
 */
async function expectDownloads(page: Page, lib: BatchResult): Promise<void> {
  const json = await download(page, '#save-batch-json');
  expect(json.name).toBe('exact-dw-batch.json');
  const mine = pageBatchOf(json.text);
  const csv = await download(page, '#save-batch-csv');
  expect(csv.name).toBe('exact-dw-batch.csv');
  expect(csv.text).toBe(renderBatch(mine, 'csv'));
  const md = await download(page, '#save-batch-markdown');
  expect(md.name).toBe('exact-dw-batch.md');
  expect(md.text).toBe(renderBatch(mine, 'markdown'));
  expect(md.text).toBe(renderBatch(lib, 'markdown'));
  const tex = await download(page, '#save-batch-latex');
  expect(tex.name).toBe('exact-dw-batch.tex');
  expect(tex.text).toBe(renderBatch(mine, 'latex'));
  expect(tex.text).toBe(renderBatch(lib, 'latex'));
  expect(tex.text).toContain('\\toprule');

  const ours = parseCsv(csv.text).rows;
  const node = parseCsv(renderBatch(lib, 'csv'));
  expect(parseCsv(csv.text).headers).toEqual(node.headers);
  expect(ours.length).toBe(node.rows.length);
  const col = (name: string) => node.headers.indexOf(name);
  for (const [i, row] of node.rows.entries()) {
    const bound = Number(row[col('error_bound')]);
    for (const [j, cellText] of row.entries()) {
      const name = node.headers[j];
      const shown = ours[i][j];
      if (cellText === '' || !['p_value', 'p_adjusted', 'error_bound'].includes(name)) {
        expect(shown, `${name} of ${row[0]}`).toBe(cellText);
      } else if (name === 'error_bound') {
        expect(Math.abs(Number(shown) / bound - 1), `${name} of ${row[0]}`).toBeLessThan(1e-3);
      } else {
        const factor = name === 'p_adjusted' ? lib.groups.filter((g) => g.pValue !== null).length : 1; // an adjusted p-value is at most m times one
        expect(Math.abs(Number(shown) - Number(cellText)), `${name} of ${row[0]}`).toBeLessThanOrEqual(2 * factor * bound);
      }
    }
  }
}

const DECISION_SHOWN = { reject: 'reject', 'not-rejected': 'not rejected', 'not-valid': 'd not valid' } as const;

/** Every group's row against the library: n, k, d, p-value, adjusted p-value, decision; a failed group's error. */
async function expectTable(page: Page, lib: BatchResult): Promise<void> {
  expect(await page.locator('#batch-table tbody tr').count()).toBe(lib.groups.length);
  for (const g of lib.groups) {
    const row = page.locator(`#batch-table tr[data-group="${g.group}"]`);
    expect(await row.locator('th[scope="row"]').textContent()).toBe(g.group);
    if (g.error) {
      expect(await row.getAttribute('data-code')).toBe(g.error.code);
      const text = await cell(page, g.group, 'error');
      expect(text).toContain(g.error.message);
      expect(text).toContain(g.error.hint);
      expect(await cell(page, g.group, 'decision')).toBe(`not tested (${g.error.code})`);
      expect(await row.locator('[data-field="d"]').count()).toBe(0);
      continue;
    }
    expect(await cell(page, g.group, 'n')).toBe(String(g.n));
    expect(await cell(page, g.group, 'k')).toBe(String(g.k));
    expectShown(await cell(page, g.group, 'd'), g.d!);
    expectShown(await cell(page, g.group, 'p-value'), g.pValue!);
    if (lib.adjust) expectShown(await cell(page, g.group, 'p-adjusted'), g.pAdjusted!);
    else expect(await row.locator('[data-field="p-adjusted"]').count()).toBe(0);
    expect(await cell(page, g.group, 'decision')).toBe(DECISION_SHOWN[g.decision!]);
  }
}

async function expectSummary(page: Page, lib: BatchResult): Promise<void> {
  const s = lib.summary;
  expect(await field(page, 'summary-groups')).toBe(String(s.groups));
  expect(await field(page, 'summary-tested')).toBe(String(s.tested));
  expect(await field(page, 'summary-failed')).toBe(String(s.failed));
  expect(await field(page, 'summary-rejected')).toBe(String(s.rejected));
  expect(await field(page, 'summary-not-valid')).toBe(String(s.notValid));
  expect(await field(page, 'summary-designs')).toBe(String(s.designs));
  const notes = page.locator('#batch-notes li');
  expect(await notes.count()).toBe(lib.notes.length);
  for (const [i, n] of lib.notes.entries()) {
    expect(await notes.nth(i).getAttribute('data-code')).toBe(n.code);
    expect(await notes.nth(i).textContent()).toBe(inline(noteText(n), 'text'));
  }
  expect(await page.locator('#batch-cautions').textContent()).toBe(inline(BATCH_ASSUMPTIONS, 'text'));
}

// ------------------------------------------------------------------ the tests

describe('the page tests each group of a stacked file separately', () => {
  it('the data make the cases wanted: rejections and not, one short group, one rank-deficient group', () => {
    const lib = libraryBatch({});
    expect(lib.groups.map((g) => g.group)).toEqual(STATIONS.map((s) => s.name));
    expect(lib.time).toBe('year'); // by the time-index rule, group by group
    expect(lib.summary.failed).toBe(2);
    expect(lib.summary.rejected).toBeGreaterThan(0);
    expect(lib.summary.tested - lib.summary.rejected).toBeGreaterThan(0);
    const failed = lib.groups.filter((g) => g.error).map((g) => [g.group, g.error!.code]);
    expect(failed).toEqual([['Eskby', 'TOO_FEW_ROWS'], ['Fallow Hill', 'RANK_DEFICIENT']]);
    // Holm and BH must differ from the raw p-values to be a check
    const holm = libraryBatch({ adjust: 'holm' });
    const bh = libraryBatch({ adjust: 'bh' });
    expect(holm.groups.some((g, i) => g.pAdjusted !== null && g.pAdjusted !== bh.groups[i].pAdjusted)).toBe(true);
  });

  it('without a grouping column the batch controls are hidden; with one, the adjustment appears and the options a batch lacks say why they are off', async () => {
    const page = await openWithStations();
    expect(await page.locator('#by').inputValue()).toBe('');
    expect(await page.locator('#by option[value="station"]').textContent()).toBe('station (6 groups)');
    expect(await page.locator('#adjust-field').isHidden()).toBe(true);
    expect(await page.locator('#drop-missing').isEnabled()).toBe(true);
    await page.selectOption('#by', 'station');
    expect(await page.locator('#adjust-field').isVisible()).toBe(true);
    // rows with missing values can be dropped in each group too
    expect(await page.locator('#drop-missing').isEnabled()).toBe(true);
    expect(await page.locator('#rho').isDisabled()).toBe(true);
    expect(await page.locator('#rho-off').isVisible()).toBe(true);
    // the grouping column cannot also be y, a regressor or the time column
    expect(await page.locator('input[name="y"][value="station"]').isDisabled()).toBe(true);
    expect(await page.locator('input[name="x"][value="station"]').isDisabled()).toBe(true);
    // the time column: the time-index rule within each group by default
    expect(await page.locator('#time option:checked').getAttribute('data-role')).toBe('rule');
    expect(await page.locator('#time-batch-note').isVisible()).toBe(true);
    expect(await page.locator('#compute').textContent()).toMatch(/every group/);
    await page.close();
  });

  it('unadjusted, time by the rule: every group as the library has it, the notes in words, progress per group, the CSV, Markdown and LaTeX bytes of the command line', async () => {
    const page = await openWithStations();
    await page.selectOption('#by', 'station');
    await page.check('input[name="alternative"][value="positive"]');
    await page.fill('#alpha', '0.05');
    // record the progress lines the worker sends (set even when the box is not yet shown)
    await page.evaluate(() => {
      const seen: string[] = [];
      (window as unknown as { progressSeen: string[] }).progressSeen = seen;
      const node = document.getElementById('progress-text')!;
      new MutationObserver(() => seen.push(node.textContent ?? '')).observe(node, { childList: true, characterData: true, subtree: true });
    });
    await compute(page);
    expect(await page.locator('#result-error').isHidden()).toBe(true);
    const lib = libraryBatch({ alternative: 'positive', alpha: 0.05 });
    await expectTable(page, lib);
    await expectSummary(page, lib);
    expect(lib.notes.map((n) => n.code).sort()).toEqual(['BATCH_GROUPS_FAILED', 'BATCH_TIME_DETECTED']);
    expect(await page.locator('#batch-table th[scope="col"]').allTextContents()).toEqual(['group', 'n', 'k', 'd', 'p-value', 'decision']);
    expect(await page.locator('#batch-table caption').textContent()).toMatch(/6 groups of station/);
    const seen = await page.evaluate(() => (window as unknown as { progressSeen: string[] }).progressSeen);
    expect(seen).toContain('Testing the groups: 6 of 6 done\u2026');

    await expectDownloads(page, lib);
    await page.close();
  });

  it('Holm and Benjamini-Hochberg: the adjusted p-values and the decisions on them, with the time column named', async () => {
    const page = await openWithStations();
    await page.selectOption('#by', 'station');
    await page.selectOption('#time', 'year');
    await page.check('input[name="alternative"][value="two-sided"]');
    await page.fill('#alpha', '0.10');
    for (const adjust of ['holm', 'bh'] as const) {
      await page.selectOption('#adjust', adjust);
      await compute(page);
      expect(await page.locator('#result-error').isHidden()).toBe(true);
      const lib = libraryBatch({ time: 'year', adjust, alternative: 'two-sided', alpha: 0.1 });
      expect(lib.notes.map((n) => n.code)).toContain('BATCH_ADJUSTED');
      await expectTable(page, lib);
      await expectSummary(page, lib);
      expect(await page.locator('#batch-table th[scope="col"]').nth(5).textContent())
        .toBe(`adjusted p-value (${adjust === 'holm' ? 'Holm' : 'Benjamini-Hochberg'})`);
      await expectDownloads(page, lib);
    }
    await page.close();
  });

  it('a cell that is not a number fails its own group with the row named; a bad level is the library error in words, not a stack trace', async () => {
    const broken = CSV.replace(/^(Brackwater,2010,)[^,]+,/m, '$1NA,');
    expect(broken).not.toBe(CSV);
    const page = await openWithStations(broken);
    await page.selectOption('#by', 'station');
    await compute(page);
    const lib = exactDwBatch({ table: parseCsv(broken, { source: SOURCE }), by: 'station', y: 'rain_mm', x: REGRESSORS });
    const g = lib.groups.find((x) => x.group === 'Brackwater')!;
    expect(g.error?.message).toMatch(/data row \d+/);
    await expectTable(page, lib);
    await expectDownloads(page, lib);

    // a level outside (0, 1): the whole batch is refused with the library's message and hint
    await page.fill('#alpha', '1.5');
    await compute(page);
    let thrown: unknown = null;
    try { exactDwBatch({ table: parseCsv(broken, { source: SOURCE }), by: 'station', y: 'rain_mm', x: REGRESSORS, alpha: 1.5 }); } catch (err) { thrown = err; }
    expect(thrown).toBeInstanceOf(Error);
    const err = page.locator('#result-error');
    expect(await err.isVisible()).toBe(true);
    expect(await err.locator('.error-message').textContent()).toBe((thrown as Error).message);
    expect(await page.locator('#result-body').isHidden()).toBe(true);
    expect((await err.textContent()) ?? '').not.toMatch(/DwError|Error:|\bat \S+:\d+:\d+|\.ts\b|\.js\b/);
    await page.close();
  });

  it('dropping rows with missing values in each group: the rows listed in the table, and every group as the library has it', async () => {
    // Brackwater loses its 2010 rain (NA) and Dunmere its 2012 temperature (empty)
    const holed = CSV.replace(/^(Brackwater,2010,)[^,]+,/m, '$1NA,').replace(/^(Dunmere,2012,[^,]+,)[^,]+,/m, '$1,');
    expect(holed).not.toBe(CSV);
    const page = await openWithStations(holed);
    await page.selectOption('#by', 'station');
    await page.selectOption('#time', 'year');
    await page.check('#drop-missing');
    await compute(page);
    expect(await page.locator('#result-error').isHidden()).toBe(true);
    const lib = exactDwBatch({ table: parseCsv(holed, { source: SOURCE }), by: 'station', y: 'rain_mm', x: REGRESSORS, time: 'year', dropMissing: true });
    const rowOf = (station: string, year: number) => holed.trimEnd().split('\n').findIndex((l) => l.startsWith(`${station},${year},`));
    expect(lib.groups.find((g) => g.group === 'Brackwater')!.droppedRows).toEqual({ count: 1, rows: [rowOf('Brackwater', 2010)] });
    expect(lib.notes.map((n) => n.code)).toContain('BATCH_ROWS_DROPPED');
    await expectTable(page, lib);
    await expectSummary(page, lib);
    expect(await cell(page, 'Brackwater', 'rows-dropped')).toBe(String(rowOf('Brackwater', 2010)));
    expect(await cell(page, 'Dunmere', 'rows-dropped')).toBe(String(rowOf('Dunmere', 2012)));
    expect(await cell(page, 'Aberford', 'rows-dropped')).toBe('\u2014');
    await expectDownloads(page, lib);
    await page.close();
  });

  it('setting the grouping back to none gives the single test of all rows again, with its controls', async () => {
    const page = await openWithStations();
    const timeBefore = await page.locator('#time').inputValue();
    await page.selectOption('#by', 'station');
    await page.selectOption('#adjust', 'holm');
    await compute(page);
    expect(await page.locator('#batch-table').isVisible()).toBe(true);
    await page.selectOption('#by', '');
    expect(await page.locator('#adjust-field').isHidden()).toBe(true);
    expect(await page.locator('#drop-missing').isEnabled()).toBe(true);
    expect(await page.locator('#rho').isEnabled()).toBe(true);
    expect(await page.locator('#time-batch-note').isHidden()).toBe(true);
    expect(await page.locator('#time').inputValue()).toBe(timeBefore);
    expect(await page.locator('#time option[data-role="rule"]').count()).toBe(0);
    expect(await page.locator('input[name="y"][value="station"]').isDisabled()).toBe(false);
    await compute(page);
    expect(await page.locator('#result-error').isHidden()).toBe(true);
    expect(await page.locator('#batch-table').count()).toBe(0);
    expect(await page.locator('#verdict').isVisible()).toBe(true);
    const table = parseCsv(CSV, { source: SOURCE });
    const lib = exactDwTest({ y: numericColumn(table, 'rain_mm'), x: Object.fromEntries(REGRESSORS.map((c) => [c, numericColumn(table, c)])), timeColumn: false });
    expect(await field(page, 'n')).toBe(String(lib.n));
    expectShown(await field(page, 'd'), lib.d);
    expectShown(await field(page, 'p-value'), lib.pValue);
    await page.close();
  });

  it('made no network request beyond its own origin, and met no policy violation or script error', () => {
    const own = new URL(rig.served.url).origin;
    const outside = rig.requests.filter((u) => !(u.startsWith(own + '/') || u.startsWith(`blob:${own}/`) || u.startsWith('data:')));
    expect(rig.requests.length).toBeGreaterThan(0);
    expect(outside).toEqual([]);
    expect(rig.problems).toEqual([]);
  });
});
