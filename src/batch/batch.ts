/**
 * Many series at once: one exact Durbin-Watson test per group of rows (a shop, a station, a
 * product), the same regression in each, with the series that share a design sharing one exact
 * null distribution (src/batch/shared-design.ts), and Holm or Benjamini-Hochberg adjusted p-values
 * over the family (src/batch/adjust.ts). A group that cannot be tested gets its error code and
 * message and the batch goes on; file-level problems (a column that does not exist) throw.
 */
import { DwError, isDwError, type DwErrorCode, type DwSuggestion } from '../errors.js';
import { columnIndex, isMissingCell, isTextColumn, parseCell, type DataTable } from '../data/csv.js';
import type { DroppedRows } from '../inference/data-input.js';
import type { MethodChoice } from '../core/types.js';
import type { Alternative } from '../core/alternative.js';
import { checkAlpha, checkAlternative } from '../core/alternative.js';
import { runExactDwTest } from '../inference/dw-test.js';
import { adjustPValues, ADJUSTMENTS, type Adjustment } from './adjust.js';
import { DesignCache } from './shared-design.js';
import { seriesAnswer } from './group-test.js';
import type { BatchNote, DwWarning } from '../inference/warnings.js';
import { parseTimeLabels, readsAsTimeIndex, TIME_NAMES, type TimeFrequency } from '../data/time-index.js';

/** A cell of a column given to {@link exactDwBatch} as values (null, undefined, '' or NaN are missing). */
export type BatchCell = number | string | null | undefined;

/** Input of {@link exactDwBatch}. */
export interface BatchInput {
  /** The data as a parsed CSV table (messages then name the file's data rows). */
  table?: DataTable;
  /** Or the data as named columns (numbers; the grouping column may hold labels). */
  columns?: Readonly<Record<string, ArrayLike<BatchCell>>>;
  /** The column whose value says which group (series) a row belongs to. */
  by: string;
  /** The dependent variable. */
  y: string;
  /** The regressors (default: every other column that holds numbers, except `by`, `y` and `time`). */
  x?: string[];
  /**
   * Time column (within each group strictly increasing; gaps are honoured): whole numbers,
   * quarters (2015Q1, 2015-Q1), months (2015-07) or ISO dates, as in src/data/time-index.ts.
   */
  time?: string;
  /**
   * `false`: no time index even when a column looks like one (the rows of each group are
   * consecutive periods). Otherwise, without `time`, the time-index rule of src/data/time-index.ts
   * applies group by group: the first column (not `by`, `y` or a listed regressor) whose labels
   * increase within every group and that has a time-like name or holds quarter, month or date
   * labels is the time index, and the result says so (`BATCH_TIME_DETECTED`).
   */
  timeColumn?: false;
  /** Frequency of ISO-date labels, instead of the one inferred for each group. */
  frequency?: TimeFrequency;
  /**
   * Drop, in each group, the rows with a missing value in y, a regressor or the time column (an
   * empty cell or a missing-value code such as NA); they are listed in the group's `droppedRows`
   * and become gaps in its time (without a time column, the group's row order is its time).
   * Without it such a cell fails its group.
   */
  dropMissing?: boolean;
  /** Adjust the p-values over the family of groups tested (default none). */
  adjust?: Adjustment;
  /** Alternative (default `positive`). */
  alternative?: Alternative;
  /** Significance level (default 0.05); with `adjust`, applied to the adjusted p-values. */
  alpha?: number;
  /** Include an intercept (default true). */
  intercept?: boolean;
  /** Lag of the differences (default 1). */
  lag?: number;
  /** Engine (default `auto`). */
  method?: MethodChoice;
  /** Target absolute error of each probability (default 1e-11). */
  tolerance?: number;
  /**
   * Also compute each group's exact critical values and bounds zone, and run each group through the
   * full single test (default false: d, the p-value tested and its error bound only, which is
   * faster when the groups have their own designs).
   */
  critical?: boolean;
  /** Called after each group with the number done and the total. */
  onProgress?: (done: number, total: number) => void;
}

/** Why a group could not be tested. */
export interface BatchGroupError {
  code: DwErrorCode;
  message: string;
  hint: string;
  /** The settings the hint suggests, by library option name (see `DwErrorDetail.suggest`). */
  suggest?: DwSuggestion[];
}

