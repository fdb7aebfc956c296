/**
 * Node-only: the groups of a batch split among this thread and worker threads (node:worker_threads),
 * each thread with its own cache of prepared designs, the parts put together in the order of the groups.
 * Groups are split into contiguous runs of about equal numbers of rows, so that groups next to each
 * other (often the same design) stay on one thread. Never imported by the web page.
 */
import { availableParallelism } from 'node:os';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { parseCsv, type CsvOptions, type DataTable } from '../data/csv.js';
import {
  batchColumns, checkBatchOptions, finishBatch, groupRows, testGroups,
  type BatchColumns, type BatchGroup, type BatchGrouping, type BatchInput, type BatchResult,
} from '../batch/batch.js';
import { DesignCache } from '../batch/shared-design.js';
import { DwError, type DwErrorDetail } from '../errors.js';

/**
 * What a worker thread is given: its rows of the table as one text (the cells joined by NUL,
 * which no CSV text holds: parseCsv refuses it), their row numbers in the file (so that messages
 * name the file's rows), the checked columns, its groups, and the batch settings. One string and
 * one typed array cross to the thread far faster than an array of arrays of strings.
 */
export interface BatchJob {
  table: Omit<DataTable, 'rows'> & { rowCount: number; rowIndex: Int32Array; cells: string };
  columns: BatchColumns;
  grouping: BatchGrouping;
  input: Omit<BatchInput, 'table' | 'columns' | 'onProgress'>;
}

/** Messages from a worker thread. */
export type BatchWorkerMessage =
  | { kind: 'progress'; done: number }
  | { kind: 'done'; groups: BatchGroup[]; designs: number }
  | { kind: 'error'; code: string; message: string; hint: string; detail?: DwErrorDetail };

/**
 * Run one job in this thread (what each worker thread does).
 *
 * @example
 * ```ts
 * const table = parseCsv(text);
 * const columns = batchColumns(table, { by: 'shop', y: 'sales' });
 * const { groups, designs } = runBatchJob({ table, columns, grouping: groupRows(table, 'shop'), input: { by: 'shop', y: 'sales' } });
 * ```
 */
export function runBatchJob(job: BatchJob, onProgress?: (done: number) => void): { groups: BatchGroup[]; designs: number } {
  const cache = new DesignCache({ intercept: job.input.intercept, lag: job.input.lag, method: job.input.method, tolerance: job.input.tolerance });
  const table = unpackTable(job.table);
  const groups = testGroups(table, job.grouping, job.columns, job.input, cache, 0, job.grouping.labels.length, onProgress);
  return { groups, designs: cache.size };
}

/** The job of groups `from` to `to`: their rows packed as one text, and their part of the grouping. */
function share(table: DataTable, grouping: BatchGrouping, from: number, to: number): Omit<BatchJob, 'columns' | 'input'> {
  const index: number[] = [];
  for (let g = from; g < to; g++) for (const r of grouping.rows[g]) index.push(r);
  const { rows, ...meta } = table;
  return {
    table: { ...meta, rowCount: rows.length, rowIndex: Int32Array.from(index), cells: index.map((r) => rows[r].join('\u0000')).join('\u0000') },
    grouping: { labels: grouping.labels.slice(from, to), rows: grouping.rows.slice(from, to), unlabelled: new Int32Array(0) },
  };
}

/** The table of a job: its rows where they are in the file, the other rows empty. */
function unpackTable(packed: BatchJob['table']): DataTable {
  const { rowCount, rowIndex, cells, ...meta } = packed;
  const width = meta.headers.length;
  const empty: string[] = [];
  const rows: string[][] = new Array<string[]>(rowCount).fill(empty);
  const all = rowIndex.length > 0 ? cells.split('\u0000') : [];
  for (let i = 0; i < rowIndex.length; i++) rows[rowIndex[i]] = all.slice(i * width, i * width + width);
  return { ...meta, rows };
}

/** The compiled worker script beside this file, or null when running from TypeScript sources. */
function workerScript(): string | null {
  const here = fileURLToPath(import.meta.url);
  if (!here.endsWith('.js')) return null;
  const script = here.replace(/batch-pool\.js$/, 'batch-worker.js');
  return existsSync(script) ? script : null;
}

/**
 * Threads to use for a large batch: every core the process may use.
 *
 * @example
 * ```ts
 * defaultWorkers(); // 2 on a two-core machine
 * ```
 */
export function defaultWorkers(): number {
  return Math.max(1, availableParallelism());
}

