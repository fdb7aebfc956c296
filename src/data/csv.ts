/**
 * Reading a data table from CSV text (RFC 4180 grammar): a header row, then one row per
 * observation. Parsing of the grammar itself (quotes, embedded delimiters) is papaparse's; this
 * module adds what a statistics user needs on top: delimiter and decimal-comma detection, a UTF-8
 * byte-order mark, CR, LF or CRLF line ends, the empty column left by a trailing delimiter, and
 * errors that name the row and column, with numeric conversion of the columns asked for.
 *
 * What is accepted and what is refused is listed, with the error codes, in
 * docs/errors-and-limits.md (checked against test/catalogue.test.ts).
 */
import Papa from 'papaparse';
import { DwError, type DwSuggestion } from '../errors.js';

/** How the CSV text is to be read. */
export interface CsvOptions {
  /** Field delimiter; detected among `,` `;` and tab from the header row when omitted. */
  delimiter?: ',' | ';' | '\t';
  /**
   * Decimal mark; `comma` reads 3,14 as 3.14. Detected when omitted: with `;` or tab delimiters a
   * file whose numbers use commas (and none a point) is read with decimal commas; in a
   * comma-delimited file a decimal comma is only possible inside quotes ("3,14") and must be asked
   * for with `comma`.
   */
  decimal?: 'point' | 'comma';
  /** File name used in messages. */
  source?: string;
}

/** A parsed table: the header and the cells as text, row by row. */
export interface DataTable {
  headers: string[];
  rows: string[][];
  delimiter: string;
  decimal: 'point' | 'comma';
  source: string;
}

/** Cell texts read as a missing value (compared in lower case, after trimming). */
const MISSING = new Set(['', 'na', 'n/a', 'nan', 'null', 'none', '.', '-', '?', '#n/a', 'missing']);
const POINT_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const COMMA_NUMBER = /^[+-]?(\d+(,\d*)?|,\d+)([eE][+-]?\d+)?$/;
/** 1,234 or 12,345,678.9: digits grouped in threes by commas. */
const COMMA_THOUSANDS = /^[+-]?\d{1,3}(,\d{3})+(\.\d*)?$/;
/** 1.234 or 12.345.678,9: digits grouped in threes by points. */
const POINT_THOUSANDS = /^[+-]?\d{1,3}(\.\d{3})+(,\d*)?$/;
/** Smallest positive normal double: below it a value loses precision (or becomes 0). */
const MIN_NORMAL = 2.2250738585072014e-308;

/**
 * Parse CSV text into a {@link DataTable}.
 *
 * Accepted without options: a UTF-8 byte-order mark, CR / LF / CRLF line ends (also mixed),
 * quoted fields ("1.5" is the number 1.5), `;` or tab delimiters with decimal commas, blank lines
 * at the end, and a trailing delimiter on every row (an extra column that is empty throughout is
 * dropped). Refused with a {@link DwError}: empty text (`CSV_EMPTY`), a header and no rows
 * (`CSV_NO_DATA_ROWS`), an empty or repeated column name (`CSV_HEADER_EMPTY`,
 * `CSV_HEADER_DUPLICATE`), a row with the wrong number of fields (`CSV_RAGGED`), a blank line between
 * observations (`CELL_EMPTY`), an unclosed quote or binary content (`CSV_MALFORMED`), decimal commas
 * and points mixed in one file (`CSV_AMBIGUOUS_DECIMAL`).
 *
 * @example
 * ```ts
 * const table = parseCsv('year,y,x\n2001,1.5,3\n2002,1.7,4\n');
 * numericColumn(table, 'y'); // Float64Array [1.5, 1.7]
 * parseCsv('y;x\n1,5;3\n1,7;4\n').decimal; // 'comma'
 * ```
 */
