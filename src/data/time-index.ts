/**
 * Time labels and the rule that picks the time index of a table (docs/methods.md, section 12).
 *
 * A time label becomes an integer period number, so that "exactly `lag` periods apart" is a
 * difference of integers (src/core/difference.ts):
 *
 *   integer       2001                  period = the integer           frequency: as given, else 'integer'
 *   quarter       2015Q3, 2015-Q3       period = 4 year + (quarter - 1) quarterly
 *   month         2015-07               period = 12 year + (month - 1)  monthly
 *   ISO date      2015-07-31            inferred from the dates (below), or as given
 *
 * For ISO dates the frequency is the coarsest of annual, quarterly, monthly, weekly and daily that
 * numbers every date distinctly and keeps the calendar position of the dates fixed: annual when
 * every date has the same month and day, quarterly when the day is fixed and the months are the
 * same position within their quarters, monthly when the day of the month is fixed (a day at the end
 * of its month, such as 31 January, 28 February, 31 March, counts as fixed), weekly when every
 * date falls on the same weekday, daily when some two dates are one day apart. Dates that fit none
 * are refused (TIME_IRREGULAR) rather than numbered on a scale that would make every pair a gap.
 *
 * The time-index rule (the same for the library, the command line and the page): a column named as
 * the time index is the time index. When none is named, the time index is the first column, in the
 * order of the table, that is neither y nor a regressor the caller listed, whose labels read as
 * strictly increasing periods, and that either has a time-like name (year, yr, quarter, qtr, month,
 * week, day, date, time, period, case-insensitive) or holds quarter, month or date labels (which
 * cannot be regressors). Every other numeric column is a regressor; a regressor that looks like a
 * time index with gaps (strictly increasing whole numbers with uneven steps) is flagged.
 */
import { DwError } from '../errors.js';

/** The frequency of a time index. 'integer' is an index of whole numbers with no calendar meaning. */
export type TimeFrequency = 'annual' | 'quarterly' | 'monthly' | 'weekly' | 'daily' | 'integer';

/** All frequencies, in the order they are tried for ISO dates (coarsest first), then 'integer'. */
export const TIME_FREQUENCIES: readonly TimeFrequency[] = ['annual', 'quarterly', 'monthly', 'weekly', 'daily', 'integer'];

/** The format of the labels. */
export type TimeLabelFormat = 'integer' | 'quarter' | 'month' | 'date';

/** A parsed time index. */
export interface TimeIndex {
  /** Integer period numbers, strictly increasing, one per observation. */
  periods: Float64Array;
  format: TimeLabelFormat;
  frequency: TimeFrequency;
  /** Whether the frequency was inferred from the labels or given by the caller. */
  frequencySource: 'inferred' | 'given' | 'format';
  /** First and last label, as given. */
  first: string;
  last: string;
  /** Periods missing between the first and the last label. */
  missingPeriods: number;
}

/** Options of {@link parseTimeLabels}. */
export interface TimeLabelOptions {
  /** Frequency to use instead of the inferred one (ISO dates), or to label integers. */
  frequency?: TimeFrequency;
  /** Column name, for messages. */
  column?: string;
  /** Where the labels come from, for messages (e.g. "'sales.csv'"). */
  source?: string;
  /** 1-based row numbers of the labels in the caller's data (default 1, 2, ...), for messages. */
  rows?: ArrayLike<number>;
}

/** Missing-value codes (as in src/data/csv.ts), compared in lower case. */
const MISSING = ['', 'na', 'n/a', 'nan', 'null', 'none', '.', '-', '?', '#n/a', 'missing'];
const INTEGER = /^[+-]?\d+$/;
const DECIMAL = /^[+-]?(\d+\.\d*|\.\d+|\d+)([eE][+-]?\d+)?$/;
const QUARTER = /^(\d{4})-?[Qq](\d+)$/;
const MONTH = /^(\d{4})-(\d{2})$/;
const DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
/** Day-month order unknown (01/02/2015, 1.2.2015): refused as ambiguous. */
const SLASHED = /^\d{1,4}[/.]\d{1,2}[/.]\d{1,4}$/;

