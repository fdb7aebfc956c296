/**
 * From the caller's columns to the series the test runs on: the time index (named, or chosen by
 * the time-index rule of src/data/time-index.ts), rows with missing values dropped on request and
 * turned into gaps, and the notes that say so. The command line and the page call the library
 * with their columns and this module decides, so that the three cannot choose differently.
 */
import { DwError } from '../errors.js';
import type { RegressorInput } from '../model/design.js';
import { chooseTimeIndex, parseTimeLabels, type TimeFrequency, type TimeIndex, type TimeLabelFormat } from '../data/time-index.js';
import type { DwWarning } from './warnings.js';

/**
 * The time index of a result, as reported: the parsed index without its period numbers (first and
 * last label and the missing periods are those of the observations used), and where it came from.
 */
export interface TimeColumnInfo extends Omit<TimeIndex, 'periods'> {
  /** Column name (null for bare observation times, or data-row numbers). */
  name: string | null;
  /** Named by the caller, detected by the time-index rule, or data-row numbers after dropping rows. */
  how: 'named' | 'detected' | 'rows';
}

/** Rows dropped for missing values. */
export interface DroppedRows {
  count: number;
  /** 1-based data rows (positions in the caller's arrays; in a CSV file, counted after the header). */
  rows: number[];
}

/** Time labels given by the caller. */
export interface TimeLabelsInput {
  /** One label per observation: integers, 2015Q1 / 2015-Q1, 2015-01 or 2015-01-31. */
  labels: ArrayLike<string | number>;
  /** Column name, for the report. */
  name?: string;
  /** Frequency instead of the inferred one (ISO dates). */
  frequency?: TimeFrequency;
  /** True when the caller chose this column by the time-index rule (the result then says so). */
  detected?: boolean;
  /** Where the labels come from (e.g. "'sales.csv'"), for messages. */
  source?: string;
}

/** What {@link resolveDataInput} reads. */
export interface DataInputFields {
  y?: ArrayLike<number>;
  residuals?: ArrayLike<number>;
  x: RegressorInput;
  times?: ArrayLike<number>;
  time?: TimeLabelsInput;
  timeColumn?: string | false;
  frequency?: TimeFrequency;
  dropMissing?: boolean;
}

/** The series after the time index and missing rows are settled. */
export interface ResolvedData {
  y?: Float64Array | ArrayLike<number>;
  residuals?: Float64Array | ArrayLike<number>;
  x: RegressorInput;
  times?: ArrayLike<number>;
  timeColumn: TimeColumnInfo | null;
  droppedRows: DroppedRows | null;
  warnings: DwWarning[];
}

function isMissingNumber(v: unknown): boolean {
  return v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v));
}

function isMissingLabel(v: unknown): boolean {
  if (isMissingNumber(v)) return true;
  if (typeof v !== 'string') return false;
  return ['', 'na', 'n/a', 'nan', 'null', 'none', '.', '-', '?', '#n/a', 'missing'].includes(v.trim().toLowerCase());
}

function describe(name: string | null, how: TimeColumnInfo['how'], parsed: ReturnType<typeof parseTimeLabels>): TimeColumnInfo {
  return {
    name, how, format: parsed.format, frequency: parsed.frequency, frequencySource: parsed.frequencySource,
    first: parsed.first, last: parsed.last, missingPeriods: parsed.missingPeriods,
  };
}

/**
 * Settle the time index and the missing rows of a test's input.
 *
 * Time index: `time` (labels) or `times` (integers) when given; else, when `x` is named columns
 * and `timeColumn` is not false, the time-index rule picks one of them (`timeColumn` may name
 * it), which then leaves the regressors. Missing values (NaN, null, undefined in y, the
 * regressors or the times; an empty or NA label) are refused downstream unless `dropMissing`:
 * then each such row is dropped, listed, and becomes a gap (the time index, or the data-row
 * numbers when there is none).
 *
 * @example
 * ```ts
 * const r = resolveDataInput({ y, x: { year: [2001, 2002, 2004], price } });
 * r.timeColumn?.name; // 'year' (detected): not a regressor; 2003 is a gap
 * ```
 */