/**
 * Lines of a file up to which a batch runs in one thread unless threads are asked for explicitly.
 * A worker thread starts cold (its code loads and compiles again), its rows must be handed over,
 * and one thread already keeps a second core partly busy with garbage collection and compilation;
 * on the two-core machine of docs/batch-performance.md two threads were slower than one on both
 * benchmark files (156 000 and 12 500 lines), and in a one-off run on a file of 624 000 lines
 * (12 000 series on one design) both took about 4.3 s.
 */
export const THREAD_MIN_ROWS = 1_000_000;

/**
 * The batch of a CSV text, with the groups split among `workers` threads (1: all in this thread;
 * `auto`: one per core when the file has more than {@link THREAD_MIN_ROWS} lines, else one).
 * File-level errors are thrown before any thread starts.
 *
 * @example
 * ```ts
 * const batch = await runBatch(text, { source: "'shops.csv'" }, { by: 'shop', y: 'sales', adjust: 'bh' }, 2);
 * ```
 */
export async function runBatch(
  text: string, csv: CsvOptions, input: Omit<BatchInput, 'table' | 'columns' | 'onProgress'>, workers: number | 'auto',
  onProgress?: (done: number, total: number) => void,
): Promise<BatchResult> {
  checkBatchOptions(input);
  const script = workerScript();
  // threads are started first, so that they load while this thread reads the file; this thread
  // tests a share of the groups too, so `wanted` threads in all is wanted - 1 workers
  const wanted = workers === 'auto' ? (lineCount(text) > THREAD_MIN_ROWS ? defaultWorkers() : 1) : workers;
  const pool = script && wanted > 1 ? Array.from({ length: wanted - 1 }, () => new Worker(script)) : [];
  try {
    const table = parseCsv(text, csv);
    const columns = batchColumns(table, input);
    const grouping = groupRows(table, columns.by);
    const total = grouping.labels.length;
    const threads = Math.min(pool.length + 1, total);
    const cache = new DesignCache({ intercept: input.intercept, lag: input.lag, method: input.method, tolerance: input.tolerance });
    if (threads <= 1) {
      const groups = testGroups(table, grouping, columns, input, cache, 0, total, onProgress ? (d) => onProgress(d, total) : undefined);
      return finishBatch(input, columns, grouping, groups, cache.size);
    }
    // contiguous runs of about equal numbers of rows; the first run is this thread's
    const rowsTotal = grouping.rows.reduce((s, r) => s + r.length, 0);
    const cuts = [0];
    let acc = 0;
    for (let g = 0; g < total && cuts.length < threads; g++) {
      acc += grouping.rows[g].length;
      if (acc >= (rowsTotal * cuts.length) / threads && g + 1 < total) cuts.push(g + 1);
    }
    cuts.push(total);
    const done = new Array<number>(cuts.length - 1).fill(0);
    const progress = (w: number, d: number) => {
      done[w] = d;
      onProgress?.(done.reduce((s, v) => s + v, 0), total);
    };
    const workerParts = cuts.slice(1, -1).map((from, i) => new Promise<{ groups: BatchGroup[]; designs: number }>((resolveJob, reject) => {
      const w = i + 1;
      const job: BatchJob = { ...share(table, grouping, from, cuts[w + 1]), columns, input };
      const worker = pool[i];
      let settled = false;
      worker.on('message', (m: BatchWorkerMessage) => {
        if (m.kind === 'progress') {
          progress(w, m.done);
        } else if (m.kind === 'done') {
          settled = true;
          resolveJob({ groups: m.groups, designs: m.designs });
        } else {
          settled = true;
          reject(new DwError(m.code as DwError['code'], m.message, m.hint, m.detail ?? {}));
        }
      });
      worker.on('error', (err) => { if (!settled) { settled = true; reject(err); } });
      worker.on('exit', (code) => { if (!settled) { settled = true; reject(new Error(`a worker thread stopped with code ${code}`)); } });
      worker.postMessage(job);
    }));
    // this thread's own run, while the workers test theirs (their messages wait until it is done)
    const own = { groups: testGroups(table, grouping, columns, input, cache, 0, cuts[1], (d) => progress(0, d)), designs: cache.size };
    const parts = [own, ...await Promise.all(workerParts)];
    // design numbers are per thread: shift them so that each prepared design has its own number
    const groups: BatchGroup[] = [];
    let offset = 0;
    for (const part of parts) {
      for (const g of part.groups) groups.push(g.design === null ? g : { ...g, design: g.design + offset });
      offset += part.designs;
    }
    return finishBatch(input, columns, grouping, groups, offset);
  } finally {
    await Promise.all(pool.map((w) => w.terminate()));
  }
}

/** Lines of a text (an upper bound on its data rows, counted without parsing). */
function lineCount(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) n++;
  return n;
}