interface Label { format: TimeLabelFormat; year: number; sub: number; day: number; value: number }

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/** Days since 1970-01-01 (UTC calendar). */
function dayNumber(year: number, month: number, day: number): number {
  return Math.round(Date.UTC(year, month - 1, day) / 86400000);
}

function where(options: TimeLabelOptions, i: number): string {
  const row = options.rows ? options.rows[i] : i + 1;
  const col = options.column !== undefined ? `, column '${options.column}'` : '';
  return `data row ${row}${col}${options.source ? ` of ${options.source}` : ''}`;
}

function detail(options: TimeLabelOptions, i: number, value: string) {
  return { file: options.source, row: options.rows ? options.rows[i] : i + 1, column: options.column, value };
}

/** Read one label, or null when it is in none of the formats. */
function readLabel(text: string): Label | null | 'invalid' {
  const v = text.trim();
  if (INTEGER.test(v)) {
    const x = Number(v);
    if (!Number.isSafeInteger(x)) return 'invalid';
    return { format: 'integer', year: 0, sub: 0, day: 0, value: x };
  }
  // a whole number written as 2001.0 or 2.001e3 (as spreadsheets export them) is an integer label
  if (DECIMAL.test(v) && Number.isSafeInteger(Number(v))) return { format: 'integer', year: 0, sub: 0, day: 0, value: Number(v) };
  let m = QUARTER.exec(v);
  if (m) {
    const q = Number(m[2]);
    if (q < 1 || q > 4) return 'invalid';
    return { format: 'quarter', year: Number(m[1]), sub: q, day: 0, value: 4 * Number(m[1]) + q - 1 };
  }
  m = MONTH.exec(v);
  if (m) {
    const mo = Number(m[2]);
    if (mo < 1 || mo > 12) return 'invalid';
    return { format: 'month', year: Number(m[1]), sub: mo, day: 0, value: 12 * Number(m[1]) + mo - 1 };
  }
  m = DATE.exec(v);
  if (m) {
    const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
    if (mo < 1 || mo > 12 || d < 1 || d > daysInMonth(y, mo)) return 'invalid';
    return { format: 'date', year: y, sub: mo, day: d, value: dayNumber(y, mo, d) };
  }
  return null;
}

const FORMAT_WORDS: Record<TimeLabelFormat, string> = {
  integer: 'whole numbers', quarter: 'quarters (2015Q1)', month: 'months (2015-01)', date: 'ISO dates (2015-01-31)',
};

/**
 * True when the text reads as a time label in one of the accepted formats (for the rule that
 * picks the time index; it does not check order).
 *
 * @example
 * ```ts
 * isTimeLabel('2015Q1');   // true
 * isTimeLabel('3.5');      // false
 * ```
 */
export function isTimeLabel(text: string): boolean {
  const l = readLabel(text);
  return l !== null && l !== 'invalid';
}

/** Period numbers of dates at a given frequency. */
function datePeriods(labels: Label[], frequency: TimeFrequency): Float64Array {
  return Float64Array.from(labels, (l) => {
    switch (frequency) {
      case 'annual': return l.year;
      case 'quarterly': return 4 * l.year + Math.floor((l.sub - 1) / 3);
      case 'monthly': return 12 * l.year + l.sub - 1;
      // weeks counted from Monday 1970-01-05 (day 4)
      case 'weekly': return Math.floor((l.value - 4) / 7);
      default: return l.value;
    }
  });
}

