/**
 * `--panel COL` and `--entity-effects` of `exact-dw test`: the entity and time of each row for the
 * pooled panel test (src/panel/panel.ts), read from the data file and checked where they enter.
 */
import { DwError } from '../errors.js';
import { columnIndex, isMissingCell, numericColumn, textColumn, type DataTable } from '../data/csv.js';
import { parseTimeLabels, type TimeFrequency } from '../data/time-index.js';
import type { PanelInput } from '../panel/panel.js';
import { listOption, type OptionSpecs, type OptionValues } from './args.js';

/** The panel options (declared once, for any command that tests a pooled panel). */
export const PANEL_OPTIONS: OptionSpecs = {
  panel: { type: 'string', value: 'COL', help: 'panel data: the entity column; one pooled regression, differences only between consecutive times of the same entity (needs --time)' },
  'entity-effects': { type: 'boolean', help: 'with --panel: one indicator per entity instead of the intercept (fixed effects)' },
};

/**
 * The panel of a data file, or undefined without --panel. The entity column is taken out of the
 * regressors chosen by default (`x` is changed in place); naming it in --x is an error.
 *
 * @example
 * ```ts
 * const x = chooseRegressors(table, values, 'sales');
 * const panel = panelFromOptions(values, table, x); // { entity: [...], time: Float64Array, entityEffects }
 * ```
 */
export function panelFromOptions(values: OptionValues, table: DataTable, x: Record<string, Float64Array>, frequency?: TimeFrequency, dropMissing = false): PanelInput | undefined {
  const col = values.panel;
  if (col === undefined) {
    if (values['entity-effects'] === true) {
      throw new DwError('OPTION_CONFLICT', '--entity-effects needs --panel COL (the entity of each row).', 'Add --panel with the entity column, or leave out --entity-effects.');
    }
    return undefined;
  }
  if (typeof col !== 'string' || col.trim() === '') throw new DwError('OPTION_VALUE', '--panel needs the name of the entity column.', 'Write it like --panel shop.');
  const j = columnIndex(table, col);
  if (typeof values.time !== 'string') {
    throw new DwError('OPTION_MISSING', '--panel needs --time COL: the period of each row, to know which rows of an entity are consecutive.', 'Add --time with the period column (whole numbers, quarters, months or ISO dates).');
  }
  if (col === values.time || col === values.y) {
    throw new DwError('OPTION_CONFLICT', `'${col}' cannot be both the entity column and ${col === values.time ? '--time' : '--y'}.`, 'Name separate columns.', { column: col });
  }
  if (listOption(values, 'x')?.includes(col)) {
    throw new DwError('OPTION_CONFLICT', `'${col}' is the entity column and cannot also be a regressor in --x.`, 'Remove it from --x (use --entity-effects for one intercept per entity).', { column: col });
  }
  delete x[col];
  const entity = table.rows.map((r) => r[j].trim());
  return {
    entity,
    time: panelTimes(table, values.time, entity, frequency, dropMissing),
    entityEffects: values['entity-effects'] === true,
  };
}

/**
 * The period number of every row of a panel: whole numbers as they are; quarter, month or ISO-date
 * labels (src/data/time-index.ts) read entity by entity, in the order of the labels (these formats
 * sort as text), with one frequency for all entities. With `dropMissing`, the rows without an entity
 * or a time get NaN (the test drops them).
 */
function panelTimes(table: DataTable, column: string, entity: string[], frequency: TimeFrequency | undefined, dropMissing: boolean): Float64Array {
  const cells = textColumn(table, column);
  // with --drop-missing, a row without its entity or time is NaN here and dropped by the test
  const skip = (r: number) => dropMissing && (isMissingCell(entity[r]) || isMissingCell(cells[r]));
  const out = new Float64Array(cells.length);
  if (cells.every((c, r) => skip(r) || /^\s*[+-]?\d+(\.0*)?\s*$/.test(c))) {
    const numbers = numericColumn(table, column, { missingAsNaN: dropMissing });
    cells.forEach((_, r) => { out[r] = skip(r) ? NaN : numbers[r]; });
    return out;
  }
  const groups = new Map<string, number[]>();
  entity.forEach((e, r) => {
    if (skip(r)) { out[r] = NaN; return; }
    const g = groups.get(e);
    if (g) g.push(r); else groups.set(e, [r]);
  });
  let seen: { frequency: TimeFrequency; entity: string } | null = null;
  for (const [e, rows] of groups) {
    rows.sort((a, b) => (cells[a].trim() < cells[b].trim() ? -1 : cells[a].trim() > cells[b].trim() ? 1 : a - b));
    const parsed = parseTimeLabels(rows.map((r) => cells[r]), { column, source: table.source, rows: rows.map((r) => r + 1), frequency });
    if (seen && parsed.frequency !== seen.frequency) {
      throw new DwError('TIME_FREQUENCY_CONFLICT',
        `The time labels of entity '${e}' read as ${parsed.frequency} and those of '${seen.entity}' as ${seen.frequency}.`,
        'Give every entity the same frequency of dates, or name the frequency.', { column });
    }
    seen = { frequency: parsed.frequency, entity: e };
    rows.forEach((r, i) => { out[r] = parsed.periods[i]; });
  }
  return out;
}
