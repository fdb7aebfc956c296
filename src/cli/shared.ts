/**
 * Pieces that several commands share: reading a table, choosing its columns, and the options
 * that define the statistic (intercept, lag, time column, engine).
 */
import { DwError } from '../errors.js';
import { numericColumn, parseCsv, columnIndex, type DataTable } from '../data/csv.js';
import type { ProblemOptions } from '../inference/problem.js';
import { choiceOption, integerOption, listOption, methodOption, type OptionSpecs, type OptionValues } from './args.js';
import type { CliIo } from './io.js';

/** Options that say how to read a CSV file. */
export const CSV_OPTIONS: OptionSpecs = {
  delimiter: { type: 'string', value: 'CHAR', help: "field delimiter: ',' ';' or 'tab' (detected when omitted)" },
  decimal: { type: 'string', value: 'MARK', help: "decimal mark: 'point' or 'comma' (detected when omitted)" },
};

/** Options that define the statistic and the engine. */
export const MODEL_OPTIONS: OptionSpecs = {
  'no-intercept': { type: 'boolean', help: 'do not add an intercept (a constant column you supply still counts as one)' },
  lag: { type: 'string', value: 'J', help: 'difference at lag J (default 1; 4 for quarterly data, Wallis 1972)' },
  time: { type: 'string', value: 'COL', help: 'integer time column (years, quarter numbers); not a regressor; gaps are honoured' },
  method: { type: 'string', value: 'ENGINE', help: 'auto (default), imhof, pan or eigenfree' },
};

/** Read and parse a CSV file named on the command line. */
export function loadTable(io: CliIo, path: string, values: OptionValues): DataTable {
  const d = values.delimiter;
  let delimiter: ',' | ';' | '\t' | undefined;
  if (d !== undefined) {
    const map: Record<string, ',' | ';' | '\t'> = { ',': ',', comma: ',', ';': ';', semicolon: ';', tab: '\t', '\t': '\t' };
    delimiter = map[String(d)];
    if (!delimiter) throw new DwError('OPTION_VALUE', `--delimiter must be ',', ';' or 'tab' (got '${String(d)}').`, "Use --delimiter ';' for files with decimal commas.");
  }
  const decimal = values.decimal === undefined ? undefined : choiceOption(values, 'decimal', ['point', 'comma'] as const, 'point');
  return parseCsv(io.readText(path), { delimiter, decimal, source: `'${path}'` });
}

/** Problem options (intercept, lag, times, engine) from the command line and the table. */
export function problemOptions(values: OptionValues, table?: DataTable): ProblemOptions {
  const lag = integerOption(values, 'lag', 1);
  if (lag !== undefined && lag < 1) {
    throw new DwError('LAG_INVALID', `--lag must be at least 1 (got ${lag}).`, 'Use 1 for annual data, 4 for quarterly.');
  }
  const timeCol = values.time;
  let times: Float64Array | undefined;
  if (typeof timeCol === 'string') {
    if (!table) throw new DwError('OPTION_CONFLICT', '--time needs a data file with a time column.', 'Give the file that holds it.');
    times = numericColumn(table, timeCol);
  }
  return { intercept: !values['no-intercept'], lag, times, method: methodOption(values) };
}

/** Columns of a design file as regressors: every column except the time column. */
export function designColumns(table: DataTable, values: OptionValues, exclude: string[] = []): Record<string, Float64Array> {
  const skip = new Set(exclude);
  if (typeof values.time === 'string') { columnIndex(table, values.time); skip.add(values.time); }
  const out: Record<string, Float64Array> = {};
  for (const h of table.headers) if (!skip.has(h)) out[h] = numericColumn(table, h);
  return out;
}

/** The regressors of a data file: --x if given, else every other numeric column. */
export function chooseRegressors(table: DataTable, values: OptionValues, yName: string): Record<string, Float64Array> {
  const listed = listOption(values, 'x');
  const time = typeof values.time === 'string' ? values.time : undefined;
  const out: Record<string, Float64Array> = {};
  if (listed) {
    for (const name of listed) {
      if (name === yName) throw new DwError('OPTION_CONFLICT', `'${name}' is both y and a regressor.`, 'Remove it from --x.', { column: name });
      if (name === time) throw new DwError('OPTION_CONFLICT', `'${name}' is the time column and cannot also be a regressor.`, 'Remove it from --x, or add a trend column of your own.', { column: name });
      if (name in out) throw new DwError('COLUMN_REPEATED', `'${name}' is listed twice in --x.`, 'List each regressor once.', { column: name });
      out[name] = numericColumn(table, name);
    }
    return out;
  }
  for (const h of table.headers) {
    if (h === yName || h === time) continue;
    try { out[h] = numericColumn(table, h); } catch { /* a text column is not a regressor by default */ }
  }
  return out;
}

/** Format a probability for a terminal: plain decimals down to 1e-4, then scientific. */
export function formatP(p: number): string {
  if (p === 0) return '0';
  if (p >= 1e-4) return p.toFixed(6).replace(/0+$/, '').replace(/\.$/, '');
  return p.toExponential(3);
}
