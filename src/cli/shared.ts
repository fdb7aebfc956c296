/**
 * Pieces that several commands share: reading a table, choosing its columns, and the options
 * that define the statistic (intercept, lag, time column, engine).
 */
import { DwError } from '../errors.js';
import { TERMINAL_STYLE, formatProbability, type ProbabilityContext } from '../core/format-number.js';
import { createHash } from 'node:crypto';
import { numericColumn, parseCsv, columnIndex, isTextColumn, textColumn, type CsvOptions, type DataTable } from '../data/csv.js';
import { chooseTimeIndex, parseTimeLabels, TIME_FREQUENCIES, type TimeFrequency } from '../data/time-index.js';
import type { DwWarning } from '../inference/warnings.js';
import { inline } from '../report/format.js';
import { warningText } from '../report/wording.js';
import type { InputDescription } from '../inference/dw-test.js';
import type { ProblemOptions } from '../problem/problem.js';
import { choiceOption, integerOption, listOption, methodOption, type OptionSpecs, type OptionValues } from './args.js';
import type { CliIo } from './io.js';

/** Options that say how to read a CSV file. */
export const CSV_OPTIONS: OptionSpecs = {
  delimiter: { type: 'string', value: 'CHAR', help: "field delimiter: ',' ';' or 'tab' (detected when omitted)" },
  decimal: { type: 'string', value: 'MARK', help: "decimal mark: 'point' or 'comma' (detected when omitted)" },
};

/** The design file of `pvalue`, `critical` and `power`: every column a regressor. */
export const DESIGN_OPTION: OptionSpecs = {
  design: { type: 'string', value: 'FILE', help: 'CSV of regressors: a header row, every column a regressor' },
};

/** `--format` for commands that print text or JSON. */
export const TEXT_JSON_FORMAT: OptionSpecs = {
  format: { type: 'string', value: 'FMT', help: 'text (default) or json' },
};

/** Options that define the statistic and the engine. */
export const MODEL_OPTIONS: OptionSpecs = {
  'no-intercept': { type: 'boolean', help: 'do not add an intercept (a constant column you supply still counts as one)' },
  lag: { type: 'string', value: 'J', help: 'difference at lag J (default 1; 4 for quarterly data, Wallis 1972)' },
  time: { type: 'string', value: 'COL', help: 'time column: integers, quarters (2015Q1, 2015-Q1), months (2015-01) or ISO dates; not a regressor; gaps are honoured' },
  'no-time': { type: 'boolean', help: 'no time index: do not take a time-like column as the time index (the rows are consecutive)' },
  frequency: { type: 'string', value: 'F', help: 'frequency of the --time dates: annual, quarterly, monthly, weekly or daily (inferred when omitted)' },
  method: { type: 'string', value: 'ENGINE', help: 'auto (default), imhof, pan, eigenfree, saddlepoint or dct' },
};

/**
 * Read and parse a CSV file named on the command line.
 *
 * @example
 * ```ts
 * const table = loadTable(processIo, 'sales.csv', { delimiter: ';', decimal: 'comma' });
 * table.headers; // the column names of sales.csv
 * ```
 */
export function loadTable(io: CliIo, path: string, values: OptionValues): DataTable {
  return parseCsv(io.readText(path), csvOptionsOf(values, path));
}

/**
 * The file name, size and SHA-256 of a data file, for the reproducibility record of a result.
 *
 * @example
 * ```ts
 * describeInput(processIo, 'sales.csv'); // { name: 'sales.csv', sha256: '9f86d0...', bytes: 1234 }
 * ```
 */
export function describeInput(io: CliIo, path: string): InputDescription {
  if (!io.readBytes) return { name: path };
  const bytes = io.readBytes(path);
  return { name: path, sha256: createHash('sha256').update(bytes).digest('hex'), bytes: bytes.length };
}

/**
 * --frequency, checked.
 *
 * @example
 * ```ts
 * frequencyOption({ frequency: 'quarterly' }); // 'quarterly'
 * ```
 */