/** The test of one group. */
export interface BatchGroup {
  /** The group's label (the value of the `by` column). */
  group: string;
  /** Rows of the data in this group. */
  rows: number;
  /** Observations and columns of X (including the intercept) when the design was built. */
  n: number | null;
  k: number | null;
  /** The statistic (null when the group failed). */
  d: number | null;
  /** Exact p-value for the alternative (null when the group failed or d is not valid there). */
  pValue: number | null;
  /** Adjusted p-value (null without an adjustment, or when `pValue` is null). */
  pAdjusted: number | null;
  /** On `pAdjusted` when adjusted, else on `pValue`; null when the group failed. */
  decision: 'reject' | 'not-rejected' | 'not-valid' | null;
  /** Exact critical values of d for this group's design at alpha (alpha/2 each for two-sided); null unless asked for. */
  critical: { lower: number; upper: number } | null;
  /** Engine and absolute error bound of the p-value. */
  method: string | null;
  errorBound: number | null;
  /** Zone of the bounds test, when the bounds apply and critical values were asked for. */
  zone: string | null;
  /** Rows of this group dropped for a missing value (1-based data rows of the file), when rows were dropped. */
  droppedRows: DroppedRows | null;
  /** Number of the distinct design this group was tested on (groups with the same number shared one null distribution). */
  design: number | null;
  warnings: DwWarning[];
  /** Why the group could not be tested (null when it was). */
  error: BatchGroupError | null;
}

/** Everything a batch produced, as plain data. */
export interface BatchResult {
  by: string;
  y: string;
  /** Regressors used (without the intercept). */
  x: string[];
  time: string | null;
  alternative: Alternative;
  alpha: number;
  adjust: Adjustment | null;
  intercept: boolean;
  lag: number;
  groups: BatchGroup[];
  summary: {
    /** Groups in the data. */
    groups: number;
    /** Groups with an answer (a p-value, or the finding that d is not valid). */
    tested: number;
    /** Groups that could not be tested (each has its `error`). */
    failed: number;
    /** Groups rejected at alpha (on adjusted p-values when adjusted). */
    rejected: number;
    /** Groups where d is not valid (a lagged dependent variable). */
    notValid: number;
    /** Null distributions prepared: one per distinct design (per worker thread, when the groups were split among threads). */
    designs: number;
  };
  notes: BatchNote[];
}

/** The groups of a table: labels in the order of their first row, and the rows of each. */
export interface BatchGrouping {
  labels: string[];
  rows: Int32Array[];
  /** Rows whose group label is missing (0-based data rows). */
  unlabelled: Int32Array;
}

/** Label given in results to the rows without a group label. */
export const MISSING_GROUP_LABEL = '';

/**
 * The data as a table: a parsed CSV as it is; named columns written as the shortest text that
 * reads back as the same number, so that both paths parse cells by one rule.
 *
 * @example
 * ```ts
 * batchTable({ by: 'shop', y: 'y', columns: { shop: ['a', 'b'], y: [1.5, 2] } }).rows; // [['a', '1.5'], ['b', '2']]
 * ```
 */
export function batchTable(input: Pick<BatchInput, 'table' | 'columns'>): DataTable {
  if ((input.table === undefined) === (input.columns === undefined)) {
    throw new DwError('OPTION_CONFLICT', 'Give the data either as a table or as named columns, not both (and not neither).', 'Pass one of table and columns.');
  }
  if (input.table) return input.table;
  const headers = Object.keys(input.columns!);
  if (headers.length === 0) throw new DwError('CSV_EMPTY', 'The batch data have no columns.', 'Give at least the grouping column and y.');
  const n = input.columns![headers[0]].length;
  for (const h of headers) {
    if (input.columns![h].length !== n) {
      throw new DwError('LENGTH_MISMATCH', `Column '${h}' has ${input.columns![h].length} values, column '${headers[0]}' has ${n}.`, 'Give every column one value per row.', { column: h });
    }
  }
  if (n === 0) throw new DwError('CSV_NO_DATA_ROWS', 'The batch data have no rows.', 'Give at least one row per group.');
  const rows: string[][] = [];
  for (let i = 0; i < n; i++) {
    rows.push(headers.map((h) => {
      const v = input.columns![h][i];
      return v === null || v === undefined ? '' : String(v);
    }));
  }
  return { headers, rows, delimiter: ',', decimal: 'point', source: 'the batch data' };
}

