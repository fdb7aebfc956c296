/**
 * Reading a data table from CSV text: a header row, then one row per observation. Parsing of the
 * CSV grammar (quotes, embedded delimiters, line ends) is papaparse's; this module adds what a
 * statistics user needs on top: delimiter and decimal-comma detection, a UTF-8 byte-order mark,
 * clear errors that name the row and column, and numeric conversion of the columns asked for.
 */
import Papa from 'papaparse';
import { DwError } from '../errors.js';

/** How the CSV text is to be read. */
export interface CsvOptions {
  /** Field delimiter; detected among `,` `;` and tab when omitted. */
  delimiter?: ',' | ';' | '\t';
  /** Decimal mark; `comma` accepts 3,14 (only with `;` or tab delimiters). Detected when omitted. */
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

const MISSING = new Set(['', 'na', 'n/a', 'nan', 'null', 'none', '.', '-', '?', '#n/a']);
const POINT_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const COMMA_NUMBER = /^[+-]?(\d+(,\d*)?|,\d+)([eE][+-]?\d+)?$/;

/**
 * Parse CSV text into a {@link DataTable}.
 *
 * @example
 * ```ts
 * const table = parseCsv('year,y,x\n2001,1.5,3\n2002,1.7,4\n');
 * numericColumn(table, 'y'); // Float64Array [1.5, 1.7]
 * ```
 */
export function parseCsv(text: string, options: CsvOptions = {}): DataTable {
  const source = options.source ?? 'the CSV input';
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (text.trim() === '') {
    throw new DwError('CSV_EMPTY', `${cap(source)} is empty.`, 'Give a CSV file with a header row and one row per observation.', { file: options.source });
  }
  const delimiter = options.delimiter ?? detectDelimiter(text);
  const parsed = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: 'greedy' });
  const fatal = parsed.errors.find((e) => e.type === 'Quotes');
  if (fatal) {
    throw new DwError('CSV_MALFORMED', `${cap(source)} has an unclosed quotation mark near data row ${(fatal.row ?? 0)}.`,
      'Close the quote or remove it.', { file: options.source, row: fatal.row ?? undefined });
  }
  const all = parsed.data;
  if (all.length === 0) {
    throw new DwError('CSV_EMPTY', `${cap(source)} has no rows.`, 'Give a header row and data rows.', { file: options.source });
  }
  const headers = all[0].map((h) => h.trim());
  headers.forEach((h, j) => {
    if (h === '') {
      throw new DwError('CSV_HEADER_EMPTY', `Column ${j + 1} of ${source} has an empty name in the header row.`,
        'Give every column a name in the first row.', { file: options.source });
    }
    if (/^[+-]?[\d.,]+$/.test(h) && headers.every((x) => /^[+-]?[\d.,eE+-]+$/.test(x))) {
      throw new DwError('CSV_HEADER_EMPTY', `The first row of ${source} holds numbers (${headers.slice(0, 3).join(', ')}...), not column names.`,
        'Add a header row naming each column.', { file: options.source });
    }
  });
  const dup = headers.find((h, j) => headers.indexOf(h) !== j);
  if (dup !== undefined) {
    throw new DwError('CSV_HEADER_DUPLICATE', `The column name '${dup}' appears twice in the header of ${source}.`,
      'Give each column a distinct name.', { file: options.source, column: dup });
  }
  const rows = all.slice(1);
  if (rows.length === 0) {
    throw new DwError('CSV_NO_DATA_ROWS', `${cap(source)} has a header but no data rows.`, 'Add one row per observation.', { file: options.source });
  }
  rows.forEach((r, i) => {
    if (r.length !== headers.length) {
      throw new DwError('CSV_RAGGED', `Data row ${i + 1} of ${source} has ${r.length} fields; the header has ${headers.length}.`,
        `Make every row have ${headers.length} fields${delimiter !== ',' ? '' : ' (if numbers use decimal commas, use ; as the delimiter)'}.`,
        { file: options.source, row: i + 1 });
    }
  });
  const decimal = options.decimal ?? detectDecimal(rows, delimiter, source, options.source);
  if (decimal === 'comma' && delimiter === ',') {
    throw new DwError('OPTION_CONFLICT', 'A decimal comma cannot be read from a comma-delimited file.',
      'Use ; or tab as the delimiter, or decimal points.');
  }
  return { headers, rows, delimiter, decimal, source };
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** The delimiter that splits the header into the most fields, consistently over the first lines. */
function detectDelimiter(text: string): ',' | ';' | '\t' {
  const lines = text.split(/\r\n|\n|\r/).filter((l) => l.trim() !== '').slice(0, 20);
  let best: ',' | ';' | '\t' = ',';
  let bestScore = -1;
  for (const d of [',', ';', '\t'] as const) {
    const counts = lines.map((l) => Papa.parse<string[]>(l, { delimiter: d }).data[0]?.length ?? 1);
    const consistent = counts.every((c) => c === counts[0]);
    const score = consistent ? counts[0] : 0;
    if (score > bestScore || (score === bestScore && d === ',' && best !== ',')) {
      if (score > bestScore) { best = d; bestScore = score; }
    }
  }
  return best;
}