/** The coarsest frequency that fits the dates, or null (irregular). */
function inferDateFrequency(labels: Label[]): TimeFrequency | null {
  const endOfMonth = labels.every((l) => l.day === daysInMonth(l.year, l.sub));
  const sameDay = labels.every((l) => l.day === labels[0].day) || endOfMonth;
  if (labels.every((l) => l.sub === labels[0].sub) && sameDay) return 'annual';
  if (sameDay && labels.every((l) => (l.sub - 1) % 3 === (labels[0].sub - 1) % 3)) return 'quarterly';
  if (sameDay) return 'monthly';
  const weekday = (l: Label) => ((l.value % 7) + 7) % 7;
  if (labels.every((l) => weekday(l) === weekday(labels[0]))) return 'weekly';
  for (let i = 1; i < labels.length; i++) if (labels[i].value - labels[i - 1].value === 1) return 'daily';
  return null;
}

/**
 * Parse time labels into integer period numbers with their frequency. Refused with a
 * {@link DwError}: a label in none of the formats (`TIME_LABEL_INVALID`, also for 2015Q5,
 * 2015-13, 2015-02-30 and non-whole numbers), day-month-year forms such as 01/02/2015
 * (`TIME_LABEL_AMBIGUOUS`), labels in more than one format (`TIME_FORMATS_MIXED`), dates of no
 * regular frequency (`TIME_IRREGULAR`), a frequency that contradicts the format
 * (`TIME_FREQUENCY_CONFLICT`), repeated or decreasing periods (`TIME_INVALID`).
 *
 * @example
 * ```ts
 * parseTimeLabels(['2015Q1', '2015Q2', '2015Q4']).periods;  // Float64Array [8060, 8061, 8063]
 * parseTimeLabels(['2015-01-31', '2015-02-28', '2015-03-31']).frequency; // 'monthly'
 * parseTimeLabels([2001, 2002, 2004]).missingPeriods;       // 1
 * ```
 */