/**
 * The rows of each group, groups in the order of their first row.
 *
 * @example
 * ```ts
 * const g = groupRows(parseCsv('shop,y\na,1\nb,2\na,3\n'), 'shop');
 * g.labels; // ['a', 'b']
 * g.rows;   // [Int32Array [0, 2], Int32Array [1]]
 * ```
 */
export function groupRows(table: DataTable, by: string): BatchGrouping {
  const j = columnIndex(table, by);
  const index = new Map<string, number>();
  const labels: string[] = [];
  const members: number[][] = [];
  const unlabelled: number[] = [];
  for (let r = 0; r < table.rows.length; r++) {
    const label = table.rows[r][j].trim();
    if (label === '') { unlabelled.push(r); continue; }
    let g = index.get(label);
    if (g === undefined) { g = labels.length; index.set(label, g); labels.push(label); members.push([]); }
    members[g].push(r);
  }
  return { labels, rows: members.map((m) => Int32Array.from(m)), unlabelled: Int32Array.from(unlabelled) };
}

/** The checked column choice of a batch. */
export interface BatchColumns {
  by: string; y: string; x: string[]; time: string | null;
  /** The time column was chosen by the time-index rule, not named. */
  timeDetected?: boolean;
}

/**
 * Check the named columns against the table (file-level errors: a column that does not exist, a
 * column named twice) and choose the default regressors.
 *
 * @example
 * ```ts
 * batchColumns(parseCsv('shop,week,y,price\na,1,2,3\n'), { by: 'shop', y: 'y', time: 'week' }).x; // ['price']
 * ```
 */
export function batchColumns(table: DataTable, input: Pick<BatchInput, 'by' | 'y' | 'x' | 'time' | 'timeColumn' | 'dropMissing'>): BatchColumns {
  for (const [role, name] of [['grouping', input.by], ['y', input.y], ['time', input.time]] as const) {
    if (name !== undefined) {
      if (typeof name !== 'string' || name === '') throw new DwError('OPTION_VALUE', `The ${role} column needs a name.`, 'Name a column of the data.');
      columnIndex(table, name);
    }
  }
  if (input.by === input.y) throw new DwError('OPTION_CONFLICT', `'${input.y}' is both the grouping column and y.`, 'Group by a column of labels, not by the dependent variable.', { column: input.y });
  if (input.time !== undefined && (input.time === input.y || input.time === input.by)) {
    throw new DwError('OPTION_CONFLICT', `'${input.time}' is the time column and cannot also be ${input.time === input.y ? 'y' : 'the grouping column'}.`, 'Name separate columns.', { column: input.time });
  }
  const detected = input.time === undefined && input.timeColumn !== false ? detectGroupTime(table, input) : null;
  const time = input.time ?? detected ?? undefined;
  const skip = new Set([input.by, input.y, ...(time !== undefined ? [time] : [])]);
  let x: string[];
  if (input.x !== undefined) {
    const seen = new Set<string>();
    for (const name of input.x) {
      columnIndex(table, name);
      if (skip.has(name)) throw new DwError('OPTION_CONFLICT', `'${name}' is the grouping, y or time column and cannot also be a regressor.`, 'Remove it from the regressors.', { column: name });
      if (seen.has(name)) throw new DwError('COLUMN_REPEATED', `'${name}' is listed twice among the regressors.`, 'List each regressor once.', { column: name });
      seen.add(name);
    }
    x = [...input.x];
  } else {
    x = table.headers.filter((h) => !skip.has(h) && !isTextColumn(table, h));
  }
  return { by: input.by, y: input.y, x, time: time ?? null, ...(detected !== null ? { timeDetected: true } : {}) };
}

/**
 * The time-index rule of src/data/time-index.ts, group by group: the first column, in file order,
 * that is not the grouping column, y or a listed regressor, whose labels increase strictly within
 * every group of two or more rows, and that has a time-like name or holds quarter, month or date
 * labels. Null when there is none.
 */