function detectDecimal(rows: string[][], delimiter: string, source: string, file?: string): 'point' | 'comma' {
  if (delimiter === ',') return 'point';
  let commas = 0;
  let points = 0;
  for (const r of rows) {
    for (const cell of r) {
      const v = cell.trim();
      if (COMMA_NUMBER.test(v) && v.includes(',')) commas++;
      if (POINT_NUMBER.test(v) && v.includes('.')) points++;
    }
  }
  if (commas > 0 && points > 0) {
    throw new DwError('CSV_AMBIGUOUS_DECIMAL', `${cap(source)} mixes decimal commas (${commas} cells) and decimal points (${points} cells).`,
      'Say which is the decimal mark with --decimal comma or --decimal point.', { file });
  }
  return commas > 0 ? 'comma' : 'point';
}

/**
 * Parse one cell as a number under the table's decimal convention, or throw an error naming the
 * row and column.
 */
export function parseCell(table: DataTable, row: number, column: string, text: string): number {
  let v = text.trim();
  const where = `data row ${row + 1}, column '${column}' of ${table.source}`;
  if (MISSING.has(v.toLowerCase())) {
    throw new DwError('CELL_EMPTY', `Missing value ${v === '' ? '(empty cell)' : `'${v}'`} at ${where}.`,
      'The exact test needs a complete series: fill the value or remove the row (and declare the gap with --time).',
      { file: table.source, row: row + 1, column, value: v });
  }
  if (/^[+-]?(inf|infinity)$/i.test(v)) {
    throw new DwError('CELL_NOT_FINITE', `Infinite value '${v}' at ${where}.`, 'Every value must be a finite number.',
      { file: table.source, row: row + 1, column, value: v });
  }
  const pattern = table.decimal === 'comma' ? COMMA_NUMBER : POINT_NUMBER;
  if (!pattern.test(v)) {
    const hint = table.decimal === 'point' && COMMA_NUMBER.test(v)
      ? 'This looks like a decimal comma: use ; as the delimiter and --decimal comma.'
      : 'Every value in a column used by the model must be a plain number such as 12.5 or -3e-4.';
    throw new DwError('CELL_NOT_NUMERIC', `'${v}' at ${where} is not a number.`, hint,
      { file: table.source, row: row + 1, column, value: v });
  }
  if (table.decimal === 'comma') v = v.replace(',', '.');
  const x = Number(v);
  if (!Number.isFinite(x)) {
    throw new DwError('CELL_NOT_FINITE', `'${text.trim()}' at ${where} is too large to represent.`, 'Rescale the column.',
      { file: table.source, row: row + 1, column, value: v });
  }
  return x;
}

/** The named column as numbers; throws COLUMN_UNKNOWN for a name not in the header. */
export function numericColumn(table: DataTable, column: string): Float64Array {
  const j = columnIndex(table, column);
  return Float64Array.from(table.rows, (r, i) => parseCell(table, i, column, r[j]));
}

/** Index of a column, or an error listing the columns there are. */
export function columnIndex(table: DataTable, column: string): number {
  const j = table.headers.indexOf(column);
  if (j < 0) {
    const list = table.headers.map((h) => `'${h}'`).join(', ');
    throw new DwError('COLUMN_UNKNOWN', `There is no column '${column}' in ${table.source}; its columns are ${list}.`,
      'Check the spelling (names are case-sensitive).', { file: table.source, column });
  }
  return j;
}

/** True when every cell of the column parses as a number. */
export function isNumericColumn(table: DataTable, column: string): boolean {
  try { numericColumn(table, column); return true; } catch { return false; }
}
