/**
 * The messages between the page (main.ts) and its computing worker (worker.ts). Only plain data
 * crosses: the test result is the library's own DwTestResult, structured-cloned as it is.
 */
import type { TimeFrequency } from '../data/time-index.js';
import type { Alternative, DwTestResult } from '../inference/dw-test.js';
import type { MethodChoice } from '../core/types.js';
import type { Adjustment } from '../batch/adjust.js';
import type { BatchResult } from '../batch/batch.js';
import type { BatchDownloads, ReportExtras } from './adapter.js';

/** How to read the CSV text ('auto' lets the library detect it). */
export interface ReadOptions {
  delimiter: 'auto' | ',' | ';' | '\t';
  decimal: 'auto' | 'point' | 'comma';
}

/** The data as the user gave it. */
export interface DataSource extends ReadOptions {
  text: string;
  /** Shown in messages: the file name, 'the demo data' or 'the pasted text'. */
  source: string;
  /** SHA-256 of the file's bytes (SubtleCrypto, computed in the page), when it could be computed. */
  sha256?: string;
  /** Size of the file in bytes. */
  bytes?: number;
}

/** What the user chose for the model and the test. */
export interface ModelChoice {
  /** Grouping column: one exact test per group of rows with the same value (exactDwBatch), or null for the one test of all rows. */
  by: string | null;
  /** With a grouping column: the adjustment of the p-values over the groups, or null for none. */
  adjust: Adjustment | null;
  y: string;
  x: string[];
  /** Time column (not a regressor), or null. */
  time: string | null;
  /**
   * With a grouping column and no time column: let the library's time-index rule choose the time
   * column group by group (false: the rows of each group are consecutive periods).
   */
  timeRule: boolean;
  /** Drop rows with a missing value in a used column (they become gaps). */
  dropMissing: boolean;
  /** Frequency of ISO-date time labels instead of the inferred one, or null (inferred). */
  frequency: TimeFrequency | null;
  lag: number;
  intercept: boolean;
  alternative: Alternative;
  alpha: number;
  /** rho at which to show the exact power, or null for none. */
  rho: number | null;
  method: MethodChoice;
}

export type Request =
  | { kind: 'inspect'; id: number; data: DataSource }
  | { kind: 'compute'; id: number; data: DataSource; model: ModelChoice };

/** A column of the table as the page shows it. */
export interface ColumnInfo {
  name: string;
  /** Every cell is a number. */
  numeric: boolean;
  /** Strictly increasing time labels (whole numbers, quarters, months, dates): can serve as the time column. */
  timeLike: boolean;
  /** Cells read as missing values. */
  missing?: number;
  /** Every cell that is not missing reads as a time label (increasing or not): can be the time column within groups. */
  timeLabels?: boolean;
  /** Distinct values (after trimming; missing cells not counted): the groups it would make as the grouping column. */
  distinct?: number;
}

/** Summary of a parsed table for the column pickers. */
export interface TableSummary {
  source: string;
  columns: ColumnInfo[];
  rows: number;
  delimiter: string;
  decimal: 'point' | 'comma';
  /** The first rows, as text. */
  preview: string[][];
  /** A first choice of y, the regressors and the time column. */
  guess: { y: string | null; x: string[]; time: string | null };
}

/** An error as the user sees it: the library's message and hint, never a stack. */
export interface PlainError {
  code: string;
  message: string;
  hint: string;
}

/** An optional part of the result (power, figure, paragraph, Markdown report) that failed. */
export type OptionalPart = 'power' | 'figure' | 'paragraph' | 'markdown';

export type Reply =
  | { kind: 'progress'; id: number; step: number; steps: number; stage: string }
  | { kind: 'inspected'; id: number; table: TableSummary }
  | { kind: 'result'; id: number; result: DwTestResult; extras: ReportExtras; failures: Partial<Record<OptionalPart, PlainError>> }
  | { kind: 'batch-result'; id: number; batch: BatchResult; downloads: BatchDownloads }
  | { kind: 'error'; id: number; error: PlainError };