function detectGroupTime(table: DataTable, input: Pick<BatchInput, 'by' | 'y' | 'x' | 'dropMissing'>): string | null {
  const listed = new Set(input.x ?? []);
  const { rows } = groupRows(table, input.by);
  for (const h of table.headers) {
    if (h === input.by || h === input.y || listed.has(h)) continue;
    const j = columnIndex(table, h);
    let ok = true;
    let calendar = false;
    let seen = false;
    for (const g of rows) {
      if (g.length < 2) continue;
      // with dropMissing the rule reads the complete rows only (as the single test's rule does)
      const cells = Array.from(g, (r) => table.rows[r][j]);
      const format = readsAsTimeIndex(input.dropMissing === true ? cells.filter((c) => !isMissingCell(c)) : cells);
      if (format === null) { ok = false; break; }
      seen = true;
      if (format !== 'integer') calendar = true;
    }
    if (ok && seen && (calendar || TIME_NAMES.includes(h.trim().toLowerCase()))) return h;
  }
  return null;
}

function sameLabels(a: string[], b: string[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function groupError(err: unknown): BatchGroupError {
  if (isDwError(err)) return { code: err.code, message: err.message, hint: err.hint, ...(err.detail?.suggest ? { suggest: err.detail.suggest } : {}) };
  throw err;
}

function failed(group: string, rows: number, error: BatchGroupError, n: number | null = null, k: number | null = null): BatchGroup {
  return { group, rows, n, k, d: null, pValue: null, pAdjusted: null, decision: null, critical: null, method: null, errorBound: null, zone: null, droppedRows: null, design: null, warnings: [], error };
}

/**
 * Test groups `from` to `to` (exclusive) of a grouping, unadjusted, sharing prepared designs
 * through `cache`. The pieces of {@link exactDwBatch}, for callers that split the groups among
 * worker threads; put the results together with {@link finishBatch}.
 *
 * @example
 * ```ts
 * const table = parseCsv(text);
 * const columns = batchColumns(table, { by: 'shop', y: 'sales' });
 * const grouping = groupRows(table, 'shop');
 * const cache = new DesignCache({});
 * const part = testGroups(table, grouping, columns, {}, cache, 0, grouping.labels.length);
 * ```
 */
export function testGroups(
  table: DataTable, grouping: BatchGrouping, columns: BatchColumns, input: Omit<BatchInput, 'table' | 'columns' | 'by' | 'y' | 'x' | 'time'>,
  cache: DesignCache, from: number, to: number, onProgress?: (done: number) => void,
): BatchGroup[] {
  const out: BatchGroup[] = [];
  const jy = columnIndex(table, columns.y);
  const jx = columns.x.map((h) => columnIndex(table, h));
  const jt = columns.time === null ? -1 : columnIndex(table, columns.time);
  // the labels and periods of the last group read: groups on the same time labels (the usual
  // batch) read them once
  let lastLabels: string[] = [];
  let lastPeriods: Float64Array | undefined;
  const drop = input.dropMissing === true;
  for (let g = from; g < to; g++) {
    const label = grouping.labels[g];
    const all = grouping.rows[g];
    const size = all.length;
    try {
      // with dropMissing, the rows with a missing value in a used column leave the group; the
      // positions kept (within the group) become its time when no time column is named
      let rows: ArrayLike<number> = all;
      let kept: number[] | null = null;
      let droppedRows: DroppedRows | null = null;
      if (drop) {
        const keep: number[] = [];
        const gone: number[] = [];
        for (let i = 0; i < size; i++) {
          const cells = table.rows[all[i]];
          const missing = isMissingCell(cells[jy]) || jx.some((j) => isMissingCell(cells[j])) || (jt >= 0 && isMissingCell(cells[jt]));
          if (missing) gone.push(all[i] + 1); else keep.push(i);
        }
        if (gone.length > 0) {
          kept = keep;
          rows = keep.map((i) => all[i]);
          droppedRows = { count: gone.length, rows: gone };
        }
      }
      const n = rows.length;
      const y = new Float64Array(n);
      const xs = columns.x.map(() => new Float64Array(n));
      for (let i = 0; i < n; i++) {
        const cells = table.rows[rows[i]];
        y[i] = parseCell(table, rows[i], columns.y, cells[jy]);
        for (let c = 0; c < jx.length; c++) xs[c][i] = parseCell(table, rows[i], columns.x[c], cells[jx[c]]);
      }
      const x: Record<string, Float64Array> = {};
      columns.x.forEach((h, c) => { x[h] = xs[c]; });
      // the time labels of this group (whole numbers, quarters, months or ISO dates: src/data/time-index.ts)
      let times: Float64Array | undefined;
      if (jt >= 0) {
        const labels = Array.from(rows, (r) => table.rows[r][jt]);
        if (lastPeriods === undefined || !sameLabels(labels, lastLabels)) {
          lastPeriods = parseTimeLabels(labels, {
            column: columns.time!, source: table.source, rows: Array.from(rows, (r) => r + 1), frequency: input.frequency,
          }).periods;
          lastLabels = labels;
        }
        times = lastPeriods;
      } else if (kept !== null) {
        times = Float64Array.from(kept);
      }
      const { id, reuse } = cache.lookup(x, n, times);
      const quick = input.critical === true ? null : seriesAnswer(y, reuse, input.alternative ?? 'positive', input.alpha ?? 0.05, times, () => cache.ceiling(id, reuse));
      // the group's own note, as the single test gives it
      const dropNote: DwWarning[] = droppedRows ? [{ code: 'ROWS_DROPPED', count: droppedRows.count, rows: droppedRows.rows, asGaps: true }] : [];
      if (quick) {
        quick.warnings.push(...dropNote);
        out.push({
          group: label, rows: size, n: quick.n, k: quick.k, d: quick.d, pValue: quick.pValue, pAdjusted: null, decision: quick.decision,
          critical: null, method: quick.method, errorBound: quick.errorBound, zone: null, droppedRows, design: id, warnings: quick.warnings, error: null,
        });
        onProgress?.(g - from + 1);
        continue;
      }
      const { result } = runExactDwTest({
        y, x, times, intercept: input.intercept, lag: input.lag, method: input.method, tolerance: input.tolerance,
        alternative: input.alternative, alpha: input.alpha,
      }, reuse);
      const valid = result.dValid;
      out.push({
        group: label,
        rows: size,
        n: result.n,
        k: result.k,
        d: result.d,
        pValue: valid ? result.pValue : null,
        pAdjusted: null,
        decision: result.decision,
        critical: { lower: result.critical.lower, upper: result.critical.upper },
        method: result.method,
        errorBound: result.errorBound,
        zone: result.bounds ? result.bounds.zone : null,
        droppedRows,
        design: id,
        warnings: [...result.warnings, ...dropNote],
        error: null,
      });
    } catch (err) {
      out.push(failed(label, size, groupError(err)));
    }
    onProgress?.(g - from + 1);
  }
  return out;
}

/**
 * Put the tested groups together: the rows without a group label as a failed entry, the adjusted
 * p-values over the family of groups with a valid p-value, the decisions and the summary.
 *
 * @example
 * ```ts
 * const result = finishBatch(input, columns, grouping, [...partA, ...partB], designs);
 * result.summary.rejected;
 * ```
 */
export function finishBatch(
  input: Pick<BatchInput, 'adjust' | 'alternative' | 'alpha' | 'intercept' | 'lag'>, columns: BatchColumns, grouping: BatchGrouping,
  tested: BatchGroup[], designs: number,
): BatchResult {
  const alpha = input.alpha ?? 0.05;
  const groups = tested.map((g) => ({ ...g }));
  if (grouping.unlabelled.length > 0) {
    const first = grouping.unlabelled[0] + 1;
    const count = grouping.unlabelled.length;
    groups.push(failed(MISSING_GROUP_LABEL, count, {
      code: 'CELL_EMPTY',
      message: `${count} row${count === 1 ? ' has' : 's have'} no value in the grouping column '${columns.by}' (the first is data row ${first}).`,
      hint: 'Give every row the label of its series, or remove the rows that belong to none.',
    }));
  }
  const notes: BatchNote[] = [];
  const family = groups.filter((g) => g.pValue !== null);
  if (input.adjust !== undefined) {
    const adjusted = adjustPValues(family.map((g) => g.pValue!), input.adjust);
    family.forEach((g, i) => {
      g.pAdjusted = adjusted[i];
      g.decision = adjusted[i] <= alpha ? 'reject' : 'not-rejected';
    });
    notes.push({ code: 'BATCH_ADJUSTED', method: input.adjust, family: family.length });
  }
  const failedCount = groups.filter((g) => g.error !== null).length;
  const notValid = groups.filter((g) => g.decision === 'not-valid').length;
  if (input.adjust !== undefined && notValid > 0) notes.push({ code: 'BATCH_NOT_VALID_EXCLUDED', excluded: notValid });
  if (failedCount > 0) notes.push({ code: 'BATCH_GROUPS_FAILED', failed: failedCount, groups: groups.length });
  if (columns.timeDetected && columns.time !== null) notes.push({ code: 'BATCH_TIME_DETECTED', column: columns.time });
  const withDrops = groups.filter((g) => g.droppedRows !== null);
  if (withDrops.length > 0) notes.push({ code: 'BATCH_ROWS_DROPPED', rows: withDrops.reduce((t, g) => t + g.droppedRows!.count, 0), groups: withDrops.length });
  return {
    by: columns.by,
    y: columns.y,
    x: columns.x,
    time: columns.time,
    alternative: input.alternative ?? 'positive',
    alpha,
    adjust: input.adjust ?? null,
    intercept: input.intercept ?? true,
    lag: input.lag ?? 1,
    groups,
    summary: {
      groups: groups.length,
      tested: groups.length - failedCount,
      failed: failedCount,
      rejected: groups.filter((g) => g.decision === 'reject').length,
      notValid,
      designs,
    },
    notes,
  };
}

/**
 * Check the options that apply to every group, before any group is tested.
 *
 * @example
 * ```ts
 * checkBatchOptions({ adjust: 'holm', alpha: 0.05 }); // fine
 * checkBatchOptions({ adjust: 'bonferroni' as never }); // throws OPTION_VALUE
 * ```
 */
export function checkBatchOptions(input: Pick<BatchInput, 'adjust' | 'alternative' | 'alpha' | 'lag' | 'dropMissing'>): void {
  checkAlternative(input.alternative ?? 'positive');
  checkAlpha(input.alpha ?? 0.05);
  if (input.adjust !== undefined && !(ADJUSTMENTS as readonly string[]).includes(input.adjust)) {
    throw new DwError('OPTION_VALUE', `The adjustment '${String(input.adjust)}' is not known.`, "Use 'holm' (family-wise error rate) or 'bh' (false discovery rate).", { value: String(input.adjust) });
  }
  const lag = input.lag ?? 1;
  if (!Number.isInteger(lag) || lag < 1) {
    throw new DwError('LAG_INVALID', `The lag must be a whole number of at least 1 (got ${lag}).`, 'Use 1 for consecutive periods.');
  }
  if (input.dropMissing !== undefined && typeof input.dropMissing !== 'boolean') {
    throw new DwError('OPTION_VALUE', `dropMissing must be true or false (got ${String(input.dropMissing)}).`, 'Pass true to drop the rows with missing values, or leave it out.');
  }
}

/**
 * One exact Durbin-Watson test per group: the regression of `y` on `x` fitted in each group, its
 * exact p-value for that group's design (groups with the same design share one exact null
 * distribution, which changes no number), optionally Holm or Benjamini-Hochberg adjusted over the
 * groups. A group that cannot be tested (too few rows, a cell that is not a number, a rank-deficient
 * design) gets `error: { code, message, hint }`; the others go on.
 *
 * @example
 * ```ts
 * const batch = exactDwBatch({
 *   columns: { shop: ['a', 'a', ...], week: [1, 2, ...], sales: [...], price: [...] },
 *   by: 'shop', y: 'sales', x: ['price'], time: 'week', adjust: 'holm',
 * });
 * batch.groups[0]; // { group: 'a', n: 52, k: 2, d: 1.41, pValue: 0.012, pAdjusted: 0.31, decision: 'not-rejected', ... }
 * batch.summary;   // { groups: 240, tested: 239, failed: 1, rejected: 3, notValid: 0, designs: 1 }
 * ```
 */
export function exactDwBatch(input: BatchInput): BatchResult {
  checkBatchOptions(input);
  const table = batchTable(input);
  const columns = batchColumns(table, input);
  const grouping = groupRows(table, columns.by);
  const cache = new DesignCache({ intercept: input.intercept, lag: input.lag, method: input.method, tolerance: input.tolerance });
  const total = grouping.labels.length;
  const tested = testGroups(table, grouping, columns, input, cache, 0, total, input.onProgress ? (done) => input.onProgress!(done, total) : undefined);
  return finishBatch(input, columns, grouping, tested, cache.size);
}
