/**
 * End-to-end tests of the offline page (src/web) in headless Chromium: Debian's `chromium` when it
 * is installed, else the binary shipped inside the npm dev dependency @sparticuz/chromium
 * (test/helpers/browser.ts; `EXACT_DW_BROWSER=bundled` forces it), driven by playwright-core (which
 * never downloads a browser of its own). The page is built with Vite into
 * a temporary folder, served by the project's own static server (src/web/serve.mjs) on 127.0.0.1
 * with an ephemeral port, and also opened from file://. Every number the page shows is compared
 * with the library's JSON (exactDwTest on the same data, run here in Node) to the precision shown.
 * One browser for the whole file; no test reads the clock.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build } from 'vite';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { resolveInside, startServer, type ServedPage } from '../../src/web/serve.mjs';
import { capabilities } from '../../src/web/adapter.js';
import { parseCsv, numericColumn } from '../../src/data/csv.js';
import { exactDwTest, type DwTestInput, type DwTestResult } from '../../src/inference/dw-test.js';
import { DwError } from '../../src/errors.js';
import { formatBound, formatProbability, formatStatistic } from '../../src/web/format.js';
import { guessColumns, summarizeColumns } from '../../src/web/columns.js';
import { pageHint, plainError } from '../../src/web/plain-error.js';
import { chromiumPath } from '../helpers/browser.js';
import { FLAGS, expectShown } from '../helpers/page.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const demoCsv = readFileSync(join(root, 'docs', 'demo', 'apiary.csv'), 'utf8');

let out = '';
let profile = '';
let served: ServedPage | null = null;
let context: BrowserContext | null = null;
/** Every URL any page of the browser asked for, and every console error or page error. */
const requests: string[] = [];
const problems: string[] = [];

beforeAll(async () => {
  const browser = await chromiumPath();
  out = mkdtempSync(join(tmpdir(), 'exact-dw-page-'));
  profile = mkdtempSync(join(tmpdir(), 'exact-dw-chromium-'));
  await build({ configFile: join(root, 'src', 'web', 'vite.config.ts'), logLevel: 'silent', build: { outDir: out, emptyOutDir: true } });
  served = await startServer({ root: out, port: 0 });
  context = await chromium.launchPersistentContext(profile, {
    executablePath: browser.path,
    ...(browser.env ? { env: browser.env } : {}),
    headless: true,
    args: FLAGS,
    viewport: { width: 1100, height: 900 },
    permissions: ['clipboard-read', 'clipboard-write'],
  });
  context.on('request', (r) => { requests.push(r.url()); });
  context.on('console', (m) => { if (m.type() === 'error' || /Content.Security.Policy/i.test(m.text())) problems.push(m.text()); });
  context.on('weberror', (e) => { problems.push(e.error().message); });
});

afterAll(async () => {
  await context?.close();
  await served?.close();
  for (const dir of [out, profile]) if (dir) rmSync(dir, { recursive: true, force: true });
});

// ------------------------------------------------------------------ helpers

async function open(url = served!.url): Promise<Page> {
  const page = await context!.newPage();
  await page.goto(url);
  return page;
}

async function loadDemo(page: Page): Promise<void> {
  await page.click('#demo');
  await page.locator('#model-step').waitFor({ state: 'visible' });
}

/** Press the compute button and wait until the page is no longer busy with it. */
async function compute(page: Page): Promise<void> {
  await page.click('#compute');
  await page.locator('#results[aria-busy="false"]').waitFor({ state: 'attached', timeout: 60_000 });
}

async function field(page: Page, name: string): Promise<string> {
  return (await page.locator(`[data-field="${name}"]`).first().textContent())?.trim() ?? '';
}

