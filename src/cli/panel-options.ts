/**
 * `--panel COL` and `--entity-effects` of `exact-dw test`: the entity and time of each row for the
 * pooled panel test (src/panel/panel.ts), read from the data file and checked where they enter.
 */
import { DwError } from '../errors.js';
import { columnIndex, numericColumn, type DataTable } from '../data/csv.js';
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
export function panelFromOptions(values: OptionValues, table: DataTable, x: Record<string, Float64Array>): PanelInput | undefined {
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
    throw new DwError('OPTION_MISSING', '--panel needs --time COL: the period of each row, to know which rows of an entity are consecutive.', 'Add --time with the integer period column.');
  }
  if (col === values.time || col === values.y) {
    throw new DwError('OPTION_CONFLICT', `'${col}' cannot be both the entity column and ${col === values.time ? '--time' : '--y'}.`, 'Name separate columns.', { column: col });
  }
  if (listOption(values, 'x')?.includes(col)) {
    throw new DwError('OPTION_CONFLICT', `'${col}' is the entity column and cannot also be a regressor in --x.`, 'Remove it from --x (use --entity-effects for one intercept per entity).', { column: col });
  }
  delete x[col];
  return {
    entity: table.rows.map((r) => r[j].trim()),
    time: numericColumn(table, values.time),
    entityEffects: values['entity-effects'] === true,
  };
}
