/**
 * The page's computing worker: reads the CSV, runs the library's exact test and asks the adapter
 * for the report parts, off the main thread so that the page stays responsive. It reports the
 * stage it is in before each step; the page shows that as progress and may end the worker to
 * cancel. With a grouping column it runs the library's batch (one exact test per group) instead,
 * reporting the groups done as they finish, and renders the batch table in the formats the
 * command line writes.
 */
import { parseCsv, numericColumn, textColumn, type CsvOptions, type DataTable } from '../data/csv.js';
import type { DwTestInput } from '../inference/dw-test.js';
import type { BatchInput } from '../batch/batch.js';
import { batchDownloads, figureSvg, markdownReport, paragraphFor, powerAt, runBatch, runTest, textReport, type ReportExtras } from './adapter.js';
import { guessColumns, summarizeColumns } from './columns.js';
import { plainError } from './plain-error.js';
import type { DataSource, ModelChoice, OptionalPart, PlainError, Reply, Request, TableSummary } from './protocol.js';

const scope = self as unknown as DedicatedWorkerGlobalScope;

function post(reply: Reply): void {
  scope.postMessage(reply);
}

/** The last table read, kept so that changing the model does not read the file again. */
let cache: { key: string; table: DataTable } | null = null;

function readTable(data: DataSource): DataTable {
  const key = `${data.delimiter}|${data.decimal}|${data.source}|${data.text}`;
  if (cache && cache.key === key) return cache.table;
  const options: CsvOptions = { source: data.source };
  if (data.delimiter !== 'auto') options.delimiter = data.delimiter;
  if (data.decimal !== 'auto') options.decimal = data.decimal;
  const table = parseCsv(data.text, options);
  cache = { key, table };
  return table;
}

function inspect(id: number, data: DataSource): void {
  const table = readTable(data);
  const columns = summarizeColumns(table);
  const summary: TableSummary = {
    source: data.source,
    columns,
    rows: table.rows.length,
    delimiter: table.delimiter,
    decimal: table.decimal,
    preview: table.rows.slice(0, 6),
    guess: guessColumns(table, columns),
  };
  post({ kind: 'inspected', id, table: summary });
}

/** Progress of a batch is posted at most this often (and always for the last group). */
const BATCH_PROGRESS_MS = 100;

/** One exact test per group of rows, as exactDwBatch runs it; the option a batch does not have (power) is not sent by the page. */
function computeBatch(id: number, data: DataSource, model: ModelChoice & { by: string }): void {
  post({ kind: 'progress', id, step: 0, steps: 1, stage: 'Reading the table' });
  const table = readTable(data);
  let last = 0;
  const input: BatchInput = {
    table,
    by: model.by,
    y: model.y,
    x: model.x,
    lag: model.lag,
    intercept: model.intercept,
    alternative: model.alternative,
    alpha: model.alpha,
    method: model.method,
    onProgress: (done, total) => {
      const now = performance.now();
      if (done < total && now - last < BATCH_PROGRESS_MS) return;
      last = now;
      post({ kind: 'progress', id, step: done, steps: total, stage: `Testing the groups: ${done} of ${total} done` });
    },
  };
  if (model.time !== null) input.time = model.time;
  else if (!model.timeRule) input.timeColumn = false;
  if (model.frequency !== null) input.frequency = model.frequency;
  if (model.adjust !== null) input.adjust = model.adjust;
  if (model.dropMissing) input.dropMissing = true;
  const batch = runBatch(input);
  post({ kind: 'progress', id, step: 1, steps: 1, stage: 'Writing the tables' });
  post({ kind: 'batch-result', id, batch, downloads: batchDownloads(batch) });
}

function compute(id: number, data: DataSource, model: ModelChoice): void {
  if (model.by !== null) { computeBatch(id, data, { ...model, by: model.by }); return; }
  const steps = model.rho === null ? 4 : 5;
  let step = 0;
  const stage = (text: string): void => post({ kind: 'progress', id, step: step++, steps, stage: text });

  stage('Reading the columns');
  const table = readTable(data);
  const missingAsNaN = model.dropMissing;
  const y = numericColumn(table, model.y, { missingAsNaN });
  const x: Record<string, Float64Array> = {};
  for (const name of model.x) x[name] = numericColumn(table, name, { missingAsNaN });
  // the library's time-index rule decides what "detected" means, as on the command line
  const ruled = guessColumns(table, summarizeColumns(table)).time;
  const time = model.time === null ? undefined
    : {
      labels: textColumn(table, model.time), name: model.time, detected: model.time === ruled, source: data.source,
      ...(model.frequency !== null ? { frequency: model.frequency } : {}),
    };
  const options: Record<string, string | boolean | string[]> = {
    y: model.y, x: model.x, lag: String(model.lag), alternative: model.alternative, alpha: String(model.alpha), method: model.method,
  };
  if (model.time !== null) options.time = model.time;
  if (model.time !== null && model.frequency !== null) options.frequency = model.frequency;
  if (!model.intercept) options['no-intercept'] = true;
  if (model.dropMissing) options['drop-missing'] = true;
  const input: DwTestInput = {
    y, x, time, timeColumn: false, dropMissing: model.dropMissing,
    provenance: { input: { name: data.source, sha256: data.sha256, bytes: data.bytes }, options },
    lag: model.lag,
    intercept: model.intercept,
    alternative: model.alternative,
    alpha: model.alpha,
    method: model.method,
  };

  stage('Fitting the regression; exact p-values and critical values');
  const result = runTest(input);

  // The optional parts: a failure in one of them (a rho out of range, a size limit) is shown in its
  // own panel and does not take the test result away.
  const failures: Partial<Record<OptionalPart, PlainError>> = {};
  const optional = <T>(part: OptionalPart, make: () => T | null): T | null => {
    try { return make(); } catch (err) { failures[part] = plainError(err); return null; }
  };
  let power = null;
  if (model.rho !== null) {
    stage(`Exact power at rho = ${model.rho}`);
    power = optional('power', () => powerAt(input, result, model.rho));
  }
  stage('Drawing the exact null density');
  const figure = optional('figure', () => figureSvg(input, result));
  stage('Writing the report and the paragraph');
  const extras: ReportExtras = {
    text: textReport(result),
    figure,
    paragraph: optional('paragraph', () => paragraphFor(result)),
    markdown: optional('markdown', () => markdownReport(result)),
    power,
  };
  post({ kind: 'result', id, result, extras, failures });
}

scope.addEventListener('message', (event: MessageEvent<Request>) => {
  const request = event.data;
  try {
    if (request.kind === 'inspect') inspect(request.id, request.data);
    else compute(request.id, request.data, request.model);
  } catch (err) {
    post({ kind: 'error', id: request.id, error: plainError(err) });
  }
});

// A sign of life, so that the page knows the worker started under its security policy.
post({ kind: 'progress', id: 0, step: 0, steps: 0, stage: 'ready' });