export function frequencyOption(values: OptionValues): TimeFrequency | undefined {
  if (values.frequency === undefined) return undefined;
  if (typeof values.time !== 'string') {
    throw new DwError('OPTION_CONFLICT', '--frequency describes the --time column, but no --time column is named.', 'Add --time COL, or leave --frequency out.');
  }
  return choiceOption<TimeFrequency>(values, 'frequency', TIME_FREQUENCIES.filter((f) => f !== 'integer'), 'annual');
}

/**
 * The time-index rule (src/data/time-index.ts) for commands that print no report (pvalue,
 * critical, power, diagnose): the options with `time` set to the column the rule takes, and a note
 * on stderr that says so, or that names a regressor whose gaps are not honoured.
 *
 * @example
 * ```ts
 * const v = applyTimeRule(processIo, table, values); // v.time === 'year' for a file with a year column
 * ```
 */
export function applyTimeRule(io: CliIo, table: DataTable, values: OptionValues, y?: string): OptionValues {
  const noTime = values['no-time'] === true;
  if (noTime && typeof values.time === 'string') {
    throw new DwError('OPTION_CONFLICT', '--time names a time column and --no-time asks for none.', 'Give one of them.');
  }
  const named = typeof values.time === 'string' ? values.time : noTime ? false : undefined;
  if (typeof named === 'string') columnIndex(table, named);
  const choice = chooseTimeIndex(table.headers.map((h) => ({ name: h, cells: textColumn(table, h) })), { named, y, listed: listOption(values, 'x') });
  const note = (w: DwWarning) => io.err(`exact-dw: note: ${inline(warningText(w), 'text')}\n`);
  if (choice.how === 'detected' && choice.column !== null) {
    const t = parseTimeLabels(textColumn(table, choice.column), { column: choice.column, source: table.source });
    note({ code: 'TIME_INDEX_DETECTED', column: choice.column, format: t.format, frequency: t.frequency });
  }
  if (choice.column === null) for (const c of choice.gapsNotHonoured) note({ code: 'TIME_GAPS_NOT_HONOURED', column: c });
  return { ...values, time: choice.column ?? undefined };
}

/**
 * Problem options (intercept, lag, times, engine) from the command line and the table.
 *
 * @example
 * ```ts
 * problemOptions({ lag: '4', time: 'year' }, table);
 * // { intercept: true, lag: 4, times: Float64Array [2001, 2002, 2004], method: 'auto' }
 * ```
 */
export function problemOptions(values: OptionValues, table?: DataTable): ProblemOptions {
  const lag = integerOption(values, 'lag', 1);
  if (lag !== undefined && lag < 1) {
    throw new DwError('LAG_INVALID', `--lag must be at least 1 (got ${lag}).`, 'Use 1 for annual data, 4 for quarterly.');
  }
  const timeCol = values.time;
  let times: Float64Array | undefined;
  if (typeof timeCol === 'string') {
    if (!table) throw new DwError('OPTION_CONFLICT', '--time needs a data file with a time column.', 'Give the file that holds it.');
    times = timeColumn(table, timeCol, frequencyOption(values));
  }
  return { intercept: !values['no-intercept'], lag, times, method: methodOption(values) };
}

/**
 * The time column as period numbers (src/data/time-index.ts: integers, quarters, months, ISO
 * dates), checked where it enters, so that errors name the file, the data row and the column.
 *
 * @example
 * ```ts
 * const table = parseCsv('year,sales\n2001,3.1\n2002,2.4\n2004,3.9\n');
 * timeColumn(table, 'year'); // Float64Array [2001, 2002, 2004] (a gap at 2003 is allowed)
 * ```
 */
export function timeColumn(table: DataTable, column: string, frequency?: TimeFrequency): Float64Array {
  columnIndex(table, column);
  return parseTimeLabels(textColumn(table, column), { column, source: table.source, frequency }).periods;
}

/**
 * Columns of a design file as regressors: every column except the time column.
 *
 * @example
 * ```ts
 * // columns year, sales, price
 * Object.keys(designColumns(table, { time: 'year' }, ['sales'])); // ['price']
 * ```
 */
export function designColumns(table: DataTable, values: OptionValues, exclude: string[] = []): Record<string, Float64Array> {
  const skip = new Set(exclude);
  if (typeof values.time === 'string') { columnIndex(table, values.time); skip.add(values.time); }
  const out: Record<string, Float64Array> = {};
  for (const h of table.headers) if (!skip.has(h)) out[h] = numericColumn(table, h);
  return out;
}