/** The library's result as JSON (what `exact-dw test --format json` prints), for the demo data. */
function libraryJson(input: Omit<Partial<DwTestInput>, 'x' | 'time'> & { x: string[]; time?: string }): DwTestResult {
  const table = parseCsv(demoCsv);
  const x = Object.fromEntries(input.x.map((c) => [c, numericColumn(table, c)]));
  const times = input.time ? numericColumn(table, input.time) : undefined;
  const { time: _time, ...rest } = input;
  const result = exactDwTest({ ...rest, y: numericColumn(table, 'yield_kg'), x, times });
  return JSON.parse(JSON.stringify(result)) as DwTestResult;
}

const activeId = (page: Page): Promise<string> => page.evaluate(() => document.activeElement?.id ?? '');
const activeValue = (page: Page): Promise<string> => page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.value ?? '');

/** Press Tab until `done` holds (at most `limit` presses); true when it did. */
async function tabUntil(page: Page, done: () => Promise<boolean>, limit = 60): Promise<boolean> {
  for (let i = 0; i < limit; i++) {
    if (await done()) return true;
    await page.keyboard.press('Tab');
  }
  return done();
}

// ------------------------------------------------------------------ the tests

describe('the offline page in headless Chromium', () => {
  it('is one self-contained file with a strict Content-Security-Policy (no inline allowance, no connections)', () => {
    const html = readFileSync(join(out, 'index.html'), 'utf8');
    const csp = /<meta http-equiv="Content-Security-Policy" content="([^"]+)">/.exec(html)?.[1] ?? '';
    const directives = new Map(csp.split(';').map((d) => d.trim().split(/\s+/)).map(([k, ...v]) => [k, v]));
    expect(directives.get('default-src')).toEqual(["'none'"]);
    expect(directives.get('connect-src')).toEqual(["'none'"]);
    expect(directives.get('script-src')!.length).toBeGreaterThan(0);
    for (const s of directives.get('script-src')!) expect(s).toMatch(/^'sha256-[A-Za-z0-9+/]+=*'$/);
    for (const s of directives.get('style-src')!) expect(s).toMatch(/^'sha256-[A-Za-z0-9+/]+=*'$/);
    expect(directives.get('worker-src')).toEqual(['blob:']);
    expect(csp).not.toMatch(/unsafe|\*|https?:/);
    expect(html).not.toMatch(/\b(?:src|href)="(?!data:|blob:|#)/);
  });

  it('demo data, columns picked by hand: d, the p-values and the critical values equal the library JSON to the shown precision', async () => {
    const page = await open();
    await loadDemo(page);
    await page.check('input[name="y"][value="yield_kg"]');
    await page.selectOption('#time', 'year');
    await page.check('input[name="x"][value="spring_rain_mm"]');
    await page.check('input[name="x"][value="june_temp_c"]');
    await page.check('input[name="alternative"][value="positive"]');
    await page.fill('#alpha', '0.05');
    await compute(page);
    expect(await page.locator('#result-error').isHidden()).toBe(true);
    const lib = libraryJson({ x: ['spring_rain_mm', 'june_temp_c'], time: 'year', alternative: 'positive', alpha: 0.05 });
    expectShown(await field(page, 'p-value'), lib.pValue);
    expectShown(await field(page, 'p-positive'), lib.pPositive);
    expectShown(await field(page, 'p-negative'), lib.pNegative);
    expectShown(await field(page, 'p-two-sided'), lib.pTwoSided);
    expectShown(await field(page, 'd'), lib.d);
    expectShown(await field(page, 'critical-lower'), lib.critical.lower);
    expectShown(await field(page, 'critical-upper'), lib.critical.upper);
    expect(await field(page, 'n')).toBe(String(lib.n));
    expect(await field(page, 'k')).toBe(String(lib.k));
    if (lib.bounds) {
      expectShown(await field(page, 'dL'), lib.bounds.dL);
      expectShown(await field(page, 'dU'), lib.bounds.dU);
      expect(await page.locator('[data-field="zone"]').getAttribute('data-zone')).toBe(lib.bounds.zone);
    }
    await page.close();
  });

  it('other choices reach the library: one regressor, two-sided at 0.10, power at rho = 0.4', async () => {
    const page = await open();
    await loadDemo(page);
    await page.uncheck('input[name="x"][value="june_temp_c"]');
    await page.check('input[name="alternative"][value="two-sided"]');
    await page.fill('#alpha', '0.10');
    if (capabilities.power) await page.fill('#rho', '0.4');
    await compute(page);
    const lib = libraryJson({ x: ['spring_rain_mm'], time: 'year', alternative: 'two-sided', alpha: 0.1 });
    expect(await field(page, 'k')).toBe('2');
    expectShown(await field(page, 'p-value'), lib.pTwoSided);
    expectShown(await field(page, 'critical-lower'), lib.critical.lower);
    expectShown(await field(page, 'critical-upper'), lib.critical.upper);
    if (capabilities.power) {
      const { exactPower } = await import('../../src/power/exact-power.js');
      const table = parseCsv(demoCsv);
      const power = exactPower({ x: { spring_rain_mm: numericColumn(table, 'spring_rain_mm') }, times: numericColumn(table, 'year'),
        rho: [0.4], alpha: 0.1, alternative: 'two-sided' });
      expectShown(await field(page, 'power'), power.curve[0].power);
      // a rho outside (-1, 1): the power panel shows the library's error; the test result stays
      await page.fill('#rho', '1.5');
      await compute(page);
      expect(await page.locator('#power-panel .error').textContent()).toMatch(/rho = 1\.5 is outside the open interval \(-1, 1\)/);
      expectShown(await field(page, 'p-value'), lib.pTwoSided);
    } else {
      expect(await page.locator('#rho-field').isHidden()).toBe(true);
    }
    await page.close();
  });

  it('the figure renders as an SVG with a path; the paragraph is shown and copies to the clipboard', async () => {
    const page = await open();
    await loadDemo(page);
    await compute(page);
    if (capabilities.figure) {
      expect(await page.locator('#figure svg path').count()).toBeGreaterThan(0);
      const box = await page.locator('#figure svg').boundingBox();
      expect(box!.width).toBeGreaterThan(200);
      expect(box!.height).toBeGreaterThan(100);
    } else {
      expect(await field(page, 'figure')).toMatch(/not part of this build/);
    }
    if (capabilities.paragraph) {
      const text = (await page.locator('#paragraph').textContent()) ?? '';
      expect(text).toMatch(/n = 24/);
      await page.click('#copy-paragraph');
      await page.locator('#paragraph-panel [role="status"]', { hasText: 'Copied to the clipboard.' }).waitFor();
      const copied = await page.evaluate(() => navigator.clipboard.readText());
      expect(copied.trim()).toBe(text.trim());
      await page.check('input[name="paragraph-format"][value="latex"]');
      expect(await page.locator('#paragraph').textContent()).toMatch(/\\cite\{/);
    } else {
      expect(await field(page, 'paragraph')).toMatch(/not part of this build/);
    }
    await page.close();
  });

  it('a malformed CSV shows the library message and hint inline, in plain words and without a stack trace', async () => {
    const page = await open();
    await page.fill('#paste', 'year,y,x\n2001,1.5,3\n2002,1.7\n2003,1.9,5\n');
    await page.click('#use-paste');
    const box = page.locator('#data-error');
    await box.waitFor({ state: 'visible' });
    const text = (await box.textContent()) ?? '';
    expect(text).toMatch(/Data row 2 of the pasted text has 2 fields; the header has 3\./);
    expect(text).toMatch(/Make every row have 3 fields/);
    expect(text).not.toMatch(/DwError|Error:|\bat \S+:\d+:\d+|\.ts\b|\.js\b/);
    expect(await page.locator('#model-step').isHidden()).toBe(true);

    // a text cell in a chosen column: the error names the row and the column
    await page.fill('#paste', 'year,y,x\n2001,1.5,3\n2002,abc,4\n2003,1.9,5\n2004,2.2,4\n2005,2.0,6\n');
    await page.click('#use-paste');
    await page.locator('#model-step').waitFor({ state: 'visible' });
    expect(await box.isHidden()).toBe(true);
    await page.check('input[name="y"][value="y"]');
    await page.check('input[name="x"][value="x"]');
    await compute(page);
    const err = page.locator('#result-error');
    expect(await err.isVisible()).toBe(true);
    expect(await err.textContent()).toMatch(/'abc' at data row 2, column 'y' of the pasted text is not a number\./);
    expect(await page.locator('#result-body').isHidden()).toBe(true);
    await page.close();
  });

  it('loads a file from the file picker and from a drop', async () => {
    const page = await open();
    await page.setInputFiles('#file', { name: 'hives.csv', mimeType: 'text/csv', buffer: Buffer.from(demoCsv) });
    await page.locator('#data-status', { hasText: /^'hives\.csv': 24 rows and 4 columns/ }).waitFor();
    await page.evaluate(() => {
      const transfer = new DataTransfer();
      transfer.items.add(new File(['t;y;x\n1;1,5;3\n2;1,7;4\n3;1,6;6\n4;2,1;5\n5;2,0;7\n'], 'dropped.csv', { type: 'text/csv' }));
      const target = document.getElementById('drop')!;
      target.dispatchEvent(new DragEvent('dragover', { dataTransfer: transfer, bubbles: true, cancelable: true }));
      target.dispatchEvent(new DragEvent('drop', { dataTransfer: transfer, bubbles: true, cancelable: true }));
    });
    await page.locator('#data-status', { hasText: /^'dropped\.csv': 5 rows and 3 columns, semicolon-separated, decimal comma\./ }).waitFor();
    await page.close();
  });

  it('quarter labels: the time index chosen by the library rule, dropped rows listed, the SHA-256 of the file in the report', async () => {
    const quarters = ['2017Q1', '2017Q2', '2017Q3', '2018Q1', '2018Q2', '2018Q3', '2018Q4', '2019Q1', '2019Q2', '2019Q4', '2020Q1', '2020Q2', '2020Q3', '2020Q4', '2021Q1', '2021Q2'];
    const csv = 'quarter,sales,price\n' + quarters.map((q, i) => `${q},${i === 5 ? 'NA' : (10 + Math.sin(i) + 0.2 * i).toFixed(3)},${(2 + Math.cos(1.3 * i)).toFixed(3)}`).join('\n') + '\n';
    const page = await open();
    await page.setInputFiles('#file', { name: 'quarters.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await page.locator('#model-step').waitFor({ state: 'visible' });
    const table = parseCsv(csv);
    expect(guessColumns(table, summarizeColumns(table)).time).toBe('quarter');
    expect(await page.locator('#time').inputValue()).toBe('quarter'); // the same choice as the command line and the API
    await page.check('#drop-missing');
    await page.fill('#lag', '4');
    await compute(page);
    expect(await page.locator('#result-error').isHidden()).toBe(true);
    expect(await field(page, 'time-index')).toMatch(/quarter \(quarter labels, quarterly; detected by the time-index rule\), 2017Q1 to 2021Q2, 3 periods missing/);
    expect(await field(page, 'dropped-rows')).toBe('1');
    const lib = exactDwTest({
      y: numericColumn(table, 'sales', { missingAsNaN: true }), x: { price: numericColumn(table, 'price') },
      time: { labels: quarters, name: 'quarter' }, lag: 4, dropMissing: true,
    });
    expectShown(await field(page, 'd'), lib.d);
    expectShown(await field(page, 'p-value'), lib.pValue);
    const digest = createHash('sha256').update(csv).digest('hex');
    expect(await page.locator('#text-report').textContent()).toContain(digest);
    expect(await page.locator('ul.warnings li[data-code="ROWS_DROPPED"]').count()).toBe(1);
    await page.close();
  });

  it('dates with a frequency chosen on the page: the same numbers as the library with that frequency', async () => {
    // quarter-end dates with one quarter missing: inferred quarterly; chosen here as monthly, with lag 3
    const dates = ['2019-03-31', '2019-06-30', '2019-09-30', '2019-12-31', '2020-03-31', '2020-06-30', '2020-12-31',
      '2021-03-31', '2021-06-30', '2021-09-30', '2021-12-31', '2022-03-31', '2022-06-30', '2022-09-30'];
    const csv = 'date,sales,price\n' + dates.map((d, i) => `${d},${(5 + Math.cos(0.9 * i) + 0.1 * i).toFixed(3)},${(1 + Math.sin(1.7 * i)).toFixed(3)}`).join('\n') + '\n';
    const page = await open();
    await page.setInputFiles('#file', { name: 'dates.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await page.locator('#model-step').waitFor({ state: 'visible' });
    expect(await page.locator('#time').inputValue()).toBe('date');
    await page.fill('#lag', '3');
    await page.selectOption('#frequency', 'monthly');
    await compute(page);
    expect(await page.locator('#result-error').isHidden()).toBe(true);
    expect(await field(page, 'time-index')).toMatch(/monthly, as given/);
    const table = parseCsv(csv);
    const y = numericColumn(table, 'sales');
    const x = { price: numericColumn(table, 'price') };
    const lib = exactDwTest({ y, x, time: { labels: dates, name: 'date', frequency: 'monthly' }, lag: 3 });
    const inferred = exactDwTest({ y, x, time: { labels: dates, name: 'date' } });
    expect(inferred.timeColumn?.frequency).toBe('quarterly');
    // three months apart at lag 3 are the consecutive quarters: the same pairs, the same d
    expect(lib.d).toBeCloseTo(inferred.d, 14);
    expectShown(await field(page, 'd'), lib.d);
    expectShown(await field(page, 'p-value'), lib.pValue);
    await page.close();
  });

  it('with a lagged dependent variable the page shows no p-value, critical value or bounds of d', async () => {
    const n = 20;
    const y: number[] = [];
    for (let i = 0; i < n; i++) y.push(+(5 + 0.6 * (y[i - 1] ?? 5) + Math.sin(1.7 * i)).toFixed(4));
    const csv = 'year,y,ylag,x\n' + y.slice(1).map((v, i) => `${2001 + i},${v},${y[i]},${(Math.cos(i)).toFixed(3)}`).join('\n') + '\n';
    const page = await open();
    await page.fill('#paste', csv);
    await page.click('#use-paste');
    await page.locator('#model-step').waitFor({ state: 'visible' });
    await page.check('input[name="y"][value="y"]');
    await compute(page);
    expect(await page.locator('#verdict').getAttribute('class')).toMatch(/invalid/);
    expect(await page.locator('#dynamic-panel').isVisible()).toBe(true);
    for (const f of ['p-value', 'p-positive', 'critical-lower', 'dL', 'zone', 'null-mean']) expect(await page.locator(`[data-field="${f}"]`).count(), f).toBe(0);
    expect(await page.locator('#bounds-panel').count()).toBe(0);
    expect(await page.locator('#d-not-valid').isVisible()).toBe(true);
    expect(await page.locator('#dynamic-panel').textContent()).toMatch(/Durbin's alternative test/);
    await page.close();
  });

  it('sets d_L, d_U as subscripts and <=, >= as the signs', async () => {
    const page = await open();
    await loadDemo(page);
    await compute(page);
    const panel = page.locator('#bounds-panel');
    expect(await panel.locator('sub').count()).toBeGreaterThanOrEqual(2);
    const text = (await panel.textContent()) ?? '';
    expect(text).not.toMatch(/d_L|d_U|<=|>=/);
    expect(text).toMatch(/≤|≥/);
    await page.close();
  });

  it('works from the keyboard alone: Tab to the controls, Enter and Space to act, the results reachable', async () => {
    const page = await open();
    expect(await tabUntil(page, async () => (await activeId(page)) === 'demo')).toBe(true);
    await page.keyboard.press('Enter');
    await page.locator('#model-step').waitFor({ state: 'visible' });
    expect(await activeId(page)).toBe('model-title');
    const june = page.locator('input[name="x"][value="june_temp_c"]');
    expect(await tabUntil(page, async () => (await activeValue(page)) === 'june_temp_c')).toBe(true);
    expect(await june.isChecked()).toBe(true);
    await page.keyboard.press('Space');
    expect(await june.isChecked()).toBe(false);
    await page.keyboard.press('Space');
    expect(await june.isChecked()).toBe(true);
    expect(await tabUntil(page, async () => (await activeId(page)) === 'compute')).toBe(true);
    await page.keyboard.press('Enter');
    await page.locator('#results[aria-busy="false"]').waitFor({ state: 'attached' });
    expect(await page.locator('#verdict').isVisible()).toBe(true);
    expect(await activeId(page)).toBe('results-title');
    expect(await tabUntil(page, async () => (await activeId(page)) === 'copy-text')).toBe(true);
    await page.close();
  });

  it('every input, select and text area has an associated label, and every button a name', async () => {
    const page = await open();
    await loadDemo(page);
    await compute(page);
    const unlabelled = await page.evaluate(() => {
      const bad: string[] = [];
      for (const el of Array.from(document.querySelectorAll<HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement>('input, select, textarea'))) {
        if (el.getAttribute('aria-hidden') === 'true' || (el as HTMLInputElement).type === 'hidden') continue;
        const text = Array.from(el.labels ?? []).map((l) => l.textContent?.trim() ?? '').join(' ');
        if (text === '') bad.push(el.outerHTML.slice(0, 80));
      }
      for (const b of Array.from(document.querySelectorAll('button'))) if ((b.textContent ?? '').trim() === '') bad.push(b.outerHTML.slice(0, 80));
      return bad;
    });
    expect(unlabelled).toEqual([]);
    expect(await page.locator('input').count()).toBeGreaterThan(10);
    await page.close();
  });

  it('the file:// build loads and computes the same p-value', async () => {
    const page = await open(pathToFileURL(join(out, 'index.html')).href);
    await loadDemo(page);
    await compute(page);
    const lib = libraryJson({ x: ['spring_rain_mm', 'june_temp_c'], time: 'year' });
    expectShown(await field(page, 'p-value'), lib.pValue);
    await page.close();
  });

  it('made no network request beyond its own origin, and met no policy violation or script error', () => {
    const own = new URL(served!.url).origin;
    const fileUrl = pathToFileURL(join(out, 'index.html')).href;
    const outside = requests.filter((u) => !(u.startsWith(own + '/') || u.startsWith(`blob:${own}/`) || u === fileUrl
      || u.startsWith('blob:null/') || u.startsWith('data:')));
    expect(requests.length).toBeGreaterThan(0);
    expect(outside).toEqual([]);
    // the computation ran in the worker, which the page starts from a blob: URL of its own script
    expect(requests.some((u) => u.startsWith('blob:'))).toBe(true);
    expect(problems).toEqual([]);
  });

  it('the static server keeps to its folder', async () => {
    expect(resolveInside('/srv/site', '/../etc/passwd')).toBeNull();
    expect(resolveInside('/srv/site', '/%2e%2e/etc/passwd')).toBeNull();
    expect(resolveInside('/srv/site', '/index.html')).toBe('/srv/site/index.html');
    const res = await fetch(new URL('/..%2fpackage.json', served!.url));
    expect(res.status).toBe(404);
  });
});

describe('the page helpers (plain functions, no browser)', () => {
  it('formats: probabilities keep 4 decimals, then 3 significant digits; error bounds round up', () => {
    expect(formatProbability(0.0386154)).toBe('0.0386');
    expect(formatProbability(0.00012)).toBe('0.0001');
    expect(formatProbability(3.4567e-7)).toBe('3.46e-7');
    expect(formatProbability(0)).toBe('0');
    expect(formatStatistic(1.31476)).toBe('1.3148');
    expect(formatBound(1.4e-11)).toBe('2e-11');
    expect(formatBound(1e-11)).toBe('1e-11');
    expect(formatBound(9.6e-9)).toBe('1e-8');
  });

  it('guesses the time column, y and the regressors as the command line does (every other numeric column)', () => {
    const demoTable = parseCsv(demoCsv);
    const demo = summarizeColumns(demoTable);
    expect(guessColumns(demoTable, demo)).toEqual({ time: 'year', y: 'yield_kg', x: ['spring_rain_mm', 'june_temp_c'] });
    const table = parseCsv('t,label,sales,price\n1,a,3.5,2\n2,b,3.9,2.5\n3,c,4.1,2.25\n');
    const cols = summarizeColumns(table);
    expect(cols.map((c) => [c.name, c.numeric, c.timeLike])).toEqual([['t', true, true], ['label', false, false], ['sales', true, false], ['price', true, false]]);
    // 't' is not a time-like name: by the time-index rule it stays a regressor (a trend)
    expect(guessColumns(table, cols)).toEqual({ time: null, y: 'sales', x: ['t', 'price'] });
    // a stacked file: year increases within each station, not over the file; it is neither y nor a
    // regressor (the batch's time-index rule, group by group), and 'idx', not a time-like name, stays a regressor
    const stacked = parseCsv('station,year,idx,rain,temp\nA,2001,1,500,8.1\nA,2002,2,520,8.4\nA,2003,3,480,7.9\nB,2001,4,610,9.2\nB,2002,5,590,9.0\nB,2003,6,640,9.6\n');
    expect(guessColumns(stacked, summarizeColumns(stacked))).toEqual({ time: null, y: 'rain', x: ['idx', 'temp'] });
  });

  it('names the settings a library error suggests as the page controls, and hides internals of other errors', () => {
    expect(pageHint("This looks like a decimal comma: read the file with decimal 'comma'.", [{ option: 'decimal', value: 'comma' }]))
      .toBe('This looks like a decimal comma: read the file with decimal \'comma\'. On this page: "Decimal mark: comma" under "How to read the file".');
    expect(pageHint('Name the time column.', [{ option: 'time' }])).toBe('Name the time column. On this page: the "Time column" choice.');
    expect(pageHint('x', [{ option: 'method', value: 'imhof' }, { option: 'method', value: 'pan' }]))
      .toBe('x On this page: the engine "imhof" under "Numerical engine" or the engine "pan" under "Numerical engine".');
    // a real library error carries its suggestion through to the page
    let thrown: unknown;
    try { numericColumn(parseCsv('y,x\n"1,5",2\n"2,5",3\n'), 'y'); } catch (err) { thrown = err; }
    const viaPage = plainError(thrown);
    expect(viaPage.code).toBe('CELL_NOT_NUMERIC');
    expect(viaPage.hint).toContain('On this page: "Decimal mark: comma"');
    expect(viaPage.hint).not.toMatch(/--[a-z]/);
    const e = plainError(new DwError('CSV_EMPTY', 'The pasted text is empty.', 'Paste a header row and data.'));
    expect(e).toEqual({ code: 'CSV_EMPTY', message: 'The pasted text is empty.', hint: 'Paste a header row and data.' });
    const internal = plainError(new TypeError('x is undefined\n    at f (worker.js:1:2)'));
    expect(internal.code).toBe('INTERNAL');
    expect(internal.message).toBe('The computation stopped on an unexpected problem: x is undefined.');
  });
});