export function parseTimeLabels(labels: ArrayLike<string | number>, options: TimeLabelOptions = {}): TimeIndex {
  const n = labels.length;
  if (n === 0) throw new DwError('TOO_FEW_ROWS', 'The time index has no labels.', 'Give one time label per observation.');
  const read: Label[] = [];
  for (let i = 0; i < n; i++) {
    const raw = labels[i];
    const text = typeof raw === 'number' ? (Number.isFinite(raw) ? String(raw) : 'NaN') : String(raw ?? '').trim();
    // no missing-value code reads as a label, so the codes are looked for only when reading fails
    const l = readLabel(text);
    if (l === null || l === 'invalid') {
      if (MISSING.includes(text.toLowerCase())) {
        throw new DwError('CELL_EMPTY', `Missing time label ${text === '' ? '(empty cell)' : `'${text}'`} at ${where(options, i)}.`,
          'Fill the label, or drop the rows with missing values (they become gaps).', detail(options, i, text));
      }
      if (SLASHED.test(text)) {
        throw new DwError('TIME_LABEL_AMBIGUOUS', `The time label '${text}' at ${where(options, i)} does not say which number is the day and which the month.`,
          'Write dates in ISO form, year-month-day (2015-02-01).', detail(options, i, text));
      }
      const number = /^[+-]?(\d+\.\d*|\.\d+|\d+)([eE][+-]?\d+)?$/.test(text);
      if (number) {
        // a time that is a number but not a whole one keeps its old code
        throw new DwError('TIME_INVALID', `The time ${text} at ${where(options, i)} is not a whole number${INTEGER.test(text) ? ' that can be represented exactly' : ''}.`,
          'The time column must hold whole numbers (years, period numbers), quarters (2015Q1), months (2015-01) or ISO dates (2015-01-31).', detail(options, i, text));
      }
      throw new DwError('TIME_LABEL_INVALID', `The time label '${text}' at ${where(options, i)} is ${l === 'invalid' ? 'not a valid period' : 'not a time label'}.`,
        'Time labels must be whole numbers (2001), quarters (2015Q1 or 2015-Q1), months (2015-01) or ISO dates (2015-01-31).', detail(options, i, text));
    }
    if (read.length > 0 && l.format !== read[0].format) {
      throw new DwError('TIME_FORMATS_MIXED', `The time labels mix ${FORMAT_WORDS[read[0].format]} and ${FORMAT_WORDS[l.format]}: '${text}' at ${where(options, i)}.`,
        'Write every time label in the same format.', detail(options, i, text));
    }
    read.push(l);
  }
  const format = read[0].format;
  let frequency: TimeFrequency;
  let frequencySource: TimeIndex['frequencySource'];
  const given = options.frequency;
  if (given !== undefined && !TIME_FREQUENCIES.includes(given)) {
    throw new DwError('OPTION_VALUE', `The frequency '${String(given)}' is not one of ${TIME_FREQUENCIES.join(', ')}.`, 'Choose one of these frequencies.', { value: String(given) });
  }
  const fixed: Partial<Record<TimeLabelFormat, TimeFrequency>> = { quarter: 'quarterly', month: 'monthly' };
  let periods: Float64Array;
  if (format === 'date') {
    if (given === 'integer') {
      throw new DwError('TIME_FREQUENCY_CONFLICT', 'Dates cannot be read as a plain integer index.', 'Choose annual, quarterly, monthly, weekly or daily.');
    }
    const inferred = given ?? inferDateFrequency(read);
    if (inferred === null) {
      throw new DwError('TIME_IRREGULAR',
        `The dates of ${options.column !== undefined ? `column '${options.column}'` : 'the time index'} (${String(labels[0])} to ${String(labels[n - 1])}) follow no regular frequency: they are not a fixed day of the year, quarter or month, not one weekday, and no two are one day apart.`,
        'Name the frequency of the series (annual, quarterly, monthly, weekly or daily).');
    }
    frequency = inferred;
    frequencySource = given ? 'given' : 'inferred';
    periods = datePeriods(read, frequency);
  } else {
    const natural = fixed[format];
    if (natural !== undefined && given !== undefined && given !== natural) {
      throw new DwError('TIME_FREQUENCY_CONFLICT', `The time labels are ${FORMAT_WORDS[format]}, which are ${natural}, but the frequency given is ${given}.`,
        `Leave the frequency out (it is ${natural}), or give dates.`);
    }
    frequency = natural ?? given ?? 'integer';
    frequencySource = natural ? 'format' : given ? 'given' : 'format';
    periods = Float64Array.from(read, (l) => l.value);
  }
  for (let i = 1; i < n; i++) {
    const a = String(labels[i - 1]).trim();
    const b = String(labels[i]).trim();
    if (periods[i] === periods[i - 1]) {
      const same = a === b;
      throw new DwError('TIME_INVALID', same
        ? `The time ${b} appears twice, at ${where(options, i - 1)} and row ${options.rows ? options.rows[i] : i + 1}.`
        : `The times ${a} and ${b} (${where(options, i)}) fall in the same period at ${frequency} frequency.`,
      same ? 'Each period may appear once: remove or merge the duplicated row.' : 'Each period may appear once: merge the rows, or name a finer frequency.', detail(options, i, b));
    }
    if (periods[i] < periods[i - 1]) {
      throw new DwError('TIME_INVALID', `The times decrease at ${where(options, i)}: ${b} comes after ${a}.`, 'Sort the rows by time (oldest first).', detail(options, i, b));
    }
  }
  return {
    periods, format, frequency, frequencySource,
    first: String(labels[0]).trim(), last: String(labels[n - 1]).trim(),
    missingPeriods: periods[n - 1] - periods[0] + 1 - n,
  };
}

/** Names that mark a time index (compared case-insensitively). */
export const TIME_NAMES: readonly string[] = ['year', 'years', 'yr', 'quarter', 'qtr', 'month', 'week', 'day', 'date', 'time', 'period'];

