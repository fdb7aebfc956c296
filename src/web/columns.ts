/**
 * What the page needs to know about the columns of a table to offer sensible choices: which are
 * numeric, which could be the time column, and a first guess of y, the regressors and the time.
 * The guess follows the command line's default (every other numeric column is a regressor).
 */
import { isMissingCell, numericColumn, textColumn, type DataTable } from '../data/csv.js';
import { chooseTimeIndex, isTimeLabel, readsAsTimeIndex, TIME_NAMES } from '../data/time-index.js';
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
 * The columns that serve as a time index within the groups of a stacked file: for some text column
 * whose labels repeat (two or more groups, at most half as many groups as rows), the column's
 * labels increase within every group of two or more rows, and it has a time-like name or holds
 * quarter, month or date labels (the time-index rule of src/data/time-index.ts, group by group, as
 * the batch applies it).
 */
function timeWithinGroups(table: DataTable, columns: ColumnInfo[]): Set<string> {
  const found = new Set<string>();
  const rows = table.rows.length;
  const groupings = columns.filter((c) => !c.numeric && (c.distinct ?? 0) >= 2 && (c.distinct ?? 0) * 2 <= rows);
  for (const by of groupings) {
    const j = table.headers.indexOf(by.name);
    const groups = new Map<string, number[]>();
    table.rows.forEach((r, i) => { const g = groups.get(r[j].trim()); if (g) g.push(i); else groups.set(r[j].trim(), [i]); });
    for (const c of columns) {
      if (c.name === by.name || found.has(c.name)) continue;
      const k = table.headers.indexOf(c.name);
      let ok = true;
      let calendar = false;
      let seen = false;
      for (const g of groups.values()) {
        if (g.length < 2) continue;
        const format = readsAsTimeIndex(g.map((i) => table.rows[i][k]).filter((cell) => !isMissingCell(cell)));
        if (format === null) { ok = false; break; }
        seen = true;
        if (format !== 'integer') calendar = true;
      }
      if (ok && seen && (calendar || TIME_NAMES.includes(c.name.trim().toLowerCase()))) found.add(c.name);
    }
  }
  return found;
}

/**
 * A first choice that follows the library's time-index rule (chooseTimeIndex, the rule of the
 * command line and the API): y is the first numeric column that is not time-like (else the first
 * numeric column); the time column is the one the rule takes (never y); the regressors are the
 * remaining numeric columns. In a stacked file, a column that is a time index within every group
 * (such as year beside a station column) is neither y nor a regressor.
 *
 * @example
 * ```ts
 * guessColumns(parseCsv('year,y\n2001,1.5\n2002,1.7\n'), summarizeColumns(table));
 * // { time: 'year', y: 'y', x: [] }
 * ```
 */
export function guessColumns(table: DataTable, columns: ColumnInfo[]): { y: string | null; x: string[]; time: string | null } {
  // in a stacked file (a text column that groups the rows) a column such as year is a time index
  // within each group, neither y nor a regressor
  const grouped = timeWithinGroups(table, columns);
  const numeric = columns.filter((c) => c.numeric);
  const y = (numeric.find((c) => !c.timeLike && !grouped.has(c.name)) ?? numeric[0])?.name ?? null;
  const choice = chooseTimeIndex(table.headers.map((h) => ({ name: h, cells: textColumn(table, h) })), { y: y ?? undefined });
  const time = choice.column;
  return { y, x: numeric.map((c) => c.name).filter((name) => name !== y && name !== time && !grouped.has(name)), time };
}
