/**
 * What the page needs to know about the columns of a table to offer sensible choices: which are
 * numeric, which could be the time column, and a first guess of y, the regressors and the time.
 * The guess follows the command line's default (every other numeric column is a regressor).
 */
import { isMissingCell, numericColumn, textColumn, type DataTable } from '../data/csv.js';
import { chooseTimeIndex, isTimeLabel, readsAsTimeIndex } from '../data/time-index.js';
import type { ColumnInfo } from './protocol.js';

/**
 * Numeric and time-like flags of every column. A column is numeric when every cell is a number
 * or a missing value (with at least one number); time-like when its labels read as strictly
 * increasing periods (src/data/time-index.ts); of time labels when every present cell reads as
 * one, increasing or not (a time column of stacked series). `distinct` counts the groups the
 * column would make as the grouping column.
 *
 * @example
 * ```ts
 * summarizeColumns(parseCsv('year,y\n2001,1.5\n2002,1.7\n')); // year: numeric, timeLike; y: numeric
 * ```
 */
export function summarizeColumns(table: DataTable): ColumnInfo[] {
  return table.headers.map((name) => {
    const cells = textColumn(table, name);
    const present = cells.filter((c) => !isMissingCell(c));
    const timeLike = readsAsTimeIndex(present) !== null;
    let numeric = true;
    try {
      numericColumn(table, name, { missingAsNaN: true });
      numeric = cells.some((c) => !isMissingCell(c));
    } catch {
      numeric = false;
    }
    const missing = cells.length - present.length;
    const timeLabels = present.length > 0 && present.every((c) => isTimeLabel(c));
    const distinct = new Set(cells.map((c) => c.trim()).filter((c) => c !== '')).size;
    return { name, numeric, timeLike, missing, timeLabels, distinct };
  });
}

/**
 * A first choice that follows the library's time-index rule (chooseTimeIndex, the rule of the
 * command line and the API): y is the first numeric column that is not time-like (else the first
 * numeric column); the time column is the one the rule takes (never y); the regressors are the
 * remaining numeric columns.
 *
 * @example
 * ```ts
 * guessColumns(parseCsv('year,y\n2001,1.5\n2002,1.7\n'), summarizeColumns(table));
 * // { time: 'year', y: 'y', x: [] }
 * ```
 */
export function guessColumns(table: DataTable, columns: ColumnInfo[]): { y: string | null; x: string[]; time: string | null } {
  const numeric = columns.filter((c) => c.numeric);
  const y = (numeric.find((c) => !c.timeLike) ?? numeric[0])?.name ?? null;
  const choice = chooseTimeIndex(table.headers.map((h) => ({ name: h, cells: textColumn(table, h) })), { y: y ?? undefined });
  const time = choice.column;
  return { y, x: numeric.map((c) => c.name).filter((name) => name !== y && name !== time), time };
}