export function resolveDataInput(input: DataInputFields): ResolvedData {
  const warnings: DwWarning[] = [];
  let x: RegressorInput = input.x;
  let labels: ArrayLike<string | number> | undefined;
  let labelName: string | null = null;
  let how: TimeColumnInfo['how'] = 'named';
  let frequency = input.time?.frequency ?? input.frequency;
  if (input.time !== undefined && input.times !== undefined) {
    throw new DwError('OPTION_CONFLICT', 'Both time labels and observation times were given.', 'Give the time index once.');
  }
  const named = !Array.isArray(x);
  if (input.time !== undefined) {
    labels = input.time.labels;
    labelName = input.time.name ?? null;
    if (input.time.detected) how = 'detected';
  } else if (input.times === undefined && named && input.timeColumn !== false) {
    const cols = x as Readonly<Record<string, ArrayLike<number>>>;
    const columns = Object.keys(cols).map((name) => ({ name, cells: Array.from(cols[name], (v) => (isMissingNumber(v) ? '' : String(v))) }));
    if (typeof input.timeColumn === 'string' && !(input.timeColumn in cols)) {
      throw new DwError('COLUMN_UNKNOWN', `The time column '${input.timeColumn}' is not among the columns given (${Object.keys(cols).map((c) => `'${c}'`).join(', ')}).`,
        'Name one of the columns as the time column.', { column: input.timeColumn });
    }
    // the rule reads the complete rows only, so that a missing label does not hide a time index
    const choice = chooseTimeIndex(columns.map((c) => ({ name: c.name, cells: c.cells.filter((s) => s !== '') })), { named: input.timeColumn });
    if (choice.column !== null) {
      labels = cols[choice.column];
      labelName = choice.column;
      how = choice.how === 'detected' ? 'detected' : 'named';
      const rest: Record<string, ArrayLike<number>> = {};
      for (const k of Object.keys(cols)) if (k !== choice.column) rest[k] = cols[k];
      x = rest;
    }
  }
  // gapped-looking regressors, when no time index honours gaps
  if (!Array.isArray(x) && labels === undefined && input.times === undefined) {
    const cols = x as Readonly<Record<string, ArrayLike<number>>>;
    for (const name of Object.keys(cols)) {
      const c = chooseTimeIndex([{ name, cells: Array.from(cols[name], String) }], { named: false });
      if (c.gapsNotHonoured.includes(name)) warnings.push({ code: 'TIME_GAPS_NOT_HONOURED', column: name });
    }
  }

  const series = (input.y ?? input.residuals) as ArrayLike<number> | undefined;
  const n = series ? series.length : labels ? labels.length : 0;
  let droppedRows: DroppedRows | null = null;
  let keep: number[] | null = null;
  if (input.dropMissing) {
    const bad = new Uint8Array(n);
    const mark = (arr: ArrayLike<unknown> | undefined, label = false) => {
      if (!arr) return;
      for (let i = 0; i < Math.min(n, arr.length); i++) if (label ? isMissingLabel(arr[i]) : isMissingNumber(arr[i])) bad[i] = 1;
    };
    mark(series as ArrayLike<unknown>);
    if (Array.isArray(x)) (x as ReadonlyArray<ArrayLike<number>>).forEach((row, i) => { for (let j = 0; j < row.length; j++) if (isMissingNumber(row[j])) bad[i] = 1; });
    else for (const col of Object.values(x as Record<string, ArrayLike<number>>)) mark(col as ArrayLike<unknown>);
    mark(input.times as ArrayLike<unknown> | undefined);
    mark(labels as ArrayLike<unknown> | undefined, true);
    const rows: number[] = [];
    keep = [];
    for (let i = 0; i < n; i++) (bad[i] ? rows : keep).push(bad[i] ? i + 1 : i);
    if (rows.length > 0) droppedRows = { count: rows.length, rows };
    else keep = null;
  }
  const pick = <T>(arr: ArrayLike<T> | undefined): T[] | ArrayLike<T> | undefined =>
    arr === undefined || keep === null ? arr : keep.map((i) => arr[i]);
  let times = pick(input.times) as ArrayLike<number> | undefined;
  let timeColumn: TimeColumnInfo | null = null;
  if (labels !== undefined) {
    const used = pick(labels)!;
    const parsed = parseTimeLabels(used, { frequency, column: labelName ?? undefined, source: input.time?.source, rows: keep ? keep.map((i) => i + 1) : undefined });
    times = parsed.periods;
    timeColumn = describe(labelName, how, parsed);
    if (how === 'detected') warnings.push({ code: 'TIME_INDEX_DETECTED', column: labelName!, format: parsed.format, frequency: parsed.frequency });
  } else if (times !== undefined) {
    const t = Array.from(times);
    timeColumn = { name: null, how: 'named', format: 'integer', frequency: frequency ?? 'integer', frequencySource: frequency ? 'given' : 'format',
      first: String(t[0]), last: String(t[t.length - 1]), missingPeriods: t.length ? t[t.length - 1] - t[0] + 1 - t.length : 0 };
  } else if (keep !== null) {
    // no time index: the data rows are consecutive periods, so a dropped row is a gap
    times = keep.map((i) => i + 1);
    timeColumn = { name: null, how: 'rows', format: 'integer', frequency: 'integer', frequencySource: 'format',
      first: String(keep[0] + 1), last: String(keep[keep.length - 1] + 1), missingPeriods: keep[keep.length - 1] - keep[0] + 1 - keep.length };
  }
  if (droppedRows) warnings.push({ code: 'ROWS_DROPPED', count: droppedRows.count, rows: droppedRows.rows, asGaps: true });
  let xOut: RegressorInput = x;
  if (keep !== null) {
    if (Array.isArray(x)) xOut = keep.map((i) => (x as ReadonlyArray<ArrayLike<number>>)[i]);
    else {
      const o: Record<string, number[]> = {};
      for (const [k, v] of Object.entries(x as Record<string, ArrayLike<number>>)) o[k] = keep.map((i) => v[i]);
      xOut = o;
    }
  }
  return {
    y: pick(input.y) as ArrayLike<number> | undefined,
    residuals: pick(input.residuals) as ArrayLike<number> | undefined,
    x: xOut, times, timeColumn, droppedRows, warnings,
  };
}