/**
 * The regressors of a data file: --x if given, else every other column that holds numbers. A
 * column of text (no cell a number: labels, country names) is left out by default; a column with
 * numbers and some cells that are not is an error naming the first bad cell, never dropped silently.
 *
 * @example
 * ```ts
 * // columns year, sales, price, region (region holds text)
 * Object.keys(chooseRegressors(table, { time: 'year' }, 'sales')); // ['price']
 * ```
 */
export function chooseRegressors(table: DataTable, values: OptionValues, yName: string, missingAsNaN = false): Record<string, Float64Array> {
  const listed = listOption(values, 'x');
  const time = typeof values.time === 'string' ? values.time : undefined;
  if (time !== undefined && time === yName) {
    throw new DwError('OPTION_CONFLICT', `'${yName}' is given both as --y and as --time.`, 'The time column must be a separate column of periods.', { column: yName });
  }
  const out: Record<string, Float64Array> = {};
  if (listed) {
    for (const name of listed) {
      if (name === yName) throw new DwError('OPTION_CONFLICT', `'${name}' is both --y and a regressor in --x.`, 'Remove it from --x.', { column: name });
      if (name === time) throw new DwError('OPTION_CONFLICT', `'${name}' is the time column and cannot also be a regressor.`, 'Remove it from --x, or add a trend column of your own.', { column: name });
      if (name in out) throw new DwError('COLUMN_REPEATED', `'${name}' is listed twice in --x.`, 'List each regressor once.', { column: name });
      out[name] = numericColumn(table, name, { missingAsNaN });
    }
    return out;
  }
  for (const h of table.headers) {
    if (h === yName || h === time) continue;
    if (isTextColumn(table, h)) continue; // a label column is not a regressor by default
    try {
      out[h] = numericColumn(table, h, { missingAsNaN });
    } catch (err) {
      if (!(err instanceof DwError)) throw err;
      throw new DwError(err.code, err.message,
        `${err.hint} (Without --x every numeric column is a regressor; to leave '${h}' out, list the regressors with --x.)`, err.detail);
    }
  }
  return out;
}

/**
 * Format a probability for a terminal (src/core/format-number.ts, TERMINAL_STYLE): up to six
 * decimals down to 1e-4, then four significant digits; with `alpha`, more digits when needed to
 * stay on its side of alpha; with an `errorBound`, a value clamped to 0 as "< bound".
 *
 * @example
 * ```ts
 * formatP(0.0312);                  // "0.0312"
 * formatP(0.00001234);              // "1.234e-5"
 * formatP(0, { errorBound: 1e-12 }); // "< 1e-12"
 * ```
 */
export function formatP(p: number, context: ProbabilityContext = {}): string {
  return formatProbability(p, TERMINAL_STYLE, context).text;
}

/**
 * The CSV reading options of the command line (--delimiter, --decimal) for `parseCsv`, for
 * commands that hand the file's text on (to worker threads) rather than a parsed table.
 *
 * @example
 * ```ts
 * csvOptionsOf({ delimiter: 'tab' }, 'shops.tsv'); // { delimiter: '\t', decimal: undefined, source: "'shops.tsv'" }
 * ```
 */
export function csvOptionsOf(values: OptionValues, path: string): CsvOptions {
  const d = values.delimiter;
  let delimiter: ',' | ';' | '\t' | undefined;
  if (d !== undefined) {
    const map: Record<string, ',' | ';' | '\t'> = { ',': ',', comma: ',', ';': ';', semicolon: ';', tab: '\t', '\t': '\t' };
    delimiter = map[String(d)];
    if (!delimiter) throw new DwError('OPTION_VALUE', `--delimiter must be ',', ';' or 'tab' (got '${String(d)}').`, "Use --delimiter ';' for files with decimal commas, --delimiter tab for tab-separated files.");
  }
  const decimal = values.decimal === undefined ? undefined : choiceOption(values, 'decimal', ['point', 'comma'] as const, 'point');
  return { delimiter, decimal, source: `'${path}'` };
}
