/**
 * What the page needs to know about the columns of a table to offer sensible choices: which are
 * numeric, which could be the time column, and a first guess of y, the regressors and the time.
 * The guess follows the command line's default (every other numeric column is a regressor).
 */
import { numericColumn, type DataTable } from '../data/csv.js';
import type { ColumnInfo } from './protocol.js';

/** Names that usually mark a time index rather than a regressor. */
const TIME_NAME = /^(t|year|years|yr|time|date|period|quarter|qtr|month|week|day|obs|observation)$/i;

/**
 * Numeric and time-like flags of every column.
 *
 * @example
 * ```ts
 * summarizeColumns(parseCsv('year,y\n2001,1.5\n2002,1.7\n')); // year: numeric, timeLike; y: numeric
 * ```
 */
export function summarizeColumns(table: DataTable): ColumnInfo[] {
  return table.headers.map((name) => {
    let values: Float64Array;
    try {
      values = numericColumn(table, name);
    } catch {
      return { name, numeric: false, timeLike: false };
    }
    let timeLike = true;
    for (let i = 0; i < values.length; i++) {
      if (!Number.isInteger(values[i]) || (i > 0 && values[i] <= values[i - 1])) { timeLike = false; break; }
    }
    return { name, numeric: true, timeLike };
  });
}

/**
 * A first choice: the time column is a time-like column with a time-like name; y is the first
 * other numeric column that is not itself a run of whole numbers (else the first other numeric
 * column); the regressors are the remaining numeric columns.
 *
 * @example
 * ```ts
 * guessColumns([{ name: 'year', numeric: true, timeLike: true }, { name: 'y', numeric: true, timeLike: false }]);
 * // { time: 'year', y: 'y', x: [] }
 * ```
 */
export function guessColumns(columns: ColumnInfo[]): { y: string | null; x: string[]; time: string | null } {
  const time = columns.find((c) => c.timeLike && TIME_NAME.test(c.name))?.name ?? null;
  const numeric = columns.filter((c) => c.numeric && c.name !== time);
  const y = (numeric.find((c) => !c.timeLike) ?? numeric[0])?.name ?? null;
  return { y, x: numeric.map((c) => c.name).filter((name) => name !== y), time };
}