/** A column as the time rule sees it: its name and its cells as text (missing cells as ''). */
export interface TimeRuleColumn {
  name: string;
  cells: ArrayLike<string | number>;
}

/** What the rule decided. */
export interface TimeIndexChoice {
  /** The time column, or null (the rows are consecutive periods). */
  column: string | null;
  how: 'named' | 'detected' | 'none';
  /** Numeric columns that look like a time index with gaps and are not the time index. */
  gapsNotHonoured: string[];
}

/**
 * True when the cells are strictly increasing time labels (any accepted format).
 *
 * @example
 * ```ts
 * readsAsTimeIndex(['2001', '2002', '2004']); // true
 * readsAsTimeIndex(['1.5', '2.5']);           // false
 * ```
 */
export function readsAsTimeIndex(cells: ArrayLike<string | number>): TimeLabelFormat | null {
  if (cells.length < 2) return null;
  try {
    return parseTimeLabels(cells).format;
  } catch {
    return null;
  }
}

/**
 * True when the cells are strictly increasing whole numbers with uneven steps: a time index with
 * gaps, if it is one.
 *
 * @example
 * ```ts
 * looksLikeGappedIndex([2001, 2002, 2004]); // true
 * looksLikeGappedIndex([2001, 2002, 2003]); // false
 * ```
 */
export function looksLikeGappedIndex(cells: ArrayLike<string | number>): boolean {
  const n = cells.length;
  if (n <= 2) return false;
  let minStep = Infinity, maxStep = 0;
  let prev = NaN;
  for (let i = 0; i < n; i++) {
    const text = String(cells[i]).trim();
    if (!DECIMAL.test(text)) return false;
    const v = Number(text);
    if (!Number.isSafeInteger(v)) return false;
    if (i > 0) {
      const step = v - prev;
      if (!(step > 0)) return false;
      minStep = Math.min(minStep, step);
      maxStep = Math.max(maxStep, step);
    }
    prev = v;
  }
  return maxStep > minStep;
}

/**
 * The time-index rule, the same for the library, the command line and the page (see the comment
 * at the top of this file and README.md).
 *
 * @param columns every column of the data, in order (y, listed regressors and the rest)
 * @param options `named`: the time column the caller named (a string), or false for none (the
 *   rule then takes no column); `y`: the dependent variable; `listed`: regressors the caller
 *   listed explicitly (never taken as time)
 *
 * @example
 * ```ts
 * chooseTimeIndex([{ name: 'year', cells: ['2001', '2002', '2004'] }, { name: 'y', cells: ['1', '2', '3'] }], { y: 'y' });
 * // { column: 'year', how: 'detected', gapsNotHonoured: [] }
 * ```
 */
export function chooseTimeIndex(columns: TimeRuleColumn[], options: { named?: string | false; y?: string; listed?: string[] } = {}): TimeIndexChoice {
  const listed = new Set(options.listed ?? []);
  // missing cells do not decide whether a column is a time index (rows with them may be dropped)
  columns = columns.map((c) => ({ name: c.name, cells: Array.from(c.cells).filter((v) => !MISSING.includes(String(v).trim().toLowerCase())) }));
  let column: string | null = null;
  let how: TimeIndexChoice['how'] = 'none';
  if (typeof options.named === 'string') {
    column = options.named;
    how = 'named';
  } else if (options.named !== false) {
    for (const c of columns) {
      if (c.name === options.y || listed.has(c.name)) continue;
      const format = readsAsTimeIndex(c.cells);
      if (format === null) continue;
      if (format !== 'integer' || TIME_NAMES.includes(c.name.trim().toLowerCase())) {
        column = c.name;
        how = 'detected';
        break;
      }
    }
  }
  const gapsNotHonoured = columns
    .filter((c) => c.name !== column && c.name !== options.y && looksLikeGappedIndex(c.cells))
    .map((c) => c.name);
  return { column, how, gapsNotHonoured };
}