export function parseCsv(text: string, options: CsvOptions = {}): DataTable {
  const source = options.source ?? 'the CSV input';
  const file = options.source;
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (text.includes('\u0000')) {
    throw new DwError('CSV_MALFORMED', `${cap(source)} is not CSV text (it holds NUL bytes: a spreadsheet workbook, or text saved as UTF-16?).`,
      'Export the sheet as CSV (UTF-8) and give that file.', { file });
  }
  // one line-end convention, so that a file with mixed line ends still splits into its lines
  text = text.replace(/\r\n?/g, '\n');
  if (text.trim() === '') {
    throw new DwError('CSV_EMPTY', `${cap(source)} is empty.`, 'Give a CSV file with a header row and one row per observation.', { file });
  }
  const delimiter = options.delimiter ?? detectDelimiter(text);
  const all = splitRecords(text, delimiter, source, file);
  // blank lines: at the end they are ignored; between observations they are refused, because a
  // silently dropped row would join two observations that are not neighbours in time
  const blank = (r: string[]) => r.every((c) => c.trim() === '');
  while (all.length > 0 && blank(all[all.length - 1])) all.pop();
  while (all.length > 0 && blank(all[0])) all.shift();
  if (all.length === 0) {
    throw new DwError('CSV_EMPTY', `${cap(source)} has no rows.`, 'Give a header row and data rows.', { file });
  }
  let headers = all[0].map((h) => h.trim());
  let rows = all.slice(1);
  // a trailing delimiter on every line (or on every data line only) leaves an extra empty column
  const lastEmpty = (r: string[], width: number) => r.length === width && r[width - 1].trim() === '';
  if (headers.length > 1 && headers[headers.length - 1] === '' && rows.length > 0 && rows.every((r) => lastEmpty(r, headers.length))) {
    headers = headers.slice(0, -1);
    rows = rows.map((r) => r.slice(0, -1));
  } else if (rows.length > 0 && rows.every((r) => lastEmpty(r, headers.length + 1))) {
    rows = rows.map((r) => r.slice(0, -1));
  }
  const looksNumeric = (h: string) => POINT_NUMBER.test(h) || COMMA_NUMBER.test(h);
  if (headers.every(looksNumeric)) {
    throw new DwError('CSV_HEADER_EMPTY', `The first row of ${source} holds numbers (${headers.slice(0, 3).join(', ')}${headers.length > 3 ? ', ...' : ''}), not column names.`,
      'Add a header row naming each column.', { file });
  }
  headers.forEach((h, j) => {
    if (h === '') {
      throw new DwError('CSV_HEADER_EMPTY', `Column ${j + 1} of ${source} has an empty name in the header row.`,
        'Give every column a name in the first row.', { file });
    }
  });
  const dup = headers.find((h, j) => headers.indexOf(h) !== j);
  if (dup !== undefined) {
    throw new DwError('CSV_HEADER_DUPLICATE', `The column name '${dup}' appears more than once in the header of ${source}.`,
      'Give each column a distinct name.', { file, column: dup });
  }
  if (rows.length === 0) {
    throw new DwError('CSV_NO_DATA_ROWS', `${cap(source)} has a header but no data rows.`, 'Add one row per observation.', { file });
  }
  rows.forEach((r, i) => {
    if (blank(r)) {
      throw new DwError('CELL_EMPTY', `Data row ${i + 1} of ${source} is blank.`,
        'Remove the blank line; if it stands for a missing period, remove it and name the time column so the gap is honoured.',
        { file, row: i + 1, suggest: [{ option: 'time' }] });
    }
    if (r.length !== headers.length) {
      const splitComma = delimiter === ',' && r.length > headers.length;
      throw new DwError('CSV_RAGGED', `Data row ${i + 1} of ${source} has ${r.length} field${r.length === 1 ? '' : 's'}; the header has ${headers.length}.`,
        `Make every row have ${headers.length} fields${splitComma ? " (numbers with decimal commas need ';' as the delimiter, or quotes)" : ''}.`,
        { file, row: i + 1 });
    }
  });
  const decimal = options.decimal ?? detectDecimal(rows, delimiter, source, file);
  return { headers, rows, delimiter, decimal, source };
}

/**
 * The records and fields of the text (line ends already LF). Without any quotation mark the RFC 4180
 * grammar reduces to splitting at line ends and delimiters, which is done directly (papaparse does
 * the same in that case, more slowly); text with quotes goes to papaparse.
 */
export function splitRecords(text: string, delimiter: string, source: string, file: string | undefined): string[][] {
  if (text === '') return [];
  if (!text.includes('"')) return text.split('\n').map((line) => line.split(delimiter));
  const parsed = Papa.parse<string[]>(text, { delimiter, newline: '\n', skipEmptyLines: false });
  const fatal = parsed.errors.find((e) => e.type === 'Quotes');
  if (fatal) {
    const row = fatal.row ?? 0;
    throw new DwError('CSV_MALFORMED', `${cap(source)} has an unclosed quotation mark in ${row === 0 ? 'the header row' : `data row ${row}`}.`,
      'Close the quote or remove it.', { file, row: row || undefined });
  }
  return parsed.data;
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/**
 * The delimiter that splits the header row into the most fields; ties (for example a header of
 * one name) are broken by the data rows (the delimiter that gives the same count on most of them),
 * then in the order `,` `;` tab.
 */
function detectDelimiter(text: string): ',' | ';' | '\t' {
  const lines = firstLines(text, 50);
  const count = (line: string, d: string) => Papa.parse<string[]>(line, { delimiter: d }).data[0]?.length ?? 1;
  const candidates = [',', ';', '\t'] as const;
  const header = candidates.map((d) => count(lines[0], d));
  const best = Math.max(...header);
  const tied = candidates.filter((_, i) => header[i] === best);
  if (tied.length === 1) return tied[0];
  let choice: ',' | ';' | '\t' = tied[0];
  let agree = -1;
  for (const d of tied) {
    const counts = lines.slice(1).map((l) => count(l, d));
    const first = counts[0] ?? 1;
    const a = first > 1 ? counts.filter((c) => c === first).length : 0;
    if (a > agree) { agree = a; choice = d; }
  }
  return choice;
}

/** The first `count` lines of the text that are not blank (without splitting the rest of it). */
function firstLines(text: string, count: number): string[] {
  const lines: string[] = [];
  let from = 0;
  while (lines.length < count && from <= text.length) {
    let to = text.indexOf('\n', from);
    if (to < 0) to = text.length;
    const line = text.slice(from, to);
    if (line.trim() !== '') lines.push(line);
    from = to + 1;
  }
  return lines;
}

/** Decimal commas or points, from the cells of a `;`- or tab-delimited file. */
function detectDecimal(rows: string[][], delimiter: string, source: string, file?: string): 'point' | 'comma' {
  if (delimiter === ',') return 'point';
  let commas = 0;
  let points = 0;
  let commaCell = '';
  let pointCell = '';
  for (const r of rows) {
    for (const cell of r) {
      const v = cell.trim();
      if (v.includes(',') && COMMA_NUMBER.test(v)) { commas++; commaCell ||= v; }
      if (v.includes('.') && POINT_NUMBER.test(v)) { points++; pointCell ||= v; }
    }
  }
  if (commas > 0 && points > 0) {
    throw new DwError('CSV_AMBIGUOUS_DECIMAL',
      `${cap(source)} mixes decimal commas (${commas} cells, such as '${commaCell}') and decimal points (${points} cells, such as '${pointCell}').`,
      "Say which is the decimal mark, decimal 'comma' or 'point' (a point may be a thousands separator: remove those).",
      { file, suggest: [{ option: 'decimal', value: 'comma' }, { option: 'decimal', value: 'point' }] });
  }
  return commas > 0 ? 'comma' : 'point';
}

/**
 * Parse one cell as a number under the table's decimal convention, or throw an error naming the
 * row and column: `CELL_EMPTY` (empty, blank or a missing-value code such as NA or NaN),
 * `CELL_NOT_FINITE` (Inf, or a magnitude outside the double range), `CELL_NOT_NUMERIC` (anything
 * else that is not a plain number).
 *
 * @example
 * ```ts
 * parseCell(parseCsv('y\n1\n'), 0, 'y', ' 2.5 '); // 2.5
 * ```
 */
export function parseCell(table: DataTable, row: number, column: string, text: string): number {
  let v = text.trim();
  const pattern = table.decimal === 'comma' ? COMMA_NUMBER : POINT_NUMBER;
  // the usual cell, a plain number: no missing-value code or infinity matches the pattern, so the
  // refusals below are reached only by cells that are not plain numbers
  if (!pattern.test(v)) refuseCell(table, row, column, text, v);
  if (table.decimal === 'comma') v = v.replace(',', '.');
  const x = Number(v);
  if (!Number.isFinite(x)) {
    throw new DwError('CELL_NOT_FINITE', `'${text.trim()}' at ${cellPlace(table, row, column)} is too large to represent as a double-precision number.`,
      'Rescale the column (for example express it in thousands).', cellDetail(table, row, column, text));
  }
  if (x !== 0 && Math.abs(x) < MIN_NORMAL) {
    throw new DwError('CELL_NOT_FINITE', `'${text.trim()}' at ${cellPlace(table, row, column)} is too small to represent as a double-precision number without loss.`,
      'Rescale the column (multiply it by a power of ten).', cellDetail(table, row, column, text));
  }
  return x;
}

function cellPlace(table: DataTable, row: number, column: string): string {
  return `data row ${row + 1}, column '${column}' of ${table.source}`;
}

function cellDetail(table: DataTable, row: number, column: string, text: string): { file: string; row: number; column: string; value: string } {
  return { file: table.source, row: row + 1, column, value: text.trim() };
}

/** The refusal of a cell (trimmed text v) that is not a plain number: missing, infinite or not numeric. */
function refuseCell(table: DataTable, row: number, column: string, text: string, v: string): never {
  const where = cellPlace(table, row, column);
  const detail = cellDetail(table, row, column, text);
  if (MISSING.has(v.toLowerCase())) {
    throw new DwError('CELL_EMPTY', `Missing value ${v === '' ? `(${text === '' ? 'empty' : 'blank'} cell)` : `'${v}'`} at ${where}.`,
      'The exact test needs a complete series: fill the value, or drop the rows with missing values (they become gaps in the time index).', detail);
  }
  if (/^[+-]?(inf|infinity|∞)$/i.test(v)) {
    throw new DwError('CELL_NOT_FINITE', `Infinite value '${v}' at ${where}.`, 'Every value must be a finite number.', detail);
  }
  const { hint, suggest } = notNumberHint(table, v);
  throw new DwError('CELL_NOT_NUMERIC', `'${v}' at ${where} is not a number.`, hint, suggest ? { ...detail, suggest } : detail);
}

function notNumberHint(table: DataTable, v: string): { hint: string; suggest?: DwSuggestion[] } {
  const comma: DwSuggestion[] = [{ option: 'decimal', value: 'comma' }];
  if (table.decimal === 'point' && COMMA_THOUSANDS.test(v) && table.delimiter === ',') {
    return { hint: `If ${v} groups thousands, remove the commas; if it has a decimal comma, read the file with decimal 'comma'.`, suggest: comma };
  }
  if (table.decimal === 'point' && COMMA_NUMBER.test(v)) {
    return {
      hint: table.delimiter === ','
        ? "This looks like a decimal comma: read the file with decimal 'comma' (the cells must be quoted), or save it with ; as the delimiter."
        : "This looks like a decimal comma: read the file with decimal 'comma'.",
      suggest: comma,
    };
  }
  if (table.decimal === 'comma' && (POINT_THOUSANDS.test(v) || POINT_NUMBER.test(v))) {
    return { hint: `The file is read with decimal commas; if the points in ${v} group thousands, remove them, otherwise read it with decimal 'point'.`, suggest: [{ option: 'decimal', value: 'point' }] };
  }
  if (/%$/.test(v)) return { hint: 'Remove the % sign (write 5% as 5 or 0.05).' };
  if (/^[\u2212\u2013]/.test(v)) return { hint: 'Use the ASCII minus sign (-) instead of a typographic one.' };
  return { hint: 'Every value in a column used by the model must be a plain number such as 12.5 or -3e-4.' };
}

/**
 * The named column as numbers; throws COLUMN_UNKNOWN for a name not in the header, and the
 * CELL_* errors of {@link parseCell} (naming the data row) for a cell that is not a finite number.
 *
 * @example
 * ```ts
 * const table = parseCsv('year,y\n2001,1.5\n2002,1.7\n');
 * numericColumn(table, 'y'); // Float64Array [1.5, 1.7]
 * numericColumn(table, 'Y'); // throws COLUMN_UNKNOWN: Did you mean 'y'?
 * ```
 */
export function numericColumn(table: DataTable, column: string, options: { missingAsNaN?: boolean } = {}): Float64Array {
  const j = columnIndex(table, column);
  return Float64Array.from(table.rows, (r, i) => (options.missingAsNaN && isMissingCell(r[j]) ? NaN : parseCell(table, i, column, r[j])));
}

/**
 * True for a cell read as a missing value: empty, spaces only, or one of the codes NA, N/A, NaN,
 * null, none, missing, `.`, `-`, `?`, `#N/A` (any case).
 *
 * @example
 * ```ts
 * isMissingCell(' NA '); // true
 * isMissingCell('0');    // false
 * ```
 */
export function isMissingCell(text: string): boolean {
  return MISSING.has(text.trim().toLowerCase());
}

/**
 * The cells of a column as text (trimmed), e.g. time labels.
 *
 * @example
 * ```ts
 * textColumn(parseCsv('q,y\n2015Q1,1\n2015Q2,2\n'), 'q'); // ['2015Q1', '2015Q2']
 * ```
 */
export function textColumn(table: DataTable, column: string): string[] {
  const j = columnIndex(table, column);
  return table.rows.map((r) => r[j].trim());
}

/**
 * Index of a column, or an error listing the columns there are (COLUMN_UNKNOWN, with a hint when
 * only the case differs).
 *
 * @example
 * ```ts
 * const table = parseCsv('year,y,x\n2001,1.5,3\n2002,1.7,4\n');
 * columnIndex(table, 'x');     // 2
 * columnIndex(table, 'sales'); // throws COLUMN_UNKNOWN: its columns are 'year', 'y', 'x'
 * ```
 */
export function columnIndex(table: DataTable, column: string): number {
  const j = table.headers.indexOf(column);
  if (j < 0) {
    const list = table.headers.map((h) => `'${h}'`).join(', ');
    const near = table.headers.find((h) => h.toLowerCase() === column.toLowerCase());
    throw new DwError('COLUMN_UNKNOWN', `There is no column '${column}' in ${table.source}; its columns are ${list}.`,
      near ? `Did you mean '${near}'? Names are case-sensitive.` : 'Check the spelling (names are case-sensitive).', { file: table.source, column });
  }
  return j;
}

/**
 * True when no cell of the column is a number (a label or text column). A column with some numbers
 * and some other cells is neither text nor numeric: it is data with a fault in it.
 *
 * @example
 * ```ts
 * const table = parseCsv('y,label\n1.5,a\n1.7,b\n');
 * isTextColumn(table, 'label'); // true
 * isTextColumn(table, 'y');     // false
 * ```
 */
export function isTextColumn(table: DataTable, column: string): boolean {
  const j = columnIndex(table, column);
  const pattern = table.decimal === 'comma' ? COMMA_NUMBER : POINT_NUMBER;
  return table.rows.every((r) => !pattern.test(r[j].trim()));
}
